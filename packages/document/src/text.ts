import type { Position } from "./types.js";

/** A line of text: `start`/`end` offsets of its content and `eolEnd` after its line ending (CRLF, LF or CR). */
export interface Line {
  start: number;
  end: number;
  eolEnd: number;
}

/** Splits text into lines the way CommonMark does: "\r\n", "\n" and a lone "\r" each end a line. */
export function splitLines(text: string): Line[] {
  const lines: Line[] = [];
  let start = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 10 || c === 13) {
      const eolEnd = c === 13 && text.charCodeAt(i + 1) === 10 ? i + 2 : i + 1;
      lines.push({ start, end: i, eolEnd });
      start = eolEnd;
      i = eolEnd - 1;
    }
  }
  lines.push({ start, end: text.length, eolEnd: text.length });
  return lines;
}

/** Maps string offsets to 1-based line/column positions. Built once per text; each lookup is a binary search. */
export class PositionMap {
  private readonly starts: number[];
  constructor(text: string) {
    this.starts = splitLines(text).map((l) => l.start);
  }
  at(offset: number): Position {
    let lo = 0;
    let hi = this.starts.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (this.starts[mid]! <= offset) lo = mid;
      else hi = mid - 1;
    }
    return { line: lo + 1, column: offset - this.starts[lo]! + 1 };
  }
}

/** The first line ending in the text, or "\n" when it has none (or starts with a lone CR). */
export function detectEol(text: string): "\n" | "\r\n" {
  const i = text.search(/\r\n|\n/);
  return i >= 0 && text[i] === "\r" ? "\r\n" : "\n";
}

/** Removes one final line ending (CRLF, LF or CR) if there is one. */
export function dropFinalEol(text: string): string {
  if (text.endsWith("\r\n")) return text.slice(0, -2);
  if (text.endsWith("\n") || text.endsWith("\r")) return text.slice(0, -1);
  return text;
}

/** True when the line holds only spaces and tabs. */
export function isBlank(s: string): boolean {
  return /^[ \t]*$/.test(s);
}

/** JSON with object keys sorted, so equal values give equal strings (used as fingerprints). */
export function stableStringify(value: unknown): string {
  return JSON.stringify(value, (_key, v: unknown) => {
    if (v && typeof v === "object" && !Array.isArray(v)) {
      const o = v as Record<string, unknown>;
      return Object.fromEntries(Object.keys(o).sort().map((k) => [k, o[k]]));
    }
    return v;
  });
}
