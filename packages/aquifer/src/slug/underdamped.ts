/**
 * Underdamped (oscillatory) slug tests in high-permeability formations: the water column in the well moves as a
 * damped oscillator (van der Kamp 1976; in the form of Springer and Gelhar 1991 and Butler 1998, which carries
 * the Bouwer-Rice shape factor):
 *   d^2 w_D / dt_D^2 + C_D dw_D / dt_D + w_D = 0,   w_D(0) = 1,  dw_D/dt_D(0) = 0,
 *   w_D = H / H0,  t_D = t sqrt(g / Le),  C_D = rc^2 ln(Re / rw) sqrt(g / Le) / (2 K Ls),
 * with Le the effective length of the oscillating water column, Ls the screen length and ln(Re/rw) the
 * Bouwer-Rice (1976) shape factor. Closed-form solutions: C_D < 2 e^(-C_D t_D / 2) (cos w t_D + C_D/(2w)
 * sin w t_D), w = sqrt(1 - C_D^2 / 4); C_D = 2 (1 + t_D) e^(-t_D); C_D > 2 (r1 e^(r2 t_D) - r2 e^(r1 t_D)) /
 * (r1 - r2), r1,2 = (-C_D +- sqrt(C_D^2 - 4)) / 2.
 * The relation between C_D and K is quoted from memory; it is checked against the solution itself: as
 * Le -> 0 (no inertia) the equation becomes C_D dw_D/dt_D + w_D = 0, i.e. ln(H0/H) = 2 K Ls t / (rc^2 ln(Re/rw)),
 * the Bouwer-Rice (1976) line (test: slug-underdamped.test.ts).
 * Sources: van der Kamp, G. (1976), Water Resources Research 12(1), 71-77; Springer, R.K. and Gelhar, L.W.
 * (1991), USGS Water-Resources Investigations Report 91-4034, 36-40; Butler, J.J. Jr. (1998), The Design,
 * Performance, and Analysis of Slug Tests, Lewis Publishers.
 */
import { fitModel, type FitOptions, type FitResult } from "../fit/index.js";
import { checkParameters, outputArray } from "../models/checks.js";
import type { DrawdownModel, ObservationGeometry, ParameterDescriptor } from "../models/model.js";
import { SlugTestInputError } from "./errors.js";
import { portableCos, portableSin } from "../numerics/portable-math.js";

/** Gravitational acceleration in m/d^2 (9.80665 m/s^2, the standard value). */
export const GRAVITY_M_PER_D2 = 9.80665 * 86400 * 86400;

/**
 * Normalized head w_D = H/H0 (dimensionless) of the damped oscillator at dimensionless time t_D >= 0 for
 * damping C_D >= 0 (module comment). Source: the closed-form solution of the oscillator equation.
 */
export function underdampedNormalizedHead(CD: number, tD: number): number {
  if (!(CD >= 0) || !(tD >= 0)) {
    throw new SlugTestInputError(`underdampedNormalizedHead: C_D = ${CD}, t_D = ${tD}; both must be >= 0.`);
  }
  const d = 1 - (CD * CD) / 4;
  if (Math.abs(d) < 1e-8) return (1 + tD) * Math.exp(-tD);
  if (d > 0) {
    const w = Math.sqrt(d);
    return Math.exp((-CD * tD) / 2) * (portableCos(w * tD) + (CD / (2 * w)) * portableSin(w * tD));
  }
  const root = Math.sqrt(-d);
  const r1 = -CD / 2 + root;
  const r2 = -CD / 2 - root;
  return (r1 * Math.exp(r2 * tD) - r2 * Math.exp(r1 * tD)) / (r1 - r2);
}

/** Geometry of the underdamped slug model, m. */
export interface UnderdampedGeometry {
  /** Casing radius where the water level moves rc, m. */
  readonly rc: number;
  /** Screen length Ls, m. */
  readonly screenLength: number;
  /** Bouwer-Rice shape factor ln(Re/rw) (e.g. from bouwerRiceLnReRw). */
  readonly lnReRw: number;
}

/** Hydraulic conductivity K (m/d) of the underdamped model. */
const conductivityParameter: ParameterDescriptor = {
  name: "K",
  label: "hydraulic conductivity",
  unit: "m/d",
  positive: true,
  bounds: [1e-3, 1e5],
  description: "Horizontal hydraulic conductivity of the formation around the screen.",
};

/** Effective water-column length Le (m). */
const columnLengthParameter: ParameterDescriptor = {
  name: "Le",
  label: "effective column length",
  unit: "m",
  positive: true,
  bounds: [0.01, 1000],
  description: "Effective length of the oscillating water column (about the static column above the screen plus a screen term).",
};

/**
 * The underdamped slug model as a DrawdownModel whose "drawdown" is H/H0 at times t (d since the slug);
 * parameters [K (m/d), Le (m)]; geometry.r and Q are ignored. Source: module comment.
 * @throws SlugTestInputError for non-positive rc, screen length or shape factor.
 */
export function underdampedSlugModel(geometry: UnderdampedGeometry): DrawdownModel & { geometry: UnderdampedGeometry } {
  for (const [name, v] of [["rc", geometry.rc], ["screenLength", geometry.screenLength], ["lnReRw", geometry.lnReRw]] as const) {
    if (!(v > 0 && Number.isFinite(v))) throw new SlugTestInputError(`underdampedSlugModel: ${name} is ${v}; it must be a finite number > 0.`);
  }
  const model: DrawdownModel & { geometry: UnderdampedGeometry } = {
    id: "underdamped-slug",
    name: "Underdamped slug test of van der Kamp (1976), in the form of Springer-Gelhar (1991) and Butler (1998)",
    source:
      "van der Kamp, G. (1976). Determining aquifer transmissivity by means of well response tests: the " +
      "underdamped case. Water Resources Research 12(1), 71-77. Springer, R.K. and Gelhar, L.W. (1991). " +
      "Characterization of large-scale aquifer heterogeneity in glacial outwash by analysis of slug tests with " +
      "oscillatory response. USGS WRI Report 91-4034, 36-40. Butler, J.J. Jr. (1998). The Design, Performance, " +
      "and Analysis of Slug Tests. Lewis Publishers.",
    assumptions: [
      "The water column in the casing oscillates as one mass; friction in the casing is neglected.",
      "The formation responds quasi-steadily (no storage), with the Bouwer-Rice shape factor ln(Re/rw).",
      "The slug is instantaneous and the well starts at rest.",
    ],
    validity: [
      "Highly permeable formations where the record oscillates or is near critically damped (C_D up to about 2-5).",
      "The relation between C_D and K is not checked against its published source here; it is checked against the Bouwer-Rice limit.",
    ],
    cautions: [
      "Le fitted from the record should be close to the column length computed from the well; a large " +
        "difference points to friction or a wrong geometry.",
      "Records must be sampled fast (several readings per oscillation period) for Le and K to be determined.",
      "Repeat tests with different H0 should agree; if the normalized records differ, non-linear losses act.",
    ],
    parameters: [conductivityParameter, columnLengthParameter],
    notSuperposable: "its output is the normalized head H/H0 of a slug test, not a drawdown driven by a pumping rate.",
    geometry,
    drawdown(p: ArrayLike<number>, _g: ObservationGeometry, t: ArrayLike<number>, out?: Float64Array): Float64Array {
      checkParameters(model, p);
      const K = p[0]!;
      const Le = p[1]!;
      const omega = Math.sqrt(GRAVITY_M_PER_D2 / Le);
      const CD = (geometry.rc * geometry.rc * geometry.lnReRw * omega) / (2 * K * geometry.screenLength);
      const result = outputArray(model.name, t.length, out);
      for (let i = 0; i < t.length; i++) {
        const ti = t[i]!;
        result[i] = ti > 0 && Number.isFinite(ti) ? underdampedNormalizedHead(CD, ti * omega) : ti <= 0 ? 1 : Number.NaN;
      }
      return result;
    },
  };
  return model;
}

/**
 * Fits K (m/d) and Le (m) of the underdamped model to a normalized record (t in d since the slug, h = H/H0)
 * by fitModel (Levenberg-Marquardt in ln K and ln Le, 95 % intervals). `start.Le` defaults to the given
 * column estimate or 5 m; `start.K` to 50 m/d; `fit` passes ftol, xtol, gtol and maxEvaluations to fitModel.
 * Source: module comment.
 */
export function fitUnderdampedSlugTest(
  geometry: UnderdampedGeometry,
  t: ArrayLike<number>,
  h: ArrayLike<number>,
  options: { start?: { K?: number; Le?: number }; fixed?: Record<string, number>; fit?: Pick<FitOptions, "ftol" | "xtol" | "gtol" | "maxEvaluations"> } = {},
): { fit: FitResult; CD: number } {
  const model = underdampedSlugModel(geometry);
  const fit = fitModel({
    model,
    wells: [{ name: "slug", geometry: { r: 1, Q: 1 }, t, s: h }],
    start: { K: options.start?.K ?? 50, Le: options.start?.Le ?? 5 },
    ...(options.fixed ? { fixed: options.fixed } : {}),
    ...(options.fit ?? {}),
  });
  const K = fit.parameters[0]!.estimate;
  const Le = fit.parameters[1]!.estimate;
  const CD = (geometry.rc * geometry.rc * geometry.lnReRw * Math.sqrt(GRAVITY_M_PER_D2 / Le)) / (2 * K * geometry.screenLength);
  return { fit, CD };
}
