import { describe, expect, it } from "vitest";
import { bourdetDerivative, regimeHints, transmissivityFromDerivativeLevel } from "../src/diagnostics/index.js";
import { expint1 } from "../src/special/index.js";

function logGrid(from: number, to: number, perDecade: number): number[] {
  const out: number[] = [];
  for (let k = Math.round(from * perDecade); k <= Math.round(to * perDecade); k++) out.push(10 ** (k / perDecade));
  return out;
}

/** Invented aquifer for the synthetic checks (demo numbers, not from any source). */
const T = 250; // m2/d
const S = 2e-4;
const Q = 1200; // m3/d
const r = 40; // m
const C = Q / (4 * Math.PI * T);
const a = (r * r * S) / (4 * T);
const rate = { value: Q, unit: "m3/d" };

describe("regime hints", () => {
  it("finds a late flat stretch on Theis data and T = Q/(4 pi level) within the bound the flat test implies", () => {
    const t = logGrid(-5, 2, 20);
    const d = bourdetDerivative(t, t.map((x) => C * expint1(a / x)), { smoothingLog10: 0.2 });
    const { hints } = regimeHints(d, { lengthUnit: "m", pumpingRate: rate });
    const flats = hints.filter((h) => h.kind === "flat");
    expect(flats.length).toBe(1);
    const flat = flats[0]!;
    // Theis derivative C e^-u has log-log slope u (d ln e^-u / d ln t = u): "flat" (slope <= 0.1) starts near
    // u = 0.1, i.e. t = 10 a = 3.2e-3 d, and runs to the end of the record.
    expect(flat.timeStart).toBeGreaterThan(5 * a);
    expect(flat.timeStart).toBeLessThan(20 * a);
    expect(flat.timeEnd).toBe(d.times.at(-1));
    expect(Math.abs(flat.slope!)).toBeLessThan(0.1);
    // Level between C e^-0.1 and C, so T from it lies between T and T e^0.1 = 1.105 T.
    const Test = flat.transmissivity!.value;
    expect(Test).toBeGreaterThanOrEqual(T * (1 - 1e-9));
    expect(Test).toBeLessThan(T * Math.exp(0.1));
    expect(flat.transmissivity!.unit).toBe("m2/d");
    expect(flat.message).toMatch(/^Hint, not a verdict/);
    expect(flat.message).toMatch(/infinite-acting radial flow/);
  });

  it("states the time range with the time unit when one is given, and refuses a unit that is not a time", () => {
    const t = logGrid(-5, 2, 20);
    const d = bourdetDerivative(t, t.map((x) => C * expint1(a / x)), { smoothingLog10: 0.2 });
    const flat = regimeHints(d, { lengthUnit: "m", timeUnit: "d", pumpingRate: rate }).hints.find((h) => h.kind === "flat")!;
    expect(flat.message).toMatch(/from t = [0-9.e-]+ to 100 d at level/);
    expect(regimeHints(d, { lengthUnit: "m" }).hints[0]!.message).toMatch(/from t = [0-9.e-]+ to 100 at level/);
    expect(() => regimeHints(d, { lengthUnit: "m", timeUnit: "m" })).toThrow(/time/);
  });

  it("labels unit slope on s = C t data with slope 1", () => {
    // s = c t: ds/d ln t = c t, log-log slope exactly 1 (well-bore storage shape, Papadopulos-Cooper early time).
    const t = logGrid(-4, -1, 10);
    // Ends omitted: a one-sided slope of c e^X is c t (e^h - 1)/h, not proportional to the central c t sinh(h)/h.
    const d = bourdetDerivative(t, t.map((x) => 3.5 * x), { smoothingLog10: 0.1, endpoints: "omit" });
    const { hints } = regimeHints(d, { lengthUnit: "m" });
    expect(hints.map((h) => h.kind)).toEqual(["unit-slope"]);
    expect(hints[0]!.slope!).toBeCloseTo(1, 9);
    expect(hints[0]!.timeStart).toBe(t[1]);
    expect(hints[0]!.timeEnd).toBe(t.at(-2));
    expect(hints[0]!.message).toMatch(/^Hint, not a verdict: .*well-bore storage/);
  });

  it("sees the derivative level double on a barrier-boundary case and says it is a hint", () => {
    // Image well 2 d + r = 2040 m away (straight no-flow boundary 1000 m from the pumping well).
    const ri = 2040;
    const ai = (ri * ri * S) / (4 * T);
    const t = logGrid(-5, 3, 20);
    const d = bourdetDerivative(t, t.map((x) => C * (expint1(a / x) + expint1(ai / x))), { smoothingLog10: 0.2 });
    const { hints } = regimeHints(d, { lengthUnit: "m", pumpingRate: rate });
    const kinds = hints.map((h) => h.kind);
    expect(kinds.filter((k) => k === "flat").length).toBe(2);
    const doubling = hints.find((h) => h.kind === "doubling")!;
    expect(doubling).toBeDefined();
    // Late level 2C e^-ui-ish against early level C e^-u-ish: ratio close to 2.
    expect(doubling.ratio!).toBeGreaterThan(1.9);
    expect(doubling.ratio!).toBeLessThan(2.1);
    expect(doubling.message).toMatch(/^Hint, not a verdict: .*barrier/);
    // The later flat level would give T/2; its message says to take T from the earlier level.
    const late = hints.filter((h) => h.kind === "flat")[1]!;
    expect(late.transmissivity!.value / T).toBeCloseTo(0.5, 1);
    expect(late.message).toMatch(/take T from the earlier flat level/);
    const early = hints.find((h) => h.kind === "flat")!;
    expect(Math.abs(early.transmissivity!.value / T - 1)).toBeLessThan(0.1);
  });

  it("labels a falling derivative on a recharge-boundary case", () => {
    // Constant-head boundary: the image well injects, s = C [E1(u) - E1(ui)]; the derivative C (e^-u - e^-ui)
    // falls as 1/t at late time (log-log slope -1).
    const ri = 2040;
    const ai = (ri * ri * S) / (4 * T);
    const t = logGrid(-5, 3, 20);
    const d = bourdetDerivative(t, t.map((x) => C * (expint1(a / x) - expint1(ai / x))), { smoothingLog10: 0.2 });
    const { hints } = regimeHints(d, { lengthUnit: "m" });
    const falling = hints.filter((h) => h.kind === "falling");
    expect(falling.length).toBe(1);
    expect(falling[0]!.slope!).toBeLessThan(-0.5);
    expect(falling[0]!.slope!).toBeGreaterThan(-1.1);
    expect(falling[0]!.timeStart).toBeGreaterThan(ai / 10);
    expect(falling[0]!.message).toMatch(/^Hint, not a verdict: .*recharge/);
    expect(hints.findIndex((h) => h.kind === "flat")).toBeLessThan(hints.findIndex((h) => h.kind === "falling"));
  });

  it("gives no hint on a stretch too short to judge", () => {
    const t = logGrid(-3, -2.8, 20);
    const d = bourdetDerivative(t, t.map((x) => C * expint1(a / x)), { smoothingLog10: 0 });
    expect(regimeHints(d, { lengthUnit: "m" }).hints).toEqual([]);
  });
});

describe("transmissivity from a flat derivative level", () => {
  it("computes T = Q/(4 pi level) in m2/d from any units", () => {
    // 10 L/s = 864 m3/d; level 0.5 ft = 0.1524 m; T = 864 / (4 pi 0.1524) = 451.1 m2/d.
    expect(transmissivityFromDerivativeLevel({ value: 10, unit: "L/s" }, { value: 0.5, unit: "ft" })).toBeCloseTo(
      864 / (4 * Math.PI * 0.1524),
      10,
    );
    expect(() => transmissivityFromDerivativeLevel(rate, { value: 0, unit: "m" })).toThrow(/level > 0/);
  });
});
