/**
 * The static (pre-pumping) water level and drawdown from it. Drawdown s = d - d0 from depth to water,
 * s = h0 - h from head (common practice, no source; computed by the data module's drawdownFromDepthToWater
 * and drawdownFromHead). The static level is given, or estimated as the mean of the last N readings before
 * pumping started, reported with their standard deviation and range so a reviewer can judge it.
 */
import { drawdownFromDepthToWater, drawdownFromHead } from "../data/levels.js";
import { requireDimension } from "../units/index.js";
import { CorrectionError, formatNumber, requireFinite, requireSameLength } from "./record.js";
import type { CorrectionResult } from "./record.js";
import { largestOf, smallestOf } from "../numerics/extremes.js";

/** Options of `estimateStaticLevel`. */
export interface StaticLevelOptions {
  /** Times of the readings, in timeUnit, on one clock with pumpingStart. */
  readonly times: ArrayLike<number>;
  /** Depth to water or head readings, in lengthUnit. */
  readonly levels: ArrayLike<number>;
  /** Time when pumping started, in timeUnit; readings with time < pumpingStart are pre-test. */
  readonly pumpingStart: number;
  /** How many of the last pre-test readings to average, >= 1. */
  readonly count: number;
  readonly timeUnit: string;
  readonly lengthUnit: string;
}

/** A static level estimated from pre-test readings. */
export interface StaticLevelEstimate {
  /** Mean of the readings used, in lengthUnit. */
  readonly level: number;
  /** N, the number of readings averaged. */
  readonly count: number;
  /** Sample standard deviation of the readings used, in lengthUnit; null when N = 1. */
  readonly standardDeviation: number | null;
  /** Largest minus smallest reading used, in lengthUnit. */
  readonly range: number;
  /** Times of the first and last reading used, in timeUnit. */
  readonly timeSpan: readonly [number, number];
  readonly lengthUnit: string;
}

/**
 * Mean of the last `count` readings before pumpingStart, with their spread; level in lengthUnit.
 * @throws CorrectionError when fewer than `count` pre-test readings exist, count < 1, or values are not finite.
 */
export function estimateStaticLevel(options: StaticLevelOptions): StaticLevelEstimate {
  requireDimension(options.timeUnit, "time", "the reading times");
  requireDimension(options.lengthUnit, "length", "the levels");
  requireSameLength(options.times, "times", options.levels, "levels");
  requireFinite(options.times, "times");
  requireFinite(options.levels, "levels");
  const n = options.count;
  if (!Number.isInteger(n) || n < 1) throw new CorrectionError(`count is ${n}; give how many pre-test readings to average, a whole number >= 1`);
  const pre: { t: number; v: number }[] = [];
  for (let i = 0; i < options.times.length; i++) {
    if (options.times[i]! < options.pumpingStart) pre.push({ t: options.times[i]!, v: options.levels[i]! });
  }
  if (pre.length < n) {
    throw new CorrectionError(
      `the static level is to be the mean of the last ${n} readings before pumping started (time < ${formatNumber(options.pumpingStart)} ${options.timeUnit}), ` +
        `but only ${pre.length} exist; lower count, or give the static level directly`,
    );
  }
  pre.sort((a, b) => a.t - b.t);
  const used = pre.slice(pre.length - n);
  const mean = used.reduce((acc, p) => acc + p.v, 0) / n;
  const sd = n > 1 ? Math.sqrt(used.reduce((acc, p) => acc + (p.v - mean) ** 2, 0) / (n - 1)) : null;
  const vs = used.map((p) => p.v);
  return {
    level: mean,
    count: n,
    standardDeviation: sd,
    range: largestOf(vs) - smallestOf(vs),
    timeSpan: [used[0]!.t, used[n - 1]!.t],
    lengthUnit: options.lengthUnit,
  };
}

/** Options of `removeStaticLevel`. */
export interface StaticLevelRemovalOptions {
  /** Depth to water (downwards from a fixed point) or head (elevation), in lengthUnit. */
  readonly levels: ArrayLike<number>;
  readonly levelKind: "depth-to-water" | "head";
  readonly lengthUnit: string;
  /** The static level, in lengthUnit, or an estimate from `estimateStaticLevel`. */
  readonly staticLevel: number | StaticLevelEstimate;
}

/**
 * Drawdowns in lengthUnit from levels and a static level: s = d - d0 (depth to water) or s = h0 - h (head).
 * @throws CorrectionError for a non-finite static level or reading, or an estimate in another unit.
 */
export function removeStaticLevel(options: StaticLevelRemovalOptions): CorrectionResult {
  requireDimension(options.lengthUnit, "length", "the levels");
  requireFinite(options.levels, "levels");
  const estimate = typeof options.staticLevel === "number" ? null : options.staticLevel;
  const level = estimate === null ? (options.staticLevel as number) : estimate.level;
  if (!Number.isFinite(level)) throw new CorrectionError(`staticLevel is ${level}; give the level before pumping, in ${options.lengthUnit}`);
  if (estimate !== null && estimate.lengthUnit !== options.lengthUnit) {
    throw new CorrectionError(
      `the static level estimate is in ${estimate.lengthUnit} but the levels are in ${options.lengthUnit}; estimate it from readings in ${options.lengthUnit}`,
    );
  }
  const values =
    options.levelKind === "depth-to-water" ? drawdownFromDepthToWater(options.levels, level) : drawdownFromHead(options.levels, level);
  const formula = options.levelKind === "depth-to-water" ? "s = d - d0" : "s = h0 - h";
  const parameters: Record<string, number | string | { value: number; unit: string }> = {
    staticLevel: { value: level, unit: options.lengthUnit },
    levelKind: options.levelKind,
  };
  let origin = "given";
  if (estimate !== null) {
    parameters["readingsAveraged"] = estimate.count;
    parameters["range"] = { value: estimate.range, unit: options.lengthUnit };
    if (estimate.standardDeviation !== null) {
      parameters["standardDeviation"] = { value: estimate.standardDeviation, unit: options.lengthUnit };
    }
    origin =
      `the mean of the last ${estimate.count} pre-test readings (range ${formatNumber(estimate.range)} ${options.lengthUnit}` +
      (estimate.standardDeviation === null ? ")" : `, standard deviation ${formatNumber(estimate.standardDeviation)} ${options.lengthUnit})`);
  }
  return {
    values,
    record: {
      method: "static level removal",
      source: "Drawdown as the fall below the static level (common practice, no source).",
      parameters,
      summary: `${formula} with static level ${formatNumber(level)} ${options.lengthUnit} (${origin}) applied to ${values.length} ${options.levelKind} readings.`,
      warnings: [],
    },
  };
}
