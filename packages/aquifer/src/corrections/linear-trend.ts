/**
 * Background trend removal: a straight line fitted by least squares to the readings taken before pumping
 * started is extrapolated over the test and its change since the start of pumping is subtracted:
 *
 *   v_c(t) = v(t) - b (t - t0),   b the fitted slope, t0 the start of pumping,
 *
 * so the level at the start of pumping is kept and only the background change is removed. The same
 * subtraction holds for depth to water, head or drawdown, since the trend is fitted to the same quantity.
 * Source: least squares line (any statistics text); removing an extrapolated pre-test trend is common
 * practice, no source. Assumes the background trend stays linear over the test: check the post-test record.
 */
import { requireDimension } from "../units/index.js";
import { fitLine } from "./least-squares-line.js";
import { CorrectionError, formatNumber, requireFinite, requireSameLength } from "./record.js";
import type { CorrectionResult } from "./record.js";
import { smallestOf } from "../numerics/extremes.js";

/** Least number of pre-test readings for a trend with a standard error (n - 2 >= 1). */
export const MIN_PRE_TEST_POINTS = 3;

/** Options of `removeLinearTrend`. */
export interface LinearTrendOptions {
  /** Times of all readings (pre-test and test), in timeUnit, on one clock with pumpingStart. */
  readonly times: ArrayLike<number>;
  /** Readings (depth to water, head or drawdown), in valueUnit. */
  readonly values: ArrayLike<number>;
  /** Time when pumping started, in timeUnit; readings with time < pumpingStart are the pre-test record. */
  readonly pumpingStart: number;
  readonly timeUnit: string;
  readonly valueUnit: string;
}

/** The fitted background trend. */
export interface LinearTrend {
  /** Slope, in slopeUnit (valueUnit per timeUnit). */
  readonly slope: number;
  readonly slopeStandardError: number;
  /** 95 % interval of the slope (Student t, n - 2 degrees of freedom). */
  readonly slopeInterval95: readonly [number, number];
  readonly slopeUnit: string;
  /** Trend line value at the start of pumping, in valueUnit. */
  readonly valueAtPumpingStart: number;
  /** Pre-test readings used. */
  readonly n: number;
  readonly rSquared: number;
  /** Residual standard deviation about the line, in valueUnit. */
  readonly residualStandardDeviation: number;
}

/** Corrected values, the fitted trend and the record. */
export interface LinearTrendResult extends CorrectionResult {
  readonly trend: LinearTrend;
}

/**
 * Fits a least squares line to the readings before pumpingStart and subtracts its change since
 * pumpingStart from every reading: v_c = v - b (t - t0). Values in valueUnit, slope in valueUnit/timeUnit.
 * @throws CorrectionError with fewer than 3 pre-test readings, unequal lengths or non-finite values.
 */
export function removeLinearTrend(options: LinearTrendOptions): LinearTrendResult {
  requireDimension(options.timeUnit, "time", "the reading times");
  requireDimension(options.valueUnit, "length", "the readings");
  requireSameLength(options.times, "times", options.values, "values");
  requireFinite(options.times, "times");
  requireFinite(options.values, "values");
  const t0 = options.pumpingStart;
  if (!Number.isFinite(t0)) throw new CorrectionError(`pumpingStart is ${t0}; give the time pumping started, in ${options.timeUnit}`);
  const preT: number[] = [];
  const preV: number[] = [];
  for (let i = 0; i < options.times.length; i++) {
    if (options.times[i]! < t0) {
      preT.push(options.times[i]! - t0);
      preV.push(options.values[i]!);
    }
  }
  if (preT.length < MIN_PRE_TEST_POINTS) {
    throw new CorrectionError(
      `a background trend needs at least ${MIN_PRE_TEST_POINTS} readings before pumping started (time < ${formatNumber(t0)} ${options.timeUnit}), ` +
        `found ${preT.length}; give a longer pre-test record, or leave the trend uncorrected and say so`,
    );
  }
  const line = fitLine(preT, preV, "background trend");
  const slopeUnit = `${options.valueUnit}/${options.timeUnit}`;
  const values = new Float64Array(options.values.length);
  let testEnd = t0;
  for (let i = 0; i < values.length; i++) {
    values[i] = options.values[i]! - line.slope * (options.times[i]! - t0);
    testEnd = Math.max(testEnd, options.times[i]!);
  }
  const trend: LinearTrend = {
    slope: line.slope,
    slopeStandardError: line.slopeStandardError,
    slopeInterval95: [line.slope - line.slopeHalfWidth95, line.slope + line.slopeHalfWidth95],
    slopeUnit,
    valueAtPumpingStart: line.intercept,
    n: line.n,
    rSquared: line.rSquared,
    residualStandardDeviation: line.residualStandardDeviation,
  };
  const preSpan = -smallestOf(preT);
  const testSpan = testEnd - t0;
  const warnings: string[] = [];
  if (testSpan > 2 * preSpan) {
    warnings.push(
      `the trend is fitted over ${formatNumber(preSpan)} ${options.timeUnit} before pumping and extrapolated over ${formatNumber(testSpan)} ${options.timeUnit} ` +
        `of test; an extrapolation more than twice the fitted span is uncertain (common practice, no source): check it against the post-test record`,
    );
  }
  if (Math.abs(line.slope) < 2 * line.slopeStandardError) {
    warnings.push(
      `the slope ${formatNumber(line.slope)} ${slopeUnit} is smaller than twice its standard error ${formatNumber(line.slopeStandardError)}; ` +
        `the trend is not distinguishable from zero and removing it may add noise`,
    );
  }
  return {
    values,
    trend,
    record: {
      method: "linear background trend removal",
      source: "Least squares straight line on the pre-test readings, extrapolated over the test (common practice, no source).",
      parameters: {
        slope: { value: line.slope, unit: slopeUnit },
        slopeStandardError: { value: line.slopeStandardError, unit: slopeUnit },
        pumpingStart: { value: t0, unit: options.timeUnit },
        preTestReadings: line.n,
        rSquared: line.rSquared,
        residualStandardDeviation: { value: line.residualStandardDeviation, unit: options.valueUnit },
      },
      summary:
        `A line fitted to ${line.n} readings before pumping started has slope ${formatNumber(line.slope)} ± ${formatNumber(line.slopeStandardError)} ` +
        `(standard error) ${slopeUnit}; its change since the start of pumping, b (t - t0), was subtracted from ${values.length} readings.`,
      warnings,
    },
  };
}
