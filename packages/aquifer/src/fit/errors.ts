/** Errors of the fitting engine. Each message says what was wrong, where, and what would fix it. */

/** Input a fit cannot work with: missing or malformed data, unknown parameter names, bad bounds. */
export class FitInputError extends RangeError {
  override readonly name = "FitInputError";
}
