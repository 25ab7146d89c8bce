import { mkdtempSync, readdirSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { createKernel, stripTypes, type StripCache, type StrippedForm } from "@conebook/kernel";
import { parseDocument } from "@conebook/document";
import { fileStripCache } from "../src/strip-cache.js";

const folder = mkdtempSync(join(tmpdir(), "conebook-strip-cache-"));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

const doc = parseDocument(
  "---\nconebook: 1\ntitle: cache\nseed: 1\n---\n\n```ts code:a\nconst T: number = 250;\nshow.value(T * 2, \"m2/d\", \"twice T\")\n```\n\n```ts code:b\nconst bad: number = T +;\n```\n",
).document;

describe("the cache of stripped cells", () => {
  it("gives a second run the kept forms and the same outputs, errors with their columns included", async () => {
    const kept = new Map<string, StrippedForm>();
    let hits = 0;
    const cache: StripCache = {
      get: (s) => {
        const f = kept.get(s);
        if (f) hits++;
        return f;
      },
      set: (s, f) => void kept.set(s, f),
    };
    const kernel = createKernel({ stripCache: cache });
    const first = await kernel.runDocument(doc);
    const second = await kernel.runDocument(doc);
    expect(kept.size).toBe(1);
    expect(hits).toBe(1);
    expect(second.outputs).toEqual(first.outputs);
    expect(first.outputs.a).toEqual([{ type: "value", value: 500, unit: "m2/d", label: "twice T" }]);
    expect(first.outputs.b![0]).toMatchObject({ type: "error", message: expect.stringContaining("SyntaxError") });
  });

  it("keeps a form on disk per source, and treats an unreadable or foreign file as a miss", () => {
    const cache = fileStripCache(folder);
    const source = "const x: number = 1;\nx";
    expect(cache.get(source)).toBeUndefined();
    const cell = stripTypes(source);
    cache.set(source, { code: cell.code, mappings: "AAAA" });
    expect(fileStripCache(folder).get(source)).toEqual({ code: cell.code, mappings: "AAAA" });
    const [file] = readdirSync(folder);
    writeFileSync(join(folder, file!), "{ not json");
    expect(fileStripCache(folder).get(source)).toBeUndefined();
    writeFileSync(join(folder, file!), JSON.stringify({ source: "another cell", code: "1", mappings: "" }));
    expect(fileStripCache(folder).get(source)).toBeUndefined();
  });
});
