/** Errors of the slug-test analyses. Each message says what was wrong, where, and what would fix it. */

/** Slug-test input the analysis cannot work with: bad geometry, units, times or displacements. */
export class SlugTestInputError extends RangeError {
  override readonly name = "SlugTestInputError";
}
