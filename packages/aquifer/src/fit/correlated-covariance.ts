/**
 * Uncertainty of least-squares estimates when the errors follow an AR(1) process within each well (in time
 * order), with the AR(1) coefficient rho unknown and integrated out.
 *
 * The estimates are those of ordinary (weighted) least squares; only their uncertainty changes.
 * 1. For a given rho, with errors of covariance sigma^2 Sigma(rho), the linearised covariance of the estimates is
 *    the sandwich Cov(rho) = sigma^2 (J'J)^-1 J' Sigma J (J'J)^-1 (e.g. Seber & Wild, Nonlinear Regression, 1989,
 *    section 6.1, from memory), with sigma^2 = SSR / tr(M Sigma) since E SSR = sigma^2 tr(M Sigma),
 *    M = I - J (J'J)^-1 J'. Its Student t quantile has the Satterthwaite degrees of freedom of that variance
 *    estimate, nu(rho) = tr(M Sigma)^2 / tr((M Sigma)^2) (Satterthwaite, F.E. (1946), Biometrics Bulletin 2,
 *    110-114: the chi-square with the same mean and variance as e'Me). For slowly varying Jacobian columns the
 *    sandwich tends to the familiar variance inflation (1 + rho)/(1 - rho).
 * 2. rho is estimated poorly from a short record (at n = 30 and rho = 0.8 the estimate is typically 0.6 to 0.9),
 *    and plugging in one value leaves intervals too narrow whenever it comes out low. So rho is integrated out:
 *    on a grid of rho from -0.95 to 0.99 (step 0.02; values below 1e-5 of the largest weight dropped) each value gets the weight of its restricted (REML)
 *    likelihood in the linearised model, L(rho) ~ |Sigma|^-1/2 |Q'Sigma^-1 Q|^-1/2 (e'P e)^-(n-q)/2 with
 *    P = Sigma^-1 - Sigma^-1 Q (Q'Sigma^-1 Q)^-1 Q'Sigma^-1 (Harville, D.A. (1974), Biometrika 61, 383-385; Q an
 *    orthonormal basis of the Jacobian's columns), i.e. a flat prior on rho. The 95 % half-width d of a parameter
 *    solves sum_k w_k (2 F_t(d / se_k; nu_k) - 1) = 0.95, the mixture of the per-rho t intervals; the covariance
 *    reported is the mixture mean sum_k w_k Cov(rho_k) (law of total covariance: every rho has the same centre).
 * With known standard deviations (absolute weights) sigma^2 = 1 and the normal distribution replaces t.
 * Coverage checked by simulation: the seeded coverage test and `npm run bench` (Theis and Hantush-Jacob,
 * 30 readings, AR(1) noise with rho = 0.8: 92 to 93 %).
 */

import { normalCdf } from "./distributions.js";
import { studentTCdf, studentTQuantile } from "./student-t.js";
import {
  ar1InverseProduct,
  ar1Product,
  dot,
  inTimeOrder,
  orthonormalBasis,
  projectedSquareTrace,
  projectedTraces,
  type TimeOrder,
} from "./residual-structure.js";

/** The AR(1)-corrected uncertainty of a fit, in the fitting space. */
export interface CorrelatedCovariance {
  /** rho with the largest restricted likelihood. */
  readonly rho: number;
  /** Likelihood-weighted 2.5 % and 97.5 % points of rho on the grid. */
  readonly rhoRange: readonly [number, number];
  /** sigma^2 at the most likely rho, weighted residual units squared (1 for known standard deviations). */
  readonly noiseVariance: number;
  /** p-by-p mixture covariance in the fitting space; NaN where not identifiable. */
  readonly covariance: number[][];
  /** Per free parameter: half-width of the 95 % interval divided by its mixture standard error. */
  readonly quantiles: number[];
  /** n (1 - rho)/(1 + rho) at the most likely rho. */
  readonly effectiveN: number;
  /** The largest of `quantiles`, and the Student t degrees of freedom with that 0.975 quantile (Infinity when below 1.96). */
  readonly tQuantile: number;
  readonly dof: number;
}

const GRID_LOW = -0.95;
const GRID_HIGH = 0.99;
const GRID_STEP = 0.02;
/** Grid points whose weight is below this fraction of the largest are dropped from the mixture. */
const NEGLIGIBLE = 1e-5;

/** Cholesky factor (lower, row-major) of a small symmetric positive definite matrix; null when not positive definite. */
function cholesky(a: number[][]): number[][] | null {
  const m = a.length;
  const l = a.map(() => new Array<number>(m).fill(0));
  for (let i = 0; i < m; i++) {
    for (let j = 0; j <= i; j++) {
      let sum = a[i]![j]!;
      for (let k = 0; k < j; k++) sum -= l[i]![k]! * l[j]![k]!;
      if (i === j) {
        if (!(sum > 0)) return null;
        l[i]![i] = Math.sqrt(sum);
      } else {
        l[i]![j] = sum / l[j]![j]!;
      }
    }
  }
  return l;
}

function choleskySolve(l: number[][], b: number[]): number[] {
  const m = l.length;
  const y = new Array<number>(m).fill(0);
  for (let i = 0; i < m; i++) {
    let sum = b[i]!;
    for (let k = 0; k < i; k++) sum -= l[i]![k]! * y[k]!;
    y[i] = sum / l[i]![i]!;
  }
  for (let i = m - 1; i >= 0; i--) {
    let sum = y[i]!;
    for (let k = i + 1; k < m; k++) sum -= l[k]![i]! * y[k]!;
    y[i] = sum / l[i]![i]!;
  }
  return y;
}

/**
 * Restricted log-likelihood of rho (additive constants dropped) for residuals e (time order) of a linearised
 * model with orthonormal basis `basis`; sigma^2 profiled out, or fixed at `knownVariance`. See the module comment.
 */
export function ar1RestrictedLogLikelihood(
  order: TimeOrder,
  e: Float64Array,
  basis: readonly Float64Array[],
  rho: number,
  knownVariance?: number,
): number {
  const n = e.length;
  const q = basis.length;
  const inverseBasis = basis.map((v) => ar1InverseProduct(order, rho, v, new Float64Array(n)));
  const inverseE = ar1InverseProduct(order, rho, e, new Float64Array(n));
  const gram = basis.map((_, a) => basis.map((__, b) => dot(basis[a]!, inverseBasis[b]!)));
  const l = cholesky(gram);
  if (!l) return -Infinity;
  const coefficients = choleskySolve(l, basis.map((v) => dot(v, inverseE)));
  let quadratic = dot(e, inverseE);
  for (let k = 0; k < q; k++) quadratic -= coefficients[k]! * dot(basis[k]!, inverseE);
  if (!(quadratic > 0)) return -Infinity;
  let logDetSigma = 0;
  for (let w = 0; w + 1 < order.blocks.length; w++) logDetSigma += Math.max(0, order.blocks[w + 1]! - order.blocks[w]! - 1) * Math.log(1 - rho * rho);
  let logDetGram = 0;
  for (let k = 0; k < q; k++) logDetGram += 2 * Math.log(l[k]![k]!);
  const data = knownVariance === undefined ? (n - q) * Math.log(quadratic) : quadratic / knownVariance;
  return -0.5 * (logDetSigma + logDetGram + data);
}

/**
 * AR(1)-corrected uncertainty (module comment) from the weighted residuals and the column-major n-by-p weighted
 * Jacobian (both in packed order), the pseudo-inverse P = (J'J)^+ (fitting space; NaN rows for unidentifiable
 * parameters) and the weighted SSR; `knownVariance` (1 for absolute weights) replaces the estimate of sigma^2.
 */
export function correlatedCovariance(
  order: TimeOrder,
  residuals: Float64Array,
  jacobian: Float64Array,
  p: number,
  pseudoInverse: readonly (readonly number[])[],
  ssr: number,
  knownVariance?: number,
): CorrelatedCovariance {
  const n = order.seq.length;
  const e = inTimeOrder(order, residuals);
  const columns = Array.from({ length: p }, (_, j) => inTimeOrder(order, jacobian, j * n));
  const basis = orthonormalBasis(order, jacobian, p);
  const identifiable = pseudoInverse.map((row, a) => Number.isFinite(row[a]!));

  const grid: number[] = [];
  for (let k = 0; GRID_LOW + k * GRID_STEP <= GRID_HIGH + 1e-12; k++) grid.push(Math.round((GRID_LOW + k * GRID_STEP) * 100) / 100);
  if (grid[grid.length - 1] !== GRID_HIGH) grid.push(GRID_HIGH);
  const logLikelihood = grid.map((rho) => ar1RestrictedLogLikelihood(order, e, basis, rho, knownVariance));
  const best = Math.max(...logLikelihood);
  const raw = logLikelihood.map((v) => Math.exp(v - best));
  const total = raw.reduce((a, b) => a + b, 0);
  const weights = raw.map((v) => v / total);
  const mode = grid[logLikelihood.indexOf(best)]!;
  let cumulative = 0;
  let rhoLow = grid[0]!;
  let rhoHigh = grid[grid.length - 1]!;
  let lowSet = false;
  for (let k = 0; k < grid.length; k++) {
    cumulative += weights[k]!;
    if (!lowSet && cumulative >= 0.025) {
      rhoLow = grid[k]!;
      lowSet = true;
    }
    if (cumulative >= 0.975) {
      rhoHigh = grid[k]!;
      break;
    }
  }

  // Sandwich covariance, noise variance and Satterthwaite degrees of freedom at each retained rho.
  const members: { weight: number; covariance: number[][]; dof: number; variance: number }[] = [];
  for (let k = 0; k < grid.length; k++) {
    if (raw[k]! < NEGLIGIBLE) continue;
    const rho = grid[k]!;
    const sigmaColumns = columns.map((c) => ar1Product(order, rho, c, new Float64Array(n)));
    const middle = columns.map((ca) => sigmaColumns.map((sb) => dot(ca, sb)));
    const traceMSigma = projectedTraces(order, basis, rho).mSigma;
    const variance = knownVariance ?? ssr / traceMSigma;
    const dof = knownVariance === undefined ? (traceMSigma * traceMSigma) / projectedSquareTrace(order, basis, rho) : Infinity;
    const covariance: number[][] = [];
    for (let a = 0; a < p; a++) {
      const row: number[] = [];
      for (let b = 0; b < p; b++) {
        if (!identifiable[a] || !identifiable[b]) {
          row.push(NaN);
          continue;
        }
        let sum = 0;
        for (let c = 0; c < p; c++) {
          if (!identifiable[c]) continue;
          for (let d = 0; d < p; d++) if (identifiable[d]) sum += pseudoInverse[a]![c]! * middle[c]![d]! * pseudoInverse[d]![b]!;
        }
        row.push(variance * sum);
      }
      covariance.push(row);
    }
    members.push({ weight: weights[k]!, covariance, dof, variance });
  }
  const weightSum = members.reduce((s, m) => s + m.weight, 0);
  const covariance = Array.from({ length: p }, (_, a) =>
    Array.from({ length: p }, (_, b) => members.reduce((s, m) => s + m.weight * m.covariance[a]![b]!, 0) / weightSum),
  );

  // Half-width of the mixture of per-rho intervals, by bisection on the coverage.
  const quantiles = Array.from({ length: p }, (_, j) => {
    if (!identifiable[j]) return NaN;
    const coverage = (d: number) =>
      members.reduce((s, m) => {
        const z = d / Math.sqrt(m.covariance[j]![j]!);
        return s + m.weight * (2 * (Number.isFinite(m.dof) ? studentTCdf(z, m.dof) : normalCdf(z)) - 1);
      }, 0) / weightSum;
    const se = Math.sqrt(covariance[j]![j]!);
    let lo = 1.9 * se;
    let hi = 2.5 * se;
    while (coverage(lo) > 0.95 && lo > 1e-6 * se) lo /= 2;
    while (coverage(hi) < 0.95 && hi < 1e6 * se) hi *= 2;
    for (let i = 0; i < 60 && hi - lo > 1e-5 * hi; i++) {
      const mid = 0.5 * (lo + hi);
      if (coverage(mid) < 0.95) lo = mid;
      else hi = mid;
    }
    return hi / se;
  });
  const tQuantile = Math.max(...quantiles.filter(Number.isFinite), 0);
  let dof = Infinity;
  if (tQuantile > 1.959963984540054) {
    let lo = 0.05;
    let hi = 1e7;
    for (let i = 0; i < 100 && hi / lo > 1 + 1e-9; i++) {
      const mid = Math.sqrt(lo * hi);
      if (studentTQuantile(0.975, mid) > tQuantile) lo = mid;
      else hi = mid;
    }
    dof = Math.sqrt(lo * hi);
  }
  const modeMember = members.reduce((a, b) => (b.weight > a.weight ? b : a));
  return {
    rho: mode,
    rhoRange: [rhoLow, rhoHigh],
    noiseVariance: modeMember.variance,
    covariance,
    quantiles,
    effectiveN: (n * (1 - mode)) / (1 + mode),
    tQuantile,
    dof,
  };
}
