/**
 * Data windows, DOM-free: the readings an analyst leaves out of fits, derivatives and diagnostics (early
 * well-bore storage, a pump stop, a logger reset), each range with its reason. They live in the document as data
 * in one code cell (id `data-windows`) that also defines `windowMask(record)`, so that every cell after it (a
 * kept match, a fit the author writes) can use them and `conebook verify` reruns them. The page reads the data
 * back from that cell's text, and writes the cell through a transaction, so undo works as for any edit.
 *
 * The rule, the same in the page (`windowMask` here) and in the cell: a reading at time t (d) is left out when
 * some window of its record has from <= t * f <= to, with f converting d to the windows' time unit and a relative
 * allowance of 1e-9 at both ends (the ends are written to 10 significant digits).
 */
import { convert } from "@conebook/aquifer";
import type { Cell, CodeCell, ConebookDocument } from "@conebook/document";

/** The id of the cell that holds the data windows. */
export const WINDOWS_CELL_ID = "data-windows";

/** One range of readings left out, ends included, in the windows' time unit. */
export interface WindowRange {
  from: number;
  to: number;
  reason: string;
}

/** The data windows of a document. */
export interface WindowSet {
  /** Unit of every `from` and `to` (a time unit of the aquifer unit tables). */
  timeUnit: string;
  /** The ranges left out, by record name. */
  records: Record<string, WindowRange[]>;
}

/** Relative allowance at the ends of a window (its ends are written to 10 significant digits). */
export const WINDOW_END_ALLOWANCE = 1e-9;

/** Reasons offered for leaving readings out (an analyst may type any other). */
export const COMMON_REASONS = ["well-bore storage", "pump stopped", "logger reset", "rate change", "outlier", "boundary effect"] as const;

/** An empty set in `timeUnit`. */
export function emptyWindows(timeUnit = "min"): WindowSet {
  return { timeUnit, records: {} };
}

/** One true or false per reading (times in d): false where a window of the record's name leaves it out. */
export function windowMask(set: WindowSet | undefined, name: string, t: ArrayLike<number>): boolean[] {
  const list = set && Object.hasOwn(set.records, name) ? set.records[name]! : [];
  if (list.length === 0) return Array.from(t, () => true);
  const f = convert(1, "d", set!.timeUnit);
  return Array.from(t, (ti) => !list.some((w) => ti * f >= w.from * (1 - WINDOW_END_ALLOWANCE) && ti * f <= w.to * (1 + WINDOW_END_ALLOWANCE)));
}

/** Why each reading is left out: the reason of the first window that covers it, "" where it is used. */
export function windowReasons(set: WindowSet | undefined, name: string, t: ArrayLike<number>): string[] {
  const list = set && Object.hasOwn(set.records, name) ? set.records[name]! : [];
  if (list.length === 0) return Array.from(t, () => "");
  const f = convert(1, "d", set!.timeUnit);
  return Array.from(t, (ti) => list.find((w) => ti * f >= w.from * (1 - WINDOW_END_ALLOWANCE) && ti * f <= w.to * (1 + WINDOW_END_ALLOWANCE))?.reason ?? "");
}

/** A time (d) in the windows' unit, at 10 significant digits. */
export function windowEnd(set: WindowSet, tDays: number): number {
  return Number((tDays * convert(1, "d", set.timeUnit)).toPrecision(10));
}

/** The set with `range` added for record `name`. */
export function withWindow(set: WindowSet, name: string, range: WindowRange): WindowSet {
  const list = Object.hasOwn(set.records, name) ? set.records[name]! : [];
  return { ...set, records: { ...set.records, [name]: [...list, range].sort((a, b) => a.from - b.from) } };
}

/** The set without the `index`-th window of record `name`. */
export function withoutWindow(set: WindowSet, name: string, index: number): WindowSet {
  const list = (Object.hasOwn(set.records, name) ? set.records[name]! : []).filter((_, i) => i !== index);
  const records = { ...set.records };
  if (list.length === 0) delete records[name];
  else records[name] = list;
  return { ...set, records };
}

const DATA = /^const dataWindows = (\{[\s\S]*?\n\});$/m;

/** The cell's source text for `set`: the data as JSON, the function `windowMask` and a table of what is left out. */
export function windowsCellSource(set: WindowSet): string {
  const records = Object.entries(set.records);
  const data = [
    "{",
    `  "timeUnit": ${JSON.stringify(set.timeUnit)},`,
    `  "records": {${records.length === 0 ? "}" : ""}`,
    ...records.map(
      ([name, list], i) =>
        `    ${JSON.stringify(name)}: [\n${list.map((w) => `      { "from": ${w.from}, "to": ${w.to}, "reason": ${JSON.stringify(w.reason)} }`).join(",\n")}\n    ]${i < records.length - 1 ? "," : ""}`,
    ),
    ...(records.length === 0 ? [] : ["  }"]),
    "}",
  ].join("\n");
  const unit = JSON.stringify(set.timeUnit);
  return [
    "// Data windows: readings left out of fits, derivatives and diagnostics, each range with its reason, marked in",
    `// the workbench. Times in ${set.timeUnit} since pumping started; a window leaves out every reading from "from"`,
    "// to \"to\", both ends included (written to 10 significant digits, so they are met within 1e-9).",
    `const dataWindows = ${data};`,
    "/** One true or false per reading of `record` (an observation record, times in d): false where a window leaves it out. */",
    "function windowMask(record) {",
    "  const list = Object.hasOwn(dataWindows.records, record.name) ? dataWindows.records[record.name] : [];",
    "  const f = aq.convert(1, \"d\", dataWindows.timeUnit);",
    "  return Array.from(record.t, (t) => !list.some((w) => t * f >= w.from * (1 - 1e-9) && t * f <= w.to * (1 + 1e-9)));",
    "}",
    "show.table(",
    "  Object.entries(dataWindows.records).flatMap(([name, list]) => list.map((w) => ({ record: name, from: w.from, to: w.to, reason: w.reason }))),",
    `  { title: "Data windows: readings left out of the analysis", units: { from: ${unit}, to: ${unit} } },`,
    ");",
  ].join("\n");
}

/** The outcome of reading the windows from a document. */
export type WindowsReading = { set: WindowSet; cell: CodeCell | undefined } | { problem: string; cell: CodeCell };

/** The data windows of `doc`: from its `data-windows` cell, an empty set when it has none. */
export function readWindows(doc: ConebookDocument): WindowsReading {
  const cell = doc.cells.find((c): c is CodeCell => c.id === WINDOWS_CELL_ID && c.kind === "code");
  if (!cell) return { set: emptyWindows(), cell: undefined };
  const m = DATA.exec(cell.source);
  if (!m) return { problem: `cell ${WINDOWS_CELL_ID} no longer holds "const dataWindows = {...};" as the workbench wrote it; edit the windows in the cell's code`, cell };
  try {
    const raw = JSON.parse(m[1]!) as { timeUnit?: unknown; records?: unknown };
    if (typeof raw.timeUnit !== "string" || raw.records === null || typeof raw.records !== "object") throw new Error("it needs timeUnit and records");
    const records: Record<string, WindowRange[]> = {};
    for (const [name, list] of Object.entries(raw.records as Record<string, unknown>)) {
      if (!Array.isArray(list)) throw new Error(`the windows of ${name} are not a list`);
      records[name] = list.map((w: { from?: unknown; to?: unknown; reason?: unknown }) => {
        if (typeof w.from !== "number" || typeof w.to !== "number" || typeof w.reason !== "string") throw new Error(`a window of ${name} needs from, to and reason`);
        return { from: w.from, to: w.to, reason: w.reason };
      });
    }
    return { set: { timeUnit: raw.timeUnit, records }, cell };
  } catch (e) {
    return { problem: `the data of cell ${WINDOWS_CELL_ID} does not read as JSON (${(e as Error).message}); edit the windows in the cell's code`, cell };
  }
}

/** The windows cell for `set`, replacing `existing` (keeping its id) or new. */
export function windowsCell(set: WindowSet, existing: CodeCell | undefined): Cell {
  const source = windowsCellSource(set);
  if (existing) return { ...existing, source };
  return { kind: "code", language: "ts", id: WINDOWS_CELL_ID, source, sourceStart: { line: 1, column: 1 }, outputs: [] };
}
