/**
 * Thinning a long logger record so that it keeps its shape on a log time axis. Loggers sample at a fixed
 * interval, so a record of 100,000 readings holds most of them in its last decade of time, while the
 * analysis (and the eye) weighs each decade of log t alike. Binning by log10 t and keeping one real reading
 * per bin evens that out without inventing any value (common practice, no source).
 */

import type { ObservationSeries } from "./series.js";

/** How the reading kept in each bin is chosen. */
export type LogResampleMethod = "nearest-centre" | "median";

/** Options of `logResample`. */
export interface LogResampleOptions {
  /** Bins per decade of time (bin width 1/pointsPerDecade in log10 t); a positive number, e.g. 10. */
  readonly pointsPerDecade: number;
  /**
   * "nearest-centre" (default): the reading whose log10 t is nearest the bin's centre in log10 t.
   * "median": the reading with the median drawdown of the bin (the lower median for an even count), which
   * resists single spikes.
   */
  readonly method?: LogResampleMethod;
}

/** A thinned series and what was done. */
export interface LogResampleResult {
  readonly series: ObservationSeries;
  /** Readings kept. */
  readonly kept: number;
  /** Readings removed by thinning (they are not listed in `excluded`: nothing is wrong with them). */
  readonly removed: number;
  /** Index in the input series of every kept reading, increasing. */
  readonly indices: Uint32Array;
}

/** Tolerance in bins, so that a time at an exact bin edge (e.g. t = 10 with 10 per decade) lands in its own bin. */
const EDGE_TOLERANCE = 1e-9;

function binOf(logT: number, pointsPerDecade: number): number {
  return Math.floor(logT * pointsPerDecade + EDGE_TOLERANCE);
}

function pickNearestCentre(logT: Float64Array, from: number, to: number, bin: number, pointsPerDecade: number): number {
  const centre = (bin + 0.5) / pointsPerDecade;
  let best = from;
  for (let i = from + 1; i < to; i++) {
    if (Math.abs(logT[i]! - centre) < Math.abs(logT[best]! - centre)) best = i;
  }
  return best;
}

function pickMedian(drawdowns: Float64Array, from: number, to: number): number {
  const order = Array.from({ length: to - from }, (_, k) => from + k);
  order.sort((a, b) => drawdowns[a]! - drawdowns[b]! || a - b);
  return order[Math.floor((order.length - 1) / 2)]!;
}

/**
 * Thins a series on a log time axis: readings are grouped in bins of width 1/pointsPerDecade in log10 t
 * (bins anchored at whole decades of the series' time unit) and one reading per bin is kept, chosen by
 * `method`. The first and last readings are always kept (they stand for their bins). Kept readings are
 * unchanged, so the result never holds a value that was not measured; about pointsPerDecade readings
 * remain per decade with data. The input must satisfy the series invariant (times > 0, increasing).
 * @throws RangeError when pointsPerDecade is not a positive finite number or the times break the invariant.
 */
export function logResample(series: ObservationSeries, options: LogResampleOptions): LogResampleResult {
  const { pointsPerDecade } = options;
  const method = options.method ?? "nearest-centre";
  if (!(pointsPerDecade > 0) || !Number.isFinite(pointsPerDecade)) {
    throw new RangeError(`pointsPerDecade is ${pointsPerDecade}; give a positive number of readings per decade, e.g. 10`);
  }
  const { times, drawdowns } = series;
  const n = times.length;
  const logT = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    if (!(times[i]! > 0) || (i > 0 && !(times[i]! > times[i - 1]!))) {
      throw new RangeError(
        `series '${series.name}': times[${i}] = ${times[i]} is not > 0 and after the previous time; build the series with createObservationSeries`,
      );
    }
    logT[i] = Math.log10(times[i]!);
  }
  const kept: number[] = [];
  let from = 0;
  while (from < n) {
    const bin = binOf(logT[from]!, pointsPerDecade);
    let to = from + 1;
    while (to < n && binOf(logT[to]!, pointsPerDecade) === bin) to++;
    const holdsFirst = from === 0;
    const holdsLast = to === n;
    if (holdsFirst) kept.push(0);
    if (holdsLast && n - 1 !== 0) kept.push(n - 1);
    if (!holdsFirst && !holdsLast) {
      kept.push(method === "median" ? pickMedian(drawdowns, from, to) : pickNearestCentre(logT, from, to, bin, pointsPerDecade));
    }
    from = to;
  }
  const indices = Uint32Array.from(kept);
  const removed = n - indices.length;
  const note = `log-resampled to ${pointsPerDecade} per decade (${method}): ${indices.length} of ${n} readings kept, ${removed} removed`;
  const previous = series.metadata["thinning"];
  return {
    series: {
      ...series,
      times: Float64Array.from(indices, (i) => times[i]!),
      drawdowns: Float64Array.from(indices, (i) => drawdowns[i]!),
      metadata: { ...series.metadata, thinning: previous === undefined ? note : `${previous}; then ${note}` },
      excluded: [...series.excluded],
    },
    kept: indices.length,
    removed,
    indices,
  };
}
