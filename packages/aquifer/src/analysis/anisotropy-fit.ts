/**
 * Horizontal anisotropy from three or more observation wells: the Papadopulos (1965) model fitted to all wells
 * together, from several starting directions (the sum of squares has one minimum per half-turn of theta and
 * flat ridges between them), keeping the best fit; the result is reported with Tmax >= Tmin and theta in
 * (-pi/2, pi/2]. Start values for T and S from a pooled Theis fit. Source: Papadopulos, I.S. (1965), IASH
 * Publication 73, 21-31; the multi-start search is common practice, no source.
 */
import { fitModel, type FitResult, type ObservationWell } from "../fit/index.js";
import { papadopulosAnisotropyModel, theisModel, transmissivityEllipse } from "../models/index.js";
import { AnalysisInputError } from "./errors.js";

/** Outcome of fitAnisotropy: the best fit and the principal values in reporting form. */
export interface AnisotropyFit {
  readonly fit: FitResult;
  /** Major and minor principal transmissivity, m2/d, with 95 % intervals (null when not identifiable). */
  readonly Tmax: { value: number; ci95: readonly [number, number] | null };
  readonly Tmin: { value: number; ci95: readonly [number, number] | null };
  /** Direction of Tmax, degrees counter-clockwise from the x axis, in (-90, 90], with its 95 % interval. */
  readonly directionDegrees: { value: number; ci95: readonly [number, number] | null };
  /** Storativity. */
  readonly S: number;
  /** Ellipse points (radius sqrt(T), m/d^0.5) and the wells' coordinates (m), for a plot. */
  readonly ellipse: { x: Float64Array; y: Float64Array };
  readonly wells: { name: string; x: number; y: number }[];
}

/**
 * Fits Tmax, Tmin, theta and S of Papadopulos (1965) to wells with plan coordinates (geometry.x, .y in m relative
 * to the pumping well, t in d, s in m). Needs at least three wells on different rays.
 * @throws AnalysisInputError for fewer than three wells or wells without coordinates.
 */
export function fitAnisotropy(wells: readonly ObservationWell[]): AnisotropyFit {
  if (wells.length < 3) {
    throw new AnalysisInputError(`fitAnisotropy: ${wells.length} well(s) given; Tmax, Tmin and the direction need at least three wells on different rays.`);
  }
  for (const w of wells) {
    if (!(Number.isFinite(w.geometry.x) && Number.isFinite(w.geometry.y))) {
      throw new AnalysisInputError(`fitAnisotropy: well "${w.name}" has no plan coordinates; give geometry.x and geometry.y in m relative to the pumping well.`);
    }
  }
  const pooled = fitModel({ model: theisModel, wells });
  const T0 = pooled.parameters[0]!.estimate;
  const S0 = pooled.parameters[1]!.estimate;
  let best: FitResult | null = null;
  for (const theta of [0, Math.PI / 4, Math.PI / 2, (3 * Math.PI) / 4]) {
    const fit = fitModel({ model: papadopulosAnisotropyModel, wells, start: { Tmax: 2 * T0, Tmin: T0 / 2, theta, S: S0 } });
    if (best === null || fit.ssr < best.ssr) best = fit;
  }
  const fit = best!;
  const [a, b, angle] = [fit.parameters[0]!, fit.parameters[1]!, fit.parameters[2]!];
  const swap = b.estimate > a.estimate;
  const major = swap ? b : a;
  const minor = swap ? a : b;
  let theta = angle.estimate + (swap ? Math.PI / 2 : 0);
  theta = theta - Math.PI * Math.ceil(theta / Math.PI - 0.5);
  const shift = theta - angle.estimate;
  const degrees = (v: number) => (v * 180) / Math.PI;
  const ci = angle.ci95 ? ([degrees(angle.ci95[0] + shift), degrees(angle.ci95[1] + shift)] as const) : null;
  return {
    fit,
    Tmax: { value: major.estimate, ci95: major.ci95 },
    Tmin: { value: minor.estimate, ci95: minor.ci95 },
    directionDegrees: { value: degrees(theta), ci95: ci },
    S: fit.parameters[3]!.estimate,
    ellipse: transmissivityEllipse(major.estimate, minor.estimate, theta),
    wells: wells.map((w) => ({ name: w.name, x: w.geometry.x!, y: w.geometry.y! })),
  };
}
