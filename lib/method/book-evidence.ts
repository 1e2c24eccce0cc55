/**
 * The candidate-method evidence of a method statement version on the firm's own book: the engine's side-by-side
 * out-of-sample backtest of this version's method, the approved version's (when this is a later draft) and the
 * standard candidates (moving average 20 and 250, EWMA 0.94 and fitted, ARCH(m), GARCH(1,1) normal and t). Pure.
 */
import { candidateEvidence } from "@/lib/risk";
import type { CandidateMethod } from "@/lib/risk/process/types";
import { engineInputOf } from "@/lib/runs/compute";
import { engineMethodOf } from "@/lib/runs/method-map";
import type { RunInputs } from "@/lib/runs/types";
import type { EstimatorChoice, MethodContent } from "@/lib/validation/method";
import { ESTIMATOR_DEFAULTS } from "./defaults";
import type { BookEvidence } from "./evidence";

/** The ARCH order of the candidates: the one the statement chooses (first found), else the table's default. */
export function candidateArchOrder(content: MethodContent): number {
  const all: EstimatorChoice[] = [content.defaultEstimator, ...Object.values(content.byAssetClass).filter((e): e is EstimatorChoice => !!e)];
  const arch = all.find((e) => e.kind === "arch");
  return arch && arch.kind === "arch" ? arch.order : (ESTIMATOR_DEFAULTS.arch as Extract<EstimatorChoice, { kind: "arch" }>).order;
}

/** Another version's method as a candidate beside this one: its volatility source, correlation or one covariance. */
export function versionCandidate(version: number, content: MethodContent, capital: RunInputs["capitalProfile"]): CandidateMethod {
  const m = engineMethodOf(content, capital);
  return {
    id: `version-${version}`,
    label: `Approved version ${version}`,
    basis: "method",
    // keys present even when undefined, so that they replace this version's pieces
    method: { volatility: m.volatility, correlation: m.correlation, covariance: m.covariance, lambda: m.lambda },
  };
}

/** The evidence on a book (RunInputs of the firm's latest period read under `content`). Failures are stated, not thrown. */
export function bookEvidenceOf(
  book: { periodId: string; periodEnd: string; inputs: RunInputs } | null,
  content: MethodContent,
  version: number,
  approved: { version: number; content: MethodContent } | null,
): BookEvidence {
  const other = approved && approved.version !== version ? approved : null;
  const base = { periodId: book?.periodId ?? null, periodEnd: book?.periodEnd ?? null, version, approvedVersion: other?.version ?? null };
  if (!book) return { ...base, candidates: null, error: "No period has confirmed positions yet: the book-level backtest needs the firm's positions." };
  try {
    const inputs: RunInputs = { ...book.inputs, method: { ...book.inputs.method, content } };
    const input = engineInputOf(inputs);
    const given = other ? [versionCandidate(other.version, other.content, inputs.capitalProfile)] : [];
    return { ...base, candidates: candidateEvidence(input, { given, archOrder: candidateArchOrder(content) }), error: null };
  } catch (error) {
    return { ...base, candidates: null, error: error instanceof Error ? error.message : String(error) };
  }
}
