/**
 * Starting values for a fit, for the parameters the caller did not give.
 *
 * Order of preference:
 * 1. values given by the caller (`start`) and fixed values;
 * 2. the models module's `startingValues`: the Cooper-Jacob straight line on the late data (u <= 0.01) of the
 *    first well, with model-specific rules for further parameters (Hantush-Jacob B, Thiem R);
 * 3. otherwise, or when that rule fails (too few late points, no model rule), a grid search: every missing
 *    free parameter on a grid across its bounds (logarithmic for positive parameters, linear otherwise;
 *    m points each with m^q <= 625 for q missing parameters, at least 3), the given ones held, scored by the
 *    weighted sum of squares over at most 64 points per well (evenly spread by index). The best grid node
 *    (first in grid order on ties) is the start.
 * Derived values outside the bounds are moved onto the nearest bound.
 */

import { isComputationStopped } from "../numerics/computation-stopped.js";
import { startingValues, type DrawdownModel } from "../models/index.js";
import type { PackedWell } from "./observations.js";
import { weightedResiduals } from "./observations.js";
import type { ParameterSpace } from "./parameter-space.js";

/**
 * How the starting values were obtained: given by the caller; "cooper-jacob" from the models module's
 * startingValues rule for the model (the Cooper-Jacob line, or for hantush-jacob a type-curve search; the
 * notes say which); or a grid search across the bounds.
 */
export type StartMethod = "given" | "cooper-jacob" | "grid-search";

export interface StartValues {
  /** Full native parameter vector (descriptor order, base units). */
  readonly values: Float64Array;
  readonly method: StartMethod;
  /** One sentence per derivation step or problem met. */
  readonly notes: string[];
}

const GRID_BUDGET = 625;
const GRID_POINTS_PER_WELL = 64;

function subsample(wells: readonly PackedWell[]): PackedWell[] {
  let offset = 0;
  return wells.map((w) => {
    const n = w.t.length;
    const m = Math.min(n, GRID_POINTS_PER_WELL);
    const pick = new Int32Array(m);
    for (let j = 0; j < m; j++) pick[j] = m === 1 ? n - 1 : Math.round((j * (n - 1)) / (m - 1));
    const sub: PackedWell = {
      name: w.name,
      geometry: w.geometry,
      offset,
      index: pick.map((j) => w.index[j]!),
      t: Float64Array.from(pick, (j) => w.t[j]!),
      s: Float64Array.from(pick, (j) => w.s[j]!),
      sqrtWeights: Float64Array.from(pick, (j) => w.sqrtWeights[j]!),
      absolute: w.absolute,
    };
    offset += m;
    return sub;
  });
}

function gridSearch(model: DrawdownModel, space: ParameterSpace, wells: readonly PackedWell[], values: Float64Array, missing: readonly number[]): number {
  const sample = subsample(wells);
  const count = sample.reduce((sum, w) => sum + w.t.length, 0);
  const prediction = new Float64Array(count);
  const residual = new Float64Array(count);
  const q = missing.length;
  const m = Math.max(3, Math.floor(Math.pow(GRID_BUDGET, 1 / q) + 1e-9));
  const axes = missing.map((k) => {
    const d = space.descriptors[k]!;
    const [lo, hi] = space.nativeBounds[k]!;
    const axis = new Float64Array(m);
    for (let j = 0; j < m; j++) {
      const f = (j + 0.5) / m;
      axis[j] = d.positive ? Math.exp(Math.log(lo > 0 ? lo : hi * 1e-12) * (1 - f) + Math.log(hi) * f) : lo + (hi - lo) * f;
    }
    return axis;
  });
  const trial = Float64Array.from(values);
  const counter = new Int32Array(q);
  let best = Infinity;
  const bestValues = Float64Array.from(values);
  const total = Math.pow(m, q);
  for (let node = 0; node < total; node++) {
    for (let j = 0; j < q; j++) trial[missing[j]!] = axes[j]![counter[j]!]!;
    let ssr = Infinity;
    try {
      weightedResiduals(model, sample, trial, prediction, residual);
      ssr = 0;
      for (let i = 0; i < count; i++) ssr += residual[i]! * residual[i]!;
      if (!Number.isFinite(ssr)) ssr = Infinity;
    } catch {
      ssr = Infinity;
    }
    if (ssr < best) {
      best = ssr;
      bestValues.set(trial);
    }
    for (let j = 0; j < q; j++) {
      counter[j]!++;
      if (counter[j]! < m) break;
      counter[j] = 0;
    }
  }
  values.set(bestValues);
  return m;
}

/** Starting values for every parameter (see the module comment for the rules). */
export function deriveStartValues(
  model: DrawdownModel,
  space: ParameterSpace,
  wells: readonly PackedWell[],
  given: Readonly<Record<string, number>> | undefined,
): StartValues {
  const descriptors = space.descriptors;
  const values = new Float64Array(descriptors.length);
  const notes: string[] = [];
  const missing: number[] = [];
  for (let k = 0; k < descriptors.length; k++) {
    const d = descriptors[k]!;
    if (space.isFixed[k]) values[k] = space.fixedValues[k]!;
    else if (given?.[d.name] !== undefined) values[k] = given[d.name]!;
    else missing.push(k);
  }
  if (missing.length === 0) return { values, method: "given", notes };

  let method: StartMethod = "grid-search";
  const first = wells.find((w) => w.t.length > 0);
  if (first) {
    try {
      const derived = startingValues(model, first.geometry, first.t, first.s);
      let usable = derived.values.length === descriptors.length;
      for (const k of missing) if (!Number.isFinite(derived.values[k]!)) usable = false;
      if (usable) {
        for (const k of missing) values[k] = derived.values[k]!;
        notes.push(`Start from the data of well "${first.name}" (startingValues): ${derived.notes.join(" ")}`);
        method = "cooper-jacob";
      }
    } catch (error) {
      if (isComputationStopped(error)) throw error;
      notes.push(`No start from the data (${error instanceof Error ? error.message : String(error)}); using a grid search.`);
    }
  }
  if (method === "grid-search") {
    const m = gridSearch(model, space, wells, values, missing);
    const names = missing.map((k) => descriptors[k]!.name).join(", ");
    notes.push(`Start for ${names} from a ${m}-point-per-parameter grid search across the bounds.`);
  }
  for (const k of missing) {
    const [lo, hi] = space.nativeBounds[k]!;
    const v = values[k]!;
    if (v < lo || v > hi) {
      values[k] = Math.min(Math.max(v, lo), hi);
      notes.push(`Start value ${descriptors[k]!.name} = ${v.toPrecision(4)} moved onto the bound ${values[k]}.`);
    }
    if (descriptors[k]!.positive && !(values[k]! > 0)) values[k] = Math.max(lo, hi * 1e-12);
  }
  return { values, method, notes };
}
