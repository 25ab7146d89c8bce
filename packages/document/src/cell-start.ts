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
  for (let i = 0; i < lines.length; i++) {
    const line = lines[i]!;
    const fence = readOpeningFence(line);
    if ((fence && fence.indent <= 3 && readCellInfo(fence.info)) || NARRATIVE_MARKER.test(line)) return { line: i + 1, text: line.trim() };
  }
  return undefined;
}
