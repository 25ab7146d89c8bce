/**
 * An observation series expressed in the library's base units (t in d, s and r in m, Q in m3/d), the form
 * the models and fitting read.
 */

import { convert, convertArray } from "../units/index.js";
import { isRateSchedule } from "./series.js";
import type { ObservationSeries } from "./series.js";

/** A series in base units: plain arrays and numbers, ready for the models. */
export interface SeriesInBaseUnits {
  readonly name: string;
  /** Elapsed times, d. */
  readonly t: Float64Array;
  /** Drawdowns, m. */
  readonly s: Float64Array;
  /** Distance from the pumping well, m. */
  readonly r: number;
  /** Constant pumping rate, m3/d; null when the rate follows a schedule of more than one step. */
  readonly Q: number | null;
  /** Pumping schedule: step start times in d and rates in m3/d (one step at 0 for a constant rate). */
  readonly steps: { readonly start: Float64Array; readonly rate: Float64Array };
}

/**
 * Converts a series to base units with the units module (exact factors of its catalogue: 1 min = 1/1440 d,
 * 1 ft = 0.3048 m, ...). A schedule with a single step counts as a constant rate.
 */
export function toBaseUnits(series: ObservationSeries): SeriesInBaseUnits {
  const rate = series.pumpingRate;
  const stepStarts = isRateSchedule(rate) ? rate.steps.map((s) => s.start) : [0];
  const stepRates = isRateSchedule(rate) ? rate.steps.map((s) => s.rate) : [rate.value];
  const start = convertArray(stepStarts, series.timeUnit, "d");
  const rates = convertArray(stepRates, rate.unit, "m3/d");
  return {
    name: series.name,
    t: convertArray(series.times, series.timeUnit, "d"),
    s: convertArray(series.drawdowns, series.lengthUnit, "m"),
    r: convert(series.radius.value, series.radius.unit, "m"),
    Q: rates.length === 1 ? rates[0]! : null,
    steps: { start, rate: rates },
  };
}
