/**
 * Log axes for hydrogeology plots, as Vega-Lite axis and scale settings: tick marks at 1..9 x 10^k, labels only
 * at decades, longer ticks and a stronger grid line at decades (common practice, no source). Decades are
 * recognised by comparing log10 of the tick value with the nearest integer within 1e-9, not by exact equality,
 * since 10^k in floating point is not always an exact power.
 */

/** Vega expression true when `datum.value` is a power of ten (within 1e-9 in log10). */
export const DECADE_TEST = "abs(log(datum.value) / LN10 - round(log(datum.value) / LN10)) < 1e-9";

/** Tick values 1..9 x 10^k spanning [min, max] (both > 0); empty when the range is empty or not positive. */
export function logTickValues(min: number, max: number): number[] {
  if (!(min > 0) || !(max >= min) || !Number.isFinite(max)) return [];
  const ticks: number[] = [];
  for (let k = Math.floor(Math.log10(min)); k <= Math.ceil(Math.log10(max)); k++) {
    for (let m = 1; m <= 9; m++) {
      const v = Number(`${m}e${k}`);
      if (v >= min * (1 - 1e-12) && v <= max * (1 + 1e-12)) ticks.push(v);
    }
  }
  return ticks;
}

/** The decades enclosing [min, max]: [10^floor(log10 min), 10^ceil(log10 max)]. */
export function decadeDomain(min: number, max: number): [number, number] {
  const lo = Number(`1e${Math.floor(Math.log10(min))}`);
  let hi = Number(`1e${Math.ceil(Math.log10(max))}`);
  if (hi <= lo) hi = lo * 10;
  return [lo, hi];
}

/** Smallest and largest finite value > 0 of the given arrays, or undefined when there is none. */
export function positiveExtent(...arrays: ArrayLike<number>[]): [number, number] | undefined {
  let lo = Infinity;
  let hi = -Infinity;
  for (const a of arrays) {
    for (let i = 0; i < a.length; i++) {
      const v = a[i]!;
      if (v > 0 && Number.isFinite(v)) {
        if (v < lo) lo = v;
        if (v > hi) hi = v;
      }
    }
  }
  return lo <= hi ? [lo, hi] : undefined;
}

/** Vega-Lite `scale` and `axis` for a log axis over the given positive data extent. */
export function logAxis(title: string, extent: [number, number] | undefined): { scale: object; axis: object } {
  const domain = extent ? decadeDomain(extent[0], extent[1]) : [1, 10];
  return {
    scale: { type: "log", domain, nice: false },
    axis: {
      title,
      values: logTickValues(domain[0]!, domain[1]!),
      labelExpr: `${DECADE_TEST} ? format(datum.value, '~g') : ''`,
      tickSize: { condition: { test: DECADE_TEST, value: 8 }, value: 4 },
      gridOpacity: { condition: { test: DECADE_TEST, value: 0.6 }, value: 0.2 },
    },
  };
}

/** Linear axis settings with a title. */
export function linearAxis(title: string, zero = false): { scale: object; axis: object } {
  return { scale: { type: "linear", zero }, axis: { title } };
}

/** Records { [xName]: x[i], [yName]: y[i] } for the points where both are finite and, for log axes, > 0. */
export function pointRecords(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  names: [string, string],
  positive: [boolean, boolean],
  extra: Record<string, string> = {},
): Record<string, number | string>[] {
  if (x.length !== y.length) {
    throw new ChartInputError(`${names[0]} has ${x.length} values but ${names[1]} has ${y.length}; give one ${names[1]} per ${names[0]}`);
  }
  const out: Record<string, number | string>[] = [];
  for (let i = 0; i < x.length; i++) {
    const a = x[i]!;
    const b = y[i]!;
    if (!Number.isFinite(a) || !Number.isFinite(b)) continue;
    if ((positive[0] && a <= 0) || (positive[1] && b <= 0)) continue;
    out.push({ [names[0]]: a, [names[1]]: b, ...extra });
  }
  return out;
}

/** Bad input to a chart builder; the message says which field and what would fix it. */
export class ChartInputError extends Error {
  override readonly name = "ChartInputError";
}

/** The Vega-Lite schema the specs are written for (vega-lite 6). */
export const VEGA_LITE_SCHEMA = "https://vega.github.io/schema/vega-lite/v6.json";
