/**
 * The barometric response function by lagged regression and the earth-tide check, against numpy.linalg.lstsq on a
 * seeded synthetic record (tests/fixtures/barometric-response, generate_barometric_response.py) and against the
 * single-coefficient barometric efficiency of the same library on a record with an instantaneous response.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { barometricResponse, correctBarometric, earthTideCheck, estimateBarometricEfficiency, pressureAsWaterColumn } from "../src/corrections/index.js";

const fixture = JSON.parse(readFileSync(new URL("../../../tests/fixtures/barometric-response/barometric_response.json", import.meta.url), "utf8")) as {
  times: number[];
  pressuresHPa: number[];
  depthsM: number[];
  kernel: number[];
  response: { m: number; tides: string[]; coefficients: number[]; coefficientSE: number[]; response: number[]; responseSE: number[]; rSquared: number }[];
  tides: { amplitudes: Record<string, number> };
};

const base = { times: fixture.times, timeUnit: "d", levels: fixture.depthsM, levelKind: "depth-to-water" as const, levelUnit: "m", pressures: fixture.pressuresHPa, pressureUnit: "hPa" };

/** A deterministic pseudo-random sequence in [-0.5, 0.5) (a linear congruential generator; test data only). */
function noise(n: number, seed: number): Float64Array {
  let x = seed >>> 0;
  return Float64Array.from({ length: n }, () => {
    x = (Math.imul(x, 1664525) + 1013904223) >>> 0;
    return x / 4294967296 - 0.5;
  });
}

describe("barometric response function by lagged regression (Rasmussen and Crawford 1997)", () => {
  it.each([0, 1])("matches numpy lstsq for coefficients, standard errors and the cumulative response (case %i)", (which) => {
    // Reference: tests/fixtures/barometric-response (numpy.linalg.lstsq of the same design).
    const ref = fixture.response[which]!;
    const result = barometricResponse({ ...base, lags: ref.m, earthTides: ref.tides.length > 0 });
    expect(result.lags.length).toBe(ref.m + 1);
    result.lags.forEach((lag, k) => {
      expect(Math.abs(lag.coefficient - ref.coefficients[k]!)).toBeLessThan(1e-10);
      expect(Math.abs(lag.coefficientStandardError / ref.coefficientSE[k]! - 1)).toBeLessThan(1e-8);
      expect(Math.abs(lag.response - ref.response[k]!)).toBeLessThan(1e-10);
      expect(Math.abs(lag.responseStandardError / ref.responseSE[k]! - 1)).toBeLessThan(1e-8);
      expect(lag.lag).toBeCloseTo(k / 24, 12);
    });
    expect(Math.abs(result.rSquared - ref.rSquared)).toBeLessThan(1e-10);
  });

  it("recovers the lagged kernel the record was made with inside its 95 % intervals, and reads it as rising", () => {
    const result = barometricResponse({ ...base, lags: 8, earthTides: true });
    let cumulative = 0;
    result.lags.forEach((lag, k) => {
      cumulative += fixture.kernel[k] ?? 0;
      expect(lag.response95[0], `lag ${k}`).toBeLessThan(cumulative);
      expect(lag.response95[1], `lag ${k}`).toBeGreaterThan(cumulative);
    });
    expect(result.shape).toBe("rising");
    expect(result.hint).toMatch(/^Hint, not a verdict: .*well-bore storage or a skin/);
    expect(result.earthTideTerms.map((e) => e.name)).toEqual(["M2", "O1"]);
  });

  it("gives a flat response equal to the barometric efficiency for an instantaneous response, as the single-coefficient method does", () => {
    // Identity: a record that follows BE times the pressure at once has A_k = BE at every lag.
    const n = 200;
    const t = Array.from({ length: n }, (_, i) => i / 24);
    const p = Array.from(noise(n, 7), (v, i) => 1010 + 8 * Math.sin(i / 9) + 2 * v);
    const w = pressureAsWaterColumn(p, "hPa", "m");
    const e = noise(n, 11);
    const head = Array.from(w, (v, i) => 30 - 0.42 * v + 0.0001 * i + 1e-5 * e[i]!);
    const result = barometricResponse({ times: t, timeUnit: "d", levels: head, levelKind: "head", levelUnit: "m", pressures: p, pressureUnit: "hPa", lags: 6 });
    for (const lag of result.lags) expect(Math.abs(lag.response - 0.42)).toBeLessThan(2e-4);
    expect(result.shape).toBe("flat");
    const single = estimateBarometricEfficiency({ levels: head, levelKind: "head", levelUnit: "m", pressures: p, pressureUnit: "hPa" });
    const lagZero = barometricResponse({ times: t, timeUnit: "d", levels: head, levelKind: "head", levelUnit: "m", pressures: p, pressureUnit: "hPa", lags: 0 });
    expect(Math.abs(lagZero.lags[0]!.response - single.efficiency)).toBeLessThan(1e-12);
    expect(Math.abs(lagZero.lags[0]!.coefficientStandardError / single.standardError - 1)).toBeLessThan(1e-9);
    // The corrected record is the single-coefficient correction with the same BE (reference pressure at reading 0).
    const corrected = correctBarometric({ levels: head, levelKind: "head", levelUnit: "m", pressures: p, pressureUnit: "hPa", efficiency: lagZero.lags[0]!.coefficient });
    for (let i = 0; i < n; i++) expect(Math.abs(lagZero.values[i]! - corrected.values[i]!)).toBeLessThan(1e-12);
  });

  it("refuses irregular readings and too many lags, saying what would fix them", () => {
    const t = [...fixture.times];
    t[10] = t[10]! + 0.01;
    expect(() => barometricResponse({ ...base, times: t, lags: 4 })).toThrow(/interval between readings 9 and 10 is .* not the regular .*resample the record or fill the gap/);
    expect(() => barometricResponse({ ...base, lags: 400 })).toThrow("barometricResponse: lags is 400; give an integer from 0 to 160 (a third of the 480 readings)");
  });
});

describe("earth-tide check", () => {
  it("matches numpy lstsq amplitudes of M2, O1, K1 and S2 and finds the gravitational tides of the record", () => {
    // Reference: tests/fixtures/barometric-response (harmonic regression with numpy).
    const check = earthTideCheck({ times: fixture.times, timeUnit: "d", values: fixture.depthsM, valueUnit: "m" });
    expect(check.notSeparated).toEqual([]);
    for (const c of check.constituents) expect(Math.abs(c.amplitude - fixture.tides.amplitudes[c.name]!)).toBeLessThan(1e-11);
    const m2 = check.constituents.find((c) => c.name === "M2")!;
    expect(m2.present).toBe(true);
    expect(m2.periodHours).toBeCloseTo(12.4206, 3); // M2 period 12.42 h (fact of astronomy, from memory)
    expect(check.notes[0]).toMatch(/^M2 and O1 are present: earth tides reach the well/);
  });

  it("recovers a pure M2 wave exactly, finds no tide in noise, and leaves out what a 3-day record cannot separate", () => {
    const t = Array.from({ length: 15 * 24 }, (_, i) => i / 24);
    const wave = t.map((v) => 0.004 * Math.cos(2 * Math.PI * 1.9322736 * v - 1.1));
    const pure = earthTideCheck({ times: t, timeUnit: "d", values: wave, valueUnit: "m" });
    expect(Math.abs(pure.constituents.find((c) => c.name === "M2")!.amplitude - 0.004)).toBeLessThan(1e-12);
    const quiet = earthTideCheck({ times: t, timeUnit: "d", values: Array.from(noise(t.length, 3), (v) => 0.001 * v), valueUnit: "m" });
    expect(quiet.constituents.filter((c) => c.present)).toEqual([]);
    const short = earthTideCheck({ times: t.slice(0, 72), timeUnit: "d", values: wave.slice(0, 72), valueUnit: "m" });
    expect(short.constituents.map((c) => c.name)).toEqual(["M2", "O1"]);
    expect(short.notSeparated[0]).toMatch(/^K1 \(not separable from O1 in 2.95833 d; needs 13.6/);
    expect(() => earthTideCheck({ times: [0, 0.5, 1], timeUnit: "d", values: [0, 0, 0], valueUnit: "m" })).toThrow(/at least 12/);
  });
});
