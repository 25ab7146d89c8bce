/**
 * The log derivative ds/d ln t of Bourdet, Ayoub and Pirard (1989), for drawdown and for recovery.
 *
 * For point i, with X = ln t, the left point j is the nearest earlier point with X_i - X_j >= L and the
 * right point k the nearest later point with X_k - X_i >= L (L the smoothing length in ln t; L = 0 takes the
 * neighbours). The derivative is the spacing-weighted mean of the two slopes:
 *
 *   ds/dX (i) = [ (dS1/dX1) dX2 + (dS2/dX2) dX1 ] / (dX1 + dX2),
 *   dS1 = s_i - s_j, dX1 = X_i - X_j, dS2 = s_k - s_i, dX2 = X_k - X_i,
 *
 * which is the slope at X_i of the parabola through the three points: its error is
 * (dX1 dX2 / 6) times a mean of d^3 s/dX^3 between X_j and X_k (Taylor expansion).
 *
 * Smoothing length: the option is `smoothingLog10`, in log10 cycles as the trade usually quotes it
 * (0.1 to 0.5 is common practice, no source); internally L = smoothingLog10 * ln 10.
 * Ends: a point with no partner at distance >= L on one side is, with endpoints "one-sided" (default),
 * given the one-sided slope to its partner on the other side (first-order accurate, error about
 * dX/2 * d^2 s/dX^2), and with endpoints "omit" left out; the result counts and marks them.
 * The derivative is with respect to the natural log; ds/d log10 t is ln 10 times larger.
 *
 * Source: Bourdet, D., Ayoub, J.A., Pirard, Y.M. (1989). Use of pressure derivative in well-test
 * interpretation. SPE Formation Evaluation 4(2), 293-302.
 * Recovery: Agarwal, R.G. (1980). A new method to account for producing time effects when drawdown type
 * curves are used to analyze pressure buildup and other test data. SPE paper 9289.
 */
import { DiagnosticError } from "./errors.js";

/** What to do with points that lack a partner at distance >= L on one side. */
export type EndpointPolicy = "one-sided" | "omit";

/** How each returned derivative point was formed. */
export type DerivativeStencil = "central" | "forward" | "backward";

/** Options of the Bourdet derivative. */
export interface BourdetOptions {
  /** Smoothing length L in log10 cycles, >= 0; default 0.2 (L = 0.2 ln 10 = 0.46 in ln t). */
  readonly smoothingLog10?: number;
  /** Points within L of an end: "one-sided" slope (default) or "omit". */
  readonly endpoints?: EndpointPolicy;
}

/** The log derivative at the points where it could be formed. */
export interface LogDerivative {
  /** Times of the points kept, in the unit of the input times (for recovery: equivalent times). */
  readonly times: Float64Array;
  /** ds/d ln t at those times, in the unit of the input drawdowns. */
  readonly derivative: Float64Array;
  /** Index of each kept point in the input arrays. */
  readonly indices: readonly number[];
  /** How each kept point was formed. */
  readonly stencils: readonly DerivativeStencil[];
  readonly smoothingLog10: number;
  /** L in ln t units. */
  readonly smoothingLn: number;
  readonly endpoints: EndpointPolicy;
  /** Points given a one-sided slope (0 with endpoints "omit"). */
  readonly oneSidedCount: number;
  /** Points left out (lacking a partner on one side with "omit", on both sides with either policy). */
  readonly omittedCount: number;
  /** The time variable: "elapsed time" or "Agarwal equivalent time". */
  readonly timeVariable: string;
}

const DEFAULT_SMOOTHING_LOG10 = 0.2;

function checkInput(times: ArrayLike<number>, values: ArrayLike<number>, timeName: string, valueName: string): void {
  if (times.length !== values.length) {
    throw new DiagnosticError(`${timeName} has ${times.length} values but ${valueName} has ${values.length}; give one value per time`);
  }
  if (times.length < 2) throw new DiagnosticError(`the log derivative needs at least 2 points, got ${times.length}`);
  for (let i = 0; i < times.length; i++) {
    const t = times[i]!;
    if (!Number.isFinite(t) || t <= 0) {
      throw new DiagnosticError(`${timeName}[${i}] is ${t}; a log derivative needs finite times > 0 (drop readings at or before the start)`);
    }
    if (i > 0 && !(t > times[i - 1]!)) {
      throw new DiagnosticError(`${timeName}[${i}] = ${t} does not follow ${timeName}[${i - 1}] = ${times[i - 1]}; sort the readings and merge duplicates`);
    }
    if (!Number.isFinite(values[i]!)) throw new DiagnosticError(`${valueName}[${i}] is ${values[i]}; give finite values`);
  }
}

function resolveOptions(options: BourdetOptions): { L10: number; L: number; endpoints: EndpointPolicy } {
  const L10 = options.smoothingLog10 ?? DEFAULT_SMOOTHING_LOG10;
  if (!Number.isFinite(L10) || L10 < 0) {
    throw new DiagnosticError(`smoothingLog10 is ${L10}; give a smoothing length in log10 cycles, >= 0 (0.1 to 0.5 is usual)`);
  }
  const endpoints = options.endpoints ?? "one-sided";
  if (endpoints !== "one-sided" && endpoints !== "omit") {
    throw new DiagnosticError(`endpoints is '${String(endpoints)}'; use "one-sided" or "omit"`);
  }
  return { L10, L: L10 * Math.LN10, endpoints };
}

/** The Bourdet derivative of `values` against ln `times`; times checked by the callers. */
function logDerivative(times: ArrayLike<number>, values: ArrayLike<number>, options: BourdetOptions, timeVariable: string): LogDerivative {
  const { L10, L, endpoints } = resolveOptions(options);
  const n = times.length;
  const X = Float64Array.from(times, Math.log);
  // Tolerance so that points placed exactly L apart on a log grid count as "at distance L".
  const reach = L * (1 - 1e-12);
  const outT: number[] = [];
  const outD: number[] = [];
  const indices: number[] = [];
  const stencils: DerivativeStencil[] = [];
  let oneSided = 0;
  let omitted = 0;
  let j = -1; // nearest earlier point at distance >= L, advanced monotonically
  let k = 0; // nearest later point at distance >= L
  for (let i = 0; i < n; i++) {
    while (j + 1 < i && X[i]! - X[j + 1]! >= reach) j++;
    const left = j >= 0 && X[i]! - X[j]! >= reach ? j : -1;
    if (k <= i) k = i + 1;
    while (k < n && X[k]! - X[i]! < reach) k++;
    const right = k < n ? k : -1;
    let d: number;
    let stencil: DerivativeStencil;
    if (left >= 0 && right >= 0) {
      const dX1 = X[i]! - X[left]!;
      const dX2 = X[right]! - X[i]!;
      const m1 = (values[i]! - values[left]!) / dX1;
      const m2 = (values[right]! - values[i]!) / dX2;
      d = (m1 * dX2 + m2 * dX1) / (dX1 + dX2);
      stencil = "central";
    } else if (endpoints === "one-sided" && (left >= 0 || right >= 0)) {
      const p = left >= 0 ? left : right;
      d = (values[p]! - values[i]!) / (X[p]! - X[i]!);
      stencil = left >= 0 ? "backward" : "forward";
      oneSided++;
    } else {
      omitted++;
      continue;
    }
    outT.push(times[i]!);
    outD.push(d);
    indices.push(i);
    stencils.push(stencil);
  }
  return {
    times: Float64Array.from(outT),
    derivative: Float64Array.from(outD),
    indices,
    stencils,
    smoothingLog10: L10,
    smoothingLn: L,
    endpoints,
    oneSidedCount: oneSided,
    omittedCount: omitted,
    timeVariable,
  };
}

/**
 * Bourdet et al. (1989) derivative ds/d ln t of drawdown during pumping. Times > 0 strictly increasing
 * (any time unit: the derivative does not depend on it); result in the drawdown unit.
 * @throws DiagnosticError on unequal lengths, fewer than 2 points, times not > 0 and increasing, or a bad option.
 */
export function bourdetDerivative(times: ArrayLike<number>, drawdowns: ArrayLike<number>, options: BourdetOptions = {}): LogDerivative {
  checkInput(times, drawdowns, "times", "drawdowns");
  return logDerivative(times, drawdowns, options, "elapsed time");
}

/** Recovery readings after the pump stopped. */
export interface RecoveryData {
  /** Times since the pump stopped, > 0 and increasing, in one time unit with pumpingDuration. */
  readonly timesSinceStop: ArrayLike<number>;
  /** Residual drawdowns s' (level below the static level) at those times, in a length unit. */
  readonly residualDrawdowns: ArrayLike<number>;
  /** Duration tp of pumping at a constant rate before the stop, > 0. */
  readonly pumpingDuration: number;
  /** Drawdown at the moment the pump stopped; when given, the recovery s(tp) - s' is returned too. */
  readonly drawdownAtStop?: number;
}

/** The recovery derivative with the equivalent times. */
export interface RecoveryLogDerivative extends LogDerivative {
  /** Agarwal equivalent times te = dt tp / (dt + tp) of every input reading, in the input time unit. */
  readonly equivalentTimes: Float64Array;
  /** Recovery s(tp) - s' of every input reading when drawdownAtStop was given, else null. */
  readonly recovery: Float64Array | null;
}

/**
 * Bourdet derivative of the recovery against the Agarwal (1980) equivalent time te = dt tp/(dt + tp):
 * d(s(tp) - s')/d ln te = -ds'/d ln te, in the drawdown unit; `times` of the result are equivalent times.
 * In infinite-acting radial flow it equals Q/(4 pi T), the drawdown derivative's level (Cooper-Jacob
 * superposition); it is exact for the Theis solution only in that limit. Source: Agarwal (1980),
 * Bourdet et al. (1989).
 * @throws DiagnosticError for bad times or values, or pumpingDuration not > 0.
 */
export function bourdetRecoveryDerivative(data: RecoveryData, options: BourdetOptions = {}): RecoveryLogDerivative {
  checkInput(data.timesSinceStop, data.residualDrawdowns, "timesSinceStop", "residualDrawdowns");
  const tp = data.pumpingDuration;
  if (!(tp > 0) || !Number.isFinite(tp)) {
    throw new DiagnosticError(`pumpingDuration is ${tp}; give the duration of pumping before the stop, > 0, in the unit of timesSinceStop`);
  }
  if (data.drawdownAtStop !== undefined && !Number.isFinite(data.drawdownAtStop)) {
    throw new DiagnosticError(`drawdownAtStop is ${data.drawdownAtStop}; give a finite drawdown or leave it out`);
  }
  const n = data.timesSinceStop.length;
  const te = new Float64Array(n);
  const rise = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const dt = data.timesSinceStop[i]!;
    te[i] = (dt * tp) / (dt + tp);
    rise[i] = -data.residualDrawdowns[i]!;
  }
  for (let i = 1; i < n; i++) {
    if (!(te[i]! > te[i - 1]!)) {
      throw new DiagnosticError(
        `equivalent times ${te[i - 1]} and ${te[i]} at readings ${i - 1} and ${i} do not increase: times since stop are so late against tp = ${tp} that te has reached its limit tp in floating point`,
      );
    }
  }
  const base = logDerivative(te, rise, options, "Agarwal equivalent time");
  const stop = data.drawdownAtStop;
  return {
    ...base,
    equivalentTimes: te,
    recovery: stop === undefined ? null : Float64Array.from(data.residualDrawdowns, (s) => stop - s),
  };
}
