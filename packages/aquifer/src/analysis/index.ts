/**
 * Units-aware entry points: fitting series in their own units with a report in chosen units, forecasts around a
 * well in chosen units, a ranking of models by information criteria, and boundaries described from a well.
 */
export { AnalysisInputError } from "./errors.js";
export type { NumberOrQuantity } from "./unit-values.js";
export {
  fitSeries,
  parameterTable,
  type BoundsWithUnit,
  type FitSeriesOptions,
  type ParameterTableRow,
  type SeriesFitResult,
} from "./fit-series.js";
export {
  fitAsGivenParameters,
  forecastAt,
  type DistancePoint,
  type ForecastableFit,
  type ForecastAtOptions,
  type ForecastAtResult,
  type PointForecastInUnits,
} from "./forecast-at.js";
export {
  akaikeWeights,
  compareModels,
  type ComparableFit,
  type CompareModelsOptions,
  type ModelComparison,
  type ModelRankingRow,
} from "./compare-models.js";
export { boundariesFromRecords, type BoundaryRecord } from "./boundary-records.js";
export { fitAnisotropy, type AnisotropyFit } from "./anisotropy-fit.js";
