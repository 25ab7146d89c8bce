/**
 * Corrections of water-level records before analysis: barometric efficiency, background trend, Jacob's
 * unconfined correction and static-level removal. Each returns corrected values and a plain-data record of
 * what was done; the series forms return a new series with the record appended to metadata.corrections.
 */
export { CorrectionError } from "./record.js";
export type { CorrectionParameter, CorrectionRecord, CorrectionResult } from "./record.js";
export type { WaterLevelKind } from "./level-kind.js";
export { correctBarometric, estimateBarometricEfficiency, pressureAsWaterColumn } from "./barometric.js";
export type {
  BarometricCorrectionOptions,
  BarometricData,
  BarometricEfficiencyEstimate,
  BarometricEfficiencyOptions,
  BarometricRegressionMethod,
} from "./barometric.js";
export { TIDAL_CONSTITUENTS, barometricResponse, earthTideCheck } from "./barometric-response.js";
export type {
  BarometricResponseLag,
  BarometricResponseOptions,
  BarometricResponseResult,
  EarthTideCheckOptions,
  EarthTideCheckResult,
  TidalAmplitude,
  TidalConstituent,
} from "./barometric-response.js";
export { MIN_PRE_TEST_POINTS, removeLinearTrend } from "./linear-trend.js";
export type { LinearTrend, LinearTrendOptions, LinearTrendResult } from "./linear-trend.js";
export { JACOB_WARNING_FRACTION, correctJacobUnconfined } from "./jacob-unconfined.js";
export type { JacobUnconfinedOptions } from "./jacob-unconfined.js";
export { estimateStaticLevel, removeStaticLevel } from "./static-level.js";
export type { StaticLevelEstimate, StaticLevelOptions, StaticLevelRemovalOptions } from "./static-level.js";
export {
  CORRECTIONS_METADATA_KEY,
  correctBarometricSeries,
  correctJacobUnconfinedSeries,
  removeLinearTrendSeries,
  seriesCorrections,
} from "./series-corrections.js";
export type {
  CorrectedSeries,
  SeriesBarometricOptions,
  SeriesJacobOptions,
  SeriesTrendOptions,
  TrendCorrectedSeries,
} from "./series-corrections.js";
