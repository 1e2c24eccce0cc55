/**
 * The one table of per-estimator defaults: the settings a newly chosen estimator starts with in the method form, and
 * the settings the run uses to show the families an asset class does not choose. Pure; shared by server and client.
 */
import type { EstimatorChoice } from "@/lib/validation/method";

/**
 * Each family's default settings:
 * - moving average over 250 days (about one trading year; common practice, no source), zero mean, divisor M;
 * - EWMA with λ = 0.94 (J.P. Morgan/Reuters, RiskMetrics Technical Document, 4th ed., 1996, for daily data);
 * - ARCH(1), the lowest order (Engle 1982's model; the order is common practice, no source);
 * - GARCH(1,1) with normal errors, zero mean, no variance targeting, falling back to EWMA where the fit fails
 *   (Bollerslev 1986's model; the fallback is Ballast's own choice).
 */
export const ESTIMATOR_DEFAULTS: Readonly<Record<EstimatorChoice["kind"], EstimatorChoice>> = {
  ma: { kind: "ma", window: 250, divisor: "m", mean: "zero" },
  ewma: { kind: "ewma", lambdaMode: "fixed", lambda: 0.94 },
  arch: { kind: "arch", order: 1 },
  garch: { kind: "garch", distribution: "normal", mean: "zero", targeting: false, fallback: "ewma" },
};

/** The default settings of one family (a fresh copy, safe to edit). */
export function estimatorDefault(kind: EstimatorChoice["kind"]): EstimatorChoice {
  return { ...ESTIMATOR_DEFAULTS[kind] } as EstimatorChoice;
}

/** The sentence a run states about the families it shows beside the chosen one. */
export const OTHER_FAMILIES_STATEMENT =
  "Families the asset class does not choose are shown with their default settings: a 250-day moving average (zero mean, divisor M), EWMA with λ = 0.94, ARCH(1), and GARCH(1,1) with normal errors and zero mean, falling back to EWMA where the fit fails.";
