/**
 * Hints about flow regimes read from the shape of a log derivative on log-log axes. Each hint names the
 * pattern, its time range and the measured log-log slope, and says it is a hint: several physical causes
 * produce each pattern, and the user decides.
 *
 * Patterns (facts of the trade, e.g. Bourdet et al. 1989; slopes and ratios are ideal values):
 * - unit slope: well-bore storage at early time in the pumped well (drawdown and derivative both ~ t);
 * - flat: infinite-acting radial flow, where ds/d ln t = Q/(4 pi T) (Theis 1935 differentiated);
 * - falling: leakage through an aquitard or a recharge (constant-head) boundary;
 * - doubling of a flat level: one straight no-flow (barrier) boundary, whose image well adds a second
 *   Q/(4 pi T) at late time (method of images).
 *
 * Method: at each point, the least squares slope of ln(derivative) against ln t over the points within half
 * a window (windowLog10) on each side; each point is classed by that slope; runs of one class spanning at
 * least minSpanLog10 and holding at least minPoints points become hints; two flat runs whose levels differ
 * by a factor between 1.7 and 2.3 give a doubling hint. Thresholds: common practice, no source.
 */
import { requireDimension } from "../units/index.js";
import { DiagnosticError } from "./errors.js";
import { transmissivityFromDerivativeLevel } from "./transmissivity-from-level.js";

/** The patterns recognised. */
export type RegimeHintKind = "unit-slope" | "flat" | "falling" | "doubling";

/** Options of `regimeHints`; every threshold has a default. */
export interface RegimeHintOptions {
  /** Unit of the derivative values (the drawdown unit), e.g. "m"; needed for T. */
  readonly lengthUnit: string;
  /** Unit of the derivative's times, e.g. "min"; when given, the messages state time ranges with it. */
  readonly timeUnit?: string;
  /** Pumping rate; when given, flat hints carry T = Q/(4 pi level) in m2/d. */
  readonly pumpingRate?: { readonly value: number; readonly unit: string };
  /** Width of the window for the local slope, in log10 cycles; default 0.5. */
  readonly windowLog10?: number;
  /** |slope| at most this is "flat"; default 0.1. */
  readonly flatTolerance?: number;
  /** |slope - 1| at most this is "unit slope"; default 0.15. */
  readonly unitSlopeTolerance?: number;
  /** Slope at most this (or a derivative <= 0) is "falling"; default -0.3. */
  readonly fallingSlope?: number;
  /** Least span of a run, in log10 cycles; default 0.5. */
  readonly minSpanLog10?: number;
  /** Least number of points in a run; default 4. */
  readonly minPoints?: number;
  /** Range of level ratios taken as a doubling; default [1.7, 2.3]. */
  readonly doublingRatio?: readonly [number, number];
}

/** One hint. */
export interface RegimeHint {
  readonly kind: RegimeHintKind;
  /** First and last time of the pattern, in the unit of the derivative's times. */
  readonly timeStart: number;
  readonly timeEnd: number;
  readonly pointCount: number;
  /** Least squares log-log slope of the derivative over the range (null for "doubling"). */
  readonly slope: number | null;
  /** Flat: mean derivative level; doubling: later level; in lengthUnit. Null otherwise. */
  readonly level: number | null;
  /** Doubling: later flat level divided by the earlier one. Null otherwise. */
  readonly ratio: number | null;
  /** Flat hint with a pumping rate: T = Q/(4 pi level) and the range from the smallest and largest derivative in the run, m2/d. */
  readonly transmissivity: { readonly value: number; readonly low: number; readonly high: number; readonly unit: "m2/d" } | null;
  /** A sentence saying what the pattern may mean, and that it is a hint. */
  readonly message: string;
}

/** The hints and the local slopes they were read from. */
export interface RegimeHintResult {
  readonly hints: readonly RegimeHint[];
  /** Local log-log slope at each input point (NaN where the window held fewer than 3 positive points). */
  readonly localSlopes: Float64Array;
  /** Derivative values <= 0, which have no logarithm (classed as falling). */
  readonly nonPositiveCount: number;
}

type PointClass = RegimeHintKind | "other";

function fmt(x: number): string {
  return String(Number(x.toPrecision(3)));
}

function lineSlope(x: readonly number[], y: readonly number[]): number {
  const n = x.length;
  const xm = x.reduce((a, b) => a + b, 0) / n;
  const ym = y.reduce((a, b) => a + b, 0) / n;
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < n; i++) {
    sxx += (x[i]! - xm) ** 2;
    sxy += (x[i]! - xm) * (y[i]! - ym);
  }
  return sxx > 0 ? sxy / sxx : Number.NaN;
}

function localSlopes(lt: Float64Array, ld: Float64Array, halfWindow: number): Float64Array {
  const n = lt.length;
  const out = new Float64Array(n).fill(Number.NaN);
  let lo = 0;
  let hi = 0;
  for (let i = 0; i < n; i++) {
    while (lt[i]! - lt[lo]! > halfWindow) lo++;
    if (hi < i) hi = i;
    while (hi + 1 < n && lt[hi + 1]! - lt[i]! <= halfWindow) hi++;
    const x: number[] = [];
    const y: number[] = [];
    for (let m = lo; m <= hi; m++) {
      if (Number.isFinite(ld[m]!)) {
        x.push(lt[m]!);
        y.push(ld[m]!);
      }
    }
    if (x.length >= 3) out[i] = lineSlope(x, y);
  }
  return out;
}

function message(kind: RegimeHintKind, range: string, slope: string, extra: string): string {
  switch (kind) {
    case "unit-slope":
      return (
        `Hint, not a verdict: the derivative rises with log-log slope ${slope} (about 1) ${range}. In a pumped well at early time ` +
        `this is the mark of well-bore storage; check that drawdown has the same unit slope and that the casing volume makes it plausible.`
      );
    case "flat":
      return (
        `Hint, not a verdict: the derivative is nearly flat (log-log slope ${slope}) ${range} at ${extra}. This is the pattern of ` +
        `infinite-acting radial flow, where ds/d ln t = Q/(4 pi T); a short flat stretch may also be a transition between other regimes.`
      );
    case "falling":
      return (
        `Hint, not a verdict: the derivative falls (log-log slope ${slope}) ${range}. Leakage through an aquitard or a recharge ` +
        `(constant-head) boundary give this pattern; so can delayed yield, a fall in pumping rate, or noise: check the rate record.`
      );
    case "doubling":
      return (
        `Hint, not a verdict: the flat level rises ${extra} ${range}. One straight no-flow (barrier) boundary doubles the level ` +
        `(its image well adds Q/(4 pi T)); a zone of lower transmissivity or a thinning aquifer can look alike.`
      );
  }
}

/**
 * Labels recognisable patterns of a log derivative (from `bourdetDerivative`) as hints with their time
 * range, measured log-log slope and, for a flat stretch with a pumping rate, T = Q/(4 pi level) in m2/d.
 * Never a verdict: the message of every hint says so.
 * @throws DiagnosticError on unequal lengths, non-increasing or non-positive times, or bad options.
 */
export function regimeHints(
  derivative: { readonly times: ArrayLike<number>; readonly derivative: ArrayLike<number> },
  options: RegimeHintOptions,
): RegimeHintResult {
  requireDimension(options.lengthUnit, "length", "the derivative");
  if (options.timeUnit !== undefined) requireDimension(options.timeUnit, "time", "the derivative's times");
  const timeUnitText = options.timeUnit === undefined ? "" : ` ${options.timeUnit}`;
  const t = derivative.times;
  const d = derivative.derivative;
  if (t.length !== d.length) throw new DiagnosticError(`times has ${t.length} values but derivative has ${d.length}; give one value per time`);
  const window = options.windowLog10 ?? 0.5;
  const flatTol = options.flatTolerance ?? 0.1;
  const unitTol = options.unitSlopeTolerance ?? 0.15;
  const falling = options.fallingSlope ?? -0.3;
  const minSpan = options.minSpanLog10 ?? 0.5;
  const minPoints = options.minPoints ?? 4;
  const [ratioLow, ratioHigh] = options.doublingRatio ?? [1.7, 2.3];
  if (!(window > 0)) throw new DiagnosticError(`windowLog10 is ${window}; give a window width in log10 cycles, > 0`);
  const n = t.length;
  const lt = new Float64Array(n);
  const ld = new Float64Array(n);
  let nonPositive = 0;
  for (let i = 0; i < n; i++) {
    if (!(t[i]! > 0) || (i > 0 && !(t[i]! > t[i - 1]!))) {
      throw new DiagnosticError(`times[${i}] = ${t[i]}: times must be > 0 and increasing; pass the result of bourdetDerivative`);
    }
    lt[i] = Math.log10(t[i]!);
    if (d[i]! > 0) ld[i] = Math.log10(d[i]!);
    else {
      ld[i] = Number.NaN;
      nonPositive++;
    }
  }
  const slopes = localSlopes(lt, ld, window / 2);
  const classes: PointClass[] = [];
  for (let i = 0; i < n; i++) {
    const m = slopes[i]!;
    if (!(d[i]! > 0)) classes.push("falling");
    else if (Number.isNaN(m)) classes.push("other");
    else if (Math.abs(m - 1) <= unitTol) classes.push("unit-slope");
    else if (Math.abs(m) <= flatTol) classes.push("flat");
    else if (m <= falling) classes.push("falling");
    else classes.push("other");
  }
  const hints: RegimeHint[] = [];
  const flats: RegimeHint[] = [];
  let start = 0;
  for (let i = 1; i <= n; i++) {
    if (i < n && classes[i] === classes[start]) continue;
    const kind = classes[start]!;
    const end = i - 1;
    const count = end - start + 1;
    if (kind !== "other" && count >= minPoints && lt[end]! - lt[start]! >= minSpan) {
      const x: number[] = [];
      const y: number[] = [];
      let sum = 0;
      let low = Infinity;
      let high = -Infinity;
      for (let m = start; m <= end; m++) {
        sum += d[m]!;
        low = Math.min(low, d[m]!);
        high = Math.max(high, d[m]!);
        if (Number.isFinite(ld[m]!)) {
          x.push(lt[m]!);
          y.push(ld[m]!);
        }
      }
      const slope = x.length >= 2 ? lineSlope(x, y) : Number.NaN;
      const range = `from t = ${fmt(t[start]!)} to ${fmt(t[end]!)}${timeUnitText}`;
      const level = kind === "flat" ? sum / count : null;
      let transmissivity: RegimeHint["transmissivity"] = null;
      let extra = "";
      if (level !== null) {
        extra = `level ${fmt(level)} ${options.lengthUnit}`;
        if (options.pumpingRate !== undefined) {
          const unit = options.lengthUnit;
          transmissivity = {
            value: transmissivityFromDerivativeLevel(options.pumpingRate, { value: level, unit }),
            low: transmissivityFromDerivativeLevel(options.pumpingRate, { value: high, unit }),
            high: transmissivityFromDerivativeLevel(options.pumpingRate, { value: low, unit }),
            unit: "m2/d",
          };
          extra += ` (T = Q/(4 pi level) = ${fmt(transmissivity.value)} m2/d, ${fmt(transmissivity.low)} to ${fmt(transmissivity.high)} over the stretch)`;
        }
      }
      const slopeText = Number.isNaN(slope) ? "undefined (derivative <= 0)" : fmt(slope);
      const nonPositiveInRun = count - x.length;
      const note =
        nonPositiveInRun > 0
          ? ` ${nonPositiveInRun} of its ${count} derivative values are <= 0 (no log-log slope there); a derivative falling to zero is what a constant-head source gives once it holds the head.`
          : "";
      const hint: RegimeHint = {
        kind,
        timeStart: t[start]!,
        timeEnd: t[end]!,
        pointCount: count,
        slope: Number.isNaN(slope) ? null : slope,
        level,
        ratio: null,
        transmissivity,
        message: message(kind, range, slopeText, extra) + note,
      };
      hints.push(hint);
      if (kind === "flat") flats.push(hint);
    }
    start = i;
  }
  for (let a = 0; a + 1 < flats.length; a++) {
    const early = flats[a]!;
    const late = flats[a + 1]!;
    const ratio = late.level! / early.level!;
    if (ratio >= ratioLow && ratio <= ratioHigh) {
      const lateIndex = hints.indexOf(late);
      hints[lateIndex] = {
        ...late,
        message:
          late.message +
          " If the rise before it is a barrier boundary, this later level is 2 Q/(4 pi T): take T from the earlier flat level.",
      };
      hints.push({
        kind: "doubling",
        timeStart: early.timeStart,
        timeEnd: late.timeEnd,
        pointCount: early.pointCount + late.pointCount,
        slope: null,
        level: late.level,
        ratio,
        transmissivity: null,
        message: message(
          "doubling",
          `between the flat stretch ending at t = ${fmt(early.timeEnd)} and the one starting at t = ${fmt(late.timeStart)}`,
          "",
          `from ${fmt(early.level!)} to ${fmt(late.level!)} ${options.lengthUnit} (ratio ${ratio.toFixed(2)}; a barrier gives 2)`,
        ),
      });
    }
  }
  hints.sort((p, q) => p.timeStart - q.timeStart);
  return { hints, localSlopes: slopes, nonPositiveCount: nonPositive };
}
