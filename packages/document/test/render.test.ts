import MarkdownIt from "markdown-it";
import { describe, expect, it } from "vitest";
import { parseDocument, renderNarrative } from "../src/index.js";
import { formatDocExample } from "./helpers.js";

describe("renderNarrative", () => {
  it("renders CommonMark to HTML", () => {
    expect(renderNarrative("# Drawdown\n\nThe *late* points.")).toBe("<h1>Drawdown</h1>\n<p>The <em>late</em> points.</p>\n");
  });

  it("shows raw HTML as text and refuses javascript: links", () => {
    const html = renderNarrative('<script>alert(1)</script>\n\n[x](javascript:alert(1)) <img src=x onerror=y>');
    expect(html).not.toContain("<script");
    expect(html).toContain("&lt;script&gt;");
    expect(html).not.toContain('href="javascript:');
    expect(html).not.toContain("<img");
  });
});

describe("a raw Conebook file in a CommonMark viewer", () => {
  // Render the whole example file as a plain CommonMark viewer would (markdown-it's CommonMark preset).
  const text = formatDocExample();
  const html = new MarkdownIt("commonmark").render(text);

  it("shows code, data, outputs and chart cells as code blocks labelled with their language", () => {
    const { document } = parseDocument(text);
    const fenced = document.cells.filter((c) => c.kind !== "narrative");
    expect(html.match(/<pre><code class="language-(\w+)">/g)).toEqual([
      '<pre><code class="language-csv">',
      '<pre><code class="language-ts">',
      '<pre><code class="language-json">',
      '<pre><code class="language-yaml">',
      '<pre><code class="language-json">',
    ]);
    expect(fenced).toHaveLength(3);
  });

  it("hides the narrative markers and renders the narrative", () => {
    expect(html).not.toContain("narrative:");
    expect(html).toContain("<h1>Cooper-Jacob check at OB-2</h1>");
  });

  it("renders each narrative cell's source alone the same way as in the whole file", () => {
    const { document } = parseDocument(text);
    for (const cell of document.cells.filter((c) => c.kind === "narrative")) {
      expect(html).toContain(renderNarrative(cell.source).trim());
    }
  });
});
