/**
 * An immutable number with a unit. Arithmetic keeps units honest: add and sub need the same dimension and
 * answer in the left operand's unit; mul and div combine dimensions and factors exactly as the units do.
 */
import { multiplyDimensions, divideDimensions, sameDimension } from "./dimension.js";
import { UnitError } from "./errors.js";
import { resolveUnit } from "./parse.js";
import type { Unit } from "./parse.js";
import { convert, describeUnit } from "./convert.js";

/** A symbol that is one term (symbol and exponent), so that it needs no parentheses after "/". */
function isSingleTerm(symbol: string): boolean {
  return /^[A-Za-z0-9^\-⁰¹²³⁴⁵⁶⁷⁸⁹⁻]+$/.test(symbol);
}

/** a·b: "/" binds to the next term only and products read left to right, so no parentheses are needed. */
function productUnit(a: Unit, b: Unit): Unit {
  const symbol = a.symbol === "1" ? b.symbol : b.symbol === "1" ? a.symbol : `${a.symbol}·${b.symbol}`;
  return Object.freeze({
    symbol,
    dimension: multiplyDimensions(a.dimension, b.dimension),
    factor: a.factor * b.factor,
  });
}

/** a/b, with b in parentheses unless it is a single term. */
function quotientUnit(a: Unit, b: Unit): Unit {
  const denominator = isSingleTerm(b.symbol) ? b.symbol : `(${b.symbol})`;
  return Object.freeze({
    symbol: b.symbol === "1" ? a.symbol : `${a.symbol}/${denominator}`,
    dimension: divideDimensions(a.dimension, b.dimension),
    factor: a.factor / b.factor,
  });
}

/** A value with its unit; never changes after construction. */
export class Quantity {
  readonly value: number;
  readonly unit: Unit;

  constructor(value: number, unit: string | Unit) {
    this.value = value;
    this.unit = resolveUnit(unit);
    Object.freeze(this);
  }

  /** The same quantity in another unit of the same dimension. @throws UnitError on a dimension mismatch. */
  to(unit: string | Unit): Quantity {
    const target = resolveUnit(unit);
    return new Quantity(convert(this.value, this.unit, target), target);
  }

  /**
   * Sum in this quantity's unit.
   * @throws UnitError when the dimensions differ: quantity(1, "m").add(quantity(1, "min")) throws
   *   "cannot add a length (m) to a time (min)".
   */
  add(other: Quantity): Quantity {
    if (!sameDimension(this.unit.dimension, other.unit.dimension)) {
      throw new UnitError(`cannot add ${describeUnit(this.unit)} to ${describeUnit(other.unit)}`);
    }
    return new Quantity(this.value + convert(other.value, other.unit, this.unit), this.unit);
  }

  /**
   * Difference this − other in this quantity's unit.
   * @throws UnitError when the dimensions differ: quantity(1, "m").sub(quantity(1, "min")) throws
   *   "cannot subtract a time (min) from a length (m)".
   */
  sub(other: Quantity): Quantity {
    if (!sameDimension(this.unit.dimension, other.unit.dimension)) {
      throw new UnitError(`cannot subtract ${describeUnit(other.unit)} from ${describeUnit(this.unit)}`);
    }
    return new Quantity(this.value - convert(other.value, other.unit, this.unit), this.unit);
  }

  /** Product; a plain number scales the value and keeps the unit. */
  mul(other: Quantity | number): Quantity {
    if (typeof other === "number") return new Quantity(this.value * other, this.unit);
    return new Quantity(this.value * other.value, productUnit(this.unit, other.unit));
  }

  /** Quotient; a plain number scales the value and keeps the unit. */
  div(other: Quantity | number): Quantity {
    if (typeof other === "number") return new Quantity(this.value / other, this.unit);
    return new Quantity(this.value / other.value, quotientUnit(this.unit, other.unit));
  }

  /** "12.5 m3/d"; a dimensionless quantity prints its value alone. `digits` gives significant digits. */
  toString(digits?: number): string {
    const text = digits === undefined ? String(this.value) : this.value.toPrecision(digits);
    return this.unit.symbol === "1" ? text : `${text} ${this.unit.symbol}`;
  }
}

/** A Quantity of `value` in the unit written as `unit`, e.g. quantity(12, "L/s"). */
export function quantity(value: number, unit: string | Unit): Quantity {
  return new Quantity(value, unit);
}
