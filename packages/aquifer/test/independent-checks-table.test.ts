import { existsSync, readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { modelIds } from "../src/models/registry.js";

// The summary table "Independent checks of every registered model" in docs/methods.md: one row per registered
// model, its number of independent checks and the test files that hold them.
const methods = readFileSync(new URL("../../../docs/methods.md", import.meta.url), "utf8");

function rows(): { id: string; count: number; files: string[] }[] {
  const start = methods.indexOf("| model id | independent checks | test files |");
  expect(start, "docs/methods.md has the table of independent checks").toBeGreaterThan(0);
  const out: { id: string; count: number; files: string[] }[] = [];
  for (const line of methods.slice(start).split("\n").slice(2)) {
    const m = /^\| `([a-z+-]+)` \| (\d+) \| (.+) \|$/.exec(line);
    if (!m) break;
    out.push({ id: m[1]!, count: Number(m[2]), files: [...m[3]!.matchAll(/`([^`]+)`/g)].map((f) => f[1]!) });
  }
  return out;
}

describe("the table of independent checks in docs/methods.md", () => {
  it("lists every registered model once, each with at least two independent checks", () => {
    const table = rows();
    expect(table.map((r) => r.id).sort()).toEqual([...modelIds].sort());
    for (const r of table) expect(r.count, r.id).toBeGreaterThanOrEqual(2);
  });

  it("names test files that exist", () => {
    for (const r of rows()) {
      for (const f of r.files) {
        const path = f.includes("/") ? new URL(`../../../${f}`, import.meta.url) : new URL(`./${f}`, import.meta.url);
        expect(existsSync(path), `${r.id}: ${f}`).toBe(true);
      }
    }
  });
});
