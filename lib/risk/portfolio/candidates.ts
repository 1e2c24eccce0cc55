/**
 * Evidence on the firm's own book: for each candidate configuration, the out-of-sample book-level backtest over
 * the backtest days side by side (exceptions, zone, Kupiec and Christoffersen p-values, mean VaR, implied capital).
 */
import type { CandidateEvidence, CandidateMethod } from "../process/types";
import type { MonthEndInput } from "./run-month-end";

/**
 * The standard candidates: moving average 20 and 250 days, EWMA λ = 0.94, EWMA λ fitted, ARCH(m), GARCH(1,1) with
 * normal and with Student-t errors, each fitted to the book's own P&L (basis "book").
 */
export function standardCandidates(archOrder = 5): CandidateMethod[] {
  void archOrder;
  throw new Error("standardCandidates: not implemented yet (issue 13 contract)");
}

/**
 * The candidates' backtests on the book. `given` adds configurations (e.g. the approved method and the draft),
 * basis "method": computed with the full method (per-factor processes and correlation) as a run would.
 * @throws {RangeError} on impossible input (as runMonthEnd)
 */
export function candidateEvidence(input: MonthEndInput, options: { candidates?: CandidateMethod[]; given?: CandidateMethod[]; archOrder?: number } = {}): CandidateEvidence {
  void input; void options;
  throw new Error("candidateEvidence: not implemented yet (issue 13 contract)");
}
