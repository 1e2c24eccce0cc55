/**
 * A small quasi-Newton (BFGS) minimiser with a strong-Wolfe line search. It knows nothing of any model:
 * it minimises f(x) given a function that returns the value and writes the gradient.
 */

/** An objective: returns f(x) and writes ∇f(x) into gradient. A non-finite value means "outside the domain". */
export type Objective = (x: Float64Array, gradient: Float64Array) => number;

/** Options of minimizeBfgs. */
export interface BfgsOptions {
  /** stop when the largest absolute gradient component is below this (default 1e-6) */
  gradientTolerance?: number;
  /** stop when an iteration lowers f by less than this times max(1, |f|) (default 1e-15) */
  valueTolerance?: number;
  /** default 200 */
  maxIterations?: number;
  /** called after each iteration; returning true abandons the run (used to cut short a poor start) */
  abandon?: (iteration: number, value: number) => boolean;
  /** a starting approximation of the inverse Hessian at x0 (row-major n×n), e.g. from outer products of scores; identity when absent */
  initialInverseHessian?: Float64Array | null;
}

/** Why the minimiser stopped. */
export type BfgsStop = "gradient" | "value" | "max-iterations" | "line-search" | "abandoned";

/** The result of minimizeBfgs. */
export interface BfgsResult {
  x: Float64Array;
  value: number;
  gradient: Float64Array;
  iterations: number;
  evaluations: number;
  /** true when stopped by the gradient or value test */
  converged: boolean;
  stop: BfgsStop;
  /** the final BFGS approximation of the inverse Hessian, row-major n×n */
  inverseHessian: Float64Array;
}

const C1 = 1e-4;
const C2 = 0.9;

function maxAbs(v: Float64Array): number {
  let m = 0;
  for (let i = 0; i < v.length; i++) { const a = Math.abs(v[i]); if (a > m || a !== a) m = a !== a ? Infinity : a; }
  return m;
}

function dot(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i] * b[i];
  return s;
}

function identity(h: Float64Array, n: number, scale = 1): void {
  h.fill(0);
  for (let i = 0; i < n; i++) h[i * n + i] = scale;
}

/**
 * Minimise a smooth function by BFGS from x0.
 * @throws {RangeError} if f is not finite at x0
 */
export function minimizeBfgs(f: Objective, x0: ArrayLike<number>, options: BfgsOptions = {}): BfgsResult {
  const gtol = options.gradientTolerance ?? 1e-6;
  const ftol = options.valueTolerance ?? 1e-15;
  const maxIterations = options.maxIterations ?? 200;
  const n = x0.length;
  const x = Float64Array.from(x0);
  const g = new Float64Array(n);
  let evaluations = 1;
  let fx = f(x, g);
  if (!Number.isFinite(fx) || !Number.isFinite(maxAbs(g))) throw new RangeError("minimizeBfgs requires a finite value and gradient at the starting point");
  const h = new Float64Array(n * n);
  identity(h, n);
  let fresh = true; // h is the (scaled) identity
  if (options.initialInverseHessian && options.initialInverseHessian.length === n * n && options.initialInverseHessian.every(Number.isFinite)) {
    h.set(options.initialInverseHessian);
    fresh = false;
  }
  const d = new Float64Array(n);
  const xt = new Float64Array(n);
  const gt = new Float64Array(n);
  const xLo = new Float64Array(n);
  const gLo = new Float64Array(n);
  const s = new Float64Array(n);
  const y = new Float64Array(n);
  const hy = new Float64Array(n);
  let stop: BfgsStop = "max-iterations";
  let iterations = 0;

  // evaluate at x + a·d into xt/gt; returns the value (Infinity when not finite)
  const trial = (a: number): number => {
    for (let i = 0; i < n; i++) xt[i] = x[i] + a * d[i];
    evaluations++;
    const v = f(xt, gt);
    return Number.isFinite(v) ? v : Infinity;
  };

  for (; iterations < maxIterations; iterations++) {
    if (maxAbs(g) < gtol) { stop = "gradient"; break; }
    for (let i = 0; i < n; i++) { let v = 0; for (let j = 0; j < n; j++) v -= h[i * n + j] * g[j]; d[i] = v; }
    let dphi0 = dot(g, d);
    if (!(dphi0 < 0)) {
      identity(h, n); fresh = true;
      for (let i = 0; i < n; i++) d[i] = -g[i];
      dphi0 = dot(g, d);
    }
    // the quasi-Newton step promises a decrease below the rounding of f: we are at the optimum to working precision
    if (!fresh && -dphi0 <= 4e-15 * Math.max(1, Math.abs(fx)) && maxAbs(g) < gtol * 1e3) { stop = "value"; break; }
    const phi0 = fx;
    let a = iterations === 0 && fresh ? Math.min(1, 1 / maxAbs(g)) : 1;
    // strong-Wolfe line search (bracketing, then zoom with safeguarded quadratic interpolation)
    let aPrev = 0, phiPrev = phi0, dphiPrev = dphi0;
    let found = false;
    let fAccepted = phi0;
    let aLo = 0, phiLo = phi0, dphiLo = dphi0, aHi = 0, phiHi = Infinity;
    let haveLo = false;
    let zoom = false;
    for (let k = 0; k < 30; k++) {
      const phi = trial(a);
      const dphi = phi === Infinity ? NaN : dot(gt, d);
      if (phi > phi0 + C1 * a * dphi0 || (k > 0 && phi >= phiPrev)) {
        aLo = aPrev; phiLo = phiPrev; dphiLo = dphiPrev; aHi = a; phiHi = phi; zoom = true; break;
      }
      if (Math.abs(dphi) <= -C2 * dphi0) { found = true; fAccepted = phi; break; }
      xLo.set(xt); gLo.set(gt); haveLo = true;
      if (dphi >= 0) { aLo = a; phiLo = phi; dphiLo = dphi; aHi = aPrev; phiHi = phiPrev; zoom = true; break; }
      aPrev = a; phiPrev = phi; dphiPrev = dphi;
      a *= 2;
    }
    if (zoom) {
      if (aLo === 0) haveLo = false;
      for (let k = 0; k < 30; k++) {
        const lo = Math.min(aLo, aHi), hi = Math.max(aLo, aHi), width = hi - lo;
        const da = aHi - aLo;
        let aq = Number.isFinite(phiHi) ? aLo - (dphiLo * da * da) / (2 * (phiHi - phiLo - dphiLo * da)) : NaN;
        if (!(aq > lo + 0.1 * width && aq < hi - 0.1 * width)) aq = 0.5 * (aLo + aHi);
        a = aq;
        const phi = trial(a);
        if (phi > phi0 + C1 * a * dphi0 || phi >= phiLo) { aHi = a; phiHi = phi; }
        else {
          const dphi = dot(gt, d);
          if (Math.abs(dphi) <= -C2 * dphi0) { found = true; fAccepted = phi; break; }
          xLo.set(xt); gLo.set(gt); haveLo = true;
          if (dphi * (aHi - aLo) >= 0) { aHi = aLo; phiHi = phiLo; }
          aLo = a; phiLo = phi; dphiLo = dphi;
        }
        if (Math.abs(aHi - aLo) < 1e-16 * Math.max(1, Math.abs(aLo))) break;
      }
      if (!found && haveLo && phiLo < phi0) { xt.set(xLo); gt.set(gLo); fAccepted = phiLo; found = true; }
    }
    if (!found) {
      if (!fresh) { identity(h, n); fresh = true; iterations--; continue; }
      // no decrease is possible along the steepest descent: at the optimum to working precision if the gradient is small
      stop = maxAbs(g) < gtol * 1e3 ? "value" : "line-search";
      break;
    }
    const fxNew = fAccepted;
    for (let i = 0; i < n; i++) { s[i] = xt[i] - x[i]; y[i] = gt[i] - g[i]; }
    const sy = dot(s, y);
    if (sy > 1e-12 * Math.sqrt(dot(s, s) * dot(y, y))) {
      if (fresh) identity(h, n, sy / dot(y, y));
      for (let i = 0; i < n; i++) { let v = 0; for (let j = 0; j < n; j++) v += h[i * n + j] * y[j]; hy[i] = v; }
      const rho = 1 / sy;
      const c = (1 + rho * dot(y, hy)) * rho;
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) h[i * n + j] += c * s[i] * s[j] - rho * (hy[i] * s[j] + s[i] * hy[j]);
      fresh = false;
    }
    x.set(xt); g.set(gt);
    const drop = fx - fxNew;
    fx = fxNew;
    if (options.abandon?.(iterations + 1, fx)) { stop = "abandoned"; iterations++; break; }
    if (drop <= ftol * Math.max(1, Math.abs(fx)) && maxAbs(g) < gtol * 1e3) { stop = "value"; iterations++; break; }
  }
  return { x, value: fx, gradient: g, iterations, evaluations, converged: stop === "gradient" || stop === "value", stop, inverseHessian: h };
}
