/** One test per claim of docs/sandbox.md; the test names are the claims. */
import { describe, expect, it } from "vitest";
import { newQuickJSWASMModuleFromVariant, TestQuickJSWASMModule, type QuickJSSyncVariant } from "quickjs-emscripten-core";
import DEBUG_SYNC from "@jitl/quickjs-wasmfile-debug-sync";
import { createKernel } from "../src/index.js";
import { makeDoc } from "./helpers.js";

const kernel = createKernel();
const first = async (cells: Parameters<typeof makeDoc>[0], header = {}) => {
  const r = await kernel.runDocument(makeDoc(cells, header));
  return { r, out: r.outputs };
};

describe("sandbox safety contract", () => {
  it("gives the Function constructor only the guest global", async () => {
    const { out } = await first([
      `const g = (() => {}).constructor("return this")();
       [g === globalThis, typeof g.process, typeof g.require, typeof g.fetch, typeof g.std, typeof g.os, typeof g.WebAssembly, typeof g.host]`,
    ]);
    expect(out.c1).toEqual([{ type: "json", value: [true, "undefined", "undefined", "undefined", "undefined", "undefined", "undefined", "undefined"] }]);
  });

  it("keeps prototype tampering in a cell away from the host", async () => {
    const before = Object.getOwnPropertyNames(Object.prototype).sort();
    const { r } = await first(["Object.prototype.polluted = 1; Array.prototype.map = null; JSON.stringify = () => 'x'; 1", "aq.expint1(1)"]);
    expect(r.status).toEqual({ c1: "ok", c2: "ok" });
    expect(Object.getOwnPropertyNames(Object.prototype).sort()).toEqual(before);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
    // E1(1) = 0.21938393439552... (Abramowitz & Stegun 1964, table 5.1); the bridge still encodes correctly.
    expect(r.outputs.c2![0]).toMatchObject({ type: "value" });
    const v = r.outputs.c2![0]!;
    if (v.type === "value") expect(v.value).toBeCloseTo(0.21938393439552, 12);
  });

  it("shows no host code through bridge functions' toString or constructor", async () => {
    const { out } = await first([
      `[String(aq.expint1).includes("validator"), String(aq.expint1).includes("expint1Scaled"),
        aq.expint1.constructor === Function, Object.getPrototypeOf(aq.expint1) === Function.prototype,
        Object.isFrozen(aq), Object.keys(aq.expint1).length]`,
    ]);
    expect(out.c1).toEqual([{ type: "json", value: [false, false, true, true, true, 0] }]);
  });

  it("refuses functions and class instances as bridge arguments with a message naming the function", async () => {
    const { out } = await first(["aq.expint1(() => 1)"]);
    expect(out.c1![0]).toMatchObject({ type: "error", message: "TypeError: aq.expint1: argument list, field \"0\" is a function; only numbers, strings, booleans, null, arrays, plain objects and Float64Array can be passed" });
  });

  it("validates every bridge argument and names the function and argument", async () => {
    const { out } = await first(["aq.expint1(-1)"]);
    expect(out.c1![0]).toMatchObject({ type: "error", message: "TypeError: aq.expint1: argument 1 (x) must be a finite number >= 0, got -1" });
  });

  it("passes Float64Array both ways", async () => {
    const { out } = await first(["const c = aq.theisTypeCurve(new Float64Array([1, 10])); [c.W instanceof Float64Array, c.W.length, c.W[0]]"]);
    // W(u = 1) = E1(1) = 0.21938393439552 (Abramowitz & Stegun 1964, table 5.1).
    const v = out.c1![0]!;
    expect(v.type).toBe("json");
    if (v.type !== "json") return;
    const [isF64, length, w0] = v.value as [boolean, number, number];
    expect([isF64, length]).toEqual([true, 2]);
    expect(w0).toBeCloseTo(0.21938393439552, 12);
  });

  it("reports the real error when a cell gave Object.prototype a toJSON or threw a value whose getter never returns", async () => {
    const polluted = "Object.prototype.toJSON = function () { return 'replaced' };";
    const { out } = await first([`${polluted} aq.expint1(1)`]);
    expect(out.c1![0]).toMatchObject({
      type: "error",
      message: "TypeError: aq.expint1: argument list cannot be passed while Object.prototype has a toJSON method, which would replace every value sent to the host; delete Object.prototype.toJSON",
    });
    const { out: thrown } = await first([`${polluted} aq.expint1(-1)`.replace("aq.expint1(-1)", "throw new RangeError('own message')")]);
    expect(thrown.c1![0]).toMatchObject({ type: "error", message: "RangeError: own message" });
    const { out: stuck } = await first(["throw { get message() { for (;;) {} } }"], { timeLimitMs: 200 });
    expect(stuck.c1![0]).toMatchObject({ type: "error", message: expect.stringMatching(/^Cell c1 was stopped after running for its time limit of 200 ms\./) });
  });

  it("interrupts an endless loop after the time limit with a clear message", async () => {
    const t0 = performance.now();
    const { r, out } = await first(["1", "while (true) {}", "2"], { timeLimitMs: 200 });
    const elapsed = performance.now() - t0;
    expect(out.c2![0]).toMatchObject({
      type: "error",
      message: "Cell c2 was stopped after running for its time limit of 200 ms. Make the computation smaller (fewer points, fewer iterations), or raise limits.cellTimeMs in the header (at most 600000).",
    });
    expect(r.status.c3).toBe("not-run");
    expect(elapsed).toBeGreaterThan(190);
    expect(elapsed).toBeLessThan(1500);
  });

  it("stops a huge string at the memory limit with a clear message", async () => {
    // 2^26 one-byte characters are 64 MiB, twice the limit.
    const { out } = await first(["const huge = 'x'.repeat(2 ** 26); huge.length"], { memoryLimitMb: 32 });
    expect(out.c1![0]).toMatchObject({ type: "error" });
    const e = out.c1![0]!;
    if (e.type === "error") expect(e.message).toMatch(/^Cell c1 ran out of memory: the sandbox may use 32 MiB\./);
  });

  it("stops deep recursion at the stack limit and the host runs the next document", async () => {
    const { out } = await first(["function down(n: number): number { return down(n + 1) + 1 }\ndown(0)"]);
    const e = out.c1![0]!;
    expect(e.type).toBe("error");
    if (e.type === "error") expect(e.message).toMatch(/nested function calls too deeply \(the stack limit is 128 KiB\)/);
    const next = await kernel.runDocument(makeDoc(["6 * 7"]));
    expect(next.outputs.c1).toEqual([{ type: "value", value: 42 }]);
  });

  it("refuses to read the clock", async () => {
    const { out } = await first(["Date.now()"]);
    const e = out.c1![0]!;
    if (e.type !== "error") throw new Error("expected an error");
    expect(e.message).toMatch(/^Error: Date.now\(\) reads the clock/);
    const { out: out2 } = await first(["new Date()"]);
    expect(out2.c1![0]).toMatchObject({ type: "error" });
  });

  it("treats local time as UTC", async () => {
    const { out } = await first([
      `const d = new Date(2024, 0, 15, 8, 30); [d.getTime() === Date.UTC(2024, 0, 15, 8, 30), d.getHours(), d.getTimezoneOffset(), String(d),
        new Date("2024-05-01T08:00").toISOString(), (1234567.891).toLocaleString()]`,
    ]);
    expect(out.c1).toEqual([{ type: "json", value: [true, 8, 0, "2024-01-15T08:30:00.000Z", "2024-05-01T08:00:00.000Z", "1234567.891"] }]);
  });

  it("seeds Math.random from the header seed", async () => {
    const cell = "[Math.random(), Math.random(), Math.random()]";
    const a = (await first([cell], { seed: 7 })).out.c1;
    const b = (await first([cell], { seed: 7 })).out.c1;
    const c = (await first([cell], { seed: 8 })).out.c1;
    expect(a).toEqual(b);
    expect(a).not.toEqual(c);
  });

  it("produces identical outputs when the same document runs twice", async () => {
    const doc = makeDoc([
      "const xs = Array.from({ length: 5 }, () => Math.random());",
      "show.table(xs.map((x, i) => ({ i, x })))",
      "charts.residuals({ t: [1, 2, 3], residual: xs.slice(0, 3) })",
    ]);
    const a = await kernel.runDocument(doc);
    const b = await kernel.runDocument(doc);
    expect(a.outputs).toEqual(b.outputs);
    expect(JSON.stringify(a.outputs)).toBe(JSON.stringify(b.outputs));
  });

  it("leaves no QuickJS memory allocated after a run", async () => {
    const debug = new TestQuickJSWASMModule(await newQuickJSWASMModuleFromVariant(DEBUG_SYNC as unknown as QuickJSSyncVariant));
    const leakKernel = createKernel({ loadModule: () => debug as never });
    const doc = makeDoc([
      "const c = aq.theisTypeCurve([1, 2, 3]); show(c); control('k', { value: 1, min: 0, max: 2 })",
      { kind: "data", name: "obs", source: "t,s\n1,0.1\n2,0.2" },
      { kind: "chart", spec: { mark: "point", data: { name: "obs" } } },
      "throw new Error('stop')",
    ]);
    const r = await leakKernel.runDocument(doc);
    expect(r.status).toEqual({ c1: "ok", c2: "ok", c3: "ok", c4: "error" });
    // quickjs-emscripten 0.32's TestQuickJSWASMModule does not forget disposed runtimes (checked: newRuntime then
    // dispose leaves runtimes.size at 1), so check each is disposed, then run the wasm-level leak sanitizer.
    expect([...debug.runtimes].map((rt) => rt.alive)).toEqual([false]);
    debug.runtimes.clear();
    expect(() => debug.assertNoMemoryAllocated()).not.toThrow();
  });
});
