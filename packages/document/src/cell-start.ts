/**
 * Lines inside a fenced block that would start another cell if the block had been closed: a top-level Conebook
 * fence (```` ```ts code:ID ````, ```` ```csv data:ID ````, ...) or a narrative marker. A block that holds one
 * was almost always left unclosed by mistake, and the cell after it vanished into it.
 */
import { readCellInfo, readOpeningFence } from "./fence.js";

const NARRATIVE_MARKER = /^\[narrative(?::([^\]\s]*))?\]:[ \t]*#[ \t]*$/;

/** The first line of `body` (1-based) that starts another cell, with its text; undefined when there is none. */
export function cellStartInside(body: string): { line: number; text: string } | undefined {
  const lines = body.split(/\r\n|\n|\r/);
  for (let i = 0; i < lines.length; i++) if (startsCell(lines[i]!)) return { line: i + 1, text: lines[i]!.trim() };
  return undefined;
}

/** True when the line (without its line ending) is a top-level Conebook fence or a narrative marker. */
export function startsCell(line: string): boolean {
  const fence = readOpeningFence(line);
  return (fence !== undefined && fence.indent <= 3 && readCellInfo(fence.info) !== undefined) || NARRATIVE_MARKER.test(line);
}

/**
 * A quick test on the line `text.slice(start, end)`: false when it cannot start a cell (neither up to three spaces
 * and a backtick or tilde, nor "[" first), so startsCell need not look at it; true when startsCell must decide.
 */
export function mayStartCell(text: string, start: number, end: number): boolean {
  if (start < end && text.charCodeAt(start) === 91) return true;
  let p = start;
  while (p < end && p - start < 3 && text.charCodeAt(p) === 32) p++;
  const c = p < end ? text.charCodeAt(p) : -1;
  return c === 96 || c === 126;
}
