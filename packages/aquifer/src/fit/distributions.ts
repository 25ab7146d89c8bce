/**
 * Distribution functions the residual checks need: the regularised incomplete gamma function, the standard
 * normal and chi-square distribution functions. Dimensionless.
 *
 * Method: P(a, x) by its power series for x < a + 1 and Q(a, x) = 1 - P(a, x) by Legendre's continued fraction
 * (modified Lentz) otherwise (DLMF 8.7.1 and 8.9.2; the split as in Press et al., Numerical Recipes, 3rd ed.,
 * section 6.2). Phi(z) = (1 + sign(z) P(1/2, z^2/2))/2 and the chi-square survival function Q(nu/2, x/2)
 * (DLMF 7.11.1 with 8.4.1 for erf; A&S 26.4.19 for chi-square). Accuracy about 1e-14 relative, checked against
 * scipy in fit-diagnostics.test.ts.
 */
import { lnGamma } from "./student-t.js";

const EPS = 1e-16;
const TINY = 1e-300;

function check(a: number, x: number, caller: string): void {
  if (!(a > 0) || !Number.isFinite(a)) throw new RangeError(`${caller}: a must be a finite number > 0, got ${a}`);
  if (!(x >= 0)) throw new RangeError(`${caller}: x must be >= 0, got ${x}`);
}

/** Series of P(a, x) (DLMF 8.7.1), for x < a + 1. */
function lowerSeries(a: number, x: number): number {
  let term = 1 / a;
  let sum = term;
  for (let n = 1; n < 10000; n++) {
    term *= x / (a + n);
    sum += term;
    if (Math.abs(term) < Math.abs(sum) * EPS) break;
  }
  return sum * Math.exp(-x + a * Math.log(x) - lnGamma(a));
}

/** Continued fraction of Q(a, x) (DLMF 8.9.2) by the modified Lentz method, for x >= a + 1. */
function upperFraction(a: number, x: number): number {
  let b = x + 1 - a;
  let c = 1 / TINY;
  let d = 1 / b;
  let h = d;
  for (let i = 1; i < 10000; i++) {
    const an = -i * (i - a);
    b += 2;
    d = an * d + b;
    if (Math.abs(d) < TINY) d = TINY;
    c = b + an / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < EPS) break;
  }
  return Math.exp(-x + a * Math.log(x) - lnGamma(a)) * h;
}

/** Regularised lower incomplete gamma function P(a, x) = gamma(a, x)/Gamma(a), a > 0, x >= 0 (DLMF 8.2.4). */
export function regularizedGammaP(a: number, x: number): number {
  check(a, x, "regularizedGammaP");
  if (x === 0) return 0;
  if (x === Infinity) return 1;
  return x < a + 1 ? lowerSeries(a, x) : 1 - upperFraction(a, x);
}

/** Regularised upper incomplete gamma function Q(a, x) = 1 - P(a, x), a > 0, x >= 0 (DLMF 8.2.4). */
export function regularizedGammaQ(a: number, x: number): number {
  check(a, x, "regularizedGammaQ");
  if (x === 0) return 1;
  if (x === Infinity) return 0;
  return x < a + 1 ? 1 - lowerSeries(a, x) : upperFraction(a, x);
}

/** Standard normal distribution function Phi(z) = P(Z <= z) (A&S 26.2.2 via erf = P(1/2, z^2)). */
export function normalCdf(z: number): number {
  if (Number.isNaN(z)) return NaN;
  if (z === Infinity) return 1;
  if (z === -Infinity) return 0;
  const half = z * z / 2;
  if (z < 0) return half < 1.5 ? 0.5 * (1 - lowerSeries(0.5, half)) : 0.5 * upperFraction(0.5, half);
  return half < 1.5 ? 0.5 * (1 + lowerSeries(0.5, half)) : 1 - 0.5 * upperFraction(0.5, half);
}

/** Chi-square survival function P(X > x) for nu > 0 degrees of freedom: Q(nu/2, x/2) (A&S 26.4.19). */
export function chiSquareSurvival(x: number, nu: number): number {
  if (!(nu > 0)) throw new RangeError(`chiSquareSurvival: degrees of freedom must be > 0, got ${nu}`);
  if (!(x > 0)) return 1;
  return regularizedGammaQ(nu / 2, x / 2);
}

/** 0.975 quantile of the standard normal distribution (A&S table 26.1: 1.959964). */
export const Z975 = 1.959963984540054;
