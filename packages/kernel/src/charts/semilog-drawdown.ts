import { linearAxis, logAxis, pointRecords, positiveExtent, VEGA_LITE_SCHEMA } from "./log-axis.js";

/** Input of the semilog drawdown plot; times in `timeUnit`, drawdowns in `lengthUnit`. */
export interface SemilogDrawdownInput {
  t: ArrayLike<number>;
  s: ArrayLike<number>;
  /** Straight line s = slope log10(t / t0): slope in length unit per log cycle, t0 in time unit. */
  line?: { slope: number; t0: number };
  timeUnit?: string;
  lengthUnit?: string;
  title?: string;
}

/** Line records s = slope log10(x / x0) at the ends of [lo, hi]; starts at x0 when x0 lies inside. */
export function straightLineRecords(slope: number, x0: number, lo: number, hi: number, names: [string, string]): Record<string, number | string>[] {
  const start = x0 > lo && x0 < hi ? x0 : lo;
  return [start, hi].map((x) => ({ [names[0]]: x, [names[1]]: slope * Math.log10(x / x0), series: "straight line" }));
}

/**
 * Drawdown against log time with the Cooper-Jacob straight line s = slope log10(t / t0) (Cooper and Jacob 1946).
 * Points with t <= 0 are left out.
 */
export function semilogDrawdownChart(input: SemilogDrawdownInput): Record<string, unknown> {
  const tu = input.timeUnit ?? "d";
  const lu = input.lengthUnit ?? "m";
  const points = pointRecords(input.t, input.s, ["t", "s"], [true, false], { series: "drawdown" });
  const extent = positiveExtent(points.map((p) => p.t as number), input.line ? [input.line.t0] : []);
  const x = { field: "t", type: "quantitative", ...logAxis(`time (${tu})`, extent) };
  const y = { field: "s", type: "quantitative", ...linearAxis(`drawdown (${lu})`, true) };
  const color = { field: "series", type: "nominal", title: null };
  const layer: unknown[] = [{ data: { values: points }, mark: { type: "point", filled: true }, encoding: { x, y, color } }];
  if (input.line && extent) {
    layer.push({ data: { values: straightLineRecords(input.line.slope, input.line.t0, extent[0], extent[1], ["t", "s"]) }, mark: "line", encoding: { x, y, color } });
  }
  return { $schema: VEGA_LITE_SCHEMA, title: input.title ?? "Drawdown (semilog)", width: 480, height: 360, layer };
}
