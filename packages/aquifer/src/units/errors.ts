/**
 * The one error type of the units module: an unknown or malformed unit, or an operation mixing dimensions.
 * The message says what was wrong and what would fix it; `suggestions` lists close known units, if any.
 */
export class UnitError extends Error {
  override readonly name = "UnitError";
  /** Known unit symbols close to the text that was not understood (empty when none or not applicable). */
  readonly suggestions: readonly string[];

  constructor(message: string, suggestions: readonly string[] = []) {
    super(message);
    this.suggestions = suggestions;
  }
}
