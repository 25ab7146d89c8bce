/**
 * The map between a model's parameters (descriptor order, base units) and the fitting space: one coordinate
 * per free parameter, ln(value) for positive parameters and the value itself otherwise. Bounds given in
 * base units are mapped the same way (a lower bound of 0 for a positive parameter becomes -Infinity).
 */

import type { ParameterDescriptor } from "../models/index.js";
import { FitInputError } from "./errors.js";

export interface ParameterSpace {
  readonly descriptors: readonly ParameterDescriptor[];
  /** Descriptor index of each free parameter, in descriptor order. */
  readonly freeIndex: readonly number[];
  /** True where the parameter at that descriptor index is held fixed. */
  readonly isFixed: readonly boolean[];
  /** Fixed values (base units) by descriptor index; NaN for free parameters. */
  readonly fixedValues: Float64Array;
  /** Per free parameter: fitted as ln(value). */
  readonly logScale: readonly boolean[];
  /** Bounds in base units by descriptor index. */
  readonly nativeBounds: readonly (readonly [number, number])[];
  /** Bounds of the free coordinates in the fitting space. */
  readonly lower: Float64Array;
  readonly upper: Float64Array;
}

function checkNames(record: Readonly<Record<string, unknown>> | undefined, what: string, names: readonly string[]): void {
  if (!record) return;
  for (const key of Object.keys(record).sort()) {
    if (!names.includes(key)) {
      throw new FitInputError(
        `fitModel: ${what} names a parameter "${key}" that the model does not have; its parameters are ${names.join(", ")}.`,
      );
    }
  }
}

/** Builds the parameter space from descriptors, fixed values and bound overrides (all in base units). */
export function buildParameterSpace(
  descriptors: readonly ParameterDescriptor[],
  fixed: Readonly<Record<string, number>> | undefined,
  bounds: Readonly<Record<string, readonly [number, number]>> | undefined,
  start: Readonly<Record<string, number>> | undefined,
): ParameterSpace {
  const names = descriptors.map((d) => d.name);
  checkNames(fixed, "fixed", names);
  checkNames(bounds, "bounds", names);
  checkNames(start, "start", names);
  const freeIndex: number[] = [];
  const isFixed: boolean[] = [];
  const fixedValues = new Float64Array(descriptors.length).fill(NaN);
  const nativeBounds: (readonly [number, number])[] = [];
  for (let k = 0; k < descriptors.length; k++) {
    const d = descriptors[k]!;
    const override = bounds?.[d.name];
    const b: readonly [number, number] = override ?? d.bounds;
    if (!(b.length === 2) || Number.isNaN(b[0]) || Number.isNaN(b[1]) || !(b[0] < b[1])) {
      throw new FitInputError(
        `fitModel: bounds for ${d.name} are [${b[0]}, ${b[1]}] ${d.unit}; give [lower, upper] with lower < upper.`,
      );
    }
    if (d.positive && b[0] < 0) {
      throw new FitInputError(
        `fitModel: the lower bound of ${d.name} (${d.label}) is ${b[0]} ${d.unit}, but ${d.name} must be > 0; use a lower bound >= 0.`,
      );
    }
    nativeBounds.push(b);
    const fv = fixed?.[d.name];
    if (fv !== undefined) {
      if (!Number.isFinite(fv) || (d.positive && !(fv > 0))) {
        throw new FitInputError(
          `fitModel: fixed value of ${d.name} (${d.label}) is ${fv} ${d.unit}; it must be a finite number${d.positive ? " > 0" : ""}.`,
        );
      }
      fixedValues[k] = fv;
      isFixed.push(true);
    } else {
      isFixed.push(false);
      freeIndex.push(k);
    }
  }
  const logScale = freeIndex.map((k) => descriptors[k]!.positive);
  const lower = new Float64Array(freeIndex.length);
  const upper = new Float64Array(freeIndex.length);
  freeIndex.forEach((k, j) => {
    const [lo, hi] = nativeBounds[k]!;
    lower[j] = logScale[j] ? (lo > 0 ? Math.log(lo) : -Infinity) : lo;
    upper[j] = logScale[j] ? Math.log(hi) : hi;
  });
  return { descriptors, freeIndex, isFixed, fixedValues, logScale, nativeBounds, lower, upper };
}

/** Writes the full native parameter vector for fitting-space coordinates theta into out. */
export function toNative(space: ParameterSpace, theta: ArrayLike<number>, out: Float64Array): Float64Array {
  out.set(space.fixedValues);
  for (let j = 0; j < space.freeIndex.length; j++) {
    out[space.freeIndex[j]!] = space.logScale[j] ? Math.exp(theta[j]!) : theta[j]!;
  }
  return out;
}

/** Fitting-space coordinates of a full native parameter vector. */
export function toFitSpace(space: ParameterSpace, native: ArrayLike<number>): Float64Array {
  const theta = new Float64Array(space.freeIndex.length);
  for (let j = 0; j < space.freeIndex.length; j++) {
    const v = native[space.freeIndex[j]!]!;
    theta[j] = space.logScale[j] ? Math.log(v) : v;
  }
  return theta;
}
