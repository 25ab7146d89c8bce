/**
 * Drawdown models: the contract (model.ts), the published solutions, their helpers and the registry.
 */
export type { DrawdownModel, ModelDescriptor, ObservationGeometry, ParameterDescriptor } from "./model.js";
export { ModelInputError, UnknownModelError } from "./errors.js";
export { storativityParameter, transmissivityParameter } from "./parameters.js";
export { theisDrawdown, theisModel, theisTypeCurve, type TheisTypeCurve } from "./theis.js";
export {
  COOPER_JACOB_DEFAULT_U_MAX,
  cooperJacobLine,
  cooperJacobModel,
  cooperJacobValidity,
  type CooperJacobExcludedPoint,
  type CooperJacobExclusionReason,
  type CooperJacobLineOptions,
  type CooperJacobLineResult,
} from "./cooper-jacob.js";
export {
  hantushJacobDrawdown,
  hantushJacobModel,
  hantushJacobSteadyDrawdown,
  hantushTypeCurves,
  leakageFactorFromLeakance,
  leakageFactorParameter,
  leakanceFromLeakageFactor,
  type HantushTypeCurve,
  type HantushTypeCurveFamily,
} from "./hantush-jacob.js";
export {
  radiusOfInfluenceParameter,
  thiemDrawdown,
  thiemModel,
  thiemRadiusOfInfluence,
  thiemTwoWells,
} from "./thiem.js";
export { theisMatchPoint, type TheisMatchPointInput, type TheisMatchPointResult } from "./match-point.js";
export { getModel, isModelId, modelIds, models, type ModelId } from "./registry.js";
export { startingValues, type StartingValues } from "./starting-values.js";
export {
  PAPADOPULOS_COOPER_STEHFEST_TERMS,
  papadopulosCooperDrawdown,
  papadopulosCooperF,
  papadopulosCooperModel,
  type PapadopulosCooperModel,
  type WellboreGeometry,
} from "./papadopulos-cooper.js";
export { wellboreStorageTime, type WellboreStorageTime } from "./wellbore-storage-time.js";
export {
  PARTIAL_PENETRATION_TOLERANCE,
  anisotropyParameter,
  partialPenetrationCorrection,
  partialPenetrationModel,
  partialPenetrationNegligibleDistance,
  type PartialPenetrationGeometry,
  type PartialPenetrationModel,
  type PenetrationObservation,
} from "./partial-penetration.js";
export {
  anisotropyRatioParameter,
  elasticStorativityParameter,
  neumanDimensionless,
  neumanModel,
  neumanTypeCurves,
  specificYieldParameter,
  NEUMAN_DEHOOG_BELOW,
  NEUMAN_THEIS_BELOW,
  NEUMAN_SERIES_TOLERANCE,
  NEUMAN_STEHFEST_TERMS,
  type NeumanModel,
  type NeumanTypeCurve,
  type NeumanTypeCurveFamily,
} from "./neuman.js";
export {
  aquitardStorativityParameter,
  hantushAquitardStorageModel,
  hantushStorageDimensionless,
  hantushStorageTypeCurves,
  LEAKY_STORAGE_DEHOOG_BELOW,
  LEAKY_STORAGE_STEHFEST_TERMS,
  type HantushStorageTypeCurve,
  type HantushStorageTypeCurveFamily,
} from "./hantush-aquitard-storage.js";
