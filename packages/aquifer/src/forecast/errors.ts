/** Errors raised by the forecasts: each says what was wrong and what would fix it. */

/** An input the forecasting tools cannot work with. */
export class ForecastInputError extends RangeError {
  override readonly name = "ForecastInputError";
}
