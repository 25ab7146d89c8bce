import { describe, it, expect } from "vitest";
import { readFileSync } from "node:fs";
import { theisModel, theisDrawdown } from "../src/models/index.js";
import { fitModel } from "../src/fit/index.js";
import { boundaryFromWell, withRateSchedule } from "../src/superposition/index.js";
import { forecastDrawdown, seededRandom, ForecastInputError, MAX_MONTE_CARLO_VALUES, type ForecastOptions } from "../src/forecast/index.js";

// Reference: tests/fixtures/forecast/forecast.json (generate_forecast.py): Theis drawdown and its gradient in
// (ln T, ln S) by mpmath.diff at 30 digits, sd = sqrt(g C g^T) for a stated covariance of (ln T, ln S).
const fixture = JSON.parse(readFileSync(new URL("../../../tests/fixtures/forecast/forecast.json", import.meta.url), "utf8")) as {
  linear: { T: number; S: number; Q: number; r: number; covarianceLn: number[][]; points: { t: number; s: number; sd: number }[] };
};
const L = fixture.linear;
const times = L.points.map((p) => p.t);
// FitResult-style covariance in base units from the ln-space one (delta method: cov_ab = p_a p_b C_ab).
const values = [L.T, L.S];
const nativeCovariance = L.covarianceLn.map((row, a) => row.map((c, b) => c * values[a]! * values[b]!));

function options(uncertainty: ForecastOptions["uncertainty"]): ForecastOptions {
  return {
    model: theisModel,
    parameters: { T: L.T, S: L.S },
    covariance: { names: ["T", "S"], matrix: nativeCovariance },
    schedule: [{ name: "PW", x: 0, y: 0, steps: [{ start: 0, rate: L.Q }] }],
    points: [{ name: "OB", r: L.r }],
    times,
    uncertainty,
  };
}

describe("forecastDrawdown", () => {
  it("propagates the covariance linearly as mpmath's gradient does, to 1e-8 relative", () => {
    const result = forecastDrawdown(options("linear"));
    const point = result.points[0]!;
    L.points.forEach((ref, i) => {
      expect(Math.abs(point.drawdown[i]! / ref.s - 1)).toBeLessThan(1e-12);
      expect(Math.abs(point.standardDeviation![i]! / ref.sd - 1)).toBeLessThan(1e-8);
      expect(point.p95![i]! - point.drawdown[i]!).toBeCloseTo(1.6448536269514722 * ref.sd, 12);
    });
  });

  it("agrees with Monte Carlo for small uncertainty within the Monte Carlo error of 4000 samples", () => {
    const N = 4000;
    const linear = forecastDrawdown(options("linear")).points[0]!;
    const mc = forecastDrawdown(options({ monteCarlo: { samples: N, seed: 11 } })).points[0]!;
    for (let i = 0; i < times.length; i++) {
      const sd = linear.standardDeviation![i]!;
      // Monte Carlo standard errors for normal spread: sd relative 1/sqrt(2(N-1)) = 1.1 %, mean sd/sqrt(N),
      // 5 % and 95 % quantiles 2.11 sd/sqrt(N). Bounds at 4 standard errors plus 1 % of sd for the slight
      // nonlinearity of s in ln T and ln S at 2 % and 5 % uncertainty.
      expect(Math.abs(mc.standardDeviation![i]! / sd - 1)).toBeLessThan(4 / Math.sqrt(2 * (N - 1)) + 0.01);
      expect(Math.abs(mc.mean![i]! - linear.drawdown[i]!)).toBeLessThan((4 / Math.sqrt(N) + 0.01) * sd);
      expect(Math.abs(mc.p05![i]! - linear.p05![i]!)).toBeLessThan((4 * 2.11 / Math.sqrt(N) + 0.01) * sd);
      expect(Math.abs(mc.p95![i]! - linear.p95![i]!)).toBeLessThan((4 * 2.11 / Math.sqrt(N) + 0.01) * sd);
      expect(Math.abs(mc.p50![i]! - linear.p50![i]!)).toBeLessThan((4 * 1.25 / Math.sqrt(N) + 0.01) * sd);
    }
  });

  it("gives bit-identical Monte Carlo output for the same seed and a different band for another seed", () => {
    const a = forecastDrawdown(options({ monteCarlo: { samples: 500, seed: 99 } })).points[0]!;
    const b = forecastDrawdown(options({ monteCarlo: { samples: 500, seed: 99 } })).points[0]!;
    const c = forecastDrawdown(options({ monteCarlo: { samples: 500, seed: 100 } })).points[0]!;
    for (const key of ["p05", "p50", "p95", "standardDeviation", "mean"] as const) {
      expect(Buffer.from(a[key]!.buffer).equals(Buffer.from(b[key]!.buffer))).toBe(true);
    }
    expect(Buffer.from(a.p95!.buffer).equals(Buffer.from(c.p95!.buffer))).toBe(false);
  });

  it("takes the covariance from a FitResult and matches the native-space delta method J cov J^T", () => {
    const g = seededRandom(5);
    const t = Array.from({ length: 30 }, (_, i) => 0.01 * Math.pow(10, (i * 3) / 29));
    const s = t.map((ti) => theisDrawdown(L.T, L.S, L.Q, L.r, ti) + 0.005 * g.nextNormal());
    const fit = fitModel({ model: theisModel, wells: [{ name: "OB", geometry: { r: L.r, Q: L.Q }, t, s }] });
    const result = forecastDrawdown({ model: theisModel, fit, schedule: [{ name: "PW", x: 0, y: 0, steps: [{ start: 0, rate: L.Q }] }], points: [{ name: "OB", x: L.r, y: 0 }], times, uncertainty: "linear" });
    const p = fit.parameters.map((q) => q.estimate);
    const J = theisModel.jacobian!(p, { r: L.r, Q: L.Q }, times);
    times.forEach((_, i) => {
      let v = 0;
      for (let a = 0; a < 2; a++) for (let b = 0; b < 2; b++) v += J[a]![i]! * fit.covariance[a]![b]! * J[b]![i]!;
      expect(Math.abs(result.points[0]!.standardDeviation![i]! / Math.sqrt(v) - 1)).toBeLessThan(1e-10);
    });
    expect(result.uncertainParameters).toEqual(["T", "S"]);
  });

  it("forecasts a new schedule with the base model from a fit of a variable-rate test, and refuses a fit of another model", () => {
    const steps = [{ start: 0, rate: 500 }, { start: 0.5, rate: 900 }];
    const fitted = withRateSchedule(theisModel, steps);
    const t = Array.from({ length: 25 }, (_, i) => 0.01 * Math.pow(10, (i * 2) / 24));
    const g = seededRandom(8);
    const s = Array.from(fitted.drawdown([L.T, L.S], { r: L.r, Q: 500 }, t), (v) => v + 0.003 * g.nextNormal());
    const fit = fitModel({ model: fitted, wells: [{ name: "OB", geometry: { r: L.r, Q: 500 }, t, s }], start: { T: 100, S: 1e-3 } });
    const result = forecastDrawdown({ model: theisModel, fit, schedule: [{ name: "PW", x: 0, y: 0, steps: [{ start: 0, rate: 1200 }] }], points: [{ name: "OB", r: L.r }], times: [30], uncertainty: "linear" });
    const T = fit.parameters[0]!.estimate;
    const S = fit.parameters[1]!.estimate;
    expect(result.points[0]!.drawdown[0]).toBeCloseTo(theisDrawdown(T, S, 1200, L.r, 30), 12);
    expect(result.points[0]!.standardDeviation![0]).toBeGreaterThan(0);
    expect(() => forecastDrawdown({ ...options("none"), parameters: undefined, covariance: undefined, fit: { ...fit, modelId: "hantush-jacob" } } as unknown as ForecastOptions)).toThrow(/the fit is of model "hantush-jacob"/);
  });

  it("forecasts next to a barrier with the image well, and more drawdown than without it", () => {
    const barrier = boundaryFromWell("no-flow", { x: 0, y: 0 }, 200, 0);
    const base = { ...options("none"), points: [{ name: "OB", x: L.r, y: 0 }] };
    const free = forecastDrawdown(base);
    const bounded = forecastDrawdown({ ...base, boundaries: [barrier] });
    expect(bounded.imagesUsed).toBe(1);
    const last = times.length - 1;
    // One barrier: s = s_theis(r) + s_theis(r_image), r_image = 400 - 75 m (Ferris et al. 1962).
    const expected = theisDrawdown(L.T, L.S, L.Q, L.r, times[last]!) + theisDrawdown(L.T, L.S, L.Q, 400 - L.r, times[last]!);
    expect(bounded.points[0]!.drawdown[last]!).toBeCloseTo(expected, 12);
    expect(bounded.points[0]!.drawdown[last]!).toBeGreaterThan(free.points[0]!.drawdown[last]!);
  });

  it("asks for a covariance when uncertainty is wanted without one, and for coordinates when r is ambiguous", () => {
    const noCov = { ...options("linear"), covariance: undefined };
    expect(() => forecastDrawdown(noCov)).toThrow(ForecastInputError);
    expect(() => forecastDrawdown(noCov)).toThrow(/uncertainty needs a covariance/);
    const barrier = boundaryFromWell("no-flow", { x: 0, y: 0 }, 200, 0);
    expect(() => forecastDrawdown({ ...options("none"), boundaries: [barrier] })).toThrow(/ambiguous with boundaries/);
    const nan = { ...options("linear"), covariance: { names: ["T", "S"], matrix: [[Number.NaN, 0], [0, 1e-12]] } };
    expect(() => forecastDrawdown(nan)).toThrow(/did not determine these parameters/);
  });

  it("refuses a Monte Carlo forecast of more than MAX_MONTE_CARLO_VALUES drawdown values before sampling", () => {
    let calls = 0;
    const big = { ...options({ monteCarlo: { samples: 1_000_000, seed: 1 } }), times: Array.from({ length: 1000 }, (_, i) => 0.01 * (i + 1)), checkpoint: () => void calls++ };
    expect(() => forecastDrawdown(big)).toThrow(ForecastInputError);
    expect(() => forecastDrawdown(big)).toThrow(`forecastDrawdown: a Monte Carlo forecast of 1000000 samples at 1 points and 1000 times needs 1000000000 drawdown values; one call may compute at most ${MAX_MONTE_CARLO_VALUES}.`);
    expect(calls).toBe(0);
    expect(MAX_MONTE_CARLO_VALUES).toBe(4_000_000);
  });

  it("calls the checkpoint before each Monte Carlo sample and lets its error through", () => {
    let calls = 0;
    forecastDrawdown({ ...options({ monteCarlo: { samples: 37, seed: 3 } }), checkpoint: () => void calls++ });
    expect(calls).toBe(37);
    const stop = new Error("deadline");
    expect(() => forecastDrawdown({ ...options({ monteCarlo: { samples: 37, seed: 3 } }), checkpoint: () => { if (++calls > 40) throw stop; } })).toThrow(stop);
  });
});
