/**
 * Spotting a column read as the wrong kind of level. Rules of thumb (common practice, no source):
 *
 * - Drawdown grows from about zero as pumping goes on, so a "drawdown" column that is mostly negative, with
 *   its most negative value larger in size than its largest positive value, is not drawdown in the library's
 *   sign convention: heads measured below a datum, or drawdown with the opposite sign.
 * - A "drawdown" column that stays far from zero (its smallest value more than twice its whole range) is a
 *   level measured from some datum: if it falls as pumping goes on it is a head (water-level elevation); if
 *   it rises it is a depth to water.
 * - For heads and depths to water the drawdowns computed with the static level must come out mostly
 *   non-negative by the first rule; if not, the kind or the static level is wrong.
 *
 * Recovery records (drawdown falling towards zero) pass: they come near zero. Fewer than 3 readings are
 * not judged.
 */

import type { LevelKind } from "./observation-csv-options.js";

/** A finding about the kind of a level column. */
export interface LevelKindFinding {
  readonly code: "looks-like-head" | "looks-like-depth-to-water" | "negative-drawdown";
  /** What the values show, as a predicate to follow the column's name ("looks like depth to water, ..."). */
  readonly what: string;
  readonly fix: string;
}

const MINIMUM_READINGS = 3;

function formatValue(x: number): string {
  return Number(x.toPrecision(6)).toString();
}

/** Mean of the last third of the values minus the mean of the first third (values in time order). */
function trend(values: ArrayLike<number>): number {
  const third = Math.max(1, Math.floor(values.length / 3));
  let first = 0;
  let last = 0;
  for (let i = 0; i < third; i++) {
    first += values[i]!;
    last += values[values.length - 1 - i]!;
  }
  return (last - first) / third;
}

/**
 * Judges whether a column read as `kind` really holds that kind of level. `raw` are the column's values
 * and `drawdowns` the drawdowns computed from them, both in time order and in `lengthUnit`; `staticLevel`
 * is the static level used for heads and depths. Returns null when nothing looks wrong.
 */
export function judgeLevelKind(
  kind: LevelKind,
  raw: ArrayLike<number>,
  drawdowns: ArrayLike<number>,
  staticLevel: number,
  lengthUnit: string,
): LevelKindFinding | null {
  const n = drawdowns.length;
  if (n < MINIMUM_READINGS) return null;
  let negatives = 0;
  let minS = Infinity;
  let maxS = -Infinity;
  let minRaw = Infinity;
  let maxRaw = -Infinity;
  for (let i = 0; i < n; i++) {
    const s = drawdowns[i]!;
    if (s < 0) negatives++;
    minS = Math.min(minS, s);
    maxS = Math.max(maxS, s);
    minRaw = Math.min(minRaw, raw[i]!);
    maxRaw = Math.max(maxRaw, raw[i]!);
  }
  const rawRange = `${formatValue(minRaw)} to ${formatValue(maxRaw)} ${lengthUnit}`;
  const falling = trend(raw) < 0;
  const mostlyNegative = negatives > n / 2 && -minS > Math.max(maxS, 0);

  if (kind === "drawdown") {
    if (mostlyNegative) {
      if (falling) {
        return {
          code: "looks-like-head",
          what: `looks like water levels (heads), not drawdown: ${negatives} of ${n} values are below 0 and they fall as pumping goes on (${rawRange})`,
          fix: "set kind: 'head' and give the static level (staticLevel); if the column is drawdown recorded with the opposite sign, negate it before import",
        };
      }
      return {
        code: "negative-drawdown",
        what: `is mostly negative (${negatives} of ${n} values below 0, ${rawRange}), but drawdown is positive when the water level falls`,
        fix: "if the column holds drawdown with the opposite sign, negate it before import; if it holds water levels, set kind: 'head' or 'depth-to-water' and give the static level (staticLevel)",
      };
    }
    const spread = maxRaw - minRaw;
    if (spread > 0 && minRaw > 2 * spread) {
      if (falling) {
        return {
          code: "looks-like-head",
          what: `looks like water levels (heads), not drawdown: values fall as pumping goes on and never come near zero (${rawRange}), while drawdown starts near zero and grows`,
          fix: "set kind: 'head' and give the static level (staticLevel)",
        };
      }
      return {
        code: "looks-like-depth-to-water",
        what: `looks like depth to water, not drawdown: values rise as pumping goes on but never come near zero (${rawRange}), while drawdown starts near zero`,
        fix: "set kind: 'depth-to-water' and give the static level (staticLevel, the depth to water before pumping)",
      };
    }
    return null;
  }

  if (mostlyNegative) {
    const other = kind === "head" ? "depth-to-water" : "head";
    const sense = kind === "head" ? "above" : "shallower than";
    return {
      code: "negative-drawdown",
      what: `gives mostly negative drawdowns with staticLevel ${formatValue(staticLevel)} ${lengthUnit} (${negatives} of ${n} below 0; values ${rawRange}): the levels sit ${sense} the static level`,
      fix: `check staticLevel; if the column holds ${kind === "head" ? "depths to water" : "heads (water-level elevations)"}, set kind: '${other}'`,
    };
  }
  return null;
}
