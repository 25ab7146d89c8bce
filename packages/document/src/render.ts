/**
 * Rendering narrative Markdown to HTML with markdown-it (CommonMark, plus tables and strikethrough).
 * Raw HTML is off (`html: false`): tags in the text are shown as text, and markdown-it's link validation refuses
 * javascript:, vbscript:, file: and non-image data: URLs, so the output needs no further sanitizing. Images from
 * anything but a data: URL are shown as text, never fetched.
 *
 * Narrative references (`{=CELL/ROW/COLUMN}`, references.ts) are read by an inline rule of our own outside code
 * spans and blocks; the caller's `reference` function gives each its text, which is escaped here like all text.
 */

import MarkdownIt from "markdown-it";
import { readReference, type FoundReference } from "./references.js";

/** How a reference is shown: its text, and whether it could not be resolved (shown marked). */
export interface ReferenceRendering {
  text: string;
  /** Full-precision value or the problem, for a tooltip. */
  title?: string;
  problem?: boolean;
}

/** Options of renderNarrative. */
export interface RenderNarrativeOptions {
  /** The text of each narrative reference; without it a reference is shown as written. */
  reference?: (found: FoundReference) => ReferenceRendering;
}

const markdown = new MarkdownIt({ html: false, linkify: false, typographer: false });

markdown.inline.ruler.before("text", "conebook_reference", (state, silent) => {
  if (state.src.charCodeAt(state.pos) !== 0x7b /* { */ || state.src.charCodeAt(state.pos + 1) !== 0x3d /* = */) return false;
  // markdown-it's "text" rule stops at "{" (one of its terminator characters), so this rule sees every "{=".
  const found = readReference(state.src, state.pos);
  if (!found || found.end > state.posMax) return false;
  if (!silent) {
    const token = state.push("conebook_reference", "span", 0);
    token.meta = found;
  }
  state.pos = found.end;
  return true;
});

markdown.renderer.rules.conebook_reference = (tokens, idx, _options, environment) => {
  const env = (environment ?? {}) as { reference?: RenderNarrativeOptions["reference"] };
  const found = tokens[idx]!.meta as FoundReference;
  const escape = markdown.utils.escapeHtml;
  if (!env.reference) return `<span class="reference">${escape("reference" in found ? found.reference.text : found.text)}</span>`;
  const r = env.reference(found);
  const title = r.title === undefined ? "" : ` title="${escape(r.title)}"`;
  return `<span class="reference${r.problem ? " reference-problem" : ""}"${title}>${escape(r.text)}</span>`;
};

const defaultImage = markdown.renderer.rules.image!;
/**
 * An image is drawn only from a data: URL inside the document; any other source (a web address, a file path) is
 * shown as text, so that opening a page or a report never makes a request the reader did not ask for.
 */
markdown.renderer.rules.image = (tokens, idx: number, options, environment, self) => {
  const token = tokens[idx]!;
  const src = String(token.attrGet("src") ?? "");
  if (/^data:image\//i.test(src)) return defaultImage(tokens, idx, options, environment, self);
  const escape = markdown.utils.escapeHtml;
  const alt = token.children ? self.renderInlineAsText(token.children, options, environment) : token.content;
  return `<span class="image-not-loaded">[image not loaded: ${escape(alt)} (${escape(src)})]</span>`;
};

/** Renders narrative Markdown to an HTML fragment. Cost: linear in the length of the text. */
export function renderNarrative(source: string, options: RenderNarrativeOptions = {}): string {
  return markdown.render(source, { reference: options.reference });
}
