/**
 * Small timing harness for `npm run bench`: best-of-N wall-clock timing with a checked result, so the work
 * cannot be optimised away, and a table printer. Figures are for the machine the bench runs on.
 */
import { spawnSync } from "node:child_process";
import { cpus, totalmem } from "node:os";
import { fileURLToPath } from "node:url";
import { peerEnvironment, preparePython } from "./python-peer.js";

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
  /** Paired ratios here / peer of interleaved rounds (wall time): their median and spread (lowest, highest). */
  readonly paired?: PairedRatio;
  /** CPU time of the same work, in `unit`, here and on the peer (medians of the rounds). */
  readonly cpu?: number;
  readonly peerCpu?: number;
}

/** Median and spread of the per-round ratios of two sides measured in alternation. */
export interface PairedRatio {
  readonly median: number;
  readonly low: number;
  readonly high: number;
  readonly rounds: number;
  /** The same for CPU time, when both sides report it. */
  readonly cpuMedian?: number;
}

/** Wall-clock and CPU time of one measured piece of work, ms. */
export interface Sample {
  readonly wallMs: number;
  readonly cpuMs: number;
}

/** Runs `fn` once and returns its result with its wall-clock and CPU time (this process, all threads). */
export function measure<T>(fn: () => T): Sample & { result: T } {
  const cpu0 = process.cpuUsage();
  const wall0 = performance.now();
  const result = fn();
  const wallMs = performance.now() - wall0;
  const cpu = process.cpuUsage(cpu0);
  return { wallMs, cpuMs: (cpu.user + cpu.system) / 1000, result };
}

/** The median of numbers (the mean of the middle two for an even count). */
export function median(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 === 1 ? sorted[mid]! : 0.5 * (sorted[mid - 1]! + sorted[mid]!);
}

/**
 * Measures two sides in `rounds` alternating rounds (here first in even rounds, the peer first in odd ones), so
 * that a change of the machine's load meets both alike; returns each side's samples and the paired ratios.
 */
export async function pairedRounds(
  rounds: number,
  here: () => Sample | Promise<Sample>,
  peer: () => Sample | Promise<Sample>,
): Promise<{ here: Sample[]; peer: Sample[]; paired: PairedRatio }> {
  const a: Sample[] = [];
  const b: Sample[] = [];
  for (let i = 0; i < rounds; i++) {
    if (i % 2 === 0) {
      a.push(await here());
      b.push(await peer());
    } else {
      b.push(await peer());
      a.push(await here());
    }
  }
  const ratios = a.map((x, i) => x.wallMs / b[i]!.wallMs);
  const cpuRatios = a.map((x, i) => x.cpuMs / b[i]!.cpuMs).filter(Number.isFinite);
  return {
    here: a,
    peer: b,
    paired: {
      median: median(ratios),
      low: Math.min(...ratios),
      high: Math.max(...ratios),
      rounds,
      ...(cpuRatios.length === rounds ? { cpuMedian: median(cpuRatios) } : {}),
    },
  };
}

/** Medians of the wall-clock and CPU times of samples. */
export function medianSample(samples: readonly Sample[]): Sample {
  return { wallMs: median(samples.map((s) => s.wallMs)), cpuMs: median(samples.map((s) => s.cpuMs)) };
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
  const choice = preparePython();
  const python = choice.python;
  const run = spawnSync(python, [script, ...args], { encoding: "utf8", timeout: 600_000, maxBuffer: 64 * 2 ** 20, env: peerEnvironment(choice) });
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

/** The ratio a target is judged on: the median paired ratio when there is one, else figure over peer figure. */
export function ratioOf(m: Measurement): number | undefined {
  if (m.paired) return m.paired.median;
  return m.peer === undefined ? undefined : m.value / m.peer;
}

/** Verdict for one measurement against its target, e.g. "met (0.42x <= 0.5x)". */
export function verdict(m: Measurement): string {
  if (!m.target) return "";
  if (m.target.ratio !== undefined) {
    const ratio = ratioOf(m);
    if (ratio === undefined) return "MISSED: no peer figure";
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

function ratioText(m: Measurement): string {
  if (m.paired) {
    const p = m.paired;
    const cpu = p.cpuMedian === undefined ? "" : `; CPU ${p.cpuMedian.toFixed(3)}x`;
    return `${p.median.toFixed(3)}x (${p.low.toFixed(2)}-${p.high.toFixed(2)}, ${p.rounds} rounds${cpu})`;
  }
  return m.peer === undefined ? "-" : `${(m.value / m.peer).toFixed(3)}x`;
}

function targetText(m: Measurement): string {
  if (!m.target) return "-";
  if (m.target.ratio !== undefined) return `<= ${m.target.ratio}x ${m.peerName ?? "peer"}`;
  return `<= ${m.target.absolute} ${m.unit}`;
}

/** Every measurement printed so far that has a target, for the closing summary. */
const withTargets: { section: string; m: Measurement }[] = [];

/** Prints measurements as an aligned table with the peer figure and the ratio. */
export function printTable(title: string, rows: readonly Measurement[]): void {
  console.log(`\n## ${title}`);
  for (const m of rows) if (m.target) withTargets.push({ section: title, m });
  const cpuText = (v: number | undefined, unit: string) => (v === undefined ? "" : `, CPU ${format(v)} ${unit}`);
  const lines = rows.map((m) => [
    m.name,
    `${format(m.value)} ${m.unit}${cpuText(m.cpu, m.unit)}`,
    m.peer === undefined ? "-" : `${format(m.peer)} ${m.unit}${cpuText(m.peerCpu, m.unit)} (${m.peerName ?? "peer"})`,
    ratioText(m),
    verdict(m),
  ]);
  const header = ["measure", "here", "peer, same run", "ratio (median, spread)", "target"];
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

/** Prints every target met or missed so far, with figure, target and peer ratio; returns the number missed. */
export function printTargetSummary(): number {
  console.log("\n## Targets");
  const header = ["target", "figure", "target", "peer ratio", "verdict"];
  const lines = withTargets.map(({ m }) => [m.name, `${format(m.value)} ${m.unit}`, targetText(m), ratioText(m), verdict(m).startsWith("met") ? "met" : "MISSED"]);
  const widths = header.map((h, i) => Math.max(h.length, ...lines.map((l) => l[i]!.length)));
  const row = (cells: string[]) => cells.map((c, i) => c.padEnd(widths[i]!)).join("  ");
  console.log(row(header));
  console.log(widths.map((w) => "-".repeat(w)).join("  "));
  for (const l of lines) console.log(row(l));
  const missed = lines.filter((l) => l[4] === "MISSED").length;
  console.log(`\n${lines.length - missed} of ${lines.length} targets met, ${missed} missed.`);
  return missed;
}
