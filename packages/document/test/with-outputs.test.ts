import { describe, expect, it } from "vitest";
import { DocumentError, messages, parseDocument, serializeDocument, withOutputs } from "../src/index.js";
import { HEADER, lines } from "./helpers.js";

const text = lines(...HEADER, "", "Intro.", "", "```ts code:a", "1", "```", "", "```json outputs:a", '[{"type":"text","text":"kept"}]', "```", "", "```ts code:b", "2", "```");

describe("withOutputs", () => {
  it("replaces the outputs of the named cells, keeps the others and sets recordedWith", () => {
    const { document } = parseDocument(text);
    const next = withOutputs(document, { b: [{ type: "error", message: "boom", line: 1, column: 1 }] }, { libraryVersion: "0.3.0" });
    expect(next.cells.map((c) => c.outputs)).toEqual([[], [{ type: "text", text: "kept" }], [{ type: "error", message: "boom", line: 1, column: 1 }]]);
    expect(next.header.libraryVersion).toBe("0.3.0");
  });

  it("does not change the document it was given", () => {
    const { document } = parseDocument(text);
    const before = serializeDocument(document);
    withOutputs(document, { a: [] }, { libraryVersion: "0.3.0" });
    expect(serializeDocument(document)).toBe(before);
    expect(document.header.libraryVersion).toBeUndefined();
  });

  it("removes the outputs block of a cell given no outputs", () => {
    const { document } = parseDocument(text);
    const out = serializeDocument(withOutputs(document, { a: [] }, { libraryVersion: "0.3.0" }), { writeAssignedIds: false });
    expect(out).not.toContain("outputs:a");
    expect(parseDocument(out).document.cells.map((c) => c.id)).toEqual(["narrative1", "a", "b"]);
  });

  it("writes long outputs one table row per line", () => {
    const { document } = parseDocument(text);
    const rows = Array.from({ length: 4 }, (_, i) => [i * 60, 0.1 * i, `well PW-${i}`]);
    const out = serializeDocument(withOutputs(document, { b: [{ type: "table", columns: [{ name: "t", unit: "s" }, { name: "s", unit: "m" }, { name: "well" }], rows }] }, { libraryVersion: "0.3.0" }));
    expect(out).toContain('    "rows": [\n      [0,0,"well PW-0"],\n      [60,0.1,"well PW-1"],\n');
    expect(parseDocument(out).document.cells[2]!.outputs[0]).toMatchObject({ type: "table", rows });
  });

  it("throws DocumentError for an unknown cell id or outputs on a narrative cell", () => {
    const { document } = parseDocument(text);
    expect(() => withOutputs(document, { zz: [] }, { libraryVersion: "1" })).toThrow(messages.outputsUnknownCell("zz").message);
    expect(() => withOutputs(document, { narrative1: [{ type: "text", text: "x" }] }, { libraryVersion: "1" })).toThrowError(DocumentError);
  });
});
