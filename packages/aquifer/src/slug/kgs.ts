/**
 * The KGS slug-test model (Hyder, Butler, McElwee and Liu 1994): the head in a partially penetrating,
 * finite-diameter well after an instantaneous change H0, in a confined, anisotropic aquifer, with a skin.
 * In the Laplace domain (p in 1/d), with Phi(p) the head at the well face per unit injection rate, averaged
 * over the screen (the vertical-mode series of models/vertical-modes.ts with confined modes, uniform flux
 * along the screen, a thin skin Sk as in Agarwal et al. 1970),
 *   flow into the aquifer Q_a = -pi rc^2 dH/dt,  H = Q_a Phi  =>  H(p) / H0 = pi rc^2 Phi / (1 + pi rc^2 p Phi),
 * inverted by Stehfest's algorithm (N = 12). For a full screen and no skin this is the transform of Cooper,
 * Bredehoeft and Papadopulos (1967) (checked in the tests against cbpNormalizedHead, a real-integral
 * evaluation). Differences from Hyder et al. (1994): their skin is a zone of finite thickness with its own
 * conductivity and storage; here it is a thin skin without storage, and only the confined (no-flow) top is
 * offered.
 * Source: Hyder, Z., Butler, J.J. Jr., McElwee, C.D. and Liu, W. (1994). Slug tests in partially penetrating
 * wells. Water Resources Research 30(11), 2945-2957.
 */
import { fitModel, type FitOptions, type FitResult } from "../fit/index.js";
import { checkParameters, outputArray } from "../models/checks.js";
import type { DrawdownModel, ObservationGeometry, ParameterDescriptor } from "../models/model.js";
import { transmissivityParameter, storativityParameter } from "../models/parameters.js";
import { screenAnisotropyParameter, skinParameter, verticalGeometry } from "../models/screened-well.js";
import { VerticalModeSeries } from "../models/vertical-modes.js";
import { stehfestCoefficients } from "../numerics/index.js";
import { SlugTestInputError } from "./errors.js";

/** Geometry of a KGS slug test, m; depths below the top of the aquifer. */
export interface KgsGeometry {
  /** Aquifer thickness b, m. */
  readonly thickness: number;
  /** Top and bottom of the screen, m below the top of the aquifer. */
  readonly screenTop: number;
  readonly screenBottom: number;
  /** Casing radius where the water level moves rc, m (> 0), and screen radius rw, m (> 0). */
  readonly rc: number;
  readonly rw: number;
  /** Kz/Kr (> 0); omitted: fitted as "KzKr". */
  readonly anisotropy?: number;
  /** Thin-skin factor (>= 0), or "fitted"; default 0. */
  readonly skin?: number | "fitted";
}

/** A KGS normalized-head model bound to its geometry. */
export interface KgsModel extends DrawdownModel {
  readonly geometry: KgsGeometry;
}

/**
 * The KGS slug model as a DrawdownModel whose "drawdown" is the normalized head H/H0 (dimensionless) at
 * times t (d since the slug); geometry.r and geometry.Q are ignored. Parameters [T (m2/d), S (1)], then
 * KzKr when `anisotropy` is omitted and Sk when `skin` is "fitted". Hydraulic conductivity Kr = T / b.
 * @throws SlugTestInputError for rc <= 0 or rw <= 0; ModelInputError for depths outside the aquifer.
 */
export function kgsSlugModel(geometry: KgsGeometry): KgsModel {
  const where = "kgsSlugModel";
  if (!(geometry.rc > 0 && Number.isFinite(geometry.rc)) || !(geometry.rw > 0 && Number.isFinite(geometry.rw))) {
    throw new SlugTestInputError(`${where}: rc = ${geometry.rc} m and rw = ${geometry.rw} m; both radii must be positive.`);
  }
  const skinOption = geometry.skin ?? 0;
  if (skinOption !== "fitted" && !(Number.isFinite(skinOption) && skinOption >= 0)) {
    throw new SlugTestInputError(`${where}: skin is ${String(skinOption)}; give a number >= 0 or "fitted".`);
  }
  const vertical = verticalGeometry(where, { ...geometry, observation: undefined });
  const fitAnisotropy = geometry.anisotropy === undefined;
  const fitSkin = skinOption === "fitted";
  const parameters: ParameterDescriptor[] = [transmissivityParameter, storativityParameter];
  if (fitAnisotropy) parameters.push(screenAnisotropyParameter);
  if (fitSkin) parameters.push(skinParameter);
  const weights = stehfestCoefficients(12);
  const cache = new Map<number, VerticalModeSeries>();
  const L = vertical.zetaB - vertical.zetaA;
  const model: KgsModel = {
    id: "kgs-slug",
    name: "KGS slug test of Hyder et al. (1994), partially penetrating well with skin",
    source:
      "Hyder, Z., Butler, J.J. Jr., McElwee, C.D. and Liu, W. (1994). Slug tests in partially penetrating wells. " +
      "Water Resources Research 30(11), 2945-2957. Thin skin as in Agarwal, Al-Hussainy and Ramey (1970).",
    assumptions: [
      "The aquifer is confined, homogeneous, anisotropic (Kz/Kr), of thickness b and infinite in areal extent.",
      "The head in the well changes instantaneously by H0 at t = 0 and then returns to static; the water " +
        "moves through the screen (depth d to l) with a uniform flux along it.",
      "Losses at the screen are lumped into a thin skin without storage (Hyder et al. use a finite skin zone).",
      "No inertia in the water column (an overdamped response); for oscillating records use the underdamped model.",
    ],
    validity: [
      "Normalized head from 1 towards 0 (overdamped response); any t > 0.",
      "Stehfest inversion (N = 12): about 1e-4 relative while H/H0 > 1e-3.",
    ],
    cautions: [
      "S from a slug test is poorly determined (T and S trade off); report it only with its interval.",
      "A positive skin lowers the apparent conductivity; without a skin term in the fit, the fitted Kr " +
        "belongs to the skin zone rather than the formation.",
      "Kr, Kz/Kr and the skin cannot all be determined from one test; fix the anisotropy from other evidence.",
    ],
    parameters,
    notSuperposable: "its output is the normalized head H/H0 of a slug test, not a drawdown driven by a pumping rate.",
    geometry,
    drawdown(p: ArrayLike<number>, _g: ObservationGeometry, t: ArrayLike<number>, out?: Float64Array): Float64Array {
      checkParameters(model, p);
      const T = p[0]!;
      const S = p[1]!;
      const kappa = fitAnisotropy ? p[2]! : geometry.anisotropy!;
      const skin = fitSkin ? p[2 + (fitAnisotropy ? 1 : 0)]! : (skinOption as number);
      let series = cache.get(skin);
      if (series === undefined) {
        if (cache.size > 8) cache.clear();
        series = new VerticalModeSeries(vertical, { rw: geometry.rw, rc: geometry.rc, skin });
        cache.set(skin, series);
      }
      const aquifer = { T, S, kappa, lambda: 0, Sy: 0, alpha: Infinity };
      const storage = Math.PI * geometry.rc * geometry.rc;
      const scale = vertical.b / (2 * Math.PI * T);
      const result = outputArray(model.name, t.length, out);
      for (let i = 0; i < t.length; i++) {
        const ti = t[i]!;
        if (!(ti > 0 && Number.isFinite(ti))) {
          result[i] = ti <= 0 ? 1 : Number.NaN;
          continue;
        }
        const a = Math.LN2 / ti;
        const direct = series.directTerms(weights.length * a, aquifer);
        let sum = 0;
        for (let k = 1; k <= weights.length; k++) {
          const pk = k * a;
          const phi = scale * (series.modeSum(pk, aquifer, geometry.rw, true, direct) + skin / L);
          sum += weights[k - 1]! * ((storage * phi) / (1 + storage * pk * phi));
        }
        result[i] = a * sum;
      }
      return result;
    },
  };
  return model;
}

/**
 * Fits the KGS model to a normalized record (t in d since the slug, h = H/H0) by fitModel (Levenberg-Marquardt
 * in ln T and ln S, 95 % intervals); start values by name in base units (default T from the Hvorslev-type
 * scale rc^2 / t at H/H0 = 0.37, S = 1e-5); `fit` passes ftol, xtol, gtol and maxEvaluations to fitModel. Returns
 * the fit and Kr = T / b (m/d) with its interval.
 * Source: Hyder et al. (1994).
 */
export function fitKgsSlugTest(
  geometry: KgsGeometry,
  t: ArrayLike<number>,
  h: ArrayLike<number>,
  options: { start?: Record<string, number>; fixed?: Record<string, number>; fit?: Pick<FitOptions, "ftol" | "xtol" | "gtol" | "maxEvaluations"> } = {},
): { fit: FitResult; Kr: number; KrCi95: readonly [number, number] | null } {
  const model = kgsSlugModel(geometry);
  let t37 = t[t.length - 1]!;
  for (let i = 0; i < t.length; i++) {
    if (h[i]! <= Math.exp(-1)) {
      t37 = t[i]!;
      break;
    }
  }
  const fit = fitModel({
    model,
    wells: [{ name: "slug", geometry: { r: geometry.rw, Q: 1 }, t, s: h }],
    start: { T: (geometry.rc * geometry.rc) / t37, S: 1e-5, ...(options.start ?? {}) },
    ...(options.fixed ? { fixed: options.fixed } : {}),
    ...(options.fit ?? {}),
  });
  const T = fit.parameters[0]!;
  const b = geometry.thickness;
  return { fit, Kr: T.estimate / b, KrCi95: T.ci95 ? [T.ci95[0] / b, T.ci95[1] / b] : null };
}
