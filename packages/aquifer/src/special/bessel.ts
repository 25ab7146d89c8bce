/**
 * Modified Bessel functions of the first kind I0, I1 and of the second kind K0, K1 of real argument, with
 * their exponentially scaled forms. Arguments and results are dimensionless.
 *
 * Algorithm. The interval layout and auxiliary functions follow the Chebyshev expansions of the Cephes
 * library (S. L. Moshier, 1984-2000) and of Clenshaw (1962, NPL Mathematical Tables 5); the code and the
 * coefficients are our own: Chebyshev interpolation of mpmath values at 40 digits, truncated below 2e-18
 * relative and converted to powers, by tests/fixtures/special/generate_coefficients.py (which writes
 * polynomials.ts).
 * - |x| <= 10: I0(x) and I1(x)/x as economized power series in y = x^2 (19 and 18 terms); the generator
 *   checks that every coefficient is positive, so the sums have no cancellation;
 * - |x| > 10: sqrt(x) e^-|x| I(x) as polynomials in a variable linear in 1/x on [10, 20] and [20, infinity)
 *   (15 and 12 terms);
 * - 0 < x <= 2: K0(x) = R0(x^2) - ln(x/2) I0(x) and K1(x) = (R1(x^2) + x^2 ln(x/2) I1(x)/x) / x
 *   (A&S 1964, eqs. 9.6.13 and 9.6.11), the regular parts R0, R1 as 11-term polynomials in x^2;
 * - x > 2: sqrt(x) e^x K(x) as polynomials in a variable linear in 1/x on [2, 4], [4, 8] and [8, infinity)
 *   (13 to 15 terms).
 * Above |x| = 700 the exponential is applied in two halves, so that I stays finite up to its overflow
 * (x = 713.987 for I0, 713.988 for I1) and K keeps the digits a subnormal result can hold until it
 * underflows (x = 742.05).
 *
 * Measured accuracy (packages/aquifer/test/special-bessel.test.ts against tests/fixtures/special/special.json,
 * mpmath at 40 digits; regimes tiny 1e-300..1e-10, small 1e-10..1, medium 1..50, large 50..700 with 161
 * log-spaced points each, plus 70 points at the interval edges), maximum relative error over
 * 1e-300 <= x <= 700: I0 6.7e-16, I0e 5.9e-16, I1 4.8e-16, I1e 4.6e-16, K0 4.9e-16, K0e 5.3e-16,
 * K1 7.3e-16, K1e 6.5e-16; the scaled functions at most 3.3e-16 for 700 <= x <= 1e12. The largest errors
 * occur for 1 <= x <= 10. The figures include the rounding of the reference to double (up to 1.1e-16).
 */
import {
  polyI0Powers0to10,
  polyI0Scaled10to20,
  polyI0Scaled20toInf,
  polyI1OverXPowers0to10,
  polyI1Scaled10to20,
  polyI1Scaled20toInf,
  polyK0Regular0to2,
  polyK0Scaled2to4,
  polyK0Scaled4to8,
  polyK0Scaled8toInf,
  polyK1Regular0to2,
  polyK1Scaled2to4,
  polyK1Scaled4to8,
  polyK1Scaled8toInf,
} from "./polynomials.js";
import { negativeArgumentError } from "./domain.js";

const LN2 = 0.6931471805599453;
const SPLIT_EXP_ABOVE = 700;
const K_DOMAIN_HINT =
  "K0 and K1 are infinite at 0 and complex for x < 0; a leaky-aquifer argument such as r/L must be >= 0.";

/** ln(x/2) for x > 0, exact in the scaling also for subnormal x (internal). */
function lnHalf(x: number): number {
  return x > 1e-300 ? Math.log(0.5 * x) : Math.log(x) - LN2;
}

/** e^x times a positive value s, without overflowing early for 700 <= x <= 713.98 (internal). */
function timesExp(x: number, s: number): number {
  if (x < SPLIT_EXP_ABOVE) return Math.exp(x) * s;
  const half = Math.exp(0.5 * x);
  return half * s * half;
}

/** e^-x times a positive value s, keeping digits for a subnormal result when x >= 700 (internal). */
function timesExpMinus(x: number, s: number): number {
  if (x < SPLIT_EXP_ABOVE) return Math.exp(-x) * s;
  const half = Math.exp(-0.5 * x);
  return half * s * half;
}

/** e^-x I0(x) for x > 10 (internal). */
function i0ScaledLarge(ax: number): number {
  const s = ax <= 20 ? polyI0Scaled10to20(40 / ax - 3) : polyI0Scaled20toInf(40 / ax - 1);
  return s / Math.sqrt(ax);
}

/** e^-x I1(x) for x > 10 (internal). */
function i1ScaledLarge(ax: number): number {
  const s = ax <= 20 ? polyI1Scaled10to20(40 / ax - 3) : polyI1Scaled20toInf(40 / ax - 1);
  return s / Math.sqrt(ax);
}

/** K0(x) for 0 < x <= 2 (internal). */
function k0Small(x: number): number {
  const y = x * x;
  return polyK0Regular0to2(y) - lnHalf(x) * polyI0Powers0to10(y);
}

/** K1(x) for 0 < x <= 2 (internal). */
function k1Small(x: number): number {
  const y = x * x;
  return (polyK1Regular0to2(y) + y * lnHalf(x) * polyI1OverXPowers0to10(y)) / x;
}

/** e^x K0(x) for x > 2 (internal). */
function k0ScaledLarge(x: number): number {
  let s: number;
  if (x <= 4) s = polyK0Scaled2to4(8 / x - 3);
  else if (x <= 8) s = polyK0Scaled4to8(16 / x - 3);
  else s = polyK0Scaled8toInf(16 / x - 1);
  return s / Math.sqrt(x);
}

/** e^x K1(x) for x > 2 (internal). */
function k1ScaledLarge(x: number): number {
  let s: number;
  if (x <= 4) s = polyK1Scaled2to4(8 / x - 3);
  else if (x <= 8) s = polyK1Scaled4to8(16 / x - 3);
  else s = polyK1Scaled8toInf(16 / x - 1);
  return s / Math.sqrt(x);
}

/**
 * Modified Bessel function of the first kind of order zero, I0(x) = sum_k (x^2/4)^k / (k!)^2 (A&S eq. 9.6.12),
 * for any real x (even in x); dimensionless. I0(0) = 1; overflows to +Infinity for |x| > 713.987 and at
 * +-Infinity; NaN gives NaN. Accuracy: maximum relative error 6.7e-16 for |x| <= 713.9, measured against
 * mpmath (module note). Source: see the module note. Cost: one exp above |x| = 10, no allocation.
 */
export function besselI0(x: number): number {
  const ax = Math.abs(x);
  if (ax <= 10) return polyI0Powers0to10(x * x);
  if (ax === Infinity) return Infinity;
  return timesExp(ax, i0ScaledLarge(ax));
}

/**
 * Exponentially scaled I0: e^-|x| I0(x), for any real x (even); dimensionless. Finite everywhere, ~ 1/sqrt(2 pi x)
 * for large x, 0 at +-Infinity; NaN gives NaN. Accuracy: maximum relative error 5.9e-16 for |x| <= 1e12,
 * measured against mpmath. Source: as for besselI0, with no exponential for |x| > 10.
 */
export function besselI0e(x: number): number {
  const ax = Math.abs(x);
  if (ax <= 10) return Math.exp(-ax) * polyI0Powers0to10(x * x);
  return i0ScaledLarge(ax);
}

/**
 * Modified Bessel function of the first kind of order one, I1(x) = (x/2) sum_k (x^2/4)^k / (k! (k+1)!)
 * (A&S eq. 9.6.10), for any real x (odd in x); dimensionless. I1(0) = 0; overflows to +-Infinity for
 * |x| > 713.988 and at +-Infinity; NaN gives NaN. Accuracy: maximum relative error 4.8e-16 for |x| <= 713.9,
 * measured against mpmath (module note). Source: see the module note.
 */
export function besselI1(x: number): number {
  const ax = Math.abs(x);
  if (ax <= 10) return x * polyI1OverXPowers0to10(x * x);
  if (ax === Infinity) return x;
  const v = timesExp(ax, i1ScaledLarge(ax));
  return x < 0 ? -v : v;
}

/**
 * Exponentially scaled I1: e^-|x| I1(x), for any real x (odd); dimensionless. Finite everywhere, 0 at
 * +-Infinity; NaN gives NaN. Accuracy: maximum relative error 4.6e-16 for |x| <= 1e12, measured against mpmath.
 * Source: as for besselI1, with no exponential for |x| > 10.
 */
export function besselI1e(x: number): number {
  const ax = Math.abs(x);
  if (ax <= 10) return Math.exp(-ax) * x * polyI1OverXPowers0to10(x * x);
  const v = i1ScaledLarge(ax);
  return x < 0 ? -v : v;
}

/**
 * Modified Bessel function of the second kind of order zero, K0(x) = integral_0^infinity e^(-x cosh t) dt
 * (A&S eq. 9.6.24), for x >= 0; dimensionless. It gives the steady drawdown around a well in a leaky aquifer
 * (de Glee 1930; Hantush & Jacob 1955): s = Q / (2 pi T) K0(r / L).
 * K0(0) = +Infinity, K0(+Infinity) = 0; subnormal above about x = 705 and 0 above x = 742.05; NaN gives NaN;
 * RangeError for x < 0. Accuracy: maximum relative error 4.9e-16 for 1e-300 <= x <= 700, measured against
 * mpmath (module note). Source: see the module note.
 */
export function besselK0(x: number): number {
  if (x > 2) return timesExpMinus(x, k0ScaledLarge(x));
  if (x > 0) return k0Small(x);
  if (x === 0) return Infinity;
  if (Number.isNaN(x)) return NaN;
  throw negativeArgumentError("besselK0", x, K_DOMAIN_HINT);
}

/**
 * Exponentially scaled K0: e^x K0(x), for x >= 0; dimensionless. Finite for x > 0, ~ sqrt(pi / (2x)) for large
 * x (A&S eq. 9.7.2), +Infinity at 0, 0 at +Infinity, NaN for NaN, RangeError for x < 0.
 * Accuracy: maximum relative error 5.3e-16 for 1e-300 <= x <= 1e12, measured against mpmath.
 * Source: as for besselK0, with no exponential for x > 2.
 */
export function besselK0e(x: number): number {
  if (x > 2) return k0ScaledLarge(x);
  if (x > 0) return Math.exp(x) * k0Small(x);
  if (x === 0) return Infinity;
  if (Number.isNaN(x)) return NaN;
  throw negativeArgumentError("besselK0e", x, K_DOMAIN_HINT);
}

/**
 * Modified Bessel function of the second kind of order one, K1(x) = -dK0/dx (A&S eq. 9.6.27), for x >= 0;
 * dimensionless. K1(x) ~ 1/x as x -> 0, so it overflows to +Infinity below x = 5.6e-309 (as 1/x does);
 * K1(0) = +Infinity, K1(+Infinity) = 0; subnormal above about x = 705 and 0 above x = 742.05; NaN gives NaN;
 * RangeError for x < 0. Accuracy: maximum relative error 7.3e-16 for 1e-300 <= x <= 700, measured against
 * mpmath (module note). Source: see the module note.
 */
export function besselK1(x: number): number {
  if (x > 2) return timesExpMinus(x, k1ScaledLarge(x));
  if (x > 0) return k1Small(x);
  if (x === 0) return Infinity;
  if (Number.isNaN(x)) return NaN;
  throw negativeArgumentError("besselK1", x, K_DOMAIN_HINT);
}

/**
 * Exponentially scaled K1: e^x K1(x), for x >= 0; dimensionless. +Infinity at 0, 0 at +Infinity, NaN for NaN,
 * RangeError for x < 0. Accuracy: maximum relative error 6.5e-16 for 1e-300 <= x <= 1e12, measured against
 * mpmath. Source: as for besselK1, with no exponential for x > 2.
 */
export function besselK1e(x: number): number {
  if (x > 2) return k1ScaledLarge(x);
  if (x > 0) return Math.exp(x) * k1Small(x);
  if (x === 0) return Infinity;
  if (Number.isNaN(x)) return NaN;
  throw negativeArgumentError("besselK1e", x, K_DOMAIN_HINT);
}
