import { describe, it, expect } from "vitest";
import { readFileSync } from "node:fs";
import { UnitError } from "../src/units/index.js";
import { forecastDrawdown } from "../src/forecast/index.js";
import { theisModel } from "../src/models/index.js";
import { AnalysisInputError, forecastAt, type ForecastableFit } from "../src/analysis/index.js";

// Reference: tests/fixtures/forecast/forecast.json (generate_forecast.py): Theis drawdown and its linear standard
// deviation by mpmath at 30 digits for T, S, Q, r and a covariance of (ln T, ln S).
const fixture = JSON.parse(readFileSync(new URL("../../../tests/fixtures/forecast/forecast.json", import.meta.url), "utf8")) as {
  linear: { T: number; S: number; Q: number; r: number; covarianceLn: number[][]; points: { t: number; s: number; sd: number }[] };
};
const L = fixture.linear;
const values = [L.T, L.S];
const fit: ForecastableFit = {
  modelId: "theis",
  parameters: [{ name: "T", estimate: L.T }, { name: "S", estimate: L.S }],
  freeParameters: ["T", "S"],
  covariance: L.covarianceLn.map((row, a) => row.map((c, b) => c * values[a]! * values[b]!)),
};
// 1 ft = 0.3048 m exactly (NIST SP 811 (2008), App. B.8); 1 d = 1440 min; 1 m3/d = 1000/86400 L/s (SI).
const FT = 0.3048;

describe("forecastAt", () => {
  const inMetres = forecastAt({
    fit,
    points: [{ name: "OB", distance: { value: L.r, unit: "m" } }],
    times: { values: L.points.map((p) => p.t * 1440), unit: "min" },
    rate: { value: (L.Q * 1000) / 86400, unit: "L/s" },
    uncertainty: "linear",
    lengthUnit: "m",
  });

  it("gives the Theis drawdown and linear band of mpmath from inputs in min and L/s", () => {
    const p = inMetres.points[0]!;
    L.points.forEach((ref, i) => {
      expect(Math.abs(p.drawdown[i]! / ref.s - 1)).toBeLessThan(1e-12);
      expect(Math.abs(p.standardDeviation![i]! / ref.sd - 1)).toBeLessThan(1e-8);
    });
    expect(inMetres.timeUnit).toBe("min");
    expect(Array.from(p.times)).toEqual(L.points.map((q) => q.t * 1440));
  });

  it("gives in ft exactly the forecast in m divided by 0.3048, band included", () => {
    const inFeet = forecastAt({
      fit,
      points: [{ name: "OB", distance: { value: L.r, unit: "m" } }],
      times: { values: L.points.map((p) => p.t * 1440), unit: "min" },
      rate: { value: (L.Q * 1000) / 86400, unit: "L/s" },
      uncertainty: "linear",
      lengthUnit: "ft",
    });
    const m = inMetres.points[0]!;
    const ft = inFeet.points[0]!;
    for (const key of ["drawdown", "standardDeviation", "p05", "p95"] as const) {
      expect(ft[key]).toEqual(m[key]!.map((v) => v / FT));
    }
    expect(inFeet.lengthUnit).toBe("ft");
  });

  it("equals forecastDrawdown in base units for a rate schedule, bit for bit after conversion", () => {
    const schedule = { unit: "m3/d", steps: [{ start: 0, rate: 900 }, { start: 1440, rate: 0 }] };
    const a = forecastAt({ fit, points: [{ name: "OB", distance: { value: 75, unit: "m" } }], times: { values: [720, 2880], unit: "min" }, rate: schedule, uncertainty: "linear", lengthUnit: "m" });
    const b = forecastDrawdown({
      model: theisModel,
      parameters: { T: L.T, S: L.S },
      covariance: { names: ["T", "S"], matrix: fit.covariance as number[][] },
      schedule: [{ name: "pumping well", x: 0, y: 0, steps: [{ start: 0, rate: 900 }, { start: 1, rate: 0 }] }],
      points: [{ name: "OB", r: 75 }],
      times: [0.5, 2],
      uncertainty: "linear",
    });
    expect(a.points[0]!.drawdown).toEqual(b.points[0]!.drawdown);
    expect(a.points[0]!.standardDeviation).toEqual(b.points[0]!.standardDeviation);
  });

  it("refuses a length unit that is not a length, and a fit with boundaries it cannot see", () => {
    const base = { fit, points: [{ name: "OB", distance: { value: 75, unit: "m" } }], times: { values: [1], unit: "d" }, rate: { value: 900, unit: "m3/d" } };
    expect(() => forecastAt({ ...base, lengthUnit: "L/s" })).toThrow(UnitError);
    expect(() => forecastAt({ ...base, lengthUnit: "L/s" })).toThrow(/forecastAt: lengthUnit: cannot convert/);
    expect(() => forecastAt({ ...base, fit: { ...fit, modelId: "theis+boundaries" }, lengthUnit: "m" })).toThrow(AnalysisInputError);
  });
});
