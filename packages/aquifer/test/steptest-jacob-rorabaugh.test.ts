import { describe, expect, it } from "vitest";
import { convert, toBase } from "../src/units/index.js";
import {
  jacobStepTest,
  rorabaughStepTest,
  stepPerformance,
  WALTON_THRESHOLDS,
  waltonWellCondition,
  StepTestInputError,
} from "../src/steptest/index.js";
import { normalGenerator } from "../../../tests/support/seeded-noise.js";

// Synthetic wells (invented): B in d/m2, C in d2/m5 (Jacob) or d^n/m^(3n-1) (Rorabaugh), Q in m3/d, s in m.
const B = 1.2e-3;
const C = 4e-7;
const RATES = [500, 1000, 1500, 2000, 2500];

function jacobSteps(rates: number[], b: number, c: number, n = 2) {
  return rates.map((q) => ({ rate: q, drawdown: b * q + c * Math.pow(q, n) }));
}

describe("Jacob (1947) step-drawdown analysis", () => {
  it("recovers B and C exactly from noise-free steps given in L/s and ft", () => {
    // Rates and drawdowns converted out of base units; the fit must convert back (1 L/s = 86.4 m3/d, 1 ft = 0.3048 m).
    const steps = jacobSteps(RATES, B, C).map((s) => ({
      rate: convert(s.rate, "m3/d", "L/s"),
      drawdown: convert(s.drawdown, "m", "ft"),
    }));
    const r = jacobStepTest({ rateUnit: "L/s", drawdownUnit: "ft", steps });
    expect(r.B).toBeCloseTo(B, 15);
    expect(Math.abs(r.B / B - 1)).toBeLessThan(1e-12);
    expect(Math.abs(r.C / C - 1)).toBeLessThan(1e-11);
    expect(r.parameters.map((p) => p.unit)).toEqual(["d/m2", "d2/m5"]);
    expect(r.parameters[1]!.standardError!).toBeLessThan(1e-12 * C + 1e-20);
    expect(r.warnings).toEqual([]);
  });

  it("computes efficiency, well-loss fraction and specific capacity as worked by hand", () => {
    // By hand: B = 1e-3 d/m2, C = 5e-7 d2/m5, Q = 1000 m3/d: BQ = 1 m, CQ^2 = 0.5 m, s_w = 1.5 m,
    // efficiency = 1/1.5 = 0.6667, well-loss fraction = 0.5/1.5 = 0.3333, Q/s_w = 1000/1.5 = 666.67 m2/d.
    const [p] = stepPerformance([1000], [1.5], 1e-3, 5e-7, 2);
    expect(p!.formationLoss).toBeCloseTo(1, 14);
    expect(p!.wellLoss).toBeCloseTo(0.5, 14);
    expect(p!.efficiency).toBeCloseTo(2 / 3, 14);
    expect(p!.wellLossFraction).toBeCloseTo(1 / 3, 14);
    expect(p!.specificCapacity).toBeCloseTo(1000 / 1.5, 10);
    expect(p!.fittedSpecificCapacity).toBeCloseTo(1000 / 1.5, 10);
  });

  it("covers the true B and C with its 95 % intervals in about 95 % of seeded noisy tests", () => {
    // Noise (sd 2e-5 d/m2) is added to s_w/Q, the regressed variable, so the interval's assumptions hold exactly;
    // 400 replicates: the binomial 99.9 % range of the coverage count for p = 0.95 is about 365..393.
    const normal = normalGenerator(20240611);
    let coverB = 0;
    let coverC = 0;
    const replicates = 400;
    for (let k = 0; k < replicates; k++) {
      const steps = RATES.map((q) => ({ rate: q, drawdown: q * (B + C * q + 2e-5 * normal()) }));
      const r = jacobStepTest({ rateUnit: "m3/d", drawdownUnit: "m", steps });
      const [b, c] = r.parameters;
      if (b!.ci95![0] <= B && B <= b!.ci95![1]) coverB++;
      if (c!.ci95![0] <= C && C <= c!.ci95![1]) coverC++;
    }
    expect(coverB).toBeGreaterThanOrEqual(365);
    expect(coverB).toBeLessThanOrEqual(393);
    expect(coverC).toBeGreaterThanOrEqual(365);
    expect(coverC).toBeLessThanOrEqual(393);
  });

  it("refuses repeated rates, missing units and non-positive drawdowns with messages that name the step", () => {
    expect(() =>
      jacobStepTest({ rateUnit: "m3/d", drawdownUnit: "m", steps: [{ rate: 500, drawdown: 1 }, { rate: 500, drawdown: 1.2 }] }),
    ).toThrow(/same rate/);
    expect(() =>
      jacobStepTest({ rateUnit: "m", drawdownUnit: "m", steps: jacobSteps(RATES, B, C) }),
    ).toThrow(StepTestInputError);
    expect(() =>
      jacobStepTest({ rateUnit: "m3/d", drawdownUnit: "m", steps: [{ rate: 500, drawdown: 1 }, { rate: 900, drawdown: -1 }] }),
    ).toThrow(/Step 2: drawdown = -1/);
  });

  it("warns when the line gives a negative well loss coefficient", () => {
    const steps = RATES.map((q) => ({ rate: q, drawdown: q * (2e-3 - 1e-7 * q) }));
    const r = jacobStepTest({ rateUnit: "m3/d", drawdownUnit: "m", steps });
    expect(r.C).toBeLessThan(0);
    expect(r.warnings.join(" ")).toMatch(/negative/);
    expect(r.wellCondition).toBeNull();
  });
});

describe("Walton (1962) well-condition hint", () => {
  it("converts the limits 5, 10, 40 s^2/ft^5 to d^2/m^5", () => {
    // By hand: 1 s^2/ft^5 = (1/86400 d)^2 / (0.3048 m)^5 = 1.3395e-10 / 2.6307e-3 = 5.0921e-8 d^2/m^5.
    expect(WALTON_THRESHOLDS[0] / 5).toBeCloseTo(5.0921e-8, 11);
    expect(WALTON_THRESHOLDS[1]).toBeCloseTo(10 * 5.0921e-8, 11);
    expect(WALTON_THRESHOLDS[2]).toBeCloseTo(40 * 5.0921e-8, 11);
    // By hand: 5 s^2/ft^5 = (5/3600 min^2) / 2.6307e-3 m^5 = 0.5279 min^2/m^5 (the metric table reads about 0.5, from memory).
    expect(convert(WALTON_THRESHOLDS[0], "d2/m5", "min2/m5")).toBeCloseTo(0.5279, 4);
  });

  it("classifies C on each side of the limits", () => {
    expect(waltonWellCondition(toBase(4.9, "s2/ft5"))!.condition).toBe("properly designed and developed");
    expect(waltonWellCondition(toBase(5.1, "s2/ft5"))!.condition).toBe("mild deterioration or clogging");
    expect(waltonWellCondition(toBase(20, "s2/ft5"))!.condition).toBe("severe deterioration or clogging");
    expect(waltonWellCondition(toBase(41, "s2/ft5"))!.condition).toBe("difficult to restore to original capacity");
    expect(waltonWellCondition(-1)).toBeNull();
    expect(waltonWellCondition(1e-7)!.hintOnly).toBe(true);
  });
});

describe("Rorabaugh (1953) step-drawdown analysis", () => {
  const n = 2.6;
  const c = 3e-9;
  it("recovers B, C and n from noise-free steps", () => {
    const r = rorabaughStepTest({ rateUnit: "m3/d", drawdownUnit: "m", steps: jacobSteps(RATES, B, c, n) });
    expect(Math.abs(r.n - n)).toBeLessThan(1e-8);
    expect(Math.abs(r.B / B - 1)).toBeLessThan(1e-8);
    expect(Math.abs(r.C / c - 1)).toBeLessThan(1e-7);
    expect(r.parameters[1]!.unit).toBe("d^2.6/m^6.8");
    for (const p of r.steps) expect(p.efficiency + p.wellLossFraction).toBeCloseTo(1, 14);
  });

  it("gives Jacob's answer when the steps follow n = 2 exactly", () => {
    const steps = jacobSteps(RATES, B, C);
    const r = rorabaughStepTest({ rateUnit: "m3/d", drawdownUnit: "m", steps });
    const j = jacobStepTest({ rateUnit: "m3/d", drawdownUnit: "m", steps });
    expect(Math.abs(r.n - 2)).toBeLessThan(1e-8);
    expect(Math.abs(r.B / j.B - 1)).toBeLessThan(1e-8);
    expect(r.wellCondition!.condition).toBe(j.wellCondition!.condition);
  });

  it("covers the true n with its 95 % interval in about 95 % of seeded noisy tests", () => {
    // Drawdown noise sd 5 mm on 6 steps; 200 replicates: linearised intervals, so a wider acceptance
    // (binomial 99.9 % range for p = 0.95 is about 179..198; allow 170..200 for the linearisation).
    const normal = normalGenerator(77);
    const rates = [400, 800, 1200, 1600, 2000, 2400];
    let cover = 0;
    for (let k = 0; k < 200; k++) {
      const steps = rates.map((q) => ({ rate: q, drawdown: B * q + c * Math.pow(q, n) + 0.005 * normal() }));
      const r = rorabaughStepTest({ rateUnit: "m3/d", drawdownUnit: "m", steps });
      const ci = r.parameters[2]!.ci95!;
      if (ci[0] <= n && n <= ci[1]) cover++;
    }
    expect(cover).toBeGreaterThanOrEqual(170);
    expect(cover).toBeLessThanOrEqual(200);
  });
});
