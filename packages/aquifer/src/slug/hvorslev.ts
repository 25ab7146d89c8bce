/**
 * Hvorslev (1951) slug-test analysis for an intake (screen or open section) of length Le and radius R in a
 * uniform, isotropic, extensive medium, with the shape factor of that case (Hvorslev 1951, the intake
 * approximated by a prolate ellipsoid; from memory)
 *
 *   F = 2 pi Le / ln[x + sqrt(1 + x^2)],  x = Le / (2R),   K = pi rc^2 / (F T0) = rc^2 ln[x + sqrt(1 + x^2)] / (2 Le T0),
 *
 * rc the radius where the water level moves (casing), T0 the basic time lag, from H/H0 = exp(-t/T0). For
 * Le/R > 8 it is within 1.6 % of the better-known long-intake form K = rc^2 ln(Le/R) / (2 Le T0). F is positive
 * for every Le > 0, so K is too.
 *
 * Where it applies, checked against an independent axisymmetric steady-state finite-difference solution of the
 * same geometry (tests/fixtures/slug/generate_shape_factors.py: the intake held at constant head in an infinite
 * isotropic medium, with an impermeable casing above it): the formula's F is 2 % above the numerical one at
 * Le/R = 2 and 8 to 12 % below it for Le/R from 4 to 32 (so K from the formula is up to about 13 % high there);
 * at Le/R = 1 it is 19 % above and at 0.5 40 % above. Intakes with Le/R below HVORSLEV_MIN_LENGTH_TO_RADIUS = 2
 * are refused: the shape factor does not describe them.
 * Source: Hvorslev, M.J. (1951). Time lag and soil permeability in ground-water observations. Bulletin 36,
 * Waterways Experiment Station, U.S. Army Corps of Engineers, Vicksburg, Mississippi.
 */

import type { ValueWithUnit } from "../data/index.js";
import { SlugTestInputError } from "./errors.js";
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
  /** 95 % interval K (1 +- t SE(b)/b), m/d, its lower end at least 0 (then a warning says the data do not bound K from below). */
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

/**
 * K (m/d), its standard error and 95 % interval from K = factor * b with factor > 0 (m^2) and the line's b (1/d):
 * the interval of b mapped through the factor, its lower end held at 0 when the interval of b reaches below it.
 */
export function conductivityFromLine(factor: number, line: RecoveryLine): Pick<SlugConductivityResult, "K" | "standardError" | "ci95"> {
  if (!(factor > 0)) throw new SlugTestInputError(`The geometry factor of K is ${factor} m^2; it must be > 0. Check the casing radius and intake length.`);
  const K = factor * line.decayRate;
  const se = line.decayRateStandardError === null ? null : factor * line.decayRateStandardError;
  const ci = se === null || line.tQuantile === null ? null : ([Math.max(0, K - line.tQuantile * se), K + line.tQuantile * se] as const);
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

/** Shortest intake, as Le/R, for which the Hvorslev shape factor is used (see the module comment). */
export const HVORSLEV_MIN_LENGTH_TO_RADIUS = 2;

/**
 * Hvorslev (1951) shape factor F = 2 pi Le / ln[x + sqrt(1 + x^2)], x = Le/(2R), in the unit of Le, for an intake of
 * length Le and radius R (any one length unit, both > 0). Source and checks: see the module comment.
 */
export function hvorslevShapeFactor(Le: number, R: number): number {
  const x = Le / (2 * R);
  return (2 * Math.PI * Le) / Math.asinh(x);
}

/**
 * Hvorslev (1951) hydraulic conductivity K (m/d) from a slug test: the basic time lag T0 = 1/b from the
 * least-squares line ln(H/H0) = a - b t over the chosen range, then K = pi rc^2 / (F T0) with the shape factor
 * F = 2 pi Le / ln[x + sqrt(1 + x^2)], x = Le/(2R) (hvorslevShapeFactor). Standard error and 95 % interval from the
 * scatter about the line only (not from the geometry or the model).
 * @throws SlugTestInputError for bad units, lengths <= 0, Le/R below 2 (where the shape factor does not apply),
 *   too few points or a record that does not decay.
 */
export function hvorslevSlugTest(
  record: SlugTestRecord,
  geometry: HvorslevGeometry,
  options: SlugLineOptions = {},
): SlugConductivityResult & { readonly lengthToRadius: number } {
  const rc = lengthInMetres(geometry.casingRadius, "the casing radius rc");
  const R = lengthInMetres(geometry.intakeRadius, "the intake radius R");
  const Le = lengthInMetres(geometry.intakeLength, "the intake length Le");
  const ratio = Le / R;
  if (!(ratio >= HVORSLEV_MIN_LENGTH_TO_RADIUS)) {
    throw new SlugTestInputError(
      `Hvorslev: the intake is ${Number(ratio.toPrecision(3))} radii long (Le/R); its shape factor applies from Le/R = ${HVORSLEV_MIN_LENGTH_TO_RADIUS}. ` +
        "For shorter intakes it overstates the flow (by 19 % at Le/R = 1 and 40 % at 0.5 against a finite-difference solution of the geometry), " +
        "so K would come out too low. Use a shape factor for a short intake or a flush bottom from a numerical model of the well.",
    );
  }
  const data = normalizeSlugRecord(record, options.range ?? {});
  const line = fitRecoveryLine(data, record.name, options.throughOrigin ?? false);
  const F = hvorslevShapeFactor(Le, R);
  const factor = (Math.PI * rc * rc) / F;
  const conductivity = conductivityFromLine(factor, line);
  const warnings = lineWarnings(line, data.dropped);
  if (conductivity.ci95 && conductivity.ci95[0] === 0) {
    warnings.push("The 95 % interval of the decay rate reaches 0: the data do not bound K from below; its lower end is given as 0.");
  }
  return {
    method: "hvorslev-1951",
    ...conductivity,
    unit: "m/d",
    line,
    lengthToRadius: ratio,
    notes: [
      `Hvorslev (1951), intake in an isotropic medium: K = pi rc^2 / (F T0), F = 2 pi Le / ln[x + sqrt(1 + x^2)] = ${Number(F.toPrecision(4))} m ` +
        `(x = Le/(2R) = ${Number((Le / (2 * R)).toPrecision(4))}), rc = ${rc} m, R = ${R} m, Le = ${Le} m; T0 = 1/b = ${Number(line.basicTimeLag.toPrecision(4))} d ` +
        `from the least-squares line ln(H/H0) = a - b t over ${line.points} points.`,
      "A finite-difference solution of the same geometry gives a shape factor 8 to 12 % larger for Le/R from 4 to 32 (2 % smaller at Le/R = 2), " +
        "so K from this formula may be high by as much; the interval covers only the scatter about the line.",
    ],
    warnings,
  };
}
