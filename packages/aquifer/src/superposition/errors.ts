/**
 * Errors raised by superposition, image wells, recovery and distance-drawdown analysis. Each message says
 * what was wrong, where, and what would fix it.
 */

/** An input (schedule, geometry, boundary, data) that the superposition tools cannot work with. */
export class SuperpositionInputError extends RangeError {
  override readonly name = "SuperpositionInputError";
}
