/**
 * Fingerprints of a cell's parts. The serializer compares them with the fingerprints taken at parse time to
 * decide which parts of the original text can be written back unchanged.
 */

import { stableStringify } from "./text.js";
import type { Cell } from "./types.js";

/** What the marker line or opening fence says: id, kind and attributes. */
export function markerKey(cell: Cell): string {
  const base = { id: cell.id, kind: cell.kind, attributes: cell.attributes ?? {} };
  switch (cell.kind) {
    case "narrative":
      return cell.review ? stableStringify({ ...base, review: cell.review }) : stableStringify(base);
    case "code":
      return stableStringify({ ...base, language: cell.language });
    case "data":
      return stableStringify({ ...base, name: cell.name, format: cell.format, file: cell.file ?? null });
    case "chart":
      return stableStringify({ ...base, specFormat: cell.specFormat });
  }
}

/** What the body says: the source, and for charts the parsed specification. */
export function bodyKey(cell: Cell): string {
  return cell.kind === "chart" ? stableStringify({ source: cell.source, spec: cell.spec }) : stableStringify({ source: cell.source });
}

/** Fingerprint of the whole cell, stored in CellOrigin.snapshot. */
export function cellSnapshot(cell: Cell): string {
  return stableStringify({ marker: markerKey(cell), body: bodyKey(cell) });
}

/** Fingerprint of an outputs block: the id it names (null when it names none) and the outputs. */
export function outputsKey(id: string | null, outputs: unknown): string {
  return stableStringify({ id, outputs });
}
