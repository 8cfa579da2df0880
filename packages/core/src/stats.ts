/**
 * Small, dependency-free statistics used by the counting functions: the regularized incomplete gamma
 * function and its inverse (for exact Poisson intervals) and the Wilson score interval.
 * Standard numerical methods (Lanczos log-gamma; series and continued-fraction incomplete gamma).
 */

/** Two-sided 95% standard-normal quantile, Φ⁻¹(0.975). */
export const Z_95 = 1.959963984540054;

const LANCZOS = [
  0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059,
  12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7,
];

/** Natural log of the gamma function, for x > 0. */
export function lnGamma(x: number): number {
  if (x < 0.5) return Math.log(Math.PI / Math.sin(Math.PI * x)) - lnGamma(1 - x);
  const z = x - 1;
  let sum = LANCZOS[0] ?? 1;
  for (let i = 1; i < LANCZOS.length; i++) sum += (LANCZOS[i] ?? 0) / (z + i);
  const t = z + 7.5;
  return 0.5 * Math.log(2 * Math.PI) + (z + 0.5) * Math.log(t) - t + Math.log(sum);
}

/** Regularized lower incomplete gamma P(a, x), a > 0, x ≥ 0. */
export function regularizedGammaP(a: number, x: number): number {
  if (x <= 0) return 0;
  const logPrefix = -x + a * Math.log(x) - lnGamma(a);
  if (x < a + 1) {
    let term = 1 / a;
    let sum = term;
    for (let n = 1; n < 1000; n++) {
      term *= x / (a + n);
      sum += term;
      if (Math.abs(term) < Math.abs(sum) * 1e-16) break;
    }
    return Math.min(1, sum * Math.exp(logPrefix));
  }
  // Continued fraction for Q(a, x) (modified Lentz).
  const tiny = 1e-300;
  let b = x + 1 - a;
  let c = 1 / tiny;
  let d = 1 / b;
  let h = d;
  for (let i = 1; i < 1000; i++) {
    const an = -i * (i - a);
    b += 2;
    d = an * d + b;
    if (Math.abs(d) < tiny) d = tiny;
    c = b + an / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < 1e-16) break;
  }
  return Math.max(0, 1 - Math.exp(logPrefix) * h);
}

/** x such that P(shape, x) = p (gamma quantile with scale 1), by bracketing bisection. */
export function gammaQuantile(p: number, shape: number): number {
  if (!(p > 0 && p < 1)) throw new RangeError(`p must be in (0, 1), got ${p}`);
  if (!(shape > 0)) throw new RangeError(`shape must be > 0, got ${shape}`);
  let lo = 0;
  let hi = shape + 10 * Math.sqrt(shape) + 20;
  while (regularizedGammaP(shape, hi) < p) hi *= 2;
  for (let i = 0; i < 200; i++) {
    const mid = 0.5 * (lo + hi);
    if (regularizedGammaP(shape, mid) < p) lo = mid;
    else hi = mid;
    if (hi - lo <= 1e-12 * Math.max(1, hi)) break;
  }
  return 0.5 * (lo + hi);
}

/**
 * Exact (Garwood) two-sided 95% interval for the mean of a Poisson count:
 * lower = χ²(0.025; 2N)/2, upper = χ²(0.975; 2N+2)/2, written with the gamma quantile.
 */
export function poissonInterval95(count: number): [number, number] {
  if (!Number.isInteger(count) || count < 0) {
    throw new RangeError(`count must be a non-negative integer, got ${count}`);
  }
  const lower = count === 0 ? 0 : gammaQuantile(0.025, count);
  const upper = gammaQuantile(0.975, count + 1);
  return [lower, upper];
}

/** Wilson score interval (95%) for a binomial proportion. */
export function wilsonInterval95(successes: number, trials: number): [number, number] {
  if (trials <= 0) return [0, 1];
  const z = Z_95;
  const p = successes / trials;
  const z2n = (z * z) / trials;
  const centre = (p + z2n / 2) / (1 + z2n);
  const half = (z / (1 + z2n)) * Math.sqrt((p * (1 - p)) / trials + z2n / (4 * trials));
  return [Math.max(0, centre - half), Math.min(1, centre + half)];
}
