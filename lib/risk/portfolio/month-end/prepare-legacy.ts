/** Preparing a run with one covariance model for every factor (the methods written before per-factor processes). */
import { fitGarch11 } from "../../estimators/garch11";
import { ewmaVariance } from "../../estimators/ewma-variance";
import type { Garch11Params } from "../../estimators/garch11-variance";
import type { EngineWarning } from "../../types";
import { equalWeightCovariance, ewmaCovariance, standardisedCorrelation } from "../covariance";
import { correlationToCovariance, type SymmetricMatrix } from "../matrix";
import { checkPsd, repairPsd, type PsdRepair } from "../psd";
import { countOf, listSome } from "../../../text/count";
import { nearestCorrelationRepair, psdWarnings, stripMatrix } from "./matrix-checks";
import type { PreparedRun, ProgressCallback, VolatilityModel } from "./types";

/** Per-factor volatility of a legacy method: GARCH(1,1) for garch-ccc, EWMA where filtering needs it, else none. */
export function legacyVolatility(method: PreparedRun["method"], factorIds: string[], returns: Float64Array[], warnings: EngineWarning[], onProgress?: ProgressCallback): VolatilityModel | null {
  const k = returns.length;
  const L = returns[0].length;
  let volatility: VolatilityModel | null = null;
  const startup = Math.min(method.startupDays, L);
  const ewmaModel = (): VolatilityModel => {
    const variance: Float64Array[] = [];
    const current = new Float64Array(k);
    for (let i = 0; i < k; i++) {
      let s = 0;
      for (let t = 0; t < startup; t++) s += returns[i][t] ** 2;
      const path = ewmaVariance(returns[i], method.lambda, Math.max(s / startup, 1e-300));
      variance.push(path.variance);
      current[i] = path.currentVariance;
    }
    const p = { omega: 0, alpha: 1 - method.lambda, beta: method.lambda };
    return { variance, current, params: new Array(k).fill(p), labels: new Array(k).fill(`ewma λ=${method.lambda}`), paramsOut: new Array(k).fill({ lambda: method.lambda }) };
  };
  if (method.covariance === "garch-ccc") {
    const variance: Float64Array[] = [];
    const current = new Float64Array(k);
    const params: Garch11Params[] = [];
    const labels: string[] = [];
    const paramsOut: Record<string, number>[] = [];
    const fellBack: string[] = [];
    const failed: string[] = [];
    const fitWarnings = new Map<string, string[]>();
    for (let i = 0; i < k; i++) {
      try {
        const fit = fitGarch11(returns[i], { mean: "zero", fallback: "ewma" });
        variance.push(fit.variance);
        current[i] = fit.currentVariance;
        if (fit.kind === "garch") {
          params.push({ omega: fit.params.omega, alpha: fit.params.alpha, beta: fit.params.beta });
          labels.push("garch(1,1)");
        } else {
          const lambda = fit.params.lambda ?? 0.94;
          params.push({ omega: 0, alpha: 1 - lambda, beta: lambda });
          labels.push(`ewma λ=${lambda} (GARCH fallback)`);
          fellBack.push(factorIds[i]);
        }
        paramsOut.push({ ...fit.params });
        for (const w of fit.warnings) {
          const list = fitWarnings.get(w.code) ?? [];
          list.push(factorIds[i]);
          fitWarnings.set(w.code, list);
        }
      } catch (error) {
        let s = 0;
        for (let t = 0; t < startup; t++) s += returns[i][t] ** 2;
        const path = ewmaVariance(returns[i], method.lambda, Math.max(s / startup, 1e-300));
        variance.push(path.variance);
        current[i] = path.currentVariance;
        params.push({ omega: 0, alpha: 1 - method.lambda, beta: method.lambda });
        labels.push(`ewma λ=${method.lambda} (GARCH failed)`);
        paramsOut.push({ lambda: method.lambda });
        failed.push(`${factorIds[i]}: ${error instanceof Error ? error.message : String(error)}`);
      }
      if (i % 25 === 0) onProgress?.("volatility", i / k);
    }
    if (fellBack.length) warnings.push({ code: "garch-fallback", message: `GARCH(1,1) failed or was near-integrated for ${countOf(fellBack.length, "factor")}; EWMA (λ = 0.94) is used instead: ${listSome(fellBack, 10)}.` });
    if (failed.length) warnings.push({ code: "garch-failed", message: `GARCH(1,1) could not be fitted for ${countOf(failed.length, "factor")}; EWMA is used: ${listSome(failed, 5, "; ")}.` });
    for (const [code, list] of fitWarnings) {
      if (code === "near-integrated" || code === "not-converged") continue; // reported as garch-fallback above
      warnings.push({ code: `garch-${code}`, message: `GARCH(1,1) fit warning "${code}" for ${countOf(list.length, "factor")}: ${listSome(list, 10)}.` });
    }
    volatility = { variance, current, params, labels, paramsOut };
  } else if (method.methods.includes("filtered")) {
    volatility = ewmaModel();
  }
  for (let i = 0; i < k; i++) {
    const v = volatility?.current[i];
    if (v !== undefined && !(v > 0)) throw new RangeError(`runMonthEnd: factor "${factorIds[i]}" has zero variance`);
  }
  onProgress?.("volatility", 1);
  return volatility;
}

/** The one-day covariance of a legacy method (and garch-ccc's correlation), PSD-checked and repaired if need be. */
export function legacyCovariance(method: PreparedRun["method"], returns: Float64Array[], volatility: VolatilityModel | null, warnings: EngineWarning[], onProgress?: ProgressCallback): Pick<PreparedRun, "covariance" | "correlation" | "psd"> {
  const L = returns[0].length;
  const startup = Math.min(method.startupDays, L);
  let covariance: SymmetricMatrix;
  let correlation: SymmetricMatrix | null = null;
  let psd: PreparedRun["psd"];
  if (method.covariance === "garch-ccc" && volatility) {
    correlation = standardisedCorrelation(returns, volatility.variance);
    const check = checkPsd(correlation);
    let repair: PsdRepair | null = null;
    if (check.status === "indefinite") {
      repair = nearestCorrelationRepair(correlation);
      correlation = repair.matrix;
    }
    covariance = correlationToCovariance(correlation, volatility.current.map(Math.sqrt));
    psd = { matrix: "correlation", check, repair: repair && stripMatrix(repair) };
  } else {
    if (method.covariance === "equal") {
      const w = Math.min(method.covarianceWindow, L);
      covariance = equalWeightCovariance(returns, { start: L - w, end: L });
    } else covariance = ewmaCovariance(returns, method.lambda, { startupDays: startup });
    const check = checkPsd(covariance);
    let repair: PsdRepair | null = null;
    if (check.status === "indefinite") {
      repair = repairPsd(covariance);
      covariance = repair.matrix;
    }
    psd = { matrix: "covariance", check, repair: repair && stripMatrix(repair) };
  }
  psdWarnings(psd, warnings);
  onProgress?.("covariance", 1);
  return { covariance, correlation, psd };
}
