/**
 * Hantush (1961): drawdown around a partially penetrating well pumping at a constant rate from a confined,
 * homogeneous aquifer of thickness b with anisotropy Kz/Kr. The well is screened from depth d to depth l
 * below the top of the aquifer; the observation point is a piezometer at depth z or an observation well
 * screened from z1 to z2 (all depths measured downwards from the top of the aquifer).
 *
 *   s = Q / (4 pi T) [W(u) + f],  u = r^2 S / (4 T t),  beta_n = n pi (r / b) sqrt(Kz/Kr),
 *   f = sum_{n>=1} c_n W(u, beta_n)   with W(u, beta) the Hantush-Jacob leaky well function,
 *   piezometer:          c_n = 2 b / (pi n (l - d)) [sin(n pi l/b) - sin(n pi d/b)] cos(n pi z/b),
 *   observation screen:  c_n = 2 b^2 / (pi^2 n^2 (l - d)(z2 - z1)) [sin(n pi l/b) - sin(n pi d/b)]
 *                                                                  [sin(n pi z2/b) - sin(n pi z1/b)].
 * Source: Hantush, M.S. (1961), J. Hydraul. Div. ASCE 87(HY4), 83-98 (the series form; the observation-well
 * form averages the piezometer form over z1..z2). The fixture script checks the series against an image-source
 * line-source integral to 1e-8 relative (it agreed to 1e-15).
 */
import { expint1 } from "../special/index.js";
import { checkGeometry, checkParameters, checkScalar, outputArray } from "./checks.js";
import { ModelInputError } from "./errors.js";
import type { DrawdownModel, ObservationGeometry, ParameterDescriptor } from "./model.js";
import { storativityParameter, transmissivityParameter } from "./parameters.js";
import { penetrationLeakyW, penetrationLeakyWdBeta, penetrationLeakyWdU } from "./penetration-leaky-function.js";
import { portableCos, portableSin } from "../numerics/portable-math.js";

const FOUR_PI = 4 * Math.PI;
/** Default bound on the truncation error of the series, relative to W(u). */
export const PARTIAL_PENETRATION_TOLERANCE = 1e-10;
/** Most series terms before the model reports that it cannot reach the tolerance. */
const MAX_TERMS = 200000;

/** Anisotropy Kz/Kr as a fitted parameter (when the geometry does not fix it). */
export const anisotropyParameter: ParameterDescriptor = {
  name: "KzKr",
  label: "anisotropy Kz/Kr",
  unit: "1",
  positive: true,
  bounds: [1e-4, 10],
  description: "Ratio of vertical to horizontal hydraulic conductivity of the aquifer.",
};

/** Where the drawdown is observed: a piezometer at one depth, or an observation well screened over a range. */
export type PenetrationObservation =
  | { readonly depth: number }
  | { readonly screenTop: number; readonly screenBottom: number };

/** The aquifer and well geometry the model is bound to; depths in m below the top of the aquifer. */
export interface PartialPenetrationGeometry {
  /** Saturated thickness of the aquifer b, m. */
  readonly thickness: number;
  /** Top d and bottom l of the pumping well's screen, m below the top of the aquifer, 0 <= d < l <= b. */
  readonly screenTop: number;
  readonly screenBottom: number;
  /** Observation point: piezometer depth z, or observation screen z1..z2 (0 <= z1 < z2 <= b). */
  readonly observation: PenetrationObservation;
  /** Kz/Kr when known; when omitted it becomes the third parameter "KzKr". */
  readonly anisotropy?: number;
  /** Bound on the series truncation error relative to W(u); default 1e-10. */
  readonly tolerance?: number;
}

/** A partial-penetration model bound to its geometry. */
export interface PartialPenetrationModel extends DrawdownModel {
  readonly geometry: PartialPenetrationGeometry;
}

/** The series coefficients of a geometry (exported for the leaky form, hantush-leaky-penetration.ts). */
export interface Coefficients {
  /** c_n for n = 1.. computed lazily up to the length needed. */
  readonly at: (n: number) => number;
  /** Upper bound of |c_n| times n^power. */
  readonly envelope: number;
  readonly power: 1 | 2;
  /** True when every c_n is 0 (full penetration). */
  readonly zero: boolean;
}

/** Checks the depths, anisotropy and tolerance of a geometry; messages name `where`. */
export function checkDepths(g: PartialPenetrationGeometry, where = "partialPenetrationModel"): void {
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
  if ("depth" in o) {
    if (!(Number.isFinite(o.depth) && o.depth >= 0 && o.depth <= b)) {
      throw new ModelInputError(
        `${where}: piezometer depth is ${o.depth} m; it must lie between 0 and the thickness ${b} m (below the top of the aquifer).`,
      );
    }
  } else {
    range("the observation well screen", o.screenTop, o.screenBottom);
  }
  if (g.anisotropy !== undefined) checkScalar(where, "anisotropy Kz/Kr", g.anisotropy, "1", true);
  const tol = g.tolerance ?? PARTIAL_PENETRATION_TOLERANCE;
  if (!(tol >= 1e-15 && tol < 1)) {
    throw new ModelInputError(`${where}: tolerance is ${tol}; it must lie in [1e-15, 1).`);
  }
}

/** c_n of the module comment for a checked geometry. */
export function coefficients(g: PartialPenetrationGeometry): Coefficients {
  const b = g.thickness;
  const d = g.screenTop;
  const l = g.screenBottom;
  const k = Math.PI / b;
  const zero = d === 0 && l === b;
  const o = g.observation;
  if ("depth" in o) {
    const scale = (2 * b) / (Math.PI * (l - d));
    return {
      at: (n) => (scale / n) * (portableSin(n * k * l) - portableSin(n * k * d)) * portableCos(n * k * o.depth),
      envelope: 2 * scale,
      power: 1,
      zero,
    };
  }
  const z1 = o.screenTop;
  const z2 = o.screenBottom;
  const scale = (2 * b * b) / (Math.PI * Math.PI * (l - d) * (z2 - z1));
  return {
    at: (n) => (scale / (n * n)) * (portableSin(n * k * l) - portableSin(n * k * d)) * (portableSin(n * k * z2) - portableSin(n * k * z1)),
    envelope: 4 * scale,
    power: 2,
    zero: zero || (z1 === 0 && z2 === b),
  };
}

/** Sum of the series f (and its derivatives in u, beta_1 and r/B when asked) with the truncation rule below. */
export interface SeriesValue {
  f: number;
  dfdu: number;
  dfdBeta1: number;
  /** Derivative in r/B (0 without leakage). */
  dfdRB: number;
  terms: number;
}

/**
 * Sums f = sum c_n W(u, n beta1). Stopping rule: with e_n = envelope / n^power * W(u, n beta1) bounding the
 * n-th term and rho = max(W_n / W_{n-1}, exp(-beta1)) (W decreases in beta; at late time
 * W -> 2 K0 and K0(beta + beta1) / K0(beta) < exp(-beta1)), the tail is estimated as e_n rho / (1 - rho),
 * and the sum stops once that is below tol * W(u). Checked against mpmath (series to 1e-18) in the tests.
 * With leakage (rB = r/B > 0, Hantush 1964) the terms are W(u, beta_n), beta_n = sqrt(rB^2 + n^2 beta1^2), the
 * target is tol * W(u, rB) and the floor of rho is exp(-(beta_n - beta_(n-1))), whose increments grow with n.
 */
export function sumSeries(
  u: number,
  beta1: number,
  c: Coefficients,
  tol: number,
  derivatives: boolean,
  where: string,
  rB = 0,
): SeriesValue {
  const leaky = rB > 0;
  const target = tol * (leaky ? penetrationLeakyW(u, rB) : expint1(u));
  const floorRho = Math.exp(-beta1);
  let f = 0;
  let dfdu = 0;
  let dfdBeta1 = 0;
  let dfdRB = 0;
  let previousW = Number.NaN;
  let previousBeta = rB;
  for (let n = 1; n <= MAX_TERMS; n++) {
    const beta = leaky ? Math.sqrt(rB * rB + n * n * beta1 * beta1) : n * beta1;
    const w = penetrationLeakyW(u, beta);
    const cn = c.at(n);
    f += cn * w;
    if (derivatives) {
      dfdu += cn * penetrationLeakyWdU(u, beta);
      const wb = penetrationLeakyWdBeta(u, beta);
      if (leaky) {
        dfdBeta1 += (cn * wb * n * n * beta1) / beta;
        dfdRB += (cn * wb * rB) / beta;
      } else {
        dfdBeta1 += cn * n * wb;
      }
    }
    if (w === 0) return { f, dfdu, dfdBeta1, dfdRB, terms: n };
    if (n > 1) {
      const rho = Math.max(w / previousW, leaky ? Math.exp(-(beta - previousBeta)) : floorRho);
      const bound = (c.envelope / (c.power === 1 ? n : n * n)) * w;
      if (rho < 1 && (bound * rho) / (1 - rho) < target) return { f, dfdu, dfdBeta1, dfdRB, terms: n };
    }
    previousW = w;
    previousBeta = beta;
  }
  throw new ModelInputError(
    `${where}: the partial-penetration series did not reach the tolerance ${tol} in ${MAX_TERMS} terms ` +
      `(r sqrt(Kz/Kr) / b = ${(beta1 / Math.PI).toPrecision(3)} is very small); loosen the tolerance or check r and the anisotropy.`,
  );
}

/**
 * Hantush (1961) partial-penetration model bound to `geometry` (thickness b, pumping screen d..l,
 * piezometer depth z or observation screen z1..z2, all m below the top of the aquifer; Kz/Kr fixed or fitted).
 * Parameter vector [T (m2/d), S (1)] when `anisotropy` is given, [T, S, KzKr (1)] when it is not.
 * Accuracy: the series is truncated when its estimated tail is below `tolerance` (default 1e-10) times
 * W(u); against mpmath on 24 fixture points the error of f was at most 2.5e-11 W(u) (s to 1e-11 relative
 * wherever s is not much smaller than Q W(u) / (4 pi T)). Full penetration (d = 0, l = b, or an observation screen over the full thickness) gives
 * the Theis drawdown exactly. Analytic Jacobian: yes.
 * @throws ModelInputError for depths outside the aquifer or an empty screen.
 */
export function partialPenetrationModel(geometry: PartialPenetrationGeometry): PartialPenetrationModel {
  checkDepths(geometry);
  const c = coefficients(geometry);
  const tol = geometry.tolerance ?? PARTIAL_PENETRATION_TOLERANCE;
  const fixedAnisotropy = geometry.anisotropy;
  const parameters =
    fixedAnisotropy === undefined
      ? [transmissivityParameter, storativityParameter, anisotropyParameter]
      : [transmissivityParameter, storativityParameter];
  const b = geometry.thickness;

  const model: PartialPenetrationModel = {
    id: "hantush-partial-penetration",
    name: "Hantush (1961) partially penetrating well in a confined aquifer",
    source:
      "Hantush, M.S. (1961). Drawdown around a partially penetrating well. Journal of the Hydraulics " +
      "Division, Proceedings of the American Society of Civil Engineers 87(HY4), 83-98.",
    assumptions: [
      "The aquifer is confined, homogeneous, of uniform thickness b and infinite in areal extent, with " +
        "horizontal conductivity Kr and vertical conductivity Kz; its top and base are impermeable.",
      "The well pumps at a constant rate, with the flow into the screen uniform along it (from depth d to " +
        "l below the top of the aquifer); its radius is infinitesimal and storage in it is neglected.",
      "The observation point is a piezometer at depth z or a well screened from z1 to z2 whose drawdown is " +
        "the average over its screen.",
    ],
    validity: [
      "All u = r^2 S / (4 T t) > 0. Beyond r = 1.5 b sqrt(Kr/Kz) partial penetration is usually neglected " +
        "(common practice, no source); measured there over short and long screens, all depths, Kz/Kr 0.01 to 1: " +
        "|f| <= 0.021, which is <= 0.5 % of W(u) for u <= 0.01 but up to 9 % at u = 1 (short screen, " +
        "piezometer level with it).",
      "At late time the correction approaches the constant f = sum 2 c_n K0(beta_n) and s follows the Theis " +
        "curve shifted by Q f / (4 pi T); the Cooper-Jacob slope gives T unaffected. The criterion t > b^2 S / " +
        "(2 T) (Kr/Kz) (Hantush 1961, from memory), measured by mpmath over 7 geometries: at that time f is " +
        "within 1.4 % of the constant (0.15 % of the drawdown), at three times that within 4e-7.",
      "The series needs more terms as r sqrt(Kz/Kr) / b becomes small (about 1 / (that ratio) terms).",
    ],
    cautions: [
      "Kz/Kr and S trade off against each other in a fit to one observation point; fix Kz/Kr from other " +
        "evidence or use several piezometers at different depths.",
      "A uniform-flux screen is assumed; real screens with large well losses or gravel packs spread the " +
        "inflow differently near the well.",
      "In a water-table aquifer the early drawdown also reflects delayed yield; this model does not.",
    ],
    parameters,
    geometry,

    drawdown(p: ArrayLike<number>, g: ObservationGeometry, t: ArrayLike<number>, out?: Float64Array): Float64Array {
      checkParameters(model, p);
      checkGeometry(model.name, g);
      const T = p[0]!;
      const S = p[1]!;
      const anisotropy = fixedAnisotropy ?? p[2]!;
      const beta1 = (Math.PI * g.r * Math.sqrt(anisotropy)) / b;
      const result = outputArray(model.name, t.length, out);
      const coef = g.Q / (FOUR_PI * T);
      const uTimesT = (g.r * g.r * S) / (4 * T);
      for (let i = 0; i < t.length; i++) {
        const ti = t[i]!;
        if (ti > 0 && Number.isFinite(ti)) {
          const u = uTimesT / ti;
          const f = c.zero ? 0 : sumSeries(u, beta1, c, tol, false, model.name).f;
          result[i] = coef * (expint1(u) + f);
        } else {
          result[i] = ti <= 0 ? 0 : Number.NaN;
        }
      }
      return result;
    },

    jacobian(p: ArrayLike<number>, g: ObservationGeometry, t: ArrayLike<number>): Float64Array[] {
      checkParameters(model, p);
      checkGeometry(model.name, g);
      const T = p[0]!;
      const S = p[1]!;
      const anisotropy = fixedAnisotropy ?? p[2]!;
      const beta1 = (Math.PI * g.r * Math.sqrt(anisotropy)) / b;
      const dT = new Float64Array(t.length);
      const dS = new Float64Array(t.length);
      const dA = new Float64Array(t.length);
      const coef = g.Q / (FOUR_PI * T);
      const uTimesT = (g.r * g.r * S) / (4 * T);
      for (let i = 0; i < t.length; i++) {
        const ti = t[i]!;
        if (ti > 0 && Number.isFinite(ti)) {
          // s = coef (W(u) + f(u, beta1)); du/dT = -u/T, du/dS = u/S, dbeta1/dKzKr = beta1 / (2 KzKr).
          const u = uTimesT / ti;
          const series = c.zero ? { f: 0, dfdu: 0, dfdBeta1: 0, dfdRB: 0, terms: 0 } : sumSeries(u, beta1, c, tol, true, model.name);
          const s = coef * (expint1(u) + series.f);
          const uDsDu = coef * u * (-Math.exp(-u) / u + series.dfdu);
          dT[i] = (-s - uDsDu) / T;
          dS[i] = uDsDu / S;
          dA[i] = (coef * series.dfdBeta1 * beta1) / (2 * anisotropy);
        } else if (!(ti <= 0)) {
          dT[i] = Number.NaN;
          dS[i] = Number.NaN;
          dA[i] = Number.NaN;
        }
      }
      return fixedAnisotropy === undefined ? [dT, dS, dA] : [dT, dS];
    },
  };
  return model;
}

/**
 * The partial-penetration correction f (dimensionless) of Hantush (1961) at u = r^2 S / (4 T t) > 0, for a
 * point at distance r (m) in the geometry `geometry` (its anisotropy required here), so that
 * s = Q / (4 pi T) (W(u) + f). Truncation error below geometry.tolerance (default 1e-10) times W(u).
 */
export function partialPenetrationCorrection(u: number, r: number, geometry: PartialPenetrationGeometry): number {
  checkDepths(geometry);
  checkScalar("partialPenetrationCorrection", "u", u, "1", true);
  checkScalar("partialPenetrationCorrection", "radial distance r", r, "m", true);
  if (geometry.anisotropy === undefined) {
    throw new ModelInputError("partialPenetrationCorrection: give geometry.anisotropy (Kz/Kr); it is needed to evaluate f.");
  }
  const c = coefficients(geometry);
  if (c.zero) return 0;
  const beta1 = (Math.PI * r * Math.sqrt(geometry.anisotropy)) / geometry.thickness;
  return sumSeries(u, beta1, c, geometry.tolerance ?? PARTIAL_PENETRATION_TOLERANCE, false, "partialPenetrationCorrection").f;
}

/**
 * Distance beyond which partial penetration is usually neglected, 1.5 b sqrt(Kr/Kz) in m, for thickness b (m)
 * and anisotropy Kz/Kr (common practice, no source; the correction measured there is stated in the model's
 * validity notes).
 */
export function partialPenetrationNegligibleDistance(thickness: number, anisotropy: number): number {
  checkScalar("partialPenetrationNegligibleDistance", "aquifer thickness", thickness, "m", true);
  checkScalar("partialPenetrationNegligibleDistance", "anisotropy Kz/Kr", anisotropy, "1", true);
  return 1.5 * thickness / Math.sqrt(anisotropy);
}
