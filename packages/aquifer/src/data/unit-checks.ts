/**
 * Checking that a unit string names a unit of the dimension a series field needs, with a message the
 * user can act on when it does not.
 */

import { UnitError, requireDimension } from "../units/index.js";

/** The quantities a series field can hold. */
export type SeriesQuantity = "time" | "length" | "discharge";

/**
 * Returns null when `unit` parses and has the dimension of `quantity`; otherwise the units module's
 * sentence prefixed by `field`: the unit found and a unit that would do, or suggestions for an unknown unit.
 */
export function checkUnit(unit: string, quantity: SeriesQuantity, field: string): string | null {
  try {
    requireDimension(unit, quantity);
    return null;
  } catch (error) {
    if (error instanceof UnitError) return `${field}: ${error.message}`;
    throw error;
  }
}
