/**
 * Water-table aquifers with partially penetrating wells, from the vertical-mode series of vertical-modes.ts
 * with the water-table modes eps_n tan eps_n = gamma, gamma = Sy b p alpha / (Kz (alpha + p)):
 * - Moench (1997): finite-diameter pumped well with well-bore storage and skin, and gradual drainage from
 *   the unsaturated zone with one drainage constant alpha (1/d) (instantaneous drainage: alpha -> infinity).
 * - Neuman (1974): the line-source well (no storage, no skin) with instantaneous drainage, for partially
 *   penetrating pumping and observation wells.
 * Limits checked in the tests: full penetration gives neuman.ts; Sy -> 0 gives the confined Hantush (1961)
 * partial penetration; Moench with rw -> 0, rc = 0 and instantaneous drainage gives Neuman (1974).
 */
import type { DrawdownModel } from "./model.js";
import { elasticStorativityParameter, specificYieldParameter } from "./neuman.js";
import { transmissivityParameter } from "./parameters.js";
import {
  checkFiniteWell,
  drainageConstantParameter,
  screenAnisotropyParameter,
  seriesModel,
  skinParameter,
  verticalGeometry,
  type FiniteWell,
  type ScreenedWellGeometry,
} from "./screened-well.js";
import { ModelInputError } from "./errors.js";

/** Geometry and options of the Moench (1997) model (depths in m below the initial water table). */
export interface MoenchGeometry extends ScreenedWellGeometry, FiniteWell {
  /** "gradual" (default) fits the drainage constant alpha (1/d); "instantaneous" is Neuman's condition. */
  readonly drainage?: "gradual" | "instantaneous";
}

/** A water-table model bound to its geometry. */
export interface WaterTableModel<G> extends DrawdownModel {
  readonly geometry: G;
}

const SHARED_ASSUMPTIONS = [
  "The aquifer is unconfined, homogeneous, of uniform saturated thickness b, infinite in areal extent, with " +
    "horizontal and vertical conductivities Kr and Kz; its base is impermeable.",
  "Water is released by compression (S) throughout and by drainage at the water table (Sy); the water-table " +
    "condition is linearised at its initial height (drawdown small compared with b).",
  "The flux into the pumping screen (depth d to l below the initial water table) is uniform along it; " +
    "observation screens report their average drawdown, piezometers the drawdown at their depth.",
];

const SHARED_CAUTIONS = [
  "Sy from a test that ends on the flat stretch of the curve is not determined; do not project long-term " +
    "yield or dewatering from such an Sy.",
  "Kz/Kr, S and the screen geometry trade off at a single observation point; fix the anisotropy or use " +
    "points at several depths and distances.",
  "A flat stretch is also produced by leakage or a recharge boundary; the interpretation needs the geology.",
];

/**
 * Moench (1997) model bound to `geometry`; parameter vector [T (m2/d), S (1), Sy (1)] followed by KzKr (1)
 * when `anisotropy` is omitted, Sk (1) when `skin` is "fitted", and alpha (1/d) for gradual drainage.
 * r = rw gives the pumped well's drawdown, r > rw the observation point's. Drawdown in m at times in d.
 * @throws ModelInputError for depths outside the aquifer, rw <= 0, rc < 0, skin < 0 or an unknown drainage.
 */
export function moenchWaterTableModel(geometry: MoenchGeometry): WaterTableModel<MoenchGeometry> {
  const where = "moenchWaterTableModel";
  const vertical = verticalGeometry(where, geometry);
  const well = checkFiniteWell(where, geometry);
  const drainage = geometry.drainage ?? "gradual";
  if (drainage !== "gradual" && drainage !== "instantaneous") {
    throw new ModelInputError(`${where}: drainage is ${String(drainage)}; use "gradual" or "instantaneous".`);
  }
  const fitAnisotropy = geometry.anisotropy === undefined;
  const fitSkin = Number.isNaN(well.skin);
  const gradual = drainage === "gradual";
  const parameters = [transmissivityParameter, elasticStorativityParameter, specificYieldParameter];
  if (fitAnisotropy) parameters.push(screenAnisotropyParameter);
  if (fitSkin) parameters.push(skinParameter);
  if (gradual) parameters.push(drainageConstantParameter);
  const iSkin = 3 + (fitAnisotropy ? 1 : 0);
  const iAlpha = iSkin + (fitSkin ? 1 : 0);
  return seriesModel(
    {
      id: "moench-water-table",
      name: "Moench (1997) water-table aquifer, finite-diameter partially penetrating well",
      source:
        "Moench, A.F. (1997). Flow to a well of finite diameter in a homogeneous, anisotropic water table " +
        "aquifer. Water Resources Research 33(6), 1397-1407. Gradual drainage after Boulton, N.S. (1954), and " +
        "Neuman, S.P. (1974), Water Resources Research 10(2), 303-312, for the instantaneous case.",
      assumptions: [
        ...SHARED_ASSUMPTIONS,
        "The pumped well has a finite radius rw, a casing of radius rc whose stored water supplies part of Q at " +
          "early time, and a thin skin; observation points respond instantly.",
        gradual
          ? "Drainage at the water table lags the fall of the water table with one exponential kernel of rate " +
            "constant alpha (Moench 1997 allows several; one is used here)."
          : "Drainage at the water table follows its fall instantly (Neuman 1974).",
      ],
      validity: [
        "Any t > 0; S < Sy. Early data follow the confined response with S (or casing storage in the pumped " +
          "well), late data Theis with S + Sy, joined by a flat stretch set by Kz/Kr and (for gradual drainage) alpha.",
        "Numerical accuracy of the default inversion (Stehfest N = 12): about 1e-4 relative where the drawdown " +
          "is more than 1e-3 of its late value (docs/methods.md gives the measured figures).",
      ],
      cautions: [
        ...SHARED_CAUTIONS,
        "alpha and Kz/Kr both shape the flat stretch and are strongly correlated in a fit to one well; a large " +
          "alpha (above about 100/d) is indistinguishable from instantaneous drainage.",
      ],
      parameters,
    },
    vertical,
    well,
    geometry.stehfestTerms ?? 12,
    (p) => ({
      aquifer: {
        T: p[0]!,
        S: p[1]!,
        Sy: p[2]!,
        kappa: fitAnisotropy ? p[3]! : geometry.anisotropy!,
        lambda: 0,
        alpha: gradual ? p[iAlpha]! : Infinity,
      },
      skin: fitSkin ? p[iSkin]! : well.skin,
    }),
    { geometry },
  );
}

/** Geometry of the Neuman (1974) partial-penetration model (depths in m below the initial water table). */
export interface NeumanPartialGeometry extends ScreenedWellGeometry {
  /** Observation point: piezometer depth or observation screen (required: the well itself is a line source). */
  readonly observation: NonNullable<ScreenedWellGeometry["observation"]>;
}

/**
 * Neuman (1974) model for partially penetrating pumping and observation wells, bound to `geometry`;
 * parameter vector [T (m2/d), S (1), Sy (1)] followed by KzKr (1) when `anisotropy` is omitted. The pumping
 * well is a line source (no storage); r > 0 is the distance of the observation point. Drawdown in m at t in d.
 * @throws ModelInputError for depths outside the aquifer or an empty screen.
 */
export function neumanPartialPenetrationModel(geometry: NeumanPartialGeometry): WaterTableModel<NeumanPartialGeometry> {
  const where = "neumanPartialPenetrationModel";
  if (geometry.observation === undefined) {
    throw new ModelInputError(`${where}: give the observation (a piezometer depth or an observation screen).`);
  }
  const vertical = verticalGeometry(where, geometry);
  const fitAnisotropy = geometry.anisotropy === undefined;
  const parameters = [transmissivityParameter, elasticStorativityParameter, specificYieldParameter];
  if (fitAnisotropy) parameters.push(screenAnisotropyParameter);
  return seriesModel(
    {
      id: "neuman-partial-penetration",
      name: "Neuman (1974) unconfined aquifer, partially penetrating wells",
      source:
        "Neuman, S.P. (1974). Effect of partial penetration on flow in unconfined aquifers considering delayed " +
        "gravity response. Water Resources Research 10(2), 303-312. Laplace-domain form as in Moench, A.F. " +
        "(1997), Water Resources Research 33(6), 1397-1407.",
      assumptions: [
        ...SHARED_ASSUMPTIONS,
        "The pumping well has an infinitesimal radius (no well-bore storage) and pumps at a constant rate; " +
          "drainage at the water table follows its fall instantly.",
      ],
      validity: [
        "All t > 0 and S < Sy at observation points (r > 0); not for the drawdown inside the pumped well.",
        "Numerical accuracy of the default inversion (Stehfest N = 12): about 1e-4 relative where the drawdown " +
          "is more than 1e-3 of its late value (docs/methods.md gives the measured figures).",
      ],
      cautions: SHARED_CAUTIONS,
      parameters,
    },
    vertical,
    { rw: 0, rc: 0 },
    geometry.stehfestTerms ?? 12,
    (p) => ({
      aquifer: { T: p[0]!, S: p[1]!, Sy: p[2]!, kappa: fitAnisotropy ? p[3]! : geometry.anisotropy!, lambda: 0, alpha: Infinity },
      skin: 0,
    }),
    { geometry },
  );
}
