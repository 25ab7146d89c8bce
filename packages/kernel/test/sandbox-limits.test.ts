/**
 * Limits that hold: work inside one native builtin or one host call, memory outside QuickJS's own allocator,
 * and huge inputs all end the cell within its limits (plus the small margin docs/sandbox.md states) with a message
 * naming the limit. Each test name is a claim of docs/sandbox.md; limits are small so each test is fast.
 */
import { describe, expect, it } from "vitest";
import { createKernel, MAX_ELEMENTS_PER_CALL, MAX_FORECAST_VALUES, MAX_PROXY_KEYS, SANDBOX_BASE_MB, HOST_RESERVE_MB } from "../src/index.js";
import { makeDoc } from "./helpers.js";

const kernel = createKernel();

/** Runs one code cell under the given limits; returns its first output and the wall-clock time of the run. */
async function runCell(source: string, limits: { timeLimitMs?: number; memoryLimitMb?: number } = {}) {
  const t0 = performance.now();
  const r = await kernel.runDocument(makeDoc([source, "1"], limits));
  return { out: r.outputs.c1![0]!, next: r.status.c2, ms: performance.now() - t0, result: r };
}

const timeLimitMessage = (ms: number) => `Cell c1 was stopped after running for its time limit of ${ms} ms.`;

describe("limits inside native builtins", () => {
  it("refuses Array.prototype.join over a length of 2^53 - 1 at once", async () => {
    const { out, ms } = await runCell(`Array.prototype.join.call({ length: 2 ** 53 - 1 }, "")`, { timeLimitMs: 300 });
    expect(out).toMatchObject({
      type: "error",
      message: `RangeError: Array.prototype.join: this has length 9007199254740991, more than the ${MAX_ELEMENTS_PER_CALL} elements one call may go through in a cell; work on a shorter array`,
      line: 5,
    });
    expect(ms).toBeLessThan(2000);
  });

  it("refuses a sparse array of length 2^32 - 1 handed to join, indexOf, concat or sort", async () => {
    for (const call of [`Array(2 ** 32 - 1).join("")`, `Array(2 ** 32 - 1).indexOf(1)`, `String(Array(2 ** 32 - 1))`, `Array(2 ** 32 - 1).sort((a, b) => a - b)`]) {
      const { out } = await runCell(call, { timeLimitMs: 300 });
      expect(out, call).toMatchObject({ type: "error", message: expect.stringMatching(/^RangeError: Array\.prototype\.(join|indexOf|sort): this has length 4294967295, more than/) });
    }
    const { out } = await runCell(`[1].concat(Array(2 ** 32 - 2))`);
    expect(out).toMatchObject({ type: "error", message: expect.stringMatching(/^RangeError: Array\.prototype\.concat: the arrays have together a length of 4294967295, more than/) });
  });

  it("refuses one call whose work would take more than about half a second, before it starts", async () => {
    // Sorting 2^22 numbers as strings took 3 s inside one builtin; with a comparator the engine can stop it.
    const cases: [string, RegExp][] = [
      [`Array(2 ** 22).fill(0).sort()`, /^RangeError: Array\.prototype\.sort: sorting 4194304 elements as strings \(no comparator given\) is more work than one call may do in a cell; give a comparator such as \(a, b\) => a - b$/],
      [`new Float64Array(2 ** 22).join()`, /^RangeError: TypedArray\.prototype\.join: this call would do about 41943040 units of work/],
      [`"x".repeat(2 ** 24).repeat(16)`, /^RangeError: String\.prototype\.repeat: this call would do about 33554432 units of work/],
    ];
    for (const [call, message] of cases) {
      const { out } = await runCell(call, { timeLimitMs: 2000 });
      expect(out, call).toMatchObject({ type: "error", message: expect.stringMatching(message) });
    }
    const { out } = await runCell(`[3, 1, 2, 10].sort().join() + " " + new Float64Array([3, 1, 2, 10]).sort().join()`);
    expect(out).toEqual({ type: "text", text: "1,10,2,3 1,2,3,10" });
  });

  it("stops a loop of joins, each short, within its time limit plus half a second", async () => {
    // Each join of 100,000 holes takes about 2 ms inside one builtin; QuickJS checks its interrupt only every
    // 10,000 steps of the interpreter, so without the metering this loop ran 8 to 25 s past a 2 s limit.
    const { out, next, ms } = await runCell(`for (;;) { Array(1e5).join("") }`, { timeLimitMs: 300 });
    expect(out).toMatchObject({ type: "error", message: expect.stringContaining(timeLimitMessage(300)) });
    expect(next).toBe("not-run");
    expect(ms).toBeLessThan(300 + 1500);
  });

  it("stops a loop of typed-array and string scans within its time limit plus half a second", async () => {
    for (const loop of [
      `const a = new Float64Array(1 << 20); for (;;) a.indexOf(1)`,
      `const s = "x".repeat(1 << 22); for (;;) s.indexOf("y")`,
      `const a = new Float64Array(1 << 18); for (;;) a.slice().sort()`,
    ]) {
      const { out, ms } = await runCell(loop, { timeLimitMs: 300 });
      expect(out, loop).toMatchObject({ type: "error", message: expect.stringContaining(timeLimitMessage(300)) });
      expect(ms, loop).toBeLessThan(300 + 1500);
    }
  });

  it("refuses a Proxy whose ownKeys trap returns more keys than a cell may list, also when passed to show", async () => {
    const proxy = `new Proxy({}, { ownKeys() { const k = []; for (let i = 0; i < 300000; i++) k.push("k" + i); return k; },
      getOwnPropertyDescriptor() { return { value: 1, enumerable: true, configurable: true }; } })`;
    for (const use of [`show(${proxy})`, `Object.keys(${proxy})`, `Reflect.ownKeys(${proxy})`]) {
      const { out, ms } = await runCell(use, { timeLimitMs: 2000 });
      expect(out, use).toMatchObject({ type: "error", message: `RangeError: a Proxy's ownKeys trap returned 300000 keys; a cell may list at most ${MAX_PROXY_KEYS}` });
      expect(ms).toBeLessThan(2000);
    }
  });

  it("keeps builtins working as the language defines them", async () => {
    const { out } = await runCell(
      `[[1, 2, 3].join("-"), String([1, [2, 3]]), Array.prototype.join.call({ length: 2, 0: "a", 1: "b" }),
        [3, 1, 2].sort(), [3, 1, 2].sort((a, b) => b - a), new Float64Array([3, 1, 2]).sort().join(), [1, 2].concat([3], 4),
        Object.keys(new Proxy({ a: 1 }, {})), Object.keys(new Proxy({}, { ownKeys: () => ["x"], getOwnPropertyDescriptor: () => ({ value: 1, enumerable: true, configurable: true }) })),
        "abcabc".replaceAll("b", "-"), JSON.stringify({ a: [1, 2] }), typeof Proxy.revocable, Array.prototype.join.length, Array.prototype.join.name]`,
    );
    expect(out).toEqual({ type: "json", value: ["1-2-3", "1,2,3", "a,b", [1, 2, 3], [3, 2, 1], "1,2,3", [1, 2, 3, 4], ["a"], ["x"], "a-ca-c", '{"a":[1,2]}', "function", 1, "join"] });
  });
});

describe("memory outside QuickJS's own allocator", () => {
  it("stops a loop pushing 1 MB Float64Arrays at the memory limit; the sandbox's memory stays under its cap", async () => {
    const { out, next, result } = await runCell(`const a = []; for (;;) a.push(new Float64Array(131072))`, { memoryLimitMb: 64, timeLimitMs: 5000 });
    expect(out).toMatchObject({ type: "error", message: expect.stringMatching(/^Cell c1 ran out of memory: the sandbox may use 64 MiB\./) });
    expect(next).toBe("not-run");
    expect(result.memory.capBytes).toBe((SANDBOX_BASE_MB + 64 + HOST_RESERVE_MB) * 2 ** 20);
    expect(result.memory.peakBytes).toBeLessThanOrEqual(result.memory.capBytes);
  });

  it("stops a loop keeping 1 MB strings at the memory limit", async () => {
    const { out, result } = await runCell(`const a = []; for (;;) a.push("x".repeat(1 << 20) + a.length)`, { memoryLimitMb: 64, timeLimitMs: 5000 });
    expect(out).toMatchObject({ type: "error", message: expect.stringMatching(/^Cell c1 ran out of memory: the sandbox may use 64 MiB\./) });
    expect(result.memory.peakBytes).toBeLessThanOrEqual(result.memory.capBytes);
  });

  it("runs the next document normally after a cell ran out of memory", async () => {
    await runCell(`const a = []; for (;;) a.push(new Float64Array(131072))`, { memoryLimitMb: 32 });
    const { out } = await runCell(`new Float64Array(1 << 20).length`);
    expect(out).toEqual({ type: "value", value: 1 << 20 });
  });
});

describe("limits inside host calls", () => {
  const scheme = `wells: [{ name: "PW-1", x: 0, y: 0, steps: [{ start: 0, rate: 1000 }] }], points: ${JSON.stringify(Array.from({ length: 10 }, (_, i) => ({ name: `P${i}`, x: 50 + 10 * i, y: 0 })))}`;
  const given = `model: "theis", parameters: { T: 300, S: 2e-4 }, covariance: { names: ["T", "S"], matrix: [[400, 0], [0, 1e-10]] }`;

  it("refuses a Monte Carlo forecast larger than its budget before doing any of the work", async () => {
    const times = "Array.from({ length: 1000 }, (_, i) => 0.01 * (i + 1))";
    const { out, ms } = await runCell(`aq.forecastDrawdown({ ${given}, ${scheme}, times: ${times}, uncertainty: { monteCarlo: { samples: 1000000, seed: 1 } } })`, { timeLimitMs: 2000 });
    expect(out).toMatchObject({
      type: "error",
      message: `ForecastInputError: aq.forecastDrawdown: a Monte Carlo forecast of 1000000 samples at 10 points and 1000 times needs 10000000000 drawdown values; one call may compute at most ${MAX_FORECAST_VALUES}. Use fewer samples, points or times.`,
    });
    expect(ms).toBeLessThan(2000);
  });

  it("stops a Monte Carlo forecast within its budget at the cell's time limit", async () => {
    const times = "Array.from({ length: 40 }, (_, i) => 0.01 * (i + 1))";
    const { out, next, ms } = await runCell(`aq.forecastDrawdown({ ${given}, ${scheme}, times: ${times}, uncertainty: { monteCarlo: { samples: 10000, seed: 1 } } })`, { timeLimitMs: 100 });
    expect(out).toMatchObject({ type: "error", message: expect.stringContaining(timeLimitMessage(100)) });
    expect(next).toBe("not-run");
    expect(ms).toBeLessThan(100 + 1500);
  });

  it("stops one import of a long record inside the host's reading at the cell's time limit", async () => {
    // 400,000 readings all at t = 1: read to the end, the import would refuse the repeated times with a CsvError.
    const options = '{ timeColumn: "t", valueColumn: "s", timeUnit: "min", lengthUnit: "m", radius: { value: 10, unit: "m" }, pumpingRate: { value: 100, unit: "m3/d" } }';
    const r = await kernel.runDocument(makeDoc(['const text = "t,s\\n" + "1,0.5\\n".repeat(400000);', `aq.parseObservationCsv(text, ${options})`, "1"], { timeLimitMs: 60 }));
    expect(r.status.c1).toBe("ok");
    expect(r.outputs.c2![0]).toMatchObject({ type: "error", message: expect.stringContaining("Cell c2 was stopped after running for its time limit of 60 ms.") });
    expect(r.status.c3).toBe("not-run");
    expect(r.timings.cells.c2!).toBeLessThan(60 + 1500);
  });

  it("stops the host's reading of a data cell's CSV at the cell's time limit", async () => {
    const csv = ["t,s", ...Array.from({ length: 400_000 }, (_, i) => `${i},${i}`)].join("\n");
    const t0 = performance.now();
    const r = await kernel.runDocument(makeDoc([{ kind: "data", name: "big", source: csv }, "1"], { timeLimitMs: 20 }));
    expect(r.outputs.c1![0]).toMatchObject({ type: "error", message: expect.stringContaining("Cell c1 was stopped after running for its time limit of 20 ms.") });
    expect(r.status.c2).toBe("not-run");
    expect(performance.now() - t0).toBeLessThan(20 + 1500);
  });

  it("stops a fit between two model evaluations at the cell's time limit", async () => {
    // 400,000 readings: the fit takes about 2 s of host time; each evaluation of the Theis model about 10 ms.
    const data = "const t = new Float64Array(400000); for (let i = 0; i < t.length; i++) t[i] = 0.001 * (i + 1); const s = aq.drawdown('theis', { T: 300, S: 2e-4 }, { r: 30, Q: 1000 }, t);";
    const fit = "aq.fitModel({ model: 'theis', wells: [{ name: 'OW-1', geometry: { r: 30, Q: 1000 }, t, s }], start: { T: 30, S: 1e-3 } })";
    const r = await kernel.runDocument(makeDoc([data, fit, "1"], { timeLimitMs: 300, memoryLimitMb: 128 }));
    expect(r.status.c1).toBe("ok");
    expect(r.outputs.c2![0]).toMatchObject({ type: "error", message: expect.stringContaining("Cell c2 was stopped after running for its time limit of 300 ms.") });
    expect(r.status.c3).toBe("not-run");
    expect(r.timings.cells.c2!).toBeLessThan(300 + 1500);
  });

  it("does not let a cell catch the stop of a host call at its time limit", async () => {
    const times = "Array.from({ length: 40 }, (_, i) => 0.01 * (i + 1))";
    const { out } = await runCell(`try { aq.forecastDrawdown({ ${given}, ${scheme}, times: ${times}, uncertainty: { monteCarlo: { samples: 10000, seed: 1 } } }) } catch (e) {} "escaped"`, { timeLimitMs: 100 });
    expect(out).toMatchObject({ type: "error", message: expect.stringContaining(timeLimitMessage(100)) });
  });
});
