/**
 * Inputs whose size or nesting once overflowed the stack after the text was read: many diagnostics at once, and
 * JSON or YAML nested far deeper than a document needs. Each is answered with diagnostics at a place.
 */
import { describe, expect, it } from "vitest";
import { messages, parseDocument, serializeDocument } from "../src/index.js";
import { MAX_JSON_DEPTH } from "../src/json-depth.js";

const HEADER = "---\nconebook: 1\ntitle: Deep input at Fenwick Reach (invented)\nseed: 1\n---\n\n";
const nested = (n: number): string => "[".repeat(n) + "]".repeat(n);

describe("large and deeply nested input", () => {
  it("reports 150,000 cells sharing one id, each at its line, without overflowing the stack", () => {
    // 130,000 diagnostics spread into push() overflowed the stack of Node 20.
    const text = HEADER + "```ts code:x\n1\n```\n\n".repeat(150_000);
    const { document, diagnostics } = parseDocument(text, { file: "d.cone.md" });
    expect(document.cells.length).toBe(150_000);
    expect(diagnostics.length).toBe(149_999);
    expect(diagnostics[0]).toMatchObject({ code: "id-duplicate", line: 11, message: messages.idDuplicate("x", 7).message });
  }, 30_000);

  it("keeps recorded outputs nested 100,000 arrays deep as text and says why", () => {
    const text = HEADER + "```ts code:c\n1\n```\n\n```json outputs:c\n[{\"type\":\"json\",\"value\":" + nested(100_000) + "}]\n```\n";
    const { document, diagnostics } = parseDocument(text, { file: "d.cone.md" });
    expect(document.cells[0]!.outputs).toEqual([]);
    expect(diagnostics.find((d) => d.code === "outputs-json")?.message).toContain(`nests more than ${MAX_JSON_DEPTH} arrays and objects deep`);
    expect(serializeDocument(document, { writeAssignedIds: false })).toBe(text);
  });

  it("refuses a JSON or YAML chart nested past 256 levels with an error at its source", () => {
    for (const [lang, source] of [
      ["json", `{"mark": "point", "usermeta": ${nested(100_000)}}`],
      ["yaml", `mark: point\nusermeta: ${nested(300)}`],
    ] as const) {
      const text = `${HEADER}\`\`\`${lang} chart:c\n${source}\n\`\`\`\n`;
      const { diagnostics } = parseDocument(text, { file: "d.cone.md" });
      expect(diagnostics.map((d) => [d.code, d.line])).toEqual([["chart-syntax", 8]]);
      expect(diagnostics[0]!.message).toContain(`more than ${MAX_JSON_DEPTH}`);
    }
  });

  it("reads a chart nested 100 levels deep as usual (the schema then refuses usermeta, as for any chart)", () => {
    const text = `${HEADER}\`\`\`json chart:c\n{"mark": "point", "usermeta": {"levels": ${nested(100)}}}\n\`\`\`\n`;
    const { document, diagnostics } = parseDocument(text);
    expect(diagnostics.map((d) => d.code)).toEqual(["chart-schema"]);
    expect(JSON.stringify((document.cells[0] as unknown as { spec: { usermeta: { levels: unknown } } }).spec.usermeta.levels)).toBe(nested(100));
  });
});
