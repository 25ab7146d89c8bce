/**
 * What the page knows about runs, DOM-free: a RunRecord per run (the cells it ran, per-cell status, outputs and
 * times as the worker reports them), and the rules that decide which result a cell shows and whether that
 * result is out of date.
 *
 * Every run starts a fresh sandbox at the top of the document, as `conebook run` and `verify` do: "run this
 * cell" runs the document up to and including that cell, "run all" and "run from here" run it to the end.
 * A cell's result is current while the header and every code, data and chart cell from the top down to it are
 * the very cell objects that ran (an edited cell is a new object); an edit therefore marks the edited cell and
 * every cell below it out of date, while narrative edits mark nothing.
 */
import type { Cell, CellOutput, ConebookDocument, DocumentHeader } from "@conebook/document";
import type { RunResult } from "@conebook/kernel";

/** Status of one cell in a run. */
export type CellRunStatus = "queued" | "running" | "ok" | "error" | "not-run" | "stopped";

/** How a run was asked for. */
export type RunMode = "all" | "cell" | "from";

/** One run. */
export interface RunRecord {
  id: number;
  mode: RunMode;
  /** The cell the run was asked for (modes cell and from). */
  targetId?: string;
  header: DocumentHeader;
  /** The executable cells that ran, in order (identity matters, see the module comment). */
  executables: readonly Cell[];
  status: Record<string, CellRunStatus>;
  outputs: Record<string, CellOutput[]>;
  ms: Record<string, number>;
  /** File line of each cell's first source line in the text that ran (to place errors in the editor). */
  sourceLines: Record<string, number>;
  phase: "running" | "done" | "stopped" | "failed";
  /** Why the run stopped or failed (a document error, a stop, a worker crash). */
  message?: string;
  result?: RunResult;
  startedAt: number;
  endedAt?: number;
}

/** True for code, data and chart cells. */
export function isExecutable(cell: Cell): boolean {
  return cell.kind !== "narrative";
}

/** The executable cells of a document. */
export function executablesOf(doc: ConebookDocument): Cell[] {
  return doc.cells.filter(isExecutable);
}

/** A new record for a run of `doc` (already cut to the cells that will run). */
export function startRun(id: number, mode: RunMode, doc: ConebookDocument, targetId: string | undefined, sourceLines: Record<string, number>, now: number): RunRecord {
  const executables = executablesOf(doc);
  const status: Record<string, CellRunStatus> = {};
  executables.forEach((c, i) => (status[c.id] = i === 0 ? "running" : "queued"));
  return { id, mode, ...(targetId ? { targetId } : {}), header: doc.header, executables, status, outputs: {}, ms: {}, sourceLines, phase: "running", startedAt: now };
}

/** The record after a progress report: the reported cell's status and time, the next cell running. */
export function withProgress(run: RunRecord, cellId: string, status: CellRunStatus, elapsedMs: number): RunRecord {
  const next = { ...run, status: { ...run.status, [cellId]: status }, ms: { ...run.ms, [cellId]: elapsedMs } };
  const i = run.executables.findIndex((c) => c.id === cellId);
  const following = run.executables[i + 1];
  if (following && next.status[following.id] === "queued") next.status[following.id] = "running";
  return next;
}

/** The record after the final result. */
export function withResult(run: RunRecord, result: RunResult, now: number): RunRecord {
  return { ...run, result, outputs: result.outputs, status: { ...result.status }, ms: { ...result.timings.cells }, phase: "done", endedAt: now };
}

/** The record after a stop (or a failure to run): cells not finished are marked stopped. */
export function withStop(run: RunRecord, phase: "stopped" | "failed", message: string, now: number): RunRecord {
  const status = { ...run.status };
  for (const [id, s] of Object.entries(status)) if (s === "queued" || s === "running") status[id] = phase === "stopped" ? "stopped" : "not-run";
  return { ...run, status, phase, message, endedAt: now };
}

/**
 * The number of leading executable cells of `doc` that are the very cells `run` ran (and 0 when the header
 * changed): results of those cells are current, results of the others out of date.
 */
export function currentPrefix(run: Pick<RunRecord, "header" | "executables">, doc: ConebookDocument): number {
  if (run.header !== doc.header) return 0;
  const now = executablesOf(doc);
  let n = 0;
  while (n < now.length && n < run.executables.length && now[n] === run.executables[n]) n++;
  return n;
}

/** What a cell shows: the outputs of the latest run that reached it, or its recorded outputs. */
export interface ShownResult {
  source: "run" | "recorded";
  outputs: readonly CellOutput[];
  status?: CellRunStatus;
  ms?: number;
  /** True when the result came from a run and the cell or a cell above it changed since. */
  outOfDate: boolean;
  run?: RunRecord;
  /** True when the outputs are the earlier ones, shown while the run in progress (`run`) has not reached the cell. */
  previous?: boolean;
}

/**
 * The result each executable cell of `doc` shows, by id, given the runs from oldest to newest. A cell takes
 * the newest run that included it (by id); with none it shows its recorded outputs, out of date once the
 * cell or one above it differs from the document as opened (`opened`).
 */
export function shownResults(doc: ConebookDocument, runs: readonly RunRecord[], opened: ConebookDocument): Map<string, ShownResult> {
  const out = new Map<string, ShownResult>();
  const executables = executablesOf(doc);
  const prefixes = new Map(runs.map((r) => [r, currentPrefix(r, doc)]));
  const openedRun = { header: opened.header, executables: executablesOf(opened) };
  const openedPrefix = currentPrefix(openedRun, doc);
  executables.forEach((cell, index) => {
    // A cell the newest run has not reached yet keeps showing what it showed before, with the run's status.
    let pending: RunRecord | undefined;
    for (let k = runs.length - 1; k >= 0; k--) {
      const run = runs[k]!;
      const status = run.status[cell.id];
      if (status === undefined) continue;
      if ((status === "queued" || status === "running") && run.outputs[cell.id] === undefined) {
        pending ??= run;
        continue;
      }
      const outputs = run.outputs[cell.id] ?? [];
      const ms = run.ms[cell.id];
      const shown: ShownResult = { source: "run", outputs, status, ...(ms !== undefined ? { ms } : {}), outOfDate: index >= prefixes.get(run)!, run };
      out.set(cell.id, pending ? { ...shown, status: pending.status[cell.id]!, run: pending, previous: true } : shown);
      return;
    }
    const recorded: ShownResult = { source: "recorded", outputs: cell.outputs, outOfDate: index >= openedPrefix };
    out.set(cell.id, pending ? { ...recorded, status: pending.status[cell.id]!, run: pending, previous: true } : recorded);
  });
  return out;
}

/** True when `run` ran the whole of `doc` as it is now and every cell succeeded: its outputs may be recorded. */
export function recordable(run: RunRecord | undefined, doc: ConebookDocument): boolean {
  if (!run || run.phase !== "done" || !run.result) return false;
  const all = executablesOf(doc);
  return run.executables.length === all.length && currentPrefix(run, doc) === all.length && Object.values(run.result.status).every((s) => s === "ok");
}
