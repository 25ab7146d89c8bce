import { describe, expect, it } from "vitest";
import { DocumentError, parseDocument, serializeDocument, withOutputs } from "../src/index.js";
import type { Cell, ConebookDocument } from "../src/index.js";
import { HEADER, lines } from "./helpers.js";

const roundTrip = (text: string, writeAssignedIds = false): string =>
  serializeDocument(parseDocument(text).document, { writeAssignedIds });

/** Lines of `b` that differ from `a`, assuming the same number of lines. */
const changedLines = (a: string, b: string): [number, string, string][] => {
  const la = a.split("\n");
  const lb = b.split("\n");
  return lb.flatMap((l, i) => (l === la[i] ? [] : [[i + 1, la[i] ?? "", l] as [number, string, string]]));
};

const handWritten = [
  // Messy but valid: comments and odd spacing in the header, no blank lines between blocks, trailing spaces.
  lines(
    "---   ",
    "# a comment",
    "conebook:   1",
    "title: 'Quoted title'   # why not",
    "seed: 0x1F",
    "parameters:",
    "  - {name: q, value: 3, range: [1,   5]}",
    "---",
    "Text right after the header.  ",
    "```ts code:a",
    "x",
    "```",
    "```json outputs:a",
    '[ {"type":"text",  "text":"hi"} ]',
    "```",
    "",
    "",
    "",
    "<!-- an HTML comment -->",
    "",
    "~~~~yaml   chart:c",
    "mark: bar",
    "~~~~",
  ),
  // No final newline, an unclosed fence at the end.
  [...HEADER, "", "```ts code:z", "let y = 2;", "", "trailing"].join("\n"),
  // CRLF throughout, with a lone CR inside a code cell.
  [...HEADER, "", "[narrative:n]: #", "", "Para\rgraph.", "", "```ts code:k", "a\rb", "```", ""].join("\r\n"),
  // Cells without ids, an indented fence, a fence inside a block quote, and blank-ish lines with spaces.
  lines(...HEADER, "   ", "Intro", "  ", "```ts code", "1", "```", "", "  ```csv data:d", "  a", "  1", "  ```", "", "> ```ts code:q", "> 1", "> ```"),
  // Header only.
  lines(...HEADER),
  // Empty header, then text.
  "---\n---\nhello",
];

describe("serializeDocument: lossless for hand-written files", () => {
  it.each(handWritten.map((t, i) => [i, t] as const))("writes file %i back byte for byte", (_i, text) => {
    expect(roundTrip(text)).toBe(text);
  });

  it("writes assigned ids into the file and changes nothing else", () => {
    const text = handWritten[3]!;
    const out = roundTrip(text, true);
    expect(out).toBe(
      lines(...HEADER, "   ", "[narrative:narrative1]: #", "", "Intro", "  ", "```ts code:code1", "1", "```", "", "  ```csv data:d", "  a", "  1", "  ```", "", "[narrative:narrative2]: #", "", "> ```ts code:q", "> 1", "> ```"),
    );
    expect(roundTrip(out, true)).toBe(out);
    expect(parseDocument(out).diagnostics).toEqual([]);
  });
});

describe("serializeDocument: regenerates only what changed", () => {
  const text = lines(
    "---",
    "conebook: 1",
    "title: Recovery at PW-2   # keep this comment",
    "seed: 5",
    "recordedWith: 0.0.9",
    "---",
    "",
    "[narrative:intro]: #",
    "",
    "Intro.",
    "",
    "```ts code:a",
    "const a = 1;",
    "```",
    "",
    "```json outputs:a",
    '[{"type": "text", "text": "old"}]',
    "```",
    "",
    "```ts code:b",
    "const b = 2;",
    "```",
  );

  it("rewrites the outputs blocks and the recordedWith value after withOutputs, and nothing else", () => {
    const { document } = parseDocument(text);
    const next = withOutputs(document, { a: [{ type: "value", value: 2.5, unit: "m" }], b: [{ type: "text", text: "new" }] }, { libraryVersion: "0.1.0" });
    const out = serializeDocument(next);
    expect(out).toBe(
      text
        .replace("recordedWith: 0.0.9", "recordedWith: 0.1.0")
        .replace('[{"type": "text", "text": "old"}]', '[{"type":"value","value":2.5,"unit":"m"}]')
        .replace(/const b = 2;\n```\n$/, 'const b = 2;\n```\n\n```json outputs:b\n[{"type":"text","text":"new"}]\n```\n'),
    );
    expect(serializeDocument(parseDocument(out).document)).toBe(out);
  });

  it("appends recordedWith when the header had none", () => {
    const { document } = parseDocument(text.replace("recordedWith: 0.0.9\n", ""));
    const out = serializeDocument(withOutputs(document, {}, { libraryVersion: "0.2.0" }));
    expect(out.split("---\n")[1]).toBe("conebook: 1\ntitle: Recovery at PW-2   # keep this comment\nseed: 5\nrecordedWith: 0.2.0\n");
  });

  it("rewrites one cell's body when its source changes, keeping its fence line", () => {
    const { document } = parseDocument(text);
    const cells = document.cells.map((c): Cell => (c.id === "b" ? { ...c, source: "const b = 3;\nconst c = b;" } : c));
    const out = serializeDocument({ ...document, cells });
    expect(out).toBe(text.replace("const b = 2;", "const b = 3;\nconst c = b;"));
  });

  it("lengthens the fence when the new source holds a line that would close it", () => {
    const { document } = parseDocument(text);
    const cells = document.cells.map((c): Cell => (c.id === "b" ? { ...c, source: "const s = `\n```\n`;" } : c));
    const out = serializeDocument({ ...document, cells });
    expect(out.endsWith("````ts code:b\nconst s = `\n```\n`;\n````\n")).toBe(true);
    expect(parseDocument(out).document.cells[2]!.source).toBe("const s = `\n```\n`;");
  });

  it("rewrites a marker when an id changes, and the outputs block names the new id", () => {
    const { document } = parseDocument(text);
    const cells = document.cells.map((c): Cell => (c.id === "a" ? { ...c, id: "alpha" } : c));
    const out = serializeDocument({ ...document, cells });
    expect(changedLines(text, out)).toEqual([
      [12, "```ts code:a", "```ts code:alpha"],
      [16, "```json outputs:a", "```json outputs:alpha"],
      [17, '[{"type": "text", "text": "old"}]', '[{"type":"text","text":"old"}]'],
    ]);
  });

  it("changes a header parameter value in place, keeping comments", () => {
    const t = lines("---", "conebook: 1", "title: T", "seed: 1", "parameters:", "  - name: q   # pumping rate", "    value: 0.004", "    range: [0.001, 0.01]", "---");
    const { document } = parseDocument(t);
    const header = { ...document.header, parameters: [{ ...document.header.parameters[0]!, value: 0.006 }] };
    expect(changedLines(t, serializeDocument({ ...document, header }))).toEqual([[7, "    value: 0.004", "    value: 0.006"]]);
  });

  it("quotes a new value whose plain form would break the flow mapping it sits in", () => {
    const t = lines("---", "conebook: 1", "title: T", "seed: 1", "parameters:", "  - {name: q, value: 1, description: old}  # keep", "---");
    const { document } = parseDocument(t);
    const header = { ...document.header, parameters: [{ ...document.header.parameters[0]!, description: "rate, in L/s: {x}" }] };
    const out = serializeDocument({ ...document, header });
    expect(parseDocument(out).document.header.parameters[0]!.description).toBe("rate, in L/s: {x}");
    expect(out).toContain("# keep");
  });

  it("quotes a new title that YAML would otherwise read as a number", () => {
    const { document } = parseDocument(text);
    const out = serializeDocument({ ...document, header: { ...document.header, title: "1e3" } });
    expect(parseDocument(out).document.header.title).toBe("1e3");
  });

  it("re-emits the header through the YAML model when a list changes length, keeping comments", () => {
    const { document } = parseDocument(text);
    const header = { ...document.header, parameters: [{ name: "q", value: 1, unit: "L/s", range: [0, 2] as [number, number] }] };
    const out = serializeDocument({ ...document, header });
    expect(out).toContain("# keep this comment");
    expect(parseDocument(out).document.header.parameters).toEqual(header.parameters);
  });

  it("regenerates a chart's source from its spec when the spec is edited", () => {
    const t = lines(...HEADER, "", "```yaml chart:c", "mark: point  # dots", "```");
    const { document } = parseDocument(t);
    const c = document.cells[0]!;
    if (c.kind !== "chart") throw new Error("expected a chart");
    const out = serializeDocument({ ...document, cells: [{ ...c, spec: { mark: "line" } }] });
    expect(out).toBe(lines(...HEADER, "", "```yaml chart:c", "mark: line", "```"));
  });

  it("keeps an edited chart source whose spec was not touched", () => {
    const t = lines(...HEADER, "", "```json chart:c", '{"mark": "point"}', "```");
    const { document } = parseDocument(t);
    const out = serializeDocument({ ...document, cells: [{ ...document.cells[0]!, source: '{"mark": "bar"}' }] });
    expect(out).toBe(t.replace("point", "bar"));
  });

  it("uses the file's CRLF line endings for regenerated text", () => {
    const t = [...HEADER, "", "```ts code:a", "1", "```", ""].join("\r\n");
    const { document } = parseDocument(t);
    const out = serializeDocument(withOutputs(document, { a: [{ type: "text", text: "x" }] }, { libraryVersion: "1.0.0" }));
    expect(out).toBe([...HEADER.slice(0, 4), "recordedWith: 1.0.0", "---", "", "```ts code:a", "1", "```", "", "```json outputs:a", '[{"type":"text","text":"x"}]', "```", ""].join("\r\n"));
  });

  it("closes an unclosed fence when a cell is added after it", () => {
    const t = [...HEADER, "", "```ts code:z", "1"].join("\n");
    const { document } = parseDocument(t);
    const extra: Cell = { id: "w", kind: "code", language: "ts", source: "2", sourceStart: { line: 1, column: 1 }, outputs: [] };
    const out = serializeDocument({ ...document, cells: [...document.cells, extra] });
    expect(parseDocument(out).document.cells.map((c) => [c.id, c.source])).toEqual([["z", "1"], ["w", "2"]]);
  });
});

describe("serializeDocument: documents built in memory", () => {
  const doc: ConebookDocument = {
    header: { title: "Slug test at MW-7", formatVersion: 1, seed: 3, timeLimitMs: 5000, parameters: [{ name: "rc", value: 0.05, unit: "m", range: [0.01, 0.2] }], extra: { owner: "hydro team" } },
    cells: [
      { id: "intro", kind: "narrative", source: "A slug test.", sourceStart: { line: 1, column: 1 }, outputs: [] },
      { id: "head", kind: "data", name: "head", format: "csv", source: "t,h\n0,1", sourceStart: { line: 1, column: 1 }, outputs: [] },
      { id: "rec", kind: "data", name: "rec", format: "csv", source: "", file: { path: "data/mw 7.csv", sha256: "0".repeat(64) }, sourceStart: { line: 1, column: 1 }, outputs: [] },
      { id: "fit", kind: "code", language: "ts", source: "show.value(1)", sourceStart: { line: 1, column: 1 }, outputs: [{ type: "value", value: 1 }] },
    ],
  };

  it("writes the canonical layout", () => {
    expect(serializeDocument(doc)).toBe(
      lines(
        "---",
        "conebook: 1",
        "title: Slug test at MW-7",
        "seed: 3",
        "limits:",
        "  cellTimeMs: 5000",
        "parameters:",
        "  - name: rc",
        "    value: 0.05",
        "    unit: m",
        "    range: [0.01, 0.2]",
        "owner: hydro team",
        "---",
        "",
        "[narrative:intro]: #",
        "",
        "A slug test.",
        "",
        "```csv data:head",
        "t,h",
        "0,1",
        "```",
        "",
        `\`\`\`csv data:rec file="data/mw 7.csv" sha256=${"0".repeat(64)}`,
        "```",
        "",
        "```ts code:fit",
        "show.value(1)",
        "```",
        "",
        "```json outputs:fit",
        '[{"type":"value","value":1}]',
        "```",
      ),
    );
  });

  it("refuses a narrative cell that would swallow the cells after it, saying why", () => {
    const bad = (source: string): ConebookDocument => ({ ...doc, cells: [{ ...doc.cells[0]!, source }, doc.cells[3]!] });
    expect(() => serializeDocument(bad("```\nunclosed"))).toThrowError(DocumentError);
    expect(() => serializeDocument(bad("<!-- open comment"))).toThrow(/leaves a code fence or HTML block open/);
    expect(() => serializeDocument(bad("```ts code:sneaky\n1\n```"))).toThrow(/contains a Conebook cell fence or narrative marker/);
  });

  it("trims blank lines around narrative, which are layout, not content", () => {
    const out = serializeDocument({ ...doc, cells: [{ ...doc.cells[0]!, source: "\n\n  \nText\n\n" }] });
    expect(parseDocument(out).document.cells[0]!.source).toBe("Text");
  });

  it("uses a tilde fence when an attribute holds a backtick", () => {
    const cell: Cell = { ...(doc.cells[1] as Extract<Cell, { kind: "data" }>), attributes: { note: "a`b" } };
    const out = serializeDocument({ ...doc, cells: [cell] });
    expect(out).toContain('~~~csv data:head note=a`b\nt,h\n0,1\n~~~');
    expect(parseDocument(out).document.cells[0]!.attributes).toEqual({ note: "a`b" });
  });
});
