import { logAxis, pointRecords, positiveExtent, VEGA_LITE_SCHEMA } from "./log-axis.js";

/** Input of the log-log drawdown plot; times in `timeUnit`, drawdowns in `lengthUnit`. */
export interface LogLogDrawdownInput {
  t: ArrayLike<number>;
  s: ArrayLike<number>;
  /** A fitted model or type curve drawn as a line. */
  model?: { t: ArrayLike<number>; s: ArrayLike<number>; label?: string };
  /** Drawdown derivative ds/d ln t (same length unit), drawn as a second set of points. */
  derivative?: { t: ArrayLike<number>; ds: ArrayLike<number> };
  timeUnit?: string;
  lengthUnit?: string;
  title?: string;
}

/**
 * Log-log plot of drawdown against time, with an optional model curve and derivative points: the diagnostic
 * plot of a pumping test (common practice, no source). Points with t <= 0 or s <= 0 are left out (a log axis
 * cannot show them).
 */
export function logLogDrawdownChart(input: LogLogDrawdownInput): Record<string, unknown> {
  const tu = input.timeUnit ?? "d";
  const lu = input.lengthUnit ?? "m";
  const records = pointRecords(input.t, input.s, ["t", "s"], [true, true], { series: "drawdown" });
  if (input.derivative) records.push(...pointRecords(input.derivative.t, input.derivative.ds, ["t", "s"], [true, true], { series: "derivative" }));
  const modelLabel = input.model?.label ?? "model";
  const curve = input.model ? pointRecords(input.model.t, input.model.s, ["t", "s"], [true, true], { series: modelLabel }) : [];
  const tAll = [...records, ...curve].map((r) => r.t as number);
  const sAll = [...records, ...curve].map((r) => r.s as number);
  const x = { field: "t", type: "quantitative", ...logAxis(`time (${tu})`, positiveExtent(tAll)) };
  const y = { field: "s", type: "quantitative", ...logAxis(`drawdown (${lu})`, positiveExtent(sAll)) };
  const color = { field: "series", type: "nominal", title: null };
  const layer: unknown[] = [{ data: { values: records }, mark: { type: "point", filled: true }, encoding: { x, y, color, shape: color } }];
  if (curve.length) layer.push({ data: { values: curve }, mark: { type: "line" }, encoding: { x, y, color } });
  return { $schema: VEGA_LITE_SCHEMA, title: input.title ?? "Drawdown (log-log)", width: 480, height: 360, layer };
}
