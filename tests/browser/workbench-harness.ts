/**
 * The workbench under test: a copy of notebooks/ (plus any extra files) in a temporary folder, served by the
 * real `conebook serve` server (startServeServer with the built page), and headless Chromium driving it.
 * Every page opened through `newPage` records console errors, page errors, dialogs and every request, so
 * tests can assert that nothing unexpected ran or was fetched. Screenshots go to tests/browser/screenshots/.
 */
import { cp, mkdir, mkdtemp, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import type { Browser, Page } from "playwright-core";
import { writeFileAtomic } from "../../packages/cli/src/atomic-write.js";
import { loadPageAssets } from "../../packages/cli/src/serve/assets.js";
import { startServeServer, type RunningServer } from "../../packages/cli/src/serve/server.js";
import { launchChromium } from "./chromium.js";
import { VIEWER_DIST } from "./viewer-build.js";

const NOTEBOOKS = fileURLToPath(new URL("../../notebooks/", import.meta.url));
/** Where screenshots of the page's states are written (gitignored). */
export const SCREENSHOTS = fileURLToPath(new URL("./screenshots/", import.meta.url));
/** The demo document, relative to the served folder. */
export const DEMO = "kestrel-moor-constant-rate.cone.md";

/** What a page did besides what the test asked. */
export interface PageLog {
  consoleErrors: string[];
  pageErrors: string[];
  dialogs: string[];
  requests: string[];
}

/** A running workbench. */
export interface Workbench {
  folder: string;
  server: RunningServer;
  browser: Browser;
  /** `METHOD path status` for every request the server saw, token replaced by TOKEN. */
  serverLog: string[];
  /** While set, the server's writes fail with this error code (as a full disk: "ENOSPC") and write nothing. */
  failWrites?: string;
  newPage(): Promise<{ page: Page; log: PageLog }>;
  close(): Promise<void>;
}

/** Starts a workbench on a copy of notebooks/ with `extra` files (relative path to text) added. */
export async function startWorkbench(chromiumPath: string, extra: Record<string, string> = {}): Promise<Workbench> {
  const folder = await mkdtemp(join(tmpdir(), "conebook-workbench-"));
  await cp(NOTEBOOKS, folder, { recursive: true });
  for (const [path, text] of Object.entries(extra)) {
    await mkdir(join(folder, path, ".."), { recursive: true });
    await writeFile(join(folder, path), text);
  }
  const serverLog: string[] = [];
  let token = "";
  const state: { failWrites?: string } = {};
  const server = await startServeServer({
    folder,
    port: 0,
    assets: await loadPageAssets(VIEWER_DIST),
    writeFile: (path, text) => {
      const code = state.failWrites;
      if (code === undefined) return writeFileAtomic(path, text);
      return Promise.reject(Object.assign(new Error(`${code}: the disk refused the write (simulated), open '${path}'`), { code }));
    },
    onRequest: (line) => serverLog.push(token ? line.split(token).join("TOKEN") : line),
  });
  token = server.token;
  const browser = await launchChromium(chromiumPath);
  await mkdir(SCREENSHOTS, { recursive: true });
  return {
    folder,
    server,
    browser,
    serverLog,
    get failWrites() {
      return state.failWrites;
    },
    set failWrites(code: string | undefined) {
      state.failWrites = code;
    },
    async newPage() {
      const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
      const page = await context.newPage();
      const log: PageLog = { consoleErrors: [], pageErrors: [], dialogs: [], requests: [] };
      page.on("console", (m) => m.type() === "error" && log.consoleErrors.push(m.text()));
      page.on("pageerror", (e) => log.pageErrors.push(e.message));
      page.on("dialog", (d) => {
        // Leaving a page with unsaved edits asks first (the recovery copy keeps them); tests leave on purpose.
        if (d.type() === "beforeunload") return void d.accept();
        log.dialogs.push(`${d.type()}: ${d.message()}`);
        void d.dismiss();
      });
      context.on("request", (r) => log.requests.push(r.url()));
      return { page, log };
    },
    async close() {
      await browser.close();
      await server.close();
      await rm(folder, { recursive: true, force: true });
    },
  };
}

/**
 * Waits until the page's state mark (document.body.dataset.conebook) is `state`. A function, not a string: the
 * page's Content-Security-Policy forbids evaluating strings.
 */
export function waitForState(page: Page, state: string, timeout = 60_000): Promise<unknown> {
  return page.waitForFunction((s) => (globalThis as unknown as { document: { body: { dataset: Record<string, string> } } }).document.body.dataset.conebook === s, state, { timeout });
}

/** Opens `path` in the page and waits until the document is shown and its pinned data are read. */
export async function openDocument(wb: Workbench, page: Page, path: string): Promise<void> {
  await page.goto(`${wb.server.origin}/${wb.server.token}/?open=${encodeURIComponent(path)}`);
  await waitForState(page, "conebook-interactive", 20_000);
}

/** Clicks `Run all` (or runs `trigger`) and waits for the run to end. */
export async function runAndWait(page: Page, trigger?: () => Promise<void>): Promise<void> {
  await page.evaluate("document.body.dataset.conebook = 'waiting'");
  if (trigger) await trigger();
  else await page.locator("cb-workbench header.top").getByRole("button", { name: "Run all" }).click();
  await waitForState(page, "conebook-ran");
}

/** The outputs of the page's latest run, by cell id (read from the workbench element). */
export function lastRunOutputs(page: Page): Promise<Record<string, unknown[]>> {
  return page.evaluate("document.querySelector('cb-workbench').runs.at(-1).outputs") as Promise<Record<string, unknown[]>>;
}

/** The text of the page's status line. */
export function statusLine(page: Page): Promise<string> {
  return page.locator("cb-workbench .status-line").innerText();
}

/** The editor text of cell `id` (editors are built when they come near the screen, so the cell is scrolled to). */
export async function editorText(page: Page, id: string): Promise<string> {
  await page.locator(`cb-cell[data-id="${id}"]`).scrollIntoViewIfNeeded();
  return page.locator(`cb-cell[data-id="${id}"] cb-editor .cm-content`).innerText();
}

/** Types `text` at the end of the editor of cell `id`. */
export async function typeAtEnd(page: Page, id: string, text: string): Promise<void> {
  await page.locator(`cb-cell[data-id="${id}"]`).scrollIntoViewIfNeeded();
  const content = page.locator(`cb-cell[data-id="${id}"] cb-editor .cm-content`);
  await content.click();
  await page.keyboard.press("Control+End");
  await page.keyboard.type(text);
}
