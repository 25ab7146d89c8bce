/**
 * Drawing a chart output's Vega-Lite spec as SVG on Node, offline and without eval: vega-lite compiles it, vega
 * parses it to an AST (`ast: true`) evaluated by vega-interpreter, the view renders headless (`renderer: "none"`,
 * no canvas) and `toSVG()` writes the markup. The loader refuses every load (the data is inline), `usermeta`
 * is removed, and links are taken out of the SVG; a drawing with other active content (scripts,
 * event handlers, URLs) is refused.
 */
import * as vega from "vega";
import { compile } from "vega-lite";
import { expressionInterpreter } from "vega-interpreter";
import type { ChartPicture } from "./outputs-html.js";

/** A loader that loads nothing: `load` refuses, `sanitize` yields an empty href (throwing there crashes vega). */
function refusingLoader(refused: string[]): vega.Loader {
  const loader = vega.loader();
  loader.load = async (uri: string) => {
    refused.push(uri);
    throw new Error(`refused to load ${uri}`);
  };
  loader.sanitize = async () => ({ href: "" });
  return loader;
}

const TAG = /<([A-Za-z][^\s/>]*)((?:\s+[^\s=/>]+(?:\s*=\s*(?:"[^"]*"|'[^']*'|[^\s>]+))?)*)\s*\/?>/g;
const ATTRIBUTE = /\s+([^\s=/>]+)(?:\s*=\s*("[^"]*"|'[^']*'|[^\s>]+))?/g;
const ACTIVE_ELEMENTS = new Set(["script", "foreignobject", "iframe", "object", "embed", "a", "image", "use"]);

/**
 * The first piece of markup in `svg` that could act or load: a script-like element, a link, an image, an event
 * handler attribute, or a URL in an attribute. Text and attribute values are escaped by vega, so only tags and
 * attribute names need looking at. Undefined when there is none.
 */
export function activeContent(svg: string): string | undefined {
  for (const tag of svg.matchAll(TAG)) {
    const element = tag[1]!.toLowerCase();
    if (ACTIVE_ELEMENTS.has(element)) return `<${tag[1]}>`;
    for (const attribute of (tag[2] ?? "").matchAll(ATTRIBUTE)) {
      const name = attribute[1]!.toLowerCase();
      const value = (attribute[2] ?? "").replace(/^["']|["']$/g, "").trim().toLowerCase();
      if (name.startsWith("on")) return `${name}= on <${tag[1]}>`;
      if ((name === "href" || name.endsWith(":href") || name === "src") && value !== "") return `${name}= on <${tag[1]}>`;
      if (/url\(\s*['"]?(?!#)/.test(value)) return `a url() in ${name}= on <${tag[1]}>`;
    }
  }
  return undefined;
}

/** Width of a drawn chart's plot area, px: with the legend beside it, the drawing fills an A4 or Letter text width. */
export const REPORT_CHART_WIDTH = 560;

/** The text of a Vega-Lite title (a string, a list of lines, or `{ text }`), or undefined. */
function titleText(title: unknown): string | undefined {
  if (typeof title === "string") return title;
  if (Array.isArray(title)) return title.map(String).join(" ");
  if (title !== null && typeof title === "object" && "text" in title) return titleText((title as { text: unknown }).text);
  return undefined;
}

/**
 * The spec as a report draws it: its title taken out to become the figure's caption, and a top-level numeric
 * width (and height, in proportion) set to REPORT_CHART_WIDTH so the figure fills the text width without
 * scaling its lettering (faceted and concatenated charts keep their sizes), and legend labels shown in full.
 */
export function reportChartSpec(spec: Record<string, unknown>): { spec: Record<string, unknown>; caption?: string } {
  const { title, ...rest } = spec;
  const caption = titleText(title);
  if (typeof rest.width === "number" && rest.width > 0) {
    const ratio = typeof rest.height === "number" && rest.height > 0 ? rest.height / rest.width : 0.6;
    rest.width = REPORT_CHART_WIDTH;
    rest.height = Math.round(REPORT_CHART_WIDTH * ratio);
  }
  // Legend labels in full (vega-lite cuts them at 160 px by default), unless the spec sets its own limit.
  const config = (typeof rest.config === "object" && rest.config !== null ? rest.config : {}) as Record<string, unknown>;
  const legend = (typeof config.legend === "object" && config.legend !== null ? config.legend : {}) as Record<string, unknown>;
  if (legend.labelLimit === undefined) rest.config = { ...config, legend: { ...legend, labelLimit: 0 } };
  return caption === undefined ? { spec: rest } : { spec: rest, caption };
}

const LEGEND_CHANNELS = ["color", "fill", "stroke", "shape", "strokeDash", "opacity", "size"];

/**
 * The layers of a layered chart that no legend describes: a mark whose encoding has no field or datum on a
 * legend channel (color, fill, stroke, shape, strokeDash, opacity, size), in a chart of more than one layer
 * other than rules.
 * Their numbers (1-based), for a note that a reader could not tell those marks apart.
 */
export function layersWithoutLegend(spec: Record<string, unknown>): number[] {
  const layers = Array.isArray(spec.layer) ? spec.layer : undefined;
  const markType = (layer: unknown): string | undefined => {
    const mark = (layer as { mark?: unknown } | null)?.mark;
    return typeof mark === "string" ? mark : (mark as { type?: string } | undefined)?.type;
  };
  // Reference lines (rules) need no legend; one data layer beside them is told apart by the axis titles.
  const marked = (layers ?? []).filter((l: unknown) => markType(l) !== "rule");
  if (marked.length < 2) return [];
  const out: number[] = [];
  layers!.forEach((layer: unknown, i) => {
    const encoding = (layer as { encoding?: Record<string, unknown> } | null)?.encoding ?? {};
    if (markType(layer) === "rule") return;
    const described = LEGEND_CHANNELS.some((c) => {
      const e = encoding[c] as { field?: unknown; datum?: unknown } | undefined;
      return e !== undefined && (e.field !== undefined || e.datum !== undefined);
    });
    if (!described) out.push(i + 1);
  });
  return out;
}

/** Draws a Vega-Lite spec (with inline data) as SVG, or says why it could not. Each call makes and finalizes its own view. */
export async function drawChart(spec: Record<string, unknown>): Promise<ChartPicture> {
  const { usermeta: _usermeta, ...clean } = spec;
  const refused: string[] = [];
  const logger = {
    level: () => logger,
    error: () => logger,
    warn: () => logger,
    info: () => logger,
    debug: () => logger,
  };
  let view: vega.View | undefined;
  try {
    const compiled = compile(clean as unknown as Parameters<typeof compile>[0], { logger: logger as never }).spec;
    delete (compiled as { usermeta?: unknown }).usermeta;
    view = new vega.View(vega.parse(compiled, undefined, { ast: true }), {
      renderer: "none",
      loader: refusingLoader(refused),
      expr: expressionInterpreter,
      logLevel: vega.None,
    });
    const svg = (await view.toSVG()).replace(/<a\b[^>]*>/g, "").replace(/<\/a>/g, "");
    if (refused.length > 0) {
      return { problem: `the report loads nothing from outside (the chart asked for ${refused.join(", ")}); give chart data inline` };
    }
    const active = activeContent(svg);
    if (active !== undefined) return { problem: `the drawing contained ${active}, which a report may not carry, and was left out` };
    return { svg };
  } catch (e) {
    return { problem: e instanceof Error ? e.message : String(e) };
  } finally {
    view?.finalize();
  }
}
