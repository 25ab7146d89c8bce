/**
 * Dougherty and Babu (1984): drawdown in and around a finite-diameter, partially penetrating well with
 * well-bore storage and skin in a confined aquifer, optionally leaky (an aquitard without storage, as in
 * Hantush-Jacob), from the vertical-mode series of vertical-modes.ts with confined modes eps_n = n pi:
 *   Phi = (b / (2 pi T)) [sum_n c_n o_n K0(q_n rw) / (rw q_n K1(q_n rw)) + Sk / L],
 *   q_n^2 = (S p + T / B^2) / T + (Kz/Kr) (n pi / b)^2,
 *   s_w(p) = (Q / p) Phi / (1 + pi rc^2 p Phi),   s(r, p) = (Q / p) / (1 + pi rc^2 p Phi) (b / (2 pi T)) sum_n c_n o_n G_n(r),
 * inverted by Stehfest's algorithm. Limits (checked in the tests): full penetration gives Papadopulos-Cooper
 * (1967) with the skin of Agarwal et al. (1970); a small well without storage gives Hantush (1961) partial
 * penetration; full penetration, small well and leakage give Hantush-Jacob (1955).
 */
import { ModelInputError } from "./errors.js";
import { leakageFactorParameter } from "./hantush-jacob.js";
import type { DrawdownModel } from "./model.js";
import { storativityParameter, transmissivityParameter } from "./parameters.js";
import {
  checkFiniteWell,
  screenAnisotropyParameter,
  seriesModel,
  skinParameter,
  verticalGeometry,
  type FiniteWell,
  type ScreenedWellGeometry,
} from "./screened-well.js";

/** Geometry and options of the Dougherty-Babu model (depths in m below the top of the aquifer). */
export interface DoughertyBabuGeometry extends ScreenedWellGeometry, FiniteWell {
  /** True for a leaky aquifer: adds the leakage factor B (m) as a parameter. Default false (confined). */
  readonly leaky?: boolean;
}

/** A Dougherty-Babu model bound to its geometry. */
export interface DoughertyBabuModel extends DrawdownModel {
  readonly geometry: DoughertyBabuGeometry;
}

/**
 * The Dougherty-Babu (1984) model bound to `geometry`; parameter vector [T (m2/d), S (1)] followed by
 * KzKr (1) when `anisotropy` is omitted, Sk (1) when `skin` is "fitted", and B (m) when `leaky`.
 * r = rw gives the drawdown in the pumped well (averaged over its screen, plus the skin loss); r > rw the
 * drawdown at the observation point of the geometry. Drawdown in m at times in d.
 * Accuracy (tests against an independent scipy evaluation, tests/fixtures/screened-wells): see docs/methods.md.
 * @throws ModelInputError for depths outside the aquifer, an empty screen, rw <= 0, rc < 0 or skin < 0.
 */
export function doughertyBabuModel(geometry: DoughertyBabuGeometry): DoughertyBabuModel {
  const where = "doughertyBabuModel";
  const vertical = verticalGeometry(where, geometry);
  const well = checkFiniteWell(where, geometry);
  if (geometry.leaky !== undefined && typeof geometry.leaky !== "boolean") {
    throw new ModelInputError(`${where}: leaky is ${String(geometry.leaky)}; give true (leaky aquifer) or false (confined).`);
  }
  const fitAnisotropy = geometry.anisotropy === undefined;
  const fitSkin = Number.isNaN(well.skin);
  const leaky = geometry.leaky === true;
  const parameters = [transmissivityParameter, storativityParameter];
  if (fitAnisotropy) parameters.push(screenAnisotropyParameter);
  if (fitSkin) parameters.push(skinParameter);
  if (leaky) parameters.push(leakageFactorParameter);
  const iAniso = 2;
  const iSkin = 2 + (fitAnisotropy ? 1 : 0);
  const iB = iSkin + (fitSkin ? 1 : 0);
  return seriesModel(
    {
      id: "dougherty-babu",
      name: "Dougherty-Babu (1984) partially penetrating finite-diameter well with storage and skin",
      source:
        "Dougherty, D.E. and Babu, D.K. (1984). Flow to a partially penetrating well in a double-porosity " +
        "reservoir. Water Resources Research 20(8), 1116-1122 (single-porosity case). Skin as in Agarwal, R.G., " +
        "Al-Hussainy, R. and Ramey, H.J. Jr. (1970), Society of Petroleum Engineers Journal 10(3), 279-290; " +
        "leakage as in Hantush, M.S. and Jacob, C.E. (1955), Transactions AGU 36(1), 95-100.",
      assumptions: [
        "The aquifer is homogeneous, of uniform thickness b and infinite in areal extent, with horizontal and " +
          "vertical conductivities Kr and Kz; its base is impermeable and its top impermeable (confined) or " +
          "overlain by an aquitard without storage that leaks from an unpumped layer at constant head (leaky).",
        "The well has a finite radius rw and is screened from depth d to l; the flux into the screen is uniform " +
          "along it and the drawdown in the well is the screen average of the aquifer drawdown at the well face " +
          "plus the loss across a thin skin.",
        "The discharge Q is constant at the surface; the water stored in the casing of radius rc supplies part " +
          "of it at early time.",
        "Observation points respond instantly (their own storage is neglected).",
      ],
      validity: [
        "Any t > 0. At early time the pumped well follows casing storage s = Q t / (pi rc^2); later the partial " +
          "penetration adds a nearly constant drawdown (pseudo-skin); at late time the Theis (or Hantush-Jacob) " +
          "slope returns.",
        "Numerical accuracy of the default inversion (Stehfest N = 12): about 1e-4 relative where the drawdown " +
          "is more than 1e-3 of its late value (docs/methods.md gives the measured figures).",
      ],
      cautions: [
        "In the pumped well S, Kz/Kr and the skin trade off: fix the anisotropy from other evidence or use " +
          "observation points at several depths before reading S from the pumped well.",
        "A uniform-flux screen is assumed; in a well with high well losses or a long gravel pack the inflow is " +
          "spread differently and the pumped-well drawdown differs.",
        "Drawdown in the pumped well also includes turbulent well losses (C Q^n), which this model does not " +
          "contain; use the step-test analysis to separate them.",
      ],
      parameters,
    },
    vertical,
    well,
    geometry.stehfestTerms ?? 12,
    (p) => {
      const T = p[0]!;
      const B = leaky ? p[iB]! : Infinity;
      return {
        aquifer: {
          T,
          S: p[1]!,
          kappa: fitAnisotropy ? p[iAniso]! : geometry.anisotropy!,
          lambda: leaky ? T / (B * B) : 0,
          Sy: 0,
          alpha: Infinity,
        },
        skin: fitSkin ? p[iSkin]! : well.skin,
      };
    },
    { geometry },
  );
}
