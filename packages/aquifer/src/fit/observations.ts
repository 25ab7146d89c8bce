/**
 * Observation wells as the fit sees them: validated, masked points packed into contiguous arrays, and the
 * weighted residual vector r_i = sqrt(w_i) (s_model(t_i) - s_obs(t_i)) (m) with its Jacobian.
 */

import type { DrawdownModel, ObservationGeometry } from "../models/index.js";
import { FitInputError } from "./errors.js";

/** One observation record: drawdown s (m) at times t (d since pumping started) at one point. */
export interface ObservationWell {
  /** Name used in messages and in the residual table, e.g. "OB-1". */
  readonly name: string;
  /** Distance to the pumping well r (m) and pumping rate Q (m3/d). */
  readonly geometry: ObservationGeometry;
  /** Times, d since pumping started, all > 0. */
  readonly t: ArrayLike<number>;
  /** Drawdowns, m (positive downwards). */
  readonly s: ArrayLike<number>;
  /**
   * Optional relative weights w_i >= 0 multiplying the squared residuals: only their ratios matter, the scale of
   * the errors comes from the residuals (s^2 = SSR/(n - p)). A weight of 0 leaves the point out.
   */
  readonly weights?: ArrayLike<number>;
  /**
   * Optional known measurement standard deviations sigma_i > 0 (m): absolute weights 1/sigma_i^2. Then the
   * uncertainties rest on these sigma_i, not on the scatter, and a chi-square test checks the fit against them.
   * Give either weights or sigma, not both.
   */
  readonly sigma?: ArrayLike<number>;
  /** Optional inclusion flags: mask[i] true keeps point i in the fit, false leaves it out. */
  readonly mask?: ArrayLike<boolean>;
}

/** One well after validation: only the points used in the fit. */
export interface PackedWell {
  readonly name: string;
  readonly geometry: ObservationGeometry;
  /** Offset of this well's first point in the packed residual vector. */
  readonly offset: number;
  /** Indices of the used points in the caller's arrays. */
  readonly index: Int32Array;
  readonly t: Float64Array;
  readonly s: Float64Array;
  /** sqrt of the weights (1 when none were given; 1/sigma_i for known standard deviations). */
  readonly sqrtWeights: Float64Array;
  /** True when the weights are absolute (known standard deviations), false for relative weights. */
  readonly absolute: boolean;
}

function location(well: string, i: number): string {
  return `well "${well}", point ${i}`;
}

/**
 * Validates the wells and packs the used points. `measurementSd` (m, > 0), when given, is the known standard
 * deviation of every reading of the wells that give neither weights nor sigma. Throws FitInputError with the
 * well and point at fault, and when known standard deviations and relative weights are mixed.
 */
export function packWells(
  wells: readonly ObservationWell[] | undefined,
  measurementSd?: number,
): { wells: PackedWell[]; count: number; absolute: boolean } {
  if (measurementSd !== undefined && !(Number.isFinite(measurementSd) && measurementSd > 0)) {
    throw new FitInputError(`fitModel: measurementSd is ${measurementSd} m; give the known standard deviation of a reading as a number > 0 (m).`);
  }
  if (!wells || wells.length === 0) {
    throw new FitInputError("fitModel: no observation wells given; pass wells: [{ name, geometry: { r, Q }, t, s }].");
  }
  const packed: PackedWell[] = [];
  const names = new Set<string>();
  let offset = 0;
  wells.forEach((w, k) => {
    const name = typeof w.name === "string" && w.name !== "" ? w.name : `#${k + 1}`;
    if (names.has(name)) throw new FitInputError(`fitModel: two wells are named "${name}"; give each well its own name.`);
    names.add(name);
    const { r, Q, x, y } = w.geometry ?? ({} as ObservationGeometry);
    if (!(Number.isFinite(r) && r > 0)) {
      throw new FitInputError(`fitModel: well "${name}" has r = ${r} m; give the distance to the pumping well as a number > 0.`);
    }
    if (!(Number.isFinite(Q) && Q !== 0)) {
      throw new FitInputError(`fitModel: well "${name}" has Q = ${Q} m3/d; give the pumping rate as a non-zero number.`);
    }
    if (!w.t || !w.s || w.t.length !== w.s.length) {
      throw new FitInputError(
        `fitModel: well "${name}" has ${w.t?.length ?? 0} times but ${w.s?.length ?? 0} drawdowns; pass one drawdown per time.`,
      );
    }
    const length = w.t.length;
    if (w.weights && w.weights.length !== length) {
      throw new FitInputError(`fitModel: well "${name}" has ${w.weights.length} weights for ${length} points; pass one weight per point.`);
    }
    if (w.sigma && w.weights) {
      throw new FitInputError(
        `fitModel: well "${name}" gives both weights (relative) and sigma (known standard deviations); give one of them.`,
      );
    }
    if (w.sigma && w.sigma.length !== length) {
      throw new FitInputError(`fitModel: well "${name}" has ${w.sigma.length} standard deviations for ${length} points; pass one sigma per point.`);
    }
    if (w.mask && w.mask.length !== length) {
      throw new FitInputError(`fitModel: well "${name}" has ${w.mask.length} mask flags for ${length} points; pass one flag per point.`);
    }
    const used: number[] = [];
    for (let i = 0; i < length; i++) {
      if (w.mask && !w.mask[i]) continue;
      const t = w.t[i]!;
      const s = w.s[i]!;
      if (!Number.isFinite(t)) {
        throw new FitInputError(`fitModel: ${location(name, i)}: time is ${t}; remove the point or leave it out with mask[${i}] = false.`);
      }
      if (!(t > 0)) {
        throw new FitInputError(
          `fitModel: ${location(name, i)}: time is ${t} d; times must be > 0 (d since pumping started). Remove the point or leave it out with mask[${i}] = false.`,
        );
      }
      if (!Number.isFinite(s)) {
        throw new FitInputError(`fitModel: ${location(name, i)}: drawdown is ${s}; remove the point or leave it out with mask[${i}] = false.`);
      }
      if (w.weights) {
        const wt = w.weights[i]!;
        if (!(Number.isFinite(wt) && wt >= 0)) {
          throw new FitInputError(`fitModel: ${location(name, i)}: weight is ${wt}; weights must be finite and >= 0.`);
        }
        if (wt === 0) continue;
      }
      if (w.sigma) {
        const sd = w.sigma[i]!;
        if (!(Number.isFinite(sd) && sd > 0)) {
          throw new FitInputError(`fitModel: ${location(name, i)}: sigma is ${sd} m; known standard deviations must be finite and > 0.`);
        }
      }
      used.push(i);
    }
    const index = Int32Array.from(used);
    const t = new Float64Array(used.length);
    const s = new Float64Array(used.length);
    const absolute = w.sigma !== undefined || (w.weights === undefined && measurementSd !== undefined);
    const sqrtWeights = new Float64Array(used.length).fill(w.weights || !absolute ? 1 : 1 / measurementSd!);
    used.forEach((i, j) => {
      t[j] = w.t[i]!;
      s[j] = w.s[i]!;
      if (w.weights) sqrtWeights[j] = Math.sqrt(w.weights[i]!);
      if (w.sigma) sqrtWeights[j] = 1 / w.sigma[i]!;
    });
    const geometry: ObservationGeometry =
      Number.isFinite(x) && Number.isFinite(y) ? { r, Q, x: x!, y: y! } : { r, Q };
    packed.push({ name, geometry, offset, index, t, s, sqrtWeights, absolute });
    offset += used.length;
  });
  const absolute = packed.some((w) => w.absolute);
  if (absolute && packed.some((w) => !w.absolute)) {
    const relative = packed.filter((w) => !w.absolute).map((w) => `"${w.name}"`).join(", ");
    throw new FitInputError(
      `fitModel: some wells give known standard deviations (sigma or measurementSd) and ${relative} relative weights or none; ` +
        "the uncertainty rests either on known standard deviations or on the scatter, not on both. Give sigma for every well, or for none.",
    );
  }
  return { wells: packed, count: offset, absolute };
}

/**
 * Weighted residuals sqrt(w_i) (s_model - s_obs) for native parameters p into out (length: all packed points),
 * using `prediction` (same length) as scratch for the model output.
 */
export function weightedResiduals(
  model: DrawdownModel,
  wells: readonly PackedWell[],
  p: Float64Array,
  prediction: Float64Array,
  out: Float64Array,
): void {
  for (const w of wells) {
    const n = w.t.length;
    if (n === 0) continue;
    const view = prediction.subarray(w.offset, w.offset + n);
    const result = model.drawdown(p, w.geometry, w.t, view);
    if (result !== view) view.set(result);
    for (let i = 0; i < n; i++) out[w.offset + i] = w.sqrtWeights[i]! * (view[i]! - w.s[i]!);
  }
}
