/**
 * GARCH(1,1) log-likelihood and its analytic gradient in the natural parameters, in one pass.
 * Internal to the fitting code; the plain reference loop in the tests checks it.
 */
import { logGamma, digamma } from "../special";

/** How the first day's variance is formed inside the likelihood. */
export type LikelihoodInit =
  | { kind: "backcast"; weights: Float64Array }
  | { kind: "unconditional" }
  | { kind: "fixed"; value: number };

/** A GARCH(1,1) likelihood problem: which parameters are free and how the start-up variance is formed. */
export interface Garch11Problem {
  x: Float64Array;
  fitMean: boolean;
  studentT: boolean;
  targeting: boolean;
  init: LikelihoodInit;
}

/** Names of the free parameters, in the order the parameter vector uses. */
export function garch11ParameterNames(p: Pick<Garch11Problem, "fitMean" | "studentT" | "targeting">): string[] {
  const names: string[] = [];
  if (p.fitMean) names.push("mu");
  if (!p.targeting) names.push("omega");
  names.push("alpha", "beta");
  if (p.studentT) names.push("nu");
  return names;
}

const LN_2PI = Math.log(2 * Math.PI);

/**
 * Log-likelihood at theta (free parameters in garch11ParameterNames order); writes the gradient when
 * gradient is given, and per-observation scores (T rows of k) when scores is given. −Infinity outside the domain.
 */
export function garch11LogLikelihood(p: Garch11Problem, theta: ArrayLike<number>, gradient?: Float64Array | null, scores?: Float64Array | null): number {
  const x = p.x;
  const n = x.length;
  let j = 0;
  const mu = p.fitMean ? theta[j++] : 0;
  let omega = p.targeting ? 0 : theta[j++];
  const alpha = theta[j++];
  const beta = theta[j++];
  const nu = p.studentT ? theta[j++] : 0;
  const persistence = alpha + beta;
  // variance targeting: ω = (1−α−β)·V, V = mean of squared residuals at mu
  let targetV = 0, dTargetVdMu = 0;
  if (p.targeting) {
    let s1 = 0, s2 = 0;
    for (let t = 0; t < n; t++) { const e = x[t] - mu; s1 += e; s2 += e * e; }
    targetV = s2 / n;
    dTargetVdMu = (-2 * s1) / n;
    omega = (1 - persistence) * targetV;
  }
  if (!(omega > 0) || !(alpha >= 0) || !(beta >= 0)) return -Infinity;
  if (p.studentT && !(nu > 2)) return -Infinity;
  let h: number, dhMu = 0, dhOm = 0, dhAl = 0, dhBe = 0;
  const init = p.init;
  if (init.kind === "backcast") {
    const w = init.weights;
    let b = 0, db = 0;
    for (let i = 0; i < w.length; i++) { const e = x[i] - mu; b += w[i] * e * e; db -= 2 * w[i] * e; }
    h = omega + persistence * b;
    dhMu = persistence * db; dhOm = 1; dhAl = b; dhBe = b;
  } else if (init.kind === "unconditional") {
    if (!(persistence < 1)) return -Infinity;
    const q = 1 - persistence;
    h = omega / q;
    dhOm = 1 / q; dhAl = omega / (q * q); dhBe = dhAl;
  } else {
    h = init.value;
  }
  const wantGrad = !!gradient;
  let ll = 0, gMu = 0, gOm = 0, gAl = 0, gBe = 0, gNu = 0;
  let kNu = 0, dkNu = 0, c = 0, half = 0;
  if (p.studentT) {
    c = nu - 2;
    half = 0.5 * (nu + 1);
    kNu = logGamma(half) - logGamma(0.5 * nu) - 0.5 * Math.log(Math.PI * c);
    if (wantGrad) dkNu = 0.5 * digamma(half) - 0.5 * digamma(0.5 * nu) - 0.5 / c;
  }
  const k = gradient ? gradient.length : 0;
  // Σ ln hₜ (and Σ ln(1+qₜ) for Student-t) as logs of products of 16 terms: far fewer Math.log calls, same value
  // to rounding; a block is closed early before a product could leave the floating-point range
  let prodH = 1, prodQ = 1, sumLogH = 0, sumLogQ = 0, block = 0;
  for (let t = 0; t < n; t++) {
    if (!(h > 0) || h === Infinity) return -Infinity;
    const e = x[t] - mu;
    const e2 = e * e;
    let lh: number, le: number, lt: number, ln = 0;
    if (p.studentT) {
      const q = e2 / (c * h);
      // ln h and ln(1+q) are summed as logs of running products (one Math.log per block, see below)
      prodH *= h; prodQ *= 1 + q;
      lt = 0;
      // the per-observation ν score needs ln(1+q) itself; the sum of ν scores gets the bulk terms below
      ln = scores ? -0.5 * Math.log1p(q) + (half * q) / ((1 + q) * c) : (half * q) / ((1 + q) * c);
      lh = (-0.5 + (half * q) / (1 + q)) / h;
      le = (-2 * half * e) / (c * h * (1 + q));
    } else {
      const inv = 1 / h;
      const r = e2 * inv;
      prodH *= h;
      lt = -0.5 * r;
      lh = 0.5 * (r - 1) * inv;
      le = -e * inv;
    }
    ll += lt;
    if (++block === 16 || prodH < 1e-150 || prodH > 1e150 || prodQ > 1e150) {
      sumLogH += Math.log(prodH); sumLogQ += Math.log(prodQ);
      prodH = 1; prodQ = 1; block = 0;
    }
    if (wantGrad) {
      const sMu = lh * dhMu - le, sOm = lh * dhOm, sAl = lh * dhAl, sBe = lh * dhBe;
      gMu += sMu; gOm += sOm; gAl += sAl; gBe += sBe; gNu += ln;
      if (scores) {
        let i = t * k;
        if (p.fitMean) scores[i++] = p.targeting ? sMu + sOm * (1 - persistence) * dTargetVdMu : sMu;
        if (!p.targeting) scores[i++] = sOm;
        scores[i++] = p.targeting ? sAl - sOm * targetV : sAl;
        scores[i++] = p.targeting ? sBe - sOm * targetV : sBe;
        if (p.studentT) scores[i++] = ln + dkNu;
      }
      dhMu = -2 * alpha * e + beta * dhMu;
      dhOm = 1 + beta * dhOm;
      dhAl = e2 + beta * dhAl;
      dhBe = h + beta * dhBe;
    }
    h = omega + alpha * e2 + beta * h;
  }
  sumLogH += Math.log(prodH); sumLogQ += Math.log(prodQ);
  // the per-observation terms left out above, added in bulk
  ll += p.studentT ? n * kNu - 0.5 * sumLogH - half * sumLogQ : -0.5 * (n * LN_2PI + sumLogH);
  if (p.studentT) gNu += scores ? n * dkNu : n * dkNu - 0.5 * sumLogQ;
  if (!Number.isFinite(ll)) return -Infinity;
  if (gradient) {
    let i = 0;
    if (p.targeting) {
      // ω depends on α, β and (through V) on μ
      if (p.fitMean) gradient[i++] = gMu + gOm * (1 - persistence) * dTargetVdMu;
      gradient[i++] = gAl - gOm * targetV;
      gradient[i++] = gBe - gOm * targetV;
    } else {
      if (p.fitMean) gradient[i++] = gMu;
      gradient[i++] = gOm;
      gradient[i++] = gAl;
      gradient[i++] = gBe;
    }
    if (p.studentT) gradient[i++] = gNu;
  }
  return ll;
}
