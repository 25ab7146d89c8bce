/**
 * Flow-regime hints for the fractional slopes of a log derivative and the delayed-yield trough, beside the
 * unit slope and flat stretch of regime-hints.ts. Ideal log-log slopes of the derivative (facts of the trade,
 * e.g. Bourdet, Ayoub and Pirard 1989, SPE Formation Evaluation 4(2), 293-302; Gringarten 2008, SPE
 * Reservoir Evaluation & Engineering 11(1), 41-62, from memory):
 * - 1/2: linear flow (a vertical fracture of infinite conductivity at early time, a channel aquifer at late time);
 * - 1/4: bilinear flow (a fracture of finite conductivity);
 * - -1/2: spherical flow (a short screen in a thick aquifer, before the flow becomes radial);
 * - trough: the derivative dips between two levels (delayed yield in a water-table aquifer, or double porosity).
 * Method: the least squares slope of ln(derivative) against ln t in a moving window of windowLog10 cycles;
 * runs of points whose slope lies within a tolerance of the ideal value spanning at least minSpanLog10
 * cycles become hints; a trough is a local minimum of the smoothed derivative lower than the larger values
 * on both sides by at least troughDepth (a factor). Thresholds: common practice, no source.
 */
import { DiagnosticError } from "./errors.js";

/** The fractional-slope patterns and the trough. */
export type SlopeHintKind = "half-slope" | "quarter-slope" | "negative-half-slope" | "trough";

/** One hint; times in the unit of the input. */
export interface SlopeHint {
  readonly kind: SlopeHintKind;
  readonly timeStart: number;
  readonly timeEnd: number;
  readonly pointCount: number;
  /** Least squares log-log slope over the range (for a trough: the derivative at its minimum divided by the smaller of the two shoulders). */
  readonly value: number;
  /** What the pattern may mean; always a hint. */
  readonly message: string;
}

/** Options of slopeHints. */
export interface SlopeHintOptions {
  /** Width of the slope window, log10 cycles; default 0.5. */
  readonly windowLog10?: number;
  /** Tolerance around each ideal slope; defaults 0.08 (1/2 and -1/2), 0.06 (1/4). */
  readonly halfTolerance?: number;
  readonly quarterTolerance?: number;
  /** Least span of a run, log10 cycles; default 0.5. */
  readonly minSpanLog10?: number;
  /** A trough's shoulders must exceed its minimum by this factor; default 1.3. */
  readonly troughDepth?: number;
}

const IDEAL: Record<Exclude<SlopeHintKind, "trough">, number> = { "half-slope": 0.5, "quarter-slope": 0.25, "negative-half-slope": -0.5 };

const MEANING: Record<SlopeHintKind, string> = {
  "half-slope":
    "linear flow: a vertical fracture of high conductivity (early time) or flow between parallel boundaries (late time); confirm on a plot of s against sqrt(t)",
  "quarter-slope": "bilinear flow: a fracture of finite conductivity; confirm on a plot of s against t^(1/4)",
  "negative-half-slope":
    "spherical flow towards a short screen in a thick aquifer, before the flow becomes radial; confirm on a plot of s against 1/sqrt(t)",
  trough:
    "a dip between two levels: delayed yield from a water table, or drainage of matrix blocks in a double-porosity rock; a rate change can look alike",
};

function windowSlopes(lt: Float64Array, ld: Float64Array, half: number): Float64Array {
  const n = lt.length;
  const out = new Float64Array(n).fill(Number.NaN);
  for (let i = 0; i < n; i++) {
    let sx = 0;
    let sy = 0;
    let sxx = 0;
    let sxy = 0;
    let m = 0;
    for (let j = 0; j < n; j++) {
      if (Math.abs(lt[j]! - lt[i]!) > half || !Number.isFinite(ld[j]!)) continue;
      sx += lt[j]!;
      sy += ld[j]!;
      sxx += lt[j]! * lt[j]!;
      sxy += lt[j]! * ld[j]!;
      m++;
    }
    const d = m * sxx - sx * sx;
    if (m >= 3 && d > 0) out[i] = (m * sxy - sx * sy) / d;
  }
  return out;
}

/**
 * Hints of linear (1/2), bilinear (1/4) and spherical (-1/2) flow and of a delayed-yield trough, read from a log
 * derivative (times > 0 increasing, derivative values in any length unit). Never a verdict: every message says so.
 * @throws DiagnosticError for unequal lengths, fewer than 5 points or non-increasing times.
 */
export function slopeHints(
  derivative: { readonly times: ArrayLike<number>; readonly derivative: ArrayLike<number> },
  options: SlopeHintOptions = {},
): { hints: SlopeHint[]; localSlopes: Float64Array } {
  const { times, derivative: d } = derivative;
  const n = times.length;
  if (d.length !== n) throw new DiagnosticError(`slopeHints: ${n} times but ${d.length} derivative values; give one value per time.`);
  if (n < 5) throw new DiagnosticError(`slopeHints: ${n} points; at least 5 are needed to read a slope.`);
  for (let i = 0; i < n; i++) {
    if (!(times[i]! > 0) || (i > 0 && !(times[i]! > times[i - 1]!))) {
      throw new DiagnosticError(`slopeHints: time ${times[i]} at index ${i} is not positive and increasing; sort the record and drop t <= 0.`);
    }
  }
  const half = (options.windowLog10 ?? 0.5) * Math.LN10 * 0.5;
  const minSpan = options.minSpanLog10 ?? 0.5;
  const lt = Float64Array.from(times, (t) => Math.log(t));
  const ld = Float64Array.from(d, (v) => (v > 0 ? Math.log(v) : Number.NaN));
  const slopes = windowSlopes(lt, ld, half);
  const tolerance = (kind: Exclude<SlopeHintKind, "trough">) =>
    kind === "quarter-slope" ? options.quarterTolerance ?? 0.06 : options.halfTolerance ?? 0.08;
  const hints: SlopeHint[] = [];
  for (const kind of Object.keys(IDEAL) as Exclude<SlopeHintKind, "trough">[]) {
    let start = -1;
    const flush = (end: number): void => {
      if (start < 0) return;
      const span = (lt[end]! - lt[start]!) / Math.LN10;
      if (span >= minSpan && end - start + 1 >= 4) {
        const idx = Array.from({ length: end - start + 1 }, (_, k) => start + k).filter((k) => Number.isFinite(ld[k]!));
        const mx = idx.reduce((a, k) => a + lt[k]!, 0) / idx.length;
        const my = idx.reduce((a, k) => a + ld[k]!, 0) / idx.length;
        const sxx = idx.reduce((a, k) => a + (lt[k]! - mx) ** 2, 0);
        const sxy = idx.reduce((a, k) => a + (lt[k]! - mx) * (ld[k]! - my), 0);
        const value = sxy / sxx;
        hints.push({
          kind,
          timeStart: times[start]!,
          timeEnd: times[end]!,
          pointCount: end - start + 1,
          value,
          message: `Hint, not a verdict: the derivative has log-log slope ${value.toFixed(2)} (about ${IDEAL[kind]}) from ${Number(times[start]!.toPrecision(3))} to ${Number(times[end]!.toPrecision(3))}, the mark of ${MEANING[kind]}.`,
        });
      }
      start = -1;
    };
    for (let i = 0; i < n; i++) {
      const inside = Math.abs(slopes[i]! - IDEAL[kind]) <= tolerance(kind);
      if (inside && start < 0) start = i;
      if (!inside) flush(i - 1);
    }
    flush(n - 1);
  }
  // Trough: global minimum of the derivative strictly inside, with higher shoulders on both sides.
  const depth = options.troughDepth ?? 1.3;
  let iMin = -1;
  for (let i = 1; i < n - 1; i++) if (d[i]! > 0 && (iMin < 0 || d[i]! < d[iMin]!)) iMin = i;
  if (iMin > 0) {
    let left = 0;
    let right = 0;
    for (let i = 0; i < iMin; i++) left = Math.max(left, d[i]!);
    for (let i = iMin + 1; i < n; i++) right = Math.max(right, d[i]!);
    const shoulder = Math.min(left, right);
    if (shoulder >= depth * d[iMin]!) {
      let a = iMin;
      let b = iMin;
      while (a > 0 && d[a - 1]! < shoulder) a--;
      while (b < n - 1 && d[b + 1]! < shoulder) b++;
      hints.push({
        kind: "trough",
        timeStart: times[a]!,
        timeEnd: times[b]!,
        pointCount: b - a + 1,
        value: d[iMin]! / shoulder,
        message: `Hint, not a verdict: the derivative dips to ${(d[iMin]! / shoulder).toFixed(2)} of its shoulders around t = ${Number(times[iMin]!.toPrecision(3))}, ${MEANING.trough}.`,
      });
    }
  }
  hints.sort((x, y) => x.timeStart - y.timeStart);
  return { hints, localSlopes: slopes };
}
