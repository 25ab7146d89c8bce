import type { Cell, ConebookDocument, DocumentHeader } from "@conebook/document";

type CellInput =
  | string
  | { kind: "code"; source: string; id?: string }
  | { kind: "data"; name: string; source?: string; file?: { path: string; sha256: string }; id?: string }
  | { kind: "chart"; spec: Record<string, unknown>; id?: string }
  | { kind: "narrative"; source: string; id?: string };

/**
 * An in-memory document: strings are code cells. Each cell's source is placed as if the file had a
 * 3-line gap (fence and blank line) before it, so file lines differ from cell lines.
 */
export function makeDoc(cells: CellInput[], header: Partial<DocumentHeader> = {}): ConebookDocument {
  let line = 5;
  const out: Cell[] = cells.map((c, i) => {
    const input = typeof c === "string" ? { kind: "code" as const, source: c } : c;
    const id = input.id ?? `c${i + 1}`;
    const source = "source" in input && input.source !== undefined ? input.source : "";
    const start = { line, column: 1 };
    line += source.split("\n").length + 3;
    const base = { id, source, sourceStart: start, outputs: [] };
    switch (input.kind) {
      case "code":
        return { ...base, kind: "code", language: "ts" };
      case "narrative":
        return { ...base, kind: "narrative" };
      case "data":
        return { ...base, kind: "data", name: input.name, format: "csv", ...(input.file ? { file: input.file } : {}) };
      case "chart":
        return { ...base, kind: "chart", spec: input.spec, specFormat: "json" };
    }
  });
  return { header: { title: "test", formatVersion: 1, seed: 42, parameters: [], extra: {}, ...header }, cells: out };
}
