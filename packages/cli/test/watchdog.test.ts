/**
 * The watchdog: the command runs the kernel in a worker thread and ends the worker when a cell outlives its time
 * limit by WATCHDOG_MARGIN_MS, for work no guard inside the kernel sees. Runs `main` in this process (the worker
 * is a real one).
 */
import { mkdtemp, readFile, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { WATCHDOG_MARGIN_MS } from "@conebook/kernel";
import { main } from "../src/cli.js";

async function conebook(cwd: string, ...argv: string[]) {
  const out: string[] = [];
  const err: string[] = [];
  const code = await main(argv, { out: (t) => out.push(t), err: (t) => err.push(t), cwd, progress: false });
  return { code, stdout: out.join("\n"), stderr: err.join("\n") };
}

// Building a typed array from an array-like of 2^27 holes reads them one by one inside one operation that no
// guard meters (2^26 of them took 1.26 s on a fast machine, so twice as many outlast the 1.3 s bound with room);
// the kernel alone could not stop it before it returned. 128 MiB stays under the sandbox's default 256 MiB.
const STUCK = `const bytes = new Uint8Array({ length: 2 ** 27 });\nbytes.length`;
const DOC = `---
conebook: 1
title: Watchdog probe at KM-OB7 (invented)
seed: 5
limits:
  cellTimeMs: 300
---

\`\`\`ts code:before
const rate = 1450; // m3/d
rate / 86400
\`\`\`

\`\`\`ts code:stuck
${STUCK}
\`\`\`

\`\`\`ts code:after
rate * 2
\`\`\`
`;

describe("the watchdog", () => {
  it("ends a run stuck inside a builtin 1000 ms after the cell's time limit and keeps the earlier cells' outputs", async () => {
    expect(WATCHDOG_MARGIN_MS).toBe(1000);
    const dir = await mkdtemp(join(tmpdir(), "conebook-watchdog-"));
    await writeFile(join(dir, "d.cone.md"), DOC);
    const t0 = performance.now();
    const r = await conebook(dir, "run", "d.cone.md", "--json", "--write");
    const ms = performance.now() - t0;
    expect(r.code).toBe(1);
    const json = JSON.parse(r.stdout) as { cells: { id: string; status: string; timeMs: number; outputs: { type: string; message?: string; value?: number }[] }[] };
    const [before, stuck, after] = json.cells;
    expect(before).toMatchObject({ id: "before", status: "ok", outputs: [{ type: "value", value: 1450 / 86400 }] });
    expect(stuck!.status).toBe("error");
    expect(stuck!.outputs).toEqual([
      {
        type: "error",
        message:
          "Cell stuck was stopped after running for its time limit of 300 ms. Make the computation smaller (fewer points, fewer iterations), or raise limits.cellTimeMs in the header (at most 600000). " +
          `It was stuck inside one operation, so the run was ended ${WATCHDOG_MARGIN_MS} ms after the limit.`,
      },
    ]);
    expect(stuck!.timeMs).toBeGreaterThanOrEqual(300 + WATCHDOG_MARGIN_MS - 20);
    expect(stuck!.timeMs).toBeLessThan(300 + WATCHDOG_MARGIN_MS + 1000);
    expect(after).toMatchObject({ id: "after", status: "not-run" });
    expect(r.stderr).toContain("d.cone.md was not written: cell stuck failed");
    expect(await readFile(join(dir, "d.cone.md"), "utf8")).toBe(DOC);
    // Starting the worker from the TypeScript sources takes a few seconds here; the bundle starts it in about 0.1 s.
    expect(ms).toBeLessThan(15000);
  });

  it("ends a loop the kernel's interrupt reaches only every 10,000 steps, within the limit plus the margin", async () => {
    // Each comparison of two 32 MiB strings takes about 25 ms inside the engine; in the kernel alone this loop ran
    // about 245 s past a 300 ms limit. Whichever stops it first, the kernel or the watchdog, the bound holds.
    const dir = await mkdtemp(join(tmpdir(), "conebook-watchdog-"));
    const loop = `const a = "x".repeat(2 ** 25) + "y", b = "x".repeat(2 ** 25) + "z";\nlet n = 0;\nfor (;;) { if (a < b) n++; }`;
    await writeFile(join(dir, "d.cone.md"), DOC.replace(STUCK, loop));
    const r = await conebook(dir, "run", "d.cone.md", "--json");
    expect(r.code).toBe(1);
    const stuck = (JSON.parse(r.stdout) as { cells: { id: string; timeMs: number; outputs: { message?: string }[] }[] }).cells[1]!;
    expect(stuck.outputs[0]!.message).toMatch(/^Cell stuck was stopped after running for its time limit of 300 ms\./);
    expect(stuck.timeMs).toBeLessThan(300 + WATCHDOG_MARGIN_MS + 1000);
  });
});
