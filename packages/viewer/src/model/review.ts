/**
 * The review view, DOM-free: a fresh run of the whole document compared with its recorded outputs by the very
 * functions `conebook verify` uses (the kernel's `compareOutputs` with DEFAULT_RTOL, and `referenceProblems` for
 * narrative references), judged cell by cell, with a summary; and "what moves": the headline numbers of two runs
 * (values, controls, estimates of fit tables) side by side, for a reviewer who changes a control or a window and
 * wants to see which results changed and by how much, without saving.
 */
import { estimateColumns, type CellOutput, type ConebookDocument } from "@conebook/document";
import { DEFAULT_RTOL, compareOutputs, numbersAgree, recordedOutputs, referenceProblems, type OutputDifference, type PinCheck, type ReferenceProblem } from "@conebook/kernel";

/** How one executable cell came out of the rerun. */
export type ReviewCellStatus = "reproduced" | "differs" | "failed" | "unrecorded";

/** The review of one cell. */
export interface CellReview {
  status: ReviewCellStatus;
  differences: OutputDifference[];
  recorded: readonly CellOutput[];
  fresh: readonly CellOutput[];
}

/** A whole review. */
export interface Review {
  cells: Map<string, CellReview>;
  references: ReferenceProblem[];
  /** Pinned data files whose bytes changed or cannot be read: nothing was rerun then. */
  pins: PinCheck[];
  /** One sentence: all reproduced, N cells differ, a pinned file changed. */
  summary: string;
  tone: "ok" | "error";
  rtol: number;
}

/**
 * Reviews `fresh` (the outputs of a fresh run of `doc` with its recorded settings) against the outputs recorded
 * in `doc`. `pins` are the pin checks of its data files; with a changed or unreadable file the review says so and
 * judges no cell, as verify refuses to.
 */
export function reviewRun(doc: ConebookDocument, fresh: Readonly<Record<string, CellOutput[]>>, pins: readonly PinCheck[], rtol = DEFAULT_RTOL): Review {
  const badPins = pins.filter((p) => p.status !== "ok");
  if (badPins.length > 0) {
    return {
      cells: new Map(),
      references: [],
      pins: badPins,
      summary: `A pinned data file changed or cannot be read (${badPins.map((p) => p.path).join(", ")}): the recorded outputs no longer describe the data, so nothing was compared`,
      tone: "error",
      rtol,
    };
  }
  const recorded = recordedOutputs(doc);
  const diffs = compareOutputs(recorded, fresh, { rtol });
  const cells = new Map<string, CellReview>();
  for (const cell of doc.cells) {
    if (cell.kind === "narrative") continue;
    const differences = diffs.filter((d) => d.cellId === cell.id);
    const now = fresh[cell.id] ?? [];
    const failed = now.some((o) => o.type === "error");
    const status: ReviewCellStatus = cell.outputs.length === 0 && now.length > 0 ? "unrecorded" : failed && differences.length > 0 ? "failed" : differences.length > 0 ? "differs" : "reproduced";
    cells.set(cell.id, { status, differences, recorded: cell.outputs, fresh: now });
  }
  const references = referenceProblems(doc, fresh, recorded, { rtol, atol: 0 });
  const differing = [...cells.values()].filter((c) => c.status !== "reproduced").length;
  const parts: string[] = [];
  if (differing > 0) parts.push(`${differing} of ${cells.size} cells differ from the record`);
  if (references.length > 0) parts.push(`${references.length} narrative reference${references.length === 1 ? "" : "s"} fail${references.length === 1 ? "s" : ""}`);
  return {
    cells,
    references,
    pins: [],
    summary: parts.length === 0 ? `All ${cells.size} cells reproduced their recorded outputs (rtol ${rtol}, as conebook verify)` : `${parts.join("; ")} (rtol ${rtol}, as conebook verify)`,
    tone: parts.length === 0 ? "ok" : "error",
    rtol,
  };
}

/** The places of a table output that differ, as `row,column` keys (0-based), from a cell's differences. */
export function differingTableCells(differences: readonly OutputDifference[], outputIndex: number): Map<string, OutputDifference> {
  const out = new Map<string, OutputDifference>();
  const re = new RegExp(`^\\[${outputIndex}\\]\\.rows\\[(\\d+)\\]\\[(\\d+)\\]$`);
  for (const d of differences) {
    const m = re.exec(d.path);
    if (m) out.set(`${m[1]},${m[2]}`, d);
  }
  return out;
}

/** True when a difference concerns output `index` (any place inside it). */
export function concernsOutput(d: OutputDifference, index: number): boolean {
  return d.path === `[${index}]` || d.path.startsWith(`[${index}].`) || d.path.startsWith(`[${index}][`);
}

/** Tables of at most this many rows count each of their numbers as a headline (larger ones are records or listings). */
export const SMALL_TABLE_ROWS = 12;

/** One headline number of a run. */
export interface Headline {
  /** Key across runs: cell, output, and row and column by position (row labels repeat, e.g. one row per well and model). */
  key: string;
  cellId: string;
  label: string;
  unit: string;
  value: number;
}

/**
 * The headline numbers of a run's outputs, in document order: every value output (by its label), every control
 * (its value), the estimate of every row of a table of estimates (a fit table: an estimate column beside an
 * uncertainty column), and every number of any other table of at most SMALL_TABLE_ROWS rows (a forecast, a
 * comparison of models).
 */
export function headlineNumbers(doc: ConebookDocument, outputs: Readonly<Record<string, readonly CellOutput[]>>): Headline[] {
  const out: Headline[] = [];
  for (const cell of doc.cells) {
    const list = outputs[cell.id];
    if (!list) continue;
    list.forEach((o, i) => {
      if (o.type === "value") out.push({ key: `${cell.id}#${i}`, cellId: cell.id, label: o.label ?? `value ${i + 1}`, unit: o.unit ?? "", value: o.value });
      else if (o.type === "control") out.push({ key: `${cell.id}#${i}`, cellId: cell.id, label: `control ${o.name}`, unit: o.unit ?? "", value: o.value });
      else if (o.type === "table") {
        const roles = estimateColumns(o.columns);
        if (!roles) {
          // A small table of results (a forecast, a comparison): each of its numbers, by row and column.
          if (o.rows.length > SMALL_TABLE_ROWS) return;
          o.rows.forEach((row, r) => {
            const name = typeof row[0] === "string" ? row[0] : `row ${r + 1}`;
            row.forEach((v, c) => {
              if (typeof v !== "number" || c === 0) return;
              const col = o.columns[c]!;
              out.push({ key: `${cell.id}#${i}/${r}/${c}`, cellId: cell.id, label: `${o.title ? `${o.title}: ` : ""}${name}, ${col.name}`, unit: col.unit ?? "", value: v });
            });
          });
          return;
        }
        o.rows.forEach((row, r) => {
          const v = row[roles.estimate];
          if (typeof v !== "number") return;
          const name = String(row[0] ?? `row ${r + 1}`);
          const unit = roles.unit !== undefined ? String(row[roles.unit] ?? "") : (o.columns[roles.estimate]!.unit ?? "");
          out.push({ key: `${cell.id}#${i}/${r}`, cellId: cell.id, label: `${o.title ? `${o.title}: ` : ""}${name}`, unit, value: v });
        });
      }
    });
  }
  return out;
}

/** One row of "what moves". */
export interface Movement {
  cellId: string;
  label: string;
  unit: string;
  before: number | undefined;
  after: number | undefined;
  /** after / before - 1 (undefined when either is missing or before is 0). */
  change: number | undefined;
}

/** The headline numbers that changed from `before` to `after` beyond `rtol`, and how many stayed. */
export function whatMoves(before: readonly Headline[], after: readonly Headline[], rtol = DEFAULT_RTOL): { moved: Movement[]; unchanged: number } {
  const then = new Map(before.map((h) => [h.key, h]));
  const now = new Map(after.map((h) => [h.key, h]));
  const moved: Movement[] = [];
  let unchanged = 0;
  for (const h of after) {
    const b = then.get(h.key);
    if (b && numbersAgree(b.value, h.value, rtol, 0)) {
      unchanged++;
      continue;
    }
    moved.push({ cellId: h.cellId, label: h.label, unit: h.unit, before: b?.value, after: h.value, change: b && b.value !== 0 ? h.value / b.value - 1 : undefined });
  }
  for (const b of before) if (!now.has(b.key)) moved.push({ cellId: b.cellId, label: b.label, unit: b.unit, before: b.value, after: undefined, change: undefined });
  return { moved, unchanged };
}

