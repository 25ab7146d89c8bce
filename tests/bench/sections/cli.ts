/**
 * Cold start of the `conebook` command: `conebook verify` of the demo notebook as a fresh process, beside a
 * bare `node -e 0` process start measured in the same run (the floor any Node command pays).
 */
import { spawnSync } from "node:child_process";
import { fileURLToPath } from "node:url";
import type { Measurement } from "../harness.js";

const ROOT = fileURLToPath(new URL("../../../", import.meta.url));
const BIN = fileURLToPath(new URL("../../../packages/cli/bin/conebook.js", import.meta.url));
const DEMO = "notebooks/kestrel-moor-constant-rate.cone.md";

function bestSpawn(repeats: number, args: string[], expectStatus: number): number {
  let best = Infinity;
  for (let i = 0; i < repeats; i++) {
    const start = performance.now();
    const run = spawnSync(process.execPath, args, { cwd: ROOT, encoding: "utf8" });
    const ms = performance.now() - start;
    if (run.status !== expectStatus) {
      throw new Error(`node ${args.join(" ")} exited ${run.status}, expected ${expectStatus}: ${run.stderr || run.stdout}`);
    }
    best = Math.min(best, ms);
  }
  return best;
}

export function cliBenchmarks(): Measurement[] {
  const build = spawnSync(process.execPath, ["packages/cli/scripts/build.mjs"], { cwd: ROOT, encoding: "utf8" });
  if (build.status !== 0) throw new Error(`building the conebook bundle failed: ${build.stderr}`);
  const bare = bestSpawn(5, ["-e", "0"], 0);
  const verify = bestSpawn(5, [BIN, "verify", DEMO], 0);
  return [
    {
      name: "cold `conebook verify` of the demo notebook",
      value: verify,
      unit: "ms",
      peer: bare,
      peerName: "bare `node -e 0` start",
      target: { absolute: 1000 },
      note: "a fresh process each time (bundle built first): parse, check data pins, rerun 21 cells, compare 27 outputs",
    },
  ];
}
