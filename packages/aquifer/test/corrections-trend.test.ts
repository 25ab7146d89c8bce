import { describe, expect, it } from "vitest";
import { removeLinearTrend, removeLinearTrendSeries, seriesCorrections } from "../src/corrections/index.js";
import { createObservationSeries } from "../src/data/index.js";
import { diagnosticsFixture, relDiff } from "./diagnostics-fixture.js";

describe("background trend removal", () => {
  it("fits the pre-test slope as scipy.stats.linregress does and subtracts b (t - t0)", () => {
    // Reference: tests/fixtures/diagnostics/generate_diagnostics.py (scipy linregress on pre-test readings).
    const f = diagnosticsFixture.trend;
    const result = removeLinearTrend({
      times: f.times,
      values: f.values,
      pumpingStart: f.pumpingStart,
      timeUnit: f.timeUnit,
      valueUnit: f.valueUnit,
    });
    const tr = result.trend;
    expect(tr.n).toBe(f.preTestCount);
    expect(relDiff(tr.slope, f.fit.slope)).toBeLessThan(1e-10);
    expect(relDiff(tr.slopeStandardError, f.fit.slopeStandardError)).toBeLessThan(1e-9);
    expect(relDiff(tr.slopeInterval95[0], f.fit.low95)).toBeLessThan(1e-9);
    expect(relDiff(tr.valueAtPumpingStart, f.fit.intercept)).toBeLessThan(1e-12);
    expect(tr.slopeUnit).toBe("m/h");
    // The invented slope (-0.0125 m/h) lies inside the 95 % interval.
    expect(tr.slopeInterval95[0]).toBeLessThan(f.slope);
    expect(tr.slopeInterval95[1]).toBeGreaterThan(f.slope);
    const last = f.times.length - 1;
    expect(result.values[last]).toBeCloseTo(f.values[last]! - tr.slope * (f.times[last]! - f.pumpingStart), 12);
    expect(result.record.parameters["slope"]).toEqual({ value: tr.slope, unit: "m/h" });
  });

  it("recovers a known slope exactly from noiseless readings and leaves a flat record", () => {
    const times = [-40, -30, -20, -10, 5, 30, 60];
    const values = times.map((t) => 5.2 + 0.002 * t);
    const { values: out, trend } = removeLinearTrend({ times, values, pumpingStart: 0, timeUnit: "min", valueUnit: "m" });
    expect(trend.slope).toBeCloseTo(0.002, 14);
    for (const v of out) expect(v).toBeCloseTo(5.2, 12);
  });

  it("refuses with fewer than 3 pre-test readings, saying how many there are", () => {
    expect(() =>
      removeLinearTrend({ times: [-2, -1, 1, 2], values: [1, 1, 2, 3], pumpingStart: 0, timeUnit: "h", valueUnit: "m" }),
    ).toThrow(/at least 3 readings before pumping started .* found 2/);
  });

  it("warns when the trend is extrapolated far beyond its fitted span", () => {
    const times = [-3, -2, -1, 1, 10, 50];
    const { record } = removeLinearTrend({ times, values: times.map((t) => 2 + 0.1 * t), pumpingStart: 0, timeUnit: "h", valueUnit: "m" });
    expect(record.warnings.some((w) => /more than twice the fitted span/.test(w))).toBe(true);
  });

  it("takes the pre-test readings of a series from its excluded points and keeps the input unchanged", () => {
    const series = createObservationSeries({
      name: "PW-1",
      times: [10, 20, 40],
      drawdowns: [0.5, 0.7, 0.9],
      timeUnit: "min",
      lengthUnit: "m",
      radius: { value: 0.15, unit: "m" },
      pumpingRate: { value: 500, unit: "m3/d" },
      excluded: [-30, -20, -10].map((t, k) => ({ row: k + 2, time: t, value: -0.001 * t, reason: "reading before pumping started" })),
    });
    const out = removeLinearTrendSeries(series);
    expect(out.trend.slope).toBeCloseTo(-0.001, 14);
    expect(out.series.drawdowns[2]).toBeCloseTo(0.9 + 0.001 * 40, 12);
    expect(series.drawdowns[2]).toBe(0.9);
    expect(seriesCorrections(out.series)[0]!.method).toBe("linear background trend removal");
  });
});
