/**
 * Slug tests: Hvorslev (1951), Bouwer & Rice (1976) with Van Rooy's (1988) coefficients, and the
 * Cooper, Bredehoeft & Papadopulos (1967) curve with a fit of T and S. Base units: m, d.
 */
export { SlugTestInputError } from "./errors.js";
export {
  lengthInMetres,
  normalizeSlugRecord,
  type NormalizedSlugRecord,
  type SlugFitRange,
  type SlugTestRecord,
} from "./slug-data.js";
export { fitRecoveryLine, type RecoveryLine } from "./log-linear-recovery.js";
export {
  HVORSLEV_MIN_LENGTH_TO_RADIUS,
  hvorslevShapeFactor,
  hvorslevSlugTest,
  type HvorslevGeometry,
  type SlugConductivityResult,
  type SlugLineOptions,
} from "./hvorslev.js";
export {
  BOUWER_RICE_RATIO_RANGE,
  bouwerRiceCoefficients,
  bouwerRiceLnReRw,
  bouwerRiceSlugTest,
  type BouwerRiceGeometry,
} from "./bouwer-rice.js";
export { cbpDenominator, cbpNormalizedHead } from "./cooper-bredehoeft-papadopulos.js";
export {
  cooperBredehoeftPapadopulosFit,
  type CbpEstimate,
  type CbpFitOptions,
  type CbpFitResult,
  type CbpGeometry,
} from "./cbp-fit.js";
export { fitKgsSlugTest, kgsSlugModel, type KgsGeometry, type KgsModel } from "./kgs.js";
export {
  GRAVITY_M_PER_D2,
  fitUnderdampedSlugTest,
  underdampedNormalizedHead,
  underdampedSlugModel,
  type UnderdampedGeometry,
} from "./underdamped.js";
export { slugRecordChecks, type SlugCheck } from "./record-checks.js";
