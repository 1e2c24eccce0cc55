/** Seeded random numbers for simulation and tests (the engine never calls Math.random). */

/** A uniform generator on [0, 1). */
export type Rng = () => number;

/** mulberry32: a small, fast, seeded 32-bit generator; the same seed gives the same stream everywhere. */
export function mulberry32(seed: number): Rng {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal draws from a uniform generator (Marsaglia's polar method). */
export function normalSampler(rng: Rng): () => number {
  let spare: number | null = null;
  return () => {
    if (spare !== null) { const s = spare; spare = null; return s; }
    let u: number, v: number, s: number;
    do { u = 2 * rng() - 1; v = 2 * rng() - 1; s = u * u + v * v; } while (s >= 1 || s === 0);
    const m = Math.sqrt((-2 * Math.log(s)) / s);
    spare = v * m;
    return u * m;
  };
}

/** Gamma(shape, 1) draws (Marsaglia–Tsang), for the chi-square behind Student-t. */
function gammaSampler(rng: Rng, normal: () => number, shape: number): () => number {
  const boost = shape < 1;
  const a = boost ? shape + 1 : shape;
  const d = a - 1 / 3, c = 1 / Math.sqrt(9 * d);
  return () => {
    let x: number, v: number, u: number;
    for (;;) {
      do { x = normal(); v = 1 + c * x; } while (v <= 0);
      v = v * v * v; u = rng();
      if (u < 1 - 0.0331 * x * x * x * x || Math.log(u) < 0.5 * x * x + d * (1 - v + Math.log(v))) break;
    }
    const g = d * v;
    return boost ? g * Math.pow(rng(), 1 / shape) : g;
  };
}

/**
 * Student-t draws with ν degrees of freedom scaled to unit variance (ν > 2), as GARCH-t errors are.
 * @throws {RangeError} if ν ≤ 2
 */
export function studentTSampler(rng: Rng, nu: number): () => number {
  if (!(nu > 2)) throw new RangeError("studentTSampler requires nu > 2");
  const normal = normalSampler(rng);
  const gamma = gammaSampler(rng, normal, nu / 2);
  const unit = Math.sqrt((nu - 2) / nu);
  return () => (unit * normal()) / Math.sqrt((2 * gamma()) / nu);
}

/**
 * Simulate n returns from GARCH(1,1) with mean mu, started at the long-run variance, after a burn-in.
 * @throws {RangeError} unless ω > 0, α, β ≥ 0 and α+β < 1
 */
export function simulateGarch11(
  draw: () => number,
  params: { omega: number; alpha: number; beta: number; mu?: number },
  n: number,
  burnIn = 500,
): Float64Array {
  const { omega, alpha, beta } = params;
  const mu = params.mu ?? 0;
  if (!(omega > 0 && alpha >= 0 && beta >= 0 && alpha + beta < 1)) throw new RangeError("simulateGarch11 requires omega > 0, alpha, beta >= 0 and alpha + beta < 1");
  let h = omega / (1 - alpha - beta);
  const out = new Float64Array(n);
  for (let t = -burnIn; t < n; t++) {
    const e = Math.sqrt(h) * draw();
    if (t >= 0) out[t] = mu + e;
    h = omega + alpha * e * e + beta * h;
  }
  return out;
}
