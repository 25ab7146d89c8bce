import { describe, expect, it } from "vitest";
import { estimateStaticLevel, removeStaticLevel } from "../src/corrections/index.js";

describe("static level", () => {
  const times = [-40, -30, -20, -10, 1, 2];
  const depths = [10.02, 10.0, 10.04, 10.03, 10.5, 10.9];

  it("is estimated as the mean of the last N pre-test readings, with its spread", () => {
    // By hand: last 3 pre-test readings 10.00, 10.04, 10.03: mean 10.023333, deviations -0.023333,
    // 0.016667, 0.006667, sample sd sqrt(8.6667e-4 / 2) = 0.020817, range 0.04.
    const est = estimateStaticLevel({ times, levels: depths, pumpingStart: 0, count: 3, timeUnit: "min", lengthUnit: "m" });
    expect(est.level).toBeCloseTo(10.023333, 6);
    expect(est.standardDeviation!).toBeCloseTo(0.020817, 6);
    expect(est.range).toBeCloseTo(0.04, 12);
    expect(est.count).toBe(3);
    expect(est.timeSpan).toEqual([-30, -10]);
    const one = estimateStaticLevel({ times, levels: depths, pumpingStart: 0, count: 1, timeUnit: "min", lengthUnit: "m" });
    expect(one.standardDeviation).toBeNull();
  });

  it("refuses when fewer pre-test readings exist than asked for", () => {
    expect(() => estimateStaticLevel({ times, levels: depths, pumpingStart: 0, count: 5, timeUnit: "min", lengthUnit: "m" })).toThrow(
      /last 5 readings .* only 4 exist/,
    );
  });

  it("turns depth to water into drawdown s = d - d0 and head into s = h0 - h, recording where d0 came from", () => {
    const est = estimateStaticLevel({ times, levels: depths, pumpingStart: 0, count: 3, timeUnit: "min", lengthUnit: "m" });
    const fromDepth = removeStaticLevel({ levels: [10.5, 10.9], levelKind: "depth-to-water", lengthUnit: "m", staticLevel: est });
    expect(fromDepth.values[1]).toBeCloseTo(10.9 - 10.023333333333, 10);
    expect(fromDepth.record.parameters["readingsAveraged"]).toBe(3);
    expect(fromDepth.record.summary).toMatch(/mean of the last 3 pre-test readings \(range 0.04 m, standard deviation 0.0208167 m\)/);
    const fromHead = removeStaticLevel({ levels: [95.5, 95.1], levelKind: "head", lengthUnit: "m", staticLevel: 96 });
    expect(fromHead.values[0]).toBeCloseTo(0.5, 12);
    expect(fromHead.values[1]).toBeCloseTo(0.9, 12);
    expect(() => removeStaticLevel({ levels: [1], levelKind: "head", lengthUnit: "ft", staticLevel: est })).toThrow(/estimate is in m/);
  });
});
