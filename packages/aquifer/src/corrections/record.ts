/**
 * What a correction did, as plain data that crosses the sandbox bridge and can be printed in a report:
 * the method, its published source, the parameters used (given or estimated) and a one-paragraph summary.
 */

/** A parameter of a correction: a number, a text, a flag, or a number with its unit. */
export type CorrectionParameter = number | string | boolean | { readonly value: number; readonly unit: string };

/** The record every correction returns beside its corrected values. */
export interface CorrectionRecord {
  /** Short name of the method, e.g. "barometric efficiency correction". */
  readonly method: string;
  /** Published source of the formula, or "common practice, no source". */
  readonly source: string;
  /** Parameters used, given or estimated, with units where they have one. */
  readonly parameters: Readonly<Record<string, CorrectionParameter>>;
  /** What was done, in sentences a reviewer can read. */
  readonly summary: string;
  /** Conditions the user should look at (empty when none); the correction was still applied. */
  readonly warnings: readonly string[];
}

/** Corrected values and the record of the correction. */
export interface CorrectionResult {
  /** Corrected values, in the unit of the input values. */
  readonly values: Float64Array;
  readonly record: CorrectionRecord;
}

/**
 * Thrown when a correction cannot be applied to the data given; the message says what was wrong, where,
 * and what would fix it.
 */
export class CorrectionError extends Error {
  override readonly name = "CorrectionError";
}

/** Number in a message: up to 6 significant digits, no trailing zeros. */
export function formatNumber(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  if (x === 0) return "0";
  return String(Number(x.toPrecision(6)));
}

/** Checks that every value is finite; names the first bad index of `what`. */
export function requireFinite(values: ArrayLike<number>, what: string): void {
  for (let i = 0; i < values.length; i++) {
    if (!Number.isFinite(values[i]!)) {
      throw new CorrectionError(`${what}[${i}] is ${values[i]}; give finite values only (drop or fill the reading first)`);
    }
  }
}

/** Checks that two arrays have the same length. */
export function requireSameLength(a: ArrayLike<number>, aName: string, b: ArrayLike<number>, bName: string): void {
  if (a.length !== b.length) {
    throw new CorrectionError(`${aName} has ${a.length} values but ${bName} has ${b.length}; give one ${bName} value per ${aName} value`);
  }
}
