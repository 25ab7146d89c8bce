import { describe, expect, it } from "vitest";
import { messages, parseDocument, validateDocument } from "../src/index.js";
import type { Cell, ConebookDocument } from "../src/index.js";
import { HEADER, lines } from "./helpers.js";

const at = { line: 1, column: 1 };
const base: ConebookDocument = { header: { title: "t", formatVersion: 1, seed: 1, parameters: [], extra: {} }, cells: [] };
const codes = (doc: ConebookDocument) => validateDocument(doc).map((d) => d.code);
const code = (id: string): Cell => ({ id, kind: "code", language: "ts", source: "", sourceStart: at, outputs: [] });

describe("validateDocument", () => {
  it("finds nothing wrong in a well-formed document", () => {
    expect(validateDocument({ ...base, cells: [code("a"), code("b")] })).toEqual([]);
  });

  it("reports duplicate ids with the line of the first use", () => {
    const { diagnostics } = parseDocument(lines(...HEADER, "", "```ts code:a", "```", "", "```ts code:a", "```"));
    const d = diagnostics.find((x) => x.code === "id-duplicate")!;
    expect([d.line, d.column, d.message]).toEqual([10, 1, messages.idDuplicate("a", 7).message]);
  });

  it("reports malformed ids", () => {
    expect(codes({ ...base, cells: [code("9lives"), code("has space"), code("x".repeat(65)), code("ok-id_2")] })).toEqual([
      "id-malformed",
      "id-malformed",
      "id-malformed",
    ]);
  });

  it("checks data pins: 64 lowercase hex digits, a safe relative path, both present", () => {
    const data = (file: { path: string; sha256: string }, source = ""): Cell => ({ id: "d", kind: "data", name: "d", format: "csv", source, file, sourceStart: at, outputs: [] });
    const good = "0123456789abcdef".repeat(4);
    expect(codes({ ...base, cells: [data({ path: "data/x.csv", sha256: good })] })).toEqual([]);
    expect(codes({ ...base, cells: [data({ path: "data/x.csv", sha256: good.toUpperCase() })] })).toEqual(["data-sha"]);
    expect(codes({ ...base, cells: [data({ path: "data/x.csv", sha256: good.slice(1) })] })).toEqual(["data-sha"]);
    for (const path of ["../x.csv", "/etc/x", "a//b", "C:/x", "a\\b", "./x"]) {
      expect(codes({ ...base, cells: [data({ path, sha256: good })] }), path).toEqual(["data-path"]);
    }
    expect(codes({ ...base, cells: [data({ path: "", sha256: good })] })).toEqual(["data-file-incomplete"]);
    expect(validateDocument({ ...base, cells: [data({ path: "x.csv", sha256: good }, "a,b")] })[0]).toMatchObject({ code: "data-file-and-inline", severity: "warning" });
  });

  it("reports a file reference missing its pin, at the cell's fence line", () => {
    const { diagnostics } = parseDocument(lines(...HEADER, "", "```csv data:d file=x.csv", "```"));
    expect(diagnostics.map((d) => [d.code, d.line])).toEqual([["data-file-incomplete", 7]]);
  });

  it("reports chart specs that are not objects or use unnamed data or usermeta", () => {
    const chart = (spec: unknown): Cell => ({ id: "c", kind: "chart", spec: spec as Record<string, unknown>, specFormat: "json", source: "", sourceStart: at, outputs: [] });
    expect(codes({ ...base, cells: [chart({ mark: "point", data: { name: "obs" } })] })).toEqual([]);
    expect(codes({ ...base, cells: [chart([1])] })).toEqual(["chart-not-object"]);
    expect(codes({ ...base, cells: [chart(null)] })).toEqual(["chart-not-object"]);
    const url = validateDocument({ ...base, cells: [chart({ data: { url: "https://example.invalid/x.csv" } })] });
    expect(url.map((d) => d.message)).toEqual([
      'the chart specification at data must have property "name"',
      'the chart specification at data.url has unknown property "url"',
    ]);
    expect(validateDocument({ ...base, cells: [chart({ usermeta: {} })] })[0]!.message).toBe('the chart specification must not have "usermeta"');
  });

  it("reports a template parameter outside its range at the line of its value", () => {
    const { diagnostics } = parseDocument(
      lines("---", "conebook: 1", "title: t", "seed: 1", "parameters:", "  - name: q", "    value: 0.2", "    range: [0.001, 0.1]", "---"),
      { file: "t.md" },
    );
    expect(diagnostics).toEqual([
      { severity: "error", code: "parameter-out-of-range", message: messages.parameterOutOfRange("q", 0.2, 0.001, 0.1).message, file: "t.md", line: 7, column: 12 },
    ]);
  });

  it("reports inverted ranges, string values with a range, and duplicate parameter names", () => {
    const header = {
      ...base.header,
      parameters: [
        { name: "a", value: 1, range: [2, 1] as [number, number] },
        { name: "b", value: "x", range: [0, 1] as [number, number] },
        { name: "a", value: 1 },
      ],
    };
    expect(codes({ ...base, header })).toEqual(["parameter-range-inverted", "header-type", "parameter-duplicate"]);
  });

  it("reports limits above their caps and header fields of the wrong type", () => {
    const header = { ...base.header, timeLimitMs: 600_001, memoryLimitMb: 5000, seed: 1.5, title: 3 as unknown as string };
    expect(codes({ ...base, header })).toEqual(["header-type", "header-type", "limit-too-large", "limit-too-large"]);
  });

  it("reports outputs of the wrong shape on in-memory documents, and outputs on narrative cells", () => {
    const bad: Cell = { ...code("a"), outputs: [{ type: "value", value: "1" } as never] };
    const story: Cell = { id: "n", kind: "narrative", source: "x", sourceStart: at, outputs: [{ type: "text", text: "x" }] };
    expect(codes({ ...base, cells: [bad, story] })).toEqual(["outputs-shape", "outputs-on-narrative"]);
  });

  it("reports data set names that are not identifiers, and duplicates", () => {
    const data = (id: string, name: string): Cell => ({ id, kind: "data", name, format: "csv", source: "a", sourceStart: at, outputs: [] });
    expect(codes({ ...base, cells: [data("a", "obs-1"), data("b", "obs"), data("c", "obs")] })).toEqual(["data-name", "data-name-duplicate"]);
  });
  it("refuses names every JavaScript object already has for parameters, data sets and data slots", () => {
    const header = {
      ...base.header,
      parameters: [{ name: "__proto__", value: 1 }, { name: "constructor", value: 2 }, { name: "rate", value: 3 }],
      dataSlots: [{ name: "toString" }],
    };
    const data: Cell = { id: "d", kind: "data", name: "__proto__", format: "csv", source: "t\n1", sourceStart: at, outputs: [] };
    const found = validateDocument({ ...base, header, cells: [data] });
    expect(found.map((d) => d.code)).toEqual(["name-reserved", "name-reserved", "name-reserved", "name-reserved"]);
    expect(found[0]!.message).toBe(messages.nameReserved("template parameter name", "__proto__").message);
    expect(found[0]!.message).toBe('template parameter name "__proto__" is reserved: every JavaScript object has a property of that name; choose another name');
  });
});
