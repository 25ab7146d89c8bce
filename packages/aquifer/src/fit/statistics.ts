/**
 * Uncertainty of least-squares estimates from the Jacobian at the optimum.
 *
 * Covariance in the fitting space: C = s^2 (J^T J)^-1 with s^2 = SSR / (n - p) (the usual linearised
 * estimate, e.g. Seber & Wild, Nonlinear Regression, 1989, section 2.1), computed as s^2 V diag(1/sigma^2) V^T
 * from the SVD of the triangular factor R of J = QR, never by forming J^T J.
 * Native units by the delta method: for a parameter fitted as ln p, SE(p) = p SE(ln p) and
 * Cov(p_a, p_b) = p_a p_b C_ab. Correlations are the same in both spaces.
 */

import { householderQr, jacobiSvd } from "./linalg.js";

/**
 * Linearised uncertainty of a least-squares optimum in the fitting space (ln p for positive parameters, p
 * otherwise): covariance, singular values of the weighted-residual Jacobian, its numerical rank and the
 * unconstrained directions. Units are those of the fitting-space coordinates, not base units.
 */
export interface FitSpaceCovariance {
  /** p-by-p covariance in the fitting space (row-major nested arrays); NaN where not identifiable. */
  readonly covariance: number[][];
  /** Singular values of J, descending. */
  readonly singularValues: number[];
  /** Numerical rank of J. */
  readonly rank: number;
  /** Unconstrained directions: for each, the weights of the fitting-space coordinates (index, weight). */
  readonly nullDirections: { index: number; weight: number }[][];
  /** True per free parameter when its variance is finite (no component along an unconstrained direction). */
  readonly identifiable: boolean[];
}

/** Relative singular value below which a direction counts as unconstrained: sigma_j <= RANK_TOLERANCE sigma_1. */
export const RANK_TOLERANCE = 1e-10;

/**
 * Covariance s^2 (J^T J)^-1 of the fitting-space coordinates from the column-major n-by-p Jacobian J of the
 * weighted residuals at the optimum and s^2 = SSR / (n - p). Directions with singular value at or below
 * RANK_TOLERANCE times the largest are reported as not identifiable; the pseudo-inverse covers the rest.
 */
export function fitSpaceCovariance(jacobian: Float64Array, n: number, p: number, s2: number): FitSpaceCovariance {
  const a = jacobian.slice();
  const tau = new Float64Array(p);
  householderQr(a, n, p, tau);
  const r = new Float64Array(p * p);
  for (let k = 0; k < p; k++) for (let i = 0; i <= k; i++) r[k * p + i] = a[k * n + i]!;
  const svd = jacobiSvd(r, p, p);
  const sigmaMax = svd.sigma[0] ?? 0;
  let rank = 0;
  for (let j = 0; j < p; j++) if (svd.sigma[j]! > RANK_TOLERANCE * sigmaMax) rank++;
  const identifiable: boolean[] = new Array<boolean>(p).fill(true);
  const nullDirections: { index: number; weight: number }[][] = [];
  for (let j = rank; j < p; j++) {
    const direction: { index: number; weight: number }[] = [];
    for (let k = 0; k < p; k++) {
      const weight = svd.v[j * p + k]!;
      if (Math.abs(weight) >= 1e-3) {
        identifiable[k] = false;
        direction.push({ index: k, weight });
      }
    }
    nullDirections.push(direction);
  }
  const covariance: number[][] = [];
  for (let a1 = 0; a1 < p; a1++) {
    const row: number[] = [];
    for (let b = 0; b < p; b++) {
      if (!identifiable[a1] || !identifiable[b]) {
        row.push(NaN);
        continue;
      }
      let sum = 0;
      for (let j = 0; j < rank; j++) {
        const sj = svd.sigma[j]!;
        sum += (svd.v[j * p + a1]! * svd.v[j * p + b]!) / (sj * sj);
      }
      row.push(s2 * sum);
    }
    covariance.push(row);
  }
  return { covariance, singularValues: Array.from(svd.sigma), rank, nullDirections, identifiable };
}

/**
 * Akaike and Bayesian information criteria for a least-squares fit with Gaussian errors, additive constants
 * dropped: AIC = n ln(SSR/n) + 2k (Akaike 1974), BIC = n ln(SSR/n) + k ln n (Schwarz 1978), and the
 * small-sample AICc = AIC + 2k(k + 1)/(n - k - 1) (Hurvich & Tsai 1989), with k = p + 1: the p free model
 * parameters plus the error variance. Only differences between fits to the same data mean anything.
 */
export function informationCriteria(ssr: number, n: number, p: number): { aic: number; bic: number; aicc: number | null } {
  const k = p + 1;
  const base = n * Math.log(ssr / n);
  const aic = base + 2 * k;
  return { aic, bic: base + k * Math.log(n), aicc: n - k - 1 > 0 ? aic + (2 * k * (k + 1)) / (n - k - 1) : null };
}
