/**
 * The map between a model's parameters (descriptor order, base units) and the fitting space: one coordinate
 * per free parameter, ln(value) for positive parameters and the value itself otherwise. Bounds given in
 * base units are mapped the same way (a lower bound of 0 for a positive parameter becomes -Infinity).
 *
 * Order constraints a < b between two positive parameters (DrawdownModel.orderedParameters) are enforced by
 * the coordinate of a: when both are free it is ln(a/b), bounded above by ln(1 - 1e-9), so that
 * a = exp(theta_a + theta_b) can never reach b; its lower bound is ln(lower_a / upper_b), and a's own bounds
 * are then checked after the fit rather than enforced. When one of the two is fixed, the constraint becomes a
 * bound of the other.
 */

import type { ParameterDescriptor } from "../models/index.js";
import { FitInputError } from "./errors.js";

/** Largest ratio a/b a constrained pair may reach. */
export const ORDER_MARGIN = 1 - 1e-9;

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
  /**
   * Per free coordinate j: the free coordinate whose parameter bounds this one from above (theta_j =
   * ln(a/b) with b that parameter), or -1.
   */
  readonly ratioOf: readonly number[];
  /** Bounds in base units by descriptor index. */
  readonly nativeBounds: readonly (readonly [number, number])[];
  /** Bounds of the free coordinates in the fitting space. */
  readonly lower: Float64Array;
  readonly upper: Float64Array;
  /** The order constraints in force, as descriptor indices [a, b] (a < b). */
  readonly ordered: readonly (readonly [number, number])[];
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
  orderedParameters: readonly (readonly [string, string])[] = [],
): ParameterSpace {
  const names = descriptors.map((d) => d.name);
  checkNames(fixed, "fixed", names);
  checkNames(bounds, "bounds", names);
  checkNames(start, "start", names);
  const freeIndex: number[] = [];
  const isFixed: boolean[] = [];
  const fixedValues = new Float64Array(descriptors.length).fill(NaN);
  const nativeBounds: [number, number][] = [];
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
    nativeBounds.push([b[0], b[1]]);
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
  const ordered: [number, number][] = [];
  for (const [a, b] of orderedParameters) {
    const ka = names.indexOf(a);
    const kb = names.indexOf(b);
    if (ka < 0 || kb < 0 || !descriptors[ka]!.positive || !descriptors[kb]!.positive) continue;
    if (isFixed[ka] && isFixed[kb]) {
      if (!(fixedValues[ka]! < fixedValues[kb]!)) {
        throw new FitInputError(`fitModel: ${a} = ${fixedValues[ka]} and ${b} = ${fixedValues[kb]} are both fixed, but the model needs ${a} < ${b}.`);
      }
    } else if (isFixed[kb]) {
      nativeBounds[ka]![1] = Math.min(nativeBounds[ka]![1], fixedValues[kb]! * ORDER_MARGIN);
    } else if (isFixed[ka]) {
      nativeBounds[kb]![0] = Math.max(nativeBounds[kb]![0], fixedValues[ka]! / ORDER_MARGIN);
    }
    for (const k of [ka, kb]) {
      if (!(nativeBounds[k]![0] < nativeBounds[k]![1])) {
        throw new FitInputError(`fitModel: with the constraint ${a} < ${b}, no value of ${names[k]} is left inside its bounds; widen the bounds or change the fixed value.`);
      }
    }
    ordered.push([ka, kb]);
  }
  const logScale = freeIndex.map((k) => descriptors[k]!.positive);
  const ratioOf = freeIndex.map(() => -1);
  const lower = new Float64Array(freeIndex.length);
  const upper = new Float64Array(freeIndex.length);
  freeIndex.forEach((k, j) => {
    const [lo, hi] = nativeBounds[k]!;
    lower[j] = logScale[j] ? (lo > 0 ? Math.log(lo) : -Infinity) : lo;
    upper[j] = logScale[j] ? Math.log(hi) : hi;
  });
  for (const [ka, kb] of ordered) {
    const ja = freeIndex.indexOf(ka);
    const jb = freeIndex.indexOf(kb);
    if (ja < 0 || jb < 0) continue;
    ratioOf[ja] = jb;
    const [loA, hiA] = nativeBounds[ka]!;
    const [loB, hiB] = nativeBounds[kb]!;
    lower[ja] = loA > 0 ? Math.log(loA / hiB) : -Infinity;
    upper[ja] = Math.min(Math.log(ORDER_MARGIN), Math.log(hiA / loB));
  }
  return { descriptors, freeIndex, isFixed, fixedValues, logScale, ratioOf, nativeBounds, lower, upper, ordered };
}

/** Writes the full native parameter vector for fitting-space coordinates theta into out. */
export function toNative(space: ParameterSpace, theta: ArrayLike<number>, out: Float64Array): Float64Array {
  out.set(space.fixedValues);
  for (let j = 0; j < space.freeIndex.length; j++) {
    const partner = space.ratioOf[j]!;
    const v = partner >= 0 ? theta[j]! + theta[partner]! : theta[j]!;
    out[space.freeIndex[j]!] = space.logScale[j] ? Math.exp(v) : v;
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
  for (let j = 0; j < space.freeIndex.length; j++) {
    const partner = space.ratioOf[j]!;
    if (partner >= 0) theta[j] = theta[j]! - Math.log(native[space.freeIndex[partner]!]!);
  }
  return theta;
}

/**
 * The linear map from fitting-space coordinates to the "natural" coordinates (ln p for positive parameters, p
 * otherwise) of the free parameters: natural = A theta, A = I plus a 1 at (a, b) for each ratio coordinate.
 * Returned as a dense p-by-p array.
 */
export function naturalMap(space: ParameterSpace): number[][] {
  const p = space.freeIndex.length;
  const a = Array.from({ length: p }, (_, i) => Array.from({ length: p }, (_, j) => (i === j ? 1 : 0)));
  space.ratioOf.forEach((partner, j) => {
    if (partner >= 0) a[j]![partner] = 1;
  });
  return a;
}
