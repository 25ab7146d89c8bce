/** Largest and smallest of many numbers, where spreading them into Math.max overflowed the engine's stack. */
import { describe, expect, it } from "vitest";
import { largestOf, smallestOf } from "../src/numerics/extremes.js";
import { fitModel, getModel, theisDrawdown } from "../src/index.js";

describe("largestOf and smallestOf", () => {
  it("give what Math.max and Math.min give, NaN, empty lists and signed zeros included", () => {
    const cases: number[][] = [[3, -1, 2], [], [NaN, 1], [1, NaN], [-0, 0], [0, -0], [-Infinity], [Infinity, 5]];
    for (const c of cases) {
      expect(Object.is(largestOf(c), Math.max(...c)), String(c)).toBe(true);
      expect(Object.is(smallestOf(c), Math.min(...c)), String(c)).toBe(true);
    }
  });

  it("take a million values, which Math.max(...values) cannot", () => {
    const values = Float64Array.from({ length: 1e6 }, (_, i) => Math.sin(i));
    expect(() => Math.max(...values)).toThrow(RangeError);
    let max = -Infinity, min = Infinity;
    for (const v of values) [max, min] = [v > max ? v : max, v < min ? v : min];
    expect([largestOf(values), smallestOf(values)]).toEqual([max, min]);
  });

  it("let a fit take a record of 200,000 readings", () => {
    const t = Float64Array.from({ length: 200_000 }, (_, i) => 0.001 * (i + 1));
    const s = t.map((x) => theisDrawdown(300, 2e-4, 1000, 30, x));
    const fit = fitModel({ model: getModel("theis"), wells: [{ name: "OW-1", geometry: { r: 30, Q: 1000 }, t, s }], start: { T: 300, S: 2e-4 } });
    expect(fit.parameters.map((p) => p.estimate)[0]).toBeCloseTo(300, 6);
  });
});
