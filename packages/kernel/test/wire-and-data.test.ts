import { describe, expect, it } from "vitest";
import { createKernel } from "../src/index.js";
import { numericColumnsOf, parseDataTable, tableRows } from "../src/data-cells.js";
import { decodeWireValue, encodeHostValue, WireDecodeError, WireEncodeError } from "../src/wire.js";
import { makeDoc } from "./helpers.js";

const kernel = createKernel();

/** The json outputs of each cell, in order. */
async function shown(cells: Parameters<typeof makeDoc>[0]): Promise<unknown[]> {
  const r = await kernel.runDocument(makeDoc(cells));
  return Object.values(r.outputs).flatMap((outs) => outs.map((o) => (o.type === "json" || o.type === "value" ? o.value : o)));
}

describe("the wire format", () => {
  it("round-trips numbers JSON cannot write, undefined, nested Float64Arrays and a __proto__ key", () => {
    const value = {
      specials: [NaN, Infinity, -Infinity, -0, 0, undefined, 1.5],
      nested: { f: new Float64Array([1.25, -2.5]), list: [new Float64Array([3]), { g: new Float64Array(0) }] },
      absent: undefined,
      ["__proto__"]: { polluted: true },
    };
    const back = decodeWireValue(encodeHostValue(value)) as Record<string, unknown>;
    const specials = back.specials as number[];
    expect(specials.length).toBe(7);
    expect(Number.isNaN(specials[0])).toBe(true);
    expect(specials.slice(1, 3)).toEqual([Infinity, -Infinity]);
    expect(Object.is(specials[3], -0)).toBe(true);
    expect(Object.is(specials[4], 0)).toBe(true);
    expect(5 in specials && specials[5] === undefined).toBe(true);
    const nested = back.nested as { f: Float64Array; list: [Float64Array, { g: Float64Array }] };
    expect(nested.f).toBeInstanceOf(Float64Array);
    expect([...nested.f]).toEqual([1.25, -2.5]);
    expect([...nested.list[0]]).toEqual([3]);
    expect(nested.list[1].g.length).toBe(0);
    expect(Object.hasOwn(back, "absent") && back.absent === undefined).toBe(true);
    expect(Object.getPrototypeOf(back)).toBe(Object.prototype);
    expect(Object.getOwnPropertyDescriptor(back, "__proto__")?.value).toEqual({ polluted: true });
  });

  it("copies a Float64Array view's own bytes, leaves functions out and honours toJSON once", () => {
    const base = new Float64Array([1, 2, 3, 4]);
    const wire = encodeHostValue({ view: base.subarray(1, 3), fn: () => 1, list: [() => 1], when: new Date(Date.UTC(2024, 4, 1)) });
    expect(wire.buffers.map((b) => b.byteLength)).toEqual([16]);
    const back = decodeWireValue(wire) as Record<string, unknown>;
    expect([...(back.view as Float64Array)]).toEqual([2, 3]);
    expect("fn" in back).toBe(false);
    expect(back.list).toEqual([null]);
    expect(back.when).toBe("2024-05-01T00:00:00.000Z");
    base[1] = 99;
    expect((back.view as Float64Array)[0]).toBe(2);
  });

  it("refuses a circular host value", () => {
    const a: unknown[] = [];
    a.push(a);
    expect(() => encodeHostValue(a)).toThrow(WireEncodeError);
  });

  it("refuses patches that do not replace a null placeholder, reuse a buffer or name a missing one", () => {
    const buffer = new Float64Array([1]).buffer;
    const bad = [
      { json: "[1, [[], 0]]", why: /null placeholder/ },
      { json: '[{"a": 5}, [["a"], "NaN"]]', why: /null placeholder/ },
      { json: '[{"a": null, "b": null}, [["a"], 0, ["b"], 0]]', why: /more than one/ },
      { json: '[{"a": null}, [["a"], 3]]', why: /no buffer/ },
      { json: '[{"a": null}, [["a", "x"], "NaN"]]', why: /does not name|leaves/ },
      { json: '[{"a": null}, [["a"], "eval"]]', why: /patch code/ },
      { json: '{"a": 1}', why: /not \[value, patches\]/ },
      { json: "[1, [", why: /not JSON/ },
    ];
    for (const { json, why } of bad) {
      expect(() => decodeWireValue({ json, buffers: [buffer] }), json).toThrow(WireDecodeError);
      expect(() => decodeWireValue({ json, buffers: [buffer] }), json).toThrow(why);
    }
  });

  it("passes values between cell and host bit for bit, Float64Array views and special numbers included", async () => {
    // W(u) = E1(u) at 1/u = 1, 0.5, 0.1: E1(1) = 0.21938393439552027, E1(2) = 0.04890051070806112,
    // E1(10) = 4.156968929685324e-6 (mpmath.e1 at 20 digits).
    const [w] = await shown([
      `const buf = new Float64Array([5, 1, 0.5, 0.1, 7]);
       const c = aq.theisTypeCurve(new Float64Array(buf.buffer, 8, 3));
       [c.W instanceof Float64Array, c.W.length, c.W[0], c.W[1], c.W[2]]`,
    ]);
    const [isF64, n, w1, w2, w10] = w as [boolean, number, number, number, number];
    expect([isF64, n]).toEqual([true, 3]);
    expect(w1).toBeCloseTo(0.21938393439552027, 14);
    expect(w2).toBeCloseTo(0.04890051070806112, 15);
    expect(w10 / 4.156968929685324e-6).toBeCloseTo(1, 12);
    // NaN reaches the host's validators as itself, not as null.
    const r = await kernel.runDocument(makeDoc(["aq.expint1(NaN)"]));
    expect(r.outputs.c1![0]).toMatchObject({ type: "error", message: "TypeError: aq.expint1: argument 1 (x) must be a finite number >= 0, got NaN" });
  });

  it("refuses a value that contains itself with a message naming the function", async () => {
    const r = await kernel.runDocument(makeDoc(["const a: unknown[] = []; a.push(a); aq.expint1(a)"]));
    expect(r.outputs.c1![0]).toMatchObject({ type: "error" });
    const e = r.outputs.c1![0]!;
    if (e.type === "error") expect(e.message).toMatch(/^TypeError: aq\.expint1: argument list, field "0"(, field "0")* contains itself; pass data without cycles$/);
    expect(r.status.c1).toBe("error");
  });
});

describe("data cells in columns", () => {
  const csv = "t, s ,note\n1,0.12,start\n2,,\n4,0.2,3\n";

  it("reads numeric columns into Float64Array with NaN for empty fields and keeps other columns as field values", () => {
    const table = parseDataTable("obs", csv);
    expect(table.columns).toEqual(["t", "s", "note"]);
    expect(table.length).toBe(3);
    expect(table.values[0]).toBeInstanceOf(Float64Array);
    expect([...table.values[0]!]).toEqual([1, 2, 4]);
    expect(table.values[1]).toBeInstanceOf(Float64Array);
    expect(Number.isNaN(table.values[1]![1])).toBe(true);
    expect(table.values[2]).toEqual(["start", null, 3]);
    expect(tableRows(table)).toEqual([
      { t: 1, s: 0.12, note: "start" },
      { t: 2, s: null, note: null },
      { t: 4, s: 0.2, note: 3 },
    ]);
  });

  it("turns a column to field values when text follows thousands of numbers, and reads an all-empty column as nulls", () => {
    const n = 3000;
    const lines = ["t,mixed,blank"];
    for (let i = 0; i < n; i++) lines.push(`${i * 0.5},${i === n - 1 ? "dry" : i},`);
    const table = parseDataTable("long", lines.join("\n"));
    expect(table.length).toBe(n);
    expect(table.values[0]).toBeInstanceOf(Float64Array);
    expect(table.values[0]!.length).toBe(n);
    expect(table.values[0]![n - 1]).toBe((n - 1) * 0.5);
    const mixed = table.values[1] as (number | string | null)[];
    expect(Array.isArray(mixed)).toBe(true);
    expect(mixed.slice(0, 3)).toEqual([0, 1, 2]);
    expect(mixed[n - 1]).toBe("dry");
    expect(mixed.length).toBe(n);
    expect(table.values[2]).toEqual(new Array(n).fill(null));
  });

  it("reads a text column from the CSV text only when it is first used, and keeps it from then on", () => {
    const table = parseDataTable("obs", csv);
    expect(typeof Object.getOwnPropertyDescriptor(table.values, 2)!.get).toBe("function");
    expect(numericColumnsOf(table).map((c) => c && Array.from(c).length)).toEqual([3, 3, null]);
    expect(typeof Object.getOwnPropertyDescriptor(table.values, 2)!.get).toBe("function");
    const first = table.values[2];
    expect(first).toEqual(["start", null, 3]);
    expect(Object.getOwnPropertyDescriptor(table.values, 2)!.value).toBe(first);
    expect(table.values[2]).toBe(first);
  });

  it("names the line of a row with the wrong number of fields", () => {
    expect(() => parseDataTable("obs", "t,s\n1,2\n3\n", 10)).toThrow('data "obs", line 12: 1 fields but the header has 2; give one field per column');
  });

  it("gives a cell the same rows as before, built on first reading, with the columns as Float64Array in byColumn", async () => {
    const out = await shown([
      { kind: "data", name: "obs", source: csv },
      `const before = typeof Object.getOwnPropertyDescriptor(obs, "rows")!.get;
       const rows = obs.rows;
       [before, typeof Object.getOwnPropertyDescriptor(obs, "rows")!.get, obs.rows === rows, Object.keys(obs),
        obs.byColumn.t instanceof Float64Array, Array.from(obs.byColumn.t), Number.isNaN(obs.byColumn.s[1]), obs.byColumn.note, rows]`,
    ]);
    expect(out[0]).toEqual([
      "function",
      "undefined",
      true,
      ["name", "columns", "rows", "csv", "byColumn"],
      true,
      [1, 2, 4],
      true,
      ["start", null, 3],
      [
        { t: 1, s: 0.12, note: "start" },
        { t: 2, s: null, note: null },
        { t: 4, s: 0.2, note: 3 },
      ],
    ]);
  });

  it("builds rows from the file even after a cell changed columns or byColumn, and a __proto__ column stays a field", async () => {
    const out = await shown([
      { kind: "data", name: "obs", source: "t,__proto__\n1,2\n" },
      `obs.columns[0] = "x"; obs.byColumn.t[0] = 99;
       const row = obs.rows[0];
       [Object.keys(row), row.t, Object.getPrototypeOf(row) === Object.prototype, Object.getOwnPropertyDescriptor(row, "__proto__")!.value]`,
    ]);
    expect(out[0]).toEqual([["t", "__proto__"], 1, true, 2]);
  });
});
