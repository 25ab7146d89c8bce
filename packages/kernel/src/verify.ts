/**
 * Verifying a document: comparing the outputs recorded in the file with the outputs of a fresh run, and
 * checking the data files a document pins against their SHA-256. Pure functions over plain data; no Node APIs
 * (files are read through a ReadFile the caller supplies).
 *
 * Rules of the comparison, per output:
 *   numbers      equal within a relative tolerance: |a - b| <= rtol * max(|a|, |b|) + atol
 *   strings      exact (labels, units, text outputs, table cells that are text, error messages)
 *   null         only equal to null (non-finite numbers are recorded as null)
 *   tables       cell by cell, so each difference names its row and column
 *   charts       the Vega-Lite spec with its inline data, value by value; the summary is derived from the spec
 *                and is not compared separately
 *   kinds        an output of another type (for example an error where a value was recorded) is one difference
 */
import { describeUtf8Problem, utf8Problem } from "@conebook/document";
import type { CellOutput, ConebookDocument } from "@conebook/document";
import { hashedBytes, type HashedBytes, type ReadFile } from "./data-cells.js";

/**
 * Default relative tolerance of `compareOutputs`. Arithmetic inside the sandbox is bit-identical on every host
 * (QuickJS carries its own libm), but the aquifer functions behind the bridge run on the host engine, whose
 * Math.exp, log, pow and sin differ in the last bit between engines (Node 20 against Chromium 156: at most
 * 6.2e-12 relative in the demo's residuals, measured by tests/browser/kernel-in-worker.test.ts). Runs on one
 * host agree bit for bit; the tolerance covers other hosts and library changes that reorder floating-point
 * work. Rounding of double precision (2.2e-16 per operation) accumulated over a million operations stays below
 * about 1e-10, while no field measurement behind an aquifer parameter is better than about 1e-4; 1e-9 sits
 * between the two.
 */
export const DEFAULT_RTOL = 1e-9;

/** Tolerances of a comparison. */
export interface CompareOptions {
  /** Relative tolerance for numbers (dimensionless); default DEFAULT_RTOL. */
  rtol?: number;
  /** Absolute tolerance for numbers, in the numbers' own units; default 0 (only exact zeros match zero). */
  atol?: number;
}

/** What kind of difference was found. */
export type DifferenceKind =
  | "number" // two numbers outside the tolerance
  | "text" // two strings that are not identical
  | "type" // values of different JSON types, or outputs of different output types
  | "error" // the fresh run produced an error where the record has something else
  | "missing" // recorded, but the fresh run has nothing at this place
  | "extra"; // the fresh run has something the record does not

/** One place where recorded and fresh outputs disagree. */
export interface OutputDifference {
  cellId: string;
  /** Where inside the cell's outputs, as a JSON path from the outputs list: `[1].value`, `[0].rows[3][2]`. */
  path: string;
  kind: DifferenceKind;
  /** The recorded value at `path` (undefined when missing). */
  recorded: unknown;
  /** The fresh value at `path` (undefined when missing). */
  fresh: unknown;
  /** Extra words for a reader: a table's column name, the relative difference of two numbers, an error's place. */
  note?: string;
}

/** True when two numbers agree within `rtol` (relative) and `atol` (absolute). */
export function numbersAgree(a: number, b: number, rtol: number, atol = 0): boolean {
  if (a === b) return true;
  if (!Number.isFinite(a) || !Number.isFinite(b)) return false;
  return Math.abs(a - b) <= rtol * Math.max(Math.abs(a), Math.abs(b)) + atol;
}

/** The relative difference |a - b| / max(|a|, |b|) of two numbers (0 when both are 0). */
export function relativeDifference(a: number, b: number): number {
  const scale = Math.max(Math.abs(a), Math.abs(b));
  return scale === 0 ? 0 : Math.abs(a - b) / scale;
}

const IDENTIFIER = /^[A-Za-z_$][A-Za-z0-9_$]*$/;

function childPath(path: string, key: string | number): string {
  if (typeof key === "number") return `${path}[${key}]`;
  return IDENTIFIER.test(key) ? `${path}.${key}` : `${path}[${JSON.stringify(key)}]`;
}

function jsonType(v: unknown): string {
  if (v === null) return "null";
  if (Array.isArray(v)) return "array";
  return typeof v;
}

interface Context {
  cellId: string;
  rtol: number;
  atol: number;
  out: OutputDifference[];
}

function push(ctx: Context, path: string, kind: DifferenceKind, recorded: unknown, fresh: unknown, note?: string): void {
  const d: OutputDifference = { cellId: ctx.cellId, path, kind, recorded, fresh };
  if (note !== undefined) d.note = note;
  ctx.out.push(d);
}

/** Compares two JSON values, depth first, recording every difference below `path`. */
function compareValues(ctx: Context, path: string, recorded: unknown, fresh: unknown): void {
  const tr = jsonType(recorded);
  const tf = jsonType(fresh);
  if (tr === "undefined" && tf === "undefined") return;
  if (tr === "undefined") return push(ctx, path, "extra", undefined, fresh);
  if (tf === "undefined") return push(ctx, path, "missing", recorded, undefined);
  if (tr !== tf) return push(ctx, path, "type", recorded, fresh, `recorded ${tr}, now ${tf}`);
  switch (tr) {
    case "number": {
      const a = recorded as number;
      const b = fresh as number;
      if (!numbersAgree(a, b, ctx.rtol, ctx.atol)) {
        push(ctx, path, "number", a, b, `relative difference ${relativeDifference(a, b).toExponential(2)}`);
      }
      return;
    }
    case "string":
      if (recorded !== fresh) push(ctx, path, "text", recorded, fresh);
      return;
    case "array": {
      const a = recorded as unknown[];
      const b = fresh as unknown[];
      const n = Math.max(a.length, b.length);
      for (let i = 0; i < n; i++) compareValues(ctx, childPath(path, i), a[i], b[i]);
      return;
    }
    case "object": {
      const a = recorded as Record<string, unknown>;
      const b = fresh as Record<string, unknown>;
      const keys = [...Object.keys(a), ...Object.keys(b).filter((k) => !Object.hasOwn(a, k))];
      for (const k of keys) compareValues(ctx, childPath(path, k), a[k], b[k]);
      return;
    }
    default:
      if (recorded !== fresh) push(ctx, path, "type", recorded, fresh);
  }
}

function errorPlace(o: Extract<CellOutput, { type: "error" }>): string {
  if (o.line === undefined) return o.message;
  return `line ${o.line}${o.column === undefined ? "" : `, column ${o.column}`}: ${o.message}`;
}

/** Compares one output with its recorded counterpart. */
function compareOutput(ctx: Context, index: number, recorded: CellOutput | undefined, fresh: CellOutput | undefined): void {
  const path = `[${index}]`;
  if (recorded === undefined) {
    if (fresh?.type === "error") return push(ctx, path, "error", undefined, fresh, `the cell now fails at ${errorPlace(fresh)}`);
    return push(ctx, path, "extra", undefined, fresh);
  }
  if (fresh === undefined) return push(ctx, path, "missing", recorded, undefined);
  if (recorded.type !== fresh.type) {
    if (fresh.type === "error") return push(ctx, path, "error", recorded, fresh, `the cell now fails at ${errorPlace(fresh)}`);
    return push(ctx, path, "type", recorded, fresh, `recorded a ${recorded.type} output, now a ${fresh.type} output`);
  }
  if (recorded.type === "chart" && fresh.type === "chart") {
    compareValues(ctx, `${path}.spec`, recorded.spec, fresh.spec);
    return;
  }
  const start = ctx.out.length;
  compareValues(ctx, path, recorded, fresh);
  if (recorded.type === "table") nameTableColumns(ctx.out.slice(start), index, recorded);
}

const ROW_CELL = /^\[(\d+)\]\.rows\[(\d+)\]\[(\d+)\]$/;

/** Adds the row number and column name (with unit) to differences inside a table's rows. */
function nameTableColumns(diffs: OutputDifference[], index: number, table: Extract<CellOutput, { type: "table" }>): void {
  for (const d of diffs) {
    const m = ROW_CELL.exec(d.path);
    if (!m || Number(m[1]) !== index) continue;
    const column = table.columns[Number(m[3])];
    const where = `row ${Number(m[2]) + 1}, column ${JSON.stringify(column?.name ?? m[3])}${column?.unit ? ` (${column.unit})` : ""}`;
    d.note = d.note === undefined ? where : `${where}, ${d.note}`;
  }
}

/**
 * Every difference between recorded and fresh outputs, cell by cell in the order of `fresh` (then cells only
 * recorded). Both arguments map cell ids to output lists, as `RunResult.outputs` does. Cost: linear in the size
 * of the outputs.
 */
export function compareOutputs(
  recorded: Record<string, readonly CellOutput[]>,
  fresh: Record<string, readonly CellOutput[]>,
  options: CompareOptions = {},
): OutputDifference[] {
  const rtol = options.rtol ?? DEFAULT_RTOL;
  const atol = options.atol ?? 0;
  if (!(rtol >= 0) || !(atol >= 0)) throw new RangeError(`tolerances must be numbers >= 0, got rtol ${rtol} and atol ${atol}`);
  const out: OutputDifference[] = [];
  const ids = [...Object.keys(fresh), ...Object.keys(recorded).filter((id) => !Object.hasOwn(fresh, id))];
  for (const cellId of ids) {
    const ctx: Context = { cellId, rtol, atol, out };
    const r = recorded[cellId] ?? [];
    const f = fresh[cellId] ?? [];
    const n = Math.max(r.length, f.length);
    for (let i = 0; i < n; i++) compareOutput(ctx, i, r[i], f[i]);
  }
  return out;
}

/** The outputs recorded in a document, by cell id, for its code, data and chart cells. */
export function recordedOutputs(doc: ConebookDocument): Record<string, CellOutput[]> {
  const out: Record<string, CellOutput[]> = {};
  for (const cell of doc.cells) if (cell.kind !== "narrative") out[cell.id] = cell.outputs;
  return out;
}

/** What was found when a pinned data file was checked. */
export interface PinCheck {
  cellId: string;
  /** The data set's name. */
  name: string;
  /** The file's path relative to the document. */
  path: string;
  /** File line of the data cell's fence. */
  line: number;
  /** The SHA-256 the document pins (lowercase hex). */
  pinned: string;
  /** The SHA-256 of the file's bytes now; undefined when it could not be read. */
  actual?: string;
  /** "not-utf8": the bytes match the pin but are not UTF-8 text (`reason` says where). */
  status: "ok" | "changed" | "unreadable" | "not-utf8";
  /** Why the file could not be read, or where it stops being UTF-8. */
  reason?: string;
}

/**
 * Reads every data file the document pins and compares its SHA-256 (FIPS 180-4, the platform's implementation
 * unless the reader returns the digest with the bytes) with the pin.
 */
export async function checkDataPins(doc: ConebookDocument, readFile: ReadFile): Promise<PinCheck[]> {
  const checks: PinCheck[] = [];
  for (const cell of doc.cells) {
    if (cell.kind !== "data" || !cell.file) continue;
    const base = {
      cellId: cell.id,
      name: cell.name,
      path: cell.file.path,
      line: (cell.origin?.start ?? cell.sourceStart).line,
      pinned: cell.file.sha256.toLowerCase(),
    };
    let read: HashedBytes;
    try {
      read = await hashedBytes(await readFile(cell.file.path));
    } catch (e) {
      checks.push({ ...base, status: "unreadable", reason: e instanceof Error ? e.message : String(e) });
      continue;
    }
    const actual = read.sha256;
    const problem = actual === base.pinned ? utf8Problem(read.bytes) : undefined;
    if (problem) checks.push({ ...base, actual, status: "not-utf8", reason: describeUtf8Problem(problem) });
    else checks.push({ ...base, actual, status: actual === base.pinned ? "ok" : "changed" });
  }
  return checks;
}
