/**
 * Checking a document's narrative references (`{=CELL/ROW/COLUMN}`, docs/format.md) against a run: every
 * reference must resolve in the fresh outputs, and to the number it resolves to in the recorded outputs
 * (within the verify tolerance), so a quote in the prose is checked like any output. Used by `conebook verify`
 * and `export` and by the workbench's review view, so all three judge references alike.
 */
import { findReferences, positionInSource, resolveReference, type CellOutput, type ConebookDocument } from "@conebook/document";
import { numbersAgree } from "./verify.js";

/** One problem with a reference: where it is (file line and column), its text and what is wrong. */
export interface ReferenceProblem {
  line: number;
  column: number;
  cellId: string;
  text: string;
  message: string;
}

/** The references of the document's narrative cells that fail to resolve or changed; `recorded` may be undefined. */
export function referenceProblems(
  doc: ConebookDocument,
  fresh: Readonly<Record<string, readonly CellOutput[]>>,
  recorded: Readonly<Record<string, readonly CellOutput[]>> | undefined,
  tolerance: { rtol: number; atol: number },
): ReferenceProblem[] {
  const problems: ReferenceProblem[] = [];
  for (const cell of doc.cells) {
    if (cell.kind !== "narrative") continue;
    for (const found of findReferences(cell.source)) {
      const at = positionInSource(cell.source, cell.sourceStart, found.offset);
      const add = (text: string, message: string) => problems.push({ line: at.line, column: at.column, cellId: cell.id, text, message });
      if (!("reference" in found)) {
        add(found.text, found.problem);
        continue;
      }
      const now = resolveReference(found.reference, fresh);
      if ("problem" in now) {
        add(found.reference.text, now.problem);
        continue;
      }
      if (recorded === undefined) continue;
      const then = resolveReference(found.reference, recorded);
      if ("problem" in then) add(found.reference.text, `resolves now (${now.resolved.value}) but not in the recorded outputs: ${then.problem}`);
      else if (!numbersAgree(then.resolved.value, now.resolved.value, tolerance.rtol, tolerance.atol)) {
        add(found.reference.text, `recorded ${then.resolved.value}, now ${now.resolved.value}`);
      }
    }
  }
  return problems;
}

