/**
 * The page's side of the kernel worker: one run at a time, progress and result as callbacks, and a stop that
 * terminates the worker (the only way to end a cell stuck in a long native call) and starts a fresh one for the
 * next run. A watchdog does the same when the worker reports nothing for a cell's time limit plus a grace period.
 */
import type { DocumentRunReply, DocumentRunRequest } from "@conebook/kernel/worker";
import type { RunProgress } from "@conebook/kernel";

/** How a run ended, as the page sees it. */
export type RunEnd = Extract<DocumentRunReply, { type: "result" | "failed" }> | { type: "stopped"; id: number; reason: string };

/** Extra time the watchdog allows beyond a cell's time limit, ms. */
export const WATCHDOG_GRACE_MS = 3000;

interface Pending {
  id: number;
  onProgress: (p: RunProgress) => void;
  resolve: (end: RunEnd) => void;
  cellLimitMs: number;
  timer: ReturnType<typeof setTimeout> | undefined;
}

export class KernelClient {
  #worker: Worker | undefined;
  #pending: Pending | undefined;
  #nextId = 1;
  readonly #makeWorker: () => Worker;
  /** Number of workers started so far (a stop replaces the worker). */
  workersStarted = 0;

  constructor(makeWorker: () => Worker) {
    this.#makeWorker = makeWorker;
  }

  get running(): boolean {
    return this.#pending !== undefined;
  }

  /** Starts the worker now, so the first run does not wait for it (and for the wasm). */
  warm(): void {
    this.#ensure();
  }

  #ensure(): Worker {
    if (this.#worker) return this.#worker;
    const worker = this.#makeWorker();
    this.workersStarted++;
    worker.addEventListener("message", (event: MessageEvent<DocumentRunReply>) => this.#onMessage(event.data));
    worker.addEventListener("error", (event: ErrorEvent) => {
      event.preventDefault();
      this.#replace(`the kernel worker failed: ${event.message || "no message"}; a fresh worker is ready for the next run`);
    });
    this.#worker = worker;
    return worker;
  }

  #arm(p: Pending): void {
    if (p.timer !== undefined) clearTimeout(p.timer);
    p.timer = setTimeout(() => this.#replace(`the kernel gave no sign of progress for ${p.cellLimitMs + WATCHDOG_GRACE_MS} ms (a cell's time limit plus ${WATCHDOG_GRACE_MS} ms); it was stopped and replaced`), p.cellLimitMs + WATCHDOG_GRACE_MS);
  }

  #onMessage(reply: DocumentRunReply): void {
    const p = this.#pending;
    if (!p || reply.id !== p.id) return;
    if (reply.type === "progress") {
      this.#arm(p);
      p.onProgress(reply.progress);
      return;
    }
    clearTimeout(p.timer);
    this.#pending = undefined;
    p.resolve(reply);
  }

  /** Runs one document; resolves when it ends (result, failure or stop). Only one run at a time. */
  run(request: Omit<DocumentRunRequest, "type" | "id">, cellLimitMs: number, onProgress: (p: RunProgress) => void): Promise<RunEnd> {
    if (this.#pending) throw new Error("a run is in progress; stop it or wait for it to end before starting another");
    const id = this.#nextId++;
    const worker = this.#ensure();
    return new Promise<RunEnd>((resolve) => {
      const p: Pending = { id, onProgress, resolve, cellLimitMs, timer: undefined };
      this.#pending = p;
      this.#arm(p);
      // Files are copied, not transferred: the page keeps them for the next run.
      worker.postMessage({ type: "run", id, ...request });
    });
  }

  /** Stops the run in progress by terminating the worker; the next run starts a fresh one. */
  stop(reason = "stopped by the user"): void {
    this.#replace(reason);
  }

  #replace(reason: string): void {
    this.#worker?.terminate();
    this.#worker = undefined;
    const p = this.#pending;
    this.#pending = undefined;
    if (p) {
      clearTimeout(p.timer);
      p.resolve({ type: "stopped", id: p.id, reason });
    }
  }

  dispose(): void {
    this.#replace("the page closed");
  }
}
