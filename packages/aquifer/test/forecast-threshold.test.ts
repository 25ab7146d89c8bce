import { describe, it, expect } from "vitest";
import { readFileSync } from "node:fs";
import { cooperJacobModel, theisDrawdown, theisModel } from "../src/models/index.js";
import { distanceToThreshold, interferenceAtNeighbours, ForecastInputError } from "../src/forecast/index.js";
import { boundaryFromWell, type PumpingWell } from "../src/superposition/index.js";

// References: tests/fixtures/forecast/forecast.json (scipy.optimize.brentq on the Theis drawdown with
// scipy.special.exp1) and tests/fixtures/superposition/superposition.json (three-well superposition with scipy).
const forecast = JSON.parse(readFileSync(new URL("../../../tests/fixtures/forecast/forecast.json", import.meta.url), "utf8")) as {
  thresholds: { T: number; S: number; Q: number; t: number; threshold: number; r: number }[];
};
const superposition = JSON.parse(readFileSync(new URL("../../../tests/fixtures/superposition/superposition.json", import.meta.url), "utf8")) as {
  cases: { multiWell: { T: number; S: number; t: number[]; wells: PumpingWell[]; observations: { name: string; x: number; y: number; s: number[] }[] } };
};

describe("distanceToThreshold", () => {
  for (const c of forecast.thresholds) {
    it(`finds the Theis radius for ${c.threshold} m after ${c.t} d: s(r*) equals the threshold to 1e-9 m and r* matches scipy's brentq to 1e-9`, () => {
      const result = distanceToThreshold(theisModel, { T: c.T, S: c.S }, c.Q, c.t, c.threshold);
      expect(Math.abs(theisDrawdown(c.T, c.S, c.Q, result.r, c.t) - c.threshold)).toBeLessThan(1e-9);
      expect(Math.abs(result.r / c.r - 1)).toBeLessThan(1e-9);
      expect(result.evaluations).toBeLessThan(100);
    });
  }

  it("matches the closed form of the Cooper-Jacob line r* = sqrt(2.25 T t/S exp(-4 pi T s*/Q))", () => {
    const T = 250;
    const S = 1e-4;
    const Q = 900;
    const t = 10;
    const level = 0.6;
    const exact = Math.sqrt(((2.25 * T * t) / S) * Math.exp((-4 * Math.PI * T * level) / Q));
    const result = distanceToThreshold(cooperJacobModel, [T, S], Q, t, level);
    expect(Math.abs(result.r / exact - 1)).toBeLessThan(1e-12);
  });

  it("says clearly when the drawdown never reaches the threshold, or never falls below it in the range", () => {
    expect(() => distanceToThreshold(theisModel, { T: 250, S: 1e-4 }, 900, 10, 50)).toThrow(/below the threshold 50 m/);
    expect(() => distanceToThreshold(theisModel, { T: 250, S: 1e-4 }, 900, 10, 0.01, { rMax: 100 })).toThrow(/does not fall below the threshold within the range/);
    expect(() => distanceToThreshold(theisModel, { T: 250 }, 900, 10, 0.5)).toThrow(ForecastInputError);
  });
});

describe("interferenceAtNeighbours", () => {
  const c = superposition.cases.multiWell;

  it("gives the drawdown the scheme causes at each neighbour (scipy reference, 1e-12) and parts that add up to it", () => {
    const result = interferenceAtNeighbours({ model: theisModel, parameters: { T: c.T, S: c.S }, schedule: c.wells, neighbours: c.observations, times: c.t });
    result.forEach((n, k) => {
      const ref = c.observations[k]!.s;
      n.total.forEach((v, i) => {
        expect(Math.abs(v / ref[i]! - 1)).toBeLessThan(1e-12);
        const parts = Object.values(n.byWell).reduce((sum, part) => sum + part[i]!, 0);
        expect(Math.abs(parts - v)).toBeLessThan(1e-13 * Math.abs(v));
      });
      expect(Object.keys(n.byWell)).toEqual(c.wells.map((w) => w.name));
    });
  });

  it("includes each well's image near a recharge boundary, which lowers the interference", () => {
    const recharge = boundaryFromWell("constant-head", { x: 0, y: 0 }, 300, Math.PI);
    const free = interferenceAtNeighbours({ model: theisModel, parameters: [c.T, c.S], schedule: c.wells, neighbours: c.observations, times: [5] });
    const bounded = interferenceAtNeighbours({ model: theisModel, parameters: [c.T, c.S], schedule: c.wells, neighbours: c.observations, times: [5], boundaries: [recharge] });
    expect(bounded[0]!.total[0]!).toBeLessThan(free[0]!.total[0]!);
  });
});
