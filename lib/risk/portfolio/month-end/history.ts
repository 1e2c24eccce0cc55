/** The month-end run's VaR history: one out-of-sample forecast per past day for the static book, by the primary method. */
import { sortedWindowLosses } from "../../var/historical";
import { esMultiplier, varMultiplier } from "../../var/parametric";
import { garchHorizonVariance, overlappingSums } from "../../var/scaling";
import { matVec, type SymmetricMatrix } from "../matrix";
import { correlationForm, factorHorizonVariance, forEachBlock, forEachDailyCovariance, matrixForm, neededReturns, refitBlocks } from "../per-factor";
import type { VarCore } from "./figures";
import { dot, evaluateParametric, tailOfSorted } from "./kernels";
import { cccAt } from "./matrix-checks";
import type { ProgressCallback, VarHistoryPoint, VolatilityModel } from "./types";

/** The VaR and ES series from the first forecast day to today (index n is day from + n), and the points shown. */
export interface VarHistory {
  from: number;
  var1: Float64Array[];
  var10: Float64Array[];
  es1: Float64Array[];
  es10: Float64Array[];
  points: VarHistoryPoint[];
}

type Blocks = ReturnType<typeof refitBlocks>;

/** The first day with a forecast: as far back as the backtest and history ask, as far as the method's data allows. */
function historyStart(core: VarCore): number {
  const { method, L, W, warnings, prepared } = core;
  const primary = method.primaryMethod;
  const B = method.backtestDays;
  const Hd = method.historyDays;
  const pfState = prepared.perFactor;
  let needBefore = primary === "parametric" ? (method.covariance === "equal" ? Math.min(method.covarianceWindow, L) : 1) : W;
  if (pfState && primary !== "historical") {
    const c = pfState.correlationSpec;
    // the correlation's own window, the variance paths' start, and (rolling) the earliest refit's data
    needBefore = primary === "parametric" ? (c.kind === "equal" ? c.window : c.kind === "ccc" ? pfState.firstDefined + 2 : 1) : W + pfState.firstDefined;
    if (method.backtestRefit.mode === "rolling") {
      const most = Math.max(...pfState.specs.map((f) => neededReturns(f.spec)));
      needBefore = Math.max(needBefore, most + method.backtestRefit.everyDays - 1);
    }
  }
  let span = Math.max(B, Hd - 1);
  if (L - span < needBefore) {
    span = Math.max(0, L - needBefore);
    warnings.push({ code: "short-history", message: `Only ${span} past days can be backtested or shown in the VaR history with this method and sample (asked for ${B} and ${Hd}).` });
  }
  return L - span;
}

/** The book's one-day (and, under term scaling, horizon) P&L volatility forecast for each day from `from` to today. */
function parametricSigmas(core: VarCore, from: number, count: number, blocks: Blocks, onProgress?: ProgressCallback): { sigma1: Float64Array; sigma10: Float64Array } {
  const { prepared, method, L, k, H, dates, returns, exposures, covariance, covariance10, correlation, volatility, paramOptions, pnl, scalingFor } = core;
  const pfState = prepared.perFactor;
  const scalingPrimary = scalingFor(method.primaryMethod);
  const sigma1 = new Float64Array(count);
  const sigma10 = new Float64Array(count);
  if (pfState) {
    // D from each factor's process as fitted on the stated schedule; R by the chosen estimator, data up to s − 1
    const term = pfState.term;
    const hist = Array.from({ length: k }, () => new Float64Array(count));
    const hist10 = term ? Array.from({ length: k }, () => new Float64Array(count)) : null;
    const corr = pfState.correlationSpec;
    const w = new Float64Array(k);
    const w10 = new Float64Array(k);
    const scratch = new Float64Array(k);
    let done = 0;
    forEachBlock(returns, pfState.specs, pfState.fits, blocks, dates, (block, { fits, paths }) => {
      let R: SymmetricMatrix | null = null;
      if (corr.kind === "ccc") {
        R = block.tau === L || method.backtestRefit.mode === "full-sample" ? (correlation as SymmetricMatrix) : cccAt(returns, paths, pfState.firstDefined, block.tau);
      }
      for (let s = block.start; s < block.end; s++) {
        if (s >= L) continue;
        const n = s - from;
        for (let i = 0; i < k; i++) {
          const h = paths[i][s];
          hist[i][n] = h;
          if (hist10) hist10[i][n] = factorHorizonVariance(fits[i], h, returns[i], s, H, true);
        }
        if (R) {
          for (let i = 0; i < k; i++) {
            w[i] = exposures[i] * Math.sqrt(hist[i][n]);
            if (hist10) w10[i] = exposures[i] * Math.sqrt(hist10[i][n]);
          }
          sigma1[n] = Math.sqrt(Math.max(0, matrixForm(R, w)));
          if (hist10) sigma10[n] = Math.sqrt(Math.max(0, matrixForm(R, w10)));
        }
      }
      done += block.end - block.start;
      onProgress?.("history", Math.min(1, done / count));
    });
    if (corr.kind !== "ccc") {
      forEachDailyCovariance(corr, returns, from, L, (s, cov) => {
        const n = s - from;
        for (let i = 0; i < k; i++) w[i] = exposures[i] * Math.sqrt(hist[i][n]);
        sigma1[n] = Math.sqrt(Math.max(0, correlationForm(cov, w, k, scratch)));
        if (hist10) {
          for (let i = 0; i < k; i++) w10[i] = exposures[i] * Math.sqrt(hist10[i][n]);
          sigma10[n] = Math.sqrt(Math.max(0, correlationForm(cov, w10, k, scratch)));
        }
      });
    }
    // today's point: exactly today's figures
    sigma1[L - from] = evaluateParametric(covariance, exposures, 0.99, paramOptions).sigma;
    if (covariance10) sigma10[L - from] = evaluateParametric(covariance10, exposures, 0.99, paramOptions).sigma;
  } else if (method.covariance === "equal") {
    const C = Math.min(method.covarianceWindow, L);
    for (let s = from; s <= L; s++) {
      let ss = 0;
      for (let u = s - C; u < s; u++) ss += pnl[u] * pnl[u];
      sigma1[s - from] = Math.sqrt(ss / C);
    }
  } else if (method.covariance === "ewma") {
    // e'Σₛe follows the same recursion on the book's P&L: σ²ₛ₊₁ = λσ²ₛ + (1−λ)pₛ²
    const st = Math.min(method.startupDays, L);
    let v = 0;
    for (let t = 0; t < st; t++) v += pnl[t] * pnl[t];
    v /= st;
    for (let s = 0; s <= L; s++) {
      if (s >= from) sigma1[s - from] = Math.sqrt(v);
      if (s < L) v = method.lambda * v + (1 - method.lambda) * pnl[s] * pnl[s];
    }
  } else {
    const vm = volatility as VolatilityModel;
    const R = correlation as SymmetricMatrix;
    const w = new Float64Array(k);
    const w10 = new Float64Array(k);
    for (let s = from; s <= L; s++) {
      for (let i = 0; i < k; i++) {
        const h = s >= L ? vm.current[i] : vm.variance[i][s];
        w[i] = exposures[i] * Math.sqrt(h);
        if (scalingPrimary === "term") w10[i] = exposures[i] * Math.sqrt(garchHorizonVariance(h, vm.params[i], H));
      }
      sigma1[s - from] = Math.sqrt(Math.max(0, dot(w, matVec(R, w))));
      if (scalingPrimary === "term") sigma10[s - from] = Math.sqrt(Math.max(0, dot(w10, matVec(R, w10))));
    }
  }
  return { sigma1, sigma10 };
}

/** Historical or filtered simulation's VaR and ES for each day from `from` to today, written into the series. */
function simulationTails(core: VarCore, from: number, count: number, blocks: Blocks, out: Omit<VarHistory, "from" | "points">, onProgress?: ProgressCallback): void {
  const { prepared, method, L, k, H, W, dates, returns, exposures, volatility, pnl, confidences, scalingFor } = core;
  const { var1, var10, es1, es10 } = out;
  const primary = method.primaryMethod;
  const pfState = prepared.perFactor;
  const cCount = confidences.length;
  const sqrtH = Math.sqrt(H);
  const scalingPrimary = scalingFor(primary);
  const scratch = new Float64Array(W);
  const scratch10 = new Float64Array(W);
  const vm = volatility;
  const p = new Float64Array(W);
  const tails = (n: number): void => {
    const sorted = sortedWindowLosses(p, 0, W, scratch);
    let sorted10: Float64Array | null = null;
    if (scalingPrimary === "overlap") sorted10 = sortedWindowLosses(overlappingSums(p, H), 0, W - H + 1, scratch10);
    for (let c = 0; c < cCount; c++) {
      const t1 = tailOfSorted(sorted, confidences[c]);
      var1[c][n] = t1.var; es1[c][n] = t1.es;
      if (sorted10) {
        const t10 = tailOfSorted(sorted10, confidences[c]);
        var10[c][n] = t10.var; es10[c][n] = t10.es;
      } else { var10[c][n] = t1.var * sqrtH; es10[c][n] = t1.es * sqrtH; }
    }
  };
  if (pfState && primary === "filtered") {
    // each factor rescaled by its own process, as fitted on the stated schedule (today's point: today's fits)
    let done = 0;
    forEachBlock(returns, pfState.specs, pfState.fits, blocks, dates, (block, { paths }) => {
      for (let s = block.start; s < block.end; s++) {
        p.fill(0);
        for (let i = 0; i < k; i++) {
          const r = returns[i];
          const hv = s >= L ? (vm as VolatilityModel).variance[i] : paths[i];
          const now = s >= L ? (vm as VolatilityModel).current[i] : paths[i][s];
          const e = exposures[i];
          for (let u = 0; u < W; u++) p[u] += e * r[s - W + u] * Math.sqrt(now / hv[s - W + u]);
        }
        tails(s - from);
      }
      done += block.end - block.start;
      onProgress?.("history", Math.min(1, done / count));
    });
  } else for (let s = from; s <= L; s++) {
    const n = s - from;
    if (primary === "historical") for (let u = 0; u < W; u++) p[u] = pnl[s - W + u];
    else {
      p.fill(0);
      for (let i = 0; i < k; i++) {
        const r = returns[i];
        const hv = (vm as VolatilityModel).variance[i];
        const now = s >= L ? (vm as VolatilityModel).current[i] : hv[s];
        const e = exposures[i];
        for (let u = 0; u < W; u++) p[u] += e * r[s - W + u] * Math.sqrt(now / hv[s - W + u]);
      }
    }
    tails(n);
    if (n % 25 === 0) onProgress?.("history", n / count);
  }
}

/** VaR history: forecasts f_s for day s made with data up to s − 1, for s = from..L (s = L is today's figure). */
export function varHistory(core: VarCore, onProgress?: ProgressCallback): VarHistory {
  const { method, L, H, dates, confidences, paramOptions } = core;
  const primary = method.primaryMethod;
  const Hd = method.historyDays;
  const from = historyStart(core);
  const count = L - from + 1;
  const cCount = confidences.length;
  const series = (n: number) => Array.from({ length: cCount }, () => new Float64Array(n));
  const var1 = series(count), var10 = series(count), es1 = series(count), es10 = series(count);
  const blocks = core.prepared.perFactor && primary !== "historical" ? refitBlocks(L, from, method.backtestRefit) : [];
  const qs = confidences.map((c) => varMultiplier(c, paramOptions));
  const qEs = confidences.map((c) => esMultiplier(c, paramOptions));
  if (primary === "parametric") {
    const sqrtH = Math.sqrt(H);
    const scalingPrimary = core.scalingFor(primary);
    const { sigma1, sigma10 } = parametricSigmas(core, from, count, blocks, onProgress);
    for (let n = 0; n < count; n++) {
      const s10 = scalingPrimary === "term" ? sigma10[n] : sigma1[n] * sqrtH;
      for (let c = 0; c < cCount; c++) {
        var1[c][n] = qs[c] * sigma1[n]; es1[c][n] = qEs[c] * sigma1[n];
        var10[c][n] = qs[c] * s10; es10[c][n] = qEs[c] * s10;
      }
    }
  } else simulationTails(core, from, count, blocks, { var1, var10, es1, es10 }, onProgress);
  const asOfIndex = (s: number) => dates[s - 1];
  const points: VarHistoryPoint[] = [];
  for (let s = Math.max(from, L - Hd + 1); s <= L; s++) {
    const n = s - from;
    points.push({ asOf: asOfIndex(s), var1d: var1.map((v) => v[n]), varHorizon: var10.map((v) => v[n]), es1d: es1.map((v) => v[n]), esHorizon: es10.map((v) => v[n]) });
  }
  onProgress?.("history", 1);
  return { from, var1, var10, es1, es10, points };
}
