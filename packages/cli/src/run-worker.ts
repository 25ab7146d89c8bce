/**
 * The worker thread a command's run happens in (see execute.ts): it receives the parsed document, the overrides
 * and the document's folder, runs the document with the kernel, and posts each cell's start, each cell's end
 * with its outputs, and the result. The main thread's watchdog ends this thread when a cell outlives its limit.
 */
import { parentPort } from "node:worker_threads";
import type { ConebookDocument } from "@conebook/document";
import type { CellStart, HashedBytes, ReadFile, RecordedControl, RunProgress, RunResult } from "@conebook/kernel";
import { createKernel } from "@conebook/kernel";
import { fileReaderFor } from "@conebook/kernel/node";
import { fileStripCache } from "./strip-cache.js";

/** What the main thread sends: one run. */
export interface RunRequest {
  document: ConebookDocument;
  overrides: Record<string, number>;
  /** Control values recorded in the document, with the default recorded beside each (see RunOptions). */
  recordedControls: Record<string, RecordedControl>;
  /** The document's folder; pinned data files are read relative to it. */
  folder: string;
  /** Pinned data files the main thread has read and hashed already, by path (others are read from `folder`). */
  files: [string, HashedBytes][];
}

/** Reads the files sent with the request, each once, and any other file from the document's folder. */
function requestReader(request: RunRequest): ReadFile {
  const sent = new Map(request.files);
  // The map holds the only reference from here on, so each file's bytes are freed once the run has read them.
  request.files.length = 0;
  const fromDisk = fileReaderFor(request.folder);
  return (path) => {
    const file = sent.get(path);
    if (file === undefined) return fromDisk(path);
    sent.delete(path);
    return file;
  };
}

/** What the worker posts back: starts and progress per cell, then one result or failure. */
export type RunReply =
  | { type: "start"; start: CellStart }
  | { type: "progress"; progress: RunProgress }
  | { type: "result"; result: RunResult }
  | { type: "failed"; message: string; stack?: string };

const port = parentPort;
if (port) {
  port.once("message", async (request: RunRequest) => {
    const post = (reply: RunReply) => port.postMessage(reply);
    const kernel = createKernel({ stripCache: fileStripCache() });
    try {
      const result = await kernel.runDocument(request.document, {
        overrides: request.overrides,
        recordedControls: request.recordedControls,
        readFile: requestReader(request),
        onCellStart: (start) => post({ type: "start", start }),
        onProgress: (progress) => post({ type: "progress", progress }),
      });
      post({ type: "result", result });
    } catch (e) {
      post({ type: "failed", message: e instanceof Error ? `${e.name}: ${e.message}` : String(e), ...(e instanceof Error && e.stack ? { stack: e.stack } : {}) });
    } finally {
      kernel.dispose();
    }
  });
}
