import { describe, expect, it } from "vitest";
import { fitTableOutput, readingsOutput } from "../src/displays.js";

/** A fit result shaped as aq.fitModel returns it (invented numbers). */
function fit(B: { estimate: number; standardError: number | null; ci95: [number, number] | null; atBound: "upper" | null }) {
  return {
    modelId: "hantush-jacob",
    parameters: [
      { name: "T", label: "transmissivity", unit: "m2/d", estimate: 250, standardError: 0.5, ci95: [249, 251], fixed: false, atBound: null },
      { name: "B", label: "leakage factor", unit: "m", fixed: false, ...B },
    ],
    rmse: 0.004,
    aic: -500,
    bic: -490,
  };
}

describe("show.fit notes", () => {
  it("say in words that a parameter ran to its bound, with what the model says that bound means", () => {
    const table = fitTableOutput(fit({ estimate: 1e6, standardError: 5.7e9, ci95: [0, Infinity], atBound: "upper" }));
    expect(table.columns.map((c) => c.name)).toEqual(["parameter", "estimate", "standard error", "95 % low", "95 % high", "unit", "interval", "note"]);
    expect(table.rows[1]).toEqual([
      "B (leakage factor)",
      1e6,
      5.7e9,
      0,
      null,
      "m",
      null,
      "at the upper bound of its fitting range: the data do not constrain B; leakage not detected: within this record the drawdown shows no leakage through the confining layer",
    ]);
    expect(table.rows[0]![7]).toBeNull();
  });

  it("name a parameter without a standard error or with one as large as its estimate, and add no column otherwise", () => {
    expect(fitTableOutput(fit({ estimate: 900, standardError: null, ci95: null, atBound: null })).rows[1]![7]).toBe("not identifiable from these data: no standard error");
    expect(fitTableOutput(fit({ estimate: 900, standardError: 950, ci95: [10, 9000], atBound: null })).rows[1]![7]).toBe("poorly constrained: the standard error is as large as the estimate");
    expect(fitTableOutput(fit({ estimate: 900, standardError: 3, ci95: [894, 906], atBound: null })).columns).toHaveLength(7);
  });
});

describe("show.readings", () => {
  it("lists every point and every reading the import left out, in time order, with why it was not used", () => {
    const series = {
      name: "OB-1",
      times: Float64Array.from([1, 10, 100]),
      drawdowns: Float64Array.from([0.1, 0.5, 0.2]),
      timeUnit: "min",
      lengthUnit: "m",
      excluded: [{ row: 3, time: 5, value: Number.NaN, reason: "the depth is not a number" }],
    };
    const table = readingsOutput(series, { used: [true, true, false], reason: "recovery" });
    expect(table.title).toBe("Readings of OB-1: 2 used, 2 left out");
    expect(table.columns).toEqual([{ name: "reading" }, { name: "time", unit: "min" }, { name: "drawdown", unit: "m" }, { name: "use" }]);
    expect(table.rows).toEqual([
      [1, 1, 0.1, "used"],
      ["file row 3", 5, null, "left out at import: the depth is not a number"],
      [2, 10, 0.5, "used"],
      [3, 100, 0.2, "left out: recovery"],
    ]);
    expect(() => readingsOutput(series, { used: [true] })).toThrow(/one true or false per point \(3\), got 1/);
  });
});
