import { linearAxis, logAxis, pointRecords, positiveExtent, VEGA_LITE_SCHEMA } from "./log-axis.js";

/** Input of a specialised plot: one or more point series on common axes, with an optional straight line. */
export interface SpecialisedPlotInput {
  series: readonly { name: string; x: ArrayLike<number>; y: ArrayLike<number> }[];
  /** Straight line y = intercept + slope x over the range of the points. */
  line?: { slope: number; intercept: number; label?: string };
  xTitle: string;
  yTitle: string;
  /** Logarithmic x axis (points with x <= 0 left out), e.g. for the composite plot s against t/r^2. */
  logX?: boolean;
  title?: string;
}

/**
 * Specialised plot: s against sqrt(t) or t^(1/4) (aq.powerTimePlot), the Horner-type recovery plot (aq.hornerPlot)
 * or the composite plot s against t/r^2 of several wells (aq.compositePlot), with the fitted line.
 */
export function specialisedPlotChart(input: SpecialisedPlotInput): Record<string, unknown> {
  const logX = input.logX === true;
  const points = input.series.flatMap((s) => pointRecords(s.x, s.y, ["x", "y"], [logX, false], { series: s.name }));
  const xs = points.map((p) => p.x as number);
  const x = { field: "x", type: "quantitative", ...(logX ? logAxis(input.xTitle, positiveExtent(xs)) : linearAxis(input.xTitle, true)) };
  const y = { field: "y", type: "quantitative", ...linearAxis(input.yTitle, true) };
  const color = { field: "series", type: "nominal", title: null };
  const layer: unknown[] = [{ data: { values: points }, mark: { type: "point", filled: true }, encoding: { x, y, color } }];
  if (input.line && xs.length > 0 && Number.isFinite(input.line.slope) && Number.isFinite(input.line.intercept)) {
    const lo = logX ? Math.min(...xs) : Math.min(0, ...xs);
    const hi = Math.max(...xs);
    const { slope, intercept } = input.line;
    const label = input.line.label ?? "straight line";
    layer.push({ data: { values: [lo, hi].map((v) => ({ x: v, y: intercept + slope * v, series: label })) }, mark: "line", encoding: { x, y, color } });
  }
  return { $schema: VEGA_LITE_SCHEMA, title: input.title ?? "Specialised plot", width: 480, height: 360, layer };
}
