/**
 * The page's DOM-free document model in Node: transactions and their inverses, undo and redo across cells with
 * typing merged into one step, the dirty state, which results are out of date after an edit, what a save
 * writes (untouched text byte for byte; outputs recorded only from a complete successful run and only where
 * they moved beyond the verify tolerance), display thinning, the line diff and the outline.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { parseDocument, serializeDocument, writeOutputs, type Cell, type CellOutput, type ConebookDocument } from "@conebook/document";
import type { RunResult } from "@conebook/kernel";
import { changeKind, newCell, withSource } from "../src/model/cells.js";
import { lineDiff } from "../src/model/line-diff.js";
import { outlineOf } from "../src/model/outline.js";
import { textToSave } from "../src/model/recording.js";
import { currentPrefix, shownResults, startRun, withResult, type RunRecord } from "../src/model/runs.js";
import { DocumentStore, MERGE_EDITS_MS } from "../src/model/store.js";
import { thinRows, thinSpec } from "../src/model/thin.js";
import { applyTransaction, deleteCell, insertCell, moveCell, replaceCell, TransactionError } from "../src/model/transaction.js";

const TEXT = `---
conebook: 1
title: Model test (invented)
seed: 2
recordedWith: 0.1.0
---

# Heading one

Some words.

\`\`\`ts code:a
const x = 2;
x
\`\`\`

\`\`\`json outputs:a
[{"type":"value","value":2}]
\`\`\`

## Heading two

\`\`\`ts code:b
x * 3
\`\`\`

\`\`\`json outputs:b
[{"type":"value","value":6}]
\`\`\`
`;

const parsed = () => parseDocument(TEXT).document;
const cellOf = (doc: ConebookDocument, id: string) => doc.cells.find((c) => c.id === id)!;

function fakeResult(doc: ConebookDocument, outputs: Record<string, CellOutput[]>): RunResult {
  const ids = doc.cells.filter((c) => c.kind !== "narrative").map((c) => c.id);
  return {
    outputs,
    status: Object.fromEntries(ids.map((id) => [id, "ok" as const])),
    timings: { cells: Object.fromEntries(ids.map((id) => [id, 1])), sandboxStartMs: 1, totalMs: 2 },
    controlsUsed: [],
    unusedOverrides: [],
    limits: { timeLimitMs: 10000, memoryLimitMb: 256 },
  } as unknown as RunResult;
}

describe("transactions", () => {
  it("apply splices in order and return an inverse that restores the very same cell objects", () => {
    const doc = parsed();
    const tr = moveCell(doc, "b", -1)!;
    const { doc: moved, inverse } = applyTransaction(doc, tr);
    expect(moved.cells.map((c) => c.id)).toEqual(["narrative1", "a", "b", "narrative2"]);
    const back = applyTransaction(moved, inverse).doc;
    expect(back.cells.every((c, i) => c === doc.cells[i])).toBe(true);
  });

  it("refuse a splice past the end and a change that would duplicate an id, naming them", () => {
    const doc = parsed();
    expect(() => applyTransaction(doc, { splices: [{ from: 3, to: 9, insert: [] }], userEvent: "delete" })).toThrow(new TransactionError("invalid splice 3..9 in a document of 4 cells"));
    expect(() => applyTransaction(doc, insertCell(0, cellOf(doc, "a")))).toThrow('the change would give two cells the id "a"');
    expect(moveCell(doc, "narrative1", -1)).toBeUndefined();
  });
});

describe("the store", () => {
  it("merges typing in one cell into one undo step, keeps steps of different cells apart, and undoes across cells", () => {
    let now = 0;
    const store = new DocumentStore(parsed(), () => now);
    const type = (id: string, text: string) => store.dispatch(replaceCell(store.doc, id, withSource(cellOf(store.doc, id), text), "edit"));
    type("a", "const x = 2;\nx ");
    now += 100;
    type("a", "const x = 2;\nx + 1");
    now += MERGE_EDITS_MS + 1;
    type("b", "x * 4");
    store.dispatch(deleteCell(store.doc, "narrative2"));
    expect(store.dirty).toBe(true);
    expect(store.undo()).toBe(true);
    expect(store.doc.cells.map((c) => c.id)).toContain("narrative2");
    expect(store.undo()).toBe(true);
    expect(cellOf(store.doc, "b").source).toBe("x * 3");
    expect(store.undo()).toBe(true);
    expect(cellOf(store.doc, "a").source).toBe("const x = 2;\nx");
    expect(store.dirty).toBe(false);
    expect(store.undo()).toBe(false);
    expect(store.redo()).toBe(true);
    expect(cellOf(store.doc, "a").source).toBe("const x = 2;\nx + 1");
    expect(store.dirty).toBe(true);
  });

  it("tells every listener of every change, undo and redo included", () => {
    const store = new DocumentStore(parsed());
    const seen: string[] = [];
    store.subscribe((tr) => seen.push(tr.userEvent));
    store.dispatch(insertCell(0, newCell(store.doc, "code")));
    store.undo();
    store.redo();
    expect(seen).toEqual(["insert", "undo", "redo"]);
    expect(cellOf(store.doc, "code-1").kind).toBe("code");
  });
});

describe("editing cells", () => {
  it("keeps a chart's last good spec while its text does not read, and changes kind keeping id and text", () => {
    const { document } = parseDocument(`---\nconebook: 1\ntitle: t\nseed: 1\n---\n\n\`\`\`yaml chart:c\nmark: point\n\`\`\`\n`);
    const chart = cellOf(document, "c");
    const broken = withSource(chart, "mark: [point");
    expect(broken.kind === "chart" && broken.spec).toEqual({ mark: "point" });
    const fixed = withSource(broken, "mark: line");
    expect(fixed.kind === "chart" && fixed.spec).toEqual({ mark: "line" });
    const asCode = changeKind(fixed, "code");
    expect({ id: asCode.id, kind: asCode.kind, source: asCode.source, outputs: asCode.outputs }).toEqual({ id: "c", kind: "code", source: "mark: line", outputs: [] });
  });
});

describe("runs and out-of-date results", () => {
  it("marks an edited cell and every executable cell below it out of date, and nothing for a narrative edit", () => {
    const store = new DocumentStore(parsed());
    const doc = store.doc;
    const run: RunRecord = withResult(startRun(1, "all", doc, undefined, {}, 0), fakeResult(doc, { a: [{ type: "value", value: 2 }], b: [{ type: "value", value: 6 }] }), 1);
    expect(currentPrefix(run, doc)).toBe(2);
    store.dispatch(replaceCell(store.doc, "narrative2", withSource(cellOf(store.doc, "narrative2"), "## Renamed"), "edit"));
    expect(currentPrefix(run, store.doc)).toBe(2);
    store.dispatch(replaceCell(store.doc, "a", withSource(cellOf(store.doc, "a"), "const x = 5;\nx"), "edit"));
    const shown = shownResults(store.doc, [run], doc);
    expect([shown.get("a")!.outOfDate, shown.get("b")!.outOfDate]).toEqual([true, true]);
    expect(shown.get("b")!.source).toBe("run");
  });
});

describe("what a save writes", () => {
  it("writes every untouched byte as it was and regenerates only the edited cell", () => {
    const doc = parsed();
    const edited = applyTransaction(doc, replaceCell(doc, "b", withSource(cellOf(doc, "b"), "x * 30"), "edit")).doc;
    expect(textToSave(edited, undefined).text).toBe(TEXT.replace("x * 3\n", "x * 30\n"));
  });

  it("records outputs only from a complete successful run of the document as it is, and only where they moved", () => {
    const doc = parsed();
    const last1ulp = 6 * (1 + Number.EPSILON);
    const run = withResult(startRun(1, "all", doc, undefined, {}, 0), fakeResult(doc, { a: [{ type: "value", value: 2 }], b: [{ type: "value", value: last1ulp }] }), 1);
    // Within the verify tolerance: nothing is rewritten.
    expect(textToSave(doc, run)).toMatchObject({ text: TEXT, recordedCells: 0 });
    const moved = withResult(startRun(2, "all", doc, undefined, {}, 0), fakeResult(doc, { a: [{ type: "value", value: 2 }], b: [{ type: "value", value: 7 }] }), 1);
    const saved = textToSave(doc, moved);
    expect(saved.recordedCells).toBe(1);
    expect(saved.text).toBe(TEXT.replace('[{"type":"value","value":6}]', writeOutputs([{ type: "value", value: 7 }])));
    expect(saved.text).toContain('"value":7');
    // A run of a part of the document, or of an older version, records nothing.
    const part = withResult(startRun(3, "cell", { ...doc, cells: doc.cells.slice(0, 2) }, "a", {}, 0), fakeResult({ ...doc, cells: doc.cells.slice(0, 2) }, { a: [{ type: "value", value: 9 }] }), 1);
    expect(textToSave(doc, part)).toEqual({ text: TEXT, doc });
  });

  it("round-trips every notebook byte for byte when nothing was edited", () => {
    for (const path of ["kestrel-moor-constant-rate.cone.md", "templates/constant-rate-test.cone.md"]) {
      const text = readFileSync(new URL(`../../../notebooks/${path}`, import.meta.url), "utf8");
      expect(textToSave(parseDocument(text).document, undefined).text, path).toBe(text);
      expect(serializeDocument(parseDocument(text).document, { writeAssignedIds: false })).toBe(text);
    }
  });
});

describe("thinning for display", () => {
  it("keeps every row of a small dataset and, of 100,000 rows, at most the limit with each block's extremes", () => {
    const small = [{ t: 1, s: 2 }];
    expect(thinRows(small)).toBe(small);
    const rows = Array.from({ length: 100_000 }, (_, i) => ({ t: i, s: Math.sin(i / 50) + (i === 77_777 ? 10 : 0) }));
    const drawn = thinRows(rows, 5000);
    expect(drawn.length).toBeLessThanOrEqual(5000);
    expect(drawn.length).toBeGreaterThan(2000);
    expect(Math.max(...drawn.map((r) => r.s as number))).toBe(Math.max(...rows.map((r) => r.s)));
    expect(drawn.map((r) => r.t as number)).toEqual([...drawn.map((r) => r.t as number)].sort((a, b) => a - b));
    const { spec, notes } = thinSpec({ layer: [{ data: { name: "big", values: rows } }] }, 5000);
    expect(notes).toEqual([{ name: "big", rows: 100_000, drawn: drawn.length }]);
    expect(((spec.layer as { data: { values: unknown[] } }[])[0]!.data.values).length).toBe(drawn.length);
  });
});

describe("compare and outline", () => {
  it("diffs lines as kept, removed and added", () => {
    expect(lineDiff("a\nb\nc", "a\nB\nc\nd")).toEqual([
      { op: "same", text: "a" },
      { op: "removed", text: "b" },
      { op: "added", text: "B" },
      { op: "same", text: "c" },
      { op: "added", text: "d" },
    ]);
  });

  it("lists ATX headings of narrative cells outside code fences", () => {
    const cells = [{ id: "n", kind: "narrative", source: "# One\n\n```\n# not a heading\n```\n### Three ###" } as Cell];
    expect(outlineOf(cells)).toEqual([
      { cellId: "n", level: 1, text: "One" },
      { cellId: "n", level: 3, text: "Three" },
    ]);
  });
});
