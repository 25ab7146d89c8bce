/**
 * Parsing takes time linear in the text: a document made from the notebooks and templates (large-document.ts)
 * four times as long takes less than eight times as long to parse (linear is four, quadratic sixteen; the figure
 * itself, 10 MB under a second, is in `npm run bench -- --only=document`). A ratio of the best of five rounds,
 * measured in turn, rather than a timing, so that a slow or busy machine does not fail it while a quadratic step
 * (the YAML package's duplicate-key check was one) does.
 */
import { describe, expect, it } from "vitest";
import { parseDocument, serializeDocument } from "../src/index.js";
import { documentFromNotebooks, notebookTexts } from "./large-document.js";

const MB = 2 ** 20;

function parseMs(text: string): number {
  const t0 = performance.now();
  parseDocument(text);
  return performance.now() - t0;
}

describe("parse time", () => {
  it("grows linearly with a document made from the notebooks: four times the text in under eight times the time", () => {
    const texts = notebookTexts();
    const small = documentFromNotebooks(1 * MB, texts);
    const large = documentFromNotebooks(4 * MB, texts);
    const { document, diagnostics } = parseDocument(large);
    expect(diagnostics).toEqual([]);
    expect(document.cells.length).toBeGreaterThan(500);
    expect(serializeDocument(document, { writeAssignedIds: false })).toBe(large);
    let tSmall = Infinity;
    let tLarge = Infinity;
    for (let round = 0; round < 5; round++) {
      tSmall = Math.min(tSmall, parseMs(small));
      tLarge = Math.min(tLarge, parseMs(large));
    }
    console.log(`parser: 1 MB from the notebooks in ${tSmall.toFixed(0)} ms, 4 MB in ${tLarge.toFixed(0)} ms (${(tLarge / tSmall).toFixed(2)}x)`);
    expect(tLarge / tSmall).toBeLessThan(8);
  }, 60_000);
});
