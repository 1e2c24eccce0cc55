/** The month-end run's stressed VaR: the primary method on a stress window, searched or chosen by the analyst. */
import { historicalTail } from "../../var/historical";
import { overlappingSums } from "../../var/scaling";
import { searchStressWindow } from "../../var/stressed";
import { equalWeightCovariance } from "../covariance";
import type { VarCore } from "./figures";
import { evaluateParametric, scenarioPnl } from "./kernels";
import type { StressedFigures, VarFigure } from "./types";

/** Stressed VaR and ES of today's book per confidence, with the window, how it was chosen and the statement. */
export function stressedVar(core: VarCore): { stressed: StressedFigures; S: number } {
  const { dates, returns, exposures, method, warnings, L, H, profile, confidences, paramOptions, pnl, scalingFor, windowScenarios } = core;
  const primary = method.primaryMethod;
  const S = Math.min(method.stressWindowDays, L);
  let stressStart: number;
  let stressEnd: number;
  let searchRule: string | null = null;
  let windowsSearched: number | null = null;
  let chosenBy: "search" | "analyst";
  if (method.stressWindow === "search") {
    const search = searchStressWindow(pnl, S, profile.confidence, primary === "parametric" ? "parametric" : "historical");
    stressStart = search.best.start;
    stressEnd = search.best.end;
    searchRule = search.rule + " (searched within the working sample)";
    windowsSearched = search.windows;
    chosenBy = "search";
    if (S < method.stressWindowDays) warnings.push({ code: "short-stress-window", message: `The stress window is ${S} days: the working sample is shorter than ${method.stressWindowDays}.` });
  } else {
    const { start, end } = method.stressWindow as { start: string; end: string };
    stressStart = dates.findIndex((d) => d >= start);
    let last = -1;
    for (let t = L - 1; t >= 0; t--) if (dates[t] <= end) { last = t; break; }
    if (stressStart < 0 || last < stressStart) throw new RangeError(`runMonthEnd: the stress window ${start} to ${end} has no days in the working sample (${dates[0]} to ${dates[L - 1]})`);
    stressEnd = last + 1;
    chosenBy = "analyst";
    if (stressEnd - stressStart < 250) warnings.push({ code: "short-stress-window", message: `The chosen stress window has ${stressEnd - stressStart} days, fewer than the 250 of a 12-month period.` });
    if (dates[0] > start) warnings.push({ code: "stress-window-clipped", message: `The stress window starts at ${dates[stressStart]}: the working sample has no earlier days.` });
  }
  const stressScenarios = windowScenarios(stressStart, stressEnd);
  const stressCov = primary === "parametric" ? equalWeightCovariance(returns, { start: stressStart, end: stressEnd }) : null;
  const stressedByConfidence = confidences.map((c) => {
    let one: VarFigure;
    let ten: VarFigure;
    if (stressCov) {
      const e1 = evaluateParametric(stressCov, exposures, c, paramOptions);
      one = { var: e1.var, es: e1.es };
      ten = { var: e1.var * Math.sqrt(H), es: e1.es * Math.sqrt(H) };
    } else {
      const p = scenarioPnl(stressScenarios, exposures);
      const t1 = historicalTail(p, c);
      one = { var: t1.var, es: t1.es };
      if (scalingFor(primary) === "overlap") {
        const t10 = historicalTail(overlappingSums(p, H), c);
        ten = { var: t10.var, es: t10.es };
      } else ten = { var: t1.var * Math.sqrt(H), es: t1.es * Math.sqrt(H) };
    }
    return { confidence: c, oneDay: one, horizon: ten };
  });
  const stressed: StressedFigures = {
    method: primary,
    window: { start: dates[stressStart], end: dates[stressEnd - 1], days: stressEnd - stressStart, chosenBy },
    searchRule,
    windowsSearched,
    byConfidence: stressedByConfidence,
    statement:
      primary === "parametric"
        ? `Stressed VaR: parametric VaR of today's book with the equal-weight, zero-mean covariance of the stress window (a recursive or GARCH estimate over one window would depend on its start-up); ${H} days by ${scalingFor(primary) === "term" ? "square-root-of-time (the term structure does not apply to a window estimate)" : "square-root-of-time"}.`
        : `Stressed VaR: historical simulation of today's book over the stress window's returns, unfiltered (filtering would rescale the stress away); ${H} days by ${scalingFor(primary) === "overlap" ? `overlapping ${H}-day returns` : "square-root-of-time"}.`,
  };
  return { stressed, S };
}
