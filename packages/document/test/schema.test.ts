import { readdirSync, readFileSync, statSync } from "node:fs";
import { join } from "node:path";
import fc from "fast-check";
import { parse as parseYaml } from "yaml";
import { describe, expect, it } from "vitest";
import { HEADER_KEYS, headerSchema, parseDocument, serializeDocument, validateJsonSchema } from "../src/index.js";
import { headerArb } from "./arbitraries.js";
import { formatDocExample } from "./helpers.js";

const rawHeader = (text: string): unknown => {
  const lines = text.split(/\r\n|\n|\r/);
  const close = lines.findIndex((l, i) => i > 0 && /^(---|\.\.\.)[ \t]*$/.test(l));
  return parseYaml(lines.slice(1, close).join("\n")) ?? {};
};

describe("headerSchema", () => {
  it("names exactly the header keys the parser knows", () => {
    expect(Object.keys(headerSchema.properties!).sort()).toEqual([...HEADER_KEYS].sort());
  });

  it("accepts every header the serializer writes for a random valid header", () => {
    fc.assert(
      fc.property(headerArb, (header) => {
        const text = serializeDocument({ header, cells: [] });
        expect(validateJsonSchema(headerSchema, rawHeader(text))).toEqual([]);
      }),
      { numRuns: 200 },
    );
  });

  it("rejects wrong types, missing keys, limits over the cap and malformed parameters, naming the path", () => {
    const problems = validateJsonSchema(headerSchema, {
      conebook: 1.5,
      seed: 1,
      limits: { cellTimeMs: 700000, other: 1 },
      parameters: [{ name: "q", value: true, range: [1] }],
    });
    expect(problems).toEqual([
      { path: "", message: 'must have property "title"' },
      { path: "conebook", message: "must be integer, not number" },
      { path: "limits.cellTimeMs", message: "must be at most 600000" },
      { path: "limits.other", message: 'has unknown property "other"' },
      { path: "parameters.0.value", message: "must be number or string, not boolean" },
      { path: "parameters.0.range", message: "must have at least 2 items" },
    ]);
  });

  it("agrees with the parser: a header the schema rejects gets an error diagnostic", () => {
    const text = "---\nconebook: 1\ntitle: t\nseed: one\n---\n";
    expect(validateJsonSchema(headerSchema, rawHeader(text)).length).toBeGreaterThan(0);
    expect(parseDocument(text).diagnostics.filter((d) => d.severity === "error").map((d) => d.code)).toEqual(["header-type"]);
  });
});

/** Every *.md file under notebooks/ (recursively), plus the example of docs/format.md. */
function notebookHeaders(): [string, string][] {
  const root = new URL("../../../notebooks/", import.meta.url).pathname;
  const found: [string, string][] = [["docs/format.md (example)", formatDocExample()]];
  const walk = (dir: string): void => {
    for (const name of readdirSync(dir)) {
      const path = join(dir, name);
      if (statSync(path).isDirectory()) walk(path);
      else if (name.endsWith(".md")) found.push([path.slice(root.length - "notebooks/".length), readFileSync(path, "utf8")]);
    }
  };
  walk(root);
  return found;
}

describe("the notebooks in notebooks/", () => {
  it.each(notebookHeaders())("%s has a header the schema accepts and parses without errors", (_name, text) => {
    expect(validateJsonSchema(headerSchema, rawHeader(text))).toEqual([]);
    expect(parseDocument(text).diagnostics.filter((d) => d.severity === "error")).toEqual([]);
  });
});
