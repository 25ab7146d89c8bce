/**
 * Shared pieces of the models built on the vertical-mode series (vertical-modes.ts): the screen geometry in
 * depths below the top of the aquifer with its validation, the optional parameters (anisotropy, skin,
 * leakance, drainage constant) and the Stehfest inversion of the series transform.
 */
import { stehfestCoefficients } from "../numerics/index.js";
import { checkGeometry, checkParameters, checkScalar, outputArray } from "./checks.js";
import { ModelInputError } from "./errors.js";
import type { DrawdownModel, ModelDescriptor, ObservationGeometry, ParameterDescriptor } from "./model.js";
import type { PenetrationObservation } from "./partial-penetration.js";
import { modeDrawdownTransform, VerticalModeSeries, type ModeAquifer, type VerticalGeometry } from "./vertical-modes.js";

/**
 * Geometry of a screened pumping well and one observation point, bound into a model when it is made.
 * Depths in m below the top of the aquifer (for a water-table aquifer: below the initial water table).
 */
export interface ScreenedWellGeometry {
  /** Saturated thickness b, m (> 0). */
  readonly thickness: number;
  /** Top d and bottom l of the pumping screen, m, 0 <= d < l <= b. */
  readonly screenTop: number;
  readonly screenBottom: number;
  /**
   * Where drawdown is observed at distances r > rw: a piezometer depth, or an observation screen
   * (0 <= top < bottom <= b). Default: averaged over the pumping screen's depth interval.
   */
  readonly observation?: PenetrationObservation;
  /** Kz/Kr when known (> 0); when omitted it is fitted as "KzKr". */
  readonly anisotropy?: number;
  /** Stehfest terms N, even, 8 to 18; default 12. */
  readonly stehfestTerms?: number;
}

/** The finite-diameter pumping well: screen radius, casing radius and skin. */
export interface FiniteWell {
  /** Effective radius of the screen or open hole rw, m (> 0). */
  readonly rw: number;
  /** Inside radius of the casing where the water level moves rc, m (>= 0; 0: no well-bore storage). */
  readonly rc: number;
  /**
   * Skin factor Sk of a thin zone at the screen (dimensionless, >= 0; Agarwal et al. 1970), or "fitted" to fit
   * it as parameter "Sk"; default 0.
   */
  readonly skin?: number | "fitted";
}

/** Anisotropy Kz/Kr as a fitted parameter. */
export const screenAnisotropyParameter: ParameterDescriptor = {
  name: "KzKr",
  label: "anisotropy Kz/Kr",
  unit: "1",
  positive: true,
  bounds: [1e-4, 10],
  description: "Ratio of vertical to horizontal hydraulic conductivity of the aquifer.",
};

/** Skin factor as a fitted parameter (fitted on a linear scale, >= 0). */
export const skinParameter: ParameterDescriptor = {
  name: "Sk",
  label: "skin factor",
  unit: "1",
  positive: false,
  bounds: [0, 100],
  description: "Dimensionless skin of a thin damaged zone at the screen; adds Q Sk / (2 pi Kr L) to the well drawdown.",
};

/** Drainage constant of gradual drainage at the water table. */
export const drainageConstantParameter: ParameterDescriptor = {
  name: "alpha",
  label: "drainage constant",
  unit: "1/d",
  positive: true,
  bounds: [1e-3, 1e5],
  description: "Rate constant of the exponential lag of drainage from the zone above the water table (Boulton kernel).",
};

/** Validates a screened-well geometry and converts it to heights above the base. */
export function verticalGeometry(where: string, g: ScreenedWellGeometry): VerticalGeometry {
  checkScalar(where, "aquifer thickness", g.thickness, "m", true);
  const b = g.thickness;
  const range = (label: string, top: number, bottom: number): void => {
    if (!(Number.isFinite(top) && Number.isFinite(bottom) && top >= 0 && bottom <= b && top < bottom)) {
      throw new ModelInputError(
        `${where}: ${label} runs from ${top} m to ${bottom} m; it needs 0 <= top < bottom <= thickness (${b} m), ` +
          "depths measured downwards from the top of the aquifer.",
      );
    }
  };
  range("the pumping well screen", g.screenTop, g.screenBottom);
  const o = g.observation;
  let observation: VerticalGeometry["observation"];
  if (o === undefined) observation = { zeta1: b - g.screenBottom, zeta2: b - g.screenTop };
  else if ("depth" in o) {
    if (!(Number.isFinite(o.depth) && o.depth >= 0 && o.depth <= b)) {
      throw new ModelInputError(
        `${where}: piezometer depth is ${o.depth} m; it must lie between 0 and the thickness ${b} m (below the top of the aquifer).`,
      );
    }
    observation = { zeta: b - o.depth };
  } else {
    range("the observation well screen", o.screenTop, o.screenBottom);
    observation = { zeta1: b - o.screenBottom, zeta2: b - o.screenTop };
  }
  if (g.anisotropy !== undefined) checkScalar(where, "anisotropy Kz/Kr", g.anisotropy, "1", true);
  const n = g.stehfestTerms ?? 12;
  if (!(Number.isInteger(n) && n % 2 === 0 && n >= 8 && n <= 18)) {
    throw new ModelInputError(`${where}: stehfestTerms is ${n}; use an even integer from 8 to 18 (12 is the tested default).`);
  }
  return { b, zetaA: b - g.screenBottom, zetaB: b - g.screenTop, observation };
}

/** Validates the finite well; returns rw, rc and the fixed skin (NaN when the skin is fitted). */
export function checkFiniteWell(where: string, well: FiniteWell): { rw: number; rc: number; skin: number } {
  checkScalar(where, "well radius rw", well.rw, "m", true);
  if (!(Number.isFinite(well.rc) && well.rc >= 0)) {
    throw new ModelInputError(
      `${where}: casing radius rc is ${well.rc} m; it must be a finite number >= 0 (the inside radius where the water level moves).`,
    );
  }
  const skin = well.skin ?? 0;
  if (skin === "fitted") return { rw: well.rw, rc: well.rc, skin: Number.NaN };
  if (!(Number.isFinite(skin) && skin >= 0)) {
    throw new ModelInputError(
      `${where}: skin is ${String(skin)}; it must be a finite number >= 0 or "fitted". For a stimulated well use an ` +
        "effective well radius rw exp(-skin) with skin 0.",
    );
  }
  return { rw: well.rw, rc: well.rc, skin };
}

/** Reads the aquifer and the skin of one parameter vector. */
export type ParameterReader = (p: ArrayLike<number>) => { aquifer: ModeAquifer; skin: number };

/** Relative tolerance within which r counts as the well radius (the pumped well). */
const SAME_RADIUS = 1e-9;

/**
 * Builds the DrawdownModel for a vertical-mode series: drawdown in m at times t (d) by Stehfest inversion
 * (N weights) of the transform of vertical-modes.ts, with one number of directly summed pumped-well terms
 * per time (that of the largest Laplace variable); r within 1e-9 of rw (rw > 0) is the pumped well.
 */
export function seriesModel<Extra extends object>(
  descriptor: ModelDescriptor,
  vertical: VerticalGeometry,
  well: { rw: number; rc: number },
  terms: number,
  read: ParameterReader,
  extra: Extra,
): DrawdownModel & Extra {
  const weights = stehfestCoefficients(terms);
  const series = new Map<number, VerticalModeSeries>();
  const seriesFor = (skin: number): VerticalModeSeries => {
    let s = series.get(skin);
    if (s === undefined) {
      if (series.size > 8) series.clear();
      s = new VerticalModeSeries(vertical, { rw: well.rw, rc: well.rc, skin });
      series.set(skin, s);
    }
    return s;
  };
  const model = {
    ...descriptor,
    ...extra,
    drawdown(p: ArrayLike<number>, geometry: ObservationGeometry, t: ArrayLike<number>, out?: Float64Array): Float64Array {
      checkParameters(model, p);
      checkGeometry(model.name, geometry);
      const r = geometry.r;
      const { aquifer, skin } = read(p);
      if (well.rw > 0 && r < well.rw * (1 - SAME_RADIUS)) {
        throw new ModelInputError(
          `${model.name}: radial distance r = ${r} m is inside the well (rw = ${well.rw} m); use r = rw for the ` +
            "pumped well or the distance of an observation point outside it.",
        );
      }
      const pumped = well.rw > 0 && r <= well.rw * (1 + SAME_RADIUS);
      const s = seriesFor(skin);
      const result = outputArray(model.name, t.length, out);
      for (let i = 0; i < t.length; i++) {
        const ti = t[i]!;
        if (!(ti > 0 && Number.isFinite(ti))) {
          result[i] = ti <= 0 ? 0 : Number.NaN;
          continue;
        }
        const a = Math.LN2 / ti;
        const direct = s.directTerms(weights.length * a, aquifer);
        let sum = 0;
        for (let k = 1; k <= weights.length; k++) {
          sum += weights[k - 1]! * modeDrawdownTransform(s, aquifer, geometry.Q, pumped ? well.rw : r, pumped, k * a, direct);
        }
        result[i] = a * sum;
      }
      return result;
    },
  } as DrawdownModel & Extra;
  return model;
}
