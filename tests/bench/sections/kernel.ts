/**
 * Benchmarks of the kernel: sandbox start, a full rerun of the worked demo document, the cost of calling a fit
 * through the bridge against calling it directly, and a 1,000-element array in and out of a bridge call. (Logger
 * documents of 1e3 to 1e6 readings are measured through the command line, sections/cli.ts.)
 * Every figure is checked: the runs must succeed and give the numbers the direct calls give.
 */
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { dirname } from "node:path";
import { convertArray, fitModel, theisModel } from "@conebook/aquifer";
import { parseDocument, type CellOutput, type ConebookDocument } from "@conebook/document";
import { createKernel, type Kernel, type RunResult } from "@conebook/kernel";
import { fileReaderFor } from "@conebook/kernel/node";
import { bestOfAsync, measure, medianSample, pairedRounds, type Measurement, type Sample } from "../harness.js";

interface FixtureWell { name: string; r: number; Q: number; t: number[]; s: number[] }
interface FixtureDataset { id: string; start: { T: number; S: number }; wells: FixtureWell[] }

const DEMO = fileURLToPath(new URL("../../../notebooks/kestrel-moor-constant-rate.cone.md", import.meta.url));
const FIT_FIXTURE = new URL("../../fixtures/fit/theis-fits.json", import.meta.url);

function parsed(text: string): ConebookDocument {
  const { document, diagnostics } = parseDocument(text);
  const errors = diagnostics.filter((d) => d.severity === "error");
  if (errors.length > 0) throw new Error(`benchmark document does not parse: ${errors[0]!.message}`);
  return document;
}

function requireOk(run: RunResult, what: string): void {
  const failing = Object.entries(run.status).filter(([, s]) => s !== "ok");
  if (failing.length > 0) {
    const [id] = failing[0]!;
    throw new Error(`${what}: cell ${id} failed: ${JSON.stringify(run.outputs[id])}`);
  }
}

function firstValue(outputs: CellOutput[] | undefined, what: string): number {
  const v = outputs?.find((o) => o.type === "value");
  if (!v || v.type !== "value") throw new Error(`${what}: no value output`);
  return v.value;
}

/** Sandbox start: a new QuickJS runtime and context with the bridge and prelude installed (module loaded). */
async function sandboxStart(kernel: Kernel): Promise<Measurement> {
  await kernel.measureSandboxStart();
  let best = Infinity;
  for (let i = 0; i < 20; i++) best = Math.min(best, await kernel.measureSandboxStart());
  return { name: "sandbox start (runtime, context, bridge, prelude)", value: best, unit: "ms", target: { absolute: 100 }, note: "best of 20, QuickJS module already loaded" };
}

/** Full rerun of the worked Kestrel Moor analysis (20 executable cells, two pinned files, two fits, charts). */
async function demoRerun(kernel: Kernel): Promise<Measurement> {
  const doc = parsed(readFileSync(DEMO, "utf8"));
  const readFile = fileReaderFor(dirname(DEMO));
  let cells = 0;
  const ms = await bestOfAsync(
    5,
    () => kernel.runDocument(doc, { readFile }),
    (run) => {
      requireOk(run, "demo document");
      cells = Object.keys(run.status).length;
    },
  );
  return { name: `rerun of the Kestrel Moor demo document (${cells} cells)`, value: ms, unit: "ms", target: { absolute: 300 }, note: "best of 5, sandbox start included, QuickJS module already loaded" };
}

/** Decimal text that reads back as exactly the same double (shortest round-trip form). */
function csvOf(t: readonly number[], s: readonly number[]): string {
  return ["t,s", ...t.map((v, i) => `${v},${s[i]}`)].join("\n");
}

/**
 * The 1,000-point Theis fit of tests/fixtures/fit/theis-fits.json from a cell against the same call in Node.
 * The cell fits REPEATS times in a loop, so the per-fit figure is the cell's time over REPEATS (strip, evaluate
 * and the copies of data both ways included). Rounds alternate which side goes first; the figure is the median of
 * the per-round ratios.
 */
async function fitThroughBridge(kernel: Kernel): Promise<Measurement> {
  const fixture = JSON.parse(readFileSync(FIT_FIXTURE, "utf8")) as { datasets: FixtureDataset[] };
  const dataset = fixture.datasets.find((d) => d.id === "thousand-point");
  if (!dataset) throw new Error("tests/fixtures/fit/theis-fits.json has no 'thousand-point' data set");
  const well = dataset.wells[0]!;
  const REPEATS = 20;
  const ROUNDS = 15;
  const tolerances = { ftol: 1e-10, xtol: 1e-10, gtol: 1e-10 };
  const wells = [{ name: well.name, geometry: { r: well.r, Q: well.Q }, t: Float64Array.from(well.t), s: Float64Array.from(well.s) }];
  const options = { model: theisModel, wells, start: dataset.start, ...tolerances };
  const direct = (): Sample => {
    const s = measure(() => {
      let last = fitModel(options);
      for (let i = 1; i < REPEATS; i++) last = fitModel(options);
      return last;
    });
    if (s.result.n !== 1000) throw new Error(`direct fit used ${s.result.n} points`);
    return { wallMs: s.wallMs / REPEATS, cpuMs: s.cpuMs / REPEATS };
  };
  const directT = fitModel(options).parameters[0]!.estimate;

  const doc = parsed(
    [
      "---\nconebook: 1\ntitle: bridge fit benchmark\nseed: 1\nlimits:\n  cellTimeMs: 60000\n---\n",
      "```csv data:record name=rec\n" + csvOf(well.t, well.s) + "\n```\n",
      "```ts code:well\n" +
        `const wells = [{ name: ${JSON.stringify(well.name)}, geometry: { r: ${well.r}, Q: ${well.Q} }, t: rec.byColumn.t, s: rec.byColumn.s }];\n` +
        "```\n",
      "```ts code:fit\n" +
        `let fit;\nfor (let i = 0; i < ${REPEATS}; i++) fit = aq.fitModel({ model: "theis", wells, start: ${JSON.stringify(dataset.start)}, ${JSON.stringify(tolerances).slice(1, -1)} });\n` +
        "show.value(fit.parameters[0].estimate, \"m2/d\", \"T\")\n```\n",
    ].join("\n"),
  );
  const throughCell = async (): Promise<Sample> => {
    const cpu0 = process.cpuUsage();
    const run = await kernel.runDocument(doc);
    const cpu = process.cpuUsage(cpu0);
    requireOk(run, "bridge fit document");
    const T = firstValue(run.outputs.fit, "bridge fit document");
    if (!Object.is(T, directT)) throw new Error(`the fit from a cell gave T = ${T}, the direct fit ${directT}; the bridge must not change numbers`);
    // The CPU time of the whole run, scaled by the fit cell's share of its wall time.
    const share = run.timings.cells.fit! / run.timings.totalMs;
    return { wallMs: run.timings.cells.fit! / REPEATS, cpuMs: ((cpu.user + cpu.system) / 1000) * share / REPEATS };
  };
  for (let i = 0; i < 3; i++) {
    direct();
    await throughCell();
  }
  const { here, peer, paired } = await pairedRounds(ROUNDS, throughCell, direct);
  const h = medianSample(here);
  const p = medianSample(peer);
  return {
    name: "Theis fit of 1,000 points from a cell (per fit)",
    value: h.wallMs,
    cpu: h.cpuMs,
    unit: "ms",
    peer: p.wallMs,
    peerCpu: p.cpuMs,
    peerName: "same fitModel call in Node",
    paired,
    target: { ratio: 1.1 },
    note: `T identical to the direct fit (${directT.toPrecision(10)} m2/d); each round the mean of ${REPEATS} consecutive fits on each side`,
  };
}

/**
 * A 1,000-element Float64Array into the sandbox's bridge and back (aq.convertArray from m to ft), per call, from a
 * cell that makes CALLS calls, beside the same call in Node. Checked: the last result equals the direct one.
 */
async function arrayThroughBridge(kernel: Kernel): Promise<Measurement> {
  const CALLS = 2000;
  const ROUNDS = 9;
  const x = Float64Array.from({ length: 1000 }, (_, i) => 0.5 + i * 0.01);
  const expected = convertArray(x, "m", "ft");
  const doc = parsed(
    "---\nconebook: 1\ntitle: bridge array benchmark\nseed: 1\n---\n\n```ts code:calls\n" +
      "const x = Float64Array.from({ length: 1000 }, (_, i) => 0.5 + i * 0.01);\n" +
      `let y;\nfor (let i = 0; i < ${CALLS}; i++) y = aq.convertArray(x, "m", "ft");\n` +
      "show.json(Array.from(y.subarray(995)))\n```\n",
  );
  const throughCell = async (): Promise<Sample> => {
    const cpu0 = process.cpuUsage();
    const run = await kernel.runDocument(doc);
    const cpu = process.cpuUsage(cpu0);
    requireOk(run, "bridge array document");
    const shown = run.outputs.calls?.find((o) => o.type === "json");
    const tail = shown && shown.type === "json" ? (shown.value as number[]) : [];
    if (!tail.every((v, i) => Object.is(v, expected[995 + i]))) throw new Error("the array that came back from the bridge differs from the direct result");
    const share = run.timings.cells.calls! / run.timings.totalMs;
    return { wallMs: (run.timings.cells.calls! * 1000) / CALLS, cpuMs: (((cpu.user + cpu.system) / 1000) * share * 1000) / CALLS };
  };
  const direct = (): Sample => {
    const s = measure(() => {
      let y = convertArray(x, "m", "ft");
      for (let i = 1; i < CALLS; i++) y = convertArray(x, "m", "ft");
      return y;
    });
    if (s.result[999] !== expected[999]) throw new Error("direct convertArray changed its result");
    return { wallMs: (s.wallMs * 1000) / CALLS, cpuMs: (s.cpuMs * 1000) / CALLS };
  };
  await throughCell();
  direct();
  const { here, peer, paired } = await pairedRounds(ROUNDS, throughCell, direct);
  const h = medianSample(here);
  const p = medianSample(peer);
  return {
    name: "1,000-element Float64Array into a bridge call and back (per call)",
    value: h.wallMs,
    cpu: h.cpuMs,
    unit: "us",
    peer: p.wallMs,
    peerCpu: p.cpuMs,
    peerName: "same convertArray call in Node",
    paired,
    target: { absolute: 20 },
    note: `aq.convertArray(x, "m", "ft") ${CALLS} times in one cell (encode, copy in, host call, copy out, decode); the last values checked against the direct call`,
  };
}

/** The kernel's benchmark figures, in the order printed. */
export async function kernelBenchmarks(): Promise<Measurement[]> {
  const kernel = createKernel();
  try {
    return [await sandboxStart(kernel), await demoRerun(kernel), await fitThroughBridge(kernel), await arrayThroughBridge(kernel)];
  } finally {
    kernel.dispose();
  }
}
