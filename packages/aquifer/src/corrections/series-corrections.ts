/**
 * Corrections applied to an ObservationSeries: each returns a NEW series with corrected drawdowns and the
 * correction's record appended to the list kept (as JSON text) in `metadata.corrections`; the input series
 * is not changed. `seriesCorrections(series)` reads the list back.
 */
import { createObservationSeries } from "../data/series.js";
import type { ObservationSeries } from "../data/series.js";
import { correctBarometric } from "./barometric.js";
import type { BarometricEfficiencyEstimate } from "./barometric.js";
import { correctJacobUnconfined } from "./jacob-unconfined.js";
import { removeLinearTrend } from "./linear-trend.js";
import type { LinearTrend } from "./linear-trend.js";
import { CorrectionError } from "./record.js";
import type { CorrectionRecord } from "./record.js";

/** Metadata key holding the JSON list of correction records. */
export const CORRECTIONS_METADATA_KEY = "corrections";

/** A corrected series and the record of the correction just applied. */
export interface CorrectedSeries {
  readonly series: ObservationSeries;
  readonly record: CorrectionRecord;
}

/**
 * The corrections recorded on a series, oldest first (empty when none).
 * @throws CorrectionError when metadata.corrections is not a JSON list.
 */
export function seriesCorrections(series: ObservationSeries): CorrectionRecord[] {
  const text = series.metadata[CORRECTIONS_METADATA_KEY];
  if (text === undefined) return [];
  let parsed: unknown;
  try {
    parsed = JSON.parse(text);
  } catch {
    parsed = undefined;
  }
  if (!Array.isArray(parsed)) {
    throw new CorrectionError(
      `series '${series.name}': metadata.${CORRECTIONS_METADATA_KEY} is not a JSON list of correction records; remove or repair that entry`,
    );
  }
  return parsed as CorrectionRecord[];
}

/** A copy of `series` with new drawdowns and `record` appended to metadata.corrections. */
function withCorrection(series: ObservationSeries, drawdowns: ArrayLike<number>, record: CorrectionRecord): CorrectedSeries {
  const list = [...seriesCorrections(series), record];
  const corrected = createObservationSeries({
    name: series.name,
    times: series.times,
    drawdowns,
    timeUnit: series.timeUnit,
    lengthUnit: series.lengthUnit,
    radius: series.radius,
    pumpingRate: series.pumpingRate,
    metadata: { ...series.metadata, [CORRECTIONS_METADATA_KEY]: JSON.stringify(list) },
    excluded: series.excluded,
  });
  return { series: corrected, record };
}

/** Options of `correctBarometricSeries`. */
export interface SeriesBarometricOptions {
  /** Barometric pressure at each time of the series, in pressureUnit. */
  readonly pressures: ArrayLike<number>;
  readonly pressureUnit: string;
  /** BE, dimensionless, given or estimated (from readings without pumping) by `estimateBarometricEfficiency`. */
  readonly efficiency: number | BarometricEfficiencyEstimate;
  /** Pressure at which the static level was read, in pressureUnit; default the first pressure of the series. */
  readonly referencePressure?: number;
}

/** The series with barometric effects removed from its drawdowns (see `correctBarometric`; Jacob 1940). */
export function correctBarometricSeries(series: ObservationSeries, options: SeriesBarometricOptions): CorrectedSeries {
  const { values, record } = correctBarometric({
    levels: series.drawdowns,
    levelKind: "drawdown",
    levelUnit: series.lengthUnit,
    pressures: options.pressures,
    pressureUnit: options.pressureUnit,
    efficiency: options.efficiency,
    ...(options.referencePressure === undefined ? {} : { referencePressure: options.referencePressure }),
  });
  return withCorrection(series, values, record);
}

/** Options of `removeLinearTrendSeries`. */
export interface SeriesTrendOptions {
  /**
   * Readings before pumping started: times < 0 in the series' timeUnit (elapsed time since pumping started)
   * and drawdowns (level below the static level) in its lengthUnit. Default: the excluded points of the
   * series with a negative time and a finite value.
   */
  readonly preTest?: { readonly times: ArrayLike<number>; readonly drawdowns: ArrayLike<number> };
}

/** Corrected series, its record and the fitted trend. */
export interface TrendCorrectedSeries extends CorrectedSeries {
  readonly trend: LinearTrend;
}

/** The series with the pre-test linear trend b t subtracted from its drawdowns (see `removeLinearTrend`). */
export function removeLinearTrendSeries(series: ObservationSeries, options: SeriesTrendOptions = {}): TrendCorrectedSeries {
  let preTimes: ArrayLike<number>;
  let preValues: ArrayLike<number>;
  if (options.preTest !== undefined) {
    preTimes = options.preTest.times;
    preValues = options.preTest.drawdowns;
  } else {
    const usable = series.excluded.filter((p) => p.time < 0 && Number.isFinite(p.value));
    preTimes = usable.map((p) => p.time);
    preValues = usable.map((p) => p.value);
  }
  const times = [...Array.from(preTimes), ...series.times];
  const values = [...Array.from(preValues), ...series.drawdowns];
  const result = removeLinearTrend({
    times,
    values,
    pumpingStart: 0,
    timeUnit: series.timeUnit,
    valueUnit: series.lengthUnit,
  });
  const corrected = result.values.subarray(preTimes.length);
  return { ...withCorrection(series, corrected, result.record), trend: result.trend };
}

/** Options of `correctJacobUnconfinedSeries`. */
export interface SeriesJacobOptions {
  /** Initial saturated thickness b, > 0, in any length unit. */
  readonly saturatedThickness: { readonly value: number; readonly unit: string };
}

/** The series with Jacob's (1944) correction s' = s - s²/(2b) applied (see `correctJacobUnconfined`). */
export function correctJacobUnconfinedSeries(series: ObservationSeries, options: SeriesJacobOptions): CorrectedSeries {
  const { values, record } = correctJacobUnconfined({
    drawdowns: series.drawdowns,
    lengthUnit: series.lengthUnit,
    saturatedThickness: options.saturatedThickness,
  });
  return withCorrection(series, values, record);
}
