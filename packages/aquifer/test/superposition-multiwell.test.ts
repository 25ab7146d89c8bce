import { describe, it, expect } from "vitest";
import { readFileSync } from "node:fs";
import { theisModel } from "../src/models/index.js";
import { fitModel } from "../src/fit/index.js";
import { multiWell, schemeDrawdown, SuperpositionInputError, type PumpingWell } from "../src/superposition/index.js";

// Reference: tests/fixtures/superposition/superposition.json (generate_superposition.py): three invented wells
// with their own schedules, distances and Theis unit drawdowns (scipy.special.exp1) summed in Python.
const fixture = JSON.parse(
  readFileSync(new URL("../../../tests/fixtures/superposition/superposition.json", import.meta.url), "utf8"),
) as {
  cases: {
    multiWell: { T: number; S: number; t: number[]; wells: PumpingWell[]; observations: { name: string; x: number; y: number; s: number[] }[] };
  };
};
const c = fixture.cases.multiWell;

function maxRelative(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let worst = 0;
  for (let i = 0; i < b.length; i++) worst = Math.max(worst, Math.abs(a[i]! - b[i]!) / Math.abs(b[i]!));
  return worst;
}

describe("multiWell", () => {
  it("sums three wells with their own schedules as computed with scipy, to 1e-12", () => {
    for (const o of c.observations) {
      const e = schemeDrawdown(theisModel, [c.T, c.S], { wells: c.wells }, o, c.t);
      expect(e.imagesUsed).toBe(0);
      expect(maxRelative(e.drawdown, o.s)).toBeLessThan(1e-12);
    }
  });

  it("with wells given by coordinates picks each observation point by its distance from the first well", () => {
    const observations = c.observations.map(({ name, x, y }) => ({ name, x, y }));
    const model = multiWell(theisModel, c.wells, { observations });
    for (const o of c.observations) {
      const r = Math.hypot(o.x - c.wells[0]!.x, o.y - c.wells[0]!.y);
      expect(maxRelative(model.drawdown([c.T, c.S], { r, Q: 1 }, c.t), o.s)).toBeLessThan(1e-12);
    }
  });

  it("with wells given by distance to one observation point gives the same drawdown", () => {
    const o = c.observations[0]!;
    const byDistance = c.wells.map((w) => ({ name: w.name, r: Math.hypot(o.x - w.x, o.y - w.y), steps: w.steps }));
    const model = multiWell(theisModel, byDistance);
    const s = model.drawdown([c.T, c.S], { r: byDistance[0]!.r, Q: 1 }, c.t);
    expect(maxRelative(s, o.s)).toBeLessThan(1e-12);
    expect(() => model.drawdown([c.T, c.S], { r: 3, Q: 1 }, c.t)).toThrow(/serves that one point only/);
  });

  it("is fit-ready: fitModel on both observation wells returns the generating T and S", () => {
    const observations = c.observations.map(({ name, x, y }) => ({ name, x, y }));
    const model = multiWell(theisModel, c.wells, { observations });
    const wells = c.observations.map((o) => ({
      name: o.name,
      geometry: { r: Math.hypot(o.x - c.wells[0]!.x, o.y - c.wells[0]!.y), Q: 600 },
      t: c.t,
      s: o.s,
    }));
    const result = fitModel({ model, wells, start: { T: 100, S: 1e-3 } });
    expect(Math.abs(result.parameters[0]!.estimate / c.T - 1)).toBeLessThan(1e-6);
    expect(Math.abs(result.parameters[1]!.estimate / c.S - 1)).toBeLessThan(1e-6);
  });

  it("refuses a mix of wells by distance and by coordinates, and duplicate well names", () => {
    expect(() =>
      multiWell(theisModel, [
        { name: "A", r: 10, steps: [{ start: 0, rate: 1 }] },
        { name: "B", x: 0, y: 0, steps: [{ start: 0, rate: 1 }] },
      ]),
    ).toThrow(SuperpositionInputError);
    expect(() =>
      schemeDrawdown(theisModel, [100, 1e-4], { wells: [{ ...c.wells[0]! }, { ...c.wells[1]!, name: c.wells[0]!.name }] }, { x: 5, y: 5 }, [1]),
    ).toThrow(/two pumping wells are named "PW-A"/);
  });

  it("says so when the observation point sits on a pumping well", () => {
    expect(() => schemeDrawdown(theisModel, [100, 1e-4], { wells: c.wells }, { x: 0, y: 0 }, [1])).toThrow(/coincides with pumping well "PW-A"/);
  });
});
