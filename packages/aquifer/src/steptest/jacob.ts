/**
 * Jacob (1947) step-drawdown analysis: s_w = B Q + C Q^2, B the formation (aquifer) loss coefficient, C the
 * well loss coefficient, from the straight line s_w/Q = B + C Q (linear least squares of s_w/Q on Q).
 * Source: Jacob, C.E. (1947). Drawdown test to determine effective radius of artesian well. Transactions of the
 * American Society of Civil Engineers 112, 1047-1064.
 */

import { fitStraightLine } from "./line-fit.js";
import type { StepDrawdownInput } from "./step-data.js";
import { stepsToBaseUnits } from "./step-data.js";
import { stepPerformance } from "./step-performance.js";
import type { StepTestParameter, StepTestResult } from "./step-result.js";
import { waltonWellCondition } from "./well-condition.js";

/** Builds the B, C, (n) report from a straight-line fit of s/Q on Q and the common checks. */
export function quadraticLossResult(
  method: "jacob-1947" | "hantush-bierschenk-1964",
  Q: Float64Array,
  s: Float64Array,
  notes: string[],
  warnings: string[],
): StepTestResult {
  const y = new Float64Array(Q.length);
  for (let i = 0; i < Q.length; i++) y[i] = s[i]! / Q[i]!;
  const line = fitStraightLine(Q, y);
  const B = line.intercept;
  const C = line.slope;
  const parameters: StepTestParameter[] = [
    {
      name: "B",
      label: "formation loss coefficient",
      unit: "d/m2",
      estimate: B,
      standardError: line.interceptStandardError,
      ci95: line.interceptCi95,
    },
    {
      name: "C",
      label: "well loss coefficient",
      unit: "d2/m5",
      estimate: C,
      standardError: line.slopeStandardError,
      ci95: line.slopeCi95,
    },
  ];
  if (line.n === 2) warnings.push("Two steps fix the line exactly: no standard errors; use three or more steps.");
  if (C < 0) {
    warnings.push(
      `C = ${C.toPrecision(3)} d2/m5 is negative: s_w/Q falls as Q rises, which a well loss cannot do; ` +
        `look for steps not yet stable, a changing aquifer response or a faulty rate.`,
    );
  }
  if (B <= 0) {
    warnings.push(`B = ${B.toPrecision(3)} d/m2 is not positive: the straight line does not describe these steps.`);
  }
  const increasing = Array.from(Q).every((q, i) => i === 0 || q > Q[i - 1]!);
  if (!increasing) warnings.push("The rates do not increase from step to step; check the order of the steps.");
  return {
    method,
    parameters,
    B,
    C,
    n: 2,
    steps: stepPerformance(Q, s, B, C, 2),
    residualStandardError: line.n > 2 ? Math.sqrt(line.ssr / (line.n - 2)) : null,
    fittedVariable: "s_w/Q (d/m2) against Q (m3/d)",
    points: line.n,
    dof: line.n - 2,
    wellCondition: waltonWellCondition(C),
    notes,
    warnings,
  };
}

/**
 * Jacob's (1947) analysis of a step-drawdown test: B (d/m2) and C (d2/m5) of s_w = B Q + C Q^2 with standard
 * errors and 95 % intervals from the least-squares line s_w/Q = B + C Q (unweighted in s_w/Q), per-step
 * efficiency, well-loss fraction and specific capacity, and Walton's (1962) condition hint from C.
 * Needs at least 2 steps (3 for standard errors).
 * @throws StepTestInputError for bad units, non-positive or repeated rates, non-positive drawdowns.
 */
export function jacobStepTest(input: StepDrawdownInput): StepTestResult {
  const { Q, s } = stepsToBaseUnits(input, 2);
  return quadraticLossResult(
    "jacob-1947",
    Q,
    s,
    [
      "Jacob (1947): s_w = B Q + C Q^2; B and C from the unweighted least-squares line s_w/Q = B + C Q " +
        "(B intercept, C slope); standard errors from the scatter about the line, 95 % intervals with Student t " +
        "for n - 2 degrees of freedom.",
    ],
    [],
  );
}
