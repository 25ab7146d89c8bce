/**
 * The workbench page in headless Chromium (the npm-provided build, see tests/browser/chromium.ts), served by the
 * real `conebook serve` server on a copy of notebooks/:
 *
 *   - page load to interactive: navigation start to the page's `conebook-interactive` mark (document shown,
 *     pinned data read), beside a blank page from a loopback server in the same run;
 *   - long tasks on the main thread (PerformanceObserver "longtask") while keys are typed into a code cell
 *     during a run of the demo, up to the run's result, and separately while its results are drawn;
 *   - an edit of the demo's fit cell to its redrawn chart: a keystroke, then the chart cell's "to here" button,
 *     until that chart reports it was drawn;
 *   - a chart of 100,000 points: time to draw (thinned for display only) and the longest main-thread task;
 *   - the production bundle: gzip size of every file of the built page except the QuickJS wasm.
 * Each figure is checked (the chart drew marks, the run ran every cell) so the work cannot be skipped.
 */
import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { gzipSync } from "node:zlib";
import type { Page } from "playwright-core";
import { chromiumExecutable } from "../../browser/chromium.js";
import { startStaticServer } from "../../browser/static-server.js";
import { ensureViewerBuilt, VIEWER_DIST } from "../../browser/viewer-build.js";
import { DEMO, openDocument, runAndWait, startWorkbench, typeAtEnd, waitForState } from "../../browser/workbench-harness.js";
import type { Measurement } from "../harness.js";

const BIG_CHART = `---
conebook: 1
title: A chart of 100000 points (benchmark document)
seed: 3
---

\`\`\`ts code:make
const big = Array.from({ length: 100000 }, (_, i) => ({ t_min: 0.5 + i * 0.03, s_m: 2 * Math.log1p(i / 500) + 0.05 * Math.sin(i / 7) }));
big.length
\`\`\`

\`\`\`yaml chart:big-chart
title: 100000 readings
width: 640
height: 320
data: {name: big}
mark: {type: line}
encoding:
  x: {field: t_min, type: quantitative, scale: {type: log}}
  y: {field: s_m, type: quantitative}
\`\`\`
`;

/** Installs a long-task recorder in the page (before its scripts run). */
async function recordLongTasks(page: Page): Promise<void> {
  await page.addInitScript(() => {
    const g = globalThis as unknown as { longTasks: { start: number; duration: number }[]; PerformanceObserver: new (cb: (list: { getEntries(): { startTime: number; duration: number }[] }) => void) => { observe(o: unknown): void } };
    g.longTasks = [];
    new g.PerformanceObserver((list) => {
      for (const e of list.getEntries()) g.longTasks.push({ start: e.startTime, duration: e.duration });
    }).observe({ type: "longtask", buffered: true });
  });
}

const now = (page: Page) => page.evaluate("performance.now()") as Promise<number>;
const longest = async (page: Page, from: number, to = Infinity) =>
  ((await page.evaluate("longTasks")) as { start: number; duration: number }[]).filter((t) => t.start + t.duration >= from && t.start <= to).reduce((m, t) => Math.max(m, t.duration), 0);

function bundleGzipBytes(): { total: number; page: number; worker: number } {
  let total = 0;
  let page = 0;
  let worker = 0;
  const walk = (folder: string) => {
    for (const e of readdirSync(folder, { withFileTypes: true })) {
      const path = join(folder, e.name);
      if (e.isDirectory()) walk(path);
      else if (!e.name.endsWith(".wasm")) {
        const n = gzipSync(readFileSync(path), { level: 9 }).length;
        total += n;
        if (e.name.startsWith("index-")) page += n;
        if (e.name.startsWith("kernel-worker-")) worker += n;
      }
    }
  };
  walk(VIEWER_DIST);
  return { total, page, worker };
}

export async function workbenchBenchmarks(): Promise<Measurement[]> {
  const built = await ensureViewerBuilt();
  const wb = await startWorkbench(await chromiumExecutable(), { "big-chart.cone.md": BIG_CHART });
  const blank = await startStaticServer(new Map([["/", { body: new TextEncoder().encode('<!doctype html><link rel="icon" href="data:,"><p>blank'), contentType: "text/html" }]]));
  try {
    // Page load to interactive, best of 3 fresh tabs; the peer is a blank page from a loopback server.
    let load = Infinity;
    let blankLoad = Infinity;
    for (let i = 0; i < 3; i++) {
      const { page } = await wb.newPage();
      await openDocument(wb, page, DEMO);
      load = Math.min(load, (await page.evaluate("performance.getEntriesByName('conebook-interactive')[0].startTime")) as number);
      if ((await page.locator("cb-cell").count()) < 30) throw new Error("the demo did not show its cells");
      await page.goto(`${blank.origin}/`);
      blankLoad = Math.min(blankLoad, (await page.evaluate("performance.getEntriesByType('navigation')[0].loadEventEnd")) as number);
      await page.context().close();
    }

    // Typing during a run; long tasks up to the result, and while the results are drawn.
    const { page } = await wb.newPage();
    await recordLongTasks(page);
    await openDocument(wb, page, DEMO);
    await runAndWait(page);
    // Bring the cell to type in on screen first, so that charts drawn because they scrolled into view are not
    // counted as the cost of typing.
    await typeAtEnd(page, "result", " ");
    await page.waitForTimeout(1500);
    await page.evaluate("document.body.dataset.conebook = 'waiting'");
    const t0 = await now(page);
    await page.locator("cb-workbench header.top").getByRole("button", { name: "Run all" }).click();
    await typeAtEnd(page, "result", "\n// typed while the demo runs in the worker");
    const typedAt = await now(page);
    await waitForState(page, "conebook-ran");
    const resultAt = ((await page.evaluate("performance.getEntriesByName('conebook-result-received').at(-1).startTime")) as number);
    await page.waitForTimeout(1500);
    const tasks = (await page.evaluate("longTasks")) as { start: number; duration: number }[];
    const duringRun = tasks.filter((t) => t.start >= t0 && t.start < resultAt - 1).reduce((m, t) => Math.max(m, t.duration), 0);
    const afterResult = await longest(page, resultAt - 1, resultAt + 1500);
    const typed = (await page.evaluate("document.querySelector('cb-workbench').store.doc.cells.find((c) => c.id === 'result').source")) as string;
    if (!typed.endsWith(" \n// typed while the demo runs in the worker")) throw new Error("the keystrokes during the run were lost");

    // Edit of the fit cell to its redrawn chart (run to the chart cell).
    await openDocument(wb, page, DEMO);
    let editToChart = Infinity;
    for (let i = 0; i < 3; i++) {
      await typeAtEnd(page, "fit-curves", " ");
      await page.evaluate(`new Promise((resolve) => {
        const chart = document.querySelector('cb-workbench').shadowRoot.querySelector('cb-cell[data-id="fit-loglog"]');
        chart.addEventListener('cb-chart-drawn', () => { window.__drawnAt = performance.now(); resolve(); }, { once: true });
        window.__editAt = performance.now();
        chart.shadowRoot.querySelector('button[aria-label="Run up to cell fit-loglog"]').click();
      })`);
      editToChart = Math.min(editToChart, (await page.evaluate("window.__drawnAt - window.__editAt")) as number);
    }
    const status = (await page.locator("cb-workbench .status-line").innerText()) as string;
    if (!/^Ran 1[0-9] cells/.test(status)) throw new Error(`the run to the chart did not run: ${status}`);

    // 100,000 points.
    const big = await wb.newPage();
    await recordLongTasks(big.page);
    await openDocument(wb, big.page, "big-chart.cone.md");
    const b0 = await now(big.page);
    await runAndWait(big.page);
    const ranAt = (await big.page.evaluate("performance.getEntriesByName('conebook-ran').at(-1).startTime")) as number;
    await big.page.locator("cb-cell[data-id='big-chart'] cb-chart svg g[class*='mark-'] path").first().waitFor({ timeout: 30_000 });
    const drawnAt = await now(big.page);
    const note = await big.page.locator("cb-cell[data-id='big-chart'] cb-chart .note").innerText();
    const bigLongest = await longest(big.page, b0, drawnAt);
    void typedAt;

    const size = bundleGzipBytes();
    return [
      { name: "page load to interactive (demo, localhost)", value: load, unit: "ms", peer: blankLoad, peerName: "blank page, loopback", target: { absolute: 1000 }, note: `best of 3 fresh tabs; navigation start to the document shown with its pinned data read${built ? `; the page was rebuilt first (${Math.round(built)} ms)` : ""}` },
      { name: "longest main-thread task while typing during a demo run", value: duringRun, unit: "ms", target: { absolute: 50 }, note: "tasks that started between the click on Run all and the arrival of the run's result (the worker computes meanwhile); 0 means no task of 50 ms or more (the long-task threshold)" },
      { name: "longest main-thread task while the demo's results are drawn", value: afterResult, unit: "ms", target: { absolute: 50 }, note: "from the arrival of the result for 1.5 s: the outputs of 21 cells replaced, charts near the screen redrawn where they changed" },
      { name: "edit of the fit cell to its redrawn chart", value: editToChart, unit: "ms", target: { absolute: 150 }, note: "best of 3: run to the chart cell fit-loglog (every run starts a fresh sandbox at the top: 14 cells, two fits) until the chart is drawn" },
      { name: "chart of 100,000 points: run to drawn", value: drawnAt - b0, unit: "ms", note: `${note}; run result after ${Math.round(ranAt - b0)} ms` },
      { name: "chart of 100,000 points: longest main-thread task", value: bigLongest, unit: "ms", target: { absolute: 50 } },
      { name: "production bundle, gzip, without the QuickJS wasm", value: size.total / 1024, unit: "KiB", target: { absolute: 1200 }, note: `page script ${Math.round(size.page / 1024)} KiB, kernel worker ${Math.round(size.worker / 1024)} KiB (gzip -9)` },
    ];
  } finally {
    await blank.close();
    await wb.close();
  }
}
