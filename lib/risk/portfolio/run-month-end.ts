/**
 * A month-end run: positions and aligned factor returns in, every figure a filing reports out, in one plain
 * object — VaR and ES at one day and the method's horizon per confidence and method, component VaR by position, asset class
 * and currency, stand-alone VaR by asset class and the diversification benefit, stressed VaR with its window,
 * the VaR history of the last 60 days, the 250-day backtest, capital with every term, and the warnings,
 * limitations and choices that apply. Pure: no I/O, no clock, no randomness.
 *
 * The public face of the run; the parts live in month-end/ by concern: types (the contract), prepare (defaults,
 * usable factors, exposures; prepare-legacy and prepare-per-factor for the two covariance paths, matrix-checks for
 * PSD checks and repairs), kernels (scenario P&L and evaluation), figures (VaR and ES per method; portfolioVar),
 * stressed (stressed VaR), history (the VaR history), statements (resolved model, limitations, choices) and run
 * (runMonthEnd: backtest, capital, candidate evidence, the result).
 */
export type {
  VarMethod, CovarianceChoice, FactorReturns, MonthEndMethod, MonthEndInput, ProgressCallback, VarFigure, PositionContribution, GroupFigure,
  ConfidenceFigures, MethodFigures, StressedFigures, VarHistoryPoint, MonthEndResult, PerFactorState, PreparedRun,
} from "./month-end/types";
export { prepareRun } from "./month-end/prepare";
export { portfolioVar, type PortfolioVarResult } from "./month-end/figures";
export { runMonthEnd } from "./month-end/run";
export { resolveModel, storedCorrelation } from "./month-end/statements";
