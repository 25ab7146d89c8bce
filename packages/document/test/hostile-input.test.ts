/**
 * Inputs a careless or hostile author may write: each is answered with a DocumentError or a diagnostic at
 * file:line:column, never an uncaught exception, and whatever the reader keeps is written back byte for byte.
 */
import { describe, expect, it } from "vitest";
import { DocumentError, decodeUtf8, describeUtf8Problem, messages, parseDocument, serializeDocument, utf8Bytes, utf8Problem, withOutputs } from "../src/index.js";
import { HEADER, lines } from "./helpers.js";

/** The DocumentError parseDocument throws for `text` (fails the test when it throws anything else or nothing). */
function refusal(text: string): DocumentError {
  try {
    parseDocument(text, { file: "h.cone.md" });
  } catch (e) {
    if (e instanceof DocumentError) return e;
    throw new Error(`expected a DocumentError, got ${String(e)}`);
  }
  throw new Error("expected a DocumentError, got a parsed document");
}

const header = (...yaml: string[]) => lines("---", "conebook: 1", "title: t", "seed: 1", ...yaml, "---");

describe("header YAML", () => {
  it("refuses an alias, naming its place, before any value is expanded", () => {
    // A chain of nine-fold aliases (a billion-laughs header) would expand to 9^6 values.
    const chain = ["a0: &a0 [x, x, x, x, x, x, x, x, x]"];
    for (let i = 1; i <= 6; i++) chain.push(`a${i}: &a${i} [${Array(9).fill(`*a${i - 1}`).join(", ")}]`);
    const e = refusal(header(...chain));
    expect([e.code, e.line, e.column]).toEqual(["header-alias", 6, 10]);
    expect(e.message).toBe(`h.cone.md:6:10: ${messages.headerAlias("a0").message}`);
    expect(refusal(header("site: &s Kestrel Moor", "area: *s")).line).toBe(6);
  });

  it("refuses nesting deeper than 64 levels on one line or over many, at the place it gets too deep", () => {
    const dashes = refusal(header("deep:", `  ${"- ".repeat(5000)}x`));
    expect([dashes.code, dashes.line]).toEqual(["header-too-deep", 6]);
    expect(dashes.message).toContain(messages.headerTooDeep(64).message);
    const flow = refusal(header(`deep: ${"[".repeat(3000)}${"]".repeat(3000)}`));
    expect([flow.code, flow.line, flow.column]).toEqual(["header-too-deep", 5, 70]);
    const stairs = refusal(header("deep:", ...Array.from({ length: 3000 }, (_, i) => `${" ".repeat(i + 1)}k${i}:`)));
    expect([stairs.code, stairs.line]).toEqual(["header-too-deep", 69]);
  });

  it("reads a header nested 64 levels deep", () => {
    const { document } = parseDocument(header(`deep: ${"[".repeat(63)}1${"]".repeat(63)}`));
    let v: unknown = document.header.extra.deep;
    let depth = 1;
    while (Array.isArray(v)) [v, depth] = [v[0], depth + 1];
    expect([v, depth]).toEqual([1, 64]);
  });
});

describe("recorded outputs that are not valid JSON", () => {
  // One stray "}" in an outputs block of 2 outputs.
  const broken = ["```json outputs:a", '[{"type": "value", "value": 1.5, "unit": "m"}},', '{"type": "text", "text": "kept"}]', "```"];
  const text = lines(...HEADER, "", "```ts code:a", "1.5", "```", "", ...broken, "", "Closing remarks.");

  it("are kept as ordinary text with a warning at the outputs' first line", () => {
    const { document, diagnostics } = parseDocument(text, { file: "o.cone.md" });
    expect(diagnostics.filter((d) => d.code !== "id-assigned").map((d) => [d.code, d.severity, d.line])).toEqual([["outputs-json", "warning", 12]]);
    expect(document.cells[0]!.outputs).toEqual([]);
    expect(document.cells[1]!.kind).toBe("narrative");
    expect(document.cells[1]!.source).toContain(broken.join("\n"));
  });

  it("are written back byte for byte, also when the cell gets fresh outputs", () => {
    const { document } = parseDocument(text);
    expect(serializeDocument(document, { writeAssignedIds: false })).toBe(text);
    const rerun = serializeDocument(withOutputs(document, { a: [{ type: "value", value: 1.5 }] }, { libraryVersion: "0.1.0" }));
    expect(rerun).toContain(broken.join("\n"));
    expect(rerun).toContain('```json outputs:a\n[{"type":"value","value":1.5}]\n```');
    expect(rerun.length).toBeGreaterThan(text.length);
  });

  it("keep an empty outputs block as written", () => {
    const empty = lines(...HEADER, "", "```ts code:a", "1", "```", "", "```json outputs:a", "[]", "```");
    expect(serializeDocument(parseDocument(empty).document)).toBe(empty);
  });
});

describe("bytes that are not UTF-8", () => {
  const bytes = (...parts: (string | number[])[]) => Uint8Array.from(parts.flatMap((p) => (typeof p === "string" ? Array.from(utf8Bytes(p)) : p)));

  it("are found at their byte offset, line and column", () => {
    // "é" is 2 bytes and 1 column; "😀" is 4 bytes and 2 UTF-16 code units.
    expect(utf8Problem(bytes("ab\ncé😀d", [0xff, 0xfe], "x"))).toEqual({ offset: 11, line: 2, column: 6, bytes: "FF FE" });
    expect(describeUtf8Problem(utf8Problem(bytes("a", [0xff, 0x41]))!)).toBe("byte offset 1 (line 1, column 2): byte FF is not UTF-8");
  });

  it("include overlong forms, surrogates, code points above U+10FFFF and a truncated sequence (Unicode Table 3-7)", () => {
    for (const bad of [[0xc0, 0x80], [0xe0, 0x80, 0x80], [0xed, 0xa0, 0x80], [0xf4, 0x90, 0x80, 0x80], [0xf5, 0x80, 0x80, 0x80], [0xe2, 0x82]]) {
      expect(utf8Problem(bytes("ok", bad))?.offset, bad.join(" ")).toBe(2);
    }
    expect(utf8Problem(bytes("\u{10FFFF} \uFFFD é 😀 \uFEFF"))).toBeUndefined();
  });

  it("decode without losing a byte order mark", () => {
    expect(decodeUtf8(bytes([0xef, 0xbb, 0xbf], "---"))).toBe("\uFEFF---");
  });
});
