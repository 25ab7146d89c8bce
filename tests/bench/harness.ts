/**
 * Small timing harness for `npm run bench`: best-of-N wall-clock timing with a checked result, so the work
 * cannot be optimised away, and a table printer. Figures are for the machine the bench runs on.
 */
import { spawnSync } from "node:child_process";
import { cpus, totalmem } from "node:os";
import { fileURLToPath } from "node:url";

export interface Measurement {
  readonly name: string;
  /** Figure measured here. */
  readonly value: number;
  readonly unit: string;
  /** The same figure measured on the peer in the same run, when there is one. */
  readonly peer?: number;
  readonly peerName?: string;
  /** Target: this figure at most `ratio` times the peer's, or at most `absolute` in `unit`. */
  readonly target?: { readonly ratio?: number; readonly absolute?: number };
  readonly note?: string;
}

/** Best wall-clock time in ms of `repeats` runs of `fn`; `check` sees the last result and must accept it. */
export function bestOf<T>(repeats: number, fn: () => T, check: (result: T) => void): number {
  let best = Infinity;
  let last: T | undefined;
  for (let i = 0; i < repeats; i++) {
    const start = performance.now();
    last = fn();
    best = Math.min(best, performance.now() - start);
  }
  check(last as T);
  return best;
}

/** Async variant of bestOf. */
export async function bestOfAsync<T>(repeats: number, fn: () => Promise<T>, check: (result: T) => void): Promise<number> {
  let best = Infinity;
  let last: T | undefined;
  for (let i = 0; i < repeats; i++) {
    const start = performance.now();
    last = await fn();
    best = Math.min(best, performance.now() - start);
  }
  check(last as T);
  return best;
}

const PEER_SCRIPT = fileURLToPath(new URL("./peer/peer_bench.py", import.meta.url));

/**
 * Runs a Python peer script with the given arguments and parses the one JSON object it prints; null, with the
 * reason printed, when python3 or scipy is missing or the script fails.
 */
export function runPythonPeer(script: string, args: readonly string[]): Record<string, Record<string, unknown>> | null {
  const python = process.env.CONEBOOK_PYTHON ?? "/usr/bin/python3";
  const run = spawnSync(python, [script, ...args], { encoding: "utf8", timeout: 600_000, maxBuffer: 64 * 2 ** 20 });
  if (run.status !== 0) {
    console.log(`peer unavailable (${python} ${script}): ${run.error?.message ?? run.stderr.trim().split("\n").pop()}`);
    console.log("install it with: apt-get install python3-scipy python3-mpmath");
    return null;
  }
  return JSON.parse(run.stdout) as Record<string, Record<string, unknown>>;
}

/** Runs the scipy peer (peer/peer_bench.py) for the named cases; null when it is unavailable. */
export function runPeer(cases: readonly string[]): Record<string, Record<string, unknown>> | null {
  return runPythonPeer(PEER_SCRIPT, cases);
}

/** One line describing this machine. */
export function machineLine(): string {
  const cpu = cpus();
  return `machine: ${cpu.length} x ${cpu[0]?.model ?? "unknown cpu"}, ${(totalmem() / 2 ** 30).toFixed(1)} GiB, node ${process.version}`;
}

function format(value: number): string {
  if (!Number.isFinite(value)) return String(value);
  const magnitude = Math.abs(value);
  if (magnitude >= 1000) return value.toFixed(0);
  if (magnitude >= 10) return value.toFixed(1);
  if (magnitude >= 1) return value.toFixed(2);
  return value.toPrecision(3);
}

/** Verdict for one measurement against its target, e.g. "met (0.42x <= 0.5x)". */
export function verdict(m: Measurement): string {
  if (!m.target) return "";
  if (m.target.ratio !== undefined) {
    if (m.peer === undefined) return "target: no peer figure";
    const ratio = m.value / m.peer;
    const ok = ratio <= m.target.ratio;
    return ok
      ? `met (${ratio.toFixed(2)}x <= ${m.target.ratio}x)`
      : `MISSED by ${((ratio / m.target.ratio - 1) * 100).toFixed(0)} % (${ratio.toFixed(2)}x > ${m.target.ratio}x)`;
  }
  if (m.target.absolute !== undefined) {
    const ok = m.value <= m.target.absolute;
    return ok
      ? `met (<= ${m.target.absolute} ${m.unit})`
      : `MISSED by ${((m.value / m.target.absolute - 1) * 100).toFixed(0)} % (> ${m.target.absolute} ${m.unit})`;
  }
  return "";
}

/** Prints measurements as an aligned table with the peer figure and the ratio. */
export function printTable(title: string, rows: readonly Measurement[]): void {
  console.log(`\n## ${title}`);
  const lines = rows.map((m) => [
    m.name,
    `${format(m.value)} ${m.unit}`,
    m.peer === undefined ? "-" : `${format(m.peer)} ${m.unit} (${m.peerName ?? "peer"})`,
    m.peer === undefined ? "-" : `${(m.value / m.peer).toFixed(3)}x`,
    verdict(m),
  ]);
  const header = ["measure", "here", "peer, same run", "ratio", "target"];
  const widths = header.map((h, i) => Math.max(h.length, ...lines.map((l) => l[i]!.length)));
  const row = (cells: string[]) => cells.map((c, i) => c.padEnd(widths[i]!)).join("  ");
  console.log(row(header));
  console.log(widths.map((w) => "-".repeat(w)).join("  "));
  for (const l of lines) console.log(row(l));
  for (const m of rows) if (m.note) console.log(`  note (${m.name}): ${m.note}`);
}

/** n points spaced evenly in ln between lo and hi (both > 0), ends included. */
export function logspace(lo: number, hi: number, n: number): Float64Array {
  const out = new Float64Array(n);
  const a = Math.log(lo);
  const step = (Math.log(hi) - a) / (n - 1);
  for (let i = 0; i < n; i++) out[i] = Math.exp(a + i * step);
  return out;
}
