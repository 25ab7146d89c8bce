import { describe, expect, it } from "vitest";
import { correctJacobUnconfined, correctJacobUnconfinedSeries, CorrectionError } from "../src/corrections/index.js";
import { createObservationSeries } from "../src/data/index.js";

describe("Jacob (1944) unconfined correction s' = s - s^2/(2b)", () => {
  it("matches hand-computed values", () => {
    // b = 20 m. By hand: 0.5 - 0.25/40 = 0.49375; 2 - 4/40 = 1.9; 4 - 16/40 = 3.6; -0.1 - 0.01/40 = -0.10025.
    const { values, record } = correctJacobUnconfined({
      drawdowns: [0.5, 2, 4, -0.1],
      lengthUnit: "m",
      saturatedThickness: { value: 20, unit: "m" },
    });
    expect(values[0]).toBeCloseTo(0.49375, 13);
    expect(values[1]).toBeCloseTo(1.9, 13);
    expect(values[2]).toBeCloseTo(3.6, 13);
    expect(values[3]).toBeCloseTo(-0.10025, 13);
    expect(record.warnings).toEqual([]);
    expect(record.source).toMatch(/^Jacob, C\.E\. \(1944\)/);
  });

  it("converts the thickness to the drawdown unit", () => {
    // b = 50 ft = 15.24 m; s = 3 m: 3 - 9/30.48 = 2.7047244 m (by hand).
    const { values } = correctJacobUnconfined({ drawdowns: [3], lengthUnit: "m", saturatedThickness: { value: 50, unit: "ft" } });
    expect(values[0]).toBeCloseTo(3 - 9 / 30.48, 13);
    expect(values[0]).toBeCloseTo(2.7047244, 7);
  });

  it("warns when drawdown exceeds a quarter of b and counts the readings", () => {
    const { values, record } = correctJacobUnconfined({ drawdowns: [1, 6, 7], lengthUnit: "m", saturatedThickness: { value: 20, unit: "m" } });
    // 6 - 36/40 = 5.1 and 7 - 49/40 = 5.775 (by hand); both above 0.25 b = 5 m.
    expect(values[1]).toBeCloseTo(5.1, 13);
    expect(values[2]).toBeCloseTo(5.775, 13);
    expect(record.parameters["readingsAboveWarningFraction"]).toBe(2);
    expect(record.warnings[0]).toMatch(/^2 drawdowns exceed 0.25 b = 5 m \(first at index 1\)/);
  });

  it("refuses a drawdown at or beyond the saturated thickness: the aquifer would be dewatered", () => {
    expect(() => correctJacobUnconfined({ drawdowns: [1, 20], lengthUnit: "m", saturatedThickness: { value: 20, unit: "m" } })).toThrow(
      /drawdowns\[1\] = 20 m is not less than the saturated thickness b = 20 m: the aquifer would be dewatered/,
    );
    expect(() => correctJacobUnconfined({ drawdowns: [1], lengthUnit: "m", saturatedThickness: { value: 0, unit: "m" } })).toThrow(CorrectionError);
  });

  it("corrects a series into a new one", () => {
    const series = createObservationSeries({
      name: "OBS-5",
      times: [1, 2],
      drawdowns: [2, 4],
      timeUnit: "d",
      lengthUnit: "m",
      radius: { value: 30, unit: "m" },
      pumpingRate: { value: 700, unit: "m3/d" },
    });
    const out = correctJacobUnconfinedSeries(series, { saturatedThickness: { value: 20, unit: "m" } });
    expect(out.series.drawdowns[1]).toBeCloseTo(3.6, 13);
    expect(series.drawdowns[1]).toBe(4);
  });
});
