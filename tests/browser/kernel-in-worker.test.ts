/**
 * The kernel in a browser Web Worker runs from the same source as in Node and gives the same outputs.
 *
 * beforeAll bundles packages/kernel/src/worker.ts (through worker-entry.ts) and a page script with esbuild, serves
 * them with the QuickJS release-sync wasm file from an in-memory server on 127.0.0.1, opens the page in headless
 * Chromium (playwright-core; the npm-provided build or CONEBOOK_CHROMIUM, see chromium.ts), and runs the demo notebook once in
 * the worker and once in Node through the same function, runDocumentText.
 *
 * Why the demo is compared with the verify tolerance (1e-9, DEFAULT_RTOL) and not bit for bit: cells run in
 * QuickJS, whose wasm carries its own libm, so arithmetic inside the sandbox is bit-identical on every host (the
 * sandbox test below checks this exactly). The aquifer functions behind `aq.*` run on the host engine, and the
 * host's Math functions differ in the last bit between engines. Measured with 20000 inputs each, Node 20.20.2
 * (V8 11.3.244.8) against Chromium 156.0.8078.114: Math.exp differed for 1958, Math.pow 1905, Math.cosh 1909,
 * Math.cbrt 1629, Math.atan2 4960, Math.log 437, Math.sin 690, Math.cos 678, each by at most one unit in the
 * last place (relative 2.3e-16); Math.sqrt and Math.tanh never. In the demo, 440 of its 3014 output numbers
 * differed, in cells derivative, fit-leaky, fit-loglog, residuals, residual-plot, compare, result, forecast and
 * forecast-plot: at most 2.1e-14 relative, except residuals (1.8e-12) and the residual plot (6.2e-12 relative,
 * 4.4e-13 mm absolute), where a difference of two nearly equal drawdowns magnifies the last-bit change. Every
 * text, status and control value was identical.
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import { parseDocument } from "@conebook/document";
import { compareOutputs, createKernel, DEFAULT_RTOL, type RunResult } from "@conebook/kernel";
import { runDocumentText, type DocumentRunReply } from "@conebook/kernel/worker";
import { buildTestPage } from "./bundle.js";
import { launchChromium } from "./chromium.js";
import { exactDifferences } from "./exact-differences.js";
import type { Harness, HarnessRequest, HarnessRun } from "./page-harness.js";
import { startStaticServer, type StaticServer } from "./static-server.js";

const NOTEBOOKS = fileURLToPath(new URL("../../notebooks/", import.meta.url));
const DEMO_FILE = "kestrel-moor-constant-rate.cone.md";
const DEMO_TEXT = readFileSync(join(NOTEBOOKS, DEMO_FILE), "utf8");
/** Paths of the data files the demo pins, relative to its folder. */
const DEMO_FILE_PATHS = parseDocument(DEMO_TEXT).document.cells.flatMap((c) => (c.kind === "data" && c.file ? [c.file.path] : []));

/** A document whose first code cell never ends: the kernel must stop it at its 2000 ms time limit. */
const ENDLESS_LOOP_TEXT = `---
conebook: 1
title: A cell that never ends
seed: 7
limits:
  cellTimeMs: 2000
---

\`\`\`ts code:spin
let turns = 0;
while (true) {
  turns++;
}
\`\`\`

\`\`\`ts code:after
turns
\`\`\`
`;

/**
 * A document whose one cell evaluates Math functions at 4000 seeded inputs inside the sandbox (QuickJS's own
 * libm, no bridge call), so nothing of the host engine's arithmetic enters its output.
 */
const SANDBOX_MATH_TEXT = `---
conebook: 1
title: Arithmetic inside the sandbox
seed: 11
---

\`\`\`ts code:math
const M = Math as unknown as Record<string, (x: number, y?: number) => number>;
const xs: number[] = [];
let state = 12345;
for (let i = 0; i < 4000; i++) {
  state = (state * 1103515245 + 12345) % 2147483648;
  xs.push((state / 2147483648) * 40 - 20);
}
const ys = xs.map((x) => Math.abs(x) * 37.1 + 1e-3);
const results: Record<string, number[]> = {};
for (const f of ["exp", "expm1", "sin", "cos", "tanh", "sinh", "cosh", "atan", "asinh"]) results[f] = xs.map((x) => M[f]!(x));
for (const f of ["log", "log10", "log2", "log1p", "sqrt", "cbrt", "acosh"]) results[f] = ys.map((y) => M[f]!(y + 1));
results.pow = ys.map((y) => Math.pow(y, 1.37));
results.atan2 = xs.map((x, i) => Math.atan2(x, ys[i]!));
results
\`\`\`
`;

let server: StaticServer;
let browser: Browser;
let page: Page;
const consoleErrors: string[] = [];
const requestedUrls: string[] = [];
const timings: Record<string, number> = {};
let nodeDemo: DocumentRunReply;
let browserDemo: HarnessRun;

/** Runs a request in the page's kernel worker and returns what the page saw. */
function runInPage(request: HarnessRequest): Promise<HarnessRun> {
  return page.evaluate((r) => (globalThis as unknown as { conebookHarness: Harness }).conebookHarness.run(r), request);
}

function resultOf(reply: DocumentRunReply): RunResult {
  if (reply.type !== "result") throw new Error(`expected a run result, got ${reply.type}: ${JSON.stringify(reply).slice(0, 500)}`);
  return reply.result;
}

/** Everything of a run result that must not depend on the engine (timings are wall-clock and left out). */
function comparable(result: RunResult) {
  const { timings: _wallClock, ...rest } = result;
  return rest;
}

beforeAll(async () => {
  const t0 = performance.now();
  const { assets, buildMs } = await buildTestPage();
  timings.bundleMs = buildMs;
  for (const path of DEMO_FILE_PATHS) {
    assets.set(`/files/${path}`, { body: new Uint8Array(readFileSync(join(NOTEBOOKS, path))), contentType: "text/csv; charset=utf-8" });
  }
  server = await startStaticServer(assets);

  const t1 = performance.now();
  browser = await launchChromium(inject("chromiumPath"));
  page = await browser.newPage();
  timings.launchMs = performance.now() - t1;
  page.on("console", (m) => {
    if (m.type() === "error") consoleErrors.push(`page console.error: ${m.text()}`);
  });
  page.on("pageerror", (e) => consoleErrors.push(`page error: ${e.message}`));
  page.on("worker", (w) =>
    w.on("console", (m) => {
      if (m.type() === "error") consoleErrors.push(`worker console.error: ${m.text()}`);
    }),
  );
  page.on("request", (r) => requestedUrls.push(r.url()));
  page.on("requestfailed", (r) => consoleErrors.push(`request failed: ${r.url()} (${r.failure()?.errorText ?? "unknown reason"})`));
  await page.goto(`${server.origin}/`);
  await page.waitForFunction(() => "conebookHarness" in globalThis);

  const request = { id: 1, text: DEMO_TEXT, file: `notebooks/${DEMO_FILE}` };
  const t2 = performance.now();
  browserDemo = await runInPage({ ...request, filePaths: DEMO_FILE_PATHS });
  timings.browserDemoMs = performance.now() - t2;

  const files = Object.fromEntries(DEMO_FILE_PATHS.map((p) => [p, new Uint8Array(readFileSync(join(NOTEBOOKS, p)))]));
  const t3 = performance.now();
  nodeDemo = await runDocumentText(createKernel(), { type: "run", ...request, files });
  timings.nodeDemoMs = performance.now() - t3;
  timings.setupMs = performance.now() - t0;
}, 60_000);

afterAll(async () => {
  await browser?.close();
  await server?.close();
  console.info(`kernel-in-worker timings (ms): ${JSON.stringify(Object.fromEntries(Object.entries(timings).map(([k, v]) => [k, Math.round(v)])))}`);
});

describe("the kernel in a Chromium Web Worker", () => {
  it("gives the demo notebook the same texts and statuses as the same run in Node, and numbers within the verify tolerance 1e-9", () => {
    const inNode = resultOf(nodeDemo);
    const inBrowser = resultOf(browserDemo.reply);
    expect(Object.values(inNode.status).every((s) => s === "ok")).toBe(true);
    expect(Object.keys(inNode.outputs).length).toBeGreaterThanOrEqual(15);
    const { outputs: nodeOutputs, ...nodeRest } = comparable(inNode);
    const { outputs: browserOutputs, ...browserRest } = comparable(inBrowser);
    expect(exactDifferences(nodeRest, browserRest)).toEqual([]);
    expect(Object.keys(browserOutputs)).toEqual(Object.keys(nodeOutputs));
    // The comparison `conebook verify` makes: texts exact, numbers |a - b| <= 1e-9 max(|a|, |b|).
    expect(DEFAULT_RTOL).toBe(1e-9);
    expect(compareOutputs(nodeOutputs, browserOutputs)).toEqual([]);
    // What differs at all is numbers only, and by far less than the tolerance (see the note at the top).
    const differences = exactDifferences(nodeOutputs, browserOutputs);
    expect(differences.filter((d) => d.relative === undefined)).toEqual([]);
    expect(Math.max(0, ...differences.map((d) => d.relative!))).toBeLessThan(1e-10);
    expect(browserDemo.reply.type === "result" && browserDemo.reply.warnings).toEqual(nodeDemo.type === "result" && nodeDemo.warnings);
    // One progress report per executable cell, then the result.
    expect(browserDemo.progressCount).toBe(Object.keys(inNode.status).length);
  });

  it("computes bit for bit the same numbers inside the QuickJS sandbox in the worker as in Node", async () => {
    const request = { id: 2, text: SANDBOX_MATH_TEXT, file: "sandbox-math.cone.md" };
    const inNode = resultOf(await runDocumentText(createKernel(), { type: "run", ...request }));
    const inBrowser = resultOf((await runInPage(request)).reply);
    const output = inNode.outputs.math?.[0];
    expect(output?.type).toBe("json");
    const values = (output?.type === "json" ? output.value : {}) as Record<string, number[]>;
    expect(Object.keys(values).length).toBe(18);
    expect(Object.values(values).every((v) => v.length === 4000 && v.every(Number.isFinite))).toBe(true);
    expect(exactDifferences(inNode.outputs, inBrowser.outputs)).toEqual([]);
  });

  it("shows no console errors on the page or in the worker, and fetches nothing but the test server's files", () => {
    expect(consoleErrors).toEqual([]);
    const foreign = requestedUrls.filter((u) => !u.startsWith(`${server.origin}/`) && !u.startsWith("data:"));
    expect(foreign).toEqual([]);
    expect(server.requests.filter((r) => !r.endsWith(" 200"))).toEqual([]);
    expect(server.requests).toContain("GET /emscripten-module.wasm 200");
  });

  it("stops an endless loop cell with the kernel's time-limit error while the page stays responsive, then runs the demo again", async () => {
    const spinning = runInPage({ id: 3, text: ENDLESS_LOOP_TEXT, file: "endless-loop.cone.md" });
    await page.waitForFunction(() => (globalThis as unknown as { conebookHarness: Harness }).conebookHarness.inFlight() > 0);
    await new Promise((resolve) => setTimeout(resolve, 300));
    // The main thread answers while the worker is inside the loop. (Were the loop on the main thread, this round
    // trip would wait for the loop to end, about 1700 ms, and no timer tick would come for 2000 ms; the bounds
    // leave room for a loaded machine.)
    const t0 = performance.now();
    const inFlight = await page.evaluate(() => (globalThis as unknown as { conebookHarness: Harness }).conebookHarness.inFlight());
    timings.evaluateDuringLoopMs = performance.now() - t0;
    expect(inFlight).toBe(1);
    expect(timings.evaluateDuringLoopMs).toBeLessThan(500);

    const run = await spinning;
    const result = resultOf(run.reply);
    timings.endlessLoopRunMs = run.endedAt - run.startedAt;
    expect(result.status).toEqual({ spin: "error", after: "not-run" });
    const error = result.outputs.spin?.[0];
    expect(error?.type).toBe("error");
    expect(error?.type === "error" && error.message).toMatch(/^Cell spin was stopped after running for its time limit of 2000 ms\. /);
    expect(result.outputs.after).toEqual([{ type: "not-run", reason: "an earlier cell (spin) failed" }]);
    expect(timings.endlessLoopRunMs).toBeGreaterThanOrEqual(2000);
    expect(timings.endlessLoopRunMs).toBeLessThan(6000);

    // Main-thread timer ticks (every 20 ms) kept coming during the whole run.
    const gaps = run.ticks.slice(1).map((t, i) => t - run.ticks[i]!);
    timings.longestTickGapMs = Math.max(...gaps);
    expect(run.ticks.length).toBeGreaterThan(timings.endlessLoopRunMs / 20 / 2);
    expect(timings.longestTickGapMs).toBeLessThan(500);

    // After the abort the kernel loads QuickJS afresh in the same worker and reproduces its first demo run bit for bit.
    const again = await runInPage({ id: 4, text: DEMO_TEXT, file: `notebooks/${DEMO_FILE}`, filePaths: DEMO_FILE_PATHS });
    expect(exactDifferences(comparable(resultOf(browserDemo.reply)), comparable(resultOf(again.reply)))).toEqual([]);
    expect(consoleErrors).toEqual([]);
  });
});

describe("the exact comparison used above", () => {
  it("tells apart numbers one unit in the last place apart, 0 and -0, and a missing key", () => {
    const x = 0.1 + 0.2;
    const bits = new Float64Array([x]);
    new BigInt64Array(bits.buffer)[0]! += 1n;
    const nextUp = bits[0]!;
    expect(nextUp - x).toBe(2 ** -54); // one unit in the last place for numbers in [0.25, 0.5)
    expect(exactDifferences({ rows: [[x]] }, { rows: [[nextUp]] })).toEqual([{ path: ".rows[0][0]", expected: x, actual: nextUp, relative: (nextUp - x) / nextUp }]);
    expect(exactDifferences([0], [-0])).toEqual([{ path: "[0]", expected: 0, actual: -0, relative: 0 }]);
    expect(exactDifferences({ a: NaN }, { a: NaN })).toEqual([]);
    expect(exactDifferences({ a: 1, b: 2 }, { a: 1 })).toEqual([{ path: ".b", expected: 2, actual: undefined }]);
  });
});
