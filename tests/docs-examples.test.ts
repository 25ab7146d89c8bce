/**
 * Every example in docs/ runs, and every example document verifies: a documentation example that does not do
 * what the page says fails CI. Two kinds of example are read from each page of docs/ (api-reference.md is
 * generated from the doc comments and holds signatures, not examples):
 *
 * - a complete document, fenced with ````markdown and starting with its `---` header: parsed without errors,
 *   run headless, and its recorded outputs compared with the fresh ones (compareOutputs, DEFAULT_RTOL), as
 *   `conebook verify` does;
 * - a TypeScript snippet, fenced with ```ts alone (a cell's code as a reader would type it): run as the only
 *   code cell of an empty document, which must give no error.
 */
import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { parseDocument, type CellOutput } from "@conebook/document";
import { compareOutputs, createKernel, recordedOutputs } from "@conebook/kernel";

const DOCS = fileURLToPath(new URL("../docs/", import.meta.url));

interface Example {
  page: string;
  /** 1-based line of the opening fence in the page. */
  line: number;
  kind: "document" | "snippet";
  text: string;
}

/** Top-level fenced blocks of a Markdown page: their info string, opening line and body. */
export function fencedBlocks(text: string): { info: string; line: number; body: string }[] {
  const lines = text.split("\n");
  const blocks: { info: string; line: number; body: string }[] = [];
  for (let i = 0; i < lines.length; i++) {
    const open = /^(`{3,}|~{3,})\s*(.*)$/.exec(lines[i]!);
    // CommonMark 4.5: the info string of a backtick fence holds no backtick (else it is inline code).
    if (!open || (open[1]![0] === "`" && open[2]!.includes("`"))) continue;
    const fence = open[1]!;
    let j = i + 1;
    while (j < lines.length && !(lines[j]!.startsWith(fence) && lines[j]!.slice(fence.length).trim() === "" && lines[j]![fence.length] !== fence[0])) j++;
    blocks.push({ info: open[2]!.trim(), line: i + 1, body: lines.slice(i + 1, j).join("\n") });
    i = j;
  }
  return blocks;
}

function examples(): Example[] {
  const out: Example[] = [];
  for (const page of readdirSync(DOCS).filter((f) => f.endsWith(".md") && f !== "api-reference.md").sort()) {
    const text = readFileSync(join(DOCS, page), "utf8");
    for (const b of fencedBlocks(text)) {
      if (b.info === "markdown" && b.body.startsWith("---\n")) out.push({ page, line: b.line, kind: "document", text: `${b.body}\n` });
      else if (b.info === "ts") out.push({ page, line: b.line, kind: "snippet", text: b.body });
    }
  }
  return out;
}

const kernel = createKernel();
const all = examples();

describe("the examples in docs/", () => {
  it("finds the example document of docs/format.md and the snippets of docs/api.md", () => {
    expect(all.some((e) => e.page === "format.md" && e.kind === "document")).toBe(true);
    expect(all.filter((e) => e.page === "api.md" && e.kind === "snippet").length).toBeGreaterThan(0);
  });

  it.each(all.filter((e) => e.kind === "document").map((e) => [`${e.page}:${e.line}`, e] as const))(
    "runs the example document at %s and reproduces every output recorded in it",
    async (_where, example) => {
      const { document, diagnostics } = parseDocument(example.text, { file: `docs/${example.page}` });
      expect(diagnostics.filter((d) => d.severity === "error")).toEqual([]);
      const run = await kernel.runDocument(document);
      const differences = compareOutputs(recordedOutputs(document), run.outputs);
      expect(differences.map((d) => `cell ${d.cellId}: ${d.path}: recorded ${JSON.stringify(d.recorded)}, now ${JSON.stringify(d.fresh)}`)).toEqual([]);
      expect(Object.values(run.status).every((s) => s === "ok")).toBe(true);
    },
  );

  it.each(all.filter((e) => e.kind === "snippet").map((e) => [`${e.page}:${e.line}`, e] as const))(
    "runs the snippet at %s without an error",
    async (_where, example) => {
      const text = `---\nconebook: 1\ntitle: snippet\nseed: 1\n---\n\n\`\`\`\`ts code:snippet\n${example.text}\n\`\`\`\`\n`;
      const { document } = parseDocument(text);
      const run = await kernel.runDocument(document);
      const errors = (run.outputs.snippet ?? []).filter((o): o is Extract<CellOutput, { type: "error" }> => o.type === "error");
      expect(errors.map((e) => `line ${e.line}: ${e.message}`)).toEqual([]);
    },
  );
});
