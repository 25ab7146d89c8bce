/** Ordinary least-squares straight line y = a + b x, with the standard error of the slope. */

/** Fitted line y = intercept + slope x. */
export interface StraightLine {
  readonly intercept: number;
  readonly slope: number;
  /** Standard error of the slope, sqrt(s^2 / Sxx) with s^2 = SSR / (n - 2); NaN for n = 2. */
  readonly slopeStandardError: number;
  /** Residual standard error sqrt(SSR / (n - 2)); NaN for n = 2. */
  readonly residualStandardError: number;
  readonly n: number;
}

/**
 * Least-squares line through (x_i, y_i), centred sums for accuracy. Needs n >= 2 and x not all equal (the caller
 * checks). Source: ordinary least squares, e.g. Draper and Smith (1998), Applied Regression Analysis, ch. 1.
 */
export function fitStraightLine(x: ArrayLike<number>, y: ArrayLike<number>): StraightLine {
  const n = x.length;
  let mx = 0;
  let my = 0;
  for (let i = 0; i < n; i++) {
    mx += x[i]!;
    my += y[i]!;
  }
  mx /= n;
  my /= n;
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < n; i++) {
    const dx = x[i]! - mx;
    sxx += dx * dx;
    sxy += dx * (y[i]! - my);
  }
  const slope = sxy / sxx;
  const intercept = my - slope * mx;
  let ssr = 0;
  for (let i = 0; i < n; i++) {
    const e = y[i]! - intercept - slope * x[i]!;
    ssr += e * e;
  }
  const s2 = n > 2 ? ssr / (n - 2) : Number.NaN;
  return { intercept, slope, slopeStandardError: Math.sqrt(s2 / sxx), residualStandardError: Math.sqrt(s2), n };
}
