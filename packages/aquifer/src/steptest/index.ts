/**
 * Step-drawdown tests: Jacob (1947), Rorabaugh (1953) and Hantush-Bierschenk (1964) well-loss analyses,
 * per-step efficiency and specific capacity, Walton's (1962) condition hint. Base units: Q m3/d, s m, t d.
 */
export { StepTestInputError } from "./errors.js";
export { fitStraightLine, type StraightLineFit } from "./line-fit.js";
export {
  splitRecordIntoSteps,
  stepEndDrawdowns,
  stepsToBaseUnits,
  type StepDrawdownInput,
  type StepEndDrawdowns,
  type StepInRecord,
  type StepReading,
  type StepsInBaseUnits,
} from "./step-data.js";
export { stepPerformance, wellLossCoefficientUnit, type StepPerformance } from "./step-performance.js";
export type { StepTestParameter, StepTestResult } from "./step-result.js";
export { WALTON_THRESHOLDS, waltonWellCondition, type WellConditionClass, type WellConditionHint } from "./well-condition.js";
export { jacobStepTest } from "./jacob.js";
export { rorabaughStepTest, type RorabaughOptions } from "./rorabaugh.js";
export {
  hantushBierschenkStepTest,
  type DrawdownIncrement,
  type HantushBierschenkOptions,
  type HantushBierschenkResult,
} from "./hantush-bierschenk.js";
export {
  fitStepDrawdown,
  stepDrawdownModel,
  wellLossExponentParameter,
  wellLossParameter,
  type StepDrawdownFit,
  type StepDrawdownFitInput,
  type StepDrawdownModel,
} from "./transient-step-fit.js";
export { transmissivityFromSpecificCapacity, type SpecificCapacityEstimate } from "./specific-capacity.js";
