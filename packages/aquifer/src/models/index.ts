/**
 * Drawdown models: the contract (model.ts), the published solutions, their helpers and the registry.
 */
export type { DrawdownModel, ModelDescriptor, ObservationGeometry, ParameterDescriptor } from "./model.js";
export { ModelInputError, UnknownModelError } from "./errors.js";
export { storativityParameter, transmissivityParameter } from "./parameters.js";
export { theisDrawdown, theisModel, theisTypeCurve, type TheisTypeCurve } from "./theis.js";
export { barrierDistanceFromImage, imageDistanceParameter, theisBarrierImageModel } from "./theis-barrier-image.js";
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
export {
  describeModel,
  getModel,
  isModelId,
  modelIds,
  models,
  modelSpecOf,
  type FixedModelId,
  type GeometryModelId,
  type ModelDescription,
  type ModelId,
  type CheckedOption,
  type ModelOptionDescriptor,
  type ModelOptionKind,
  type ModelSpec,
  type ScheduleStep,
  type OptionValue,
  type SpecifiedModel,
} from "./registry.js";
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
export {
  DIRECT_CAP,
  SERIES_TOLERANCE,
  VerticalModeSeries,
  modeDrawdownTransform,
  type ModeAquifer,
  type ModeWell,
  type VerticalGeometry,
} from "./vertical-modes.js";
export {
  drainageConstantParameter,
  screenAnisotropyParameter,
  skinParameter,
  type FiniteWell,
  type ScreenedWellGeometry,
} from "./screened-well.js";
export { doughertyBabuModel, type DoughertyBabuGeometry, type DoughertyBabuModel } from "./dougherty-babu.js";
export {
  moenchWaterTableModel,
  neumanPartialPenetrationModel,
  type MoenchGeometry,
  type NeumanPartialGeometry,
  type WaterTableModel,
} from "./moench-water-table.js";
export {
  dupuitThiemModel,
  dupuitThiemTwoWells,
  hydraulicConductivityParameter,
  type DupuitThiemModel,
} from "./dupuit-thiem.js";
export {
  hantushJacobMatchPoint,
  neumanMatchPoint,
  type HantushJacobMatchInput,
  type HantushJacobMatchResult,
  type NeumanMatchInput,
  type NeumanMatchResult,
} from "./type-curve-match-points.js";
export { blockStorageTerm, type MatrixBlocks } from "./vertical-modes.js";
export {
  blockRateParameter,
  blockStorativityParameter,
  fractureSkinParameter,
  moenchDoublePorosityModel,
  type DoublePorosityGeometry,
} from "./moench-double-porosity.js";
export { papadopulosAnisotropyModel, transmissivityEllipse, transmissivityTensor } from "./papadopulos-anisotropy.js";
export { gringartenFractureModel, type FractureGeometry } from "./gringarten-fracture.js";
export { boultonModel, BOULTON_STEHFEST_TERMS } from "./boulton.js";
export {
  JACOB_LOHMAN_STEHFEST_TERMS,
  jacobLohmanG,
  jacobLohmanModel,
  type ConstantDrawdownWell,
  type JacobLohmanModel,
} from "./jacob-lohman.js";
export { hantushLeakyPartialPenetrationModel, type LeakyPartialPenetrationModel } from "./hantush-leaky-penetration.js";
