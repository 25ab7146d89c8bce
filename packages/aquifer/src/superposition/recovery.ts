/**
 * Recovery analysis after the pump stops.
 *
 * Theis (1935) recovery: after pumping at rate Q for tp (d), the residual drawdown at time t' = dt (d) after the
 * stop, t = tp + t' after the start, is by superposition
 *   s'(t') = Q/(4 pi T) [W(u) - W(u')],  u = r^2 S/(4 T t),  u' = r^2 S'/(4 T t'),
 * and for small u and u' (S' = S) s' = 2.303 Q/(4 pi T) log10(t/t'): a straight line through s' = 0 at t/t' = 1
 * with slope ds' = 2.303 Q/(4 pi T) per log cycle of t/t', so T = 2.303 Q/(4 pi ds').
 *
 * Agarwal (1980) equivalent time te = tp dt/(tp + dt): the recovered drawdown s_rec(dt) = s(tp) - s'(dt) plotted
 * against te follows the constant-rate drawdown curve s(te), exactly wherever the Cooper-Jacob line holds for s(dt),
 * s(tp) and s(tp + dt), since then s(tp) - s(tp + dt) + s(dt) = Q/(4 pi T) ln(2.25 T te/(r^2 S)). Earlier than
 * that it is an approximation, so fit recovery data with withRateSchedule (exact superposition) where possible.
 *
 * Sources: Theis, C.V. (1935), Trans. Am. Geophys. Union 16(2), 519-524; Agarwal, R.G. (1980), SPE 9289,
 * "A new method to account for producing time effects when drawdown type curves are used to analyze pressure
 * buildup and other test data".
 */
import { SuperpositionInputError } from "./errors.js";
import { fitStraightLine } from "./line-fit.js";

const LN10 = Math.log(10);
const FOUR_PI = 4 * Math.PI;

function checkPositive(where: string, name: string, value: number, unit: string): void {
  if (!(Number.isFinite(value) && value > 0)) {
    throw new SuperpositionInputError(`${where}: ${name} is ${value}${unit ? " " + unit : ""}; it must be a finite number > 0.`);
  }
}

/**
 * Agarwal (1980) equivalent time te = tp dt/(tp + dt), d, for pumping duration tp (d, > 0) and time since the
 * pump stopped dt (d, > 0). te < min(tp, dt) and te -> tp as dt -> infinity. Source: Agarwal (1980), SPE 9289.
 */
export function agarwalEquivalentTime(tp: number, dt: number): number {
  checkPositive("agarwalEquivalentTime", "pumping duration tp", tp, "d");
  checkPositive("agarwalEquivalentTime", "time since the pump stopped dt", dt, "d");
  return (tp * dt) / (tp + dt);
}

/** Recovery data restated as drawdown against equivalent time. */
export interface EquivalentDrawdown {
  /** Equivalent times te = tp dt/(tp + dt), d. */
  readonly te: Float64Array;
  /** Recovered drawdown s(tp) - s'(dt), m: the drawdown the constant-rate curve should show at te. */
  readonly s: Float64Array;
}

/**
 * Converts residual drawdowns s'(dt) (m) at times dt (d since the pump stopped) after pumping for tp (d) with
 * drawdown sAtStop (m) at the moment of stopping into recovered drawdown s(tp) - s'(dt) (m) at Agarwal equivalent
 * times te (d), ready to fit with any constant-rate drawdown model (geometry.Q = the rate before the stop).
 * Source: Agarwal (1980), SPE 9289.
 */
export function recoveryAsDrawdown(tp: number, sAtStop: number, dt: ArrayLike<number>, residual: ArrayLike<number>): EquivalentDrawdown {
  const where = "recoveryAsDrawdown";
  checkPositive(where, "pumping duration tp", tp, "d");
  if (!Number.isFinite(sAtStop)) throw new SuperpositionInputError(`${where}: drawdown at the stop is ${sAtStop} m; give a finite drawdown.`);
  if (dt.length !== residual.length) {
    throw new SuperpositionInputError(`${where}: ${dt.length} times but ${residual.length} residual drawdowns; pass one per time.`);
  }
  const te = new Float64Array(dt.length);
  const s = new Float64Array(dt.length);
  for (let i = 0; i < dt.length; i++) {
    checkPositive(where, `time since the stop at index ${i}`, dt[i]!, "d");
    if (!Number.isFinite(residual[i]!)) throw new SuperpositionInputError(`${where}: residual drawdown at index ${i} is ${residual[i]}; give a finite value (m).`);
    te[i] = (tp * dt[i]!) / (tp + dt[i]!);
    s[i] = sAtStop - residual[i]!;
  }
  return { te, s };
}

/** Input of {@link theisRecoveryLine}. */
export interface TheisRecoveryInput {
  /** Pumping duration before the stop, d. */
  readonly tp: number;
  /** Times since the pump stopped, d (> 0). */
  readonly dt: ArrayLike<number>;
  /** Residual drawdowns s' (m), one per time. */
  readonly residual: ArrayLike<number>;
  /** Rate before the stop, m3/d. */
  readonly Q: number;
  /**
   * Largest t/t' used (default 100). Large t/t' means soon after the stop, where u' is not small and well-bore
   * storage acts; the straight line holds for late recovery, small t/t'.
   */
  readonly maxRatio?: number;
  /**
   * With r (m) and S (1) known or assumed, points with u' = r^2 S/(4 T t') above uMax (default 0.01, common practice,
   * no source) are left out, iterating with the T of the line.
   */
  readonly screen?: { readonly r: number; readonly S: number; readonly uMax?: number };
}

/** Result of {@link theisRecoveryLine}. */
export interface TheisRecoveryResult {
  /** Transmissivity 2.303 Q/(4 pi ds'), m2/d. */
  readonly T: number;
  /** Standard error of T from the slope's, m2/d (NaN with 2 points). */
  readonly TStandardError: number;
  /** ds': residual drawdown per log10 cycle of t/t', m. */
  readonly slopePerLogCycle: number;
  /** s' of the line at t/t' = 1, m; ideally 0. */
  readonly interceptAtRatioOne: number;
  /** Indices of the points used. */
  readonly used: number[];
  /** Points left out and why. */
  readonly excluded: { readonly index: number; readonly reason: string }[];
  readonly warnings: string[];
}

/**
 * Theis (1935) recovery straight line: least squares of s' (m) on log10(t/t') over the late recovery points, and
 * T = 2.303 Q/(4 pi ds') (m2/d) from the slope ds' (m per log cycle). Valid where u' = r^2 S/(4 T t') is small
 * (<= 0.01 common practice) and storativity is the same in pumping and recovery. Source: Theis (1935).
 */
export function theisRecoveryLine(input: TheisRecoveryInput): TheisRecoveryResult {
  const where = "theisRecoveryLine";
  checkPositive(where, "pumping duration tp", input.tp, "d");
  if (!(Number.isFinite(input.Q) && input.Q !== 0)) throw new SuperpositionInputError(`${where}: rate Q is ${input.Q} m3/d; give the non-zero rate before the stop.`);
  if (input.dt.length !== input.residual.length) {
    throw new SuperpositionInputError(`${where}: ${input.dt.length} times but ${input.residual.length} residual drawdowns; pass one per time.`);
  }
  const maxRatio = input.maxRatio ?? 100;
  if (!(maxRatio > 1)) throw new SuperpositionInputError(`${where}: maxRatio is ${maxRatio}; give a value > 1.`);
  const screen = input.screen;
  if (screen) {
    checkPositive(where, "screen.r", screen.r, "m");
    checkPositive(where, "screen.S", screen.S, "");
  }
  const uMax = screen?.uMax ?? 0.01;
  const candidates: number[] = [];
  const excluded: { index: number; reason: string }[] = [];
  for (let i = 0; i < input.dt.length; i++) {
    const dt = input.dt[i]!;
    const s = input.residual[i]!;
    if (!(Number.isFinite(dt) && dt > 0) || !Number.isFinite(s)) {
      excluded.push({ index: i, reason: `time ${dt} d or residual drawdown ${s} m is not usable (need dt > 0 and finite values)` });
      continue;
    }
    const ratio = (input.tp + dt) / dt;
    if (ratio > maxRatio) {
      excluded.push({ index: i, reason: `t/t' = ${ratio.toPrecision(4)} is above maxRatio ${maxRatio} (too soon after the stop)` });
      continue;
    }
    candidates.push(i);
  }
  const x = (idx: readonly number[]) => idx.map((i) => Math.log10((input.tp + input.dt[i]!) / input.dt[i]!));
  const y = (idx: readonly number[]) => idx.map((i) => input.residual[i]!);
  const lineOf = (idx: readonly number[]) => {
    if (idx.length < 2) {
      throw new SuperpositionInputError(
        `${where}: ${idx.length} usable recovery point${idx.length === 1 ? "" : "s"} after screening; the line needs at least 2. Raise maxRatio or relax the screen.`,
      );
    }
    const xs = x(idx);
    if (xs.every((v) => v === xs[0])) throw new SuperpositionInputError(`${where}: all used points have the same t/t'; the slope is undefined.`);
    return fitStraightLine(xs, y(idx));
  };
  let used = candidates;
  let line = lineOf(used);
  let screened: { index: number; reason: string }[] = [];
  if (screen) {
    for (let iteration = 0; iteration < 50; iteration++) {
      const T = (LN10 * input.Q) / (FOUR_PI * line.slope);
      if (!(T > 0)) break;
      const next = candidates.filter((i) => (screen.r * screen.r * screen.S) / (4 * T * input.dt[i]!) <= uMax);
      screened = candidates
        .filter((i) => !next.includes(i))
        .map((i) => ({ index: i, reason: `u' = ${((screen.r * screen.r * screen.S) / (4 * T * input.dt[i]!)).toPrecision(3)} > ${uMax} with T = ${T.toPrecision(4)} m2/d` }));
      if (next.length === used.length && next.every((v, k) => v === used[k])) break;
      used = next;
      line = lineOf(used);
    }
  }
  const slope = line.slope;
  const warnings: string[] = [];
  if (!(slope > 0)) {
    throw new SuperpositionInputError(
      `${where}: residual drawdown does not fall as t/t' falls (slope ${slope.toPrecision(3)} m per log cycle); check the times since the stop and the sign of the residual drawdowns.`,
    );
  }
  const T = (LN10 * input.Q) / (FOUR_PI * slope);
  const scale = Math.max(Math.abs(slope), 1e-300);
  if (Math.abs(line.intercept) > 0.1 * scale) {
    warnings.push(
      `The line meets t/t' = 1 at s' = ${line.intercept.toPrecision(3)} m rather than 0: storativity differing between pumping and recovery, ` +
        "a boundary, recharge or a rate that was not constant can cause this; read T with care.",
    );
  }
  if (used.length < 3) warnings.push("Only 2 points define the line: no check of straightness and no standard error.");
  if (!screen) warnings.push("Without screen { r, S } the points were not checked for small u'; use late recovery data only.");
  return {
    T,
    TStandardError: (T * line.slopeStandardError) / slope,
    slopePerLogCycle: slope,
    interceptAtRatioOne: line.intercept,
    used,
    excluded: [...excluded, ...screened].sort((a, b) => a.index - b.index),
    warnings,
  };
}
