import { describe, expect, it } from "vitest";
import type { CellOutput } from "@conebook/document";
import { parseDocument, sha256Hex, utf8Bytes } from "@conebook/document";
import { DEFAULT_RTOL, checkDataPins, compareOutputs, numbersAgree, recordedOutputs } from "../src/index.js";

const value = (v: number, unit = "m2/d", label = "T"): CellOutput => ({ type: "value", value: v, unit, label });

describe("numbersAgree", () => {
  it("treats 0.1 + 0.2 and 0.3 as equal at the default tolerance", () => {
    // IEEE 754 double: 0.1 + 0.2 = 0.30000000000000004, a relative difference of about 1.85e-16 (common practice, no source).
    expect(0.1 + 0.2).not.toBe(0.3);
    expect(numbersAgree(0.1 + 0.2, 0.3, DEFAULT_RTOL)).toBe(true);
  });

  it("separates numbers just outside the relative tolerance from numbers just inside it", () => {
    expect(numbersAgree(1000, 1000 * (1 + 0.9e-9), 1e-9)).toBe(true);
    expect(numbersAgree(1000, 1000 * (1 + 1.1e-9), 1e-9)).toBe(false);
  });

  it("matches zero only with zero unless an absolute tolerance is given", () => {
    expect(numbersAgree(0, 0, 1e-9)).toBe(true);
    expect(numbersAgree(0, 1e-300, 1e-9)).toBe(false);
    expect(numbersAgree(0, 1e-13, 1e-9, 1e-12)).toBe(true);
  });
});

describe("compareOutputs", () => {
  it("reports nothing for identical outputs and for numbers within the tolerance", () => {
    const rec = { fit: [value(152.4), { type: "text", text: "late data on one line" } as CellOutput] };
    const now = { fit: [value(152.4 * (1 + 1e-12)), { type: "text", text: "late data on one line" } as CellOutput] };
    expect(compareOutputs(rec, now)).toEqual([]);
  });

  it("names the cell, the path and both values of a changed number", () => {
    const d = compareOutputs({ fit: [value(152.4), value(2.1e-4, "1", "S")] }, { fit: [value(152.4), value(2.2e-4, "1", "S")] });
    expect(d).toHaveLength(1);
    expect(d[0]).toMatchObject({ cellId: "fit", path: "[1].value", kind: "number", recorded: 2.1e-4, fresh: 2.2e-4 });
    // |2.1e-4 - 2.2e-4| / 2.2e-4 = 0.04545...
    expect(d[0]!.note).toBe("relative difference 4.55e-2");
  });

  it("compares text exactly, including units and labels", () => {
    const d = compareOutputs({ a: [value(1, "m2/d")] }, { a: [value(1, "m2/s")] });
    expect(d).toEqual([{ cellId: "a", path: "[0].unit", kind: "text", recorded: "m2/d", fresh: "m2/s" }]);
  });

  it("compares tables cell by cell and names the row and column", () => {
    const table = (x: number): CellOutput => ({
      type: "table",
      title: "Fitted parameters",
      columns: [{ name: "parameter" }, { name: "estimate", unit: "m2/d" }],
      rows: [["T", 150], ["S", x]],
    });
    const d = compareOutputs({ fit: [table(2e-4)] }, { fit: [table(3e-4)] });
    expect(d).toHaveLength(1);
    expect(d[0]).toMatchObject({ path: "[0].rows[1][1]", recorded: 2e-4, fresh: 3e-4 });
    expect(d[0]!.note).toMatch(/^row 2, column "estimate" \(m2\/d\), relative difference 3\.33e-1$/);
  });

  it("compares a chart's spec and inline data value by value", () => {
    const chart = (s: number): CellOutput => ({
      type: "chart",
      spec: { mark: "point", data: { name: "obs", values: [{ t: 60, s: 0.2 }, { t: 120, s }] } },
      summary: { datasets: [{ name: "obs", rows: 2, fields: [] }] },
    });
    expect(compareOutputs({ c: [chart(0.45)] }, { c: [chart(0.45)] })).toEqual([]);
    const d = compareOutputs({ c: [chart(0.45)] }, { c: [chart(0.46)] });
    expect(d.map((x) => x.path)).toEqual(["[0].spec.data.values[1].s"]);
  });

  it("reports a cell that now fails with the error's place", () => {
    const d = compareOutputs({ fit: [value(152.4)] }, { fit: [{ type: "error", message: "RangeError: T must be > 0", line: 41, column: 7 }] });
    expect(d).toHaveLength(1);
    expect(d[0]).toMatchObject({ cellId: "fit", kind: "error", path: "[0]" });
    expect(d[0]!.note).toBe("the cell now fails at line 41, column 7: RangeError: T must be > 0");
  });

  it("reports missing and extra outputs and non-finite numbers recorded as null", () => {
    const d = compareOutputs({ a: [value(1), value(2)], b: [] }, { a: [value(1)], b: [{ type: "json", value: [null, 1] }] });
    expect(d.map((x) => [x.cellId, x.path, x.kind])).toEqual([
      ["a", "[1]", "missing"],
      ["b", "[0]", "extra"],
    ]);
    const n = compareOutputs({ j: [{ type: "json", value: [null] }] }, { j: [{ type: "json", value: [0] }] });
    expect(n[0]).toMatchObject({ kind: "type", note: "recorded null, now number" });
  });

  it("refuses a negative tolerance", () => {
    expect(() => compareOutputs({}, {}, { rtol: -1 })).toThrow(/tolerances must be numbers >= 0/);
  });
});

describe("checkDataPins and recordedOutputs", () => {
  const csv = "t_s,s_m\n60,0.229\n";
  const pin = sha256Hex(utf8Bytes(csv));
  const text = [
    "---",
    "conebook: 1",
    "title: pins",
    "seed: 1",
    "---",
    "",
    `\`\`\`csv data:obs file=obs.csv sha256=${pin}`,
    "```",
    "",
    "```ts code:a",
    "1 + 1",
    "```",
    "",
    "```json outputs:a",
    '[{"type":"value","value":2}]',
    "```",
    "",
  ].join("\n");
  const { document } = parseDocument(text);

  it("finds a pinned file unchanged, changed (with both digests) or unreadable", async () => {
    const ok = await checkDataPins(document, () => utf8Bytes(csv));
    expect(ok).toEqual([{ cellId: "obs", name: "obs", path: "obs.csv", line: 7, pinned: pin, actual: pin, status: "ok" }]);
    const changed = await checkDataPins(document, () => utf8Bytes(csv.replace("0.229", "0.230")));
    expect(changed[0]).toMatchObject({ status: "changed", pinned: pin, actual: sha256Hex(utf8Bytes("t_s,s_m\n60,0.230\n")) });
    const gone = await checkDataPins(document, () => {
      throw new Error("ENOENT: no such file");
    });
    expect(gone[0]).toMatchObject({ status: "unreadable", reason: "ENOENT: no such file" });
  });

  it("collects recorded outputs of executable cells by id", () => {
    expect(recordedOutputs(document)).toEqual({ obs: [], a: [{ type: "value", value: 2 }] });
  });
});
