/**
 * Making and editing cells for transactions: a cell with new source text, a new empty cell of a kind with an
 * id no other cell has, and a cell turned into another kind. Pure functions over the document package's types.
 */
import { parse as parseYaml } from "yaml";
import type { Cell, CellKind, ChartCell, ConebookDocument } from "@conebook/document";

/** The kinds a user can choose, in menu order, with the word the page shows. */
export const CELL_KINDS: readonly { kind: CellKind; label: string }[] = [
  { kind: "narrative", label: "text" },
  { kind: "code", label: "code" },
  { kind: "data", label: "data" },
  { kind: "chart", label: "chart" },
];

/** The result of reading a chart cell's source: the spec, or the reason it could not be read. */
export type SpecReading = { spec: Record<string, unknown> } | { problem: string; line?: number };

/** Reads chart source text as YAML or JSON; the spec must be an object. */
export function readChartSource(source: string, format: "json" | "yaml"): SpecReading {
  try {
    const value: unknown = format === "json" ? JSON.parse(source) : parseYaml(source, { prettyErrors: true });
    if (value === null || typeof value !== "object" || Array.isArray(value)) return { problem: "a chart specification must be a mapping (key: value lines), not a list or a single value" };
    return { spec: value as Record<string, unknown> };
  } catch (e) {
    const err = e as { message?: string; linePos?: { line: number }[] };
    const line = err.linePos?.[0]?.line;
    return { problem: (err.message ?? String(e)).split("\n")[0]!, ...(line !== undefined ? { line } : {}) };
  }
}

/**
 * The cell with new source text. For a chart the spec is read from the text; when the text does not read,
 * the last good spec is kept (the text is still saved as typed and the problem is shown in the cell).
 */
export function withSource(cell: Cell, source: string): Cell {
  if (cell.kind !== "chart") return { ...cell, source };
  const reading = readChartSource(source, cell.specFormat);
  return { ...cell, source, spec: "spec" in reading ? reading.spec : cell.spec } as ChartCell;
}

/** An id `${base}-${n}` no cell of `doc` has (n from 1). */
export function freshId(doc: ConebookDocument, base: string): string {
  const used = new Set(doc.cells.map((c) => c.id));
  for (let n = 1; ; n++) {
    const id = `${base}-${n}`;
    if (!used.has(id)) return id;
  }
}

const STARTER: Record<CellKind, string> = {
  narrative: "",
  code: "",
  data: "name,value\n",
  chart: "data: {name: observed}\nmark: point\nencoding:\n  x: {field: t, type: quantitative}\n  y: {field: s, type: quantitative}",
};

/** A new cell of `kind` with a fresh id, to be inserted into `doc`; `source` defaults to a small starter. */
export function newCell(doc: ConebookDocument, kind: CellKind, source = STARTER[kind]): Cell {
  const id = freshId(doc, kind === "narrative" ? "text" : kind);
  return cellOfKind(id, kind, source);
}

function cellOfKind(id: string, kind: CellKind, source: string): Cell {
  const base = { id, source, sourceStart: { line: 1, column: 1 }, outputs: [] };
  switch (kind) {
    case "narrative":
      return { ...base, kind };
    case "code":
      return { ...base, kind, language: "ts" };
    case "data":
      return { ...base, kind, name: id.replace(/[^A-Za-z0-9_]/g, "_"), format: "csv" };
    case "chart": {
      const reading = readChartSource(source, "yaml");
      return { ...base, kind, specFormat: "yaml", spec: "spec" in reading ? reading.spec : {} };
    }
  }
}

/**
 * The cell turned into `kind`, keeping its id and source text. Its recorded outputs are dropped (they belong to
 * the old kind) and so is its parse origin, so the serializer writes it afresh. A file-pinned data cell keeps
 * no file when it changes kind.
 */
export function changeKind(cell: Cell, kind: CellKind): Cell {
  if (cell.kind === kind) return cell;
  return cellOfKind(cell.id, kind, cell.source);
}
