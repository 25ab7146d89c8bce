/**
 * The command line as a user meets it, each run a fresh process whose CPU time and peak resident set it reports
 * itself on exit (report-usage.mjs):
 *  - cold `conebook verify` of the demo notebook, in rounds alternating with a bare `node -e 0` start (the floor
 *    any Node command pays), with the median of the paired ratios;
 *  - `conebook run` of the Alder Reach logger document (logger-document.ts: ISO 8601 timestamps every second and a
 *    barometric record, both pinned files; import, barometric correction, thinning, Theis fit, chart) at 1e3, 1e4,
 *    1e5 and 1e6 readings, within the default cell limits, with wall and CPU time, peak memory and the per-row slope.
 * Every run is checked: verify must report success, and each logger run must recover the generating T.
 */
import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { median, medianSample, pairedRounds, type Measurement, type Sample } from "../harness.js";
import { LOGGER_TRUTH, writeLoggerDocument } from "../logger-document.js";

const ROOT = fileURLToPath(new URL("../../../", import.meta.url));
const BIN = fileURLToPath(new URL("../../../packages/cli/bin/conebook.js", import.meta.url));
const USAGE_HOOK = fileURLToPath(new URL("../report-usage.mjs", import.meta.url));
const DEMO = "notebooks/kestrel-moor-constant-rate.cone.md";

interface ProcessRun extends Sample {
  /** Peak resident set of the process, MB. */
  peakMb: number;
  stdout: string;
}

/** Runs `node args` as a fresh process; wall time measured here, CPU and peak memory reported by the process. */
function runNode(args: string[], expectStatus: number, usageFile: string): ProcessRun {
  const start = performance.now();
  const run = spawnSync(process.execPath, ["--import", USAGE_HOOK, ...args], {
    cwd: ROOT,
    encoding: "utf8",
    maxBuffer: 64 * 2 ** 20,
    env: { ...process.env, CONEBOOK_BENCH_USAGE: usageFile },
  });
  const wallMs = performance.now() - start;
  if (run.status !== expectStatus) {
    throw new Error(`node ${args.join(" ")} exited ${run.status}, expected ${expectStatus}: ${run.stderr || run.stdout}`);
  }
  const usage = JSON.parse(readFileSync(usageFile, "utf8")) as { userCPUTime: number; systemCPUTime: number; maxRSS: number };
  return { wallMs, cpuMs: (usage.userCPUTime + usage.systemCPUTime) / 1000, peakMb: (usage.maxRSS * 1024) / 2 ** 20, stdout: run.stdout };
}

/** Least-squares slope of y against x. */
function slope(x: readonly number[], y: readonly number[]): number {
  const mx = x.reduce((a, b) => a + b, 0) / x.length;
  const my = y.reduce((a, b) => a + b, 0) / y.length;
  let sxy = 0;
  let sxx = 0;
  for (let i = 0; i < x.length; i++) {
    sxy += (x[i]! - mx) * (y[i]! - my);
    sxx += (x[i]! - mx) ** 2;
  }
  return sxy / sxx;
}

/** The fitted T (m2/d) of a logger run's JSON. */
function fittedT(stdout: string): number {
  const result = JSON.parse(stdout) as { cells: { id: string; outputs: { type: string; rows?: unknown[][] }[] }[] };
  const table = result.cells.find((c) => c.id === "fit")?.outputs.find((o) => o.type === "table");
  return Number(table?.rows?.[0]?.[1]);
}

export async function cliBenchmarks(): Promise<Measurement[]> {
  const build = spawnSync(process.execPath, ["packages/cli/scripts/build.mjs"], { cwd: ROOT, encoding: "utf8" });
  if (build.status !== 0) throw new Error(`building the conebook bundle failed: ${build.stderr}`);
  const work = mkdtempSync(join(tmpdir(), "conebook-bench-cli-"));
  const usage = join(work, "usage.json");
  try {
    const verify = () => {
      const r = runNode([BIN, "verify", DEMO], 0, usage);
      if (!/verified: all \d+ recorded outputs/.test(r.stdout)) throw new Error(`conebook verify of the demo did not verify: ${r.stdout}`);
      return r;
    };
    const bare = () => runNode(["-e", "0"], 0, usage);
    verify();
    const cold = await pairedRounds(7, verify, bare);
    const v = medianSample(cold.here);
    const b = medianSample(cold.peer);
    const verifyPeak = median((cold.here as ProcessRun[]).map((r) => r.peakMb));
    const rows: Measurement[] = [
      {
        name: "cold `conebook verify` of the demo notebook, wall",
        value: v.wallMs,
        cpu: v.cpuMs,
        unit: "ms",
        target: { absolute: 1000 },
        note: `a fresh process each time (bundle built first): parse, check data pins, rerun 21 cells, compare the outputs; peak RSS ${verifyPeak.toFixed(0)} MB; medians of 7 rounds`,
      },
      { name: "cold `conebook verify` of the demo notebook, CPU", value: v.cpuMs, unit: "ms", target: { absolute: 600 }, note: "user + system time of all threads, reported by the process" },
      {
        name: "cold `conebook verify` beside a bare node start",
        value: v.wallMs,
        cpu: v.cpuMs,
        unit: "ms",
        peer: b.wallMs,
        peerCpu: b.cpuMs,
        peerName: "bare `node -e 0`",
        paired: cold.paired,
        target: { ratio: 3 },
      },
    ];

    const sizes = [1e3, 1e4, 1e5, 1e6];
    const runs: { rows: number; wall: number; cpu: number; peak: number; T: number }[] = [];
    for (const size of sizes) {
      const folder = join(work, `logger-${size}`);
      const { path } = writeLoggerDocument(folder, size);
      const repeats = size >= 1e6 ? 2 : size >= 1e5 ? 3 : 5;
      const samples: ProcessRun[] = [];
      let T = NaN;
      for (let i = 0; i < repeats; i++) {
        const r = runNode([BIN, "run", path, "--json"], 0, usage);
        T = fittedT(r.stdout);
        if (!(Math.abs(T / LOGGER_TRUTH.T - 1) < 0.05)) throw new Error(`logger document of ${size} readings: fitted T = ${T} m2/d, generated with ${LOGGER_TRUTH.T}`);
        samples.push(r);
      }
      runs.push({ rows: size, wall: median(samples.map((s) => s.wallMs)), cpu: median(samples.map((s) => s.cpuMs)), peak: median(samples.map((s) => s.peakMb)), T });
      rmSync(folder, { recursive: true, force: true });
    }
    for (const r of runs) {
      const targets = r.rows === 1e5 ? { wall: 2000, peak: 250 } : r.rows === 1e6 ? { wall: 10000, peak: 600 } : undefined;
      const label = `logger document, ${r.rows.toLocaleString("en")} readings`;
      rows.push({
        name: `${label}, wall`,
        value: r.wall,
        cpu: r.cpu,
        unit: "ms",
        ...(targets ? { target: { absolute: targets.wall } } : {}),
        note: `\`conebook run --json\`, default cell limits; fitted T = ${r.T.toPrecision(5)} m2/d (generated with ${LOGGER_TRUTH.T}); median of ${r.rows >= 1e6 ? 2 : r.rows >= 1e5 ? 3 : 5} runs`,
      });
      rows.push({ name: `${label}, peak RSS`, value: r.peak, unit: "MB", ...(targets ? { target: { absolute: targets.peak } } : {}) });
    }
    const x = runs.map((r) => r.rows);
    rows.push({
      name: "logger document, per-row slope of wall time (1e3..1e6)",
      value: slope(x, runs.map((r) => r.wall)) * 1000,
      cpu: slope(x, runs.map((r) => r.cpu)) * 1000,
      unit: "us/row",
      note: `least squares over the four sizes; between 1e5 and 1e6 alone ${(((runs[3]!.wall - runs[2]!.wall) / 9e5) * 1000).toFixed(2)} us/row`,
    });
    rows.push({ name: "logger document, per-row slope of peak RSS (1e3..1e6)", value: slope(x, runs.map((r) => r.peak)) * 2 ** 20 / 1, unit: "B/row", note: "least squares over the four sizes" });
    return rows;
  } finally {
    rmSync(work, { recursive: true, force: true });
  }
}
