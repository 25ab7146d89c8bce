import { describe, expect, it } from "vitest";
import {
  correctBarometric,
  correctBarometricSeries,
  CorrectionError,
  estimateBarometricEfficiency,
  seriesCorrections,
} from "../src/corrections/index.js";
import { createObservationSeries } from "../src/data/index.js";
import { diagnosticsFixture, relDiff } from "./diagnostics-fixture.js";
import { uniformGenerator } from "../../../tests/support/seeded-noise.js";


/** Standard normal deviates by the Box-Muller transform. */
function normals(uniform: () => number): () => number {
  return () => Math.sqrt(-2 * Math.log(1 - uniform())) * Math.cos(2 * Math.PI * uniform());
}

/** 1 mH2O = 9806.65 Pa: the conventional metre of water (NIST SP 811, 1000 kg/m3 times g_n). */
const PA_PER_M_WATER = 9806.65;

/** Invented record: hourly readings, pressure a random walk in hPa, depth to water with BE, a trend and noise. */
function syntheticRecord(seed: number, be: number, n: number, noiseM: number) {
  const z = normals(uniformGenerator(seed));
  const pressures: number[] = [];
  const depths: number[] = [];
  let p = 1012;
  for (let i = 0; i < n; i++) {
    p += 0.7 * z();
    pressures.push(p);
    depths.push(21.4 + be * ((p - pressures[0]!) * 100) / PA_PER_M_WATER + 0.0005 * i + noiseM * z());
  }
  return { pressures, depths };
}

describe("barometric efficiency by regression", () => {
  it("reproduces scipy.stats.linregress on levels and on differences", () => {
    // Reference: tests/fixtures/diagnostics/generate_diagnostics.py (scipy linregress, t.ppf).
    const f = diagnosticsFixture.barometric;
    for (const method of ["levels", "differences"] as const) {
      const ref = f[method];
      const est = estimateBarometricEfficiency({
        levels: f.depthToWater,
        levelKind: "depth-to-water",
        levelUnit: "m",
        pressures: f.pressures,
        pressureUnit: "hPa",
        method,
      });
      expect(est.n).toBe(ref.n);
      expect(relDiff(est.efficiency, ref.slope), method).toBeLessThan(1e-10);
      expect(relDiff(est.standardError, ref.slopeStandardError), method).toBeLessThan(1e-9);
      expect(relDiff(est.rSquared, ref.rSquared), method).toBeLessThan(1e-10);
      expect(relDiff(est.interval95[0], ref.low95), method).toBeLessThan(1e-9);
      expect(relDiff(est.interval95[1], ref.high95), method).toBeLessThan(1e-9);
    }
  });

  it("recovers a known BE within its 95 % interval, and its intervals cover BE about 95 % of the time", () => {
    const be = 0.42;
    const single = syntheticRecord(12345, be, 72, 0.0015);
    const est = estimateBarometricEfficiency({
      levels: single.depths,
      levelKind: "depth-to-water",
      levelUnit: "m",
      pressures: single.pressures,
      pressureUnit: "hPa",
    });
    expect(est.method).toBe("differences");
    expect(est.interval95[0]).toBeLessThan(be);
    expect(est.interval95[1]).toBeGreaterThan(be);
    expect(est.warnings).toEqual([]);
    // Coverage over 400 seeded records: binomial(400, 0.95) has sd 1.1 %, so 0.91..0.99 is about 3.5 sd wide.
    let covered = 0;
    const trials = 400;
    for (let k = 0; k < trials; k++) {
      const rec = syntheticRecord(1000 + k, be, 72, 0.0015);
      const e = estimateBarometricEfficiency({
        levels: rec.depths,
        levelKind: "depth-to-water",
        levelUnit: "m",
        pressures: rec.pressures,
        pressureUnit: "hPa",
      });
      if (e.interval95[0] <= be && be <= e.interval95[1]) covered++;
    }
    expect(covered / trials).toBeGreaterThan(0.91);
    expect(covered / trials).toBeLessThan(0.99);
  });

  it("gives the same BE from heads as from depths to water (the sign convention turns with the kind)", () => {
    const rec = syntheticRecord(7, 0.6, 50, 0.002);
    const base = { levelUnit: "m", pressures: rec.pressures, pressureUnit: "hPa" };
    const fromDepth = estimateBarometricEfficiency({ ...base, levels: rec.depths, levelKind: "depth-to-water" });
    const fromHead = estimateBarometricEfficiency({ ...base, levels: rec.depths.map((d) => 250 - d), levelKind: "head" });
    expect(fromHead.efficiency).toBeCloseTo(fromDepth.efficiency, 12);
    // Read as head without saying so, the same numbers give a negative BE and a warning.
    const wrong = estimateBarometricEfficiency({ ...base, levels: rec.depths, levelKind: "head" });
    expect(wrong.efficiency).toBeLessThan(0);
    expect(wrong.warnings[0]).toMatch(/outside 0\.\.1.*sign convention/);
  });

  it("refuses fewer than 3 pairs and unequal lengths", () => {
    const base = { levelKind: "drawdown" as const, levelUnit: "m", pressureUnit: "hPa" };
    expect(() => estimateBarometricEfficiency({ ...base, levels: [1, 2, 3], pressures: [1000, 1001, 1002] })).toThrow(
      /at least 3 pairs, got 2 from 3 readings/,
    );
    expect(() => estimateBarometricEfficiency({ ...base, levels: [1, 2], pressures: [1000] })).toThrow(CorrectionError);
    expect(() => estimateBarometricEfficiency({ ...base, levels: [1, 2, 3, 4], pressures: [1, 2, 3, 4], pressureUnit: "m" })).toThrow(
      /expected a pressure/,
    );
  });
});

describe("barometric correction", () => {
  it("removes BE times the pressure change as water column, in the level's unit", () => {
    // Hand computation: BE = 0.5, pressure up 2 kPa = 2000/9806.65 mH2O = 0.203943 m = 0.669105 ft of water
    // (1 mH2O = 9806.65 Pa conventional, NIST SP 811; 1 ft = 0.3048 m); the depth rises by half of that,
    // 0.334553 ft, which the correction takes off.
    const rise = (0.5 * 2000) / PA_PER_M_WATER / 0.3048;
    const { values, record } = correctBarometric({
      levels: [30, 30 + rise, 30.1 + rise],
      levelKind: "depth-to-water",
      levelUnit: "ft",
      pressures: [101, 103, 103],
      pressureUnit: "kPa",
      efficiency: 0.5,
    });
    expect(rise).toBeCloseTo(0.334553, 6);
    expect(values[0]).toBe(30);
    expect(values[1]).toBeCloseTo(30, 12);
    expect(values[2]).toBeCloseTo(30.1, 12);
    expect(record.parameters["referencePressure"]).toEqual({ value: 101, unit: "kPa" });
    expect(record.source).toMatch(/^Jacob, C\.E\. \(1940\)/);
    expect(record.summary).toMatch(/pressure rise lowers the level in a confined aquifer/);
  });

  it("adds the effect back to heads, which fall when pressure rises", () => {
    const { values } = correctBarometric({
      levels: [100, 100 - 0.3 * 0.5],
      levelKind: "head",
      levelUnit: "m",
      pressures: [0, 0.5],
      pressureUnit: "mH2O",
      efficiency: 0.3,
    });
    expect(values[1]).toBeCloseTo(100, 12);
  });

  it("carries the regression's statistics into the record when BE was estimated", () => {
    const rec = syntheticRecord(99, 0.35, 60, 0.003);
    const data = { levels: rec.depths, levelKind: "depth-to-water" as const, levelUnit: "m", pressures: rec.pressures, pressureUnit: "hPa" };
    const est = estimateBarometricEfficiency(data);
    const { record } = correctBarometric({ ...data, efficiency: est });
    expect(record.parameters["barometricEfficiency"]).toBe(est.efficiency);
    expect(record.parameters["barometricEfficiencyStandardError"]).toBe(est.standardError);
    expect(record.parameters["regressionMethod"]).toBe("differences");
    expect(record.summary).toMatch(/estimated by regression on differences \(n = 59/);
  });

  it("returns a new series with the record appended and leaves the input as it was", () => {
    const series = createObservationSeries({
      name: "OBS-2",
      times: [1, 2, 3],
      drawdowns: [0.2, 0.35, 0.4],
      timeUnit: "h",
      lengthUnit: "m",
      radius: { value: 25, unit: "m" },
      pumpingRate: { value: 8, unit: "L/s" },
    });
    const once = correctBarometricSeries(series, { pressures: [1010, 1012, 1011], pressureUnit: "hPa", efficiency: 0.5 });
    const twice = correctBarometricSeries(once.series, { pressures: [1010, 1012, 1011], pressureUnit: "hPa", efficiency: 0.5 });
    expect(series.drawdowns[1]).toBe(0.35);
    expect(series.metadata["corrections"]).toBeUndefined();
    expect(once.series.drawdowns[1]).toBeCloseTo(0.35 - (0.5 * 200) / PA_PER_M_WATER, 12);
    expect(seriesCorrections(once.series)).toEqual([once.record]);
    expect(seriesCorrections(twice.series).length).toBe(2);
  });
});
