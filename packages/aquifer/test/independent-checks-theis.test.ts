import { describe, expect, it } from "vitest";
import { theisModel } from "../src/models/theis.js";

// Two routes to W(u) = E1(u) beside the mpmath fixture of models-theis.test.ts: the convergent power series
// W(u) = -gamma - ln u - sum_k (-u)^k / (k k!) (Abramowitz and Stegun 1964, 5.1.11, from memory), used here only
// for u > 1, where the library's expint1 uses its Chebyshev-derived polynomials instead (for u <= 1 expint1 sums
// this same series, so a check there would not be independent); and the asymptotic series
// W(u) ~ (e^-u / u) sum_k (-1)^k k! / u^k (5.1.51, from memory), summed to its smallest term. The model is evaluated with T, S, r, t chosen so that u takes each value and
// Q = 4 pi T, so that s = W(u).
const EULER_GAMMA = 0.5772156649015329; // Euler's constant to 16 digits (from memory; agrees with mpmath.euler)

function powerSeries(u: number): number {
  let term = 1;
  let sum = 0;
  for (let k = 1; k < 200; k++) {
    term *= -u / k;
    const add = term / k;
    sum += add;
    if (Math.abs(add) < 1e-18 * Math.abs(sum)) break;
  }
  return -EULER_GAMMA - Math.log(u) - sum;
}

function asymptoticSeries(u: number): { value: number; smallestTerm: number } {
  let term = 1;
  let sum = 1;
  for (let k = 1; k < u; k++) {
    const next = (term * -k) / u;
    if (Math.abs(next) > Math.abs(term)) break;
    term = next;
    sum += term;
  }
  return { value: (Math.exp(-u) / u) * sum, smallestTerm: Math.abs(term) / sum };
}

const T = 50;
const S = 1e-4;
const r = 10;
const theisAt = (u: number): number =>
  theisModel.drawdown([T, S], { r, Q: 4 * Math.PI * T }, [(r * r * S) / (4 * T * u)])[0]!;

describe("Theis (1935) against series of the exponential integral", () => {
  it("matches the power series within 1e-11 relative for u from 1.5 to 5, where expint1 does not use it (measured 1.4e-13)", () => {
    // The alternating series loses digits to cancellation (its terms reach about Ei(u), 40 at u = 5, against
    // W(5) = 1.1e-3): about 1e-16 * 40 / 1.1e-3 = 4e-12 relative at u = 5.
    for (const u of [1.5, 2, 3, 4, 5]) {
      expect(Math.abs(theisAt(u) / powerSeries(u) - 1), `u = ${u}`).toBeLessThan(1e-11);
    }
  });

  it("matches the asymptotic series within its smallest term for u from 30 to 300 (early time, below 1e-11)", () => {
    // Allowed: the series' smallest term plus the conditioning of W at large u (relative error of u, a few
    // 2.2e-16 from forming u out of T, S, r, t, times d ln W / d ln u, about u).
    for (const u of [30, 50, 100, 300]) {
      const { value, smallestTerm } = asymptoticSeries(u);
      expect(smallestTerm).toBeLessThan(1e-11);
      expect(Math.abs(theisAt(u) / value - 1), `u = ${u}`).toBeLessThan(smallestTerm + 4 * u * 2.2e-16);
    }
  });
});
