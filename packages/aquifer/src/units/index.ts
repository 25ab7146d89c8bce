/**
 * Units and quantities: parse unit text as the trade writes it, convert between units, and carry values with
 * their units. Base units of the library: length m, time d (day), discharge m3/d, transmissivity m2/d,
 * hydraulic conductivity m/d, leakance 1/d, pressure Pa.
 */
export type { Dimension, DimensionVector } from "./dimension.js";
export {
  DIMENSIONS,
  dimensionLabel,
  dimensionName,
  dimensionPhrase,
  divideDimensions,
  multiplyDimensions,
  powerDimension,
  sameDimension,
} from "./dimension.js";
export { UnitError } from "./errors.js";
export type { Unit } from "./parse.js";
export { knownUnitSymbols, parseUnit } from "./parse.js";
export type { CatalogueEntry } from "./catalogue.js";
export { CATALOGUE } from "./catalogue.js";
export {
  baseUnitOf,
  convert,
  convertArray,
  describeUnit,
  fromBase,
  isDimension,
  requireDimension,
  toBase,
} from "./convert.js";
export { Quantity, quantity } from "./quantity.js";
