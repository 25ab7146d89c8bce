import { describe, expect, it } from "vitest";
import { createKernel } from "../src/index.js";
import { makeDoc } from "./helpers.js";

const kernel = createKernel();

describe("running cells", () => {
  it("shares top-level const, let and function declarations between cells", async () => {
    const doc = makeDoc(["const a: number = 2;\nlet b = 3;\nfunction f(x: number) { return x * 10 }", "a + b + f(1)"]);
    const r = await kernel.runDocument(doc);
    expect(r.status).toEqual({ c1: "ok", c2: "ok" });
    expect(r.outputs.c2).toEqual([{ type: "value", value: 15 }]);
  });

  it("maps a runtime error to the user's line and column in the file after type stripping", async () => {
    // Cell 2 starts on file line 9 (see makeDoc). The error is on cell line 3; `.foo` starts at column 34
    // of the TypeScript line, which is further right than in the stripped JavaScript (annotations removed).
    const doc = makeDoc(["const ok = 1", "const x: number = 1;\nconst y: string = 'a';\nconst z: { foo: number } | null = null as any; z.foo"]);
    const r = await kernel.runDocument(doc);
    expect(r.status.c2).toBe("error");
    const err = r.outputs.c2![0]!;
    expect(err.type).toBe("error");
    if (err.type !== "error") return;
    expect(err.message).toMatch(/TypeError: cannot read property 'foo' of null/);
    expect(err.line).toBe(doc.cells[1]!.sourceStart.line + 2);
    const tsLine = "const z: { foo: number } | null = null as any; z.foo";
    expect(err.column).toBe(tsLine.indexOf(".foo") + 1);
  });

  it("reports a syntax error at its line and column in the file", async () => {
    const doc = makeDoc(["const a = 1;\nconst b = ;"]);
    const r = await kernel.runDocument(doc);
    const err = r.outputs.c1![0]!;
    expect(err).toMatchObject({ type: "error", line: doc.cells[0]!.sourceStart.line + 1, column: 11 });
  });

  it("stops at a thrown error and marks the later cells not-run", async () => {
    const doc = makeDoc(["const a = 1", "throw new Error('bad data')", "a + 1", { kind: "narrative", source: "text" }, "2"]);
    const r = await kernel.runDocument(doc);
    expect(r.status).toEqual({ c1: "ok", c2: "error", c3: "not-run", c5: "not-run" });
    // QuickJS places a thrown error at the call that made it: the "(" of Error(...).
    expect(r.outputs.c2![0]).toMatchObject({ type: "error", message: "Error: bad data", line: doc.cells[1]!.sourceStart.line, column: 16 });
    expect(r.outputs.c3).toEqual([{ type: "not-run", reason: "an earlier cell (c2) failed" }]);
  });

  it("turns the last expression into value, text or json outputs and records show() calls in order", async () => {
    const doc = makeDoc(["show('first'); show(2.5); ({ a: [1, 2], b: new Float64Array([0.5]) })", "'text'", "const q = 1;"]);
    const r = await kernel.runDocument(doc);
    expect(r.outputs.c1).toEqual([
      { type: "text", text: "first" },
      { type: "value", value: 2.5 },
      { type: "json", value: { a: [1, 2], b: [0.5] } },
    ]);
    expect(r.outputs.c2).toEqual([{ type: "text", text: "text" }]);
    expect(r.outputs.c3).toEqual([]);
  });

  it("shows every display called as a statement, once each, in call order", async () => {
    const doc = makeDoc([
      "show.value(1.19, 'm', 'drawdown per log cycle');\nshow.value(0.00123, 'm2/s', 'transmissivity');\nconst done = 1;",
      "for (const k of [1, 2]) show.value(k, 'm');\nshow(show.json({ k: 3 }));\nshow.table([{ a: 1 }])",
      "const line = charts.residuals({ t: [1, 2], residual: [0.1, -0.1] });\nshow.value(5);\nshow(line);\nline",
    ]);
    const r = await kernel.runDocument(doc);
    expect(r.outputs.c1).toEqual([
      { type: "value", value: 1.19, unit: "m", label: "drawdown per log cycle" },
      { type: "value", value: 0.00123, unit: "m2/s", label: "transmissivity" },
    ]);
    expect(r.outputs.c2).toEqual([
      { type: "value", value: 1, unit: "m" },
      { type: "value", value: 2, unit: "m" },
      { type: "json", value: { k: 3 } },
      { type: "table", columns: [{ name: "a" }], rows: [[1]] },
    ]);
    expect(r.outputs.c3!.map((o) => o.type)).toEqual(["chart", "value"]);
  });

  it("shows a display made in an earlier cell again when a later cell shows it", async () => {
    const r = await kernel.runDocument(makeDoc(["const v = show.value(2, 'm');", "show(v); v"]));
    expect(r.outputs.c1).toEqual([{ type: "value", value: 2, unit: "m" }]);
    expect(r.outputs.c2).toEqual([{ type: "value", value: 2, unit: "m" }]);
  });

  it("reports a display that cannot be shown at the line of the call", async () => {
    const doc = makeDoc(["const a = 1;\nshow.table(42);\nconst b = 2;"]);
    const r = await kernel.runDocument(doc);
    expect(r.outputs.c1![0]).toMatchObject({ type: "error", line: doc.cells[0]!.sourceStart.line + 1 });
  });

  it("shows values with units, tables and fit parameter tables", async () => {
    const doc = makeDoc([
      "show(show.value(152.4, 'm2/d', 'T'))",
      "show.table([{ t: 1, s: 0.2 }, { t: 2, s: 0.35 }], { units: { t: 'min', s: 'm' }, title: 'obs' })",
      "show.fit({ modelName: 'Theis', parameters: [{ name: 'T', unit: 'm2/d', estimate: 150, standardError: 5, interval95: [140, 160] }] })",
    ]);
    const r = await kernel.runDocument(doc);
    expect(r.outputs.c1).toEqual([{ type: "value", value: 152.4, unit: "m2/d", label: "T" }]);
    expect(r.outputs.c2).toEqual([
      { type: "table", title: "obs", columns: [{ name: "t", unit: "min" }, { name: "s", unit: "m" }], rows: [[1, 0.2], [2, 0.35]] },
    ]);
    expect(r.outputs.c3![0]).toMatchObject({ type: "table", title: "Fitted parameters: Theis", rows: [["T", 150, 5, 140, 160, "m2/d", null]] });
  });
});

describe("controls", () => {
  const cells = ["const Q = control('Q', { value: 500, min: 100, max: 800, unit: 'm3/d' });", "Q * 2"];

  it("returns the default value and records a control output", async () => {
    const r = await kernel.runDocument(makeDoc(cells));
    expect(r.outputs.c1).toEqual([{ type: "control", name: "Q", value: 500, default: 500, min: 100, max: 800, unit: "m3/d" }]);
    expect(r.outputs.c2).toEqual([{ type: "value", value: 1000 }]);
    expect(r.controlsUsed.map((c) => c.cellId)).toEqual(["c1"]);
  });

  it("applies an override inside the range and names unused overrides", async () => {
    const r = await kernel.runDocument(makeDoc(cells), { overrides: { Q: 650, Qq: 1 } });
    expect(r.outputs.c2).toEqual([{ type: "value", value: 1300 }]);
    expect(r.unusedOverrides).toEqual(["Qq"]);
  });

  it("refuses an override outside the range with a message naming the control and the range", async () => {
    const r = await kernel.runDocument(makeDoc(cells), { overrides: { Q: 900 } });
    expect(r.status.c1).toBe("error");
    expect(r.outputs.c1![0]).toMatchObject({
      type: "error",
      message: 'TypeError: control "Q": the override 900 m3/d lies outside the allowed range 100..800 m3/d; choose a value in the range',
    });
    expect(r.status.c2).toBe("not-run");
  });
});
