/**
 * The long version of packages/cli/test/run-write.kill.test.ts: `npx tsx tests/soak/save-kills.ts [--kills=1000]
 * [--seed=20261204] [--verify-every=50]` (also run by `npm run soak`). The built command
 * (packages/cli/dist/conebook.js, made by `npm run build:cli`) runs `conebook run --set rate=1200 --write` on a
 * recorded document and is killed with SIGKILL at seeded moments spread over the whole run, as in the fast test.
 *
 * After each kill the file must be byte for byte the old text or the complete new text, both of which parse
 * without an error and verify against their records (checked once at the start, and on the killed file itself
 * every `verify-every` kills); a kill that left a temporary file is followed by an uninterrupted write, after
 * which no temporary file may remain. Prints the figure (kills, corrupt files, temporary files left, elapsed);
 * exit 1 on any corrupt file, failed parse or verify, or a temporary file left after the next write, naming the
 * kill and its moment so that it can be reproduced with the seed.
 */
import { spawn, spawnSync } from "node:child_process";
import { existsSync } from "node:fs";
import { mkdtemp, readFile, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { parseDocument } from "@conebook/document";
import { seededFractions, temporaries } from "../support/kill-moments.js";

const option = (name: string, fallback: number): number => {
  const given = process.argv.find((a) => a.startsWith(`--${name}=`));
  const value = given === undefined ? fallback : Number(given.slice(name.length + 3));
  if (!Number.isInteger(value) || value < 0) throw new Error(`--${name} must be a whole number, got ${given}`);
  return value;
};
const KILLS = option("kills", 1000);
const SEED = option("seed", 20261204);
const VERIFY_EVERY = option("verify-every", 50);
const CLI = fileURLToPath(new URL("../../packages/cli/dist/conebook.js", import.meta.url));
const FILE = "wh.cone.md";
const RUN_NEW = ["run", FILE, "--set", "rate=1200", "--write"];

/** An invented document whose run takes a moment: a Theis curve at a controlled rate and its fit (Wren Hollow, invented). */
const SOURCE = `---
conebook: 1
title: Saving under kills at Wren Hollow WH-OB1 (invented)
seed: 4
---

\`\`\`ts code:curve
const Q = control("rate", { value: 960, min: 100, max: 3000, unit: "m3/d", description: "Pumping rate of WH-PW1" });
const t = Array.from({ length: 400 }, (_, i) => 0.5 * 1.02 ** i);
const s = aq.drawdown("theis", { T: 420, S: 1.5e-4 }, { r: 25, Q }, t);
s[399]
\`\`\`

\`\`\`ts code:fit
const fit = aq.fitModel({ model: "theis", wells: [{ name: "WH-OB1", geometry: { r: 25, Q }, t, s }], start: { T: 100, S: 1e-3 } });
fit.parameters.find((q) => q.name === "T").estimate
\`\`\`
`;

/** The same seeded moments as the fast test: a linear congruential generator (Numerical Recipes constants). */
function command(dir: string, args: string[]): { status: number | null; output: string } {
  const r = spawnSync(process.execPath, [CLI, ...args], { cwd: dir, encoding: "utf8", timeout: 120_000 });
  return { status: r.status, output: `${r.stdout}${r.stderr}`.trim() };
}

/** Problems of a text that should be a readable, recorded document: parse errors, and the verify outcome. */
function parseProblems(text: string): string[] {
  try {
    return parseDocument(text, { file: FILE }).diagnostics.filter((d) => d.severity === "error").map((d) => d.message);
  } catch (e) {
    return [(e as Error).message];
  }
}

async function main(): Promise<number> {
  if (!existsSync(CLI)) {
    console.log(`save-kills: ${CLI} is missing; build it with \`npm run build:cli\``);
    return 1;
  }
  const dir = await mkdtemp(join(tmpdir(), "conebook-soak-kill-"));
  const path = join(dir, FILE);
  const failures: string[] = [];
  try {
    await writeFile(path, SOURCE);
    const first = command(dir, ["run", FILE, "--write"]);
    if (first.status !== 0) throw new Error(`recording the old document failed: ${first.output}`);
    const OLD = await readFile(path, "utf8");
    const t0 = performance.now();
    const whole = command(dir, RUN_NEW);
    const runMs = performance.now() - t0;
    if (whole.status !== 0) throw new Error(`the uninterrupted run failed: ${whole.output}`);
    const NEW = await readFile(path, "utf8");
    if (NEW === OLD || !NEW.includes("\"value\": 1200,")) throw new Error("the new run did not record the new rate");
    for (const [name, text] of [["old", OLD], ["new", NEW]] as const) {
      const problems = parseProblems(text);
      if (problems.length > 0) throw new Error(`the ${name} text does not parse cleanly: ${problems.join("; ")}`);
      await writeFile(path, text);
      const v = command(dir, ["verify", FILE]);
      if (v.status !== 0) throw new Error(`the ${name} text does not verify: ${v.output}`);
    }

    const started = performance.now();
    let old = 0;
    let fresh = 0;
    let corrupt = 0;
    let leftTemporary = 0;
    let leftAfterNextWrite = 0;
    let verified = 0;
    const fractions = seededFractions(SEED, KILLS);
    for (let k = 0; k < KILLS; k++) {
      const fraction = fractions[k]!;
      const moment = `kill ${k + 1} (seed ${SEED}) at ${(fraction * 1.1).toFixed(4)} of the run`;
      await writeFile(path, OLD);
      const child = spawn(process.execPath, [CLI, ...RUN_NEW], { cwd: dir, stdio: "ignore" });
      // Listened for from the start: a run may finish before its kill.
      const exited = new Promise((r) => child.once("exit", r));
      await new Promise((r) => setTimeout(r, fraction * runMs * 1.1));
      child.kill("SIGKILL");
      await exited;
      const text = await readFile(path, "utf8");
      if (text === OLD) old++;
      else if (text === NEW) fresh++;
      else {
        corrupt++;
        failures.push(`${moment}: the file is neither the old nor the new text (${text.length} characters)`);
        continue;
      }
      const problems = parseProblems(text);
      if (problems.length > 0) failures.push(`${moment}: ${problems.join("; ")}`);
      if (VERIFY_EVERY > 0 && (k + 1) % VERIFY_EVERY === 0) {
        const v = command(dir, ["verify", FILE]);
        if (v.status === 0) verified++;
        else failures.push(`${moment}: verify exited ${v.status}: ${v.output}`);
      }
      if ((await temporaries(dir)).length > 0) {
        leftTemporary++;
        const next = command(dir, RUN_NEW);
        if (next.status !== 0) failures.push(`${moment}: the next write failed: ${next.output}`);
        const remaining = await temporaries(dir);
        leftAfterNextWrite += remaining.length;
        if (remaining.length > 0) failures.push(`${moment}: ${remaining.join(", ")} left after the next write`);
      }
    }
    const elapsed = (performance.now() - started) / 1000;
    console.log(
      `saving: ${KILLS} kills of conebook run --write over a ${runMs.toFixed(0)} ms run (seed ${SEED}): ` +
        `${old + fresh} files intact (${old} old, ${fresh} new), ${corrupt} corrupt, every intact file parsed, ` +
        `${verified} verified on the spot; ${leftTemporary} kills left a temporary file, ${leftAfterNextWrite} left after the next write; ` +
        `${elapsed.toFixed(1)} s`,
    );
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
  for (const line of failures) console.log(`  ${line}`);
  return failures.length === 0 ? 0 : 1;
}

process.exitCode = await main();
