/**
 * Ordinary least-squares straight line y = a + b x with standard errors and 95 % intervals, the shared engine
 * of the straight-line methods (Jacob's step test, Hantush-Bierschenk, Hvorslev, Bouwer-Rice).
 *
 * Formulas (e.g. Draper & Smith, Applied Regression Analysis, 3rd ed. 1998, ch. 1): with xbar, ybar the means,
 * Sxx = sum (x - xbar)^2, b = sum (x - xbar)(y - ybar) / Sxx, a = ybar - b xbar, s^2 = SSR / (n - 2),
 * SE(b) = s / sqrt(Sxx), SE(a) = s sqrt(1/n + xbar^2 / Sxx), Cov(a, b) = -xbar s^2 / Sxx; 95 % intervals
 * estimate +- t(0.975, n - 2) SE. Computed about the means, so no normal equations are formed.
 */

import { studentTQuantile } from "../fit/student-t.js";

/**
 * Ordinary least-squares line y = a + b x as returned by fitStraightLine: coefficients, standard errors,
 * covariance and 95 % intervals, fit quality and residuals, all in the units of the caller's x and y.
 */
export interface StraightLineFit {
  /** Intercept a, in the unit of y. */
  readonly intercept: number;
  /** Slope b, in the unit of y per unit of x. */
  readonly slope: number;
  /** Standard errors; null when n = 2 (no degree of freedom left for the scatter). */
  readonly interceptStandardError: number | null;
  readonly slopeStandardError: number | null;
  /** Cov(a, b); null when n = 2. */
  readonly covariance: number | null;
  /** 95 % intervals a +- t SE and b +- t SE; null when n = 2. */
  readonly interceptCi95: readonly [number, number] | null;
  readonly slopeCi95: readonly [number, number] | null;
  /** Student t 0.975 quantile for n - 2 degrees of freedom; null when n = 2. */
  readonly tQuantile: number | null;
  /** Points used. */
  readonly n: number;
  /** Sum of squared residuals, unit of y squared. */
  readonly ssr: number;
  /** Coefficient of determination 1 - SSR / sum (y - ybar)^2 (1 when y is constant and fitted exactly). */
  readonly rSquared: number;
  /** y - (a + b x) per point. */
  readonly residuals: Float64Array;
}

/**
 * Least-squares line through (x_i, y_i), i < n; x and y in any consistent units.
 * @throws RangeError when fewer than 2 points are given, values are not finite or all x are equal.
 */
export function fitStraightLine(x: ArrayLike<number>, y: ArrayLike<number>): StraightLineFit {
  const n = x.length;
  if (y.length !== n) throw new RangeError(`fitStraightLine: ${n} x values but ${y.length} y values; give one y per x.`);
  if (n < 2) throw new RangeError(`fitStraightLine: ${n} point(s); a straight line needs at least 2.`);
  let xbar = 0;
  let ybar = 0;
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(x[i]!) || !Number.isFinite(y[i]!)) {
      throw new RangeError(`fitStraightLine: point ${i + 1} is (${x[i]}, ${y[i]}); every value must be finite.`);
    }
    xbar += x[i]!;
    ybar += y[i]!;
  }
  xbar /= n;
  ybar /= n;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (let i = 0; i < n; i++) {
    const dx = x[i]! - xbar;
    const dy = y[i]! - ybar;
    sxx += dx * dx;
    sxy += dx * dy;
    syy += dy * dy;
  }
  if (!(sxx > 0)) throw new RangeError(`fitStraightLine: all ${n} x values equal ${xbar}; the slope is undetermined.`);
  const slope = sxy / sxx;
  const intercept = ybar - slope * xbar;
  const residuals = new Float64Array(n);
  let ssr = 0;
  for (let i = 0; i < n; i++) {
    residuals[i] = y[i]! - (intercept + slope * x[i]!);
    ssr += residuals[i]! * residuals[i]!;
  }
  const rSquared = syy > 0 ? 1 - ssr / syy : 1;
  if (n === 2) {
    return {
      intercept, slope, interceptStandardError: null, slopeStandardError: null, covariance: null,
      interceptCi95: null, slopeCi95: null, tQuantile: null, n, ssr, rSquared, residuals,
    };
  }
  const s2 = ssr / (n - 2);
  const slopeSe = Math.sqrt(s2 / sxx);
  const interceptSe = Math.sqrt(s2 * (1 / n + (xbar * xbar) / sxx));
  const t = studentTQuantile(0.975, n - 2);
  return {
    intercept,
    slope,
    interceptStandardError: interceptSe,
    slopeStandardError: slopeSe,
    covariance: (-xbar * s2) / sxx,
    interceptCi95: [intercept - t * interceptSe, intercept + t * interceptSe],
    slopeCi95: [slope - t * slopeSe, slope + t * slopeSe],
    tQuantile: t,
    n,
    ssr,
    rSquared,
    residuals,
  };
}
