/**
 * Writing a document for saving. Recorded outputs are written only from a complete successful run of the
 * document as it is (`recordable`), as `conebook run --write` does; a cell whose fresh outputs agree with its
 * recorded ones within the verify tolerance (the kernel's `compareOutputs`) keeps its recorded text byte for
 * byte, so rerunning and saving does not rewrite outputs that only moved in the last bit (browser and Node
 * engines differ there). Without a recordable run the recorded outputs stay as they are.
 */
import { serializeDocument, withOutputs, type CellOutput, type ConebookDocument } from "@conebook/document";
import { compareOutputs } from "@conebook/kernel";
import aquiferPackage from "../../../aquifer/package.json" with { type: "json" };
import { recordable, type RunRecord } from "./runs.js";

/** Version of the aquifer library the page runs, written to `recordedWith` when outputs are recorded. */
export const AQUIFER_VERSION: string = aquiferPackage.version;

/** The outputs to record by cell id: fresh ones only where they differ from the record beyond the tolerance. */
export function outputsToRecord(doc: ConebookDocument, fresh: Record<string, CellOutput[]>): Record<string, CellOutput[]> {
  const changed: Record<string, CellOutput[]> = {};
  for (const cell of doc.cells) {
    if (cell.kind === "narrative") continue;
    const next = fresh[cell.id] ?? [];
    if (compareOutputs({ [cell.id]: cell.outputs }, { [cell.id]: next }).length > 0) changed[cell.id] = next;
  }
  return changed;
}

/** What a save writes: the text, and the document it describes (with recorded outputs when a run was recorded). */
export interface SaveText {
  text: string;
  doc: ConebookDocument;
  /** Number of cells whose recorded outputs were replaced; undefined when no run was recorded. */
  recordedCells?: number;
}

/**
 * The text to save for `doc`. With a recordable `run` the fresh outputs are recorded (ids the parser assigned
 * of cells that get outputs are then written, as `run --write` writes them); otherwise the text is the document as edited, untouched
 * parts byte for byte. Throws DocumentError when a cell cannot be written (see serializeDocument).
 */
export function textToSave(doc: ConebookDocument, run: RunRecord | undefined): SaveText {
  if (run && recordable(run, doc) && run.result) {
    const changed = outputsToRecord(doc, run.result.outputs);
    const next = Object.keys(changed).length === 0 && doc.header.libraryVersion === AQUIFER_VERSION ? doc : withOutputs(doc, changed, { libraryVersion: AQUIFER_VERSION });
    // Ids the parser assigned are written only where outputs are recorded for such a cell (an outputs block
    // must name its cell); elsewhere untouched text stays as it was.
    const writeAssignedIds = next.cells.some((c) => Object.hasOwn(changed, c.id) && c.origin?.idAssigned === true);
    return { text: serializeDocument(next, { writeAssignedIds }), doc: next, recordedCells: Object.keys(changed).length };
  }
  return { text: serializeDocument(doc, { writeAssignedIds: false }), doc };
}
