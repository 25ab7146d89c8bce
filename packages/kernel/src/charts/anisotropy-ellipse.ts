import { ChartInputError, linearAxis, VEGA_LITE_SCHEMA } from "./log-axis.js";

/** Input of the anisotropy plot: ellipse points (any scale) and the wells' plan coordinates (m). */
export interface AnisotropyEllipseInput {
  ellipse: { x: ArrayLike<number>; y: ArrayLike<number> };
  wells: readonly { name: string; x: number; y: number }[];
  title?: string;
}

/**
 * The transmissivity ellipse of a Papadopulos (1965) fit (radius sqrt(T) in each direction) drawn around the pumping
 * well, scaled so that its largest radius equals the distance of the farthest well, with the wells (m) as labelled
 * points: the ellipse shows the shape and direction, the wells where the data came from.
 */
export function anisotropyEllipseChart(input: AnisotropyEllipseInput): Record<string, unknown> {
  const n = input.ellipse.x.length;
  if (n !== input.ellipse.y.length || n < 3) throw new ChartInputError("ellipse needs x and y of equal length (at least 3 points), as aq.transmissivityEllipse gives them");
  let radius = 0;
  for (let i = 0; i < n; i++) radius = Math.max(radius, Math.hypot(input.ellipse.x[i]!, input.ellipse.y[i]!));
  const reach = Math.max(...input.wells.map((w) => Math.hypot(w.x, w.y)));
  const scale = radius > 0 && reach > 0 ? reach / radius : 1;
  const curve = Array.from({ length: n }, (_, i) => ({ x: input.ellipse.x[i]! * scale, y: input.ellipse.y[i]! * scale, order: i, series: "transmissivity ellipse (scaled)" }));
  const wells = [{ name: "pumping well", x: 0, y: 0 }, ...input.wells].map((w) => ({ x: w.x, y: w.y, name: w.name, series: w.name === "pumping well" ? "pumping well" : "observation wells" }));
  const span = Math.max(reach, 1) * 1.15;
  const x = { field: "x", type: "quantitative", ...linearAxis("x (m)"), scale: { domain: [-span, span] } };
  const y = { field: "y", type: "quantitative", ...linearAxis("y (m)"), scale: { domain: [-span, span] } };
  const color = { field: "series", type: "nominal", title: null };
  return {
    $schema: VEGA_LITE_SCHEMA,
    title: input.title ?? "Horizontal anisotropy: transmissivity ellipse and wells",
    width: 400,
    height: 400,
    layer: [
      { data: { values: curve }, mark: "line", encoding: { x, y, order: { field: "order", type: "quantitative" }, color } },
      { data: { values: wells }, mark: { type: "point", filled: true, size: 60 }, encoding: { x, y, color } },
      { data: { values: wells }, mark: { type: "text", dx: 8, dy: -8, align: "left" }, encoding: { x, y, text: { field: "name", type: "nominal" } } },
    ],
  };
}
