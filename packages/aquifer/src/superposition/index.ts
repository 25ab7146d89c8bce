/**
 * Superposition: variable rates (time), several wells and image wells for straight boundaries (space),
 * recovery analysis and distance-drawdown analysis.
 */
export { SuperpositionInputError } from "./errors.js";
export { distanceBetween, type NamedPoint, type Point } from "./plane.js";
export { rateChanges, withRateSchedule, type PumpingStep, type RateChanges } from "./rate-schedule.js";
export {
  boundaryFromWell,
  imageLayout,
  imageSign,
  reflect,
  sideOf,
  wedgeOrder,
  type BoundaryFamily,
  type BoundaryKind,
  type ImageLayout,
  type ImageWell,
  type StraightBoundary,
} from "./boundaries.js";
export { STRIP_MAX_ROWS, STRIP_TOLERANCE, type PumpingWell, type SchemeEvaluation } from "./scheme.js";
export {
  locateObservation,
  multiWell,
  schemeDrawdown,
  withBoundaries,
  type BoundedWellSetup,
  type MultiWellOptions,
  type PlaneGeometry,
  type PumpingWellAtDistance,
  type SchemeDrawdownOptions,
} from "./bounded-models.js";
export {
  agarwalEquivalentTime,
  recoveryAsDrawdown,
  theisRecoveryLine,
  type EquivalentDrawdown,
  type TheisRecoveryInput,
  type TheisRecoveryResult,
} from "./recovery.js";
export {
  cooperJacobDistance,
  thiemDistance,
  type CooperJacobDistanceResult,
  type ThiemDistanceResult,
} from "./distance-drawdown.js";
