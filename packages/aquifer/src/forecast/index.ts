/**
 * Forecasts: drawdown for a pumping scheme with uncertainty from a fit (linear or seeded Monte Carlo), distance
 * to a drawdown threshold, interference at neighbouring wells, and the seeded random generator behind them.
 */
export { ForecastInputError } from "./errors.js";
export { seededRandom, type RandomStream } from "./random.js";
export { choleskyLower } from "./cholesky.js";
export { sortedQuantile } from "./quantile.js";
export { resolveParameters, type GivenParameters, type ParameterInput, type ResolvedParameters } from "./parameters.js";
export {
  MAX_MONTE_CARLO_VALUES,
  forecastDrawdown,
  type ForecastOptions,
  type ForecastPoint,
  type ForecastResult,
  type ForecastUncertainty,
  type PointForecast,
} from "./forecast-drawdown.js";
export { distanceToThreshold, type DistanceToThresholdOptions, type DistanceToThresholdResult } from "./distance-threshold.js";
export { interferenceAtNeighbours, type InterferenceOptions, type NeighbourInterference } from "./interference.js";
