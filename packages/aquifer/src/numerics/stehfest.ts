/**
 * Gaver-Stehfest numerical Laplace inversion (Stehfest 1970, Comm. ACM 13:47, with the 1970 correction):
 * f(t) ≈ (ln 2 / t) Σ_{k=1}^{N} V_k F(k ln 2 / t),
 * V_k = (−1)^{k+N/2} Σ_{j=⌊(k+1)/2⌋}^{min(k,N/2)} j^{N/2} (2j)! / ((N/2 − j)! j! (j − 1)! (k − j)! (2j − k)!).
 * Only real p are used. In double precision N = 12..16 is the useful range: the V_k alternate and grow
 * (|V_k| up to about 1e9 at N = 16), so larger N loses digits to cancellation. The method suits smooth,
 * non-oscillating f; on oscillating or step-like f use `deHoog`.
 */
import { portablePow } from "./portable-math.js";

const coefficientCache = new Map<number, Float64Array>();

/** Smallest and largest N accepted by `stehfest`. */
export const STEHFEST_MIN_TERMS = 2;
/** Largest N accepted by `stehfest` (20): beyond it the alternating weights lose digits to cancellation. */
export const STEHFEST_MAX_TERMS = 20;

/**
 * The Stehfest weights V_1..V_N for an even N in [2, 20], as a Float64Array (index k − 1 holds V_k).
 * @throws RangeError when N is odd or outside [2, 20].
 */
export function stehfestCoefficients(n: number): Float64Array {
  validateTerms(n);
  const cached = coefficientCache.get(n);
  if (cached) return cached;
  const half = n / 2;
  const v = new Float64Array(n);
  for (let k = 1; k <= n; k++) {
    let sum = 0;
    for (let j = Math.floor((k + 1) / 2); j <= Math.min(k, half); j++) {
      sum +=
        (portablePow(j, half) * factorial(2 * j)) /
        (factorial(half - j) * factorial(j) * factorial(j - 1) * factorial(k - j) * factorial(2 * j - k));
    }
    v[k - 1] = ((k + half) % 2 === 0 ? 1 : -1) * sum;
  }
  coefficientCache.set(n, v);
  return v;
}

/**
 * Inverts the Laplace transform F (a function of real p, in units of f times time) at time t > 0 with N
 * Stehfest terms (even, default 14). Cost: N evaluations of F.
 * Accuracy measured in numerics-laplace.test.ts for t in [0.01, 20]: 1/p ↔ 1 within 1e-7 (N = 12..16),
 * 1/p² and 1/sqrt(p) within 1e-6 relative (N = 14), e^−t within 2e-5 absolute (N = 16); the Theis transform
 * within 1e-4 relative for u = 1/(4t) <= 1 but only 1e-2 at u = 5 (N = 14).
 * @throws RangeError when t is not a positive finite number or N is not an even integer in [2, 20].
 */
export function stehfest(F: (p: number) => number, t: number, n = 14): number {
  if (!(t > 0) || !Number.isFinite(t)) {
    throw new RangeError(`stehfest: time t = ${t}; it must be a positive finite number.`);
  }
  const v = stehfestCoefficients(n);
  const a = Math.LN2 / t;
  let sum = 0;
  for (let k = 1; k <= n; k++) sum += v[k - 1]! * F(k * a);
  return a * sum;
}

function validateTerms(n: number): void {
  if (!Number.isInteger(n) || n % 2 !== 0 || n < STEHFEST_MIN_TERMS || n > STEHFEST_MAX_TERMS) {
    throw new RangeError(
      `stehfest: N = ${n}; use an even integer from ${STEHFEST_MIN_TERMS} to ${STEHFEST_MAX_TERMS} (12 to 16 is best in double precision).`,
    );
  }
}

function factorial(m: number): number {
  let r = 1;
  for (let i = 2; i <= m; i++) r *= i;
  return r;
}
