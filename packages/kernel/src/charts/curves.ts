import { ChartInputError, linearAxis, logAxis, pointRecords, positiveExtent, VEGA_LITE_SCHEMA } from "./log-axis.js";

/** One named series of a curves chart: points or a line. */
export interface CurveSeries {
  label: string;
  x: ArrayLike<number>;
  y: ArrayLike<number>;
  /** "point" (default) or "line". */
  mark?: string;
}

/** Input of the curves chart: several named series on shared axes, each axis log or linear. */
export interface CurvesInput {
  series: CurveSeries[];
  xTitle: string;
  yTitle: string;
  /** "log" (default) or "linear". */
  xScale?: string;
  /** "log" (default) or "linear". */
  yScale?: string;
  title?: string;
}

/**
 * Several named series of points or lines on shared axes, each axis log (ticks at 1..9 x 10^k, labels at
 * decades) or linear, coloured and named in the legend: the composite plot of several observation wells
 * (drawdown against t/r^2), drawdown forecasts side by side, a slug test's normalised head against time.
 * Points that a log axis cannot show (<= 0) and non-finite points are left out. Common practice, no source.
 */
export function curvesChart(input: CurvesInput): Record<string, unknown> {
  const xLog = (input.xScale ?? "log") === "log";
  const yLog = (input.yScale ?? "log") === "log";
  for (const [name, value] of [["xScale", input.xScale], ["yScale", input.yScale]] as const) {
    if (value !== undefined && value !== "log" && value !== "linear") throw new ChartInputError(`${name} must be "log" or "linear", got "${value}"`);
  }
  if (input.series.length === 0) throw new ChartInputError("series is empty; give at least one { label, x, y }");
  const labels = new Set<string>();
  const points: Record<string, number | string>[] = [];
  const lines: Record<string, number | string>[] = [];
  for (const [k, s] of input.series.entries()) {
    if (labels.has(s.label)) throw new ChartInputError(`series ${k} repeats the label "${s.label}"; give each series its own label`);
    labels.add(s.label);
    const mark = s.mark ?? "point";
    if (mark !== "point" && mark !== "line") throw new ChartInputError(`series ${k} ("${s.label}"): mark must be "point" or "line", got "${mark}"`);
    (mark === "line" ? lines : points).push(...pointRecords(s.x, s.y, ["x", "y"], [xLog, yLog], { series: s.label }));
  }
  const all = [...points, ...lines];
  const xs = all.map((p) => p.x as number);
  const ys = all.map((p) => p.y as number);
  const x = { field: "x", type: "quantitative", ...(xLog ? logAxis(input.xTitle, positiveExtent(xs)) : linearAxis(input.xTitle)) };
  const y = { field: "y", type: "quantitative", ...(yLog ? logAxis(input.yTitle, positiveExtent(ys)) : linearAxis(input.yTitle)) };
  // One colour scale over every label, in the order given, so that points and lines of a label match.
  const color = { field: "series", type: "nominal", title: null, scale: { domain: [...labels] } };
  const layer: unknown[] = [];
  if (points.length) layer.push({ data: { values: points }, mark: { type: "point", filled: true }, encoding: { x, y, color, shape: { field: "series", type: "nominal", title: null } } });
  if (lines.length) layer.push({ data: { values: lines }, mark: { type: "line" }, encoding: { x, y, color, detail: { field: "series", type: "nominal" } } });
  return { $schema: VEGA_LITE_SCHEMA, title: input.title ?? "Curves", width: 480, height: 360, layer };
}
