/**
 * Rorabaugh (1953) step-drawdown analysis: s_w = B Q + C Q^n with the exponent n fitted.
 * Source: Rorabaugh, M.I. (1953). Graphical and theoretical analysis of step-drawdown test of artesian well.
 * Proceedings of the American Society of Civil Engineers 79, separate 362.
 *
 * Fit: nonlinear least squares on the drawdowns (residual s_i - B Q_i - C Q_i^n, m) with the library's
 * Levenberg-Marquardt engine and an analytic Jacobian, in the scaled coordinates b = B Qm, c = C Qm^n, n
 * (Qm the largest rate), which keeps the three columns of comparable size. Start: Jacob's B and C with n = 2.
 * Covariance s^2 (J^T J)^-1 in (b, c, n), s^2 = SSR/(N - 3), carried to (B, C, n) by the delta method with
 * B = b/Qm, C = c Qm^-n (dC/dn = -C ln Qm).
 */

import { fitSpaceCovariance } from "../fit/statistics.js";
import { levenbergMarquardt } from "../fit/levenberg-marquardt.js";
import type { LeastSquaresProblem } from "../fit/levenberg-marquardt.js";
import { studentTQuantile } from "../fit/student-t.js";
import { fitStraightLine } from "./line-fit.js";
import type { StepDrawdownInput } from "./step-data.js";
import { stepsToBaseUnits } from "./step-data.js";
import { stepPerformance, wellLossCoefficientUnit } from "./step-performance.js";
import type { StepTestParameter, StepTestResult } from "./step-result.js";
import { waltonWellCondition } from "./well-condition.js";
import { portablePow } from "../numerics/portable-math.js";

/** Settings of rorabaughStepTest: bounds and starting value of the well-loss exponent n (dimensionless). */
export interface RorabaughOptions {
  /** Bounds of the exponent n; default [1, 5]. Rorabaugh reported values from about 1.5 to 3.5 (from memory). */
  readonly exponentBounds?: readonly [number, number];
  /** Starting exponent; default 2 (Jacob's form). */
  readonly startExponent?: number;
}

/**
 * Rorabaugh's (1953) analysis of a step-drawdown test: B (d/m2), C (d^n/m^(3n-1)) and n of s_w = B Q + C Q^n,
 * with standard errors and 95 % intervals (Student t, N - 3 degrees of freedom), per-step efficiency
 * B Q / (B Q + C Q^n), well-loss fraction and specific capacity. Needs at least 3 steps (4 for standard errors).
 * Walton's condition hint is given only when the fitted n is within 0.05 of 2, where C has Jacob's units.
 * @throws StepTestInputError for bad units, non-positive or repeated rates, non-positive drawdowns.
 */
export function rorabaughStepTest(input: StepDrawdownInput, options: RorabaughOptions = {}): StepTestResult {
  const { Q, s } = stepsToBaseUnits(input, 3);
  const N = Q.length;
  const [nLow, nHigh] = options.exponentBounds ?? [1, 5];
  const warnings: string[] = [];
  const qm = Math.max(...Q);
  const q = Q.map((v) => v / qm);
  const problem: LeastSquaresProblem = {
    residualCount: N,
    parameterCount: 3,
    residuals(x, out) {
      for (let i = 0; i < N; i++) out[i] = x[0]! * q[i]! + x[1]! * portablePow(q[i]!, x[2]!) - s[i]!;
    },
    jacobian(x, out) {
      for (let i = 0; i < N; i++) {
        const qn = portablePow(q[i]!, x[2]!);
        out[i] = q[i]!;
        out[N + i] = qn;
        out[2 * N + i] = x[1]! * qn * Math.log(q[i]!);
      }
    },
  };
  const start = startValues(Q, s, qm, options.startExponent ?? 2, nLow, nHigh);
  const lm = levenbergMarquardt(problem, start, {
    lower: new Float64Array([-Infinity, -Infinity, nLow]),
    upper: new Float64Array([Infinity, Infinity, nHigh]),
  });
  const [b, c, n] = [lm.x[0]!, lm.x[1]!, lm.x[2]!];
  const B = b / qm;
  const C = c * portablePow(qm, -n);
  const dof = N - 3;
  let se: (number | null)[] = [null, null, null];
  let t: number | null = null;
  if (dof > 0) {
    const cov = fitSpaceCovariance(lm.jacobian, N, 3, lm.ssr / dof).covariance;
    const g = [
      [1 / qm, 0, 0],
      [0, portablePow(qm, -n), -C * Math.log(qm)],
      [0, 0, 1],
    ];
    se = g.map((row) => {
      let v = 0;
      for (let a = 0; a < 3; a++) for (let k = 0; k < 3; k++) v += row[a]! * cov[a]![k]! * row[k]!;
      return Number.isFinite(v) ? Math.sqrt(v) : null;
    });
    t = studentTQuantile(0.975, dof);
  } else {
    warnings.push("Three steps fix B, C and n exactly: no standard errors; use four or more steps.");
  }
  const ci = (est: number, e: number | null): readonly [number, number] | null =>
    e === null || t === null ? null : [est - t * e, est + t * e];
  const parameters: StepTestParameter[] = [
    { name: "B", label: "formation loss coefficient", unit: "d/m2", estimate: B, standardError: se[0]!, ci95: ci(B, se[0]!) },
    { name: "C", label: "well loss coefficient", unit: wellLossCoefficientUnit(n), estimate: C, standardError: se[1]!, ci95: ci(C, se[1]!) },
    { name: "n", label: "well loss exponent", unit: "1", estimate: n, standardError: se[2]!, ci95: ci(n, se[2]!) },
  ];
  if (n <= nLow + 1e-9 || n >= nHigh - 1e-9) {
    warnings.push(`n = ${n.toPrecision(4)} sits on its bound [${nLow}, ${nHigh}]: the data do not determine n; report Jacob's n = 2 fit instead.`);
  }
  if (C < 0 || B <= 0) warnings.push(`B = ${B.toPrecision(3)} d/m2, C = ${C.toPrecision(3)}: a negative loss term is not physical.`);
  if (lm.reason === "max-evaluations") warnings.push("The fit stopped at its evaluation limit before converging.");
  warnings.push(
    "B, C and n are strongly correlated over the narrow range of rates of a step test; the standard errors are " +
      "linearised and can understate the uncertainty of n.",
  );
  return {
    method: "rorabaugh-1953",
    parameters,
    B,
    C,
    n,
    steps: stepPerformance(Q, s, B, C, n),
    residualStandardError: dof > 0 ? Math.sqrt(lm.ssr / dof) : null,
    fittedVariable: "s_w (m) against Q (m3/d)",
    points: N,
    dof,
    wellCondition: Math.abs(n - 2) <= 0.05 ? waltonWellCondition(C) : null,
    notes: [
      "Rorabaugh (1953): s_w = B Q + C Q^n; B, C, n by Levenberg-Marquardt least squares on the drawdowns " +
        `(stopped: ${lm.reason}, ${lm.iterations} iterations), started from Jacob's line with n = 2.`,
    ],
    warnings,
  };
}

/** Start: the straight line s/Q = B + C Q^(n0 - 1) (Jacob's line for n0 = 2), with n0 clipped into the bounds. */
function startValues(Q: Float64Array, s: Float64Array, qm: number, n0: number, lo: number, hi: number): Float64Array {
  const n = Math.min(Math.max(n0, lo), hi);
  const line = fitStraightLine(
    Q.map((v) => portablePow(v, n - 1)),
    Q.map((v, i) => s[i]! / v),
  );
  return new Float64Array([line.intercept * qm, line.slope * portablePow(qm, n), n]);
}
