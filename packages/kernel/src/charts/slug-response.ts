import { linearAxis, logAxis, pointRecords, positiveExtent, VEGA_LITE_SCHEMA } from "./log-axis.js";

/** Input of the slug-test plot: normalized head H/H0 at times in `timeUnit`, with an optional model curve. */
export interface SlugResponseInput {
  t: ArrayLike<number>;
  h: ArrayLike<number>;
  model?: { t: ArrayLike<number>; h: ArrayLike<number>; label?: string };
  timeUnit?: string;
  /** Logarithmic time axis (the usual one for overdamped tests); default true. Linear for oscillating records. */
  logTime?: boolean;
  title?: string;
}

/** Normalized head H/H0 against time, readings as points and the fitted model as a line. */
export function slugResponseChart(input: SlugResponseInput): Record<string, unknown> {
  const tu = input.timeUnit ?? "d";
  const logTime = input.logTime !== false;
  const points = pointRecords(input.t, input.h, ["t", "h"], [logTime, false], { series: "readings" });
  const curve = input.model ? pointRecords(input.model.t, input.model.h, ["t", "h"], [logTime, false], { series: input.model.label ?? "model" }) : [];
  const extent = positiveExtent(points.map((p) => p.t as number), curve.map((p) => p.t as number));
  const x = { field: "t", type: "quantitative", ...(logTime ? logAxis(`time (${tu})`, extent) : linearAxis(`time (${tu})`, true)) };
  const y = { field: "h", type: "quantitative", ...linearAxis("normalized head H/H0 (1)") };
  const color = { field: "series", type: "nominal", title: null };
  const layer: unknown[] = [{ data: { values: points }, mark: { type: "point", filled: true }, encoding: { x, y, color } }];
  if (curve.length > 0) layer.push({ data: { values: curve }, mark: "line", encoding: { x, y, color } });
  return { $schema: VEGA_LITE_SCHEMA, title: input.title ?? "Slug test", width: 480, height: 360, layer };
}
