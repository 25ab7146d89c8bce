/**
 * The line a command prints for a narrative reference that fails its check (the check itself is the kernel's
 * `referenceProblems`, shared with the workbench's review view).
 */
import { referenceProblems, type ReferenceProblem } from "@conebook/kernel";
import { place } from "./errors.js";

export { referenceProblems, type ReferenceProblem };

/** The line a command prints for a reference problem. */
export function referenceProblemLine(shown: string, p: ReferenceProblem): string {
  return `${place(shown, p.line, p.column)}: narrative ${p.cellId}: reference ${p.text}: ${p.message}`;
}
