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
