/**
 * Walton's (1962) rule of thumb relating the well-loss coefficient C of s_w = BQ + CQ^2 to the condition of a
 * well. A classification hint only: C depends on rate range, well design and the form fitted.
 *
 * Thresholds (Walton, W.C., 1962, Selected analytical methods for well and aquifer evaluation, Illinois State
 * Water Survey Bulletin 49), in s^2/ft^5, from memory: C < 5 properly designed and developed; 5 to 10 mild
 * deterioration or clogging; 10 to 40 severe deterioration or clogging; > 40 difficult to restore to the
 * original capacity. Converted here with the units module (1 s^2/ft^5 = 5.0921e-8 d^2/m^5); the converted
 * values, about 0.5, 1 and 4 min^2/m^5, agree with the metric form of the same table as we recall it (also
 * from memory).
 */

import { toBase } from "../units/index.js";

/** Walton's condition classes, in order of increasing C. */
export type WellConditionClass =
  | "properly designed and developed"
  | "mild deterioration or clogging"
  | "severe deterioration or clogging"
  | "difficult to restore to original capacity";

/**
 * Walton's (1962) condition class for a well-loss coefficient C (d^2/m^5, Q in m3/d and s in m), with the class
 * limits used and their source; a hint for a reviewer, not a diagnosis.
 */
export interface WellConditionHint {
  readonly condition: WellConditionClass;
  /** The C classified, d^2/m^5. */
  readonly C: number;
  /** Class limits in d^2/m^5 (5, 10 and 40 s^2/ft^5 converted). */
  readonly thresholds: readonly [number, number, number];
  /** Always true: a hint for a reviewer, not a diagnosis. */
  readonly hintOnly: true;
  readonly source: string;
}

/** Walton's limits 5, 10, 40 s^2/ft^5 in d^2/m^5. */
export const WALTON_THRESHOLDS: readonly [number, number, number] = [
  toBase(5, "s2/ft5"),
  toBase(10, "s2/ft5"),
  toBase(40, "s2/ft5"),
];

/**
 * Walton's (1962) well-condition class for a well-loss coefficient C in d^2/m^5 (the C of s = BQ + CQ^2 with
 * Q in m3/d and s in m); null for a C that is not finite or is negative (no physical well loss to classify).
 */
export function waltonWellCondition(C: number): WellConditionHint | null {
  if (!(Number.isFinite(C) && C >= 0)) return null;
  const [a, b, c] = WALTON_THRESHOLDS;
  const condition: WellConditionClass =
    C < a
      ? "properly designed and developed"
      : C < b
        ? "mild deterioration or clogging"
        : C < c
          ? "severe deterioration or clogging"
          : "difficult to restore to original capacity";
  return {
    condition,
    C,
    thresholds: WALTON_THRESHOLDS,
    hintOnly: true,
    source:
      // The limits are from memory; the text shown calls them a rule of thumb.
      "Walton (1962), Illinois State Water Survey Bulletin 49: limits 5, 10, 40 s^2/ft^5 (a rule of thumb, common practice); " +
      "a classification hint only.",
  };
}
