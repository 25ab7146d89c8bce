/**
 * The control values a run in the page uses, by the same rule as `conebook run` and `conebook verify`: the
 * values recorded in the document's control outputs (first record of each name), then the numeric template
 * parameters of the header over them. So a document run in the page and verified by the CLI meets the same
 * values. (tests/browser checks both give the same outputs for every notebook.)
 */
import type { ConebookDocument } from "@conebook/document";

/** Control overrides for a run of `doc` as recorded. */
export function recordedRunOverrides(doc: ConebookDocument): Record<string, number> {
  const out: Record<string, number> = {};
  for (const cell of doc.cells) {
    for (const o of cell.outputs) if (o.type === "control" && !Object.hasOwn(out, o.name)) out[o.name] = o.value;
  }
  for (const p of doc.header.parameters) if (typeof p.value === "number") out[p.name] = p.value;
  return out;
}
