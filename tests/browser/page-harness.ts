/**
 * Main-thread script of the browser test page: starts the kernel worker and exposes `conebookHarness` for the
 * test to call through page.evaluate. While a run is in flight it records main-thread timer ticks, so a test
 * can tell whether the page stayed responsive. Worker failures are logged with console.error, which the test
 * collects. The DOM types are declared here because the project compiles without the DOM library.
 */
import type { DocumentRunReply, DocumentRunRequest } from "@conebook/kernel/worker";

interface PageWorker {
  postMessage(message: DocumentRunRequest): void;
  addEventListener(type: "message", listener: (event: { data: DocumentRunReply }) => void): void;
  addEventListener(type: "error", listener: (event: { message: string }) => void): void;
}

/** What a run in the page returns: the final reply, the progress reports, and main-thread ticks (ms). */
export interface HarnessRun {
  reply: DocumentRunReply;
  progressCount: number;
  /** performance.now() at every main-thread timer tick while the run was in flight. */
  ticks: number[];
  startedAt: number;
  endedAt: number;
}

/** A run request as the test sends it: the data files by path, fetched by the page from `/files/`. */
export interface HarnessRequest {
  id: number;
  text: string;
  file?: string;
  overrides?: Record<string, number>;
  filePaths?: string[];
}

/** The object the page puts on globalThis.conebookHarness. */
export interface Harness {
  run(request: HarnessRequest): Promise<HarnessRun>;
  /** Number of runs sent to the worker and not yet answered. */
  inFlight(): number;
}

interface PageScope {
  Worker: new (url: string, options: { type: "module" }) => PageWorker;
  setInterval(handler: () => void, ms: number): number;
  clearInterval(handle: number): void;
  conebookHarness?: Harness;
}

/** Interval of the responsiveness timer, ms. */
const TICK_MS = 20;

const scope = globalThis as unknown as PageScope;
const worker = new scope.Worker("./worker.js", { type: "module" });
const waiting = new Map<number, { resolve: (r: HarnessRun) => void; progress: number; ticks: number[]; timer: number; startedAt: number }>();

worker.addEventListener("error", (event) => console.error(`kernel worker error: ${event.message}`));
worker.addEventListener("message", ({ data }) => {
  const entry = waiting.get(data.id);
  if (!entry) {
    console.error(`kernel worker replied to unknown request ${data.id}: ${JSON.stringify(data).slice(0, 200)}`);
    return;
  }
  if (data.type === "progress") {
    entry.progress++;
    return;
  }
  scope.clearInterval(entry.timer);
  waiting.delete(data.id);
  entry.resolve({ reply: data, progressCount: entry.progress, ticks: entry.ticks, startedAt: entry.startedAt, endedAt: performance.now() });
});

async function fetchFiles(paths: string[]): Promise<Record<string, Uint8Array>> {
  const files: Record<string, Uint8Array> = {};
  for (const path of paths) {
    const response = await fetch(`./files/${path}`);
    if (!response.ok) throw new Error(`the test server has no ${path} (HTTP ${response.status})`);
    files[path] = new Uint8Array(await response.arrayBuffer());
  }
  return files;
}

scope.conebookHarness = {
  async run({ filePaths = [], ...rest }) {
    const files = await fetchFiles(filePaths);
    return new Promise<HarnessRun>((resolve) => {
      const ticks: number[] = [];
      const timer = scope.setInterval(() => ticks.push(performance.now()), TICK_MS);
      waiting.set(rest.id, { resolve, progress: 0, ticks, timer, startedAt: performance.now() });
      worker.postMessage({ type: "run", ...rest, files });
    });
  },
  inFlight: () => waiting.size,
};
