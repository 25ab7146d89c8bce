/** Errors of the units-aware analysis entry points: each says what was wrong, where, and what would fix it. */

/** An input the analysis entry points (fitSeries, forecastAt, compareModels) cannot work with. */
export class AnalysisInputError extends RangeError {
  override readonly name = "AnalysisInputError";
}
