/**
 * What the workbench must never do, checked in Chromium, and what it must always do: a hostile document
 * (script tags, event-handler attributes, javascript: and data: links in narrative; charts with a URL data
 * source, an href channel, usermeta, expressions reaching for globals, an image mark with a remote URL; text
 * outputs, table titles and CSV values carrying markup) executes nothing and makes no request; the server
 * refuses a missing token, traversal and a foreign origin as the browser sends them; every notebook gives in
 * the page the outputs `conebook verify` checks, and survives open, edit one cell, save byte for byte.
 */
import { readFileSync } from "node:fs";
import { readFile } from "node:fs/promises";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import { parseDocument, type CellOutput } from "@conebook/document";
import { compareOutputs, createKernel, recordedOutputs } from "@conebook/kernel";
import { runDocumentText } from "@conebook/kernel/worker";
import { recordedControlValues, runOverrides } from "../../packages/cli/src/settings.js";
import { recordedRunSettings } from "../../packages/viewer/src/model/run-overrides.js";
import { startStaticServer, type StaticServer } from "./static-server.js";
import { SCREENSHOTS, lastRunOutputs, openDocument, runAndWait, startWorkbench, statusLine, typeAtEnd, type PageLog, type Workbench } from "./workbench-harness.js";

/** An address nothing listens on (loopback, so even a leak would stay on this machine). */
const TRAP = "http://127.0.0.2:9";

const HOSTILE = `---
conebook: 1
title: <img src=x onerror=alert('title')> hostile document
seed: 1
---

[narrative:prose]: #

# Hostile <script>alert("heading")</script>

<img src="${TRAP}/pixel.png" onerror="alert('img')">

<div onmouseover="alert('div')">hover me</div>

[a javascript link](javascript:alert('js')), [a data link](data:text/html,<script>alert('data')</script>),
[a vbscript link](vbscript:msgbox('vb')) and ![a remote image](${TRAP}/remote.png).

\`\`\`csv data:hostile
name,value
<script>alert('csv')</script>,1
<img src=x onerror=alert('csv-img')>,2
\`\`\`

\`\`\`ts code:texts
show("<script>alert('text')</script><img src=x onerror=alert('text-img')>");
show(show.table([{ label: "<b onclick=alert('cell')>bold</b>", v: 1 }], { title: "<svg onload=alert('caption')>" }));
hostile.rows
\`\`\`

\`\`\`ts code:charts
const x = { field: "a", type: "quantitative" };
show(show.chart({ data: { url: "${TRAP}/data.csv" }, mark: "point", encoding: { x } }));
show(show.chart({ data: { values: [{ a: 1, u: "javascript:alert('href')" }, { a: 2, u: "${TRAP}/go" }] }, mark: { type: "point", size: 400, filled: true }, encoding: { x, href: { field: "u" } } }));
show(show.chart({ usermeta: { embedOptions: { actions: true, renderer: "canvas" } }, data: { values: [{ a: 1 }] }, mark: "point", encoding: { x } }));
show(show.chart({ data: { values: [{ a: 1 }] }, transform: [{ calculate: "window.alert('expr')", as: "b" }], mark: "point", encoding: { x } }));
show(show.chart({ data: { values: [{ a: 1 }] }, transform: [{ calculate: "constructor.constructor('alert(1)')()", as: "b" }], mark: "point", encoding: { x } }));
show(show.chart({ data: { values: [{ a: 1, img: "${TRAP}/mark.png" }] }, mark: "image", encoding: { x, url: { field: "img" } } }));
show(show.chart({ data: { values: [{ a: 1, t: "<img src=x onerror=alert('label')>" }] }, mark: "text", encoding: { x, text: { field: "t" } } }));
\`\`\`

\`\`\`yaml chart:table-chart
data: {name: hostile}
mark: text
encoding:
  y: {field: name, type: nominal}
  text: {field: name}
  href: {value: "javascript:alert('chart-cell')"}
\`\`\`
`;

/** A chart cell a document may not have: a URL data source and usermeta; it opens with the error in the cell. */
const HOSTILE_SPEC = `---
conebook: 1
title: A chart cell that reaches out (test document)
seed: 1
---

\`\`\`yaml chart:reach
data: {url: "${TRAP}/data.csv"}
mark: point
usermeta: {embedOptions: {actions: true}}
\`\`\`
`;

let wb: Workbench;
let page: Page;
let log: PageLog;
let foreign: StaticServer;

beforeAll(async () => {
  wb = await startWorkbench(inject("chromiumPath"), { "hostile.cone.md": HOSTILE, "hostile-spec.cone.md": HOSTILE_SPEC });
  ({ page, log } = await wb.newPage());
  const attackPage = `<!doctype html><html><head><link rel="icon" href="data:,"></head><body><script>
    globalThis.attack = async (url) => {
      const out = [];
      const tries = [
        ["GET", { mode: "no-cors" }],
        ["POST", { mode: "no-cors", body: JSON.stringify({ text: "owned" }), headers: { "content-type": "text/plain" } }],
        ["PUT", { mode: "cors", body: JSON.stringify({ text: "owned", baseSha256: "x" }), headers: { "content-type": "application/json" } }],
      ];
      for (const [method, init] of tries) {
        try { await fetch(url, { method, ...init }); out.push(method + " answered"); } catch (e) { out.push(method + " failed"); }
      }
      return out;
    };
  </script></body></html>`;
  foreign = await startStaticServer(new Map([["/", { body: new TextEncoder().encode(attackPage), contentType: "text/html; charset=utf-8" }]]));
}, 60_000);

afterAll(async () => {
  await foreign?.close();
  await wb?.close();
});

/** Every element in the page's light and shadow trees that could run or load something. */
const ACTIVE_CONTENT = `(() => {
  const found = [];
  const visit = (root) => {
    for (const el of root.querySelectorAll("*")) {
      const tag = el.tagName.toLowerCase();
      if (tag === "script" && !(el.getAttribute("src") || "").includes("/assets/")) found.push("<script> " + el.textContent.slice(0, 40));
      if (["iframe", "object", "embed", "foreignobject"].includes(tag)) found.push("<" + tag + ">");
      for (const a of el.attributes) {
        const v = a.value.trim().toLowerCase();
        if (a.name.toLowerCase().startsWith("on")) found.push(tag + " " + a.name + "=" + a.value.slice(0, 40));
        if (["href", "src", "xlink:href", "action", "formaction"].includes(a.name.toLowerCase()) && /^(javascript|data:text|vbscript|http)/.test(v)) found.push(tag + " " + a.name + "=" + a.value.slice(0, 60));
      }
      if (el.shadowRoot) visit(el.shadowRoot);
    }
  };
  visit(document);
  return found;
})()`;

const ownOrigin = () => `${wb.server.origin}/${wb.server.token}/`;

describe("a hostile document", () => {
  it("executes nothing, shows the markup as text, and makes no request beyond the page's own server", async () => {
    await openDocument(wb, page, "hostile.cone.md");
    await runAndWait(page);
    const hostile = page.locator('cb-cell[data-id="prose"] .prose');
    expect(await hostile.locator("h1").innerText()).toBe('Hostile <script>alert("heading")</script>');
    expect(await hostile.innerText()).toContain(`<img src="${TRAP}/pixel.png" onerror="alert('img')">`);
    expect(await hostile.locator("a").evaluateAll((as) => as.map((a) => (a as unknown as { getAttribute(n: string): string | null }).getAttribute("href")))).toEqual([]);
    expect(await page.locator('cb-cell[data-id="texts"] cb-outputs pre.text').innerText()).toBe("<script>alert('text')</script><img src=x onerror=alert('text-img')>");
    expect(await page.locator('cb-cell[data-id="texts"] caption').innerText()).toBe("<svg onload=alert('caption')>");
    expect(await page.locator('cb-cell[data-id="texts"] td').first().innerText()).toBe("<b onclick=alert('cell')>bold</b>");
    expect(await page.locator('cb-cell[data-id="hostile"] .data td').allInnerTexts()).toEqual(["<script>alert('csv')</script>", "1", "<img src=x onerror=alert('csv-img')>", "2"]);
    expect(await hostile.locator(".image-not-loaded").innerText()).toBe(`[image not loaded: a remote image (${TRAP}/remote.png)]`);
    // Every chart either drew without reaching out or says why it could not be drawn.
    const charts = page.locator('cb-cell[data-id="charts"] cb-chart');
    expect(await charts.count()).toBe(7);
    for (const chart of await charts.all()) await chart.scrollIntoViewIfNeeded();
    await page.locator('cb-cell[data-id="table-chart"]').scrollIntoViewIfNeeded();
    await expect.poll(() => page.locator('cb-cell[data-id="charts"] cb-chart svg').count(), { timeout: 15_000 }).toBeGreaterThanOrEqual(4);
    // Click every mark that carries a link, and hover over everything: nothing may navigate, open or alert.
    const navigations: string[] = [];
    page.on("framenavigated", (f) => navigations.push(f.url()));
    const linked = [page.locator('cb-cell[data-id="charts"] cb-chart').nth(1), page.locator('cb-cell[data-id="table-chart"] cb-chart')];
    for (const chart of linked) {
      for (const mark of (await chart.locator("svg g[class*='mark-'] path, svg g[class*='mark-'] text").all()).slice(0, 4)) await mark.click({ force: true, timeout: 1000 }).catch(() => undefined);
    }
    await page.locator('cb-cell[data-id="prose"] .prose').hover();
    await page.waitForTimeout(300);
    expect(navigations).toEqual([]);
    expect(await page.locator('cb-cell[data-id="texts"] cb-outputs pre.text').count()).toBe(1);
    expect(page.url().startsWith(ownOrigin())).toBe(true);
    expect(page.context().pages().length).toBe(1);
    await page.screenshot({ path: join(SCREENSHOTS, "11-hostile-document.png"), fullPage: false });
    expect(await page.evaluate(ACTIVE_CONTENT)).toEqual([]);
    expect(log.dialogs).toEqual([]);
    expect(log.pageErrors).toEqual([]);
    expect(log.consoleErrors).toEqual([]);
    expect(log.requests.filter((u) => !u.startsWith(ownOrigin()))).toEqual([]);
    expect(wb.serverLog.filter((l) => !/ (200|308)$/.test(l))).toEqual([]);
  });

  it("opens a chart cell with a URL data source and usermeta with the schema errors in the cell, drawing and requesting nothing", async () => {
    const before = log.requests.length;
    await openDocument(wb, page, "hostile-spec.cone.md");
    const problems = page.locator('cb-cell[data-id="reach"] .problems');
    await expect.poll(() => problems.innerText().catch(() => "")).toMatch(/must not have "usermeta"[\s\S]*data\.url has unknown property "url"/);
    expect(log.requests.slice(before).filter((u) => !u.startsWith(ownOrigin()))).toEqual([]);
    expect(log.dialogs).toEqual([]);
    expect(log.consoleErrors).toEqual([]);
  });
});

describe("the server, as a browser reaches it", () => {
  it("refuses a request without the token, a traversal, and requests from a foreign origin", async () => {
    const other = await wb.newPage();
    const noToken = await other.page.goto(`${wb.server.origin}/`);
    expect(noToken?.status()).toBe(403);
    expect(await other.page.locator("body").innerText()).toMatch(/lacks this server's token/);
    // One character changed (never the same character, so never the token itself).
    const otherFirst = wb.server.token.startsWith("x") ? "y" : "x";
    const wrongToken = await other.page.goto(`${wb.server.origin}/${otherFirst}${wb.server.token.slice(1)}/`);
    expect(wrongToken?.status()).toBe(403);
    for (const path of ["..%2F..%2F..%2Fetc%2Fpasswd", "%2e%2e/%2e%2e/etc/passwd", "data/..%2f..%2fhostile.cone.md"]) {
      const r = await other.page.goto(`${ownOrigin()}api/document?path=${path}`);
      expect(r?.status(), path).toBe(403);
    }
    const r = await other.page.goto(`${ownOrigin()}api/data?document=${encodeURIComponent("kestrel-moor-constant-rate.cone.md")}&path=..%2F..%2F..%2Fetc%2Fhostname`);
    expect(r?.status()).toBe(403);

    const before = wb.serverLog.length;
    await other.page.goto(`${foreign.origin}/`);
    // The answers are refused a second time in the browser (no CORS headers, Cross-Origin-Resource-Policy
    // same-origin), so each fetch fails there; what matters is that the server refused each request first.
    const sent = await other.page.evaluate(`attack(${JSON.stringify(`${ownOrigin()}api/document?path=kestrel-moor-constant-rate.cone.md`)})`);
    expect(sent).toEqual(["GET failed", "POST failed", "PUT failed"]);
    await expect.poll(() => wb.serverLog.length - before).toBe(3);
    expect(wb.serverLog.slice(before)).toEqual([
      "GET /TOKEN/api/document?path=kestrel-moor-constant-rate.cone.md 403",
      "POST /TOKEN/api/document?path=kestrel-moor-constant-rate.cone.md 403",
      // A cross-origin PUT needs the browser's preflight first, which the server refuses: the PUT is never sent.
      "OPTIONS /TOKEN/api/document?path=kestrel-moor-constant-rate.cone.md 403",
    ]);
    expect(await readFile(join(wb.folder, "kestrel-moor-constant-rate.cone.md"), "utf8")).not.toContain("owned");
    await other.page.context().close();
  });
});

const NOTEBOOKS = fileURLToPath(new URL("../../notebooks/", import.meta.url));
const EVERY_NOTEBOOK = [
  "greywether-levels-slug-tests.cone.md",
  "kestrel-moor-constant-rate.cone.md",
  "ketterby-heath-partial-penetration.cone.md",
  "pennock-mill-step-test.cone.md",
  "scarrow-flats-water-table.cone.md",
  "templates/barrier-boundary-test.cone.md",
  "templates/constant-rate-test.cone.md",
  "templates/leaky-aquifer-test.cone.md",
  "templates/multi-well-test.cone.md",
  "templates/pumped-well-storage-skin.cone.md",
  "templates/raw-logger-import.cone.md",
  "templates/recovery-test.cone.md",
  "templates/slug-test.cone.md",
  "templates/step-drawdown-test.cone.md",
  "templates/unconfined-aquifer-test.cone.md",
  "tollin-brook-dupuit-thiem.cone.md",
];

describe("every notebook in the page", () => {
  it("lists every notebook of the repository in this test", async () => {
    const session = JSON.parse(await (await page.request.get(`${ownOrigin()}api/session`)).text()) as { documents: string[] };
    expect(session.documents.filter((d) => !d.startsWith("hostile"))).toEqual(EVERY_NOTEBOOK);
  });

  for (const path of EVERY_NOTEBOOK) {
    it(`${path}: the page's run gives the outputs conebook verify checks, and the same as the CLI's run in Node`, async () => {
      const text = readFileSync(join(NOTEBOOKS, path), "utf8");
      const doc = parseDocument(text).document;
      const cli = { overrides: runOverrides(doc.header.parameters, {}), recordedControls: recordedControlValues(doc) };
      expect(recordedRunSettings(doc)).toEqual(cli);
      await openDocument(wb, page, path);
      await runAndWait(page);
      expect(await statusLine(page)).toMatch(/^Ran \d+ cells in /);
      const inPage = (await lastRunOutputs(page)) as Record<string, CellOutput[]>;
      const folder = join(NOTEBOOKS, path, "..");
      const files = Object.fromEntries(doc.cells.flatMap((c) => (c.kind === "data" && c.file ? [[c.file.path, new Uint8Array(readFileSync(join(folder, c.file.path)))]] : [])));
      const inNode = await runDocumentText(createKernel(), { type: "run", id: 1, text, file: path, ...cli, files });
      if (inNode.type !== "result") throw new Error(`the Node run failed: ${JSON.stringify(inNode)}`);
      expect(Object.keys(inPage)).toEqual(Object.keys(inNode.result.outputs));
      expect(compareOutputs(inNode.result.outputs, inPage)).toEqual([]);
      expect(compareOutputs(recordedOutputs(doc), inPage)).toEqual([]);
    });

    it(`${path}: open, edit one cell, save leaves every other byte as it was`, async () => {
      const before = await readFile(join(wb.folder, path), "utf8");
      await openDocument(wb, page, path);
      const id = (await page.evaluate("document.querySelector('cb-workbench').store.doc.cells.find((c) => c.kind === 'code').id")) as string;
      const oldSource = (await page.evaluate(`document.querySelector('cb-workbench').store.doc.cells.find((c) => c.id === ${JSON.stringify(id)}).source`)) as string;
      await typeAtEnd(page, id, "\n// looked at in the page");
      const newSource = (await page.evaluate(`document.querySelector('cb-workbench').store.doc.cells.find((c) => c.id === ${JSON.stringify(id)}).source`)) as string;
      expect(newSource).toBe(`${oldSource}\n// looked at in the page`);
      await page.keyboard.press("Control+s");
      await expect.poll(() => statusLine(page)).toMatch(/^Saved /);
      const fence = before.indexOf(`code:${id}`);
      const at = before.indexOf(oldSource, fence);
      expect(await readFile(join(wb.folder, path), "utf8")).toBe(before.slice(0, at) + newSource + before.slice(at + oldSource.length));
    });
  }
});
