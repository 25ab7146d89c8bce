/**
 * Converting numbers between units of the same dimension, and to and from the library's base units
 * (length m, time d, discharge m3/d, transmissivity m2/d, hydraulic conductivity m/d, leakance 1/d,
 * pressure Pa). A conversion is exact up to floating-point rounding of the factors: a few units in the last
 * place (relative error below 1e-15 for a single conversion).
 */
import { DIMENSIONS, dimensionLabel, dimensionPhrase, sameDimension } from "./dimension.js";
import type { Dimension, DimensionVector } from "./dimension.js";
import { UnitError } from "./errors.js";
import { errorForDimension } from "./dimension-suggestions.js";
import { resolveUnit } from "./parse.js";
import type { Unit } from "./parse.js";

const BASE_SYMBOLS: Readonly<Record<Dimension, string>> = Object.freeze({
  length: "m",
  time: "d",
  discharge: "m3/d",
  area: "m2",
  volume: "m3",
  transmissivity: "m2/d",
  velocity: "m/d",
  leakance: "1/d",
  dimensionless: "1",
  pressure: "Pa",
});

/** "a length (m)": how a unit is named in messages. */
export function describeUnit(unit: string | Unit): string {
  const resolved = resolveUnit(unit);
  return `${dimensionPhrase(resolved.dimension)} (${resolved.symbol})`;
}

/** Value in base units of `value` given in `unit`; e.g. toBase(1, "ft") = 0.3048 (m), toBase(1, "s") = 1/86400 (d). */
export function toBase(value: number, unit: string | Unit): number {
  return value * resolveUnit(unit).factor;
}

/** Value in `unit` of `value` given in base units; e.g. fromBase(1, "L/s") = 1/86.4 for 1 m3/d. */
export function fromBase(value: number, unit: string | Unit): number {
  return value / resolveUnit(unit).factor;
}

/** `unit` parsed; when it is unknown and `other` parses, the suggestions are of `other`'s dimension first. */
function resolveAgainst(unit: string | Unit, other: string | Unit): Unit {
  try {
    return resolveUnit(unit);
  } catch (e) {
    if (!(e instanceof UnitError) || typeof unit !== "string") throw e;
    let expected: Unit;
    try {
      expected = resolveUnit(other);
    } catch {
      throw e;
    }
    throw errorForDimension(unit, expected.dimension, e);
  }
}

/** Both units parsed, after checking they share a dimension. */
function checkedPair(from: string | Unit, to: string | Unit): [Unit, Unit] {
  const source = resolveAgainst(from, to);
  const target = resolveAgainst(to, source);
  if (!sameDimension(source.dimension, target.dimension)) {
    throw new UnitError(`cannot convert ${describeUnit(source)} to ${describeUnit(target)}`);
  }
  return [source, target];
}

/**
 * `value` in unit `from` expressed in unit `to`, e.g. convert(1, "US gpm", "m3/d") = 5.45099296896.
 * @throws UnitError when the dimensions differ: "cannot convert a length (m) to a time (min)".
 */
export function convert(value: number, from: string | Unit, to: string | Unit): number {
  const [source, target] = checkedPair(from, to);
  if (source.factor === target.factor) return value;
  return (value * source.factor) / target.factor;
}

/**
 * Every value of `values` converted from `from` to `to`, as a new Float64Array (the input is not changed).
 * @throws UnitError when the dimensions differ, as `convert`.
 */
export function convertArray(values: ArrayLike<number>, from: string | Unit, to: string | Unit): Float64Array {
  const [source, target] = checkedPair(from, to);
  const n = values.length;
  const out = new Float64Array(n);
  const a = source.factor;
  const b = target.factor;
  if (a === b && values instanceof Float64Array) out.set(values);
  else if (a === b) for (let i = 0; i < n; i++) out[i] = values[i]!;
  else for (let i = 0; i < n; i++) out[i] = (values[i]! * a) / b;
  return out;
}

/**
 * Symbol of the base unit of a dimension: "m", "d", "m3/d", "m2", "m3", "m2/d", "m/d", "1/d", "1", "Pa".
 * For a dimension without a name the symbol is built from m, d and Pa (the base mass unit is Pa·m·d²),
 * e.g. "m2/d2"; every returned symbol parses back to a unit of factor 1.
 */
export function baseUnitOf(dimension: Dimension | DimensionVector): string {
  const vector = typeof dimension === "string" ? DIMENSIONS[dimension] : dimension;
  if (vector === undefined) {
    throw new UnitError(`unknown dimension '${String(dimension)}'; known: ${Object.keys(DIMENSIONS).join(", ")}`);
  }
  const label = dimensionLabel(vector);
  if (label !== undefined) return BASE_SYMBOLS[label];
  const exponents: [string, number][] = [
    ["Pa", vector.M],
    ["m", vector.L + vector.M],
    ["d", vector.T + 2 * vector.M],
  ];
  const power = (symbol: string, exponent: number) => (exponent === 1 ? symbol : `${symbol}${exponent}`);
  const numerator = exponents.filter(([, e]) => e > 0).map(([s, e]) => power(s, e));
  const denominator = exponents.filter(([, e]) => e < 0).map(([s, e]) => `/${power(s, -e)}`);
  return (numerator.length > 0 ? numerator.join("·") : "1") + denominator.join("");
}

/** True when `unit` has the named dimension, e.g. isDimension("US gpm", "discharge") is true. */
export function isDimension(unit: string | Unit, dimension: Dimension): boolean {
  return sameDimension(resolveUnit(unit).dimension, DIMENSIONS[dimension]);
}

/**
 * Returns the parsed unit when it has the named dimension.
 * @param what what the unit is for, named in the message, e.g. "the drawdown column".
 * @throws UnitError "expected a length for the drawdown column, in a unit such as 'm', got 'L/s' (a discharge)".
 */
export function requireDimension(unit: string | Unit, dimension: Dimension, what?: string): Unit {
  let resolved: Unit;
  try {
    resolved = resolveUnit(unit);
  } catch (e) {
    if (e instanceof UnitError && typeof unit === "string") throw errorForDimension(unit, dimension, e);
    throw e;
  }
  if (!sameDimension(resolved.dimension, DIMENSIONS[dimension])) {
    const purpose = what === undefined ? "" : ` for ${what}`;
    const got = dimensionPhrase(resolved.dimension);
    const wanted = dimensionPhrase(DIMENSIONS[dimension]);
    throw new UnitError(
      `expected ${wanted}${purpose}, in a unit such as '${BASE_SYMBOLS[dimension]}', got '${resolved.symbol}' (${got})`,
    );
  }
  return resolved;
}
