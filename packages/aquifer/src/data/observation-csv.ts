/**
 * Importing one observation series from CSV text: one time column and one level column chosen by header.
 *
 * Pipeline: options checked -> header line located, separator detected -> records read (RFC 4180,
 * csv-records.ts) -> columns found -> each row read (numbers, timestamps, missing markers) -> rows before
 * the start of pumping and rows with missing readings refused or excluded -> time order checked or sorted,
 * duplicates refused -> drawdowns computed -> the column's kind checked -> readings at t = 0 excluded ->
 * series built. Every problem is collected (not only the first) and thrown as one CsvError; every remedy
 * applied is listed in the returned notes, and every reading left out is in `series.excluded` with its reason.
 *
 * Readings at t = 0: the start of pumping, where drawdown is 0 by definition; they are kept out of the
 * series (which holds only t > 0, see series.ts) and listed in `excluded`. A non-zero drawdown at t = 0 is
 * excluded the same way, with a note that the static level or pumping start may be off.
 */

import { convert } from "../units/index.js";
import { CsvError, CsvProblemCode, describeLocation, makeProblem } from "./csv-problems.js";
import type { CsvColumnRef, CsvProblem } from "./csv-problems.js";
import { detectSeparator, offsetOfLine, scanCsvRecords } from "./csv-records.js";
import type { CsvSeparator } from "./csv-records.js";
import { decimalMarksIn, readDecimal } from "./decimal-numbers.js";
import { TIMESTAMP_FORM, instantMs, readIsoTimestamp, readUtcOffset } from "./iso-timestamp.js";
import type { IsoTimestamp } from "./iso-timestamp.js";
import { judgeLevelKind } from "./level-kind-check.js";
import { drawdownFromDepthToWater, drawdownFromHead } from "./levels.js";
import type { LevelKind, ObservationCsvImport, ObservationCsvOptions } from "./observation-csv-options.js";
import { SeriesError, createObservationSeries } from "./series.js";
import type { ExcludedPoint } from "./series.js";
import { checkUnit } from "./unit-checks.js";

const DEFAULT_MISSING_MARKERS = ["", "NA", "N/A", "NaN", "null", "-"];
const SEPARATOR_NAMES: Record<CsvSeparator, string> = { ",": "comma", ";": "semicolon", "\t": "tab" };

/** What a host may add to an import (a cell cannot): a time budget. */
export interface ImportHostOptions {
  /** Called every CSV_CHECKPOINT_RECORDS records (csv-records.ts); a host stops a long import at its time limit by throwing. */
  readonly checkpoint?: () => void;
}

/** One data row as read: time in the series' timeUnit and raw level in lengthUnit, NaN when missing. */
interface ReadRow {
  readonly row: number;
  time: number;
  raw: number;
  timeMissing: boolean;
  valueMissing: boolean;
}

/** Everything resolved from the options before the rows are read. */
interface Settings {
  readonly kind: LevelKind;
  readonly timeFormat: "elapsed" | "timestamp";
  readonly timeUnit: string;
  readonly startMs: number;
  readonly fallbackOffsetMinutes: number | null;
  readonly secondsToTimeUnit: number;
  readonly markers: ReadonlySet<string>;
}

/** "1 row", "3 rows". */
function count(n: number, noun: string): string {
  return `${n} ${noun}${n === 1 ? "" : "s"}`;
}

function formatNumber(x: number): string {
  return Number(x.toPrecision(10)).toString();
}

/** Checks the options that do not depend on the file; returns settings or pushes problems. */
function resolveSettings(options: ObservationCsvOptions, problems: CsvProblem[]): Settings | null {
  const option = (what: string, fix: string): void => {
    problems.push(makeProblem(CsvProblemCode.invalidOption, {}, what, fix));
  };
  const kind = options.kind ?? "drawdown";
  const timeFormat = options.timeFormat ?? "elapsed";
  if (kind !== "drawdown" && !Number.isFinite(options.staticLevel)) {
    option(
      `kind '${kind}' needs the static level, but staticLevel is ${options.staticLevel === undefined ? "not given" : String(options.staticLevel)}`,
      kind === "head"
        ? `give staticLevel: the head before pumping started, in ${options.lengthUnit}`
        : `give staticLevel: the depth to water before pumping started, in ${options.lengthUnit}`,
    );
  }
  if (timeFormat === "elapsed" && options.timeUnit === undefined) {
    option("timeUnit is not given, so the elapsed times have no unit", "give timeUnit, e.g. 'min' or 's'");
  }
  const timeUnit = options.timeUnit ?? "min";
  for (const [unit, quantity, field] of [
    [timeUnit, "time", "timeUnit"],
    [options.lengthUnit, "length", "lengthUnit"],
  ] as const) {
    const unitProblem = checkUnit(unit, quantity, field);
    if (unitProblem !== null) option(unitProblem, `give ${field} as a ${quantity} unit`);
  }
  let fallbackOffsetMinutes: number | null = null;
  if (options.assumedUtcOffset !== undefined) {
    const offset = readUtcOffset(options.assumedUtcOffset);
    if (offset.ok) fallbackOffsetMinutes = offset.value;
    else option(`assumedUtcOffset: ${offset.reason}`, "write it as Z or ±hh:mm, e.g. '+01:00'");
  }
  let startMs = 0;
  if (timeFormat === "timestamp") {
    if (options.pumpingStart === undefined) {
      option("timeFormat is 'timestamp' but pumpingStart is not given", "give pumpingStart, e.g. '2026-03-04T08:00:00+01:00'");
    } else {
      const start = readIsoTimestamp(options.pumpingStart);
      if (!start.ok) option(`pumpingStart: ${start.reason}`, `write it as ${TIMESTAMP_FORM}`);
      else if (start.value.offsetMinutes === null && fallbackOffsetMinutes === null) {
        option(
          `pumpingStart '${options.pumpingStart}' has no UTC offset, so its instant is unknown`,
          "add the offset to it (e.g. '+01:00'), or set assumedUtcOffset to the offset of the clock that wrote it",
        );
      } else startMs = instantMs(start.value, fallbackOffsetMinutes ?? 0);
    }
  }
  let secondsToTimeUnit = Number.NaN;
  if (problems.length === 0) secondsToTimeUnit = convert(1, "s", timeUnit);
  const markers = new Set((options.missingMarkers ?? DEFAULT_MISSING_MARKERS).map((m) => m.trim().toLowerCase()));
  if (problems.length > 0) return null;
  return { kind, timeFormat, timeUnit, startMs, fallbackOffsetMinutes, secondsToTimeUnit, markers };
}

/** Finds a column by header: exact match after trimming, else ignoring case. */
function findColumn(header: readonly string[], wanted: string, role: string, headerRow: number, problems: CsvProblem[]): CsvColumnRef | null {
  const trimmed = header.map((h) => h.trim());
  let matches = trimmed.flatMap((h, i) => (h === wanted.trim() ? [i] : []));
  if (matches.length === 0) {
    matches = trimmed.flatMap((h, i) => (h.toLowerCase() === wanted.trim().toLowerCase() ? [i] : []));
  }
  const list = trimmed.map((h, i) => `'${h}' (${i + 1})`).join(", ");
  if (matches.length === 0) {
    problems.push(
      makeProblem(
        CsvProblemCode.columnNotFound,
        { row: headerRow },
        `no column is headed '${wanted}' (the ${role} column); the header has ${list}`,
        `set ${role === "time" ? "timeColumn" : "valueColumn"} to one of these names`,
      ),
    );
    return null;
  }
  if (matches.length > 1) {
    problems.push(
      makeProblem(
        CsvProblemCode.ambiguousColumn,
        { row: headerRow },
        `${matches.length} columns are headed '${wanted}' (columns ${matches.map((i) => i + 1).join(", ")})`,
        "rename the columns in the file so that each header is unique",
      ),
    );
    return null;
  }
  return { name: trimmed[matches[0]!]!, index: matches[0]! + 1 };
}

/** Chooses the decimal mark: the option when given, else commas for ';'-files unless only points occur. */
function chooseDecimalComma(options: ObservationCsvOptions, separator: CsvSeparator, numericTexts: readonly string[], notes: string[]): boolean {
  if (options.decimalComma !== undefined) return options.decimalComma;
  if (separator !== ";") return false;
  const marks = decimalMarksIn(numericTexts);
  if (marks === "point") {
    notes.push("semicolon-separated file with decimal points only: numbers read with a decimal point");
    return false;
  }
  notes.push("semicolon-separated file: numbers read with a decimal comma (set decimalComma to choose)");
  return true;
}

/**
 * The texts of the numeric fields of every data record (the level, and the time when it is elapsed time), record by
 * record, for choosing the decimal mark of a semicolon-separated file; empty when a column is not found (the
 * import then stops on that).
 */
function numericFieldTexts(body: string, separator: CsvSeparator, headerLine: number, options: ObservationCsvOptions, settings: Settings): string[] {
  const texts: string[] = [];
  let indexes: number[] | null | undefined;
  scanCsvRecords(
    body,
    separator,
    (fields, line) => {
      if (indexes === undefined) {
        const ignored: CsvProblem[] = [];
        const time = findColumn(fields, options.timeColumn, "time", line, ignored);
        const value = findColumn(fields, options.valueColumn, "value", line, ignored);
        indexes = time === null || value === null ? null : settings.timeFormat === "elapsed" ? [time.index - 1, value.index - 1] : [value.index - 1];
        return;
      }
      if (indexes !== null) for (const i of indexes) texts.push(fields[i] ?? "");
    },
    headerLine,
  );
  return texts;
}

/**
 * Reads CSV text holding one observation series: a header row, a time column and a level column chosen by
 * header name. Times are elapsed times in `timeUnit` or ISO 8601 timestamps turned into elapsed time since
 * `pumpingStart` (offsets honoured, no host time zone); levels are drawdown, head or depth to water in
 * `lengthUnit`, turned into drawdown (s = h0 - h, s = d - d0). CSV syntax per RFC 4180.
 * `host` (from host code only, never from a cell): a checkpoint for a long import (see ImportHostOptions).
 * @returns the series and notes on every remedy applied (sorting, exclusions, decimal mark chosen).
 * @throws CsvError listing every problem, each with row (1-based line of the file), column and fix.
 */
export function parseObservationCsv(text: string, options: ObservationCsvOptions, host: ImportHostOptions = {}): ObservationCsvImport {
  const { checkpoint } = host;
  const problems: CsvProblem[] = [];
  const notes: string[] = [];
  const settings = resolveSettings(options, problems);
  if (settings === null) throw new CsvError(problems);

  const headerLine = options.headerLine ?? firstNonBlankLine(text);
  const headerOffset = headerLine === null ? -1 : offsetOfLine(text, headerLine);
  if (headerLine === null || headerOffset < 0 || headerOffset >= text.length) {
    throw new CsvError([
      makeProblem(
        CsvProblemCode.noHeader,
        {},
        headerLine === null ? "the file is empty" : `the file has no line ${headerLine} for the header`,
        "give a file whose header row names the columns, and set headerLine to that row's line number",
      ),
    ]);
  }
  const body = text.slice(headerOffset);
  const separator = options.separator ?? detectSeparator(body);
  if (separator === null) {
    throw new CsvError([
      makeProblem(
        CsvProblemCode.separatorUnknown,
        { row: headerLine },
        "the header row shows no single field separator (no comma, semicolon or tab, or a tie between them)",
        "set separator to ',', ';' or '\\t'; the file needs at least a time column and a level column",
      ),
    ]);
  }
  if (options.separator === undefined && separator !== ",") notes.push(`field separator detected: ${SEPARATOR_NAMES[separator]}`);

  // The decimal mark comes from the options or the separator; only a semicolon-separated file with no
  // decimalComma option needs its numeric fields looked at first (numericFieldTexts, a pass of its own).
  const numericTexts = options.decimalComma === undefined && separator === ";" ? numericFieldTexts(body, separator, headerLine, options, settings) : [];
  const decimalComma = chooseDecimalComma(options, separator, numericTexts, notes);

  const found: { header?: { line: number; fields: string[] }; time: CsvColumnRef | null; value: CsvColumnRef | null; reader?: RowReader } = { time: null, value: null };
  const columnProblems: CsvProblem[] = [];
  let dataRecords = 0;
  const syntax = scanCsvRecords(
    body,
    separator,
    (fields, line) => {
      if (found.header === undefined) {
        found.header = { line, fields: fields.slice() };
        found.time = findColumn(found.header.fields, options.timeColumn, "time", line, columnProblems);
        found.value = findColumn(found.header.fields, options.valueColumn, "value", line, columnProblems);
        if (found.time !== null && found.value !== null) {
          found.reader = new RowReader(fields.length, separator, found.time, found.value, decimalComma, settings);
        }
        return;
      }
      dataRecords++;
      found.reader?.read(fields, line);
    },
    headerLine,
    checkpoint,
  );
  for (const p of syntax) {
    problems.push(makeProblem(CsvProblemCode.syntax, { row: p.line }, `field ${p.field}: ${p.message}`, p.fix));
  }
  const { header, time: timeColumn, value: valueColumn, reader } = found;
  if (header === undefined) {
    throw new CsvError([
      makeProblem(CsvProblemCode.noHeader, { row: headerLine }, "the header line is blank", "set headerLine to the line that names the columns"),
    ]);
  }
  problems.push(...columnProblems);
  if (timeColumn === null || valueColumn === null || reader === undefined) throw new CsvError(problems);
  if (dataRecords === 0) {
    problems.push(
      makeProblem(CsvProblemCode.noData, { row: header.line }, "the header is not followed by any data rows", "give a file with readings below the header"),
    );
    throw new CsvError(problems);
  }
  problems.push(...reader.finish());
  const rows = reader.rows;
  const excluded: ExcludedPoint[] = [];
  const kept = applyRowPolicies(rows, options, settings, timeColumn, valueColumn, excluded, problems, notes);
  const ordered = orderByTime(kept, options.outOfOrder ?? "refuse", settings.timeUnit, timeColumn, problems, notes);

  const staticLevel = options.staticLevel ?? 0;
  const raw = ordered.map((r) => r.raw);
  const drawdowns =
    settings.kind === "head"
      ? drawdownFromHead(raw, staticLevel)
      : settings.kind === "depth-to-water"
        ? drawdownFromDepthToWater(raw, staticLevel)
        : Float64Array.from(raw);
  if (options.checkLevelKind ?? true) {
    const finding = judgeLevelKind(settings.kind, raw, drawdowns, staticLevel, options.lengthUnit);
    if (finding !== null) {
      problems.push({
        code: finding.code,
        column: valueColumn,
        message: `${describeLocation(undefined, valueColumn)} ${finding.what}`,
        fix: `${finding.fix}; or set checkLevelKind: false if the column is right`,
      });
    }
  }
  if (problems.length > 0) throw new CsvError(problems);

  const times: number[] = [];
  const values: number[] = [];
  ordered.forEach((r, i) => {
    const s = drawdowns[i]!;
    if (r.time > 0) {
      times.push(r.time);
      values.push(s);
      return;
    }
    const reason =
      s === 0
        ? "reading at t = 0 (start of pumping, drawdown 0 by definition): kept out because a log time axis cannot place t = 0"
        : `reading at t = 0 with drawdown ${formatNumber(s)} ${options.lengthUnit}, not 0: kept out because a log time axis cannot place t = 0; a non-zero drawdown at the start suggests the static level or the pumping start is off`;
    excluded.push({ row: r.row, time: 0, value: s, reason });
    notes.push(`row ${r.row}: ${reason}`);
  });
  excluded.sort((a, b) => a.row - b.row);

  const metadata: Record<string, string> = {
    ...(options.metadata ?? {}),
    "source.format": "csv",
    "source.timeColumn": timeColumn.name,
    "source.valueColumn": valueColumn.name,
    "source.kind": settings.kind,
  };
  if (settings.kind !== "drawdown") metadata["source.staticLevel"] = `${staticLevel} ${options.lengthUnit}`;
  if (options.pumpingStart !== undefined && settings.timeFormat === "timestamp") metadata["source.pumpingStart"] = options.pumpingStart;
  try {
    const series = createObservationSeries({
      name: options.name ?? valueColumn.name,
      times,
      drawdowns: values,
      timeUnit: settings.timeUnit,
      lengthUnit: options.lengthUnit,
      radius: options.radius,
      pumpingRate: options.pumpingRate,
      metadata,
      excluded,
    });
    return { series, notes };
  } catch (error) {
    if (!(error instanceof SeriesError)) throw error;
    throw new CsvError(
      error.problems.map((p) => makeProblem(CsvProblemCode.invalidOption, {}, p, "correct the option named above")),
    );
  }
}

/** 1-based number of the first line holding anything but spaces, or null for an empty text. */
function firstNonBlankLine(text: string): number | null {
  let line = 1;
  let start = 0;
  for (;;) {
    let end = start;
    while (end < text.length && text.charCodeAt(end) !== 10 && text.charCodeAt(end) !== 13) end++;
    if (text.slice(start, end).replace(/^\uFEFF/, "").trim() !== "") return line;
    if (end >= text.length) return null;
    start = text.charCodeAt(end) === 13 && text.charCodeAt(end + 1) === 10 ? end + 2 : end + 1;
    line++;
  }
}

/** Reads time and level from each data record as it is scanned; collects problems for ragged rows and unreadable fields. */
class RowReader {
  readonly rows: ReadRow[] = [];
  private readonly problems: CsvProblem[] = [];
  private readonly unoffset: number[] = [];
  private readonly markFix: string;
  private readonly timeIndex: number;
  private readonly valueIndex: number;

  constructor(
    private readonly width: number,
    private readonly separator: CsvSeparator,
    private readonly timeColumn: CsvColumnRef,
    private readonly valueColumn: CsvColumnRef,
    private readonly decimalComma: boolean,
    private readonly settings: Settings,
  ) {
    this.markFix = decimalComma ? "set decimalComma: false if the file uses decimal points" : "set decimalComma: true if the file uses decimal commas";
    this.timeIndex = timeColumn.index - 1;
    this.valueIndex = valueColumn.index - 1;
  }

  read(fields: readonly string[], line: number): void {
    const { width, settings, problems, decimalComma, markFix } = this;
    const fieldCount = fields.length;
    if (fieldCount !== width) {
      const hint =
        this.separator === "," && fieldCount > width
          ? "; a decimal comma in an unquoted field splits it in two: quote such numbers or use ';' as separator"
          : "";
      problems.push(
        makeProblem(
          CsvProblemCode.raggedRow,
          { row: line },
          `the record has ${fieldCount} fields but the header has ${width}`,
          `give every record ${width} fields (RFC 4180 section 2.4)${hint}`,
        ),
      );
      return;
    }
    const timeText = fields[this.timeIndex]!;
    const valueText = fields[this.valueIndex]!;
    const row: ReadRow = { row: line, time: Number.NaN, raw: Number.NaN, timeMissing: false, valueMissing: false };
    if (settings.timeFormat === "elapsed") {
      const t = readDecimal(timeText, decimalComma);
      if (t.ok) row.time = t.value;
      else if (isMissing(timeText, settings)) row.timeMissing = true;
      else problems.push(nonNumeric(line, this.timeColumn, t.reason, markFix));
    } else {
      const stamp = readIsoTimestamp(timeText);
      if (stamp.ok && stamp.value.offsetMinutes === null && settings.fallbackOffsetMinutes === null) this.unoffset.push(line);
      else if (stamp.ok) row.time = elapsedFromTimestamp(stamp.value, settings);
      else if (isMissing(timeText, settings)) row.timeMissing = true;
      else {
        problems.push(
          makeProblem(CsvProblemCode.badTimestamp, { row: line, column: this.timeColumn }, stamp.reason, `write the time as ${TIMESTAMP_FORM}`),
        );
      }
    }
    const v = readDecimal(valueText, decimalComma);
    if (v.ok) row.raw = v.value;
    else if (isMissing(valueText, settings)) row.valueMissing = true;
    else problems.push(nonNumeric(line, this.valueColumn, v.reason, markFix));
    this.rows.push(row);
  }

  /** The problems found, in row order, with the missing-offset problem (naming its first row) last. */
  finish(): CsvProblem[] {
    const { unoffset } = this;
    if (unoffset.length > 0) {
      const others = unoffset.length > 1 ? ` (and ${count(unoffset.length - 1, "more row")})` : "";
      this.problems.push(
        makeProblem(
          CsvProblemCode.missingUtcOffset,
          { row: unoffset[0]!, column: this.timeColumn },
          `the timestamp has no UTC offset${others}, so its instant depends on a clock setting the file does not state`,
          "add offsets to the timestamps (e.g. '2026-03-04T08:00:00+01:00'), or set assumedUtcOffset to the offset the logger clock kept (e.g. '+01:00' or 'Z')",
        ),
      );
    }
    return this.problems;
  }
}

function isMissing(text: string, settings: Settings): boolean {
  return settings.markers.has(text.trim().toLowerCase());
}

function nonNumeric(row: number, column: CsvColumnRef, reason: string, markFix: string): CsvProblem {
  const fix = /decimal (comma|point)/.test(reason)
    ? markFix
    : "correct the value; if it marks a missing reading, list it in missingMarkers and set missing: 'exclude'";
  return makeProblem(CsvProblemCode.nonNumeric, { row, column }, reason, fix);
}

function elapsedFromTimestamp(stamp: IsoTimestamp, settings: Settings): number {
  const seconds = (instantMs(stamp, settings.fallbackOffsetMinutes ?? 0) - settings.startMs) / 1000;
  return seconds * settings.secondsToTimeUnit;
}

/** Applies the missing-reading and before-start policies; returns the rows that go on to the series. */
function applyRowPolicies(
  rows: readonly ReadRow[],
  options: ObservationCsvOptions,
  settings: Settings,
  timeColumn: CsvColumnRef,
  valueColumn: CsvColumnRef,
  excluded: ExcludedPoint[],
  problems: CsvProblem[],
  notes: string[],
): ReadRow[] {
  const missingPolicy = options.missing ?? "refuse";
  const beforeStartPolicy = options.beforeStart ?? "refuse";
  const kept: ReadRow[] = [];
  let missingCount = 0;
  let beforeCount = 0;
  const drawdownOf = (raw: number): number =>
    settings.kind === "head"
      ? (options.staticLevel ?? 0) - raw
      : settings.kind === "depth-to-water"
        ? raw - (options.staticLevel ?? 0)
        : raw;
  for (const r of rows) {
    if (r.timeMissing || r.valueMissing) {
      const column = r.timeMissing ? timeColumn : valueColumn;
      const what = r.timeMissing ? "time" : "level";
      if (missingPolicy === "refuse") {
        problems.push(
          makeProblem(
            CsvProblemCode.missingValue,
            { row: r.row, column },
            `the ${what} is missing`,
            "fill in the reading, or set missing: 'exclude' to leave such rows out (they are listed in excluded)",
          ),
        );
      } else {
        excluded.push({
          row: r.row,
          time: r.timeMissing ? Number.NaN : r.time,
          value: r.valueMissing ? Number.NaN : drawdownOf(r.raw),
          reason: `${what} missing in column '${column.name}'`,
        });
        missingCount++;
      }
      continue;
    }
    if (Number.isNaN(r.time) || Number.isNaN(r.raw)) continue;
    if (r.time < 0) {
      if (beforeStartPolicy === "refuse") {
        const when =
          settings.timeFormat === "timestamp"
            ? `the reading is ${formatNumber(-r.time)} ${settings.timeUnit} before pumpingStart`
            : `time ${formatNumber(r.time)} ${settings.timeUnit} is negative (before pumping started)`;
        const fix =
          settings.timeFormat === "timestamp"
            ? "check pumpingStart, or set beforeStart: 'exclude' to leave pre-pumping readings out (they are listed in excluded)"
            : "check the time column, or set beforeStart: 'exclude' to leave pre-pumping readings out (they are listed in excluded)";
        problems.push(makeProblem(CsvProblemCode.negativeTime, { row: r.row, column: timeColumn }, when, fix));
      } else {
        excluded.push({ row: r.row, time: r.time, value: drawdownOf(r.raw), reason: "reading before pumping started (negative elapsed time)" });
        beforeCount++;
      }
      continue;
    }
    kept.push(r);
  }
  if (missingCount > 0) notes.push(`${count(missingCount, "row")} with a missing reading excluded (listed in excluded)`);
  if (beforeCount > 0) notes.push(`${count(beforeCount, "reading")} before pumping started excluded (listed in excluded)`);
  return kept;
}

/** Checks that times increase down the file (or sorts them) and refuses duplicate times. */
function orderByTime(
  rows: ReadRow[],
  policy: "refuse" | "sort",
  timeUnit: string,
  timeColumn: CsvColumnRef,
  problems: CsvProblem[],
  notes: string[],
): ReadRow[] {
  let increasing = true;
  for (let i = 1; i < rows.length && increasing; i++) increasing = rows[i]!.time > rows[i - 1]!.time;
  if (increasing) return rows;
  const found: CsvProblem[] = [];
  const byTime = rows.map((_, i) => i).sort((a, b) => rows[a]!.time - rows[b]!.time || a - b);
  for (let k = 1; k < byTime.length; k++) {
    const earlier = rows[byTime[k - 1]!]!;
    const later = rows[byTime[k]!]!;
    if (later.time === earlier.time) {
      found.push(
        makeProblem(
          CsvProblemCode.duplicateTime,
          { row: later.row, column: timeColumn },
          `time ${formatNumber(later.time)} ${timeUnit} repeats the time of row ${earlier.row}`,
          "remove one of the two readings or correct its time",
        ),
      );
    }
  }
  let latest = rows[0]!;
  let outOfOrder = 0;
  let firstOutOfOrder = 0;
  for (const r of rows) {
    if (r.time < latest.time) {
      if (outOfOrder === 0) firstOutOfOrder = r.row;
      outOfOrder++;
      if (policy === "refuse") {
        found.push(
          makeProblem(
            CsvProblemCode.outOfOrder,
            { row: r.row, column: timeColumn },
            `time ${formatNumber(r.time)} ${timeUnit} comes after ${formatNumber(latest.time)} ${timeUnit} on row ${latest.row}; times must increase down the file`,
            "put the rows in time order, or set outOfOrder: 'sort' to have them sorted",
          ),
        );
      }
    }
    if (r.time > latest.time) latest = r;
  }
  found.sort((a, b) => a.row! - b.row!);
  problems.push(...found);
  if (policy === "sort" && outOfOrder > 0) {
    notes.push(
      `sorted by time: ${count(outOfOrder, "row")} came earlier than a row above them (first: row ${firstOutOfOrder}); the series follows time order`,
    );
    return byTime.map((i) => rows[i]!);
  }
  return rows;
}
