/**
 * Hvorslev (1951) slug-test analysis, case implemented: an intake (screen or open section) of length Le and
 * radius R in a uniform, isotropic, extensive medium, in the long-intake limit Le/R > 8, where the shape
 * factor F = 2 pi Le / ln(Le/R) (the limit of 2 pi Le / ln[Le/(2R) + sqrt(1 + (Le/(2R))^2)] for Le >> R):
 *
 *   K = rc^2 ln(Le/R) / (2 Le T0),
 *
 * rc the radius where the water level moves (casing), T0 the basic time lag, from H/H0 = exp(-t/T0).
 * Source: Hvorslev, M.J. (1951). Time lag and soil permeability in ground-water observations. Bulletin 36,
 * Waterways Experiment Station, U.S. Army Corps of Engineers, Vicksburg, Mississippi.
 */

import type { ValueWithUnit } from "../data/index.js";
import { fitRecoveryLine, type RecoveryLine } from "./log-linear-recovery.js";
import { lengthInMetres, normalizeSlugRecord, type SlugFitRange, type SlugTestRecord } from "./slug-data.js";

/** Well geometry for hvorslevSlugTest: rc, R and Le as lengths with their units (any length unit, converted to m). */
export interface HvorslevGeometry {
  /** Radius of the casing where the water level moves, rc. */
  readonly casingRadius: ValueWithUnit;
  /** Radius of the intake (screen, or borehole with filter pack), R. */
  readonly intakeRadius: ValueWithUnit;
  /** Length of the intake, Le. */
  readonly intakeLength: ValueWithUnit;
}

/**
 * Outcome of a straight-line slug analysis (Hvorslev or Bouwer & Rice): hydraulic conductivity K with its
 * standard error and 95 % interval (m/d), the fitted line ln(H/H0) = a - b t (b in 1/d), notes and warnings.
 */
export interface SlugConductivityResult {
  readonly method: "hvorslev-1951" | "bouwer-rice-1976";
  /** Hydraulic conductivity K, m/d. */
  readonly K: number;
  readonly unit: "m/d";
  /** Standard error of K from the scatter about the line (delta method: SE(K)/K = SE(b)/b), m/d. */
  readonly standardError: number | null;
  /** 95 % interval K (1 +- t SE(b)/b), m/d. */
  readonly ci95: readonly [number, number] | null;
  /** The fitted line ln(H/H0) = a - b t. */
  readonly line: RecoveryLine;
  readonly notes: string[];
  readonly warnings: string[];
}

/**
 * Settings of the straight-line slug analyses: the part of the record fitted (times in the record's time unit,
 * heads as H/H0) and whether the line is forced through H/H0 = 1 at t = 0.
 */
export interface SlugLineOptions {
  /** Part of the record to fit; default all points with H/H0 > 0. */
  readonly range?: SlugFitRange;
  /** Force the line through H/H0 = 1 at t = 0; default false (fit the intercept too). */
  readonly throughOrigin?: boolean;
}

/** K, its standard error and interval from K = factor * b. */
export function conductivityFromLine(factor: number, line: RecoveryLine): Pick<SlugConductivityResult, "K" | "standardError" | "ci95"> {
  const K = factor * line.decayRate;
  const se = line.decayRateStandardError === null ? null : factor * line.decayRateStandardError;
  const ci = se === null || line.tQuantile === null ? null : ([K - line.tQuantile * se, K + line.tQuantile * se] as const);
  return { K, standardError: se, ci95: ci };
}

/** Warnings common to the straight-line slug methods. */
export function lineWarnings(line: RecoveryLine, dropped: readonly string[]): string[] {
  const warnings: string[] = [];
  if (!line.throughOrigin && Math.abs(line.intercept) > Math.log(1.25)) {
    warnings.push(
      `The fitted line starts at H/H0 = ${Number(Math.exp(line.intercept).toPrecision(3))} at t = 0, not 1: ` +
        `an early disturbance, a double straight line or a wrong H0; check the range fitted.`,
    );
  }
  if (line.rSquared < 0.98) {
    warnings.push(`ln(H/H0) is not straight over the chosen range (R^2 = ${line.rSquared.toFixed(3)}); narrow the range.`);
  }
  if (dropped.length > 0) warnings.push(`Left out: ${dropped.join("; ")}.`);
  return warnings;
}

/**
 * Hvorslev (1951) hydraulic conductivity K (m/d) from a slug test: the basic time lag T0 = 1/b from the
 * least-squares line ln(H/H0) = a - b t over the chosen range, then K = rc^2 ln(Le/R) / (2 Le T0) (long intake
 * in an isotropic medium, Le/R > 8; a warning is given otherwise). Standard error and 95 % interval from the
 * scatter about the line only (not from the geometry or the model).
 * @throws SlugTestInputError for bad units, lengths <= 0, too few points or a record that does not decay.
 */
export function hvorslevSlugTest(
  record: SlugTestRecord,
  geometry: HvorslevGeometry,
  options: SlugLineOptions = {},
): SlugConductivityResult & { readonly lengthToRadius: number } {
  const rc = lengthInMetres(geometry.casingRadius, "the casing radius rc");
  const R = lengthInMetres(geometry.intakeRadius, "the intake radius R");
  const Le = lengthInMetres(geometry.intakeLength, "the intake length Le");
  const data = normalizeSlugRecord(record, options.range ?? {});
  const line = fitRecoveryLine(data, record.name, options.throughOrigin ?? false);
  const ratio = Le / R;
  const factor = (rc * rc * Math.log(ratio)) / (2 * Le);
  const warnings = lineWarnings(line, data.dropped);
  if (!(ratio > 8)) {
    warnings.push(
      `Le/R = ${Number(ratio.toPrecision(3))}: the formula K = rc^2 ln(Le/R)/(2 Le T0) needs Le/R > 8; ` +
        `for a short intake use Hvorslev's full shape factor.`,
    );
  }
  return {
    method: "hvorslev-1951",
    ...conductivityFromLine(factor, line),
    unit: "m/d",
    line,
    lengthToRadius: ratio,
    notes: [
      `Hvorslev (1951), long intake in an isotropic medium: K = rc^2 ln(Le/R) / (2 Le T0) with rc = ${rc} m, ` +
        `R = ${R} m, Le = ${Le} m; T0 = 1/b = ${Number(line.basicTimeLag.toPrecision(4))} d from the least-squares ` +
        `line ln(H/H0) = a - b t over ${line.points} points.`,
    ],
    warnings,
  };
}
