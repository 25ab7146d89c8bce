/**
 * What the prelude installs stays as installed: a cell cannot replace the library, the display and control
 * functions, the data tables, the seeded Math.random or the clock-free Date. Each test name is a claim of
 * docs/sandbox.md.
 */
import { describe, expect, it } from "vitest";
import { createKernel } from "../src/index.js";
import { makeDoc } from "./helpers.js";

const kernel = createKernel();

/** Runs `attack` (a function body) in a cell and reports how it ended: "refused: TypeError", "returned: ...". */
const attempt = (attack: string) => `(() => { try { const r = (() => { ${attack} })(); return "returned: " + String(r); } catch (e) { return "refused: " + e.name; } })()`;

describe("sandbox integrity", () => {
  it("keeps aq, charts, show and control in place when a cell redefines them on the global object", async () => {
    const attacks = [
      `Object.defineProperty(globalThis, "aq", { value: { expint1: () => 42 } })`,
      `Object.defineProperty(globalThis, "show", { value: () => 1 })`,
      `Object.defineProperties(globalThis, { control: { value: () => 7 } })`,
      `return Reflect.defineProperty(globalThis, "charts", { value: {} })`,
      `Object.defineProperty(globalThis, "aq", { get: () => ({}) })`,
      `Object.defineProperty(globalThis, "aq", { configurable: true })`,
      `globalThis.aq = {}`,
      `delete globalThis.show`,
    ];
    const r = await kernel.runDocument(
      makeDoc([
        `[${attacks.map(attempt).join(", ")}]`,
        // E1(1) = 0.21938393439552... (Abramowitz & Stegun 1964, table 5.1): still the library's value.
        "[aq.expint1(1), typeof show.json, typeof control, typeof charts.logLogDrawdown]",
      ]),
    );
    expect(r.outputs.c1).toEqual([{ type: "json", value: [
      "refused: TypeError", "refused: TypeError", "refused: TypeError", "returned: false",
      "refused: TypeError", "refused: TypeError", "refused: TypeError", "refused: TypeError",
    ] }]);
    const [e1, ...kinds] = (r.outputs.c2![0] as { value: unknown[] }).value;
    expect(e1).toBeCloseTo(0.21938393439552, 12);
    expect(kinds).toEqual(["function", "function", "function"]);
  });

  it("lets a cell redefine only what the language allows on the global object", async () => {
    // A configurable global a cell made itself may be redefined; an identical redefinition of a locked one passes.
    const r = await kernel.runDocument(
      makeDoc([
        `globalThis.mine = 1; Object.defineProperty(globalThis, "mine", { value: 2 });
         const d = Object.getOwnPropertyDescriptor(globalThis, "aq");
         Object.defineProperty(globalThis, "aq", { value: d.value, writable: false, enumerable: false, configurable: false });
         [mine, aq === d.value]`,
      ]),
    );
    expect(r.outputs.c1).toEqual([{ type: "json", value: [2, true] }]);
  });

  it("keeps a data table in place when a cell redefines its name", async () => {
    const r = await kernel.runDocument(
      makeDoc([
        { kind: "data", name: "obs", source: "t,s\n1,0.5\n2,0.9" },
        attempt(`Object.defineProperty(globalThis, "obs", { value: { rows: [] } })`),
        "obs.rows.length",
      ]),
    );
    expect(r.outputs.c2).toEqual([{ type: "text", text: "refused: TypeError" }]);
    expect(r.outputs.c3).toEqual([{ type: "value", value: 2 }]);
  });

  it("keeps the seeded Math.random and the clock-free Date in place", async () => {
    const r = await kernel.runDocument(
      makeDoc([
        `[${[`Math.random = () => 0.5`, `Object.defineProperty(Math, "random", { value: () => 0.5 })`, `Date = function () {}`, `Date.now = () => 0`]
          .map(attempt)
          .join(", ")}]`,
        attempt("return Date.now()"),
      ]),
    );
    expect(r.outputs.c1).toEqual([{ type: "json", value: ["refused: TypeError", "refused: TypeError", "refused: TypeError", "refused: TypeError"] }]);
    expect(r.outputs.c2).toEqual([{ type: "text", text: "refused: Error" }]);
  });
});

describe("names every JavaScript object already has", () => {
  it("are refused as control names, with a message saying why", async () => {
    const r = await kernel.runDocument(makeDoc([`control("__proto__", { value: 1, min: 0, max: 2 })`, `control("constructor", { value: 1, min: 0, max: 2 })`].map((c) => attempt(`return ${c}`)).concat([`control("__proto__", { value: 1, min: 0, max: 2 })`])));
    expect(r.outputs.c1).toEqual([{ type: "text", text: "refused: TypeError" }]);
    expect(r.outputs.c2).toEqual([{ type: "text", text: "refused: TypeError" }]);
    expect(r.outputs.c3![0]).toMatchObject({
      type: "error",
      message: 'TypeError: control: argument 1 (name) "__proto__" is reserved: every JavaScript object has a property of that name; choose another name',
    });
    expect(r.controlsUsed).toEqual([]);
  });

  it("are refused as own keys of a value shown or passed to the host", async () => {
    const r = await kernel.runDocument(makeDoc([
      attempt(`show(JSON.parse('{"a": 1, "b": { "__proto__": { "c": 2 } }}'))`),
      `aq.expint1(JSON.parse('{"__proto__": 1}'))`,
    ]));
    expect(r.outputs.c1).toEqual([{ type: "text", text: "refused: TypeError" }]);
    expect(r.outputs.c2![0]).toMatchObject({
      type: "error",
      message: 'TypeError: aq.expint1: argument list, field "__proto__" is a key named "__proto__", which cannot be passed; rename it',
    });
  });
});
