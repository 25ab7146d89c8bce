/**
 * Hantush (1964): drawdown around a partially penetrating well pumping at a constant rate from a leaky aquifer
 * (an aquitard without storage over it, leaking from an unpumped layer at constant head, as in Hantush-Jacob
 * 1955), homogeneous, of thickness b, with anisotropy Kz/Kr. Depths are measured downwards from the top of the
 * aquifer: pumping screen d..l, piezometer at z or observation screen z1..z2.
 *
 *   s = Q / (4 pi T) [W(u, r/B) + sum_{n>=1} c_n W(u, sqrt((r/B)^2 + beta_n^2))],
 *   u = r^2 S / (4 T t),  beta_n = n pi (r / b) sqrt(Kz/Kr),
 *
 * with W(u, beta) the Hantush-Jacob leaky well function and c_n the coefficients of Hantush (1961) (see
 * partial-penetration.ts): each vertical mode of the confined series leaks like the fully penetrating aquifer,
 * its radial decay sqrt((r/B)^2 + beta_n^2) combining leakage and vertical flow. B -> infinity gives Hantush
 * (1961); a full screen gives Hantush-Jacob (1955).
 * Source: Hantush, M.S. (1964). Hydraulics of wells. In: Chow, V.T. (ed.), Advances in Hydroscience 1,
 * Academic Press, New York, 281-432. Checked (models-hantush-leaky-penetration.test.ts) against an mpmath
 * evaluation of this formula from the integral definition of W(u, beta) (tests/fixtures/leaky-penetration) and
 * against the Laplace-domain vertical-mode series of Dougherty and Babu (1984) in its line-source limit.
 */
import { checkGeometry, checkParameters, outputArray } from "./checks.js";
import { leakageFactorParameter } from "./hantush-jacob.js";
import type { DrawdownModel, ObservationGeometry } from "./model.js";
import { storativityParameter, transmissivityParameter } from "./parameters.js";
import {
  anisotropyParameter,
  checkDepths,
  coefficients,
  PARTIAL_PENETRATION_TOLERANCE,
  sumSeries,
  type PartialPenetrationGeometry,
} from "./partial-penetration.js";
import { penetrationLeakyW, penetrationLeakyWdBeta, penetrationLeakyWdU } from "./penetration-leaky-function.js";

const FOUR_PI = 4 * Math.PI;

/** A leaky partial-penetration model bound to its geometry. */
export interface LeakyPartialPenetrationModel extends DrawdownModel {
  readonly geometry: PartialPenetrationGeometry;
}

/**
 * Hantush (1964) leaky partial-penetration model bound to `geometry` (as partialPenetrationModel: thickness b,
 * pumping screen d..l, piezometer depth or observation screen, m below the top of the aquifer; Kz/Kr fixed or
 * fitted). Parameter vector [T (m2/d), S (1), B (m)] followed by KzKr (1) when `anisotropy` is omitted.
 * Drawdown in m at times in d; analytic Jacobian. The series is truncated when its estimated tail is below
 * `tolerance` (default 1e-10) times W(u, r/B). Source and checks: module comment.
 * @throws ModelInputError for depths outside the aquifer or an empty screen.
 */
export function hantushLeakyPartialPenetrationModel(geometry: PartialPenetrationGeometry): LeakyPartialPenetrationModel {
  const where = "hantushLeakyPartialPenetrationModel";
  checkDepths(geometry, where);
  const c = coefficients(geometry);
  const tol = geometry.tolerance ?? PARTIAL_PENETRATION_TOLERANCE;
  const fixedAnisotropy = geometry.anisotropy;
  const parameters = [transmissivityParameter, storativityParameter, leakageFactorParameter];
  if (fixedAnisotropy === undefined) parameters.push(anisotropyParameter);
  const b = geometry.thickness;
  const none = { f: 0, dfdu: 0, dfdBeta1: 0, dfdRB: 0, terms: 0 };

  const model: LeakyPartialPenetrationModel = {
    id: "hantush-leaky-partial-penetration",
    name: "Hantush (1964) partially penetrating well in a leaky aquifer",
    source:
      "Hantush, M.S. (1964). Hydraulics of wells. In: Chow, V.T. (ed.), Advances in Hydroscience, vol. 1, " +
      "Academic Press, New York, 281-432 (leaky aquifer, partially penetrating well). Leakage as in Hantush, M.S. " +
      "and Jacob, C.E. (1955), Transactions AGU 36(1), 95-100; the series of Hantush, M.S. (1961), J. Hydraul. " +
      "Div. ASCE 87(HY4), 83-98.",
    assumptions: [
      "The aquifer is homogeneous, of uniform thickness b and infinite in areal extent, with horizontal and " +
        "vertical conductivities Kr and Kz, on an impermeable base.",
      "It is overlain by an aquitard without storage through which water leaks from an unpumped layer whose head " +
        "stays constant; the leakage is vertical and proportional to the drawdown (leakage factor B = sqrt(T b'/K')).",
      "The well pumps at a constant rate with uniform flux along its screen (depth d to l below the top of the " +
        "aquifer); its radius is infinitesimal and storage in it is neglected.",
      "The observation point is a piezometer at depth z or a well screened from z1 to z2 whose drawdown is the " +
        "average over its screen.",
    ],
    validity: [
      "All u = r^2 S / (4 T t) > 0 at observation points (r > 0); not for the drawdown inside the pumped well.",
      "The leakage enters at the top of the aquifer in the real system while the formula spreads it over the " +
        "thickness mode by mode, as Hantush did; close to a screen at the top this differs from a model that " +
        "places the leakage at the boundary.",
      "Late time: W(u, beta) -> 2 K0(beta), so s levels off at Q / (2 pi T) [K0(r/B) + sum_n c_n K0(sqrt((r/B)^2 + beta_n^2))].",
    ],
    cautions: [
      "B, Kz/Kr and S trade off in a fit to one piezometer; fix the anisotropy from other evidence or use several " +
        "depths and distances.",
      "A flattening curve is also produced by a recharge boundary or delayed yield; the interpretation needs the geology.",
      "Leakage from an aquitard that stores water (Hantush 1960) is not represented; early data of such a test " +
        "deviate from this model.",
    ],
    parameters,
    geometry,

    drawdown(p: ArrayLike<number>, g: ObservationGeometry, t: ArrayLike<number>, out?: Float64Array): Float64Array {
      checkParameters(model, p);
      checkGeometry(model.name, g);
      const T = p[0]!;
      const S = p[1]!;
      const rB = g.r / p[2]!;
      const anisotropy = fixedAnisotropy ?? p[3]!;
      const beta1 = (Math.PI * g.r * Math.sqrt(anisotropy)) / b;
      const result = outputArray(model.name, t.length, out);
      const coef = g.Q / (FOUR_PI * T);
      const uTimesT = (g.r * g.r * S) / (4 * T);
      for (let i = 0; i < t.length; i++) {
        const ti = t[i]!;
        if (ti > 0 && Number.isFinite(ti)) {
          const u = uTimesT / ti;
          const f = c.zero ? 0 : sumSeries(u, beta1, c, tol, false, model.name, rB).f;
          result[i] = coef * (penetrationLeakyW(u, rB) + f);
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
      const B = p[2]!;
      const rB = g.r / B;
      const anisotropy = fixedAnisotropy ?? p[3]!;
      const beta1 = (Math.PI * g.r * Math.sqrt(anisotropy)) / b;
      const dT = new Float64Array(t.length);
      const dS = new Float64Array(t.length);
      const dB = new Float64Array(t.length);
      const dA = new Float64Array(t.length);
      const coef = g.Q / (FOUR_PI * T);
      const uTimesT = (g.r * g.r * S) / (4 * T);
      for (let i = 0; i < t.length; i++) {
        const ti = t[i]!;
        if (ti > 0 && Number.isFinite(ti)) {
          // s = coef (W(u, rB) + f); du/dT = -u/T, du/dS = u/S, d rB/dB = -rB/B, d beta1/dKzKr = beta1/(2 KzKr).
          const u = uTimesT / ti;
          const series = c.zero ? none : sumSeries(u, beta1, c, tol, true, model.name, rB);
          const s = coef * (penetrationLeakyW(u, rB) + series.f);
          const uDsDu = coef * u * (penetrationLeakyWdU(u, rB) + series.dfdu);
          dT[i] = (-s - uDsDu) / T;
          dS[i] = uDsDu / S;
          dB[i] = (coef * (penetrationLeakyWdBeta(u, rB) + series.dfdRB) * -rB) / B;
          dA[i] = (coef * series.dfdBeta1 * beta1) / (2 * anisotropy);
        } else if (!(ti <= 0)) {
          dT[i] = dS[i] = dB[i] = dA[i] = Number.NaN;
        }
      }
      return fixedAnisotropy === undefined ? [dT, dS, dB, dA] : [dT, dS, dB];
    },
  };
  return model;
}
