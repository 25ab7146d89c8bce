/**
 * Narrative HTML for the page. markdown-it renders it with raw HTML off (tags in the text stay text; it refuses
 * javascript:, vbscript:, file: and non-image data: links), so it carries no script. One more rule here: an
 * image whose source is not an inline `data:image/` URL is not loaded (the page fetches nothing from outside,
 * and a remote image would tell its server that the document was opened); it is shown as its alt text and
 * address instead. Links open in a new tab without a referrer.
 */
import { nothing } from "lit";

/** A document fragment for `html` (markdown-it output) with remote images replaced and links hardened. */
export function narrativeFragment(html: string): DocumentFragment | typeof nothing {
  if (html === "") return nothing;
  const template = document.createElement("template");
  template.innerHTML = html;
  const content = template.content;
  for (const img of content.querySelectorAll("img")) {
    const src = img.getAttribute("src") ?? "";
    if (/^data:image\//i.test(src)) continue;
    const note = document.createElement("span");
    note.className = "image-not-loaded";
    note.textContent = `[image not loaded: ${img.getAttribute("alt") || "no description"} (${src})]`;
    img.replaceWith(note);
  }
  for (const a of content.querySelectorAll("a[href]")) {
    a.setAttribute("rel", "noopener noreferrer");
    a.setAttribute("target", "_blank");
  }
  return content;
}
