/**
 * The Conebook document model: what a `.md` Conebook file means once parsed.
 *
 * The grammar of the file is described in docs/format.md; these types are the in-memory form. Every cell and
 * the header may carry an `origin` / `layout` record of the exact text the parser saw, which lets
 * `serializeDocument` write untouched parts back byte for byte and regenerate only what changed.
 */

import type { ReviewMark } from "./review-notes.js";
import type { TestInformation } from "./test-information.js";

/** A place in the document text. Both numbers are 1-based; columns count UTF-16 code units. */
export interface Position {
  line: number;
  column: number;
}

/** A number (or string) a template lets a reader change before a rerun. */
export interface TemplateParameter {
  name: string;
  value: number | string;
  unit?: string;
  /** Inclusive allowed range [min, max] of a numeric value, in `unit`. */
  range?: [number, number];
  description?: string;
  /** True when a template's value is only a demonstration: `conebook new` refuses to run without a value for it. */
  required?: boolean;
  /**
   * The value as the user typed it, with its unit, when it was converted to `unit` (e.g. "165 US gpm" for a
   * value in m3/d); written by `--set` so the header keeps what was given beside the converted value.
   */
  given?: string;
}

/** A place where a template expects a data set to be supplied (for example a drawdown record). */
export interface DataSlot {
  name: string;
  description?: string;
  /** Columns the data set must provide, with their units. */
  columns?: { name: string; unit?: string }[];
}

/** The YAML header between the `---` lines at the top of the file. */
export interface DocumentHeader {
  title: string;
  /** Version of the file format (header key `conebook`). */
  formatVersion: number;
  /** Version of the Conebook library the recorded outputs were produced with (header key `recordedWith`). */
  libraryVersion?: string;
  /** Seed of the pseudo-random generator every run starts from (an integer). */
  seed: number;
  /** Wall-clock limit per cell in milliseconds (header key `limits.cellTimeMs`), at most MAX_CELL_TIME_LIMIT_MS. */
  timeLimitMs?: number;
  /** Memory limit of the sandbox in MiB (header key `limits.memoryMb`), at most MAX_MEMORY_LIMIT_MB. */
  memoryLimitMb?: number;
  parameters: TemplateParameter[];
  dataSlots?: DataSlot[];
  /** Facts of the test for a report (header key `testInformation`): site, dates, wells, rates, people, units. */
  testInformation?: TestInformation;
  /** Header keys this version does not know, kept as parsed so they survive a rewrite. */
  extra: Record<string, unknown>;
}

export type CellKind = "narrative" | "code" | "data" | "chart";

/** The exact text a cell came from, kept by the parser for lossless serialization. Treat as opaque. */
export interface CellOrigin {
  /** Text between the previous block and this cell (blank lines, usually). */
  leading: string;
  /** The cell's marker or opening fence line with the line ending(s) after it, up to the first line of `body`. */
  head: string;
  /** The raw text the source was read from (for fenced cells: the lines inside the fences, with their endings). */
  body: string;
  /** The closing fence line (empty for narrative cells and unclosed fences). */
  tail: string;
  /** Fingerprint of the cell's meaning when parsed; a cell whose fingerprint still matches is written as `text`. */
  snapshot: string;
  /** Text between the cell and its outputs block, when the file had one. */
  outputsLeading?: string;
  /** The outputs block's own text, when the file had one. */
  outputsText?: string;
  /** Fingerprint of the outputs when parsed. */
  outputsSnapshot?: string;
  /** True when the file gave no id and the parser assigned `id`. */
  idAssigned: boolean;
  /** Where the cell's marker (narrative) or opening fence (other kinds) starts. */
  start: Position;
}

interface CellBase {
  id: string;
  kind: CellKind;
  source: string;
  /** Position of the first line of `source` in the file. */
  sourceStart: Position;
  outputs: CellOutput[];
  /** Attributes on the cell's marker that this version does not know, kept for round trips. */
  attributes?: Record<string, string>;
  origin?: CellOrigin;
}

export interface NarrativeCell extends CellBase {
  kind: "narrative";
  /** Present when the cell is a review note (marker `[review:ID]: # "on CELL, open"`, see review-notes.ts). */
  review?: ReviewMark;
}

export interface CodeCell extends CellBase {
  kind: "code";
  language: "ts";
}

/** A data set, as inline CSV in `source` or as a file beside the document pinned by its SHA-256. */
export interface DataCell extends CellBase {
  kind: "data";
  /** The name code and charts use to refer to the data set. */
  name: string;
  format: "csv";
  /** A file beside the document (relative path, forward slashes) and the lowercase hex SHA-256 of its bytes. */
  file?: { path: string; sha256: string };
}

/** A Vega-Lite specification whose data comes by name from values earlier cells produced. */
export interface ChartCell extends CellBase {
  kind: "chart";
  spec: Record<string, unknown>;
  specFormat: "json" | "yaml";
}

export type Cell = NarrativeCell | CodeCell | DataCell | ChartCell;

export type CellOutput =
  | { type: "value"; label?: string; value: number; unit?: string }
  | { type: "text"; text: string }
  | { type: "table"; title?: string; columns: { name: string; unit?: string }[]; rows: (number | string | null)[][] }
  | {
      type: "chart";
      spec: Record<string, unknown>;
      summary: { datasets: { name: string; rows: number; fields: { name: string; min?: number; max?: number }[] }[] };
    }
  | { type: "json"; value: unknown }
  | { type: "control"; name: string; value: number; default: number; unit?: string; min?: number; max?: number; description?: string }
  | { type: "error"; message: string; line?: number; column?: number }
  | { type: "not-run"; reason: string };

export type CellOutputType = CellOutput["type"];

/** The exact header text and document-wide layout the parser saw. Treat as opaque. */
export interface DocumentLayout {
  /** Line ending used for regenerated text: the first line ending of the file. */
  eol: "\n" | "\r\n";
  /** The header from the opening `---` through the closing `---` line, without its final line ending. */
  headerText: string;
  /** Fingerprint of the header when parsed. */
  headerSnapshot: string;
  /** Positions of header fields, by dotted path (`title`, `parameters.0.value`, `limits.cellTimeMs`). */
  headerPositions: Record<string, Position>;
  /** Text after the last cell (line endings, blank lines). */
  trailing: string;
}

export interface ConebookDocument {
  header: DocumentHeader;
  cells: Cell[];
  /** Present on parsed documents; absent on documents built in memory. */
  layout?: DocumentLayout;
}

export type Severity = "error" | "warning";

/** A problem found in a document, with the place it was found. */
export interface Diagnostic {
  severity: Severity;
  /** Stable identifier of the kind of problem, from the message catalogue (messages.ts). */
  code: string;
  message: string;
  file?: string;
  line: number;
  column: number;
  cellId?: string;
}
