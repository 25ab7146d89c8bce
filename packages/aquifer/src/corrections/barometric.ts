/**
 * Barometric efficiency and the barometric correction of water levels in a confined aquifer.
 *
 * Definition (Jacob 1940): the barometric efficiency BE is the ratio of the change of water level in a well
 * to the change of barometric pressure expressed as a height of water column, BE = -dh / (dp / (rho g)),
 * with 0 <= BE <= 1 in a confined aquifer (BE + tidal efficiency = 1).
 *
 * Sign convention used here: a RISE of barometric pressure LOWERS the water level in a well in a confined
 * aquifer, so it RAISES depth to water and apparent drawdown, and lowers head, by BE times the pressure
 * rise in water column. The correction removes that effect:
 *   depth to water, drawdown:  d_c = d - BE (w - w_ref)
 *   head:                      h_c = h + BE (w - w_ref)
 * with w the barometric pressure expressed as water column (conventional metre of water, 1 mH2O =
 * 9806.65 Pa, from the units catalogue) in the level's length unit, w_ref the pressure at the reference time.
 *
 * Sources: Jacob, C.E. (1940). On the flow of water in an elastic artesian aquifer. Transactions, American
 * Geophysical Union 21(2), 574-586 (definition of BE). Estimation by least squares regression of level on
 * pressure, or of first differences of level on first differences of pressure: the regression methods
 * reviewed by Rasmussen, T.C. and Crawford, L.A. (1997). Identifying and removing barometric pressure
 * effects in confined and unconfined aquifers. Ground Water 35(3), 502-511 (from memory). Clark's (1967)
 * difference-summing method is a related, different estimator and is not what is implemented here.
 */
import { convert, convertArray, requireDimension } from "../units/index.js";
import { fitLine } from "./least-squares-line.js";
import { fallSign } from "./level-kind.js";
import type { WaterLevelKind } from "./level-kind.js";
import { CorrectionError, formatNumber, requireFinite, requireSameLength } from "./record.js";
import type { CorrectionRecord, CorrectionResult } from "./record.js";

const JACOB_1940 =
  "Jacob, C.E. (1940). On the flow of water in an elastic artesian aquifer. Transactions, American Geophysical Union 21(2), 574-586.";
/** The review's volume and pages are from memory. */
const REGRESSION_SOURCE =
  "Least squares regression of water level on barometric pressure in water column, as reviewed by Rasmussen, T.C. and " +
  "Crawford, L.A. (1997), Ground Water 35(3), 502-511; BE as defined by Jacob (1940).";

/** Water levels and the barometric pressures read at the same times. */
export interface BarometricData {
  /** Water-level readings, in levelUnit. */
  readonly levels: ArrayLike<number>;
  /** What the readings measure; decides the sign of the correction. */
  readonly levelKind: WaterLevelKind;
  /** Length unit of levels, e.g. "m" or "ft". */
  readonly levelUnit: string;
  /** Barometric pressure at each reading, in pressureUnit. */
  readonly pressures: ArrayLike<number>;
  /** Pressure unit, e.g. "hPa", "mbar", "kPa", "psi", "inH2O", "mH2O". */
  readonly pressureUnit: string;
}

/** How the barometric efficiency is regressed. */
export type BarometricRegressionMethod = "differences" | "levels";

/** Options of `estimateBarometricEfficiency`. */
export interface BarometricEfficiencyOptions extends BarometricData {
  /**
   * "differences" (default): regress the change of level between successive readings on the change of
   * pressure, with an intercept; a steady linear trend at regular reading intervals goes into the intercept.
   * "levels": regress the levels on the pressures, with an intercept; a trend biases BE.
   */
  readonly method?: BarometricRegressionMethod;
}

/** A barometric efficiency estimated by regression, with its uncertainty. */
export interface BarometricEfficiencyEstimate {
  /** Barometric efficiency, dimensionless. */
  readonly efficiency: number;
  /** Standard error of BE from the regression (ordinary least squares, independent errors assumed). */
  readonly standardError: number;
  /** 95 % interval of BE with the Student t quantile for n - 2 degrees of freedom. */
  readonly interval95: readonly [number, number];
  /** Coefficient of determination of the regression. */
  readonly rSquared: number;
  /** Number of pairs regressed (readings, or differences between successive readings). */
  readonly n: number;
  readonly method: BarometricRegressionMethod;
  /** Intercept, in levelUnit (per reading interval for "differences"), oriented so that positive means falling level. */
  readonly intercept: number;
  readonly levelUnit: string;
  /** Physical-range or fit-quality warnings (empty when none). */
  readonly warnings: readonly string[];
}

/** Barometric pressures converted to water column (conventional metre of water) in `levelUnit`. */
export function pressureAsWaterColumn(pressures: ArrayLike<number>, pressureUnit: string, levelUnit: string): Float64Array {
  requireDimension(pressureUnit, "pressure", "the barometric pressures");
  requireDimension(levelUnit, "length", "the water levels");
  const metresOfWater = convertArray(pressures, pressureUnit, "mH2O");
  return convertArray(metresOfWater, "m", levelUnit);
}

function checkData(data: BarometricData): Float64Array {
  requireSameLength(data.levels, "levels", data.pressures, "pressures");
  requireFinite(data.levels, "levels");
  requireFinite(data.pressures, "pressures");
  return pressureAsWaterColumn(data.pressures, data.pressureUnit, data.levelUnit);
}

/**
 * Barometric efficiency BE (dimensionless) by least squares regression of water level (oriented so that it
 * grows as the level falls) on barometric pressure as water column, both in levelUnit; slope = BE.
 * Use readings without pumping (before the test or after full recovery), at regular intervals.
 * Source: Jacob (1940) for BE; regression as reviewed by Rasmussen and Crawford (1997, from memory).
 * @throws CorrectionError when fewer than 3 pairs remain, lengths differ, values are not finite or the
 *   pressure never changes; UnitError for a unit of the wrong dimension.
 */
export function estimateBarometricEfficiency(options: BarometricEfficiencyOptions): BarometricEfficiencyEstimate {
  const method = options.method ?? "differences";
  const w = checkData(options);
  const sign = fallSign(options.levelKind);
  const n = options.levels.length;
  let x: Float64Array;
  let y: Float64Array;
  if (method === "differences") {
    x = new Float64Array(Math.max(n - 1, 0));
    y = new Float64Array(Math.max(n - 1, 0));
    for (let i = 0; i + 1 < n; i++) {
      x[i] = w[i + 1]! - w[i]!;
      y[i] = sign * (options.levels[i + 1]! - options.levels[i]!);
    }
  } else {
    x = w;
    y = Float64Array.from(options.levels, (v) => sign * v);
  }
  if (x.length < 3) {
    throw new CorrectionError(
      `barometric efficiency by regression on ${method} needs at least 3 pairs, got ${x.length} from ${n} readings; give more readings`,
    );
  }
  const line = fitLine(x, y, "barometric efficiency regression (pressure is the x variable)");
  const warnings: string[] = [];
  const low = line.slope - line.slopeHalfWidth95;
  const high = line.slope + line.slopeHalfWidth95;
  if (line.slope < 0 || line.slope > 1) {
    warnings.push(
      `BE = ${formatNumber(line.slope)} lies outside 0..1, the range for a confined aquifer (Jacob 1940); check the sign convention ` +
        `(levelKind '${options.levelKind}'), the pressure unit, a lag between pressure and level, or pumping during the record`,
    );
  }
  if (line.rSquared < 0.5) {
    warnings.push(`r² = ${formatNumber(line.rSquared)}: pressure explains little of the level changes; BE is poorly determined`);
  }
  return {
    efficiency: line.slope,
    standardError: line.slopeStandardError,
    interval95: [low, high],
    rSquared: line.rSquared,
    n: x.length,
    method,
    intercept: line.intercept,
    levelUnit: options.levelUnit,
    warnings,
  };
}

/** Options of `correctBarometric`. */
export interface BarometricCorrectionOptions extends BarometricData {
  /** BE, dimensionless, given or as estimated by `estimateBarometricEfficiency`. */
  readonly efficiency: number | BarometricEfficiencyEstimate;
  /** Barometric pressure at which the levels are taken as uncorrected (in pressureUnit); default the first pressure. */
  readonly referencePressure?: number;
}

/**
 * Removes the barometric effect from water levels: d_c = d - BE (w - w_ref) for depth to water and
 * drawdown, h_c = h + BE (w - w_ref) for head, w the pressure as water column in levelUnit (1 mH2O =
 * 9806.65 Pa). Result in levelUnit. Source: Jacob (1940).
 * @throws CorrectionError on unequal lengths, non-finite values or a BE that is not finite.
 */
export function correctBarometric(options: BarometricCorrectionOptions): CorrectionResult {
  const estimate = typeof options.efficiency === "number" ? null : options.efficiency;
  const be = typeof options.efficiency === "number" ? options.efficiency : options.efficiency.efficiency;
  if (!Number.isFinite(be)) throw new CorrectionError(`barometric efficiency is ${be}; give a finite BE, usually between 0 and 1`);
  const w = checkData(options);
  if (w.length === 0) throw new CorrectionError("no readings given; give levels and pressures");
  const pRef = options.referencePressure ?? options.pressures[0]!;
  if (!Number.isFinite(pRef)) throw new CorrectionError(`referencePressure is ${pRef}; give a finite pressure in ${options.pressureUnit}`);
  const wRef = pressureAsWaterColumn([pRef], options.pressureUnit, options.levelUnit)[0]!;
  const sign = fallSign(options.levelKind);
  const values = new Float64Array(w.length);
  let largest = 0;
  for (let i = 0; i < w.length; i++) {
    const effect = sign * be * (w[i]! - wRef);
    values[i] = options.levels[i]! - effect;
    largest = Math.max(largest, Math.abs(effect));
  }
  const warnings: string[] = [...(estimate?.warnings ?? [])];
  if (estimate === null && (be < 0 || be > 1)) {
    warnings.push(`BE = ${formatNumber(be)} lies outside 0..1, the range for a confined aquifer (Jacob 1940)`);
  }
  const parameters: Record<string, CorrectionRecord["parameters"][string]> = {
    barometricEfficiency: be,
    levelKind: options.levelKind,
    referencePressure: { value: pRef, unit: options.pressureUnit },
    waterColumnConversion: { value: convert(1, "mH2O", "Pa"), unit: "Pa per mH2O" },
  };
  if (estimate !== null) {
    parameters["barometricEfficiencyStandardError"] = estimate.standardError;
    parameters["barometricEfficiencyLow95"] = estimate.interval95[0];
    parameters["barometricEfficiencyHigh95"] = estimate.interval95[1];
    parameters["rSquared"] = estimate.rSquared;
    parameters["regressionMethod"] = estimate.method;
    parameters["regressionPairs"] = estimate.n;
  }
  const origin =
    estimate === null
      ? "given"
      : `estimated by regression on ${estimate.method} (n = ${estimate.n}, standard error ${formatNumber(estimate.standardError)}, r² = ${formatNumber(estimate.rSquared)})`;
  const direction = sign === 1 ? "subtracted from" : "added to";
  return {
    values,
    record: {
      method: "barometric efficiency correction",
      source: estimate === null ? JACOB_1940 : `${JACOB_1940} ${REGRESSION_SOURCE}`,
      parameters,
      summary:
        `BE = ${formatNumber(be)} (${origin}) times the change of barometric pressure since ${formatNumber(pRef)} ${options.pressureUnit}, ` +
        `as water column in ${options.levelUnit}, ${direction} ${w.length} ${options.levelKind} readings ` +
        `(a pressure rise lowers the level in a confined aquifer); largest change ${formatNumber(largest)} ${options.levelUnit}.`,
      warnings,
    },
  };
}
