/**
 * Problems found while importing an observation CSV, and the error that carries them. Each problem says
 * where (row = 1-based line of the file, column = header name and 1-based index), what is wrong, and what
 * would fix it.
 */

/** Kinds of import problem, as a closed set of string codes. */
export const CsvProblemCode = {
  invalidOption: "invalid-option",
  separatorUnknown: "separator-unknown",
  syntax: "syntax",
  noHeader: "no-header",
  columnNotFound: "column-not-found",
  ambiguousColumn: "ambiguous-column",
  raggedRow: "ragged-row",
  noData: "no-data",
  nonNumeric: "non-numeric",
  badTimestamp: "bad-timestamp",
  missingUtcOffset: "missing-utc-offset",
  missingValue: "missing-value",
  negativeTime: "negative-time",
  duplicateTime: "duplicate-time",
  outOfOrder: "out-of-order",
  looksLikeHead: "looks-like-head",
  looksLikeDepthToWater: "looks-like-depth-to-water",
  negativeDrawdown: "negative-drawdown",
} as const;
export type CsvProblemCode = (typeof CsvProblemCode)[keyof typeof CsvProblemCode];

/** A column of the CSV, named as the header names it. */
export interface CsvColumnRef {
  /** Header text of the column. */
  readonly name: string;
  /** 1-based position of the column in the header. */
  readonly index: number;
}

/** One thing wrong with an import, with its place in the file and a fix. */
export interface CsvProblem {
  readonly code: CsvProblemCode;
  /** 1-based line of the file where the offending record starts; absent for problems of a whole column or option. */
  readonly row?: number;
  /** Column concerned; absent for problems of a whole record or option. */
  readonly column?: CsvColumnRef;
  /** Full sentence starting with the location, e.g. "row 7, column 'drawdown' (2): 'x' is not a number". */
  readonly message: string;
  /** What the user can do about it. */
  readonly fix: string;
}

/** Formats a location prefix: "row 7, column 'drawdown' (2)", "row 7", "column 'drawdown' (2)" or "". */
export function describeLocation(row: number | undefined, column: CsvColumnRef | undefined): string {
  const parts: string[] = [];
  if (row !== undefined) parts.push(`row ${row}`);
  if (column !== undefined) parts.push(`column '${column.name}' (${column.index})`);
  return parts.join(", ");
}

/** Builds a problem whose message starts with its location. */
export function makeProblem(
  code: CsvProblemCode,
  where: { row?: number; column?: CsvColumnRef },
  what: string,
  fix: string,
): CsvProblem {
  const location = describeLocation(where.row, where.column);
  const message = location === "" ? what : `${location}: ${what}`;
  const problem: { -readonly [K in keyof CsvProblem]: CsvProblem[K] } = { code, message, fix };
  if (where.row !== undefined) problem.row = where.row;
  if (where.column !== undefined) problem.column = where.column;
  return problem;
}

/** How many problems the error message lists before summarising the rest. */
const LISTED_PROBLEMS = 20;

/**
 * Thrown by the CSV importer when the file cannot be turned into a series as asked. `problems` holds
 * every problem found (not only the first); the message lists the first 20 with their fixes.
 */
export class CsvError extends Error {
  override readonly name = "CsvError";
  readonly problems: readonly CsvProblem[];

  constructor(problems: readonly CsvProblem[]) {
    const listed = problems.slice(0, LISTED_PROBLEMS).map((p) => `- ${p.message}. Fix: ${p.fix}.`);
    const more = problems.length > LISTED_PROBLEMS ? [`- and ${problems.length - LISTED_PROBLEMS} more problems`] : [];
    const count = problems.length === 1 ? "1 problem" : `${problems.length} problems`;
    super([`The observation CSV could not be imported (${count}):`, ...listed, ...more].join("\n"));
    this.problems = problems;
  }
}
