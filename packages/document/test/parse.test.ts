import { describe, expect, it } from "vitest";
import { DocumentError, formatDiagnostic, messages, parseDocument } from "../src/index.js";
import type { Cell } from "../src/index.js";
import { HEADER, lines } from "./helpers.js";

const parse = (...body: string[]) => parseDocument(lines(...HEADER, "", ...body), { file: "pw4.cone.md" });
const summary = (cells: Cell[]) => cells.map((c) => ({ id: c.id, kind: c.kind, source: c.source, at: c.sourceStart }));

describe("parseDocument: cells", () => {
  it("reads narrative, code, data and chart cells with their ids and source positions", () => {
    const { document, diagnostics } = parse(
      "[narrative:intro]: #",
      "",
      "Some *prose*.",
      "",
      "```ts code:calc",
      "const a = 1;",
      "const b = a + 1;",
      "```",
      "",
      "```csv data:steps name=steps",
      "step,q",
      "1,0.004",
      "```",
      "",
      "```json chart:plot",
      '{"mark": "line", "data": {"name": "steps"}}',
      "```",
    );
    expect(diagnostics).toEqual([]);
    expect(summary(document.cells)).toEqual([
      { id: "intro", kind: "narrative", source: "Some *prose*.", at: { line: 9, column: 1 } },
      { id: "calc", kind: "code", source: "const a = 1;\nconst b = a + 1;", at: { line: 12, column: 1 } },
      { id: "steps", kind: "data", source: "step,q\n1,0.004", at: { line: 17, column: 1 } },
      { id: "plot", kind: "chart", source: '{"mark": "line", "data": {"name": "steps"}}', at: { line: 22, column: 1 } },
    ]);
    const chart = document.cells[3]!;
    expect(chart.kind === "chart" && chart.spec).toEqual({ mark: "line", data: { name: "steps" } });
  });

  it("assigns deterministic ids to cells without one and reports each with its position", () => {
    const { document, diagnostics } = parse("Intro text.", "", "```ts code", "1", "```", "", "```ts code:code1", "2", "```", "", "```ts code:", "3", "```");
    expect(document.cells.map((c) => c.id)).toEqual(["narrative1", "code2", "code1", "code3"]);
    const assigned = diagnostics.filter((d) => d.code === "id-assigned");
    expect(assigned.map((d) => [d.line, d.column, d.cellId])).toEqual([
      [7, 1, "narrative1"],
      [9, 1, "code2"],
      [17, 1, "code3"],
    ]);
    expect(assigned[1]!.message).toBe(messages.idAssigned("code2").message);
  });

  it("gives a data cell without a name its id as the name", () => {
    const { document } = parse("```csv data:wells", "a", "```");
    const cell = document.cells[0]!;
    expect(cell.kind === "data" && cell.name).toBe("wells");
  });

  it("treats a fence without a Conebook kind, or nested in a list, as narrative", () => {
    const { document, diagnostics } = parse(
      "[narrative:n]: #",
      "",
      "An example:",
      "",
      "```ts",
      "let x = 1;",
      "```",
      "",
      "- item",
      "",
      "  ```ts code:nested",
      "  2",
      "  ```",
    );
    expect(diagnostics).toEqual([]);
    expect(document.cells).toHaveLength(1);
    expect(document.cells[0]!.source).toContain("```ts code:nested");
  });

  it("reads recorded outputs into the preceding cell", () => {
    const { document, diagnostics } = parse(
      "```ts code:k",
      "show.value(1)",
      "```",
      "",
      "```json outputs:k",
      '[{"type": "value", "value": 1.5, "unit": "m"}, {"type": "not-run", "reason": "skipped"}]',
      "```",
    );
    expect(diagnostics).toEqual([]);
    expect(document.cells[0]!.outputs).toEqual([
      { type: "value", value: 1.5, unit: "m" },
      { type: "not-run", reason: "skipped" },
    ]);
  });

  it("keeps an outputs block that does not follow its cell as narrative and warns", () => {
    const { document, diagnostics } = parse("```ts code:a", "1", "```", "", "Text.", "", "```json outputs:a", "[]", "```");
    expect(document.cells.map((c) => c.kind)).toEqual(["code", "narrative"]);
    expect(document.cells[0]!.outputs).toEqual([]);
    expect(document.cells[1]!.source).toBe("Text.\n\n```json outputs:a\n[]\n```");
    expect(diagnostics.find((d) => d.code === "outputs-orphan")).toMatchObject({ line: 13, column: 1, severity: "warning" });
  });

  it("keeps outputs that are not JSON as narrative with a warning, and reports malformed output shapes as errors, at the outputs' first line", () => {
    const bad = parse("```ts code:a", "1", "```", "", "```json outputs:a", "[{", "```");
    expect(bad.diagnostics.filter((d) => d.code !== "id-assigned").map((d) => [d.code, d.line, d.severity])).toEqual([["outputs-json", 12, "warning"]]);
    expect(bad.document.cells.map((c) => c.kind)).toEqual(["code", "narrative"]);
    const shape = parse("```ts code:a", "1", "```", "", "```json outputs:a", '[{"type": "value", "value": "x"}]', "```");
    expect(shape.diagnostics[0]!.code).toBe("outputs-shape");
    expect(shape.diagnostics[0]!.message).toContain("output 1: a value output needs a number");
  });

  it("warns about an unclosed fence, which runs to the end of the file", () => {
    const { document, diagnostics } = parse("```ts code:a", "1", "", "More text");
    expect(document.cells[0]!.source).toBe("1\n\nMore text");
    const d = diagnostics.find((x) => x.code === "fence-unclosed")!;
    expect(formatDiagnostic(d)).toBe(`pw4.cone.md:7:1: warning: ${messages.fenceUnclosed("```").message}`);
  });

  it("refuses a cell in the wrong language and keeps the block as narrative", () => {
    const { document, diagnostics } = parse("```python code:a", "1", "```");
    expect(document.cells.map((c) => c.kind)).toEqual(["narrative"]);
    expect(diagnostics.map((d) => [d.code, d.line, d.column])).toEqual([["cell-language", 7, 1], ["id-assigned", 7, 1]]);
  });

  it("reads quoted attributes, file references and keeps unknown attributes", () => {
    const sha = "ab".repeat(32);
    const { document, diagnostics } = parse(`\`\`\`csv data:rec name=rec file="data/pw 4.csv" sha256=${sha} color=blue`, "```");
    const cell = document.cells[0]!;
    expect(cell.kind === "data" && cell.file).toEqual({ path: "data/pw 4.csv", sha256: sha });
    expect(cell.attributes).toEqual({ color: "blue" });
    expect(diagnostics.map((d) => d.code)).toEqual(["attribute-unknown"]);
  });

  it("reports an unterminated quoted attribute with its column", () => {
    const { diagnostics } = parse('```csv data:rec name="rec', "a", "```");
    const d = diagnostics.find((x) => x.code === "attribute-syntax")!;
    expect([d.line, d.column]).toEqual([7, 22]); // the opening quote
    expect(d.message).toBe(messages.attributeSyntax(`the quoted value of "name" has no closing '"'`).message);
  });

  it("strips the indentation of an indented fence from the source, as CommonMark does", () => {
    const { document } = parse("  ```ts code:a", "  x", "   y", " z", "  ```");
    expect(document.cells[0]!.source).toBe("x\n y\nz");
    expect(document.cells[0]!.sourceStart).toEqual({ line: 8, column: 3 });
  });

  it("reads tilde fences and longer backtick fences whose body holds shorter fences", () => {
    const { document } = parse("~~~ts code:a", "```", "~~~", "", "````ts code:b", "```", "````");
    expect(document.cells.map((c) => c.source)).toEqual(["```", "```"]);
  });

  it("keeps CRLF line endings inside sources", () => {
    const text = ["---", "conebook: 1", "title: x", "seed: 1", "---", "", "```ts code:a", "a", "b", "```", ""].join("\r\n");
    const { document, diagnostics } = parseDocument(text);
    expect(diagnostics).toEqual([]);
    expect(document.cells[0]!.source).toBe("a\r\nb");
    expect(document.layout!.eol).toBe("\r\n");
  });

  it("reports a chart specification that is not valid YAML or not an object", () => {
    const bad = parse("```yaml chart:c", "mark: [point", "```");
    expect(bad.diagnostics[0]).toMatchObject({ code: "chart-syntax", line: 8, severity: "error" });
    const list = parse("```json chart:c", "[1, 2]", "```");
    expect(list.diagnostics[0]).toMatchObject({ code: "chart-not-object", line: 8 });
  });

  it("splits narrative at markers, including a marker with no text after it", () => {
    const { document } = parse("[narrative:a]: #", "", "[narrative:b]: #", "", "B text", "", "```ts code:c", "1", "```");
    expect(summary(document.cells).slice(0, 2)).toEqual([
      { id: "a", kind: "narrative", source: "", at: { line: 8, column: 1 } },
      { id: "b", kind: "narrative", source: "B text", at: { line: 11, column: 1 } },
    ]);
  });
});

describe("parseDocument: header", () => {
  const withHeader = (...h: string[]) => lines("---", ...h, "---", "", "Text.");

  it("throws DocumentError naming the place and the fix when the header is missing", () => {
    expect(() => parseDocument("# Title\n", { file: "a.md" })).toThrowError(DocumentError);
    expect(() => parseDocument("# Title\n", { file: "a.md" })).toThrow(`a.md:1:1: ${messages.headerMissing().message}`);
  });

  it("throws DocumentError when the header is never closed", () => {
    expect(() => parseDocument("---\ntitle: x\n")).toThrow(messages.headerUnclosed().message);
  });

  it("throws DocumentError with the file line of a YAML syntax error", () => {
    try {
      parseDocument(withHeader("conebook: 1", "title: [unclosed", "seed: 1"), { file: "h.md" });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(DocumentError);
      const err = e as DocumentError;
      expect(err.code).toBe("header-yaml");
      expect(err.line).toBeGreaterThanOrEqual(3);
      expect(err.message.startsWith(`h.md:${err.line}:${err.column}: the header is not valid YAML`)).toBe(true);
    }
  });

  it("throws DocumentError for a header that is a list, and for a newer format version", () => {
    expect(() => parseDocument(withHeader("- a"))).toThrow(messages.headerNotMapping().message);
    expect(() => parseDocument(withHeader("conebook: 2", "title: x", "seed: 1"))).toThrow(messages.formatTooNew(2, 1).message);
  });

  it("reports wrongly typed and missing header keys at their lines", () => {
    const { diagnostics } = parseDocument(withHeader("conebook: 1", "title: 42", "limits:", "  cellTimeMs: fast"), { file: "h.md" });
    expect(diagnostics.filter((d) => d.code.startsWith("header")).map((d) => [d.code, d.line, d.column])).toEqual([
      ["header-required", 2, 1],
      ["header-type", 3, 8],
      ["header-type", 5, 15],
    ]);
    expect(diagnostics.map((d) => d.message)).toContain(messages.headerType("title", "a string").message);
  });

  it("accepts a header closed by '...' and a byte order mark", () => {
    const { document, diagnostics } = parseDocument("\uFEFF---\nconebook: 1\ntitle: t\nseed: 3\n...\n");
    expect(diagnostics).toEqual([]);
    expect(document.header.seed).toBe(3);
  });
});
