/**
 * Physical dimensions as integer exponent vectors over length (L), time (T) and mass (M).
 *
 * Pressure is M L^-1 T^-2; with the library's base units (m, d and a mass unit chosen so that the base
 * pressure unit is exactly 1 Pa, see `baseUnitOf`) every product or quotient of units has a well-defined
 * dimension and factor.
 */

/** Exponents of length, time and mass; e.g. transmissivity is { L: 2, T: -1, M: 0 }. */
export interface DimensionVector {
  readonly L: number;
  readonly T: number;
  readonly M: number;
}

/** Names of the dimensions the library knows by name. */
export type Dimension =
  | "length"
  | "time"
  | "discharge"
  | "area"
  | "volume"
  | "transmissivity"
  | "velocity"
  | "leakance"
  | "dimensionless"
  | "pressure";

function vector(L: number, T: number, M: number): DimensionVector {
  return Object.freeze({ L, T, M });
}

/**
 * The exponent vector behind each named dimension. "velocity" covers hydraulic conductivity (L/T);
 * "leakance" is 1/T; "discharge" is volume per time.
 */
export const DIMENSIONS: Readonly<Record<Dimension, DimensionVector>> = Object.freeze({
  length: vector(1, 0, 0),
  time: vector(0, 1, 0),
  discharge: vector(3, -1, 0),
  area: vector(2, 0, 0),
  volume: vector(3, 0, 0),
  transmissivity: vector(2, -1, 0),
  velocity: vector(1, -1, 0),
  leakance: vector(0, -1, 0),
  dimensionless: vector(0, 0, 0),
  pressure: vector(-1, -2, 1),
});

/** True when both vectors have the same exponents. */
export function sameDimension(a: DimensionVector, b: DimensionVector): boolean {
  return a.L === b.L && a.T === b.T && a.M === b.M;
}

/** Dimension of a product: exponents add. */
export function multiplyDimensions(a: DimensionVector, b: DimensionVector): DimensionVector {
  return vector(a.L + b.L, a.T + b.T, a.M + b.M);
}

/** Dimension of a quotient a / b: exponents subtract. */
export function divideDimensions(a: DimensionVector, b: DimensionVector): DimensionVector {
  return vector(a.L - b.L, a.T - b.T, a.M - b.M);
}

/** Dimension of a raised to an integer power: exponents scale ("+ 0" turns a -0 into 0 for printing). */
export function powerDimension(a: DimensionVector, exponent: number): DimensionVector {
  return vector(a.L * exponent + 0, a.T * exponent + 0, a.M * exponent + 0);
}

/** The name of a vector when it is one of the named dimensions, else undefined. */
export function dimensionLabel(v: DimensionVector): Dimension | undefined {
  for (const name of Object.keys(DIMENSIONS) as Dimension[]) {
    if (sameDimension(DIMENSIONS[name], v)) return name;
  }
  return undefined;
}

/**
 * A readable name for messages: the dimension's name ("transmissivity") when it has one, else its
 * exponents, e.g. "L^2·T^-2".
 */
export function dimensionName(v: DimensionVector): string {
  const label = dimensionLabel(v);
  if (label !== undefined) return label;
  const parts: string[] = [];
  for (const [symbol, exponent] of [["L", v.L], ["T", v.T], ["M", v.M]] as const) {
    if (exponent === 0) continue;
    parts.push(exponent === 1 ? symbol : `${symbol}^${exponent}`);
  }
  return parts.join("·");
}

/** The dimension name with an article, for sentences: "a length", "an area", "a dimensionless number". */
export function dimensionPhrase(v: DimensionVector): string {
  const label = dimensionLabel(v);
  if (label === "dimensionless") return "a dimensionless number";
  if (label === undefined) return `a quantity of dimension ${dimensionName(v)}`;
  return /^[aeiou]/.test(label) ? `an ${label}` : `a ${label}`;
}
