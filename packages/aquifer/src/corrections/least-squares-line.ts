/**
 * Ordinary least squares straight line y = a + b x with the usual standard errors (any statistics text;
 * e.g. Draper & Smith, Applied Regression Analysis): b = Sxy/Sxx, a = ybar - b xbar,
 * s^2 = SSR/(n - 2), se(b) = s/sqrt(Sxx), se(a) = s sqrt(1/n + xbar^2/Sxx), r^2 = 1 - SSR/Syy.
 * Sums are formed about the means (two-pass), which keeps the digits when x is far from 0.
 */
import { studentTQuantile } from "../fit/student-t.js";
import { CorrectionError } from "./record.js";

/** A fitted straight line and its statistics. */
export interface LineFit {
  readonly n: number;
  readonly intercept: number;
  readonly slope: number;
  readonly interceptStandardError: number;
  readonly slopeStandardError: number;
  /** Coefficient of determination; NaN when all y are equal. */
  readonly rSquared: number;
  /** Residual standard deviation s = sqrt(SSR/(n - 2)); NaN for n = 2. */
  readonly residualStandardDeviation: number;
  /** Half-width of the 95 % interval of the slope: t(0.975, n - 2) se(b); NaN for n = 2. */
  readonly slopeHalfWidth95: number;
  readonly xMean: number;
}

/** Least squares line through (x, y); at least 2 points and x not all equal. */
export function fitLine(x: ArrayLike<number>, y: ArrayLike<number>, what: string): LineFit {
  const n = x.length;
  if (n < 2) throw new CorrectionError(`${what}: a straight line needs at least 2 points, got ${n}`);
  let xMean = 0;
  let yMean = 0;
  for (let i = 0; i < n; i++) {
    xMean += x[i]!;
    yMean += y[i]!;
  }
  xMean /= n;
  yMean /= n;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (let i = 0; i < n; i++) {
    const dx = x[i]! - xMean;
    const dy = y[i]! - yMean;
    sxx += dx * dx;
    sxy += dx * dy;
    syy += dy * dy;
  }
  if (!(sxx > 0)) {
    throw new CorrectionError(`${what}: all ${n} x values are equal (${x[0]}), so no slope can be fitted; give readings that vary`);
  }
  const slope = sxy / sxx;
  const intercept = yMean - slope * xMean;
  let ssr = 0;
  for (let i = 0; i < n; i++) {
    const r = y[i]! - intercept - slope * x[i]!;
    ssr += r * r;
  }
  const dof = n - 2;
  const s = dof > 0 ? Math.sqrt(ssr / dof) : Number.NaN;
  const slopeStandardError = s / Math.sqrt(sxx);
  return {
    n,
    intercept,
    slope,
    interceptStandardError: s * Math.sqrt(1 / n + (xMean * xMean) / sxx),
    slopeStandardError,
    rSquared: syy > 0 ? 1 - ssr / syy : Number.NaN,
    residualStandardDeviation: s,
    slopeHalfWidth95: dof > 0 ? studentTQuantile(0.975, dof) * slopeStandardError : Number.NaN,
    xMean,
  };
}
