/**
 * Where in the file a guest error happened, and the messages for limit aborts.
 */
import type { Cell } from "@conebook/document";
import type { AbortKind } from "./sandbox.js";
import { MAX_MEMORY_LIMIT_MB, MAX_TIME_LIMIT_MS, type RunLimits } from "./limits.js";

/** The script name a cell runs under; it appears in guest stack traces. */
export function cellFilename(cellId: string): string {
  return `cell:${cellId}`;
}

function escapeRegExp(s: string): string {
  return s.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");
}

/**
 * File line and column of the innermost stack frame inside the cell, or undefined when the stack has none.
 * `mapColumn` maps a column of the stripped JavaScript back to the TypeScript source (same line).
 */
export function errorLocation(
  cell: Cell,
  stack: string,
  mapColumn?: (line: number, column: number) => number,
): { line: number; column: number } | undefined {
  const frame = new RegExp(`${escapeRegExp(cellFilename(cell.id))}:(\\d+):(\\d+)`).exec(stack);
  if (!frame) return undefined;
  const line = Number(frame[1]);
  const jsColumn = Number(frame[2]);
  const column = mapColumn ? mapColumn(line, jsColumn) : jsColumn;
  return {
    line: cell.sourceStart.line + line - 1,
    column: line === 1 ? cell.sourceStart.column + column - 1 : column,
  };
}

/** The message of a cell stopped by a limit: which limit, its value, and what to do. */
export function abortMessage(cellId: string, kind: AbortKind, limits: RunLimits, stackBytes: number): string {
  switch (kind) {
    case "time":
      return (
        `Cell ${cellId} was stopped after running for its time limit of ${limits.timeLimitMs} ms. ` +
        `Make the computation smaller (fewer points, fewer iterations), or raise limits.cellTimeMs in the header (at most ${MAX_TIME_LIMIT_MS}).`
      );
    case "memory":
      return (
        `Cell ${cellId} ran out of memory: the sandbox may use ${limits.memoryLimitMb} MiB. ` +
        `Work on less data at once, or raise limits.memoryMb in the header (at most ${MAX_MEMORY_LIMIT_MB}).`
      );
    case "stack":
      return (
        `Cell ${cellId} nested function calls too deeply (the stack limit is ${stackBytes / 1024} KiB): ` +
        "a function probably calls itself without end. Check its stopping condition, or use a loop."
      );
  }
}
