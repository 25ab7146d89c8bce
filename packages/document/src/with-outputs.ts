import { DocumentError } from "./errors.js";
import { messages } from "./messages.js";
import type { Cell, CellOutput, ConebookDocument } from "./types.js";

export interface WithOutputsOptions {
  /** Version of the library the outputs were produced with; written to the header as `recordedWith`. */
  libraryVersion: string;
}

/**
 * A new document whose cells named in `outputsByCellId` carry the given outputs instead of their recorded ones;
 * other cells keep theirs. The input document is not changed. Serializing the result rewrites only the outputs
 * blocks that changed and the `recordedWith` header value. Throws DocumentError for an id no cell has, or for
 * outputs given to a narrative cell (which never has outputs).
 */
export function withOutputs(
  doc: ConebookDocument,
  outputsByCellId: Record<string, CellOutput[]>,
  options: WithOutputsOptions,
): ConebookDocument {
  const byId = new Map(doc.cells.map((c) => [c.id, c]));
  for (const id of Object.keys(outputsByCellId)) {
    const cell = byId.get(id);
    if (!cell) {
      throw new DocumentError(messages.outputsUnknownCell(id), { line: 1, column: 1 });
    }
    if (cell.kind === "narrative" && outputsByCellId[id]!.length > 0) {
      throw new DocumentError(messages.outputsForNarrative(id), cell.origin?.start ?? cell.sourceStart);
    }
  }
  const cells = doc.cells.map((cell): Cell => {
    const outputs = outputsByCellId[cell.id];
    return outputs === undefined ? cell : { ...cell, outputs: [...outputs] };
  });
  return { ...doc, header: { ...doc.header, libraryVersion: options.libraryVersion }, cells };
}
