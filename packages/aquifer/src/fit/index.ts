/** Fitting engine: nonlinear least squares with uncertainty for drawdown models. */
export { FitInputError } from "./errors.js";
export {
  fitModel,
  type CooperJacobFitOptions,
  type FitOptions,
  type FitUncertainty,
  type IntervalMethod,
  type ProfileChoice,
  type ResidualCorrelation,
  type FitParameter,
  type FitResult,
  type JacobianMethod,
  type WellResiduals,
} from "./fit-model.js";
export {
  levenbergMarquardt,
  type ConvergenceReason,
  type FiniteDifferenceScheme,
  type LeastSquaresProblem,
  type LevenbergMarquardtOptions,
  type LevenbergMarquardtResult,
} from "./levenberg-marquardt.js";
export { applyQTranspose, householderQr, jacobiSvd, numericalRank, type SmallSvd } from "./linalg.js";
export type { ObservationWell } from "./observations.js";
export { plausibilityNotes } from "./plausibility.js";
export { fitSpaceCovariance, informationCriteria, RANK_TOLERANCE, type FitSpaceCovariance } from "./statistics.js";
export type { StartMethod } from "./start-values.js";
export { lnBeta, lnGamma, regularizedIncompleteBeta, studentTCdf, studentTQuantile } from "./student-t.js";
export { chiSquareSurvival, normalCdf, regularizedGammaP, regularizedGammaQ } from "./distributions.js";
export type { DurbinWatsonTest, ResidualDiagnostics, RunsTest } from "./residual-diagnostics.js";
export type { ExcludedReading } from "./validity-checks.js";
