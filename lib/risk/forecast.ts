/**
 * Variance forecasts: the kernels (lib/risk/forecast-kernels.ts) and the forecast of any fit through the process
 * registry. GARCH reverts towards its long-run variance V_L; the moving average and EWMA forecast a flat line.
 */
import type { VolatilityFit } from "./types";
import { forecastOfFit } from "./process/registry";

export * from "./forecast-kernels";

/** Variance forecasts for t = 1..horizonDays from any fit: GARCH and ARCH revert, MA and EWMA are flat (through the process registry). */
export function forecastVariance(fit: VolatilityFit, horizonDays: number): Float64Array {
  return forecastOfFit(fit, horizonDays);
}
