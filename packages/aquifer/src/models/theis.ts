/**
 * Theis (1935): transient drawdown around a well pumping at a constant rate from a confined aquifer.
 *
 *   s = Q / (4 pi T) W(u),  u = r^2 S / (4 T t),  W(u) = E1(u) (the exponential integral).
 *
 * Source: Theis, C.V. (1935), Trans. Am. Geophys. Union 16(2), 519-524.
 */
import { expint1 } from "../special/index.js";
import { checkGeometry, checkParameters, checkScalar, outputArray } from "./checks.js";
import type { DrawdownModel, ObservationGeometry } from "./model.js";
import { storativityParameter, transmissivityParameter } from "./parameters.js";

const FOUR_PI = 4 * Math.PI;

/** Theis model as a DrawdownModel; parameter vector [T (m2/d), S (1)]. */
export const theisModel: DrawdownModel = {
  id: "theis",
  name: "Theis (1935) confined aquifer",
  source:
    "Theis, C.V. (1935). The relation between the lowering of the piezometric surface and the rate and " +
    "duration of discharge of a well using ground-water storage. Transactions, American Geophysical " +
    "Union 16(2), 519-524.",
  assumptions: [
    "The aquifer is confined, homogeneous, isotropic and of uniform thickness, and infinite in areal extent.",
    "The piezometric surface is horizontal before pumping starts.",
    "The well pumps at a constant rate and fully penetrates the aquifer; flow to it is horizontal.",
    "Water is released from storage instantaneously as head declines.",
    "The well has an infinitesimal radius: storage in the well casing is neglected.",
    "No recharge, no leakage through the confining layers, no boundaries within the cone of depression.",
  ],
  validity: [
    "All u = r^2 S / (4 T t) > 0; the model itself holds at every time once its assumptions hold.",
    "In the pumped well, early data are affected by well-bore storage (rc the casing radius): at the often " +
      "quoted 25 rc^2 / T the drawdown is still 1.9 % (alpha = rw^2 S / rc^2 = 0.1) to 3.2 % (alpha = 1e-7) below " +
      "Theis and it comes within 1 % at 46 to 58 rc^2 / T (Papadopulos-Cooper by mpmath; see " +
      "wellboreStorageTime); drawdown there also contains well losses.",
    "In a water-table aquifer, usable while drawdown stays small (below roughly 10 to 25 % of the saturated " +
      "thickness, common practice, no source) and after delayed yield has ended.",
  ],
  cautions: [
    "A late-time departure from the curve signals a boundary, leakage or delayed yield; do not force a fit " +
      "through it, and do not extrapolate drawdown or yield beyond the tested duration as if none existed.",
    "T and S are correlated in a fit to a single observation point; S from the pumped well itself is " +
      "unreliable because the effective well radius is unknown.",
  ],
  parameters: [transmissivityParameter, storativityParameter],

  drawdown(p: ArrayLike<number>, geometry: ObservationGeometry, t: ArrayLike<number>, out?: Float64Array): Float64Array {
    checkParameters(theisModel, p);
    checkGeometry(theisModel.name, geometry);
    const T = p[0]!;
    const S = p[1]!;
    const result = outputArray(theisModel.name, t.length, out);
    const coef = geometry.Q / (FOUR_PI * T);
    const uTimesT = (geometry.r * geometry.r * S) / (4 * T);
    for (let i = 0; i < t.length; i++) {
      const ti = t[i]!;
      result[i] = ti > 0 ? coef * expint1(uTimesT / ti) : ti <= 0 ? 0 : Number.NaN;
    }
    return result;
  },

  jacobian(p: ArrayLike<number>, geometry: ObservationGeometry, t: ArrayLike<number>): Float64Array[] {
    checkParameters(theisModel, p);
    checkGeometry(theisModel.name, geometry);
    const T = p[0]!;
    const S = p[1]!;
    const dT = new Float64Array(t.length);
    const dS = new Float64Array(t.length);
    const coef = geometry.Q / (FOUR_PI * T);
    const uTimesT = (geometry.r * geometry.r * S) / (4 * T);
    for (let i = 0; i < t.length; i++) {
      const ti = t[i]!;
      if (ti > 0) {
        // With dW/du = -exp(-u)/u:  ds/dln T = -s + coef e^-u,  ds/dln S = -coef e^-u.
        const u = uTimesT / ti;
        const s = coef * expint1(u);
        const g = coef * Math.exp(-u);
        dT[i] = (g - s) / T;
        dS[i] = -g / S;
      } else if (!(ti <= 0)) {
        dT[i] = Number.NaN;
        dS[i] = Number.NaN;
      }
    }
    return [dT, dS];
  },
};

/**
 * Theis drawdown in m at one time, for T (m2/d), S (1), Q (m3/d), r (m) and t (d since pumping
 * started); 0 for t <= 0. Accuracy is that of `expint1` (relative, near double precision).
 * Source: Theis (1935).
 */
export function theisDrawdown(T: number, S: number, Q: number, r: number, t: number): number {
  return theisModel.drawdown([T, S], { r, Q }, [t])[0]!;
}

/** Dimensionless Theis type curve: W(u) against 1/u. */
export interface TheisTypeCurve {
  /** The 1/u values asked for (dimensionless). */
  readonly uInverse: Float64Array;
  /** W(u) = E1(u) at each of them (dimensionless). */
  readonly W: Float64Array;
}

/**
 * Theis type curve W(u) = E1(u) at the given values of 1/u (each finite and > 0). Plotted log-log against
 * 1/u it has the same shape as s against t, which is what curve matching relies on. Source: Theis (1935).
 */
export function theisTypeCurve(uInverse: ArrayLike<number>): TheisTypeCurve {
  const x = Float64Array.from(uInverse);
  const W = new Float64Array(x.length);
  for (let i = 0; i < x.length; i++) {
    checkScalar("theisTypeCurve", `1/u at index ${i}`, x[i]!, "1", true);
    W[i] = expint1(1 / x[i]!);
  }
  return { uInverse: x, W };
}
