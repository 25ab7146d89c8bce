/**
 * Papadopulos and Cooper (1967): drawdown in and around a large-diameter well pumping at a constant rate
 * from a confined aquifer, with the water stored in the well casing, and an optional skin at the well face
 * in the form of Agarwal, Al-Hussainy and Ramey (1970).
 *
 * Laplace domain (p the Laplace variable in 1/d, q = sqrt(S p / T) in 1/m, x = q rw):
 *   A(p)    = Q / (p [2 pi T x K1(x) + pi rc^2 p (K0(x) + Sk x K1(x))])
 *   s_w(p)  = A (K0(x) + Sk x K1(x))        drawdown in the pumped well (r = rw)
 *   s(r, p) = A K0(q r)                      drawdown in the aquifer at r > rw
 * from the aquifer equation T (s'' + s'/r) = S p s, s -> 0 far away, the well balance
 * Q/p = 2 pi rw T (-ds/dr)(rw) + pi rc^2 p s_w, and the skin condition s_w = s(rw) - Sk rw (ds/dr)(rw).
 * In dimensionless form (C_D = rc^2 / (2 rw^2 S), p_D = p S rw^2 / T) the pumped-well expression is that of
 * Agarwal et al. (1970); with Sk = 0 it is the transform of Papadopulos and Cooper's (1967) solution, whose
 * real-integral form the fixture script checks against the transform to 1e-12 relative.
 * The inversion is Gaver-Stehfest (numerics/stehfest.ts) with N = 12 by default; accuracy in the doc of
 * `papadopulosCooperModel`.
 */
import { besselK0e, besselK1e } from "../special/index.js";
import { stehfestCoefficients } from "../numerics/index.js";
import { checkGeometry, checkParameters, checkScalar, outputArray } from "./checks.js";
import { ModelInputError } from "./errors.js";
import type { DrawdownModel, ObservationGeometry } from "./model.js";
import { storativityParameter, transmissivityParameter } from "./parameters.js";

/** Default number of Stehfest terms (see the accuracy figures in the doc of `papadopulosCooperModel`). */
export const PAPADOPULOS_COOPER_STEHFEST_TERMS = 12;

/** Relative tolerance within which an observation distance r counts as the well radius (pumped well). */
const SAME_RADIUS = 1e-9;

/** The well that the model is bound to, in base units. */
export interface WellboreGeometry {
  /** Inside radius of the casing over the range in which the water level moves, m (>= 0). */
  readonly rc: number;
  /** Effective radius of the well screen (or open hole), m (> 0). */
  readonly rw: number;
  /**
   * Dimensionless skin factor Sk >= 0 of a thin zone at the well face (Agarwal et al. 1970), default 0.
   * It adds Q Sk / (2 pi T) to the late drawdown in the pumped well and acts on observation points only by
   * delaying the flow out of storage.
   */
  readonly skin?: number;
  /** Stehfest terms N, even, 8 to 18; default 12. */
  readonly stehfestTerms?: number;
}

/** A Papadopulos-Cooper model bound to one well: a DrawdownModel with the well geometry it was made for. */
export interface PapadopulosCooperModel extends DrawdownModel {
  /** The bound geometry (skin and Stehfest terms filled in with their defaults). */
  readonly well: Required<WellboreGeometry>;
}

function checkWell(well: WellboreGeometry): Required<WellboreGeometry> {
  const where = "papadopulosCooperModel";
  checkScalar(where, "well radius rw", well.rw, "m", true);
  if (!(Number.isFinite(well.rc) && well.rc >= 0)) {
    throw new ModelInputError(
      `${where}: casing radius rc is ${well.rc} m; it must be a finite number >= 0 (the inside radius of the casing where the water level moves).`,
    );
  }
  const skin = well.skin ?? 0;
  if (!(Number.isFinite(skin) && skin >= 0)) {
    throw new ModelInputError(
      `${where}: skin is ${skin}; it must be a finite number >= 0. For a negative skin (a stimulated well) use ` +
        "an effective well radius rw * exp(-skin) with skin 0 instead.",
    );
  }
  const n = well.stehfestTerms ?? PAPADOPULOS_COOPER_STEHFEST_TERMS;
  if (!(Number.isInteger(n) && n % 2 === 0 && n >= 8 && n <= 18)) {
    throw new ModelInputError(
      `${where}: stehfestTerms is ${n}; use an even integer from 8 to 18 (12 is the tested default).`,
    );
  }
  return { rc: well.rc, rw: well.rw, skin, stehfestTerms: n };
}

/**
 * Drawdown in m at one time t (d) by Stehfest inversion of the transform in the module comment, for T (m2/d),
 * S (1), Q (m3/d), at distance r (m; r = rw within 1e-9 relative means the pumped well).
 */
function drawdownPoint(
  T: number,
  S: number,
  Q: number,
  r: number,
  pumped: boolean,
  well: Required<WellboreGeometry>,
  weights: Float64Array,
  t: number,
): number {
  const { rc, rw, skin } = well;
  const a = Math.LN2 / t;
  const storage = Math.PI * rc * rc;
  const twoPiT = 2 * Math.PI * T;
  const sOverT = S / T;
  let sum = 0;
  for (let k = 1; k <= weights.length; k++) {
    const p = k * a;
    const q = Math.sqrt(sOverT * p);
    const x = q * rw;
    // Exponentially scaled Bessel functions: the common factor e^x cancels between A and the well terms.
    const k1 = besselK1e(x);
    const face = besselK0e(x) + skin * x * k1;
    const denominator = p * (twoPiT * x * k1 + storage * p * face);
    const numerator = pumped ? face : besselK0e(q * r) * Math.exp(-q * (r - rw));
    sum += weights[k - 1]! * (numerator / denominator);
  }
  return Q * a * sum;
}

/**
 * Papadopulos-Cooper (1967) model of a large-diameter well, bound to the casing radius rc (m), well radius
 * rw (m) and optional skin Sk (Agarwal et al. 1970) of `well`; parameter vector [T (m2/d), S (1)].
 * The geometry's r is the distance of the observation point (m, >= rw); r = rw gives the drawdown in the
 * pumped well itself, which is where well-bore storage and skin matter most.
 *
 * Accuracy of the inversion against mpmath.invertlaplace of the same transform at 30 digits
 * (tests/fixtures/wellbore/wellbore.json, 46 points: pumped well with alpha = rw^2 S / rc^2 from 1e-7 to 0.1,
 * skin 0 to 5, observation points at 2 and 15 m, t from 1e-6 to 10 d), maximum relative error:
 * N = 10: 3.2e-4, N = 12 (default): 5.0e-5, N = 14: 1.8e-5, N = 16: 5.0e-6. The largest errors sit in the
 * bend between storage-dominated and Theis-like drawdown; early and late times are better than 3e-6.
 * N = 12 keeps the error far below any measured drawdown's and the cost at 12 evaluations of three real
 * Bessel functions per time. At observation points at very early time (u > 1, drawdown below 1e-3 of its
 * late value) Stehfest loses relative accuracy (1e-2 at u = 5), as it does for the Theis transform.
 * @throws ModelInputError for rc < 0, rw <= 0, skin < 0 or a bad number of terms.
 */
export function papadopulosCooperModel(well: WellboreGeometry): PapadopulosCooperModel {
  const bound = checkWell(well);
  const weights = stehfestCoefficients(bound.stehfestTerms);
  const model: PapadopulosCooperModel = {
    id: "papadopulos-cooper",
    name: "Papadopulos-Cooper (1967) large-diameter well with well-bore storage",
    source:
      "Papadopulos, I.S. and Cooper, H.H. Jr. (1967). Drawdown in a well of large diameter. Water Resources " +
      "Research 3(1), 241-244. Skin as in Agarwal, R.G., Al-Hussainy, R. and Ramey, H.J. Jr. (1970). An " +
      "investigation of wellbore storage and skin effect in unsteady liquid flow: I. Analytical treatment. " +
      "Society of Petroleum Engineers Journal 10(3), 279-290.",
    assumptions: [
      "The aquifer is confined, homogeneous, isotropic, of uniform thickness and infinite in areal extent.",
      "The well fully penetrates the aquifer and has a finite radius rw; flow to it is horizontal.",
      "The discharge Q is constant at the surface; part of it comes from the water stored in the casing of " +
        "radius rc, so the flow from the aquifer starts at zero and rises towards Q.",
      "Head losses at the well face are lumped into a thin skin of dimensionless factor Sk >= 0 with no " +
        "storage of its own (Sk = 0: no skin).",
      "The observation point, if not the pumped well, responds instantly: its own storage is neglected.",
    ],
    validity: [
      "Any time t > 0; at early time the pumped well follows pure casing storage s = Q t / (pi rc^2), at late " +
        "time the Theis solution at r = rw plus Q Sk / (2 pi T).",
      "Well-bore storage affects the pumped well for longer than the often quoted 25 rc^2 / T: there the " +
        "drawdown is still 1.9 % (alpha = rw^2 S / rc^2 = 0.1) to 3.2 % (alpha = 1e-7) below Theis at rw, and it " +
        "comes within 1 % at 46 to 58 rc^2 / T (by mpmath; see wellboreStorageTime); with skin the effect lasts " +
        "longer (alpha = 1e-3: 2.3 % at 25 rc^2 / T and 1 % at 54 rc^2 / T without skin, 2.6 % and 55 rc^2 / T " +
        "with Sk = 2).",
      "Numerical accuracy of the default inversion (N = 12 Stehfest terms) against mpmath: 5e-5 relative or " +
        "better at 46 tested points, up to 8.8e-5 in the pumped well near 25 rc^2 / T for alpha = 1e-7 (N = 16: " +
        "5.1e-6); at observation points where u > 1 the relative error grows (1e-2 at u = 5).",
    ],
    cautions: [
      "S from the pumped well is poorly determined: the early data are governed by rc, and the skin and " +
        "the unknown effective well radius trade off against S; prefer S from an observation well.",
      "The casing radius rc must be the radius where the water level moves (e.g. the pump column annulus " +
        "matters); a wrong rc shifts the storage period and biases T fitted to early data.",
      "Data within the storage-dominated period carry no information on T: they only confirm rc.",
    ],
    parameters: [transmissivityParameter, storativityParameter],
    well: bound,

    drawdown(p: ArrayLike<number>, geometry: ObservationGeometry, t: ArrayLike<number>, out?: Float64Array): Float64Array {
      checkParameters(model, p);
      checkGeometry(model.name, geometry);
      const r = geometry.r;
      if (r < bound.rw * (1 - SAME_RADIUS)) {
        throw new ModelInputError(
          `${model.name}: radial distance r = ${r} m is inside the well (rw = ${bound.rw} m); use r = rw for the ` +
            "pumped well or the distance of an observation point outside it.",
        );
      }
      const pumped = r <= bound.rw * (1 + SAME_RADIUS);
      const T = p[0]!;
      const S = p[1]!;
      const result = outputArray(model.name, t.length, out);
      for (let i = 0; i < t.length; i++) {
        const ti = t[i]!;
        result[i] = ti > 0 && Number.isFinite(ti)
          ? drawdownPoint(T, S, geometry.Q, pumped ? bound.rw : r, pumped, bound, weights, ti)
          : ti <= 0 ? 0 : Number.NaN;
      }
      return result;
    },
  };
  return model;
}

/**
 * Papadopulos-Cooper drawdown in m at one time t (d), for T (m2/d), S (1), Q (m3/d), distance r (m; r = rw
 * for the pumped well) and the well `well` (rc, rw in m, optional skin). Source: Papadopulos and Cooper (1967).
 */
export function papadopulosCooperDrawdown(
  T: number,
  S: number,
  Q: number,
  r: number,
  t: number,
  well: WellboreGeometry,
): number {
  return papadopulosCooperModel(well).drawdown([T, S], { r, Q }, [t])[0]!;
}

/**
 * The Papadopulos-Cooper well function of the pumped well, F(u_w, alpha) = 4 pi T s_w / Q (dimensionless),
 * with u_w = rw^2 S / (4 T t) > 0 and alpha = rw^2 S / rc^2 > 0, optionally with skin Sk >= 0.
 * Plotted against 1/u_w it gives the family of type curves, one per alpha. Computed as the model drawdown
 * with T = 1, Q = 1, rw = rc = 1, S = alpha, t = alpha / (4 u_w). Source: Papadopulos and Cooper (1967).
 */
export function papadopulosCooperF(u: number, alpha: number, skin = 0): number {
  checkScalar("papadopulosCooperF", "u", u, "1", true);
  checkScalar("papadopulosCooperF", "alpha", alpha, "1", true);
  const model = papadopulosCooperModel({ rc: 1, rw: 1, skin });
  return 4 * Math.PI * model.drawdown([1, alpha], { r: 1, Q: 1 }, [alpha / (4 * u)])[0]!;
}
