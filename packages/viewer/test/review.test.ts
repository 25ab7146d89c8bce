/**
 * The review view's judgement and "what moves", DOM-free, on the demo run by the kernel in Node: an unchanged
 * document reproduces everywhere; a tampered recorded number is found at its cell and place with the same
 * functions conebook verify uses; a changed pin stops the comparison; a control change moves only what depends on
 * it, by the amount the physics says.
 */
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { parseDocument, type CellOutput, type ConebookDocument } from "@conebook/document";
import { createKernel, recordedOutputs, recordedRunSettings, type PinCheck } from "@conebook/kernel";
import { fileReaderFor } from "@conebook/kernel/node";
import { differingTableCells, headlineNumbers, reviewRun, whatMoves } from "../src/model/review.js";

const NOTEBOOKS = fileURLToPath(new URL("../../../notebooks/", import.meta.url));
const TEXT = readFileSync(`${NOTEBOOKS}kestrel-moor-constant-rate.cone.md`, "utf8");
const kernel = createKernel();

async function run(doc: ConebookDocument, overrides: Record<string, number> = {}): Promise<Record<string, CellOutput[]>> {
  const settings = recordedRunSettings(doc);
  return (await kernel.runDocument(doc, { ...settings, overrides: { ...settings.overrides, ...overrides }, readFile: fileReaderFor(NOTEBOOKS) })).outputs;
}

describe("reviewRun", () => {
  it("finds every cell of the demo reproduced, and a tampered number at its cell and table place", async () => {
    const demo = parseDocument(TEXT).document;
    const fresh = await run(demo);
    const clean = reviewRun(demo, fresh, []);
    expect(clean.summary).toBe("All 21 cells reproduced their recorded outputs (rtol 1e-9, as conebook verify)");
    expect([...clean.cells.values()].every((c) => c.status === "reproduced")).toBe(true);

    const tampered = parseDocument(TEXT.replace("        75.44428496433848,", "        74.44428496433848,")).document;
    const review = reviewRun(tampered, fresh, []);
    expect(review.summary).toBe("1 of 21 cells differ from the record (rtol 1e-9, as conebook verify)");
    const compare = review.cells.get("compare")!;
    expect(compare.status).toBe("differs");
    expect(compare.differences.map((d) => [d.path, d.recorded, d.fresh])).toEqual([["[0].rows[0][3]", 74.44428496433848, 75.44428496433848]]);
    expect([...differingTableCells(compare.differences, 0).keys()]).toEqual(["0,3"]);
  });

  it("compares nothing when a pinned file changed, as verify refuses to", () => {
    const demo = parseDocument(TEXT).document;
    const pin: PinCheck = { cellId: "ob1-record", name: "ob1", path: "data/kestrel-moor-km-ob1.csv", line: 49, pinned: "a".repeat(64), status: "changed", actual: "b".repeat(64) } as PinCheck;
    const review = reviewRun(demo, {}, [pin]);
    expect(review.cells.size).toBe(0);
    expect(review.summary).toContain("A pinned data file changed or cannot be read (data/kestrel-moor-km-ob1.csv)");
  });
});

describe("what moves", () => {
  it("lists only the control and the forecast after a change of the proposed rate, each by the rate's ratio", async () => {
    const demo = parseDocument(TEXT).document;
    const before = headlineNumbers(demo, recordedOutputs(demo));
    const after = headlineNumbers(demo, await run(demo, { proposed_rate: 2000 }));
    const { moved, unchanged } = whatMoves(before, after);
    expect(new Set(moved.map((m) => m.cellId))).toEqual(new Set(["forecast-controls", "forecast"]));
    expect(unchanged).toBeGreaterThan(90);
    // Drawdown is linear in the pumping rate (Theis 1935, Hantush and Jacob 1955), and so is the delta-method
    // band around it: every forecast number moves by 2000 / 1450 - 1.
    for (const m of moved) expect(m.change!).toBeCloseTo(2000 / 1450 - 1, 9);
  });
});
