/**
 * Data cells: CSV text (inline, or a file beside the document pinned by SHA-256) read into the table a cell sees
 * under the data cell's name: `{ name, columns, rows, csv, byColumn }`.
 *
 * The host reads the text into columns: a column whose every field reads as a number (empty fields allowed, at
 * least one number) is a Float64Array with NaN for the empty fields; any other column is an array of field values
 * (numbers where a field reads as a number, null for an empty field, text otherwise). Columns cross into the
 * sandbox as bytes; the guest builds the row records of `rows` (numbers, null for empty, text) only when a cell
 * first reads them (guest-prelude.ts), so a large record that is only handed to an importer via `csv` never
 * becomes 100,000 objects.
 */
import { scanCsvRecords, type CsvSeparator } from "@conebook/aquifer";
import { decodeUtf8Strict, describeUtf8Problem } from "@conebook/document";
import type { DataCell } from "@conebook/document";
import { platformSha256 } from "./digest.js";
import { checkHostDeadline } from "./host-budget.js";

/** One column of a data table: numbers (NaN where the field is empty), or field values. */
export type DataColumn = Float64Array | (number | string | null)[];

/** The value a data cell defines, in columns. */
export interface DataTable {
  name: string;
  /** Column names from the header line, trimmed, in file order. */
  columns: string[];
  /**
   * One entry per column name, in the same order. A text column is read from `csv` when first used (an accessor
   * that then leaves the column in place); numericColumnsOf lists the numeric ones without reading text columns.
   */
  values: DataColumn[];
  /** Number of rows (lines after the header). */
  length: number;
  /** The CSV text itself. */
  csv: string;
}

/** A data cell that could not be read; the message names the cell or file and what would fix it. */
export class DataCellError extends Error {
  override readonly name = "DataCellError";
  constructor(message: string, readonly line?: number) {
    super(message);
  }
}

/** Bytes a reader has already hashed (the CLI hashes each pinned file once, before the run, and sends both). */
export interface HashedBytes {
  bytes: Uint8Array;
  /** SHA-256 of `bytes`, 64 lowercase hexadecimal digits. */
  sha256: string;
}

/**
 * Reads the bytes of a file beside the document (relative path, forward slashes); a reader that has hashed them
 * returns them with their SHA-256, which the run then uses instead of hashing them again.
 */
export type ReadFile = (path: string) => Promise<Uint8Array | HashedBytes> | Uint8Array | HashedBytes;

/** The bytes and SHA-256 of what a ReadFile returned (hashing them on the platform when the reader did not). */
export async function hashedBytes(read: Uint8Array | HashedBytes): Promise<HashedBytes> {
  if (read instanceof Uint8Array) return { bytes: read, sha256: await platformSha256(read) };
  return read;
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** The separator: the one of ",", ";", tab that occurs most in the first line (comma on a tie). */
function guessSeparator(text: string): CsvSeparator {
  const first = text.slice(0, text.search(/\r|\n|$/));
  const count = (c: string) => first.split(c).length - 1;
  const tab = count("\t");
  const semi = count(";");
  const comma = count(",");
  if (tab > comma && tab >= semi) return "\t";
  if (semi > comma) return ";";
  return ",";
}

/** A field's value: null when empty, a number when the trimmed text reads as one, else the trimmed text. */
function fieldValue(raw: string): number | string | null {
  if (raw === "") return null;
  return NUMBER.test(raw) ? Number(raw) : raw;
}

/**
 * Parses CSV text with a header line into a DataTable (see the module comment for the column forms).
 * `firstLine` is the file line of the text's first line; errors name the data cell, the line and what to fix.
 * `checkpoint` is called as the records are read (the kernel's time limit for the data cell; it may throw).
 */
export function parseDataTable(name: string, text: string, firstLine = 1, checkpoint?: () => void): DataTable {
  const separator = guessSeparator(text);
  let columns: string[] | undefined;
  let builders: ColumnBuilder[] = [];
  let n = 0;
  let ragged: DataCellError | undefined;
  const problems = scanCsvRecords(
    text,
    separator,
    (fields, line) => {
      if (ragged) return;
      if (!columns) {
        columns = fields.map((f) => f.trim());
        builders = columns.map(() => new ColumnBuilder());
        return;
      }
      if (fields.length !== columns.length) {
        ragged = new DataCellError(`data "${name}", line ${line}: ${fields.length} fields but the header has ${columns.length}; give one field per column`, line);
        return;
      }
      for (let c = 0; c < builders.length; c++) builders[c]!.add(fields[c]!.trim(), n);
      n++;
    },
    firstLine,
    checkpoint,
  );
  if (problems.length > 0) {
    const p = problems[0]!;
    throw new DataCellError(`data "${name}", line ${p.line}, field ${p.field}: ${p.message} ${p.fix}`, p.line);
  }
  if (!columns) throw new DataCellError(`data "${name}" is empty; give a header line with column names and then the rows`);
  if (ragged) throw ragged;
  const values: DataColumn[] = [];
  builders.forEach((b, c) => {
    const column = b.column(n);
    if (column) values[c] = column;
    else lazyTextColumn(values, c, () => textColumn(text, separator, c, n, firstLine, () => checkHostDeadline(`data "${name}", column "${columns![c]}"`)));
  });
  return { name, columns, values, length: n, csv: text };
}

/**
 * One column being read: numbers while every field so far reads as one (NaN for empty fields). A column with a
 * field that does not read as a number is a text column, and the builder stops keeping anything for it: its field
 * values are read again from the text when first used (lazyTextColumn), so the timestamp column of a logger record,
 * a million strings no cell may read, costs nothing until a cell reads it.
 */
class ColumnBuilder {
  private numbers = new Float64Array(1024);
  private sawNumber = false;
  private text = false;

  add(field: string, row: number): void {
    if (this.text) return;
    let v: number;
    if (field === "") v = NaN;
    else if (NUMBER.test(field)) {
      v = Number(field);
      this.sawNumber = true;
    } else {
      this.text = true;
      return;
    }
    if (row === this.numbers.length) {
      const grown = new Float64Array(this.numbers.length * 2);
      grown.set(this.numbers);
      this.numbers = grown;
    }
    this.numbers[row] = v;
  }

  /** The numeric (or all-empty) column of n rows, or undefined for a text column. */
  column(n: number): DataColumn | undefined {
    if (this.text) return undefined;
    if (this.sawNumber) return this.numbers.length === n ? this.numbers : this.numbers.slice(0, n);
    return new Array<null>(n).fill(null);
  }
}

/**
 * Makes values[c] a text column read by `read` on first access and kept from then on. The reading checks the
 * deadline of the host call in progress (checkHostDeadline), since it happens inside the call that first reads it.
 */
function lazyTextColumn(values: DataColumn[], c: number, read: () => DataColumn): void {
  Object.defineProperty(values, c, {
    configurable: true,
    enumerable: true,
    get() {
      const column = read();
      Object.defineProperty(values, c, { value: column, writable: true, enumerable: true, configurable: true });
      return column;
    },
  });
}

/** The numeric columns of a table (null for a text column), without reading a text column that is not read yet. */
export function numericColumnsOf(table: DataTable): (Float64Array | null)[] {
  return table.columns.map((_, c) => {
    const d = Object.getOwnPropertyDescriptor(table.values, c);
    return d && "value" in d && d.value instanceof Float64Array ? d.value : null;
  });
}

/** Field values (fieldValue) of column c of the n data rows, read again from the text. */
function textColumn(text: string, separator: CsvSeparator, c: number, n: number, firstLine: number, checkpoint: () => void): DataColumn {
  const out: (number | string | null)[] = [];
  let header = true;
  scanCsvRecords(
    text,
    separator,
    (fields) => {
      if (header) header = false;
      else if (out.length < n) out.push(fieldValue(fields[c]!.trim()));
    },
    firstLine,
    checkpoint,
  );
  return out;
}

/** The rows of a table as records, as a cell sees them in `rows` (numbers, null for empty fields, text). */
export function tableRows(table: DataTable): Record<string, number | string | null>[] {
  const rows: Record<string, number | string | null>[] = [];
  for (let r = 0; r < table.length; r++) {
    const row: Record<string, number | string | null> = {};
    table.columns.forEach((c, i) => {
      const v = table.values[i]![r]!;
      const value = typeof v === "number" && Number.isNaN(v) ? null : v;
      if (c === "__proto__") Object.defineProperty(row, c, { value, writable: true, enumerable: true, configurable: true });
      else row[c] = value;
    });
    rows.push(row);
  }
  return rows;
}

/**
 * The CSV text of a data cell: its inline source, or the pinned file read with `readFile` and checked
 * against the pinned SHA-256.
 */
export async function dataCellText(cell: DataCell, readFile: ReadFile | undefined): Promise<string> {
  if (!cell.file) return cell.source;
  const { path, sha256 } = cell.file;
  if (!readFile) {
    throw new DataCellError(`data "${cell.name}" refers to the file ${path}, but this run was given no way to read files`);
  }
  let read: HashedBytes;
  try {
    read = await hashedBytes(await readFile(path));
  } catch (e) {
    throw new DataCellError(`data "${cell.name}": could not read ${path}: ${e instanceof Error ? e.message : String(e)}`);
  }
  const actual = read.sha256;
  if (actual !== sha256.toLowerCase()) {
    throw new DataCellError(
      `data "${cell.name}": the file ${path} has SHA-256 ${actual}, but the document pins ${sha256.toLowerCase()}; ` +
        "the file changed since it was pinned. Restore the original file, or update the pin if the change is intended.",
    );
  }
  const decoded = decodeUtf8Strict(read.bytes);
  if (!decoded.ok) {
    throw new DataCellError(
      `data "${cell.name}": the file ${path} is not UTF-8 at ${describeUtf8Problem(decoded.problem)}; save it as UTF-8 (and pin the new bytes)`,
    );
  }
  return decoded.text;
}
