/**
 * Data cells: CSV text (inline, or a file beside the document pinned by SHA-256) read into the plain table
 * a cell sees under the data cell's name: `{ name, columns, rows, csv }`, where `rows` is an array of records
 * (numbers where a field reads as a number, null for an empty field, text otherwise) and `csv` is the text
 * itself for `aq.parseObservationCsv` or other readers.
 */
import { readCsvRecords, type CsvSeparator } from "@conebook/aquifer";
import { sha256Hex } from "@conebook/document";
import type { DataCell } from "@conebook/document";

/** The value a data cell defines. */
export interface DataTable {
  name: string;
  columns: string[];
  rows: Record<string, number | string | null>[];
  csv: string;
}

/** A data cell that could not be read; the message names the cell or file and what would fix it. */
export class DataCellError extends Error {
  override readonly name = "DataCellError";
  constructor(message: string, readonly line?: number) {
    super(message);
  }
}

/** Reads the bytes of a file beside the document (relative path, forward slashes). */
export type ReadFile = (path: string) => Promise<Uint8Array> | Uint8Array;

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

/** Parses CSV text with a header line into a DataTable. `firstLine` is the file line of the text's first line. */
export function parseDataTable(name: string, text: string, firstLine = 1): DataTable {
  const { records, problems } = readCsvRecords(text, guessSeparator(text), firstLine);
  if (problems.length > 0) {
    const p = problems[0]!;
    throw new DataCellError(`data "${name}", line ${p.line}, field ${p.field}: ${p.message} ${p.fix}`, p.line);
  }
  const header = records[0];
  if (!header) throw new DataCellError(`data "${name}" is empty; give a header line with column names and then the rows`);
  const columns = header.fields.map((f) => f.trim());
  const rows = records.slice(1).map((r) => {
    if (r.fields.length !== columns.length) {
      throw new DataCellError(`data "${name}", line ${r.line}: ${r.fields.length} fields but the header has ${columns.length}; give one field per column`, r.line);
    }
    const row: Record<string, number | string | null> = {};
    columns.forEach((c, i) => {
      const raw = r.fields[i]!.trim();
      row[c] = raw === "" ? null : NUMBER.test(raw) ? Number(raw) : raw;
    });
    return row;
  });
  return { name, columns, rows, csv: text };
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
  let bytes: Uint8Array;
  try {
    bytes = await readFile(path);
  } catch (e) {
    throw new DataCellError(`data "${cell.name}": could not read ${path}: ${e instanceof Error ? e.message : String(e)}`);
  }
  const actual = await sha256Hex(bytes);
  if (actual !== sha256.toLowerCase()) {
    throw new DataCellError(
      `data "${cell.name}": the file ${path} has SHA-256 ${actual}, but the document pins ${sha256.toLowerCase()}; ` +
        "the file changed since it was pinned. Restore the original file, or update the pin if the change is intended.",
    );
  }
  return new TextDecoder("utf-8").decode(bytes);
}
