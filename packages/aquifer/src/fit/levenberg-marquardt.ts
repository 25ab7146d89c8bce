/**
 * Bounded Levenberg-Marquardt least squares, minimising sum r_i(x)^2 over a box lo <= x <= hi.
 *
 * Algorithm: the trust-region form of Levenberg-Marquardt with Moré's diagonal scaling and step control
 * (J. J. Moré, "The Levenberg-Marquardt algorithm: implementation and theory", in G. A. Watson (ed.),
 * Numerical Analysis, Dundee 1977, Springer, vol. 630, 1978, pp. 105-116; the MINPACK lmder routine follows
 * it). Differences from MINPACK:
 * - the trust-region subproblem is solved from the SVD of R D^-1 (R from a Householder QR of J), so the
 *   secular equation ||D dx(lambda)|| = Delta costs O(p^2) per trial lambda;
 * - bounds by an active set and projection (Kanzow, Yamashita & Fukushima 2004, "Levenberg-Marquardt methods
 *   with strong local convergence properties for solving nonlinear equations with convex constraints",
 *   J. Comput. Appl. Math. 172): a variable at a bound whose gradient pushes outwards is held for that
 *   iteration, the step of the others is projected onto the box, and the predicted reduction is computed for
 *   the projected step.
 *
 * Deterministic: fixed loop order, no randomness; the same input gives the same output bit for bit.
 * Buffers are allocated once per call; the iteration itself allocates only the small p-by-p SVD.
 */

import { applyQTranspose, householderQr, jacobiSvd, numericalRank } from "./linalg.js";

/** Why the iteration stopped. */
export type ConvergenceReason =
  /** Relative reduction of the sum of squares, actual and predicted, below ftol. */
  | "ftol"
  /** Relative change of the scaled parameters below xtol. */
  | "xtol"
  /** Cosine between residual vector and every Jacobian column below gtol (first-order optimality). */
  | "gtol"
  /** The residuals are exactly zero. */
  | "zero-residual"
  /** Evaluation budget used up before any tolerance was met. */
  | "max-evaluations"
  /** Tolerances tighter than machine precision allow: no further reduction possible. */
  | "stalled"
  /** Every parameter is fixed: nothing to iterate. */
  | "no-free-parameters";

/** How the Jacobian is obtained when the problem supplies none. */
export type FiniteDifferenceScheme = "forward" | "central";

/** A least-squares problem in the fitting space. */
export interface LeastSquaresProblem {
  /** Number of residuals n. */
  readonly residualCount: number;
  /** Number of unknowns p (<= n). */
  readonly parameterCount: number;
  /** Writes r(x) into out (length n). Non-finite values mark x as unusable (the step is rejected). */
  residuals(x: Float64Array, out: Float64Array): void;
  /** Optional analytic Jacobian: writes d r_i / d x_k into out[k * n + i] (column-major n-by-p). */
  jacobian?(x: Float64Array, out: Float64Array): void;
}

/**
 * Settings of levenbergMarquardt: box bounds on the unknowns (fitting-space units), stopping tolerances and
 * trust-radius factor (dimensionless), evaluation budget and finite-difference scheme.
 */
export interface LevenbergMarquardtOptions {
  /** Lower bounds per unknown (may be -Infinity). */
  readonly lower?: Float64Array;
  /** Upper bounds per unknown (may be Infinity). */
  readonly upper?: Float64Array;
  /** Relative sum-of-squares tolerance (MINPACK ftol); default 1e-10. */
  readonly ftol?: number;
  /** Relative step tolerance on the scaled parameters (MINPACK xtol); default 1e-10. */
  readonly xtol?: number;
  /** Gradient-cosine tolerance (MINPACK gtol); default 1e-10. */
  readonly gtol?: number;
  /** Most residual evaluations, finite-difference ones included; default 200 (p + 1). */
  readonly maxEvaluations?: number;
  /** Finite-difference scheme when the problem has no Jacobian; default "central". */
  readonly finiteDifferences?: FiniteDifferenceScheme;
  /**
   * Initial trust radius as a multiple of ||D x0|| (MINPACK factor); default 10. MINPACK suggests 100, but
   * with parameters in ln space such a first step can span many decades and strand the iteration on a
   * plateau where the model saturates.
   */
  readonly stepBound?: number;
  /** r(x0) when the caller has already evaluated it (counted as one evaluation); saves one evaluation. */
  readonly initialResiduals?: Float64Array;
}

/**
 * Outcome of levenbergMarquardt: the solution x (fitting-space units), the residuals, their sum of squares and
 * the Jacobian there (units of the problem's residuals), why it stopped, and counts of steps and evaluations.
 */
export interface LevenbergMarquardtResult {
  /** Solution in the fitting space. */
  readonly x: Float64Array;
  /** Residuals at x. */
  readonly residuals: Float64Array;
  /** Sum of squared residuals at x. */
  readonly ssr: number;
  /** Column-major n-by-p Jacobian at x (a fresh evaluation at the final point). */
  readonly jacobian: Float64Array;
  readonly reason: ConvergenceReason;
  /** Accepted steps. */
  readonly iterations: number;
  /** Residual evaluations, finite-difference evaluations included. */
  readonly evaluations: number;
  /** Jacobian evaluations (analytic or by finite differences). */
  readonly jacobianEvaluations: number;
}

const EPS = Number.EPSILON;

function norm(v: Float64Array, length: number): number {
  let sum = 0;
  for (let i = 0; i < length; i++) sum += v[i]! * v[i]!;
  return Math.sqrt(sum);
}

function allFinite(v: Float64Array): boolean {
  for (let i = 0; i < v.length; i++) if (!Number.isFinite(v[i]!)) return false;
  return true;
}

/**
 * Minimises ||r(x)||^2 from x0 (fitting-space units) with Levenberg-Marquardt inside the box [lower, upper].
 * x0 must lie inside the box and give finite residuals.
 */
export function levenbergMarquardt(
  problem: LeastSquaresProblem,
  x0: Float64Array,
  options: LevenbergMarquardtOptions = {},
): LevenbergMarquardtResult {
  const n = problem.residualCount;
  const p = problem.parameterCount;
  const ftol = options.ftol ?? 1e-10;
  const xtol = options.xtol ?? 1e-10;
  const gtol = options.gtol ?? 1e-10;
  const maxEvaluations = options.maxEvaluations ?? 200 * (p + 1);
  const scheme = options.finiteDifferences ?? "central";
  const factor = options.stepBound ?? 10;
  const lower = options.lower ?? new Float64Array(p).fill(-Infinity);
  const upper = options.upper ?? new Float64Array(p).fill(Infinity);

  const x = x0.slice();
  const f = new Float64Array(n);
  const fTrial = new Float64Array(n);
  const fdPlus = new Float64Array(n);
  const fdMinus = new Float64Array(n);
  const jac = new Float64Array(n * p);
  const work = new Float64Array(n);
  const tau = new Float64Array(p);
  const qtf = new Float64Array(p);
  const diag = new Float64Array(p);
  const columnNorms = new Float64Array(p);
  const gradient = new Float64Array(p);
  const xTrial = new Float64Array(p);
  const step = new Float64Array(p);
  const rStep = new Float64Array(p);
  const free = new Int32Array(p);
  const z = new Float64Array(p);

  let evaluations = 0;
  let jacobianEvaluations = 0;

  const evaluate = (at: Float64Array, out: Float64Array): void => {
    problem.residuals(at, out);
    evaluations++;
  };

  const computeJacobian = (): void => {
    jacobianEvaluations++;
    if (problem.jacobian) {
      problem.jacobian(x, jac);
      return;
    }
    for (let k = 0; k < p; k++) {
      const xk = x[k]!;
      const ck = k * n;
      const base = Math.max(Math.abs(xk), 1);
      if (scheme === "central") {
        const h = Math.cbrt(EPS) * base;
        if (xk + h <= upper[k]! && xk - h >= lower[k]!) {
          x[k] = xk + h;
          const hp = x[k]! - xk;
          evaluate(x, fdPlus);
          x[k] = xk - h;
          const hm = xk - x[k]!;
          evaluate(x, fdMinus);
          x[k] = xk;
          const span = hp + hm;
          for (let i = 0; i < n; i++) jac[ck + i] = (fdPlus[i]! - fdMinus[i]!) / span;
          continue;
        }
      }
      let h = Math.sqrt(EPS) * base;
      if (xk + h > upper[k]!) h = -h;
      x[k] = xk + h;
      const actual = x[k]! - xk;
      evaluate(x, fdPlus);
      x[k] = xk;
      for (let i = 0; i < n; i++) jac[ck + i] = (fdPlus[i]! - f[i]!) / actual;
    }
  };

  let jacobianIsCurrent = false;
  const finish = (reason: ConvergenceReason, iterations: number): LevenbergMarquardtResult => {
    if (!jacobianIsCurrent) computeJacobian();
    let ssr = 0;
    for (let i = 0; i < n; i++) ssr += f[i]! * f[i]!;
    return {
      x: x.slice(),
      residuals: f.slice(),
      ssr,
      jacobian: jac.slice(),
      reason,
      iterations,
      evaluations,
      jacobianEvaluations,
    };
  };

  if (options.initialResiduals) {
    f.set(options.initialResiduals);
    evaluations++;
  } else {
    evaluate(x, f);
  }
  if (!allFinite(f)) throw new Error("levenbergMarquardt: the residuals at the start point are not finite");
  if (p === 0) {
    return {
      x,
      residuals: f.slice(),
      ssr: norm(f, n) ** 2,
      jacobian: new Float64Array(0),
      reason: "no-free-parameters",
      iterations: 0,
      evaluations,
      jacobianEvaluations,
    };
  }
  let fnorm = norm(f, n);
  let lambda = 0;
  let delta = 0;
  let xnorm = 0;
  let iterations = 0;

  for (let outer = 1; ; outer++) {
    computeJacobian();
    jacobianIsCurrent = true;
    jacobianIsCurrent = false;
    householderQr(jac, n, p, tau);
    work.set(f);
    applyQTranspose(jac, n, p, tau, work);
    for (let k = 0; k < p; k++) qtf[k] = work[k]!;
    // Column norms and gradient J^T f from J = QR: ||J e_k|| = ||R e_k||, J^T f = R^T (Q^T f).
    for (let k = 0; k < p; k++) {
      let sumSq = 0;
      let dot = 0;
      const ck = k * n;
      for (let i = 0; i <= k; i++) {
        const v = jac[ck + i]!;
        sumSq += v * v;
        dot += v * qtf[i]!;
      }
      columnNorms[k] = Math.sqrt(sumSq);
      gradient[k] = dot;
    }
    if (outer === 1) {
      for (let k = 0; k < p; k++) diag[k] = columnNorms[k]! > 0 ? columnNorms[k]! : 1;
      let sum = 0;
      for (let k = 0; k < p; k++) sum += (diag[k]! * x[k]!) ** 2;
      xnorm = Math.sqrt(sum);
      delta = factor * xnorm;
      if (delta === 0) delta = factor;
    } else {
      for (let k = 0; k < p; k++) if (columnNorms[k]! > diag[k]!) diag[k] = columnNorms[k]!;
    }

    // Active set: variables at a bound whose steepest-descent direction -g leaves the box.
    let freeCount = 0;
    for (let k = 0; k < p; k++) {
      const atLower = x[k]! <= lower[k]! && gradient[k]! > 0;
      const atUpper = x[k]! >= upper[k]! && gradient[k]! < 0;
      if (!atLower && !atUpper) free[freeCount++] = k;
    }

    if (fnorm === 0) return finish("zero-residual", iterations);
    let gnorm = 0;
    for (let j = 0; j < freeCount; j++) {
      const k = free[j]!;
      if (columnNorms[k]! > 0) gnorm = Math.max(gnorm, Math.abs(gradient[k]!) / (columnNorms[k]! * fnorm));
    }
    if (gnorm <= gtol || freeCount === 0) return finish("gtol", iterations);

    let qtfNormSq = 0;
    for (let k = 0; k < p; k++) qtfNormSq += qtf[k]! * qtf[k]!;
    const outsideRangeSq = Math.max(fnorm * fnorm - qtfNormSq, 0);

    // A = R[:, free] D_free^-1 (p-by-freeCount), then its SVD for the trust-region subproblem.
    const a = new Float64Array(p * freeCount);
    for (let j = 0; j < freeCount; j++) {
      const k = free[j]!;
      for (let i = 0; i <= k; i++) a[j * p + i] = jac[k * n + i]! / diag[k]!;
    }
    const svd = jacobiSvd(a, p, freeCount);
    const rank = numericalRank(svd.sigma, p, freeCount);
    const c = new Float64Array(freeCount);
    for (let j = 0; j < freeCount; j++) {
      let dot = 0;
      for (let i = 0; i < p; i++) dot += svd.w[j * p + i]! * qtf[i]!;
      c[j] = dot;
    }
    let cNorm = 0;
    for (let j = 0; j < freeCount; j++) cNorm += c[j]! * c[j]!;
    cNorm = Math.sqrt(cNorm);

    // Scaled step z(lambda) = -sum_j c_j / (sigma_j^2 + lambda) v_j; returns ||z||.
    const scaledStep = (lam: number): number => {
      z.fill(0);
      for (let j = 0; j < freeCount; j++) {
        const s2 = svd.sigma[j]! * svd.sigma[j]!;
        if (lam === 0 && j >= rank) continue;
        const coefficient = -c[j]! / (s2 + lam);
        for (let i = 0; i < freeCount; i++) z[i]! += coefficient * svd.v[j * freeCount + i]!;
      }
      return norm(z, freeCount);
    };
    const derivativeSum = (lam: number): number => {
      let sum = 0;
      for (let j = 0; j < freeCount; j++) {
        const d = svd.sigma[j]! * svd.sigma[j]! + lam;
        sum += (c[j]! * c[j]!) / (d * d * d);
      }
      return sum;
    };

    for (;;) {
      // Solve min ||qtf + A z||^2 subject to ||z|| <= delta (Moré 1978, section 5), z = D dx.
      let zNorm = scaledStep(0);
      if (zNorm - delta <= 0.1 * delta) {
        lambda = 0;
      } else {
        let lowerLambda = 0;
        if (rank === freeCount) {
          // One Newton step on 1/delta - 1/||z(lambda)|| from 0 (a concave function): a lower bound.
          lowerLambda = Math.max(0, ((zNorm - delta) * zNorm * zNorm) / (delta * derivativeSum(0)));
        }
        let upperLambda = cNorm / delta;
        if (upperLambda === 0) upperLambda = Number.MIN_VALUE / Math.min(delta, 0.1);
        lambda = Math.min(Math.max(lambda, lowerLambda), upperLambda);
        if (lambda === 0) lambda = Math.max(0.001 * upperLambda, Math.sqrt(lowerLambda * upperLambda));
        for (let inner = 0; inner < 20; inner++) {
          if (lambda <= lowerLambda || lambda >= upperLambda) {
            lambda = Math.max(0.001 * upperLambda, Math.sqrt(lowerLambda * upperLambda));
          }
          zNorm = scaledStep(lambda);
          const phi = zNorm - delta;
          if (Math.abs(phi) <= 0.1 * delta) break;
          if (phi > 0) lowerLambda = Math.max(lowerLambda, lambda);
          else upperLambda = Math.min(upperLambda, lambda);
          const correction = (phi * zNorm * zNorm) / (delta * derivativeSum(lambda));
          lambda = Math.max(lowerLambda, lambda + correction);
        }
      }

      // Unscale, project onto the box and measure the step actually taken.
      step.fill(0);
      for (let j = 0; j < freeCount; j++) step[free[j]!] = z[j]! / diag[free[j]!]!;
      for (let k = 0; k < p; k++) {
        const target = Math.min(Math.max(x[k]! + step[k]!, lower[k]!), upper[k]!);
        xTrial[k] = target;
        step[k] = target - x[k]!;
      }
      let pnormSq = 0;
      for (let k = 0; k < p; k++) pnormSq += (diag[k]! * step[k]!) ** 2;
      const pnorm = Math.sqrt(pnormSq);
      if (outer === 1 && iterations === 0) delta = Math.min(delta, pnorm);

      let fnormTrial = Infinity;
      if (pnorm > 0) {
        evaluate(xTrial, fTrial);
        if (allFinite(fTrial)) fnormTrial = norm(fTrial, n);
      }
      let actualReduction = -1;
      if (0.1 * fnormTrial < fnorm) actualReduction = 1 - (fnormTrial / fnorm) ** 2;

      // Model: ||f + J s||^2 = ||qtf + R s||^2 + ||f||^2 - ||qtf||^2 (J = Q R).
      let modelSq = 0;
      let directional = 0;
      for (let i = 0; i < p; i++) {
        let sum = 0;
        for (let k = i; k < p; k++) sum += jac[k * n + i]! * step[k]!;
        rStep[i] = sum;
        modelSq += (qtf[i]! + sum) ** 2;
        directional += qtf[i]! * sum;
      }
      modelSq += outsideRangeSq;
      const fnormSq = fnorm * fnorm;
      const predictedReduction = 1 - modelSq / fnormSq;
      const dirder = (2 * directional) / fnormSq;
      const ratio = predictedReduction > 0 ? actualReduction / predictedReduction : 0;

      if (ratio <= 0.25) {
        let temp = actualReduction >= 0 ? 0.5 : (0.5 * dirder) / (dirder + 0.5 * actualReduction);
        if (0.1 * fnormTrial >= fnorm || !(temp >= 0.1)) temp = 0.1;
        delta = temp * (pnorm > 0 ? Math.min(delta, pnorm / 0.1) : delta);
        lambda /= temp;
      } else if (lambda === 0 || ratio >= 0.75) {
        delta = pnorm / 0.5;
        lambda *= 0.5;
      }

      const accepted = ratio >= 1e-4;
      if (accepted) {
        x.set(xTrial);
        f.set(fTrial);
        fnorm = fnormTrial;
        let sum = 0;
        for (let k = 0; k < p; k++) sum += (diag[k]! * x[k]!) ** 2;
        xnorm = Math.sqrt(sum);
        iterations++;
      }

      const smallReduction = Math.abs(actualReduction) <= ftol && predictedReduction <= ftol && 0.5 * ratio <= 1;
      if (fnorm === 0) return finish("zero-residual", iterations);
      if (smallReduction) return finish("ftol", iterations);
      if (delta <= xtol * xnorm) return finish("xtol", iterations);
      if (evaluations >= maxEvaluations) return finish("max-evaluations", iterations);
      if (
        (Math.abs(actualReduction) <= EPS && predictedReduction <= EPS && 0.5 * ratio <= 1) ||
        delta <= EPS * Math.max(xnorm, EPS)
      ) {
        return finish("stalled", iterations);
      }
      if (accepted) break;
    }
  }
}
