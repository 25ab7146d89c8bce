/**
 * Hantush and Jacob (1955): transient drawdown around a well pumping at a constant rate from a confined
 * aquifer that receives leakage through an aquitard from an unpumped aquifer whose head stays constant;
 * storage in the aquitard is neglected.
 *
 *   s = Q / (4 pi T) W(u, r/B),  u = r^2 S / (4 T t),  B = sqrt(T b' / K'),
 *   W(u, b) = integral from u to infinity of exp(-y - b^2 / (4 y)) / y dy.
 *
 * Source: Hantush, M.S. and Jacob, C.E. (1955), Trans. Am. Geophys. Union 36(1), 95-100.
 */
import { besselK0 } from "../special/index.js";
import { hantushW, hantushWdRB, hantushWdU } from "../wells/index.js";
import { checkGeometry, checkParameters, checkScalar, outputArray } from "./checks.js";
import { ModelInputError } from "./errors.js";
import type { DrawdownModel, ObservationGeometry, ParameterDescriptor } from "./model.js";
import { storativityParameter, transmissivityParameter } from "./parameters.js";

const FOUR_PI = 4 * Math.PI;

/** Leakage factor B = sqrt(T b' / K') in m. */
export const leakageFactorParameter: ParameterDescriptor = {
  name: "B",
  label: "leakage factor",
  unit: "m",
  positive: true,
  bounds: [1, 1e6],
  description:
    "Distance scale of leakage, sqrt(T b'/K') with b' the aquitard thickness and K' its vertical hydraulic " +
    "conductivity; large B means little leakage.",
  atBound: { upper: "leakage not detected: within this record the drawdown shows no leakage through the confining layer" },
};

/** Hantush-Jacob leaky-aquifer model; parameter vector [T (m2/d), S (1), B (m)]. */
export const hantushJacobModel: DrawdownModel = {
  id: "hantush-jacob",
  name: "Hantush-Jacob (1955) leaky aquifer without aquitard storage",
  source:
    "Hantush, M.S. and Jacob, C.E. (1955). Non-steady radial flow in an infinite leaky aquifer. " +
    "Transactions, American Geophysical Union 36(1), 95-100.",
  assumptions: [
    "The pumped aquifer is homogeneous, isotropic, of uniform thickness and infinite in areal extent; " +
      "flow in it is horizontal.",
    "It is overlain or underlain by an aquitard through which water leaks vertically, in proportion to the " +
      "drawdown, from an unpumped aquifer whose head does not change.",
    "Storage in the aquitard is neglected (release from aquitard storage is the subject of Hantush 1960).",
    "The well pumps at a constant rate, fully penetrates the aquifer and has an infinitesimal radius.",
  ],
  validity: [
    "All u > 0 and r/B >= 0; r/B = 0 is the Theis solution.",
    "Neglecting aquitard storage is acceptable when the aquitard releases little water from its own " +
      "storage compared with the leakage it transmits; otherwise early data follow Hantush (1960) instead.",
    "Late-time drawdown levels off at the steady value Q / (2 pi T) K0(r/B) (de Glee 1930, Hantush 1955).",
  ],
  cautions: [
    "The levelling-off of drawdown is also produced by a recharge boundary or delayed yield; leakage is an " +
      "interpretation, to be backed by the geology and by the head in the unpumped aquifer.",
    "The unpumped aquifer's head is assumed constant: over long pumping it may fall, so drawdown and yield " +
      "projected beyond the tested duration may be too optimistic.",
    "When the record ends before drawdown levels off, B is poorly determined (its upper confidence bound may " +
      "be unbounded); report it with its interval.",
  ],
  parameters: [transmissivityParameter, storativityParameter, leakageFactorParameter],

  drawdown(p: ArrayLike<number>, geometry: ObservationGeometry, t: ArrayLike<number>, out?: Float64Array): Float64Array {
    checkParameters(hantushJacobModel, p);
    checkGeometry(hantushJacobModel.name, geometry);
    const T = p[0]!;
    const S = p[1]!;
    const rB = geometry.r / p[2]!;
    const result = outputArray(hantushJacobModel.name, t.length, out);
    const coef = geometry.Q / (FOUR_PI * T);
    const uTimesT = (geometry.r * geometry.r * S) / (4 * T);
    for (let i = 0; i < t.length; i++) {
      const ti = t[i]!;
      result[i] = ti > 0 ? coef * hantushW(uTimesT / ti, rB) : ti <= 0 ? 0 : Number.NaN;
    }
    return result;
  },

  jacobian(p: ArrayLike<number>, geometry: ObservationGeometry, t: ArrayLike<number>): Float64Array[] {
    checkParameters(hantushJacobModel, p);
    checkGeometry(hantushJacobModel.name, geometry);
    const T = p[0]!;
    const S = p[1]!;
    const B = p[2]!;
    const rB = geometry.r / B;
    const dT = new Float64Array(t.length);
    const dS = new Float64Array(t.length);
    const dB = new Float64Array(t.length);
    const coef = geometry.Q / (FOUR_PI * T);
    const uTimesT = (geometry.r * geometry.r * S) / (4 * T);
    for (let i = 0; i < t.length; i++) {
      const ti = t[i]!;
      if (ti > 0) {
        // Chain rule with du/dT = -u/T, du/dS = u/S, d(r/B)/dB = -(r/B)/B.
        const u = uTimesT / ti;
        const s = coef * hantushW(u, rB);
        const uWu = u * hantushWdU(u, rB);
        dT[i] = (-s - coef * uWu) / T;
        dS[i] = (coef * uWu) / S;
        dB[i] = (-coef * hantushWdRB(u, rB) * rB) / B;
      } else if (!(ti <= 0)) {
        dT[i] = Number.NaN;
        dS[i] = Number.NaN;
        dB[i] = Number.NaN;
      }
    }
    return [dT, dS, dB];
  },
};

/**
 * Hantush-Jacob drawdown in m at one time, for T (m2/d), S (1), leakage factor B (m), Q (m3/d), r (m) and
 * t (d); 0 for t <= 0. Source: Hantush and Jacob (1955).
 */
export function hantushJacobDrawdown(T: number, S: number, B: number, Q: number, r: number, t: number): number {
  return hantushJacobModel.drawdown([T, S, B], { r, Q }, [t])[0]!;
}

/**
 * Steady drawdown in m that the Hantush-Jacob solution approaches at late time:
 * s = Q / (2 pi T) K0(r/B), for Q (m3/d), T (m2/d), r (m), B (m). Source: de Glee (1930); Hantush and
 * Jacob (1955), as the limit t -> infinity.
 */
export function hantushJacobSteadyDrawdown(T: number, B: number, Q: number, r: number): number {
  const where = "hantushJacobSteadyDrawdown";
  checkScalar(where, "transmissivity T", T, "m2/d", true);
  checkScalar(where, "leakage factor B", B, "m", true);
  checkScalar(where, "pumping rate Q", Q, "m3/d", false);
  checkScalar(where, "radial distance r", r, "m", true);
  return (Q / (2 * Math.PI * T)) * besselK0(r / B);
}

/**
 * Leakance K'/b' = T / B^2 in 1/d, from transmissivity T (m2/d) and leakage factor B (m).
 * Follows from the definition B = sqrt(T b' / K') (Hantush and Jacob 1955).
 */
export function leakanceFromLeakageFactor(T: number, B: number): number {
  checkScalar("leakanceFromLeakageFactor", "transmissivity T", T, "m2/d", true);
  checkScalar("leakanceFromLeakageFactor", "leakage factor B", B, "m", true);
  return T / (B * B);
}

/**
 * Leakage factor B = sqrt(T / leakance) in m, from transmissivity T (m2/d) and leakance K'/b' (1/d).
 * Inverse of {@link leakanceFromLeakageFactor}.
 */
export function leakageFactorFromLeakance(T: number, leakance: number): number {
  checkScalar("leakageFactorFromLeakance", "transmissivity T", T, "m2/d", true);
  checkScalar("leakageFactorFromLeakance", "leakance K'/b'", leakance, "1/d", true);
  return Math.sqrt(T / leakance);
}

/** One member of the Hantush-Jacob type-curve family. */
export interface HantushTypeCurve {
  /** r/B of this curve, dimensionless. */
  readonly rB: number;
  /** W(u, r/B) at each 1/u of the family. */
  readonly W: Float64Array;
}

/** The Hantush-Jacob type-curve family W(u, r/B) against 1/u. */
export interface HantushTypeCurveFamily {
  readonly uInverse: Float64Array;
  readonly curves: HantushTypeCurve[];
}

/**
 * Hantush-Jacob type curves: W(u, r/B) at the given 1/u values (each > 0) for each r/B (each >= 0; 0 gives
 * the Theis curve). Source: Hantush and Jacob (1955).
 */
export function hantushTypeCurves(uInverse: ArrayLike<number>, rB: ArrayLike<number>): HantushTypeCurveFamily {
  const x = Float64Array.from(uInverse);
  for (let i = 0; i < x.length; i++) checkScalar("hantushTypeCurves", `1/u at index ${i}`, x[i]!, "1", true);
  const curves: HantushTypeCurve[] = [];
  for (let k = 0; k < rB.length; k++) {
    const b = rB[k]!;
    if (!(Number.isFinite(b) && b >= 0)) {
      throw new ModelInputError(`hantushTypeCurves: r/B at index ${k} is ${b}; it must be a finite number >= 0.`);
    }
    const W = new Float64Array(x.length);
    for (let i = 0; i < x.length; i++) W[i] = hantushW(1 / x[i]!, b);
    curves.push({ rB: b, W });
  }
  return { uInverse: x, curves };
}
