/**
 * The command line where a user could get a wrong or missing answer without a word: recorded control values
 * against an edited default, values typed with units in the header, kept template defaults, a changed pinned
 * file, the terminal summary of fits. The commands run in-process through `main` on small documents of an
 * invented scenario (well PW-7 at the invented Tarn Gill site) written to a temporary folder.
 */
import { mkdtemp, readFile, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { main } from "../src/cli.js";

let dir: string;

async function conebook(...argv: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  const out: string[] = [];
  const err: string[] = [];
  const code = await main(argv, { out: (t) => out.push(t), err: (t) => err.push(t), cwd: dir, progress: false });
  return { code, stdout: out.join("\n"), stderr: err.join("\n") };
}

const RATE_DOC = (value: number) => `---
conebook: 1
title: Rate control at PW-7, Tarn Gill (invented)
seed: 3
---

\`\`\`ts code:rate
const Q = control("rate", { value: ${value}, min: 100, max: 5000, unit: "m3/d" });
show.value(Q, "m3/d", "rate used");
\`\`\`
`;

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), "conebook-traps-"));
});

afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

function valueOf(json: string, cell: string, label: string): number {
  const run = JSON.parse(json) as { cells: { id: string; outputs: { type: string; label?: string; value: number }[] }[] };
  return run.cells.find((c) => c.id === cell)!.outputs.find((o) => o.label === label)!.value;
}

describe("recorded control values and edited defaults", () => {
  it("uses an edited default rather than the value recorded for the old default", async () => {
    await writeFile(join(dir, "rate.cone.md"), RATE_DOC(900));
    expect((await conebook("run", "rate.cone.md", "--write")).code).toBe(0);
    const text = await readFile(join(dir, "rate.cone.md"), "utf8");
    await writeFile(join(dir, "rate.cone.md"), text.replace("value: 900,", "value: 1000,"));
    const run = await conebook("run", "rate.cone.md", "--json");
    expect(run.code).toBe(0);
    expect(valueOf(run.stdout, "rate", "rate used")).toBe(1000);
  });

  it("keeps a value set with --set while the default is unchanged, and says so when an edited default sets it aside", async () => {
    await writeFile(join(dir, "set.cone.md"), RATE_DOC(900));
    expect((await conebook("run", "set.cone.md", "--write", "--set", "rate=1200")).code).toBe(0);
    const kept = await conebook("run", "set.cone.md", "--json");
    expect(valueOf(kept.stdout, "rate", "rate used")).toBe(1200);
    const fresh = await conebook("run", "set.cone.md", "--json", "--fresh");
    expect(valueOf(fresh.stdout, "rate", "rate used")).toBe(900);
    const text = await readFile(join(dir, "set.cone.md"), "utf8");
    await writeFile(join(dir, "set.cone.md"), text.replace("value: 900,", "value: 1000,"));
    const edited = await conebook("run", "set.cone.md");
    expect(edited.stdout).toContain("rate used = 1000 m3/d");
    expect(edited.stderr).toContain(
      // Line 8: the fence of cell rate, one line lower once --write added recordedWith to the header.
      'set.cone.md:8: note: control "rate": the default in the code changed from 900 m3/d to 1000 m3/d since the value 1200 m3/d was recorded, so the new default 1000 m3/d is used; give --set rate=1200 to use the recorded value again',
    );
  });
});
