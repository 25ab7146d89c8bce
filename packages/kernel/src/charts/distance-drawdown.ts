import { linearAxis, logAxis, pointRecords, positiveExtent, VEGA_LITE_SCHEMA } from "./log-axis.js";

/** Input of the distance-drawdown plot: drawdown at one time in several wells at distances r. */
export interface DistanceDrawdownInput {
  r: ArrayLike<number>;
  s: ArrayLike<number>;
  /** Straight line s = slope log10(r0 / r): slope in length unit per log cycle, r0 where s = 0 (length unit). */
  line?: { slope: number; r0: number };
  lengthUnit?: string;
  title?: string;
}

/**
 * Distance-drawdown plot: drawdown against log distance at one time, with the Cooper-Jacob line
 * s = slope log10(r0 / r), slope = 2.303 Q / (2 pi T) (Cooper and Jacob 1946). Points with r <= 0 are left out.
 */
export function distanceDrawdownChart(input: DistanceDrawdownInput): Record<string, unknown> {
  const lu = input.lengthUnit ?? "m";
  const points = pointRecords(input.r, input.s, ["r", "s"], [true, false], { series: "drawdown" });
  const extent = positiveExtent(points.map((p) => p.r as number), input.line ? [input.line.r0] : []);
  const x = { field: "r", type: "quantitative", ...logAxis(`distance (${lu})`, extent) };
  const y = { field: "s", type: "quantitative", ...linearAxis(`drawdown (${lu})`, true) };
  const color = { field: "series", type: "nominal", title: null };
  const layer: unknown[] = [{ data: { values: points }, mark: { type: "point", filled: true }, encoding: { x, y, color } }];
  if (input.line && extent) {
    const { slope, r0 } = input.line;
    const hi = Math.max(extent[1], r0);
    const values = [extent[0], hi].map((r) => ({ r, s: slope * Math.log10(r0 / r), series: "straight line" }));
    layer.push({ data: { values }, mark: "line", encoding: { x, y, color } });
  }
  return { $schema: VEGA_LITE_SCHEMA, title: input.title ?? "Distance-drawdown", width: 480, height: 360, layer };
}
