/**
 * Barometric response function by lagged regression, and an earth-tide check.
 *
 * Barometric response function (Rasmussen and Crawford 1997; the regression deconvolution of Furbish 1991):
 * with readings at a regular interval dt, the change of water level over each interval is regressed on the
 * changes of barometric pressure (as water column) over the same interval and the m intervals before it,
 *
 *   dw_i = a_0 dB_i + a_1 dB_(i-1) + ... + a_m dB_(i-m) + c  [+ earth-tide terms] + e_i,
 *
 * dw oriented so that it grows as the water level falls (depth to water, drawdown; the negative of a head) and c a
 * steady trend per interval. The response function is the cumulative sum A_k = a_0 + ... + a_k: the level change
 * k intervals after a unit step of pressure. A constant A_k is the instantaneous response of a confined aquifer
 * (A = barometric efficiency, Jacob 1940); A_k rising with the lag points to well-bore storage or skin delaying the
 * response, A_k falling towards 0 to air pressure reaching the water table through the unsaturated zone of an
 * unconfined aquifer (Rasmussen and Crawford 1997, from memory; hints, not verdicts). The corrected record
 * removes the fitted pressure response, dw_c = dw - sum_k a_k dB_(i-k), summed from the first reading that has
 * all its lags.
 * Earth-tide terms (optional): cosine and sine at the frequencies of the main gravitational constituents O1 and M2,
 * which barometric pressure does not carry (the atmospheric tides S1, S2 and K1 coincide with barometric ones and are
 * left to the pressure terms); first differences of a harmonic are a harmonic of the same frequency.
 *
 * Earth-tide check: the harmonic regression of a record (constant, linear trend, cosine and sine per constituent)
 * gives the amplitude of O1, K1, M2 and S2 with its standard error; an amplitude above three standard errors is
 * reported as present. Constituents closer in frequency than the record can separate (Rayleigh: span x frequency
 * difference < 1; M2 and S2 need 14.8 d, O1 and K1 13.7 d) are not fitted together: the one with the larger
 * gravitational amplitude (M2, then O1, K1, S2) is kept. Frequencies in cycles per day (from memory, checked here
 * against each other: O1 = M2 - K1, K1 = 1 + 1/365.2422): O1 0.9295357, K1 1.0027379, M2 1.9322736, S2 2.
 *
 * Sources: Rasmussen, T.C. and Crawford, L.A. (1997). Identifying and removing barometric pressure effects in
 * confined and unconfined aquifers. Ground Water 35(3), 502-511; Furbish, D.J. (1991). The response of water
 * level in a well to a time series of atmospheric loading under confined conditions. Water Resources Research
 * 27(4), 557-568 (both from memory); Jacob, C.E. (1940), Transactions AGU 21(2), 574-586. The frequencies of the
 * tidal constituents are facts of astronomy (from memory, checked against each other as above).
 */
import { studentTQuantile } from "../fit/student-t.js";
import { convertArray, requireDimension } from "../units/index.js";
import { pressureAsWaterColumn } from "./barometric.js";
import { fallSign, type WaterLevelKind } from "./level-kind.js";
import { regress } from "./multiple-regression.js";
import { CorrectionError, formatNumber, requireFinite, requireSameLength, type CorrectionRecord } from "./record.js";
import { portableCos, portableSin } from "../numerics/portable-math.js";

/** A tidal constituent: name, frequency in cycles per day, and whether it is also an atmospheric (barometric) tide. */
export interface TidalConstituent {
  readonly name: "O1" | "K1" | "M2" | "S2";
  readonly cyclesPerDay: number;
  readonly atmospheric: boolean;
}

/** The constituents of the check, in the order of their gravitational amplitude (M2, O1, K1, S2). */
export const TIDAL_CONSTITUENTS: readonly TidalConstituent[] = Object.freeze([
  Object.freeze({ name: "M2", cyclesPerDay: 1.9322736, atmospheric: false }),
  Object.freeze({ name: "O1", cyclesPerDay: 0.9295357, atmospheric: false }),
  Object.freeze({ name: "K1", cyclesPerDay: 1.0027379, atmospheric: true }),
  Object.freeze({ name: "S2", cyclesPerDay: 2, atmospheric: true }),
]);

const RASMUSSEN_CRAWFORD =
  "Rasmussen, T.C. and Crawford, L.A. (1997). Identifying and removing barometric pressure effects in confined and unconfined aquifers. Ground Water 35(3), 502-511.";

/** Largest relative departure of a reading interval from the median interval. */
const REGULAR_INTERVAL = 0.01;

/** Options of `barometricResponse`. */
export interface BarometricResponseOptions {
  /** Reading times in timeUnit, increasing at a regular interval (within 1 %). */
  readonly times: ArrayLike<number>;
  readonly timeUnit: string;
  /** Water levels in levelUnit, of kind levelKind (decides the sign). */
  readonly levels: ArrayLike<number>;
  readonly levelKind: WaterLevelKind;
  readonly levelUnit: string;
  /** Barometric pressures at the same times, in pressureUnit. */
  readonly pressures: ArrayLike<number>;
  readonly pressureUnit: string;
  /** Number of lags m (intervals), an integer from 0 to a third of the readings. */
  readonly lags: number;
  /** Add O1 and M2 earth-tide terms to the regression; default false. */
  readonly earthTides?: boolean;
}

/** One lag of the response function. */
export interface BarometricResponseLag {
  /** Lag, in timeUnit. */
  readonly lag: number;
  /** Regression coefficient a_k (1) and its standard error. */
  readonly coefficient: number;
  readonly coefficientStandardError: number;
  /** Cumulative response A_k = a_0 + ... + a_k (1), its standard error and 95 % interval. */
  readonly response: number;
  readonly responseStandardError: number;
  readonly response95: readonly [number, number];
}

/** Result of `barometricResponse`. */
export interface BarometricResponseResult {
  readonly method: "barometric-response-function";
  readonly timeUnit: string;
  readonly levelUnit: string;
  /** Reading interval, timeUnit. */
  readonly interval: number;
  readonly lags: BarometricResponseLag[];
  /** Trend per interval (levelUnit, positive = falling level) and its standard error. */
  readonly trendPerInterval: number;
  readonly trendStandardError: number;
  /** Earth-tide amplitudes in the regression of differences, when asked (levelUnit per interval). */
  readonly earthTideTerms: { name: string; amplitude: number }[];
  readonly rSquared: number;
  /** Residual standard deviation of the level changes, levelUnit. */
  readonly residualStandardDeviation: number;
  /** Regressed equations (readings minus lags minus one). */
  readonly n: number;
  /** Shape of the response: "flat", "rising" or "falling", with its reading as a hint. */
  readonly shape: "flat" | "rising" | "falling";
  readonly hint: string;
  /** Corrected levels in levelUnit (NaN for the first `lags` readings, which lack their lags). */
  readonly values: Float64Array;
  readonly record: CorrectionRecord;
  readonly warnings: string[];
}

function checkTimes(times: ArrayLike<number>, where: string): number {
  requireFinite(times, `${where}: times`);
  const steps: number[] = [];
  for (let i = 1; i < times.length; i++) {
    const d = times[i]! - times[i - 1]!;
    if (!(d > 0)) throw new CorrectionError(`${where}: times[${i}] = ${times[i]} is not after times[${i - 1}] = ${times[i - 1]}; give increasing times`);
    steps.push(d);
  }
  if (steps.length === 0) throw new CorrectionError(`${where}: give at least two readings`);
  const sorted = [...steps].sort((a, b) => a - b);
  const median = sorted[Math.floor(sorted.length / 2)]!;
  steps.forEach((d, i) => {
    if (Math.abs(d / median - 1) > REGULAR_INTERVAL) {
      throw new CorrectionError(
        `${where}: the interval between readings ${i} and ${i + 1} is ${formatNumber(d)}, not the regular ${formatNumber(median)} (within 1 %); ` +
          "the lagged regression needs readings at a regular interval: resample the record or fill the gap",
      );
    }
  });
  return median;
}

/**
 * The barometric response function of a water-level record by lagged regression of level changes on pressure
 * changes (Rasmussen and Crawford 1997; module comment): coefficients and cumulative response per lag (1) with
 * standard errors and 95 % intervals (Student t, n - p degrees of freedom), the trend, r^2, a hint from the shape
 * of the response, and the levels corrected for the fitted response (levelUnit). Use a record without pumping.
 * @throws CorrectionError for irregular or too few readings, unequal lengths, non-finite values or a lag count out of
 *   range; UnitError for units of the wrong dimension.
 */
export function barometricResponse(options: BarometricResponseOptions): BarometricResponseResult {
  const where = "barometricResponse";
  requireDimension(options.timeUnit, "time", "the times");
  requireSameLength(options.levels, "levels", options.pressures, "pressures");
  requireSameLength(options.times, "times", options.levels, "levels");
  requireFinite(options.levels, `${where}: levels`);
  requireFinite(options.pressures, `${where}: pressures`);
  const interval = checkTimes(options.times, where);
  const n = options.levels.length;
  const m = options.lags;
  if (!(Number.isInteger(m) && m >= 0 && m <= Math.floor(n / 3))) {
    throw new CorrectionError(`${where}: lags is ${m}; give an integer from 0 to ${Math.floor(n / 3)} (a third of the ${n} readings)`);
  }
  const w = pressureAsWaterColumn(options.pressures, options.pressureUnit, options.levelUnit);
  const sign = fallSign(options.levelKind);
  const dB = new Float64Array(n);
  for (let i = 1; i < n; i++) dB[i] = w[i]! - w[i - 1]!;
  const first = m + 1;
  const rows = n - first;
  const y = new Float64Array(rows);
  for (let i = first; i < n; i++) y[i - first] = sign * (options.levels[i]! - options.levels[i - 1]!);
  const columns: Float64Array[] = [];
  for (let k = 0; k <= m; k++) columns.push(Float64Array.from({ length: rows }, (_, j) => dB[first + j - k]!));
  columns.push(new Float64Array(rows).fill(1));
  const tides = options.earthTides === true ? TIDAL_CONSTITUENTS.filter((c) => !c.atmospheric) : [];
  const days = convertArray(options.times, options.timeUnit, "d");
  for (const c of tides) {
    const omega = 2 * Math.PI * c.cyclesPerDay;
    columns.push(Float64Array.from({ length: rows }, (_, j) => portableCos(omega * days[first + j]!)));
    columns.push(Float64Array.from({ length: rows }, (_, j) => portableSin(omega * days[first + j]!)));
  }
  const fit = regress(columns, y, true, `${where} (lagged regression of ${rows} level changes)`);
  const p = fit.p;
  const tq = studentTQuantile(0.975, rows - p);
  const lags: BarometricResponseLag[] = [];
  let response = 0;
  for (let k = 0; k <= m; k++) {
    response += fit.coefficients[k]!;
    let variance = 0;
    for (let i = 0; i <= k; i++) for (let j = 0; j <= k; j++) variance += fit.covariance[i * p + j]!;
    const se = Math.sqrt(Math.max(variance, 0));
    lags.push({
      lag: k * interval,
      coefficient: fit.coefficients[k]!,
      coefficientStandardError: Math.sqrt(fit.covariance[k * p + k]!),
      response,
      responseStandardError: se,
      response95: [response - tq * se, response + tq * se],
    });
  }
  const earthTideTerms = tides.map((c, j) => {
    const a = fit.coefficients[m + 2 + 2 * j]!;
    const b = fit.coefficients[m + 3 + 2 * j]!;
    return { name: c.name, amplitude: Math.hypot(a, b) };
  });
  // Shape: compare the last response with the first, against their combined uncertainty.
  const a0 = lags[0]!;
  const am = lags[lags.length - 1]!;
  const change = am.response - a0.response;
  const spread = 2 * Math.hypot(a0.responseStandardError, am.responseStandardError);
  const shape: BarometricResponseResult["shape"] = m === 0 || Math.abs(change) <= Math.max(spread, 0.05 * Math.abs(am.response)) ? "flat" : change > 0 ? "rising" : "falling";
  const hint =
    shape === "flat"
      ? `Hint, not a verdict: the response is about constant at ${formatNumber(am.response)} over ${m} lags: an instantaneous response, as in a confined aquifer (barometric efficiency ${formatNumber(am.response)}).`
      : shape === "rising"
        ? `Hint, not a verdict: the response rises from ${formatNumber(a0.response)} to ${formatNumber(am.response)} with the lag: well-bore storage or a skin delays the well's response (common practice).`
        : `Hint, not a verdict: the response falls from ${formatNumber(a0.response)} to ${formatNumber(am.response)} with the lag: air pressure reaching the water table through the unsaturated zone, as in an unconfined aquifer (common practice).`;
  const warnings: string[] = [];
  if (fit.rSquared < 0.3) warnings.push(`r² = ${formatNumber(fit.rSquared)}: pressure explains little of the level changes; the response is poorly determined`);
  if (am.response < -0.1 || am.response > 1.1) {
    warnings.push(`the response at the longest lag is ${formatNumber(am.response)}, outside 0..1; check the level kind '${options.levelKind}', the pressure unit and whether the well was pumped`);
  }
  const values = new Float64Array(n).fill(Number.NaN);
  values[m] = options.levels[m]!;
  for (let i = first; i < n; i++) {
    let removed = 0;
    for (let k = 0; k <= m; k++) removed += fit.coefficients[k]! * dB[i - k]!;
    values[i] = values[i - 1]! + (options.levels[i]! - options.levels[i - 1]!) - sign * removed;
  }
  const record: CorrectionRecord = {
    method: "barometric response function (lagged regression)",
    source: RASMUSSEN_CRAWFORD,
    parameters: {
      lags: m,
      interval: { value: interval, unit: options.timeUnit },
      responseAtLongestLag: am.response,
      levelKind: options.levelKind,
      earthTideTerms: tides.length > 0,
    },
    summary:
      `Level changes regressed on the pressure changes (water column) of the same interval and ${m} interval(s) before it ` +
      `(${rows} equations, r² = ${formatNumber(fit.rSquared)}); the fitted response, ${formatNumber(a0.response)} at lag 0 and ` +
      `${formatNumber(am.response)} at ${formatNumber(m * interval)} ${options.timeUnit}, was removed from the levels from reading ${m} on.`,
    warnings,
  };
  return {
    method: "barometric-response-function",
    timeUnit: options.timeUnit,
    levelUnit: options.levelUnit,
    interval,
    lags,
    trendPerInterval: fit.coefficients[m + 1]!,
    trendStandardError: Math.sqrt(fit.covariance[(m + 1) * p + m + 1]!),
    earthTideTerms,
    rSquared: fit.rSquared,
    residualStandardDeviation: fit.residualStandardDeviation,
    n: rows,
    shape,
    hint,
    values,
    record,
    warnings,
  };
}

/** Options of `earthTideCheck`. */
export interface EarthTideCheckOptions {
  /** Reading times in timeUnit (any spacing finer than 6 h; increasing). */
  readonly times: ArrayLike<number>;
  readonly timeUnit: string;
  /** Values (a water level, corrected or not), in valueUnit. */
  readonly values: ArrayLike<number>;
  readonly valueUnit: string;
}

/** One constituent of the check. */
export interface TidalAmplitude {
  readonly name: string;
  readonly periodHours: number;
  /** Amplitude (valueUnit) and its standard error (delta method). */
  readonly amplitude: number;
  readonly amplitudeStandardError: number;
  /** Amplitude above three standard errors. */
  readonly present: boolean;
  /** True for K1 and S2, which barometric pressure also carries. */
  readonly atmospheric: boolean;
}

/** Result of `earthTideCheck`. */
export interface EarthTideCheckResult {
  readonly method: "earth-tide-check";
  readonly valueUnit: string;
  readonly spanDays: number;
  readonly constituents: TidalAmplitude[];
  /** Constituents left out: not separable from a stronger one in this record's span. */
  readonly notSeparated: string[];
  readonly residualStandardDeviation: number;
  readonly notes: string[];
}

/**
 * Earth-tide check (module comment): harmonic regression of a record on a constant, a linear trend and the
 * cosine and sine of the tidal constituents O1, K1, M2 and S2 that the record's span can separate; amplitudes in
 * valueUnit with standard errors, "present" above three standard errors, and notes on what that means.
 * @throws CorrectionError for fewer than 12 readings, readings farther apart than 6 h, or a span under 1 d.
 */
export function earthTideCheck(options: EarthTideCheckOptions): EarthTideCheckResult {
  const where = "earthTideCheck";
  requireDimension(options.timeUnit, "time", "the times");
  requireDimension(options.valueUnit, "length", "the values");
  requireSameLength(options.times, "times", options.values, "values");
  requireFinite(options.times, `${where}: times`);
  requireFinite(options.values, `${where}: values`);
  const t = convertArray(options.times, options.timeUnit, "d");
  const n = t.length;
  if (n < 12) throw new CorrectionError(`${where}: ${n} readings; the check needs at least 12 over a day or more`);
  for (let i = 1; i < n; i++) {
    const d = t[i]! - t[i - 1]!;
    if (!(d > 0)) throw new CorrectionError(`${where}: times[${i}] is not after times[${i - 1}]; give increasing times`);
    if (d > 0.25) throw new CorrectionError(`${where}: readings ${i - 1} and ${i} are ${formatNumber(d * 24)} h apart; the semidiurnal tides need readings at most 6 h apart`);
  }
  const span = t[n - 1]! - t[0]!;
  if (span < 1) throw new CorrectionError(`${where}: the record spans ${formatNumber(span)} d; the check needs at least 1 d (better 15 d to separate M2 from S2)`);
  const kept: TidalConstituent[] = [];
  const notSeparated: string[] = [];
  for (const c of TIDAL_CONSTITUENTS) {
    const clash = kept.find((k) => span * Math.abs(k.cyclesPerDay - c.cyclesPerDay) < 1);
    if (clash) notSeparated.push(`${c.name} (not separable from ${clash.name} in ${formatNumber(span)} d; needs ${formatNumber(1 / Math.abs(clash.cyclesPerDay - c.cyclesPerDay))} d)`);
    else kept.push(c);
  }
  const mid = 0.5 * (t[0]! + t[n - 1]!);
  const columns: Float64Array[] = [new Float64Array(n).fill(1), Float64Array.from(t, (v) => v - mid)];
  for (const c of kept) {
    const omega = 2 * Math.PI * c.cyclesPerDay;
    columns.push(Float64Array.from(t, (v) => portableCos(omega * v)));
    columns.push(Float64Array.from(t, (v) => portableSin(omega * v)));
  }
  const fit = regress(columns, options.values, true, `${where} (harmonic regression)`);
  const p = fit.p;
  const constituents = kept.map((c, j): TidalAmplitude => {
    const ia = 2 + 2 * j;
    const ib = ia + 1;
    const a = fit.coefficients[ia]!;
    const b = fit.coefficients[ib]!;
    const amplitude = Math.hypot(a, b);
    // Delta method: dA/da = a/A, dA/db = b/A.
    const variance = amplitude > 0
      ? (a * a * fit.covariance[ia * p + ia]! + 2 * a * b * fit.covariance[ia * p + ib]! + b * b * fit.covariance[ib * p + ib]!) / (amplitude * amplitude)
      : fit.covariance[ia * p + ia]!;
    const se = Math.sqrt(Math.max(variance, 0));
    return { name: c.name, periodHours: 24 / c.cyclesPerDay, amplitude, amplitudeStandardError: se, present: amplitude > 3 * se, atmospheric: c.atmospheric };
  });
  const notes: string[] = [];
  const gravitational = constituents.filter((c) => !c.atmospheric && c.present).map((c) => c.name);
  if (gravitational.length > 0) {
    notes.push(
      `${gravitational.join(" and ")} ${gravitational.length === 1 ? "is" : "are"} present: earth tides reach the well, a sign of a confined (or semi-confined) ` +
        "response; in a drawdown record of a few millimetres they are noise to filter out before fitting (common practice, no source).",
    );
  } else {
    notes.push("No gravitational tide (O1, M2) above three standard errors: the well shows no earth-tide response at this resolution.");
  }
  if (constituents.some((c) => c.atmospheric && c.present)) {
    notes.push("K1 or S2 is present: these are also atmospheric tides; after a barometric correction they point to a response the correction left behind.");
  }
  if (notSeparated.length > 0) notes.push(`Not fitted: ${notSeparated.join("; ")}.`);
  return {
    method: "earth-tide-check",
    valueUnit: options.valueUnit,
    spanDays: span,
    constituents,
    notSeparated,
    residualStandardDeviation: fit.residualStandardDeviation,
    notes,
  };
}
