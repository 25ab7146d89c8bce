/**
 * Dupuit-Thiem: steady radial flow to a fully penetrating well pumping at a constant rate from an unconfined
 * aquifer on a horizontal impermeable base, with the Dupuit assumptions (horizontal flow, gradient equal to
 * the slope of the water table):
 *
 *   H^2 - h(r)^2 = Q / (pi K) ln(R / r),   s(r) = H - sqrt(H^2 - Q ln(R / r) / (pi K)),
 *
 * with H the undisturbed saturated thickness (bound into the model), K the hydraulic conductivity and R the
 * radius of influence. Between two observation points R cancels: h2^2 - h1^2 = Q / (pi K) ln(r2 / r1).
 * For small drawdown (s << H) s -> Q ln(R / r) / (2 pi K H), the Thiem formula with T = K H.
 *
 * Sources: Dupuit, J. (1863). Etudes theoriques et pratiques sur le mouvement des eaux. Dunod, Paris;
 * Thiem, G. (1906). Hydrologische Methoden. Gebhardt, Leipzig.
 */
import { checkGeometry, checkParameters, checkScalar, outputArray } from "./checks.js";
import { ModelInputError } from "./errors.js";
import type { DrawdownModel, ObservationGeometry, ParameterDescriptor } from "./model.js";
import { radiusOfInfluenceParameter } from "./thiem.js";

/** Hydraulic conductivity K in m/d. */
export const hydraulicConductivityParameter: ParameterDescriptor = {
  name: "K",
  label: "hydraulic conductivity",
  unit: "m/d",
  positive: true,
  bounds: [1e-6, 1e4],
  description: "Horizontal hydraulic conductivity of the saturated zone.",
};

/** A Dupuit-Thiem model with its undisturbed saturated thickness bound in. */
export interface DupuitThiemModel extends DrawdownModel {
  /** Undisturbed saturated thickness H, m. */
  readonly saturatedThickness: number;
}

/**
 * Dupuit-Thiem steady unconfined model for undisturbed saturated thickness H (m, > 0); parameter vector
 * [K (m/d), R (m)]. Drawdown s = H - h in m, the same at every time. Where Q ln(R/r) / (pi K) >= H^2 the
 * formula has no real water level (the well would be dewatered) and the model gives NaN.
 * @throws ModelInputError for H <= 0.
 */
export function dupuitThiemModel(H: number): DupuitThiemModel {
  checkScalar("dupuitThiemModel", "saturated thickness H", H, "m", true);
  const model: DupuitThiemModel = {
    id: "dupuit-thiem",
    name: "Dupuit (1863) and Thiem (1906) steady unconfined flow",
    source:
      "Dupuit, J. (1863). Etudes theoriques et pratiques sur le mouvement des eaux dans les canaux decouverts et " +
      "a travers les terrains permeables. Dunod, Paris. Thiem, G. (1906). Hydrologische Methoden. Gebhardt, Leipzig.",
    assumptions: [
      "The aquifer is unconfined, homogeneous and isotropic on a horizontal impermeable base, with undisturbed " +
        "saturated thickness H.",
      "Flow is steady, horizontal and radial (Dupuit assumptions: the gradient equals the water-table slope).",
      "The well pumps at a constant rate and fully penetrates the saturated thickness; the head is undisturbed " +
        "at the radius of influence R.",
    ],
    validity: [
      "Observation distances r < R where Q ln(R/r) / (pi K) < H^2.",
      "The Dupuit water table lies below the true one close to the well (seepage face); use points farther " +
        "than about 1.5 H from the well (common practice, no source).",
    ],
    cautions: [
      "The model returns the same drawdown at every time: it describes the steady state only.",
      "R is not an aquifer property; a projection based on a fitted R holds only for the pumping duration that " +
        "produced it.",
      "Drawdown in the pumped well itself is larger than the Dupuit value (seepage face, well losses).",
    ],
    parameters: [hydraulicConductivityParameter, radiusOfInfluenceParameter],
    notSuperposable:
      "its drawdown is not proportional to the pumping rate (the Dupuit form is linear in h^2, not in s); superpose " +
      "H^2 - h^2 by hand, or use thiem for drawdowns small against H.",
    saturatedThickness: H,

    drawdown(p: ArrayLike<number>, geometry: ObservationGeometry, t: ArrayLike<number>, out?: Float64Array): Float64Array {
      checkParameters(model, p);
      checkGeometry(model.name, geometry);
      const result = outputArray(model.name, t.length, out);
      const lowering = (geometry.Q * Math.log(p[1]! / geometry.r)) / (Math.PI * p[0]!);
      const h2 = H * H - lowering;
      // s = H - sqrt(H^2 - a) written as a / (H + sqrt(H^2 - a)) so small drawdowns keep their digits.
      result.fill(h2 > 0 ? lowering / (H + Math.sqrt(h2)) : Number.NaN);
      return result;
    },

    jacobian(p: ArrayLike<number>, geometry: ObservationGeometry, t: ArrayLike<number>): Float64Array[] {
      checkParameters(model, p);
      checkGeometry(model.name, geometry);
      const K = p[0]!;
      const R = p[1]!;
      const a = (geometry.Q * Math.log(R / geometry.r)) / (Math.PI * K);
      const h = Math.sqrt(H * H - a);
      // s = H - sqrt(H^2 - a): ds/da = 1 / (2 h); da/dK = -a / K; da/dR = Q / (pi K R).
      const dK = h > 0 ? -a / (2 * h * K) : Number.NaN;
      const dR = h > 0 ? geometry.Q / (2 * h * Math.PI * K * R) : Number.NaN;
      return [new Float64Array(t.length).fill(dK), new Float64Array(t.length).fill(dR)];
    },
  };
  return model;
}

/**
 * Hydraulic conductivity K in m/d from steady water levels: saturated thicknesses h1, h2 (m above the base)
 * at distances r1, r2 (m) from a well pumping Q (m3/d): K = Q ln(r2/r1) / (pi (h2^2 - h1^2)).
 * Source: Dupuit (1863), Thiem (1906).
 * @throws ModelInputError when a value is not finite or positive, the distances are equal, or the levels do
 *   not rise away from the well (K <= 0).
 */
export function dupuitThiemTwoWells(Q: number, r1: number, h1: number, r2: number, h2: number): number {
  const where = "dupuitThiemTwoWells";
  checkScalar(where, "pumping rate Q", Q, "m3/d", true);
  checkScalar(where, "distance r1", r1, "m", true);
  checkScalar(where, "saturated thickness h1", h1, "m", true);
  checkScalar(where, "distance r2", r2, "m", true);
  checkScalar(where, "saturated thickness h2", h2, "m", true);
  if (r1 === r2) throw new ModelInputError(`${where}: both distances are ${r1} m; the two points must differ in r.`);
  const K = (Q * Math.log(r2 / r1)) / (Math.PI * (h2 * h2 - h1 * h1));
  if (!(K > 0) || !Number.isFinite(K)) {
    throw new ModelInputError(
      `${where}: water levels h1 = ${h1} m at r1 = ${r1} m and h2 = ${h2} m at r2 = ${r2} m do not rise away from ` +
        `the well (they give K = ${K.toPrecision(3)} m/d); give saturated thicknesses above the base, not drawdowns.`,
    );
  }
  return K;
}
