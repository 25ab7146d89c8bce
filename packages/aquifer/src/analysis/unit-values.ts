/**
 * Values given with units at the edge of the library, converted to a model parameter's base unit with the units
 * module (never by hand), and report units checked against a parameter's dimension.
 */
import type { ValueWithUnit } from "../data/index.js";
import type { DrawdownModel, ParameterDescriptor } from "../models/index.js";
import { convert, UnitError } from "../units/index.js";
import { AnalysisInputError } from "./errors.js";

/** A number in base units, or a number with its unit. */
export type NumberOrQuantity = number | ValueWithUnit;

/** The model's descriptor of parameter `name`; AnalysisInputError listing the parameters when there is none. */
export function parameterDescriptor(where: string, model: DrawdownModel, name: string, field: string): ParameterDescriptor {
  const d = model.parameters.find((p) => p.name === name);
  if (d) return d;
  const list = model.parameters.map((p) => `${p.name} (${p.label}, ${p.unit})`).join(", ");
  throw new AnalysisInputError(`${where}: ${field} names "${name}", which model "${model.id}" does not have; its parameters are ${list}.`);
}

/**
 * `value` converted with the units module from `from` to `to`; a unit of the wrong dimension or an unknown unit is
 * the units module's UnitError, its message prefixed by where it was found.
 */
export function convertAt(where: string, field: string, value: number, from: string, to: string): number {
  try {
    return convert(value, from, to);
  } catch (error) {
    if (error instanceof UnitError) throw new UnitError(`${where}: ${field}: ${error.message}`, error.suggestions);
    throw error;
  }
}

/** A number (taken as base units) or { value, unit } converted to the base unit of parameter d. */
export function toParameterBase(where: string, field: string, d: ParameterDescriptor, given: NumberOrQuantity): number {
  if (typeof given === "number") return given;
  if (!given || typeof given.value !== "number" || typeof given.unit !== "string") {
    throw new AnalysisInputError(`${where}: ${field} must be a number in ${d.unit} or { value, unit }.`);
  }
  return convertAt(where, field, given.value, given.unit, d.unit);
}

/** A record of numbers or quantities by parameter name, converted to base units. */
export function recordToBase(
  where: string,
  field: string,
  model: DrawdownModel,
  record: Readonly<Record<string, NumberOrQuantity>> | undefined,
): Record<string, number> | undefined {
  if (record === undefined) return undefined;
  const out: Record<string, number> = {};
  for (const [name, given] of Object.entries(record)) {
    const d = parameterDescriptor(where, model, name, field);
    out[name] = toParameterBase(where, `${field}.${name}`, d, given);
  }
  return out;
}
