/**
 * Evidence on the firm's own book: for each candidate configuration, the out-of-sample backtest over the run's
 * backtest days side by side (exceptions, zone, Kupiec and Christoffersen p-values, mean VaR, implied capital).
 * Standard candidates (basis "book") fit their process to the book's own daily P&L — today's positions on past
 * days — on the run's refit schedule, and forecast VaR = q·σ; a given configuration (basis "method") is the whole
 * method as a run computes it (per-factor processes, correlation, primary VaR method).
 */
import { fitProcess, filterFit, horizonVariance, resolveSpec, specLabel } from "../process/registry";
import type { BacktestRefit, CandidateEvidence, CandidateMethod, CandidateRow, ProcessFit, VolatilitySpec } from "../process/types";
import { runBacktest } from "../backtest/backtest";
import { capitalCharge, type CapitalProfile } from "../capital/capital";
import { varMultiplier } from "../var/parametric";
import { refitBlocks } from "./per-factor";
import type { MonthEndMethod } from "./run-month-end";

/**
 * The standard candidates: moving average 20 and 250 days, EWMA λ = 0.94, EWMA λ fitted, ARCH(m), GARCH(1,1) with
 * normal and with Student-t errors, each fitted to the book's own P&L (basis "book").
 */
export function standardCandidates(archOrder = 5): CandidateMethod[] {
  const book = (id: string, label: string, spec: VolatilitySpec): CandidateMethod => ({ id, label, basis: "book", spec });
  return [
    book("ma-20", "Moving average, 20 days", { kind: "ma", window: 20 }),
    book("ma-250", "Moving average, 250 days", { kind: "ma", window: 250 }),
    book("ewma-0.94", "EWMA, λ = 0.94", { kind: "ewma", lambda: 0.94 }),
    book("ewma-fit", "EWMA, λ fitted", { kind: "ewma", lambda: 0.94, fit: true }),
    book(`arch-${archOrder}`, `ARCH(${archOrder})`, { kind: "arch", order: archOrder }),
    book("garch-normal", "GARCH(1,1), normal errors", { kind: "garch" }),
    book("garch-t", "GARCH(1,1), Student-t errors", { kind: "garch", distribution: "t" }),
  ];
}

/** What a run hands the candidate stage. */
export interface CandidateContext {
  dates: readonly string[];
  /** the static book's P&L on every working day */
  pnl: Float64Array;
  /** first backtest day (index into dates) */
  backtestFrom: number;
  refit: BacktestRefit;
  confidence: number;
  profile: CapitalProfile;
  /** the run's stressed VaR at the profile's horizon (the same for every candidate) */
  stressedVar: number | null;
  /** horizon rule for the capital's horizon: each process's own term structure, or square-root-of-time */
  term: boolean;
}

/** A row for a candidate that could not be computed. */
export const failedRow = (c: CandidateMethod, error: string): CandidateRow => ({
  id: c.id, label: c.label, basis: c.basis, days: null, exceptions: null, zone: null, kupiecPValue: null, christoffersenIndependencePValue: null, christoffersenPValue: null,
  meanVar: null, capitalVarTerm: null, capital: null, plusFactor: null, var: null, error,
});

/** A row from a one-day VaR series over the backtest days and the profile-horizon VaR of the last averaging days. */
export function rowFromSeries(c: CandidateMethod, ctx: CandidateContext, var1: ArrayLike<number>, capitalVars: ArrayLike<number>): CandidateRow {
  const L = ctx.dates.length;
  const dates = ctx.dates.slice(ctx.backtestFrom, L);
  const pnl = ctx.pnl.subarray(ctx.backtestFrom, L);
  const bt = runBacktest(dates, pnl, var1, ctx.confidence);
  let mean = 0;
  for (let i = 0; i < var1.length; i++) mean += var1[i];
  mean /= var1.length;
  const withStressed = ctx.stressedVar !== null && ctx.profile.includeStressed;
  const profile = withStressed ? ctx.profile : { ...ctx.profile, includeStressed: false };
  const cap = capitalCharge({ varHistory: capitalVars, stressedVarHistory: withStressed ? new Array(capitalVars.length).fill(ctx.stressedVar) : undefined, plusFactor: bt.plusFactor }, profile);
  return {
    id: c.id, label: c.label, basis: c.basis, days: bt.days, exceptions: bt.exceptions, zone: bt.zone,
    kupiecPValue: bt.kupiec.pValue,
    christoffersenIndependencePValue: bt.christoffersen?.pValueInd ?? null,
    christoffersenPValue: bt.christoffersen?.pValueCc ?? null,
    meanVar: mean, capitalVarTerm: cap.varTerm, capital: withStressed ? cap.capital : null, plusFactor: bt.plusFactor,
    var: Array.from(var1), error: null,
  };
}

/**
 * One book-level candidate: its process fitted to the book's P&L on the refit schedule (latest fit first, each
 * warm-started from the next later one), each day's VaR from the data before it.
 */
export function bookCandidateRow(c: CandidateMethod, ctx: CandidateContext): CandidateRow {
  const spec = c.spec;
  if (!spec) return failedRow(c, "a book-level candidate needs a volatility process");
  try {
    const s = resolveSpec(spec);
    const L = ctx.dates.length;
    const Hp = ctx.profile.horizonDays;
    const first = Math.min(ctx.backtestFrom, L - ctx.profile.averagingDays + 1);
    const blocks = refitBlocks(L, first, ctx.refit);
    const var1 = new Float64Array(L - ctx.backtestFrom);
    const capitalVars = new Float64Array(ctx.profile.averagingDays);
    let later: ProcessFit | null = null;
    for (const block of blocks) {
      const warm: Record<string, number> | undefined = later && later.used.kind === s.kind ? later.params : undefined;
      const fit = fitProcess(ctx.pnl.subarray(0, block.tau), s, { warmStart: warm, lean: true });
      const path = filterFit(fit, ctx.pnl, block.tau);
      const q = varMultiplier(ctx.confidence, fit.used.kind === "garch" && fit.params.nu !== undefined ? { distribution: "t", nu: fit.params.nu } : {});
      for (let t = block.start; t < block.end; t++) {
        const h = path[t];
        if (!(h > 0)) throw new Error(`no positive variance on ${ctx.dates[Math.min(t, L - 1)]}`);
        if (t >= ctx.backtestFrom && t < L) var1[t - ctx.backtestFrom] = q * Math.sqrt(h);
        const a = t - (L - ctx.profile.averagingDays + 1);
        if (a >= 0) capitalVars[a] = q * Math.sqrt(ctx.term ? horizonVariance(fit, h, ctx.pnl, t, Hp) : Hp * h);
      }
      later = fit;
    }
    return rowFromSeries({ ...c, label: c.label || specLabel(s) }, ctx, var1, capitalVars);
  } catch (error) {
    return failedRow(c, (error as Error).message);
  }
}

/** The statement of the evidence. */
export function evidenceStatement(ctx: CandidateContext, days: number): string {
  const refit = ctx.refit.mode === "rolling" ? `parameters re-estimated every ${ctx.refit.everyDays} business days on the data before each refit day` : "parameters fitted once on the whole sample (in-sample)";
  return (
    `Each candidate's one-day ${ctx.confidence * 100} % VaR on each of the last ${days} days, from data up to the day before (${refit}), against the P&L of today's book on that day. ` +
    `Book-level candidates fit their process to the book's own daily P&L and take VaR = q·σ (q the normal quantile; the unit-variance Student-t quantile at the fitted ν for GARCH(1,1)-t); ` +
    `the run's own method uses per-factor processes and the correlation as the run computes them. Capital: max(last VaR, (m_c + plus factor) × mean VaR over ${ctx.profile.averagingDays} days) at ${ctx.profile.horizonDays} days (${ctx.term ? "each process's term structure" : "square-root-of-time"}), the plus factor from the candidate's own exceptions, ` +
    `${ctx.stressedVar !== null && ctx.profile.includeStressed ? "plus the run's stressed-VaR term, the same for every candidate." : "without a stressed-VaR term."}`
  );
}

/** The evidence from book-level candidates and rows already computed (the run's own method, given methods). */
export function candidateRows(ctx: CandidateContext, candidates: readonly CandidateMethod[], computed: readonly CandidateRow[]): CandidateEvidence {
  const L = ctx.dates.length;
  const rows = [...computed, ...candidates.filter((c) => c.basis === "book").map((c) => bookCandidateRow(c, ctx))];
  return {
    days: L - ctx.backtestFrom,
    confidence: ctx.confidence,
    dates: ctx.dates.slice(ctx.backtestFrom, L),
    pnl: Array.from(ctx.pnl.subarray(ctx.backtestFrom, L)),
    refit: ctx.refit,
    rows,
    statement: evidenceStatement(ctx, L - ctx.backtestFrom),
  };
}

/** The method of a "method" candidate: the run's own with the candidate's pieces changed and no candidates. */
export function methodOfCandidate(base: MonthEndMethod | undefined, c: CandidateMethod): MonthEndMethod {
  const m: MonthEndMethod = { ...(base ?? {}), ...(c.method ?? {}), candidates: { include: "none" } };
  // a candidate with one covariance model (no per-factor processes) keeps that model's own refit rule unless it
  // states one: the run's rolling rule does not apply to the legacy GARCH-CCC, which is fitted once
  if (!m.volatility && c.method?.backtestRefit === undefined) delete m.backtestRefit;
  if (!m.volatility) delete m.correlation;
  return m;
}
