/**
 * One run of a loaded document through the kernel, with the overrides the CLI derives from settings and the
 * data files read beside the document.
 */
import type { Cell } from "@conebook/document";
import type { RecordedControl, RunResult } from "@conebook/kernel";
import { createNodeKernel, fileReaderFor } from "@conebook/kernel/node";
import type { Io } from "./io.js";
import type { LoadedDocument } from "./load.js";

/** The file line where a cell starts (its fence or marker). */
export function cellLine(cell: Cell): number {
  return (cell.origin?.start ?? cell.sourceStart).line;
}

/**
 * Runs every cell of `loaded.document` with `overrides` and the control values recorded in it (`recorded`; none
 * for a fresh run); progress lines go to standard error when it is a terminal.
 */
export async function execute(
  loaded: LoadedDocument,
  overrides: Record<string, number>,
  io: Io,
  recorded: Record<string, RecordedControl> = {},
): Promise<RunResult> {
  const kernel = createNodeKernel();
  const byId = new Map(loaded.document.cells.map((c) => [c.id, c]));
  try {
    return await kernel.runDocument(loaded.document, {
      overrides,
      recordedControls: recorded,
      readFile: fileReaderFor(loaded.folder),
      onProgress: (p) => {
        if (!io.progress) return;
        const cell = byId.get(p.cellId);
        io.err(`[${p.index + 1}/${p.total}] ${cell?.kind ?? "cell"} ${p.cellId}: ${p.status} (${p.elapsedMs.toFixed(0)} ms)`);
      },
    });
  } finally {
    kernel.dispose();
  }
}
