/**
 * Ordinary least squares with several regressors, y = X beta + e, by Householder QR of X (numerically stable
 * where the normal equations lose digits to the square of the condition number), with the usual statistics:
 * s^2 = SSR / (n - p), cov(beta) = s^2 (X^T X)^-1 = s^2 R^-1 R^-T, r^2 = 1 - SSR / Syy (about the mean when
 * the design has a constant column, about 0 otherwise). Source: any regression text, e.g. Draper and Smith,
 * Applied Regression Analysis; Householder QR as in Golub and Van Loan, Matrix Computations, 5.2.
 */
import { CorrectionError } from "./record.js";

/** A least-squares fit with its covariance. */
export interface RegressionFit {
  readonly coefficients: Float64Array;
  /** Covariance of the coefficients, s^2 (X^T X)^-1, row-major p x p. */
  readonly covariance: Float64Array;
  readonly residuals: Float64Array;
  readonly n: number;
  readonly p: number;
  /** Residual standard deviation s. */
  readonly residualStandardDeviation: number;
  readonly rSquared: number;
}

/**
 * Least squares of y (length n) on the columns of X (p columns of length n each); `hasConstant` says whether a
 * column is constant (r^2 about the mean). Needs n > p and columns that are not linearly dependent.
 * @throws CorrectionError for too few rows or a rank-deficient design, naming `what`.
 */
export function regress(columns: readonly Float64Array[], y: ArrayLike<number>, hasConstant: boolean, what: string): RegressionFit {
  const p = columns.length;
  const n = y.length;
  if (n <= p) throw new CorrectionError(`${what}: ${n} equations for ${p} unknowns; give more readings or fewer lags`);
  // Column-major copy of X and of y.
  const A = columns.map((c) => Float64Array.from(c));
  const b = Float64Array.from(y);
  const diag = new Float64Array(p);
  for (let k = 0; k < p; k++) {
    const a = A[k]!;
    let norm = 0;
    for (let i = k; i < n; i++) norm += a[i]! * a[i]!;
    norm = Math.sqrt(norm);
    let scale = 0;
    for (let i = 0; i < n; i++) scale = Math.max(scale, Math.abs(columns[k]![i]!));
    if (!(norm > 1e-12 * scale * Math.sqrt(n)) || !(scale > 0)) {
      throw new CorrectionError(`${what}: regressor ${k} is (nearly) a combination of the others; the design is singular. Use fewer lags or more varied data`);
    }
    const alpha = a[k]! > 0 ? -norm : norm;
    // v = a_k:n - alpha e_1, stored in place.
    a[k] = a[k]! - alpha;
    let vv = 0;
    for (let i = k; i < n; i++) vv += a[i]! * a[i]!;
    for (let j = k + 1; j < p; j++) {
      const c = A[j]!;
      let dot = 0;
      for (let i = k; i < n; i++) dot += a[i]! * c[i]!;
      const f = (2 * dot) / vv;
      for (let i = k; i < n; i++) c[i] = c[i]! - f * a[i]!;
    }
    let dot = 0;
    for (let i = k; i < n; i++) dot += a[i]! * b[i]!;
    const f = (2 * dot) / vv;
    for (let i = k; i < n; i++) b[i] = b[i]! - f * a[i]!;
    diag[k] = alpha;
  }
  // R: diag on the diagonal, A[j][k] (k < j) above it. Back-substitute R beta = (Q^T y)_1:p.
  const R = (i: number, j: number): number => (i === j ? diag[i]! : A[j]![i]!);
  const beta = new Float64Array(p);
  for (let i = p - 1; i >= 0; i--) {
    let s = b[i]!;
    for (let j = i + 1; j < p; j++) s -= R(i, j) * beta[j]!;
    beta[i] = s / R(i, i);
  }
  // Rinv (upper triangular), then cov = s^2 Rinv Rinv^T.
  const Rinv = new Float64Array(p * p);
  for (let j = 0; j < p; j++) {
    Rinv[j * p + j] = 1 / R(j, j);
    for (let i = j - 1; i >= 0; i--) {
      let s = 0;
      for (let k = i + 1; k <= j; k++) s += R(i, k) * Rinv[k * p + j]!;
      Rinv[i * p + j] = -s / R(i, i);
    }
  }
  const residuals = new Float64Array(n);
  let ssr = 0;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += y[i]!;
  mean = hasConstant ? mean / n : 0;
  let syy = 0;
  for (let i = 0; i < n; i++) {
    let fitted = 0;
    for (let k = 0; k < p; k++) fitted += columns[k]![i]! * beta[k]!;
    residuals[i] = y[i]! - fitted;
    ssr += residuals[i]! * residuals[i]!;
    syy += (y[i]! - mean) ** 2;
  }
  const s2 = ssr / (n - p);
  const covariance = new Float64Array(p * p);
  for (let i = 0; i < p; i++) {
    for (let j = 0; j < p; j++) {
      let s = 0;
      for (let k = Math.max(i, j); k < p; k++) s += Rinv[i * p + k]! * Rinv[j * p + k]!;
      covariance[i * p + j] = s2 * s;
    }
  }
  return { coefficients: beta, covariance, residuals, n, p, residualStandardDeviation: Math.sqrt(s2), rSquared: syy > 0 ? 1 - ssr / syy : Number.NaN };
}
