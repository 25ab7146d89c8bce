/**
 * Reading a table output as a table of estimates: which columns hold the estimate, its standard error, its
 * 95 % interval and a per-row unit, and the standard uncertainty of one row. Used by the report (to round each
 * row to its uncertainty) and by narrative references (to quote an estimate with the same rounding).
 */
import type { CellOutput } from "./types.js";

type Table = Extract<CellOutput, { type: "table" }>;
type Cell = Table["rows"][number][number];

/** Column indices of an estimate table; absent roles are undefined. */
export interface EstimateColumns {
  estimate: number;
  standardError?: number;
  low?: number;
  high?: number;
  /** A column of unit strings, one per row. */
  unit?: number;
  /** A column of notes in words (a parameter at a bound, not identifiable). */
  note?: number;
}

const names = {
  estimate: /^(estimate|value|fitted value)$/i,
  standardError: /^(standard error|std\.? error|se|±)$/i,
  low: /^95 ?% (low|lower)$/i,
  high: /^95 ?% (high|upper)$/i,
  unit: /^units?$/i,
  note: /^(note|status)$/i,
};

/** The roles of a table's columns, when it has an estimate column and at least one uncertainty column. */
export function estimateColumns(columns: Table["columns"]): EstimateColumns | undefined {
  const find = (re: RegExp): number | undefined => {
    const i = columns.findIndex((c) => re.test(c.name.trim()));
    return i < 0 ? undefined : i;
  };
  const estimate = find(names.estimate);
  if (estimate === undefined) return undefined;
  const roles: EstimateColumns = { estimate };
  const se = find(names.standardError);
  const low = find(names.low);
  const high = find(names.high);
  const unit = find(names.unit);
  const note = find(names.note);
  if (se !== undefined) roles.standardError = se;
  if (low !== undefined) roles.low = low;
  if (high !== undefined) roles.high = high;
  if (unit !== undefined) roles.unit = unit;
  if (note !== undefined) roles.note = note;
  return se === undefined && (low === undefined || high === undefined) ? undefined : roles;
}

const finite = (v: Cell | undefined): v is number => typeof v === "number" && Number.isFinite(v);

/**
 * The standard uncertainty of one row: its standard error when that is a positive number, otherwise a quarter
 * of the width of its 95 % interval (about the standard error for many degrees of freedom, where the interval
 * is ±1.96 of it); undefined when the row has neither.
 */
export function rowUncertainty(row: readonly Cell[], roles: EstimateColumns): number | undefined {
  const se = roles.standardError === undefined ? undefined : row[roles.standardError];
  if (finite(se) && se > 0) return se;
  const low = roles.low === undefined ? undefined : row[roles.low];
  const high = roles.high === undefined ? undefined : row[roles.high];
  if (finite(low) && finite(high) && high > low) return (high - low) / 4;
  return undefined;
}

/**
 * Why a row's estimate is not constrained by the data, in words, or undefined when it is: the note column's
 * text when there is one; a standard error at least as large as the estimate; or an interval with a side
 * missing although the estimate is there.
 */
export function unconstrainedReason(row: readonly Cell[], roles: EstimateColumns): string | undefined {
  const note = roles.note === undefined ? undefined : row[roles.note];
  if (typeof note === "string" && note.trim() !== "") return note.trim();
  const estimate = row[roles.estimate];
  if (!finite(estimate)) return undefined;
  const se = roles.standardError === undefined ? undefined : row[roles.standardError];
  if (finite(se) && se >= Math.abs(estimate) && estimate !== 0) return "not constrained by the data: the standard error is as large as the estimate";
  const low = roles.low === undefined ? undefined : row[roles.low];
  const high = roles.high === undefined ? undefined : row[roles.high];
  const hasSe = finite(se);
  if (hasSe && roles.low !== undefined && roles.high !== undefined && (!finite(low) || !finite(high))) {
    return "not constrained by the data: the 95 % interval has no finite bound on one side";
  }
  return undefined;
}
