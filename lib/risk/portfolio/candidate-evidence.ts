/** Candidate evidence on the firm's book outside a run: the month-end computation asked for its candidates. */
import type { CandidateEvidence, CandidateMethod } from "../process/types";
import { standardCandidates } from "./candidates";
import { runMonthEnd, type MonthEndInput, type MonthEndResult } from "./run-month-end";

/**
 * The candidates' backtests on the book: the run's own method first, then `given` configurations (basis "method",
 * each computed as a run with those pieces of the method changed), then the candidates (standard by default).
 * This runs the month-end computation; inside a run, ask for `method.candidates` instead.
 * @throws {RangeError} on impossible input (as runMonthEnd)
 */
export function candidateEvidence(input: MonthEndInput, options: { candidates?: CandidateMethod[]; given?: CandidateMethod[]; archOrder?: number } = {}): CandidateEvidence {
  const own = options.candidates ?? standardCandidates(options.archOrder ?? 5);
  const result: MonthEndResult = runMonthEnd({ ...input, method: { ...(input.method ?? {}), candidates: { include: "none", extra: [...(options.given ?? []), ...own] } } });
  return result.candidates as CandidateEvidence;
}
