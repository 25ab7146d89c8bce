/**
 * Theis (1935) drawdown beside one straight no-flow (barrier) boundary, by one image well (Ferris et al. 1962),
 * with the distance from the observation point to the image well as a fitted parameter:
 *
 *   s = Q / (4 pi T) [W(u) + W(u_i)],   u = r^2 S / (4 T t),   u_i = r_i^2 S / (4 T t),
 *
 * W = E1. The image of the pumping well across the barrier pumps at the same rate, so the late-time
 * Cooper-Jacob slope doubles. Fitting r_i locates the image on a circle of radius r_i about the observation
 * point; where the boundary lies then follows from the direction of the boundary (mapped) or from a second
 * observation point. Sources: Theis, C.V. (1935), Trans. AGU 16(2), 519-524; Ferris, J.G., Knowles, D.B.,
 * Brown, R.H. and Stallman, R.W. (1962), Theory of aquifer tests, USGS Water-Supply Paper 1536-E.
 */
import { expint1 } from "../special/index.js";
import { checkGeometry, checkParameters, outputArray } from "./checks.js";
import type { DrawdownModel, ObservationGeometry, ParameterDescriptor } from "./model.js";
import { storativityParameter, transmissivityParameter } from "./parameters.js";
import { portableCos, portableSin } from "../numerics/portable-math.js";

const FOUR_PI = 4 * Math.PI;

/** Distance r_i from the observation point to the image well, m. */
export const imageDistanceParameter: ParameterDescriptor = {
  name: "ri",
  label: "distance to the image well",
  unit: "m",
  positive: true,
  bounds: [0.1, 1e6],
  description:
    "Distance from the observation point to the image of the pumping well across the barrier; twice the " +
    "distance from the pumping well to the barrier when the observation point is the pumping well itself.",
  atBound: { upper: "no barrier detected: within this record the drawdown shows no boundary" },
};

/** Theis with one no-flow image well; parameter vector [T (m2/d), S (1), ri (m)]. */
export const theisBarrierImageModel: DrawdownModel = {
  id: "theis-barrier-image",
  name: "Theis (1935) with one barrier image well (Ferris et al. 1962)",
  source:
    "Theis, C.V. (1935). The relation between the lowering of the piezometric surface and the rate and " +
    "duration of discharge of a well using ground-water storage. Transactions, American Geophysical Union " +
    "16(2), 519-524. Image wells: Ferris, J.G., Knowles, D.B., Brown, R.H. and Stallman, R.W. (1962). Theory " +
    "of aquifer tests. U.S. Geological Survey Water-Supply Paper 1536-E.",
  assumptions: [
    "All assumptions of the Theis (1935) solution inside the aquifer: confined, homogeneous, isotropic, of uniform thickness; constant rate; fully penetrating well of infinitesimal radius.",
    "The aquifer ends at one straight, fully penetrating no-flow boundary (a fault against impermeable rock, the edge of a buried channel); beyond it nothing is drawn.",
    "The barrier is replaced by an image of the pumping well, mirrored across it and pumping at the same rate.",
  ],
  validity: [
    "All t > 0 and ri >= r (the image lies beyond the barrier, farther from an observation point on the aquifer's side than the pumping well).",
    "The fitted ri is determined only once the image's drawdown has reached the observation point: roughly t > ri^2 S / (4 T) (u_i below about 1), and it is well determined when the record runs a log cycle beyond that.",
    "One observation point gives ri, a circle of possible image positions; the barrier's position needs its direction (a mapped fault) or a second observation point.",
  ],
  cautions: [
    "A steepening of the late drawdown is also produced by a lower-transmissivity zone, a second barrier, a leaky layer that stops leaking or a rate that crept up; a barrier is an interpretation, to be backed by the geology.",
    "A fitted ri is an effective distance: a boundary that is not straight, not sharp or not fully penetrating gives a distance that fits this record and may mislead forecasts for longer pumping.",
    "T and S are fitted from the same record and correlate with ri; report ri with its interval and forecast with the parameter uncertainty.",
  ],
  parameters: [transmissivityParameter, storativityParameter, imageDistanceParameter],

  drawdown(p: ArrayLike<number>, geometry: ObservationGeometry, t: ArrayLike<number>, out?: Float64Array): Float64Array {
    checkParameters(theisBarrierImageModel, p);
    checkGeometry(theisBarrierImageModel.name, geometry);
    const T = p[0]!;
    const S = p[1]!;
    const ri = p[2]!;
    const result = outputArray(theisBarrierImageModel.name, t.length, out);
    const coef = geometry.Q / (FOUR_PI * T);
    const a = (geometry.r * geometry.r * S) / (4 * T);
    const ai = (ri * ri * S) / (4 * T);
    for (let i = 0; i < t.length; i++) {
      const ti = t[i]!;
      result[i] = ti > 0 ? coef * (expint1(a / ti) + expint1(ai / ti)) : ti <= 0 ? 0 : Number.NaN;
    }
    return result;
  },

  jacobian(p: ArrayLike<number>, geometry: ObservationGeometry, t: ArrayLike<number>): Float64Array[] {
    checkParameters(theisBarrierImageModel, p);
    checkGeometry(theisBarrierImageModel.name, geometry);
    const T = p[0]!;
    const S = p[1]!;
    const ri = p[2]!;
    const dT = new Float64Array(t.length);
    const dS = new Float64Array(t.length);
    const dRi = new Float64Array(t.length);
    const coef = geometry.Q / (FOUR_PI * T);
    const a = (geometry.r * geometry.r * S) / (4 * T);
    const ai = (ri * ri * S) / (4 * T);
    for (let i = 0; i < t.length; i++) {
      const ti = t[i]!;
      if (ti > 0) {
        // With dW/du = -exp(-u)/u and u proportional to S/T and to r^2:
        // ds/dln T = -s + coef (e^-u + e^-ui), ds/dln S = -coef (e^-u + e^-ui), ds/dln ri = -2 coef e^-ui.
        const u = a / ti;
        const ui = ai / ti;
        const s = coef * (expint1(u) + expint1(ui));
        const g = coef * (Math.exp(-u) + Math.exp(-ui));
        dT[i] = (g - s) / T;
        dS[i] = -g / S;
        dRi[i] = (-2 * coef * Math.exp(-ui)) / ri;
      } else if (!(ti <= 0)) {
        dT[i] = Number.NaN;
        dS[i] = Number.NaN;
        dRi[i] = Number.NaN;
      }
    }
    return [dT, dS, dRi];
  },
};

/**
 * Perpendicular distance (m) from a pumping well at the origin to a straight boundary whose normal points
 * from the well at `angleDeg` (degrees counter-clockwise from +x), given the observation point (x, y) in m and
 * the fitted distance ri (m) from it to the image well. The image lies at 2 d (cos a, sin a), so
 * |2 d n - o|^2 = ri^2, a quadratic in d; the root that keeps the observation point on the well's side of the
 * boundary (n . o < d) is returned. NaN when no such root exists (ri too short for that direction).
 * Source: the image construction of Ferris et al. (1962); the algebra is elementary.
 */
export function barrierDistanceFromImage(x: number, y: number, angleDeg: number, ri: number): number {
  const a = (angleDeg * Math.PI) / 180;
  const along = x * portableCos(a) + y * portableSin(a);
  const disc = along * along - (x * x + y * y - ri * ri);
  if (!(disc >= 0) || !(ri > 0)) return Number.NaN;
  const d = (along + Math.sqrt(disc)) / 2;
  return d > along && d > 0 ? d : Number.NaN;
}
