/**
 * Fence lines of cells: reading `<lang> <kind>[:<id>] key=value ...` info strings and choosing fences that the
 * cell's body cannot close early (CommonMark 0.31, section 4.5 "Fenced code blocks").
 */

import { splitLines } from "./text.js";

/** The kinds of fenced block a Conebook file uses; narrative cells have a Markdown marker instead. */
export type FenceKind = "code" | "data" | "chart" | "outputs";

export interface OpeningFence {
  indent: number;
  char: "`" | "~";
  length: number;
  info: string;
}

/** Reads a line as an opening code fence, or returns undefined when it is not one. */
export function readOpeningFence(line: string): OpeningFence | undefined {
  const m = /^( {0,3})(`{3,}|~{3,})(.*)$/.exec(line);
  if (!m) return undefined;
  const char = m[2]![0] as "`" | "~";
  if (char === "`" && m[3]!.includes("`")) return undefined;
  return { indent: m[1]!.length, char, length: m[2]!.length, info: m[3]!.trim() };
}

/** True when `line` closes a fence opened with `open` (same character, at least as long, nothing after). */
export function closesFence(line: string, open: OpeningFence): boolean {
  const m = /^ {0,3}(`{3,}|~{3,})[ \t]*$/.exec(line);
  return !!m && m[1]![0] === open.char && m[1]!.length >= open.length;
}

/** The shortest fence of `char` (at least 3) that no line of `body` closes. */
export function safeFence(body: string, char: "`" | "~"): string {
  let longest = 0;
  const re = char === "`" ? /^ {0,3}(`{3,})[ \t]*$/ : /^ {0,3}(~{3,})[ \t]*$/;
  for (const l of splitLines(body)) {
    const m = re.exec(body.slice(l.start, l.end));
    if (m) longest = Math.max(longest, m[1]!.length);
  }
  return char.repeat(Math.max(3, longest + 1));
}

export interface CellInfo {
  lang: string;
  kind: FenceKind;
  /** The id after the colon, or undefined when the marker has none (`ts code`). */
  id: string | undefined;
  /** Column (0-based, within the info string) where the kind word ends: where `:id` goes when it is added. */
  kindEnd: number;
  attributes: Record<string, string>;
  /** Order in which attributes were written. */
  order: string[];
  /** A description of the first syntax problem, when the attributes could not all be read. */
  error?: { detail: string; offset: number };
}

const KIND_RE = /^(code|data|chart|outputs)(?::(\S*))?$/;

/**
 * Reads an info string such as `csv data:wells name=obs1 file="data/obs 1.csv" sha256=...`. Returns
 * undefined when the second word is not a Conebook kind (then the block is ordinary Markdown).
 */
export function readCellInfo(info: string): CellInfo | undefined {
  const first = /^(\S+)\s+(\S+)/.exec(info);
  if (!first) return undefined;
  const km = KIND_RE.exec(first[2]!);
  if (!km) return undefined;
  const kindStart = info.indexOf(first[2]!, first[1]!.length);
  const kindEnd = kindStart + km[1]!.length;
  const result: CellInfo = {
    lang: first[1]!,
    kind: km[1] as FenceKind,
    id: km[2],
    kindEnd,
    attributes: {},
    order: [],
  };
  let i = kindStart + first[2]!.length;
  while (i < info.length) {
    while (i < info.length && /\s/.test(info[i]!)) i++;
    if (i >= info.length) break;
    const keyMatch = /^[A-Za-z][A-Za-z0-9_-]*/.exec(info.slice(i));
    if (!keyMatch) {
      result.error = { detail: `unexpected ${JSON.stringify(info[i])}`, offset: i };
      break;
    }
    const key = keyMatch[0];
    i += key.length;
    let value = "";
    if (info[i] === "=") {
      i++;
      if (info[i] === '"') {
        const quoteAt = i;
        i++;
        let closed = false;
        while (i < info.length) {
          const c = info[i]!;
          if (c === "\\" && i + 1 < info.length) {
            value += info[i + 1];
            i += 2;
          } else if (c === '"') {
            closed = true;
            i++;
            break;
          } else {
            value += c;
            i++;
          }
        }
        if (!closed) {
          result.error = { detail: `the quoted value of ${JSON.stringify(key)} has no closing '"'`, offset: quoteAt };
          break;
        }
      } else {
        const bare = /^[^\s"]*/.exec(info.slice(i))![0];
        value = bare;
        i += bare.length;
      }
    } else if (i < info.length && !/\s/.test(info[i]!)) {
      result.error = { detail: `unexpected ${JSON.stringify(info[i])} after ${JSON.stringify(key)}`, offset: i };
      break;
    }
    if (!(key in result.attributes)) result.order.push(key);
    result.attributes[key] = value;
  }
  return result;
}

/** Writes one attribute, quoting the value when it holds spaces, quotes, backslashes or is empty. */
export function formatAttribute(key: string, value: string): string {
  if (value === "") return key;
  if (/^[^\s"\\]+$/.test(value)) return `${key}=${value}`;
  return `${key}="${value.replace(/[\\"]/g, (c) => "\\" + c)}"`;
}

/** Writes an info string `lang kind:id attrs...`. */
export function formatCellInfo(lang: string, kind: FenceKind, id: string, attributes: [string, string][]): string {
  return [`${lang} ${kind}:${id}`, ...attributes.map(([k, v]) => formatAttribute(k, v))].join(" ");
}
