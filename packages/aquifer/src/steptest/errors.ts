/** Errors of the step-drawdown analyses. Each message says what was wrong, where, and what would fix it. */

/** Step-test input the analysis cannot work with: too few steps, rates not increasing, bad units or times. */
export class StepTestInputError extends RangeError {
  override readonly name = "StepTestInputError";
}
