/**
 * Moench (1984): drawdown in a double-porosity (fractured) aquifer whose matrix blocks, slabs or spheres,
 * release water by transient diffusion through a fracture skin, here for a finite-diameter, partially or fully
 * penetrating well with well-bore storage and skin (the vertical-mode series of vertical-modes.ts with the
 * storage term S p replaced by S p + Sm p F(p), see blockStorageTerm). Dougherty and Babu (1984) solved the
 * partially penetrating double-porosity case; Moench (1984) added the fracture skin.
 * Limits (tested): rate -> infinity gives the single-porosity models with storativity S + Sm, rate -> 0 gives
 * them with S alone.
 */
import type { DrawdownModel, ParameterDescriptor } from "./model.js";
import { ModelInputError } from "./errors.js";
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

/** Geometry and options of the double-porosity model (depths in m below the top of the aquifer). */
export interface DoublePorosityGeometry extends ScreenedWellGeometry, FiniteWell {
  /** Block shape; default "slab". */
  readonly blockShape?: "slab" | "sphere";
  /** Fracture skin sf (>= 0), or "fitted" (parameter "sf"); default 0. */
  readonly fractureSkin?: number | "fitted";
}

/** Storativity of the matrix blocks. */
export const blockStorativityParameter: ParameterDescriptor = {
  name: "Sm",
  label: "matrix block storativity",
  unit: "1",
  positive: true,
  bounds: [1e-8, 0.5],
  description: "Storativity of the matrix blocks over the aquifer thickness (specific storage of the blocks times their share of b).",
};

/** Block diffusion rate Km / (Ssm a^2). */
export const blockRateParameter: ParameterDescriptor = {
  name: "blockRate",
  label: "block diffusion rate",
  unit: "1/d",
  positive: true,
  bounds: [1e-6, 1e6],
  description: "Km / (Ssm a^2) with a the slab half-thickness or sphere radius; 1/rate is the time scale of block drainage.",
};

/** Fracture skin of the blocks. */
export const fractureSkinParameter: ParameterDescriptor = {
  name: "sf",
  label: "fracture skin",
  unit: "1",
  positive: false,
  bounds: [0, 1e4],
  description: "Km bs / (Ks a): resistance of a low-permeability coating on the block faces (Moench 1984).",
};

/**
 * The Moench (1984) double-porosity model bound to `geometry`; parameter vector [T (m2/d, fractures), S
 * (fractures), Sm, blockRate (1/d)] then KzKr, Sk and sf as the options require. r = rw is the pumped well.
 * Drawdown in m at times in d.
 * @throws ModelInputError for bad geometry, skin or block shape.
 */
export function moenchDoublePorosityModel(geometry: DoublePorosityGeometry): DrawdownModel & { geometry: DoublePorosityGeometry } {
  const where = "moenchDoublePorosityModel";
  const vertical = verticalGeometry(where, geometry);
  const well = checkFiniteWell(where, geometry);
  const shape = geometry.blockShape ?? "slab";
  if (shape !== "slab" && shape !== "sphere") throw new ModelInputError(`${where}: blockShape is ${String(shape)}; use "slab" or "sphere".`);
  const sfOption = geometry.fractureSkin ?? 0;
  if (sfOption !== "fitted" && !(Number.isFinite(sfOption) && sfOption >= 0)) {
    throw new ModelInputError(`${where}: fractureSkin is ${String(sfOption)}; give a number >= 0 or "fitted".`);
  }
  const fitAnisotropy = geometry.anisotropy === undefined;
  const fitSkin = Number.isNaN(well.skin);
  const fitSf = sfOption === "fitted";
  const parameters = [transmissivityParameter, storativityParameter, blockStorativityParameter, blockRateParameter];
  if (fitAnisotropy) parameters.push(screenAnisotropyParameter);
  if (fitSkin) parameters.push(skinParameter);
  if (fitSf) parameters.push(fractureSkinParameter);
  const iSkin = 4 + (fitAnisotropy ? 1 : 0);
  const iSf = iSkin + (fitSkin ? 1 : 0);
  return seriesModel(
    {
      id: "moench-double-porosity",
      name: `Moench (1984) double porosity, ${shape} blocks with fracture skin, finite-diameter well`,
      source:
        "Moench, A.F. (1984). Double-porosity models for a fissured groundwater reservoir with fracture skin. " +
        "Water Resources Research 20(7), 831-846. Partial penetration after Dougherty, D.E. and Babu, D.K. (1984), " +
        "Water Resources Research 20(8), 1116-1122.",
      assumptions: [
        "The fractures form a homogeneous, confined aquifer of thickness b (T, S); the matrix blocks store water " +
          "(Sm) and release it by transient diffusion into the fractures.",
        `The blocks are ${shape === "slab" ? "slabs (horizontal layers)" : "spheres"} of one size, and their faces may carry a thin skin of low permeability (sf).`,
        "The well has a finite radius, casing storage and skin, and a uniform-flux screen; observation points respond instantly.",
      ],
      validity: [
        "Any t > 0. Early data follow the fracture response (S), late data S + Sm, joined by a transition set by " +
          "blockRate (and sf); with a large sf the transition looks like pseudo-steady (Warren-Root) exchange.",
        "Numerical accuracy: that of the vertical-mode series with Stehfest N = 12 (docs/methods.md).",
      ],
      cautions: [
        "The dip of the derivative that marks double porosity is also produced by delayed yield or leakage; the " +
          "interpretation needs the geology.",
        "Sm and blockRate trade off when the test does not reach the late (S + Sm) response.",
        "A fractured rock is rarely a homogeneous continuum near the well; a good fit does not prove the model.",
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
        kappa: fitAnisotropy ? p[4]! : geometry.anisotropy!,
        lambda: 0,
        Sy: 0,
        alpha: Infinity,
        blocks: { Sm: p[2]!, rate: p[3]!, skin: fitSf ? p[iSf]! : (sfOption as number), shape },
      },
      skin: fitSkin ? p[iSkin]! : well.skin,
    }),
    { geometry },
  );
}
