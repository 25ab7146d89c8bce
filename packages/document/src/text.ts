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

/**
 * The lines of a text as splitLines finds them, held as two arrays of offsets instead of an object per line (a
 * 10 MB document has some 300,000 lines, and their objects kept the garbage collector busy).
 */
export class LineTable {
  /** Offset of each line's first character. */
  readonly starts: number[] = [];
  private readonly ends: number[] = [];
  private readonly textLength: number;
  constructor(text: string) {
    this.textLength = text.length;
    let start = 0;
    if (text.indexOf("\r") < 0) {
      // Only "\n" ends lines: let the platform's search find them.
      for (let i = text.indexOf("\n"); i >= 0; i = text.indexOf("\n", start)) {
        this.starts.push(start);
        this.ends.push(i);
        start = i + 1;
      }
    } else {
      for (let i = 0; i < text.length; i++) {
        const c = text.charCodeAt(i);
        if (c === 10 || c === 13) {
          const eolEnd = c === 13 && text.charCodeAt(i + 1) === 10 ? i + 2 : i + 1;
          this.starts.push(start);
          this.ends.push(i);
          start = eolEnd;
          i = eolEnd - 1;
        }
      }
    }
    this.starts.push(start);
    this.ends.push(text.length);
  }
  /** The number of lines (one more than the line endings). */
  get length(): number {
    return this.starts.length;
  }
  /** Offset of the first character of line `i` (0-based). */
  start(i: number): number {
    return this.starts[i]!;
  }
  /** Offset of the end of line `i`'s content, before its line ending. */
  end(i: number): number {
    return this.ends[i]!;
  }
  /** Offset after line `i`'s line ending (the text's length for the last line). */
  eolEnd(i: number): number {
    return i + 1 < this.starts.length ? this.starts[i + 1]! : this.textLength;
  }
}

/** Maps string offsets to 1-based line/column positions. Built once per text; each lookup is a binary search. */
export class PositionMap {
  private readonly starts: readonly number[];
  /** `starts` are the offsets of the text's lines when the caller has them already (LineTable.starts). */
  constructor(text: string, starts?: readonly number[]) {
    this.starts = starts ?? splitLines(text).map((l) => l.start);
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

/**
 * JSON with object keys sorted, so equal values give equal strings (used as fingerprints). The text is exactly
 * that of `JSON.stringify(value, replacer)` with a replacer that copies every non-array object with its keys
 * sorted (a copy lists integer keys first, in numeric order, as every object does); plain data (null, booleans,
 * numbers, strings, arrays, plain objects) is written directly in one pass, and anything else (a toJSON, a boxed
 * value, a class instance, a typed array, deep or cyclic nesting) takes the replacer path.
 */
export function stableStringify(value: unknown): string {
  // Plain data whose keys are in order already is what the platform's JSON.stringify writes, natively.
  if (sortedPlain(value, 0)) return JSON.stringify(value);
  const plain = plainJson(value, 0);
  return plain ?? (stringifyWithReplacer(value) as string);
}

/** True when the value is plain data (see plainJson) and every object lists its keys in the sorted order. */
function sortedPlain(v: unknown, depth: number): boolean {
  if (typeof v !== "object") return typeof v === "string" || typeof v === "number" || typeof v === "boolean";
  if (v === null) return true;
  if (depth > PLAIN_DEPTH || typeof (v as { toJSON?: unknown }).toJSON === "function") return false;
  if (Array.isArray(v)) {
    if (Object.getPrototypeOf(v) !== Array.prototype) return false;
    for (let i = 0; i < v.length; i++) {
      const item: unknown = v[i];
      if (item !== undefined && typeof item !== "function" && typeof item !== "symbol" && !sortedPlain(item, depth + 1)) return false;
    }
    return true;
  }
  const proto: unknown = Object.getPrototypeOf(v);
  if (proto !== Object.prototype && proto !== null) return false;
  const o = v as Record<string, unknown>;
  const keys = Object.keys(o);
  let i = 0;
  while (i < keys.length && isArrayIndex(keys[i]!)) i++;
  for (let k = 0; k < keys.length; k++) {
    if (k > i && keys[k - 1]! > keys[k]!) return false;
    const item = o[keys[k]!];
    if (item !== undefined && typeof item !== "function" && typeof item !== "symbol" && !sortedPlain(item, depth + 1)) return false;
  }
  return true;
}

/** The general path: JSON.stringify with a replacer that sorts the keys of every non-array object. */
function stringifyWithReplacer(value: unknown): string | undefined {
  return JSON.stringify(value, (_key, v: unknown) => {
    if (v && typeof v === "object" && !Array.isArray(v)) {
      const o = v as Record<string, unknown>;
      return Object.fromEntries(Object.keys(o).sort().map((k) => [k, o[k]]));
    }
    return v;
  });
}

/** Nesting beyond which the general path is taken (it reports cycles and overflows as JSON.stringify does). */
const PLAIN_DEPTH = 500;

const ARRAY_INDEX = /^(?:0|[1-9][0-9]*)$/;
/** True for a value JSON writes through its properties (an object or array, not null). */
const isObjectItem = (x: unknown): boolean => typeof x === "object" && x !== null;

/** True when `key` is an array index, which objects list first, in numeric order (ECMA-262, OrdinaryOwnPropertyKeys). */
function isArrayIndex(key: string): boolean {
  const c = key.charCodeAt(0);
  return c >= 48 && c <= 57 && ARRAY_INDEX.test(key) && Number(key) < 4294967295;
}

/**
 * The JSON of plain data with sorted keys, or undefined when the value is not plain data. A value JSON leaves out
 * (undefined, a function, a symbol) is not plain at the top or in an array; an object member checks for those first.
 */
function plainJson(v: unknown, depth: number): string | undefined {
  switch (typeof v) {
    case "string":
      return JSON.stringify(v);
    case "number":
      return Number.isFinite(v) ? JSON.stringify(v) : "null";
    case "boolean":
      return v ? "true" : "false";
    case "object":
      break;
    default:
      return undefined;
  }
  if (v === null) return "null";
  if (depth > PLAIN_DEPTH || typeof (v as { toJSON?: unknown }).toJSON === "function") return undefined;
  if (Array.isArray(v)) {
    if (Object.getPrototypeOf(v) !== Array.prototype) return undefined;
    // An array with no object in it (a table row) is written as the platform writes it.
    if (!v.some(isObjectItem)) return JSON.stringify(v);
    let out = "[";
    for (let i = 0; i < v.length; i++) {
      const item: unknown = v[i];
      const json = item === undefined || typeof item === "function" || typeof item === "symbol" ? "null" : plainJson(item, depth + 1);
      if (json === undefined) return undefined;
      out += i === 0 ? json : "," + json;
    }
    return out + "]";
  }
  const proto: unknown = Object.getPrototypeOf(v);
  if (proto !== Object.prototype && proto !== null) return undefined;
  const o = v as Record<string, unknown>;
  const keys = Object.keys(o);
  // Object.keys lists the array indices first, in numeric order; the sorted copy keeps them there.
  let indices = 0;
  while (indices < keys.length && isArrayIndex(keys[indices]!)) indices++;
  const named = indices === 0 ? keys.slice().sort() : keys.slice(indices).sort();
  // Keys in order and no object among the values: the platform writes the same text.
  if (named.every((k, i) => k === keys[indices + i]) && !keys.some((k) => isObjectItem(o[k]))) return JSON.stringify(o);
  let out = "{";
  for (let i = 0; i < keys.length; i++) {
    const key = i < indices ? keys[i]! : named[i - indices]!;
    const item = o[key];
    if (item === undefined || typeof item === "function" || typeof item === "symbol") continue;
    const json = plainJson(item, depth + 1);
    if (json === undefined) return undefined;
    out += (out.length === 1 ? "" : ",") + JSON.stringify(key) + ":" + json;
  }
  return out + "}";
}
