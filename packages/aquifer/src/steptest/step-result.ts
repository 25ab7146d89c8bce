/** The result shape shared by the step-drawdown methods. */

import type { StepPerformance } from "./step-performance.js";
import type { WellConditionHint } from "./well-condition.js";

/** One fitted coefficient, base units. */
export interface StepTestParameter {
  /** "B", "C" or "n". */
  readonly name: string;
  readonly label: string;
  /** Unit text: "d/m2" for B, "d2/m5" for C with n = 2, "1" for n. */
  readonly unit: string;
  readonly estimate: number;
  /** Standard error; null when the data leave no degree of freedom. */
  readonly standardError: number | null;
  /** 95 % interval estimate +- t(0.975, dof) SE; null with the standard error. */
  readonly ci95: readonly [number, number] | null;
}

/**
 * Outcome of a step-drawdown analysis (Jacob, Rorabaugh or Hantush-Bierschenk): the coefficients of
 * s_w = B Q + C Q^n with uncertainties, per-step performance, fit quality, Walton's hint, notes and warnings.
 * Base units: Q m3/d, s_w m, B d/m2, C d^n/m^(3n-1).
 */
export interface StepTestResult {
  readonly method: "jacob-1947" | "rorabaugh-1953" | "hantush-bierschenk-1964";
  /** B, C and, for Rorabaugh, n. */
  readonly parameters: StepTestParameter[];
  /** Formation loss coefficient B, d/m2. */
  readonly B: number;
  /** Well loss coefficient C, d^n/m^(3n-1) (d2/m5 for n = 2). */
  readonly C: number;
  /** Exponent of the well-loss term (2 for Jacob and Hantush-Bierschenk). */
  readonly n: number;
  /** Per-step losses, efficiency, well-loss fraction and specific capacity. */
  readonly steps: StepPerformance[];
  /** Residual standard error in the unit of the fitted variable (d/m2 for the s_w/Q line, m for a fit on s_w). */
  readonly residualStandardError: number | null;
  /** What was regressed, e.g. "s_w/Q (d/m2) against Q (m3/d)". */
  readonly fittedVariable: string;
  /** Points used and degrees of freedom left. */
  readonly points: number;
  readonly dof: number;
  /** Walton (1962) condition class from C (n = 2 only); a hint, not a diagnosis. */
  readonly wellCondition: WellConditionHint | null;
  /** How the numbers were obtained, for the report. */
  readonly notes: string[];
  readonly warnings: string[];
}
