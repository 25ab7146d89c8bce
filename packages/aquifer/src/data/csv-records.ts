/**
 * Splitting CSV text into records and fields, following RFC 4180 ("Common Format and MIME Type for
 * Comma-Separated Values (CSV) Files", Shafranovich 2005), section 2:
 *
 * - 2.1 / 2.2: records end with a line break; the last record may lack one. CRLF is the standard break;
 *   LF and a lone CR are accepted as well because loggers and spreadsheets write them.
 * - 2.4: fields are separated by the separator; spaces are part of a field (they are kept here; numeric
 *   parsing trims them later).
 * - 2.5: a field may be enclosed in double quotes; an unquoted field must not contain a double quote.
 * - 2.6: fields holding line breaks, double quotes or the separator must be quoted; such breaks are kept
 *   verbatim in the field value.
 * - 2.7: a double quote inside a quoted field is written as two double quotes.
 *
 * Beyond the RFC: the separator may be ';' or a tab as well as ','; a leading byte order mark is skipped;
 * completely empty lines are skipped (they carry no fields); line numbers count every line break,
 * including those inside quoted fields, so a record's `line` is the physical line of the file where it starts.
 */

/** Field separators the reader accepts. */
export type CsvSeparator = "," | ";" | "\t";

/** One record: its fields in order and the 1-based line of the file where it starts. */
export interface CsvRecord {
  /** 1-based physical line where the record starts. */
  readonly line: number;
  /** Field texts, quotes removed and doubled quotes undone. */
  readonly fields: readonly string[];
}

/** A breach of RFC 4180 syntax, with where it happened. */
export interface CsvSyntaxProblem {
  /** 1-based physical line of the offending character. */
  readonly line: number;
  /** 1-based index of the field within its record. */
  readonly field: number;
  readonly kind: "unterminated-quote" | "stray-quote" | "text-after-quote";
  /** What is wrong, in one sentence. */
  readonly message: string;
  /** What would fix it. */
  readonly fix: string;
}

/** Records and syntax problems read from CSV text. */
export interface CsvRecords {
  readonly records: CsvRecord[];
  readonly problems: CsvSyntaxProblem[];
}

const QUOTE = 34;
const CR = 13;
const LF = 10;

/** Records read between two calls of a reader's checkpoint (a host's time budget; about 10 ms of reading). */
export const CSV_CHECKPOINT_RECORDS = 16384;

/**
 * Reads CSV text into records (RFC 4180 section 2, with the extensions listed in this module's comment).
 * Never throws: syntax problems are returned with line and field numbers, and reading goes on after each.
 * `firstLine` is the file line number of the first character of `text` (for text cut from a longer file).
 * `checkpoint`, when given, is called every CSV_CHECKPOINT_RECORDS records (a host stops a long read there by
 * throwing); it is the only way this function throws.
 */
export function readCsvRecords(text: string, separator: CsvSeparator, firstLine = 1, checkpoint?: () => void): CsvRecords {
  const records: CsvRecord[] = [];
  const problems = scanCsvRecords(text, separator, (fields, line) => records.push({ line, fields: fields.slice() }), firstLine, checkpoint);
  return { records, problems };
}

/**
 * Reads CSV text record by record, as readCsvRecords does, but hands each record to `onRecord` instead of keeping
 * it: `fields` is one array reused for every record (copy what you keep), `line` the 1-based file line where the
 * record starts. A reader of a million-line logger file keeps only what it needs, not a million records.
 * Returns the syntax problems; `checkpoint` is called every CSV_CHECKPOINT_RECORDS records (it may throw).
 */
export function scanCsvRecords(
  text: string,
  separator: CsvSeparator,
  onRecord: (fields: readonly string[], line: number) => void,
  firstLine = 1,
  checkpoint?: () => void,
): CsvSyntaxProblem[] {
  const sep = separator.charCodeAt(0);
  const problems: CsvSyntaxProblem[] = [];
  const fields: string[] = [];
  let count = 0;
  const n = text.length;
  let i = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  let line = firstLine;

  /** Consumes one line break at i (CRLF, LF or CR) if present; returns true when it did. */
  const takeLineBreak = (): boolean => {
    const c = text.charCodeAt(i);
    if (c === CR) {
      i += text.charCodeAt(i + 1) === LF ? 2 : 1;
      line++;
      return true;
    }
    if (c === LF) {
      i++;
      line++;
      return true;
    }
    return false;
  };

  while (i < n) {
    const recordLine = line;
    fields.length = 0;
    let sawQuotedField = false;
    for (;;) {
      const fieldNumber = fields.length + 1;
      if (text.charCodeAt(i) === QUOTE) {
        sawQuotedField = true;
        const openLine = line;
        i++;
        let value = "";
        let closed = false;
        while (i < n) {
          const c = text.charCodeAt(i);
          if (c === QUOTE) {
            if (text.charCodeAt(i + 1) === QUOTE) {
              value += '"';
              i += 2;
              continue;
            }
            i++;
            closed = true;
            break;
          }
          if (c === CR || c === LF) {
            const start = i;
            takeLineBreak();
            value += text.slice(start, i);
            continue;
          }
          let j = i + 1;
          while (j < n) {
            const d = text.charCodeAt(j);
            if (d === QUOTE || d === CR || d === LF) break;
            j++;
          }
          value += text.slice(i, j);
          i = j;
        }
        if (!closed) {
          problems.push({
            line: openLine,
            field: fieldNumber,
            kind: "unterminated-quote",
            message: `the quoted field that opens on line ${openLine} is never closed`,
            fix: "add the closing double quote, or double every quote inside the field (RFC 4180 section 2.7)",
          });
        } else if (i < n && text.charCodeAt(i) !== sep && text.charCodeAt(i) !== CR && text.charCodeAt(i) !== LF) {
          let j = i;
          while (j < n && text.charCodeAt(j) !== sep && text.charCodeAt(j) !== CR && text.charCodeAt(j) !== LF) j++;
          problems.push({
            line,
            field: fieldNumber,
            kind: "text-after-quote",
            message: `text ${JSON.stringify(text.slice(i, j))} follows the closing quote of field ${fieldNumber}`,
            fix: "put the whole field inside the quotes and write inner quotes as two double quotes (RFC 4180 sections 2.5 and 2.7)",
          });
          value += text.slice(i, j);
          i = j;
        }
        fields.push(value);
      } else {
        let j = i;
        while (j < n) {
          const d = text.charCodeAt(j);
          if (d === sep || d === CR || d === LF) break;
          j++;
        }
        const value = text.slice(i, j);
        if (value.includes('"')) {
          problems.push({
            line,
            field: fieldNumber,
            kind: "stray-quote",
            message: `field ${fieldNumber} is not quoted but contains a double quote: ${JSON.stringify(value)}`,
            fix: "enclose the field in double quotes and write each inner quote as two double quotes (RFC 4180 sections 2.5 and 2.7)",
          });
        }
        fields.push(value);
        i = j;
      }
      if (i < n && text.charCodeAt(i) === sep) {
        i++;
        continue;
      }
      takeLineBreak();
      break;
    }
    const blank = fields.length === 1 && fields[0] === "" && !sawQuotedField;
    if (blank) continue;
    onRecord(fields, recordLine);
    if (++count % CSV_CHECKPOINT_RECORDS === 0) checkpoint?.();
  }
  return problems;
}

/**
 * Counts each candidate separator outside quoted fields in the record that starts at the beginning of
 * `text`, and returns the most frequent one, or null when none occurs or two candidates tie.
 */
export function detectSeparator(text: string): CsvSeparator | null {
  const counts = new Map<CsvSeparator, number>([
    [",", 0],
    [";", 0],
    ["\t", 0],
  ]);
  let inQuotes = false;
  for (let i = text.charCodeAt(0) === 0xfeff ? 1 : 0; i < text.length; i++) {
    const c = text[i]!;
    if (c === '"') {
      inQuotes = !inQuotes;
      continue;
    }
    if (inQuotes) continue;
    if (c === "\n" || c === "\r") break;
    if (c === "," || c === ";" || c === "\t") counts.set(c, counts.get(c)! + 1);
  }
  let best: CsvSeparator | null = null;
  let bestCount = 0;
  let tie = false;
  for (const [candidate, count] of counts) {
    if (count > bestCount) {
      best = candidate;
      bestCount = count;
      tie = false;
    } else if (count === bestCount && count > 0) {
      tie = true;
    }
  }
  return tie ? null : best;
}

/**
 * Offset in `text` of the first character of 1-based physical line `lineNumber`, counting CRLF, LF and CR
 * as line breaks, or -1 when the text has fewer lines. Lines before it are treated as plain text (a
 * logger's preamble), not as CSV records.
 */
export function offsetOfLine(text: string, lineNumber: number): number {
  let line = 1;
  let i = 0;
  while (line < lineNumber) {
    const lf = text.indexOf("\n", i);
    const cr = text.indexOf("\r", i);
    if (lf < 0 && cr < 0) return -1;
    if (cr >= 0 && (lf < 0 || cr < lf)) i = text.charCodeAt(cr + 1) === LF ? cr + 2 : cr + 1;
    else i = lf + 1;
    line++;
  }
  return i <= text.length ? i : -1;
}
