/**
 * Slug-test records: head displacement against time since the slug, normalized by the initial displacement
 * H0 and brought to base units (t in d). The sign convention does not matter: a falling head after an added
 * slug and a rising head after a removed one both give H/H0 from 1 towards 0.
 */

import type { ValueWithUnit } from "../data/index.js";
import { UnitError, convert, requireDimension } from "../units/index.js";
import { SlugTestInputError } from "./errors.js";

/** Head displacement in the tested well against time since the slug was added or removed. */
export interface SlugTestRecord {
  /** Well or test id, used in messages. */
  readonly name: string;
  /** Elapsed times since the slug, in `timeUnit`; >= 0, increasing. */
  readonly times: ArrayLike<number>;
  readonly timeUnit: string;
  /** Displacement of the water level from its static level, in `lengthUnit`, same sign as H0. */
  readonly displacements: ArrayLike<number>;
  readonly lengthUnit: string;
  /** Initial displacement H0 (at t = 0), nonzero. */
  readonly initialDisplacement: ValueWithUnit;
}

/** Which part of a record to fit: limits on time (record's unit) and on H/H0; all optional and inclusive. */
export interface SlugFitRange {
  /** Earliest time to use, in the record's time unit. */
  readonly fromTime?: number;
  /** Latest time to use, in the record's time unit. */
  readonly toTime?: number;
  /** Smallest H/H0 to use (e.g. 0.2). */
  readonly minNormalizedHead?: number;
  /** Largest H/H0 to use (e.g. 0.3, or 0.9 to skip an early disturbance). */
  readonly maxNormalizedHead?: number;
}

/** A record in base units. */
export interface NormalizedSlugRecord {
  /** Times, d. */
  readonly t: Float64Array;
  /** H/H0, dimensionless. */
  readonly h: Float64Array;
  /** H0, m (signed as given). */
  readonly H0: number;
  /** Indices into the caller's arrays. */
  readonly index: Int32Array;
}

/** A length in m from a value with unit. @throws SlugTestInputError for a unit that is not a length or a value <= 0. */
export function lengthInMetres(v: ValueWithUnit, what: string): number {
  try {
    requireDimension(v.unit, "length", what);
  } catch (error) {
    if (error instanceof UnitError) throw new SlugTestInputError(`Slug test: ${error.message}.`);
    throw error;
  }
  if (!(Number.isFinite(v.value) && v.value > 0)) {
    throw new SlugTestInputError(`Slug test: ${what} = ${v.value} ${v.unit}; give a positive length.`);
  }
  return convert(v.value, v.unit, "m");
}

/**
 * The record in base units with H/H0, keeping the points inside `range`. Points where H/H0 <= 0 are dropped
 * when `positiveOnly` (a logarithm is taken of them) and listed in `dropped`.
 * @throws SlugTestInputError for bad units, H0 = 0, mismatched lengths, non-finite or decreasing times.
 */
export function normalizeSlugRecord(
  record: SlugTestRecord,
  range: SlugFitRange = {},
  positiveOnly = true,
): NormalizedSlugRecord & { dropped: string[] } {
  for (const [unit, dim, what] of [
    [record.timeUnit, "time", "the times"],
    [record.lengthUnit, "length", "the displacements"],
    [record.initialDisplacement.unit, "length", "the initial displacement H0"],
  ] as const) {
    try {
      requireDimension(unit, dim, what);
    } catch (error) {
      if (error instanceof UnitError) throw new SlugTestInputError(`Slug test "${record.name}": ${error.message}.`);
      throw error;
    }
  }
  const n = record.times.length;
  if (record.displacements.length !== n) {
    throw new SlugTestInputError(
      `Slug test "${record.name}": ${n} times but ${record.displacements.length} displacements; give one per time.`,
    );
  }
  const H0 = convert(record.initialDisplacement.value, record.initialDisplacement.unit, "m");
  if (!(Number.isFinite(H0) && H0 !== 0)) {
    throw new SlugTestInputError(`Slug test "${record.name}": H0 = ${record.initialDisplacement.value}; give the nonzero initial displacement.`);
  }
  const t: number[] = [];
  const h: number[] = [];
  const index: number[] = [];
  const dropped: string[] = [];
  for (let i = 0; i < n; i++) {
    const ti = record.times[i]!;
    const Hi = record.displacements[i]!;
    if (!Number.isFinite(ti) || ti < 0 || (i > 0 && !(ti > record.times[i - 1]!))) {
      throw new SlugTestInputError(
        `Slug test "${record.name}": times[${i}] = ${ti}; times must be finite, >= 0 and strictly increasing.`,
      );
    }
    if (!Number.isFinite(Hi)) {
      throw new SlugTestInputError(`Slug test "${record.name}": displacements[${i}] = ${Hi}; give a finite number.`);
    }
    const hi = convert(Hi, record.lengthUnit, "m") / H0;
    if (range.fromTime !== undefined && ti < range.fromTime) continue;
    if (range.toTime !== undefined && ti > range.toTime) continue;
    if (range.minNormalizedHead !== undefined && hi < range.minNormalizedHead) continue;
    if (range.maxNormalizedHead !== undefined && hi > range.maxNormalizedHead) continue;
    if (positiveOnly && !(hi > 0)) {
      dropped.push(`point ${i + 1} (t = ${ti} ${record.timeUnit}): H/H0 = ${Number(hi.toPrecision(3))} <= 0, no logarithm`);
      continue;
    }
    t.push(convert(ti, record.timeUnit, "d"));
    h.push(hi);
    index.push(i);
  }
  return { t: new Float64Array(t), h: new Float64Array(h), H0, index: new Int32Array(index), dropped };
}
