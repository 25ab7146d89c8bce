/**
 * One run of a loaded document through the kernel, with the overrides the CLI derives from settings and the
 * data files read beside the document.
 *
 * The kernel runs in a worker thread behind a watchdog. The kernel stops a cell at its time limit itself, and
 * its guards hold the limit inside the builtins and host calls they meter; for work they do not see (one
 * operation that takes seconds inside the engine), the watchdog ends the worker WATCHDOG_MARGIN_MS after the
 * cell's limit. The cell then gets the time-limit message, the cells after it are not run, and the outputs of the
 * cells before it are kept. The worker's JavaScript heap is bounded too (HOST_HEAP_LIMIT_MB); the sandbox's own
 * memory is bounded by the kernel.
 */
import { Worker } from "node:worker_threads";
import type { Cell, CellOutput } from "@conebook/document";
import { HOST_HEAP_LIMIT_MB, STACK_LIMIT_BYTES, WATCHDOG_MARGIN_MS, abortMessage, limitsFor, type CellStart, type CellStatus, type ControlRecord, type RecordedControl, type RunResult } from "@conebook/kernel";
import type { Io } from "./io.js";
import type { LoadedDocument } from "./load.js";
import type { RunReply, RunRequest } from "./run-worker.js";

/** The file line where a cell starts (its fence or marker). */
export function cellLine(cell: Cell): number {
  return (cell.origin?.start ?? cell.sourceStart).line;
}

/** The worker's entry: the bundled run-worker.js beside this module, or the sources through tsx. */
function workerEntry(): URL {
  return import.meta.url.endsWith(".ts") ? new URL("./run-worker-bootstrap.mjs", import.meta.url) : new URL("./run-worker.js", import.meta.url);
}

/**
 * Runs every cell of `loaded.document` with `overrides` and the control values recorded in it (`recorded`; none
 * for a fresh run) in a worker thread that a watchdog ends when a cell outlives its limit; progress lines go to
 * standard error when it is a terminal.
 */
export async function execute(
  loaded: LoadedDocument,
  overrides: Record<string, number>,
  io: Io,
  recorded: Record<string, RecordedControl> = {},
): Promise<RunResult> {
  const t0 = performance.now();
  const doc = loaded.document;
  const byId = new Map(doc.cells.map((c) => [c.id, c]));
  const limits = limitsFor(doc.header);
  const outputs: Record<string, CellOutput[]> = {};
  const status: Record<string, CellStatus> = {};
  const cellTimes: Record<string, number> = {};
  const worker = new Worker(workerEntry(), { resourceLimits: { maxOldGenerationSizeMb: HOST_HEAP_LIMIT_MB } });

  return await new Promise<RunResult>((resolve, reject) => {
    let current: { start: CellStart; at: number } | undefined;
    let timer: ReturnType<typeof setTimeout> | undefined;
    let settled = false;
    const settle = (f: () => void) => {
      if (settled) return;
      settled = true;
      clearTimeout(timer);
      f();
    };
    // The run as far as it got, with `note` closing the cell in progress (the rest not run).
    const stopped = (kind: "time" | "memory", note: string): RunResult => {
      const cells = doc.cells.filter((c) => c.kind !== "narrative");
      let failedAt: string | undefined;
      for (const cell of cells) {
        if (status[cell.id] !== undefined) continue;
        if (failedAt === undefined) {
          failedAt = cell.id;
          outputs[cell.id] = [{ type: "error", message: `${abortMessage(cell.id, kind, limits, STACK_LIMIT_BYTES)} ${note}` }];
          status[cell.id] = "error";
          cellTimes[cell.id] = current?.start.cellId === cell.id ? performance.now() - current.at : 0;
        } else {
          outputs[cell.id] = [{ type: "not-run", reason: `an earlier cell (${failedAt}) failed` }];
          status[cell.id] = "not-run";
          cellTimes[cell.id] = 0;
        }
      }
      const controlsUsed: ControlRecord[] = [];
      for (const cell of cells) for (const o of outputs[cell.id] ?? []) if (o.type === "control") controlsUsed.push({ cellId: cell.id, output: o });
      const used = new Set(controlsUsed.map((c) => c.output.name));
      return {
        outputs,
        status,
        timings: { cells: cellTimes, sandboxStartMs: 0, totalMs: performance.now() - t0 },
        controlsUsed,
        unusedOverrides: Object.keys(overrides).filter((k) => !used.has(k)),
        limits,
        // The notes on control values travel with the result, which a stopped worker never sent.
        notes: [],
        // Unknown: the worker that held the sandbox was ended before it could report its memory.
        memory: { peakBytes: 0, capBytes: 0 },
      };
    };
    const end = (result: () => RunResult) => settle(() => void worker.terminate().then(() => resolve(result()), () => resolve(result())));

    worker.on("message", (reply: RunReply) => {
      switch (reply.type) {
        case "start":
          current = { start: reply.start, at: performance.now() };
          clearTimeout(timer);
          timer = setTimeout(
            () => end(() => stopped("time", `It was stuck inside one operation, so the run was ended ${WATCHDOG_MARGIN_MS} ms after the limit.`)),
            reply.start.timeLimitMs + WATCHDOG_MARGIN_MS,
          );
          return;
        case "progress": {
          clearTimeout(timer);
          const p = reply.progress;
          outputs[p.cellId] = p.outputs;
          status[p.cellId] = p.status;
          cellTimes[p.cellId] = p.elapsedMs;
          if (io.progress) io.err(`[${p.index + 1}/${p.total}] ${byId.get(p.cellId)?.kind ?? "cell"} ${p.cellId}: ${p.status} (${p.elapsedMs.toFixed(0)} ms)`);
          return;
        }
        case "result":
          settle(() => void worker.terminate().then(() => resolve(reply.result), () => resolve(reply.result)));
          return;
        case "failed":
          settle(() => void worker.terminate().finally(() => reject(Object.assign(new Error(reply.message), reply.stack ? { stack: reply.stack } : {}))));
      }
    });
    worker.on("error", (e: Error & { code?: string }) => {
      if (e.code === "ERR_WORKER_OUT_OF_MEMORY") end(() => stopped("memory", `The run's host side needed more than ${HOST_HEAP_LIMIT_MB} MiB, so it was ended.`));
      else settle(() => reject(e));
    });
    worker.on("exit", (code) => settle(() => reject(new Error(`the run's worker thread ended unexpectedly with exit code ${code}`))));
    // The files checkPins read and hashed move to the worker (their buffers transferred, not copied), so each is
    // read and hashed once per command; a later run of the same loaded document reads them again.
    const files = [...loaded.checkedFiles];
    loaded.checkedFiles.clear();
    const transfer = files
      .map(([, f]) => f.bytes)
      .filter((b) => b.byteOffset === 0 && b.byteLength === b.buffer.byteLength && b.buffer instanceof ArrayBuffer)
      .map((b) => b.buffer as ArrayBuffer);
    worker.postMessage({ document: doc, overrides, recordedControls: recorded, folder: loaded.folder, files } satisfies RunRequest, [...new Set(transfer)]);
  });
}
