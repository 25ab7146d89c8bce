/**
 * Narrative references: prose that quotes a computed result instead of a hand-typed number, so the quote
 * cannot drift from the run. Written `{=CELL}`, `{=CELL/NAME}` or `{=CELL/ROW/COLUMN}`, with `#N` after the
 * cell id to pick its N-th output (1-based); a segment holding `/`, `}` or `"` is written in double quotes
 * with `\"` and `\\` escapes. See docs/format.md, section "Narrative references".
 *
 *   {=result}                          the cell's one value output
 *   {=fit-leaky/T}                     the row "T (transmissivity)" of the cell's estimate table: estimate ± SE
 *   {=fit-leaky/T/95 % low}            one column of that row, rounded as the row is
 *   {=result/"transmissivity in SI units"}   the value output with that label (or the control of that name)
 *
 * Resolution reads outputs only (recorded or fresh), so the same reference is checked by verify, shown by the
 * report and by a viewer, with the same rounding rules (number-text.ts).
 */
import { estimateColumns, rowUncertainty } from "./estimate-columns.js";
import { formatAtPlace, formatPlain, formatQuantity, typesetUnit, uncertaintyPlace } from "./number-text.js";
import type { CellOutput, Position } from "./types.js";

/** One reference as written. */
export interface NarrativeReference {
  /** The reference as written, from `{=` to `}`. */
  text: string;
  cellId: string;
  /** The 1-based output number after `#`, when given. */
  output?: number;
  /** The segments after the cell id: a name, or a row and a column. */
  path: string[];
}

/** A reference found in a narrative source, or a piece of text that opens one but does not read as one. */
export type FoundReference =
  | { reference: NarrativeReference; offset: number; end: number }
  | { problem: string; text: string; offset: number; end: number };

const CELL_ID = /^[A-Za-z][A-Za-z0-9_-]{0,63}/;

/**
 * Reads a reference starting at `start` (where `{=` is); undefined when no `{=` is there. The result's `end` is
 * the offset after the closing `}` (or, when there is a problem, where reading stopped, so that the rest of the
 * text reads as prose).
 */
export function readReference(text: string, start: number): FoundReference | undefined {
  if (!text.startsWith("{=", start)) return undefined;
  let i = start + 2;
  const fail = (problem: string): FoundReference => ({ problem, text: text.slice(start, Math.max(i, start + 2)), offset: start, end: Math.max(i, start + 2) });
  while (text[i] === " ") i++;
  const id = CELL_ID.exec(text.slice(i))?.[0];
  if (id === undefined) return fail("a reference starts with the id of a cell: {=CELL}, {=CELL/NAME} or {=CELL/ROW/COLUMN}");
  i += id.length;
  let output: number | undefined;
  if (text[i] === "#") {
    const n = /^#(\d{1,4})/.exec(text.slice(i));
    if (!n || Number(n[1]) < 1) return fail(`after "${id}#" comes the output number, 1 for the cell's first output`);
    output = Number(n[1]);
    i += n[0].length;
  }
  const path: string[] = [];
  for (;;) {
    while (text[i] === " ") i++;
    if (text[i] === "}") {
      i++;
      break;
    }
    if (text[i] !== "/") return fail(`expected "/" or "}" after ${path.length === 0 ? `the cell id "${id}"` : `"${path[path.length - 1]}"`}`);
    i++;
    while (text[i] === " ") i++;
    let segment = "";
    if (text[i] === '"') {
      i++;
      let closed = false;
      while (i < text.length && text[i] !== "\n") {
        const c = text[i]!;
        if (c === "\\" && (text[i + 1] === '"' || text[i + 1] === "\\")) {
          segment += text[i + 1];
          i += 2;
        } else if (c === '"') {
          i++;
          closed = true;
          break;
        } else {
          segment += c;
          i++;
        }
      }
      if (!closed) return fail("a quoted name is not closed: end it with \"");
    } else {
      while (i < text.length && !"/}\"\n".includes(text[i]!)) segment += text[i++];
      segment = segment.trim();
    }
    if (segment === "") return fail("a name between / and / or } is empty");
    path.push(segment);
    if (path.length > 2) return fail("a reference names at most a row and a column: {=CELL/ROW/COLUMN}");
  }
  const reference: NarrativeReference = { text: text.slice(start, i), cellId: id, path };
  if (output !== undefined) reference.output = output;
  return { reference, offset: start, end: i };
}

/**
 * Offsets of the narrative source that are code (fenced or indented code blocks and code spans), where `{=`
 * is shown as written and numbers are not prose. A light reading of CommonMark: fences of three or more
 * backticks or tildes, and backtick runs matched by a run of the same length on the same paragraph.
 */
export function codeRanges(source: string): [number, number][] {
  const ranges: [number, number][] = [];
  const lineStarts: number[] = [0];
  for (let i = 0; i < source.length; i++) if (source[i] === "\n") lineStarts.push(i + 1);
  let fence: { char: string; length: number; start: number } | undefined;
  for (const ls of lineStarts) {
    const nl = source.indexOf("\n", ls);
    const line = source.slice(ls, nl < 0 ? source.length : nl);
    const m = /^ {0,3}(`{3,}|~{3,})/.exec(line);
    if (fence) {
      if (m && m[1]![0] === fence.char && m[1]!.length >= fence.length && line.trim() === m[1]) {
        ranges.push([fence.start, nl < 0 ? source.length : nl]);
        fence = undefined;
      }
      continue;
    }
    if (m) fence = { char: m[1]![0]!, length: m[1]!.length, start: ls };
  }
  if (fence) ranges.push([fence.start, source.length]);
  const inBlock = (i: number) => ranges.some(([a, b]) => i >= a && i < b);
  const spans: [number, number][] = [];
  const tick = /`+/g;
  let open: { length: number; start: number } | undefined;
  for (const m of source.matchAll(tick)) {
    const at = m.index!;
    if (inBlock(at)) continue;
    if (open === undefined) open = { length: m[0].length, start: at };
    else if (m[0].length === open.length) {
      spans.push([open.start, at + m[0].length]);
      open = undefined;
    } else if (/\n\s*\n/.test(source.slice(open.start, at))) open = { length: m[0].length, start: at };
  }
  return [...ranges, ...spans].sort((a, b) => a[0] - b[0]);
}

/** Every reference (and every `{=` that does not read as one) in a narrative source, outside code. */
export function findReferences(source: string): FoundReference[] {
  const code = codeRanges(source);
  const found: FoundReference[] = [];
  let from = 0;
  for (;;) {
    const at = source.indexOf("{=", from);
    if (at < 0) break;
    const block = code.find(([a, b]) => at >= a && at < b);
    if (block) {
      from = block[1];
      continue;
    }
    const r = readReference(source, at)!;
    found.push(r);
    from = Math.max(r.end, at + 2);
  }
  return found;
}

/** The position in the file of an offset into a cell's source that starts at `sourceStart`. */
export function positionInSource(source: string, sourceStart: Position, offset: number): Position {
  const before = source.slice(0, offset);
  const lines = before.split("\n");
  if (lines.length === 1) return { line: sourceStart.line, column: sourceStart.column + offset };
  return { line: sourceStart.line + lines.length - 1, column: lines[lines.length - 1]!.length + 1 };
}

/** What a reference stands for: a number, its unit, and the uncertainty it is rounded by. */
export interface ResolvedReference {
  value: number;
  unit?: string;
  /** Standard uncertainty of the estimate the number belongs to (the row's), when there is one. */
  uncertainty?: number;
  /** True when the text shows "± uncertainty" (a whole estimate row was referenced). */
  showUncertainty: boolean;
  /** Where the number is, in words: `cell fit-leaky, output 1, row "T (transmissivity)", column "estimate"`. */
  where: string;
}

type Table = Extract<CellOutput, { type: "table" }>;

function rowMatches(first: unknown, key: string): boolean {
  if (typeof first !== "string") return false;
  const f = first.trim();
  return f === key || f.startsWith(`${key} (`) || f.endsWith(` ${key}`);
}

/**
 * The number a reference stands for in a set of outputs (by cell id), or a problem in words saying what is
 * missing and what would fix it.
 */
export function resolveReference(
  ref: NarrativeReference,
  outputsByCell: Readonly<Record<string, readonly CellOutput[]>>,
): { resolved: ResolvedReference } | { problem: string } {
  const all = outputsByCell[ref.cellId];
  if (all === undefined) return { problem: `there is no cell "${ref.cellId}" with outputs` };
  if (ref.output !== undefined && ref.output > all.length) {
    return { problem: `cell ${ref.cellId} has ${all.length} output${all.length === 1 ? "" : "s"}, not ${ref.output}` };
  }
  const indexed = all.map((o, i) => ({ o, i })).filter(({ i }) => ref.output === undefined || i === ref.output - 1);
  const at = (i: number) => `cell ${ref.cellId}, output ${i + 1}`;
  if (ref.path.length === 0) {
    const values = indexed.filter(({ o }) => o.type === "value" || o.type === "control");
    if (values.length !== 1) {
      return { problem: `cell ${ref.cellId} has ${values.length === 0 ? "no" : values.length} value outputs${ref.output ? ` at output ${ref.output}` : ""}; name one: {=${ref.cellId}/LABEL}` };
    }
    const { o, i } = values[0]!;
    const v = o as Extract<CellOutput, { type: "value" | "control" }>;
    return { resolved: { value: v.value, ...(v.unit ? { unit: v.unit } : {}), showUncertainty: false, where: at(i) } };
  }
  const key = ref.path[0]!;
  if (ref.path.length === 1) {
    for (const { o, i } of indexed) {
      if (o.type === "value" && o.label === key) return { resolved: { value: o.value, ...(o.unit ? { unit: o.unit } : {}), showUncertainty: false, where: `${at(i)} ("${key}")` } };
      if (o.type === "control" && o.name === key) return { resolved: { value: o.value, ...(o.unit ? { unit: o.unit } : {}), showUncertainty: false, where: `${at(i)} (control ${key})` } };
    }
  }
  const hits: { t: Table; i: number; r: number }[] = [];
  for (const { o, i } of indexed) {
    if (o.type !== "table") continue;
    o.rows.forEach((row, r) => {
      if (rowMatches(row[0], key)) hits.push({ t: o, i, r });
    });
  }
  if (hits.length === 0) return { problem: `cell ${ref.cellId} has no value labelled "${key}" and no table row "${key}"` };
  // Of rows in several tables, keep those whose table has the column asked for (or, with none named, estimates).
  if (new Set(hits.map((h) => h.i)).size > 1) {
    const fitting = hits.filter((h) => (ref.path.length === 2 ? h.t.columns.some((c) => c.name === ref.path[1]) : estimateColumns(h.t.columns) !== undefined));
    if (fitting.length > 0) hits.splice(0, hits.length, ...fitting);
  }
  const tables = new Set(hits.map((h) => h.i));
  if (hits.length > 1) {
    return {
      problem:
        tables.size > 1
          ? `"${key}" is a row in ${tables.size} tables of cell ${ref.cellId}; pick one with {=${ref.cellId}#N/...} (outputs ${[...tables].map((i) => i + 1).join(", ")})`
          : `"${key}" matches ${hits.length} rows of the table; write the row's first cell in full`,
    };
  }
  const { t, i, r } = hits[0]!;
  const row = t.rows[r]!;
  const roles = estimateColumns(t.columns);
  let column: number;
  if (ref.path.length === 2) {
    column = t.columns.findIndex((c) => c.name === ref.path[1]);
    if (column < 0) return { problem: `the table (${at(i)}) has no column "${ref.path[1]}"; its columns are ${t.columns.map((c) => `"${c.name}"`).join(", ")}` };
  } else if (roles) column = roles.estimate;
  else if (t.columns.length === 2) column = 1;
  else return { problem: `name the column of row "${key}": {=${ref.cellId}/${key}/COLUMN} (columns ${t.columns.map((c) => `"${c.name}"`).join(", ")})` };
  const value = row[column];
  if (typeof value !== "number") return { problem: `row "${key}", column "${t.columns[column]!.name}" of ${at(i)} holds ${value === null ? "no number" : `text, not a number`}` };
  const unitCell = roles?.unit === undefined ? undefined : row[roles.unit];
  const unit = t.columns[column]!.unit ?? (typeof unitCell === "string" ? unitCell : undefined);
  const uncertainty = roles ? rowUncertainty(row, roles) : undefined;
  const numeric = roles !== undefined && [roles.estimate, roles.standardError, roles.low, roles.high].includes(column);
  const resolved: ResolvedReference = {
    value,
    showUncertainty: ref.path.length === 1 && uncertainty !== undefined,
    where: `${at(i)}, row "${String(row[0])}", column "${t.columns[column]!.name}"`,
  };
  if (unit !== undefined) resolved.unit = unit;
  if (numeric && uncertainty !== undefined) resolved.uncertainty = uncertainty;
  return { resolved };
}

/** The text a resolved reference shows: by the same rounding rules as the report's tables. */
export function referenceText(r: ResolvedReference): string {
  if (r.showUncertainty && r.uncertainty !== undefined) return formatQuantity(r.value, r.unit, r.uncertainty);
  const place = r.uncertainty === undefined ? undefined : uncertaintyPlace(r.uncertainty);
  const number = place === undefined ? formatPlain(r.value) : formatAtPlace(r.value, place.exponent);
  const unit = typesetUnit(r.unit);
  return unit === "" ? number : `${number} ${unit}`;
}
