/**
 * The exponential integral E1, which is the Theis well function W(u) = E1(u).
 *
 * Algorithm. For 0 < x <= 1: E1(x) = -gamma - ln x + Ein(x), Ein(x) = sum_{k>=1} (-1)^(k+1) x^k / (k k!)
 * (Abramowitz & Stegun 1964, eq. 5.1.11), with Ein(x)/x as a 12-term economized polynomial in x, and below
 * x = 1e-3 as its first four Taylor terms. For x > 1: x e^x E1(x), a smooth function between 0.59 and 1, as a
 * polynomial of 14 to 19 terms in a variable linear in 1/x on each of [1, 2], [2, 4], [4, 8], [8, 16] and
 * [16, infinity). Piecewise Chebyshev expansions of this kind go back to Clenshaw (1962, "Chebyshev series for
 * mathematical functions", NPL Mathematical Tables 5) and are the route of the SLATEC/FNLIB E1; rational
 * Chebyshev fits by Cody & Thacher (1969, Math. Comp. 23) are the alternative. The coefficients here are our
 * own: Chebyshev interpolation of mpmath values at 40 digits, truncated below 2e-18 relative and converted to
 * powers, by tests/fixtures/special/generate_coefficients.py (which writes polynomials.ts).
 *
 * Measured accuracy (packages/aquifer/test/special-expint.test.ts against tests/fixtures/special/special.json,
 * mpmath at 40 digits, 161 log-spaced points per regime plus 70 points at the interval edges), maximum
 * relative error: E1 tiny (1e-300..1e-10) 1.7e-16, small (1e-10..1) 5.1e-16, medium (1..50) 5.1e-16,
 * large (50..700) 3.0e-16; e^x E1(x) at most 5.6e-16 on 1e-300..1e12. These figures include the rounding of
 * the reference to double (up to 1.1e-16).
 */
import {
  polyE1Ein0to1,
  polyE1G16toInf,
  polyE1G1to2,
  polyE1G2to4,
  polyE1G4to8,
  polyE1G8to16,
} from "./polynomials.js";
import { negativeArgumentError } from "./domain.js";

/** Euler's constant gamma, rounded to double. */
const EULER_GAMMA = 0.5772156649015329;

/** Above this, e^-x is split in two halves so that subnormal results keep as many digits as they can. */
const SPLIT_EXP_ABOVE = 700;

const DOMAIN_HINT =
  "For the well function W(u), u = r^2 S / (4 T t) must be >= 0: check the signs of r, S, T and t.";

/** x e^x E1(x) for x > 1 (internal). */
function scaledTimesX(x: number): number {
  if (x <= 4) return x <= 2 ? polyE1G1to2(4 / x - 3) : polyE1G2to4(8 / x - 3);
  if (x <= 16) return x <= 8 ? polyE1G4to8(16 / x - 3) : polyE1G8to16(32 / x - 3);
  return polyE1G16toInf(32 / x - 1);
}

/** E1(x) for 0 < x <= 1 (internal). */
function smallArgument(x: number): number {
  if (x < 1e-3) {
    // Ein(x) to four terms; the first neglected term x^5/600 is below 2e-18 while E1(x) > 6.
    return -EULER_GAMMA - Math.log(x) + x * (1 - x * (0.25 - x * (1 / 18 - x / 96)));
  }
  return -EULER_GAMMA - Math.log(x) + x * polyE1Ein0to1(x);
}

/**
 * Exponential integral E1(x) = integral from x to infinity of e^(-t)/t dt, for x >= 0; argument and result
 * dimensionless. This is the Theis well function: W(u) = E1(u) with u = r^2 S / (4 T t).
 *
 * Special values: E1(0) = +Infinity, E1(+Infinity) = 0, NaN gives NaN. Above about x = 702 the result is
 * subnormal (accurate to one unit of the smallest subnormal) and it underflows to 0 above about x = 738.
 * Throws a RangeError for x < 0, where E1 is complex.
 *
 * Accuracy: maximum relative error 5.1e-16 for 1e-300 <= x <= 700, measured against mpmath at 40 digits
 * (per-regime figures in the module note). Source: A&S eq. 5.1.11 for x <= 1, our Chebyshev-derived
 * polynomials of x e^x E1(x) for x > 1 (see the module note). Cost: one log (x <= 1) or one exp (x > 1),
 * one or two divisions and at most 10 dependent multiply-adds; no allocation.
 */
export function expint1(x: number): number {
  if (x > 1) {
    const g = scaledTimesX(x);
    if (x < SPLIT_EXP_ABOVE) return Math.exp(-x) * (g / x);
    const half = Math.exp(-0.5 * x);
    return half * (g / x) * half;
  }
  if (x > 0) return smallArgument(x);
  if (x === 0) return Infinity;
  if (Number.isNaN(x)) return NaN;
  throw negativeArgumentError("expint1", x, DOMAIN_HINT);
}

/**
 * Exponentially scaled exponential integral e^x E1(x), for x >= 0; dimensionless. It stays finite where E1
 * underflows: e^x E1(x) ~ 1/x for large x (A&S eq. 5.1.51), and it is 0 at +Infinity.
 *
 * Special values: +Infinity at 0, 0 at +Infinity, NaN for NaN; RangeError for x < 0.
 *
 * Accuracy: maximum relative error 5.6e-16 for 1e-300 <= x <= 1e12, measured against mpmath at 40 digits.
 * Source: as for expint1; for x > 1 the polynomial divided by x, with no exponential.
 */
export function expint1Scaled(x: number): number {
  if (x > 1) return scaledTimesX(x) / x;
  if (x > 0) return Math.exp(x) * smallArgument(x);
  if (x === 0) return Infinity;
  if (Number.isNaN(x)) return NaN;
  throw negativeArgumentError("expint1Scaled", x, DOMAIN_HINT);
}
