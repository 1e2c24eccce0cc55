/**
 * Whether a run's inputs are still the period's current ones: the confirmed positions file, the approved method
 * statement and the capital rule profile by their stored ids (each is immutable once in force), and the price history
 * by comparing the closes the run stored with the closes held now, factor by factor, up to the period end. A run
 * whose inputs are no longer current is stale: shown as such everywhere and never chosen for a filing. Pure.
 */
import type { RunInputs } from "./types";

export type StaleInput = "positions" | "prices" | "method" | "capitalProfile";

export interface InputChange {
  input: StaleInput;
  /** one sentence saying what changed */
  message: string;
}

export interface RunFreshness {
  stale: boolean;
  changes: InputChange[];
}

/** What a run was computed from, by id. */
export interface RunInputIds {
  positionsUploadId: string;
  methodStatementId: string;
  capitalProfileId: string | null;
}

/** The period's inputs as they stand now. */
export interface CurrentInputs {
  positions: { uploadId: string; fileName: string; confirmedAt: string | null } | null;
  method: { id: string; version: number } | null;
  capitalProfile: { id: string; name: string } | null;
}

/** Differences between the closes a run stored and the closes held now for the same factors, up to the period end. */
export function priceChanges(stored: RunInputs["prices"], current: ReadonlyMap<string, { dates: readonly string[]; closes: readonly number[] }>, needed: readonly string[]): InputChange[] {
  const changed: string[] = [];
  const appeared: string[] = [];
  for (const factor of needed) {
    const mine = stored.factors[factor];
    const now = current.get(factor);
    if (!mine) {
      if (now && now.dates.length > 0) appeared.push(factor);
      continue;
    }
    const dates: string[] = [];
    const closes: number[] = [];
    mine.closes.forEach((c, i) => {
      if (c !== null) {
        dates.push(stored.dates[i]);
        closes.push(c);
      }
    });
    if (!now || now.dates.length !== dates.length || now.dates.some((d, i) => d !== dates[i] || now.closes[i] !== closes[i])) changed.push(factor);
  }
  const list = (ids: string[]) => `${ids.slice(0, 5).join(", ")}${ids.length > 5 ? ` and ${ids.length - 5} more` : ""}`;
  const out: InputChange[] = [];
  if (changed.length) {
    out.push({ input: "prices", message: `The price history changed for ${changed.length} factor${changed.length === 1 ? "" : "s"} since the run (${list(changed)}): closes added or corrected up to the period end.` });
  }
  if (appeared.length) {
    out.push({ input: "prices", message: `${appeared.length} factor${appeared.length === 1 ? " that had" : "s that had"} no price history at the run now ${appeared.length === 1 ? "has" : "have"} one (${list(appeared)}).` });
  }
  return out;
}

/** A run's freshness against the period's current inputs (prices compared by the caller through priceChanges). */
export function runFreshness(run: RunInputIds, current: CurrentInputs, prices: readonly InputChange[] = []): RunFreshness {
  const changes: InputChange[] = [];
  if (!current.positions) changes.push({ input: "positions", message: "The period has no confirmed positions any more." });
  else if (current.positions.uploadId !== run.positionsUploadId) {
    changes.push({ input: "positions", message: `The positions were superseded by "${current.positions.fileName}"${current.positions.confirmedAt ? ` (confirmed ${current.positions.confirmedAt.slice(0, 16).replace("T", " ")} UTC)` : ""}.` });
  }
  if (!current.method) changes.push({ input: "method", message: "No method statement is approved any more." });
  else if (current.method.id !== run.methodStatementId) changes.push({ input: "method", message: `Method statement version ${current.method.version} is now the approved one.` });
  if ((current.capitalProfile?.id ?? null) !== run.capitalProfileId) {
    changes.push({ input: "capitalProfile", message: current.capitalProfile ? `The capital rule profile in force is now "${current.capitalProfile.name}".` : "No capital rule profile is in force any more." });
  }
  changes.push(...prices);
  return { stale: changes.length > 0, changes };
}

/** One sentence for a stale run: what changed, for badges' titles and refusals. */
export function staleSummary(freshness: RunFreshness): string {
  return freshness.changes.map((c) => c.message).join(" ");
}
