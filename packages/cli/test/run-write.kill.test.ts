/**
 * Saving never loses a document: `conebook run --write` (the built command, packages/cli/dist/conebook.js, run by
 * plain node) is killed with SIGKILL at seeded moments spread over the whole run. After each kill the document
 * is exactly the old text or exactly the complete new text (the one an uninterrupted run writes), and the next
 * write removes every temporary file the killed runs left (a dead writer's files are stale; cli docs, "atomic
 * writes").
 */
import { spawn, spawnSync } from "node:child_process";
import { mkdtemp, readFile, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { seededFractions, temporaries } from "../../../tests/support/kill-moments.js";

const KILLS = 50;
const CLI = fileURLToPath(new URL("../dist/conebook.js", import.meta.url));

/** An invented document whose run takes a moment: a Theis curve and its fit (Wren Hollow, invented). */
const OLD = `---
conebook: 1
title: Saving under kills at Wren Hollow WH-OB1 (invented)
seed: 4
---

\`\`\`ts code:curve
const t = Array.from({ length: 400 }, (_, i) => 0.5 * 1.02 ** i);
const s = aq.drawdown("theis", { T: 420, S: 1.5e-4 }, { r: 25, Q: 960 }, t);
s[399]
\`\`\`

\`\`\`ts code:fit
const fit = aq.fitModel({ model: "theis", wells: [{ name: "WH-OB1", geometry: { r: 25, Q: 960 }, t, s }], start: { T: 100, S: 1e-3 } });
fit.parameters.find((q) => q.name === "T").estimate
\`\`\`
`;

describe("conebook run --write under SIGKILL", () => {
  it(`leaves the old or the complete new document through ${KILLS} kills at random moments, and no temporary file after the next write`, async () => {
    const dir = await mkdtemp(join(tmpdir(), "conebook-run-kill-"));
    const file = join(dir, "wh.cone.md");
    await writeFile(file, OLD);
    const t0 = performance.now();
    const whole = spawnSync(process.execPath, [CLI, "run", "wh.cone.md", "--write"], { cwd: dir, encoding: "utf8" });
    const runMs = performance.now() - t0;
    expect(whole.status, whole.stderr).toBe(0);
    const NEW = await readFile(file, "utf8");
    expect(NEW).not.toBe(OLD);
    expect(NEW).toContain("```json outputs:fit");
    let old = 0;
    let fresh = 0;
    let leftBehind = 0;
    for (const fraction of seededFractions(20261204, KILLS)) {
      await writeFile(file, OLD);
      const child = spawn(process.execPath, [CLI, "run", "wh.cone.md", "--write"], { cwd: dir, stdio: "ignore" });
      // Listened for from the start: a run may finish before its kill.
      const exited = new Promise((r) => child.once("exit", r));
      await new Promise((r) => setTimeout(r, fraction * runMs * 1.1));
      child.kill("SIGKILL");
      await exited;
      const text = await readFile(file, "utf8");
      if (text === OLD) old++;
      else {
        expect(text, "a killed run leaves the old or the complete new text").toBe(NEW);
        fresh++;
      }
      leftBehind = Math.max(leftBehind, (await temporaries(dir)).length);
    }
    expect(old + fresh).toBe(KILLS);
    const last = spawnSync(process.execPath, [CLI, "run", "wh.cone.md", "--write"], { cwd: dir, encoding: "utf8" });
    expect(last.status, last.stderr).toBe(0);
    expect(await readFile(file, "utf8")).toBe(NEW);
    expect(await temporaries(dir)).toEqual([]);
    console.log(
      `saving: ${KILLS} kills of conebook run --write over a ${runMs.toFixed(0)} ms run, ${KILLS} files intact (${old} old, ${fresh} new), ` +
        `0 corrupt, at most ${leftBehind} temporary files left at once, 0 after the next write`,
    );
  }, 180_000);
});
