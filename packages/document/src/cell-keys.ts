/**
 * Fingerprints of a cell's parts. The serializer compares them with the fingerprints taken at parse time to
 * decide which parts of the original text can be written back unchanged.
 */

import { stableStringify } from "./text.js";
import type { Cell } from "./types.js";

/** What the marker line or opening fence says: id, kind and attributes. Keys are written in sorted order. */
export function markerKey(cell: Cell): string {
  const attributes = cell.attributes ?? {};
  switch (cell.kind) {
    case "narrative":
      return stableStringify(cell.review ? { attributes, id: cell.id, kind: cell.kind, review: cell.review } : { attributes, id: cell.id, kind: cell.kind });
    case "code":
      return stableStringify({ attributes, id: cell.id, kind: cell.kind, language: cell.language });
    case "data":
      return stableStringify({ attributes, file: cell.file ?? null, format: cell.format, id: cell.id, kind: cell.kind, name: cell.name });
    case "chart":
      return stableStringify({ attributes, id: cell.id, kind: cell.kind, specFormat: cell.specFormat });
  }
}

/** What the body says: the source, and for charts the parsed specification. */
export function bodyKey(cell: Cell): string {
  return cell.kind === "chart" ? stableStringify({ source: cell.source, spec: cell.spec }) : stableStringify({ source: cell.source });
}

/** Fingerprint of the whole cell, stored in CellOrigin.snapshot. */
export function cellSnapshot(cell: Cell): string {
  // stableStringify({ body, marker }) of two strings, written out.
  return `{"body":${JSON.stringify(bodyKey(cell))},"marker":${JSON.stringify(markerKey(cell))}}`;
}

/** Fingerprint of an outputs block: the id it names (null when it names none) and the outputs. */
export function outputsKey(id: string | null, outputs: unknown): string {
  return stableStringify({ id, outputs });
}
