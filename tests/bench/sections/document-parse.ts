/**
 * Parsing documents (packages/document): `parseDocument` of a 10 MB document made from the notebooks and templates
 * (packages/document/test/large-document.ts: the demo's header, a 1 MB narrative cell, a 2 MB inline data cell,
 * then every notebook's and template's cells over and over with renamed ids: about 1,600 cells with their recorded
 * outputs), and of a 10 MB document of 116,000 small cells (tests/support/document-mutations.ts, largeDocument),
 * with wall and CPU time (best of five) and the ratio of 4 MB to 1 MB. Every parse is checked: no diagnostic, and
 * the text written back byte for byte.
 */
import { parseDocument, serializeDocument } from "@conebook/document";
import { documentFromNotebooks } from "../../../packages/document/test/large-document.js";
import { largeDocument } from "../../support/document-mutations.js";
import type { Measurement, Sample } from "../harness.js";

const MB = 2 ** 20;

/** Best of `repeats` parses of `text` (wall and CPU, ms), after checking that it reads cleanly and writes back. */
function timeParse(text: string, repeats: number): Sample & { cells: number } {
  const { document, diagnostics } = parseDocument(text);
  if (diagnostics.length > 0) throw new Error(`the bench document has ${diagnostics.length} diagnostics, first: ${diagnostics[0]!.message}`);
  if (serializeDocument(document, { writeAssignedIds: false }) !== text) throw new Error("the bench document does not write back byte for byte");
  let wallMs = Infinity;
  let cpuMs = Infinity;
  for (let i = 0; i < repeats; i++) {
    const cpu0 = process.cpuUsage();
    const t0 = performance.now();
    parseDocument(text);
    wallMs = Math.min(wallMs, performance.now() - t0);
    const cpu = process.cpuUsage(cpu0);
    cpuMs = Math.min(cpuMs, (cpu.user + cpu.system) / 1000);
  }
  return { wallMs, cpuMs, cells: document.cells.length };
}

export function documentParseBenchmarks(): Measurement[] {
  const rows: Measurement[] = [];
  const notebooks = timeParse(documentFromNotebooks(10 * MB), 5);
  rows.push({
    name: "parse a 10 MB document made from the notebooks, wall",
    value: notebooks.wallMs,
    cpu: notebooks.cpuMs,
    unit: "ms",
    target: { absolute: 1000 },
    note: `${notebooks.cells} cells with their outputs, a 1 MB narrative and a 2 MB data cell; best of 5; CPU counts every thread of the process (the collector's too)`,
  });
  const small = timeParse(documentFromNotebooks(1 * MB), 5);
  const large = timeParse(documentFromNotebooks(4 * MB), 5);
  rows.push({
    name: "parse time of 4 MB over 1 MB (from the notebooks)",
    value: large.wallMs / small.wallMs,
    unit: "x",
    target: { absolute: 6 },
    note: `1 MB in ${small.wallMs.toFixed(0)} ms, 4 MB in ${large.wallMs.toFixed(0)} ms; linear is 4`,
  });
  const dense = timeParse(largeDocument(10 * MB), 3);
  rows.push({
    name: "parse a 10 MB document of small cells, wall",
    value: dense.wallMs,
    cpu: dense.cpuMs,
    unit: "ms",
    target: { absolute: 1000 },
    note: `${dense.cells} cells of about 90 characters each (narrative, code, data in turn); best of 3`,
  });
  return rows;
}
