/** docs/sandbox.md states each claim beside the test that holds it: every claim is a test of that name in that file. */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";

const root = new URL("../../../", import.meta.url);
const doc = readFileSync(new URL("docs/sandbox.md", root), "utf8");

/** The bold claims of docs/sandbox.md, each with the test file named in the heading or paragraph before it. */
function claims(): { file: string; claim: string }[] {
  const out: { file: string; claim: string }[] = [];
  let file: string | undefined;
  for (const line of doc.split("\n")) {
    const named = /\(`((?:packages|tests)\/[^`]+\.test\.ts)`\)/.exec(line);
    if (named) file = named[1];
    for (const m of line.matchAll(/^- \*\*(.+?)\*\*/g)) {
      if (!file) throw new Error(`claim "${m[1]}" comes before any test file is named`);
      out.push({ file, claim: m[1]! });
    }
  }
  return out;
}

describe("docs/sandbox.md", () => {
  const all = claims();

  it("names more than 35 claims, each in a test file", () => {
    expect(all.length).toBeGreaterThan(35);
  });

  it("states only claims that are the names of tests in the file it names", () => {
    const missing = all.filter(({ file, claim }) => !readFileSync(new URL(file, root), "utf8").includes(`it(${JSON.stringify(claim)}`));
    expect(missing).toEqual([]);
  });
});
