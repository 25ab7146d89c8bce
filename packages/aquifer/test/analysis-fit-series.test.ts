import { describe, it, expect } from "vitest";
import { convert, UnitError } from "../src/units/index.js";
import { createObservationSeries, toBaseUnits, type ObservationSeries } from "../src/data/index.js";
import { fitModel } from "../src/fit/index.js";
import { theisDrawdown, theisModel } from "../src/models/index.js";
import { withRateSchedule } from "../src/superposition/index.js";
import { AnalysisInputError, fitSeries } from "../src/analysis/index.js";

// Conversion factors written out from their definitions, not taken from the units module:
// - international foot = 0.3048 m exactly (NIST SP 811 (2008), App. B.8);
// - minute = 60 s and day = 86400 s, so 1 min = 1/1440 d exactly (SI Brochure, units accepted for use with the SI);
// - US liquid gallon = 231 in³ = 3.785411784 L exactly (NIST Handbook 44 App. C, from memory), so
//   1 US gal/min = 3.785411784e-3 m3 × 1440 /d = 5.45099296896 m3/d.
const FT = 0.3048;
const MIN_IN_D = 1 / 1440;
const GPM_IN_M3D = 3.785411784e-3 * 1440;

describe("the units module's factors used at the edge", () => {
  it("agrees with the defined foot, minute and US gallon per minute", () => {
    expect(convert(1, "ft", "m")).toBe(FT);
    expect(Math.abs(convert(1, "min", "d") / MIN_IN_D - 1)).toBeLessThan(1e-15);
    expect(Math.abs(convert(1, "US gpm", "m3/d") / GPM_IN_M3D - 1)).toBeLessThan(1e-15);
    expect(Math.abs(convert(1, "US gal/min", "m3/d") / GPM_IN_M3D - 1)).toBeLessThan(1e-15);
    expect(Math.abs(convert(1, "m2/d", "ft2/d") * FT * FT - 1)).toBeLessThan(1e-15);
  });
});

// Invented record: observation well 120 ft from a well pumping 300 US gal/min, Theis drawdown for T = 2200 ft2/d
// and S = 2e-4 plus a deterministic ripple of up to 0.02 ft standing in for reading noise.
const timesMin = [1, 1.5, 2, 3, 4, 5, 7, 10, 14, 20, 28, 40, 55, 75, 100, 140, 200, 280, 400, 550, 720];
const trueT = 2200 * FT * FT;
const drawdownFt = timesMin.map((t, i) => theisDrawdown(trueT, 2e-4, 300 * GPM_IN_M3D, 120 * FT, t * MIN_IN_D) / FT + 0.02 * Math.sin(1.7 * i));

const seriesFt: ObservationSeries = createObservationSeries({
  name: "OB-NORTH",
  times: timesMin,
  drawdowns: drawdownFt,
  timeUnit: "min",
  lengthUnit: "ft",
  radius: { value: 120, unit: "ft" },
  pumpingRate: { value: 300, unit: "US gal/min" },
});
const seriesM: ObservationSeries = createObservationSeries({
  name: "OB-NORTH",
  times: timesMin.map((t) => t * MIN_IN_D),
  drawdowns: drawdownFt.map((s) => s * FT),
  timeUnit: "d",
  lengthUnit: "m",
  radius: { value: 120 * FT, unit: "m" },
  pumpingRate: { value: 300 * GPM_IN_M3D, unit: "m3/d" },
});

describe("fitSeries on series in their own units", () => {
  const inFeet = fitSeries({ model: "theis", series: [seriesFt], reportUnits: { T: "ft2/d" } });
  const inMetres = fitSeries({ model: theisModel, series: [seriesM] });

  it("finds the same T and S from ft, min and US gal/min as from m, d and m3/d, to 1e-9 relative", () => {
    const [T1, S1] = inFeet.parameters;
    const [T2, S2] = inMetres.parameters;
    expect(inFeet.converged && inMetres.converged).toBe(true);
    expect(Math.abs(T1!.estimate / T2!.estimate - 1)).toBeLessThan(1e-9);
    expect(Math.abs(S1!.estimate / S2!.estimate - 1)).toBeLessThan(1e-9);
    // The ripple is small, so the estimate is near the generating T (invented data, a plausibility check only).
    expect(Math.abs(T2!.estimate / trueT - 1)).toBeLessThan(0.05);
  });

  it("reports T in ft2/d as the base estimate divided by 0.3048², with its interval converted the same way", () => {
    const row = inFeet.table[0]!;
    const T = inFeet.parameters[0]!;
    expect(row.parameter).toBe("T");
    expect(row.unit).toBe("ft2/d");
    expect(Math.abs(row.estimate / (T.estimate / (FT * FT)) - 1)).toBeLessThan(1e-15);
    expect(Math.abs(row.standardError! / (T.standardError! / (FT * FT)) - 1)).toBeLessThan(1e-15);
    expect(Math.abs(row.low95! / (T.ci95![0] / (FT * FT)) - 1)).toBeLessThan(1e-15);
    expect(Math.abs(row.high95! / (T.ci95![1] / (FT * FT)) - 1)).toBeLessThan(1e-15);
    // The same T in ft2/d from the metric fit agrees to the fit's own 1e-9.
    expect(Math.abs(row.estimate / (inMetres.parameters[0]!.estimate / (FT * FT)) - 1)).toBeLessThan(1e-9);
    // S has no report unit: it stays dimensionless.
    expect(inFeet.table[1]!.unit).toBe("1");
    expect(inFeet.table[1]!.estimate).toBe(inFeet.parameters[1]!.estimate);
  });

  it("gives the RMSE in the series' length unit", () => {
    expect(inFeet.rmseReported.unit).toBe("ft");
    expect(Math.abs(inFeet.rmseReported.value / (inFeet.rmse / FT) - 1)).toBeLessThan(1e-15);
    expect(inMetres.rmseReported).toEqual({ value: inMetres.rmse, unit: "m" });
  });

  it("takes start values with units and converts them to the base unit", () => {
    const fit = fitSeries({ model: "theis", series: [seriesFt], start: { T: { value: 2000, unit: "ft2/d" }, S: 1e-4 } });
    expect(fit.start.method).toBe("given");
    expect(Math.abs(fit.start.values.T! / (2000 * FT * FT) - 1)).toBeLessThan(1e-15);
    expect(Math.abs(fit.parameters[0]!.estimate / inMetres.parameters[0]!.estimate - 1)).toBeLessThan(1e-8);
  });

  it("refuses a report unit of the wrong dimension with the units module's error, before fitting", () => {
    let error: unknown;
    try {
      fitSeries({ model: "theis", series: [seriesFt], reportUnits: { T: "ft" } });
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(UnitError);
    expect((error as Error).message).toMatch(/^fitSeries: reportUnits\.T \(transmissivity\): cannot convert .*\(m2\/d\) to .*\(ft\)/);
  });

  it("leaves out a report unit for a parameter the model does not have, and says so", () => {
    const fit = fitSeries({ model: "theis", series: [seriesFt], reportUnits: { T: "ft2/d", B: "ft" } });
    expect(fit.table.map((r) => r.unit)).toEqual(["ft2/d", "1"]);
    expect(fit.warnings.at(-1)).toBe('reportUnits names B, which model "theis" does not have (T, S); it was not used.');
  });

  it("names an unknown parameter in start values together with the model's parameters", () => {
    expect(() => fitSeries({ model: "theis", series: [seriesFt], start: { K: 3 } })).toThrow(AnalysisInputError);
    expect(() => fitSeries({ model: "theis", series: [seriesFt], start: { K: 3 } })).toThrow(/start names "K".*T \(transmissivity, m2\/d\)/);
  });
});

describe("fitSeries with a rate schedule", () => {
  // Invented two-step test: 200 US gal/min for 120 min, then 320 US gal/min; T = 1800 ft2/d, S = 1e-4, r = 80 ft.
  const schedule = { unit: "US gal/min", steps: [{ start: 0, rate: 200 }, { start: 120, rate: 320 }] };
  const t = [2, 5, 10, 20, 40, 80, 119, 125, 135, 150, 180, 220, 240];
  const baseSteps = [{ start: 0, rate: 200 * GPM_IN_M3D }, { start: 120 * MIN_IN_D, rate: 320 * GPM_IN_M3D }];
  const stepped = withRateSchedule(theisModel, baseSteps);
  const s = stepped.drawdown([1800 * FT * FT, 1e-4], { r: 80 * FT, Q: 1 }, t.map((v) => v * MIN_IN_D));
  const series = createObservationSeries({
    name: "OB-STEP",
    times: t,
    drawdowns: Array.from(s, (v, i) => v / FT + 0.01 * Math.cos(2.3 * i)),
    timeUnit: "min",
    lengthUnit: "ft",
    radius: { value: 80, unit: "ft" },
    pumpingRate: schedule,
  });

  it("fits by superposition in time, exactly as fitModel with withRateSchedule on the base-unit record", () => {
    const fit = fitSeries({ model: "theis", series: [series] });
    const base = toBaseUnits(series);
    const steps = Array.from(base.steps.start, (start, i) => ({ start, rate: base.steps.rate[i]! }));
    const direct = fitModel({ model: withRateSchedule(theisModel, steps), wells: [{ name: base.name, geometry: { r: base.r, Q: steps[0]!.rate }, t: base.t, s: base.s }] });
    expect(fit.modelId).toBe("theis+schedule");
    expect(fit.parameters).toEqual(direct.parameters);
    expect(Math.abs(fit.parameters[0]!.estimate / (1800 * FT * FT) - 1)).toBeLessThan(0.05);
  });

  it("refuses series on different schedules, naming both", () => {
    const other = createObservationSeries({ ...series, name: "OB-CONST", pumpingRate: { value: 200, unit: "US gal/min" } });
    expect(() => fitSeries({ model: "theis", series: [series, other] })).toThrow(/series "OB-CONST" does not follow the rate schedule of series "OB-STEP"/);
  });
});
