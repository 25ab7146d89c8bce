import { expint1 } from "../special/index.js";

const MAX_TERMS = 80;

/**
 * S_k(u, x) = Σ_{n>=0} (−x)^n / n! · E_{n+k}(u) for k = 0, 1 or 2, with the generalised exponential integrals
 * E_m(u) = ∫_1^∞ e^{−ut} t^{−m} dt built by the upward recurrence E_{m+1} = (e^{−u} − u E_m)/m from
 * E_0 = e^{−u}/u and E_1 = expint1(u).
 * With x = b²/(4u), S_1 is the Hantush-Jacob well function W(u, b) (expand e^{−b²/(4y)} in ∫_u^∞ e^{−y}/y ... dy
 * term by term; attributed to Hantush & Jacob 1955 from memory). Accuracy: the alternating sum loses a
 * factor of about e^{2x} to cancellation and the recurrence, weighted by the series, amplifies rounding by
 * about I0(b); callers keep x <= 3, and for b <= 10 the error stays below 2.4e-12 relative (measured against
 * mpmath in wells-hantush.test.ts).
 */
export function leakySeries(u: number, x: number, k: 0 | 1 | 2): number {
  const emu = Math.exp(-u);
  let e = k === 0 ? emu / u : expint1(u);
  let m = k === 0 ? 0 : 1;
  if (k === 2) {
    e = emu - u * e;
    m = 2;
  }
  let sum = e;
  let coefficient = 1;
  for (let n = 1; n < MAX_TERMS; n++) {
    e = m === 0 ? expint1(u) : (emu - u * e) / m;
    m++;
    coefficient *= -x / n;
    const term = coefficient * e;
    sum += term;
    if (Math.abs(term) <= 1e-17 * Math.abs(sum)) break;
  }
  return sum;
}
