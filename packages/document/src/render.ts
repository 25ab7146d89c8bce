/**
 * Rendering narrative Markdown to HTML with markdown-it (CommonMark, plus tables and strikethrough).
 * Raw HTML is off (`html: false`): tags in the text are shown as text, and markdown-it's link validation refuses
 * javascript:, vbscript:, file: and non-image data: URLs, so the output needs no further sanitizing.
 */

import MarkdownIt from "markdown-it";

const markdown = new MarkdownIt({ html: false, linkify: false, typographer: false });

/** Renders narrative Markdown to an HTML fragment. Cost: linear in the length of the text. */
export function renderNarrative(source: string): string {
  return markdown.render(source);
}
