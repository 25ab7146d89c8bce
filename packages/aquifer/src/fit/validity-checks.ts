/**
 * Validity limits of a model enforced where a fit crosses them:
 * - Cooper-Jacob: the straight line holds only where u = r^2 S/(4 T t) is small (u <= 0.01 by default, common
 *   practice, no source; 0.05 is also used). Readings beyond it are left out and the fit repeated until the set
 *   is stable (as cooperJacobLine does), or kept with a warning.
 * - Papadopulos-Cooper: pumped-well readings before the well-bore storage time (wellboreStorageTime, 1 % of
 *   Theis) carry little information on T; they are counted and flagged.
 */
import { COOPER_JACOB_DEFAULT_U_MAX, wellboreStorageTime, type DrawdownModel, type PapadopulosCooperModel } from "../models/index.js";
import type { FitResult } from "./fit-model.js";
import type { ObservationWell, PackedWell } from "./observations.js";

/** A reading left out of a fit by a validity rule. */
export interface ExcludedReading {
  /** Well name. */
  readonly well: string;
  /** Index in the caller's arrays. */
  readonly index: number;
  /** Time, d. */
  readonly t: number;
  /** u = r^2 S/(4 T t) under the fit that decided the exclusion. */
  readonly u: number;
  readonly reason: string;
}

const fmt = (v: number) => Number(v.toPrecision(3)).toString();

/**
 * Readings of the caller's wells with u = r^2 S/(4 T t) > uMax under the fit's T and S (m2/d, 1), and the wells
 * with those readings masked out, plus a warning sentence.
 */
export function cooperJacobCheck(
  fit: FitResult,
  wells: readonly ObservationWell[],
  uMax: number = COOPER_JACOB_DEFAULT_U_MAX,
): { outside: ExcludedReading[]; masked: ObservationWell[]; uMax: number; message: string } {
  const T = fit.parameters.find((p) => p.name === "T")!.estimate;
  const S = fit.parameters.find((p) => p.name === "S")!.estimate;
  const outside: ExcludedReading[] = [];
  const masked = wells.map((w, k) => {
    const name = typeof w.name === "string" && w.name !== "" ? w.name : `#${k + 1}`;
    const c = (w.geometry.r * w.geometry.r * S) / (4 * T);
    const mask = Array.from({ length: w.t.length }, (_, i) => {
      const keep = w.mask ? Boolean(w.mask[i]) : true;
      const t = w.t[i]!;
      if (!keep || !(t > 0)) return keep;
      const u = c / t;
      if (u > uMax) {
        outside.push({ well: name, index: i, t, u, reason: `u = ${fmt(u)} > ${uMax}: too early for the Cooper-Jacob line` });
        return false;
      }
      return true;
    });
    return { ...w, mask };
  });
  const largest = outside.reduce((m, e) => Math.max(m, e.u), 0);
  const message =
    outside.length === 0
      ? ""
      : `${outside.length} reading${outside.length === 1 ? "" : "s"} have u = r^2 S/(4 T t) above ${uMax} (up to ${fmt(largest)}) under the fitted T and S, ` +
        "where the Cooper-Jacob line falls below the Theis curve (0.2 % at u = 0.01, 2 % at 0.05): they bias T high and S low. " +
        "Leave them out (cooperJacob.outside \"exclude\", the default) or fit the Theis model.";
  return { outside, masked, uMax, message };
}

function isPapadopulosCooper(model: DrawdownModel): model is PapadopulosCooperModel {
  return model.id === "papadopulos-cooper" && typeof (model as PapadopulosCooperModel).well === "object";
}

/** Warnings for pumped-well readings of a Papadopulos-Cooper fit that lie inside the well-bore storage time. */
export function wellboreStorageCheck(model: DrawdownModel, wells: readonly PackedWell[], fit: FitResult): string[] {
  if (!isPapadopulosCooper(model)) return [];
  const T = fit.parameters.find((p) => p.name === "T")?.estimate;
  const S = fit.parameters.find((p) => p.name === "S")?.estimate;
  if (!(T !== undefined && S !== undefined && T > 0 && S > 0)) return [];
  const { rw } = model.well;
  const warnings: string[] = [];
  let storage: ReturnType<typeof wellboreStorageTime> | null = null;
  for (const w of wells) {
    if (Math.abs(w.geometry.r - rw) > 1e-9 * rw) continue;
    storage ??= wellboreStorageTime(T, S, model.well);
    const inside = Array.from(w.t).filter((t) => t < storage!.time).length;
    if (inside === 0) continue;
    warnings.push(
      `${inside} of ${w.t.length} readings of the pumped well "${w.name}" lie before ${fmt(storage.time)} d (${fmt(storage.multipleOfRc2OverT)} rc^2/T), ` +
        "while casing storage still holds the drawdown more than 1 % below the Theis curve; they confirm rc but carry little information on T. " +
        `(The rule of thumb 25 rc^2/T = ${fmt((25 * model.well.rc * model.well.rc) / T)} d leaves a gap of ${fmt(100 * storage.gapAtRuleOfThumb)} % here.)`,
    );
  }
  return warnings;
}
