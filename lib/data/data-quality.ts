/**
 * The data-quality report of a period, from its confirmed positions and the firm's price history: computed once per
 * state of what it reads and stored (data_quality_reports), so a page view is a read.
 *
 * What the report reads, and so what its inputs key fingerprints (qualityInputsKey):
 * - the period's end date and its confirmed positions upload (positions rows are written once, with their upload);
 * - the firm's price history up to the period end: closes are written only by confirming a price-history upload
 *   (new points and corrections, lib/data/uploads.ts confirmUpload), so the ids of the confirmed price uploads;
 * - the firm's holidays (business-day checks), its reporting currency, the capital rule profile in force (a
 *   profile filing the standardised figure adds attribute findings; versions never change, so its id);
 * - the period's data-quality confirmations (never changed or deleted, so their ids);
 * - QUALITY_REPORT_VERSION: raise it when lib/uploads/data-quality.ts or the attribute checks change what they report.
 * A stored report is served only when its key equals the key of the inputs as they are now; otherwise the report is
 * computed, stored (only when the inputs did not change while it was computed) and served.
 */
import "server-only";
import { and, eq, inArray } from "drizzle-orm";
import { getDb, type Database, type Tx } from "@/db/client";
import { capitalRuleProfiles, dataQualityReports, holidays, positions, qualityConfirmations, reportingPeriods, uploads } from "@/db/schema";
import type { Actor } from "@/lib/auth/actor";
import { AppError } from "@/lib/errors";
import { now } from "@/lib/clock";
import { hashOf } from "@/lib/domain/canonical";
import { dataQualityReport, type QualityReport } from "@/lib/uploads/data-quality";
import { getCalendar, getPeriod } from "./periods";
import { priceSeries } from "./prices";
import { periodConfirmations, withConfirmations } from "./quality-confirmations";
import { currentCapitalProfile } from "./capital-profile";
import { attributesFromStored, standardisedQualityItems } from "@/lib/uploads/position-attributes";

/** Raise when the checks change what they report: every stored report is then computed again on its next read. */
export const QUALITY_REPORT_VERSION = 1;

export interface DataQualityView {
  periodEnd: string;
  uploadId: string | null;
  fileName: string | null;
  positions: number;
  report: QualityReport;
  /** when the report was computed (the real time) */
  computedAt: string;
}

/** The period's confirmed positions upload, if any. */
export async function confirmedPositionsUpload(actor: Actor, periodId: string) {
  const [row] = await getDb()
    .select()
    .from(uploads)
    .where(and(eq(uploads.firmId, actor.firmId), eq(uploads.periodId, periodId), eq(uploads.kind, "positions"), eq(uploads.status, "confirmed")));
  return row ?? null;
}

/**
 * The fingerprint of everything the period's report reads, as it is now (through `exec`: the database or a
 * transaction). Another firm's period is not found.
 */
export async function qualityInputsKey(exec: Database | Tx, actor: Pick<Actor, "firmId" | "reportingCurrency">, periodId: string): Promise<string> {
  const firmId = actor.firmId;
  const [period] = await exec
    .select({ periodEnd: reportingPeriods.periodEnd })
    .from(reportingPeriods)
    .where(and(eq(reportingPeriods.id, periodId), eq(reportingPeriods.firmId, firmId)));
  if (!period) throw new AppError("not_found:period", "No such reporting period.");
  const [positionUploads, priceUploads, holidayRows, profile, confirmations] = await Promise.all([
    exec
      .select({ id: uploads.id })
      .from(uploads)
      .where(and(eq(uploads.firmId, firmId), eq(uploads.periodId, periodId), eq(uploads.kind, "positions"), eq(uploads.status, "confirmed"))),
    exec
      .select({ id: uploads.id })
      .from(uploads)
      .where(and(eq(uploads.firmId, firmId), eq(uploads.kind, "prices"), inArray(uploads.status, ["confirmed", "superseded"]))),
    exec.select({ date: holidays.date }).from(holidays).where(eq(holidays.firmId, firmId)),
    exec
      .select({ id: capitalRuleProfiles.id })
      .from(capitalRuleProfiles)
      .where(and(eq(capitalRuleProfiles.firmId, firmId), eq(capitalRuleProfiles.active, true))),
    exec
      .select({ id: qualityConfirmations.id })
      .from(qualityConfirmations)
      .where(and(eq(qualityConfirmations.firmId, firmId), eq(qualityConfirmations.periodId, periodId))),
  ]);
  const ids = (rows: { id: string }[]) => rows.map((r) => r.id).sort();
  return hashOf({
    version: QUALITY_REPORT_VERSION,
    periodId,
    periodEnd: period.periodEnd,
    reportingCurrency: actor.reportingCurrency,
    positions: ids(positionUploads),
    prices: ids(priceUploads),
    holidays: holidayRows.map((h) => h.date).sort(),
    capitalProfile: ids(profile),
    confirmations: ids(confirmations),
  });
}

/** Compute the report from the stored data (the slow part: every close up to the period end). */
async function computeReport(actor: Actor, periodId: string): Promise<Omit<DataQualityView, "computedAt">> {
  const period = await getPeriod(actor, periodId);
  const upload = await confirmedPositionsUpload(actor, periodId);
  const rows = upload
    ? await getDb().select().from(positions).where(and(eq(positions.firmId, actor.firmId), eq(positions.uploadId, upload.id)))
    : [];
  const series = await priceSeries(actor.firmId, period.periodEnd);
  const { holidays: holidaySet } = await getCalendar(actor.firmId);
  // under a profile that files the standardised figure, each confirmed position lacking what its block needs
  const profile = await currentCapitalProfile(actor);
  const extraItems =
    profile?.filedRegime === "standardised"
      ? standardisedQualityItems(
          rows.map((r) => ({ row: r.rowNumber, instrument: r.instrument, assetClass: r.assetClass, currency: r.currency, quantity: r.quantity, marketValue: r.marketValue, attributes: attributesFromStored(r) })),
          { reportingCurrency: actor.reportingCurrency, asOf: period.periodEnd, profile: profile.standardised },
        )
      : [];
  const report = dataQualityReport(
    rows.map((r) => ({ instrument: r.instrument, currency: r.currency, quantity: r.quantity, price: r.price, marketValue: r.marketValue })),
    series,
    { reportingCurrency: actor.reportingCurrency, periodEnd: period.periodEnd, holidays: holidaySet, extraItems },
  );
  // findings that ask for confirmation carry it once someone confirmed them (who, when, why)
  report.items = withConfirmations(report.items, await periodConfirmations(actor, periodId));
  return { periodEnd: period.periodEnd, uploadId: upload?.id ?? null, fileName: upload?.fileName ?? null, positions: rows.length, report };
}

/** How many reports this process computed (for tests: a served report that was not computed leaves it unchanged). */
export const qualityComputations = { count: 0 };

// One computation per firm, period and inputs at a time in this process: concurrent readers of a report being
// computed wait for it instead of computing it again.
const inFlight = new Map<string, Promise<DataQualityView>>();

/**
 * Compute the period's report for the inputs as they are now and store it. Stored only when the inputs key read
 * in the storing transaction is the key read before computing, so a stored report always matches its key.
 */
export async function refreshDataQuality(actor: Actor, periodId: string, keyBefore?: string): Promise<DataQualityView> {
  const key = keyBefore ?? (await qualityInputsKey(getDb(), actor, periodId));
  const flight = `${actor.firmId}|${periodId}|${key}`;
  const running = inFlight.get(flight);
  if (running) return running;
  const work = (async () => {
    qualityComputations.count++;
    const computed = await computeReport(actor, periodId);
    const computedAt = now().toISOString();
    await getDb().transaction(async (tx) => {
      if ((await qualityInputsKey(tx, actor, periodId)) !== key) return; // inputs changed meanwhile: serve, do not store
      const values = { inputsKey: key, uploadId: computed.uploadId, fileName: computed.fileName, positionCount: computed.positions, report: computed.report, computedAt };
      await tx
        .insert(dataQualityReports)
        .values({ firmId: actor.firmId, periodId, ...values })
        .onConflictDoUpdate({ target: [dataQualityReports.firmId, dataQualityReports.periodId], set: values });
    });
    return { ...computed, computedAt };
  })();
  inFlight.set(flight, work);
  try {
    return await work;
  } finally {
    inFlight.delete(flight);
  }
}

/** The stored report when it was computed from the inputs as they are now, else null. */
export async function storedDataQuality(actor: Actor, periodId: string, key?: string): Promise<DataQualityView | null> {
  const current = key ?? (await qualityInputsKey(getDb(), actor, periodId));
  const [row] = await getDb()
    .select()
    .from(dataQualityReports)
    .where(and(eq(dataQualityReports.firmId, actor.firmId), eq(dataQualityReports.periodId, periodId)));
  if (!row || row.inputsKey !== current) return null;
  const [period] = await getDb()
    .select({ periodEnd: reportingPeriods.periodEnd })
    .from(reportingPeriods)
    .where(and(eq(reportingPeriods.id, periodId), eq(reportingPeriods.firmId, actor.firmId)));
  return { periodEnd: period!.periodEnd, uploadId: row.uploadId, fileName: row.fileName, positions: row.positionCount, report: row.report, computedAt: row.computedAt };
}

/**
 * The report for a period; an empty report (with a note) when no positions are confirmed yet. The stored report
 * when its inputs are the current ones; otherwise computed now, stored and served (never a report of other inputs).
 */
export async function getDataQuality(actor: Actor, periodId: string): Promise<DataQualityView> {
  const key = await qualityInputsKey(getDb(), actor, periodId);
  return (await storedDataQuality(actor, periodId, key)) ?? refreshDataQuality(actor, periodId, key);
}

