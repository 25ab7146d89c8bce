/**
 * The kernel behind a Web Worker's message port: a request carries a document's text, its data files' bytes and
 * the run options; the worker parses the text with @conebook/document, runs it with the kernel and posts back
 * progress and the run result. `runDocumentText` is the same function without the port, so Node and the worker
 * run a document through identical code.
 *
 * A worker entry builds the kernel for its host and hands it over, e.g. under Vite:
 *   import wasmUrl from "@jitl/quickjs-wasmfile-release-sync/wasm?url";
 *   serveKernelWorker(globalThis as unknown as KernelWorkerScope, createKernel({ loadModule: loadBrowserModule(wasmUrl) }));
 * The page keeps the right to terminate the worker: the kernel's time limit does not fire inside one long native
 * builtin or bridge call, so a page that gets no reply within the time limit plus a grace period replaces it.
 */
import { DocumentError, formatDiagnostic, parseDocument, type Diagnostic } from "@conebook/document";
import type { ReadFile } from "./data-cells.js";
import type { Kernel, RunProgress, RunResult } from "./kernel.js";
import type { RecordedControl } from "./controls.js";

/** Run one document. */
export interface DocumentRunRequest {
  type: "run";
  /** Chosen by the sender; every reply to this request carries it. */
  id: number;
  /** The document's text (a `*.cone.md` file). */
  text: string;
  /** File name shown in diagnostics. */
  file?: string;
  /** Values for `control(name, ...)` calls, by control name. */
  overrides?: Record<string, number>;
  /** Control values recorded in the document, with the default recorded beside each (see RunOptions). */
  recordedControls?: Record<string, RecordedControl>;
  /** Bytes of the data files the document pins, by their path relative to the document (forward slashes). */
  files?: Record<string, Uint8Array | ArrayBuffer>;
}

/** What the worker posts back: progress after each executable cell, then exactly one `result` or `failed`. */
export type DocumentRunReply =
  | { type: "progress"; id: number; progress: RunProgress }
  | { type: "result"; id: number; result: RunResult; warnings: Diagnostic[] }
  | { type: "failed"; id: number; message: string; diagnostics: Diagnostic[] };

/** The part of a worker's global scope the kernel worker uses (a DedicatedWorkerGlobalScope in a browser). */
export interface KernelWorkerScope {
  addEventListener(type: "message", listener: (event: { data: unknown }) => void): void;
  postMessage(message: DocumentRunReply): void;
}

/** A ReadFile over the bytes sent with a request; a path that was not sent is an error naming it. */
export function sentFileReader(files: Record<string, Uint8Array | ArrayBuffer>): ReadFile {
  return (path) => {
    const bytes = Object.hasOwn(files, path) ? files[path] : undefined;
    if (bytes === undefined) {
      const sent = Object.keys(files);
      throw new Error(`${path} was not sent with the document (sent: ${sent.length > 0 ? sent.join(", ") : "no files"}); send its bytes under files["${path}"]`);
    }
    return bytes instanceof Uint8Array ? bytes : new Uint8Array(bytes);
  };
}

/**
 * Parses `request.text` and runs it on `kernel`. A document with errors is not run: the reply is `failed` with
 * every error as `file:line:column: error: message`. Progress goes to `onProgress` after each executable cell.
 */
export async function runDocumentText(kernel: Kernel, request: DocumentRunRequest, onProgress?: (p: RunProgress) => void): Promise<DocumentRunReply> {
  const { id, file } = request;
  let parsed;
  try {
    parsed = parseDocument(request.text, { file });
  } catch (e) {
    if (e instanceof DocumentError) return { type: "failed", id, message: e.message, diagnostics: [] };
    throw e;
  }
  const errors = parsed.diagnostics.filter((d) => d.severity === "error");
  if (errors.length > 0) {
    const lines = errors.map((d) => formatDiagnostic(file === undefined ? d : { ...d, file }));
    return { type: "failed", id, message: `the document has ${errors.length === 1 ? "an error" : `${errors.length} errors`}:\n${lines.join("\n")}`, diagnostics: errors };
  }
  const result = await kernel.runDocument(parsed.document, {
    overrides: request.overrides ?? {},
    recordedControls: request.recordedControls ?? {},
    readFile: sentFileReader(request.files ?? {}),
    ...(onProgress ? { onProgress } : {}),
  });
  return { type: "result", id, result, warnings: parsed.diagnostics.filter((d) => d.severity === "warning") };
}

/** The problem with a message that is not a DocumentRunRequest, or undefined when it is one. */
function requestProblem(data: unknown): string | undefined {
  if (data === null || typeof data !== "object") return "the message is not an object; send { type: \"run\", id, text }";
  const m = data as Record<string, unknown>;
  if (m.type !== "run") return `unknown message type ${JSON.stringify(m.type)}; the kernel worker understands only "run"`;
  if (typeof m.id !== "number") return "a run request needs a numeric id";
  if (typeof m.text !== "string") return "a run request needs the document's text as a string in text";
  return undefined;
}

/**
 * Answers DocumentRunRequests posted to `scope` with `kernel`, one run at a time in the order they arrive.
 * A malformed request or an unexpected exception becomes a `failed` reply (id -1 when the request had none).
 */
export function serveKernelWorker(scope: KernelWorkerScope, kernel: Kernel): void {
  let queue: Promise<void> = Promise.resolve();
  scope.addEventListener("message", (event) => {
    const data = event.data;
    queue = queue.then(async () => {
      const problem = requestProblem(data);
      const id = data !== null && typeof data === "object" && typeof (data as { id?: unknown }).id === "number" ? (data as { id: number }).id : -1;
      if (problem) {
        scope.postMessage({ type: "failed", id, message: problem, diagnostics: [] });
        return;
      }
      try {
        const reply = await runDocumentText(kernel, data as DocumentRunRequest, (progress) => scope.postMessage({ type: "progress", id, progress }));
        scope.postMessage(reply);
      } catch (e) {
        const message = e instanceof Error ? `${e.name}: ${e.message}` : String(e);
        scope.postMessage({ type: "failed", id, message: `the kernel failed: ${message}`, diagnostics: [] });
      }
    });
  });
}
