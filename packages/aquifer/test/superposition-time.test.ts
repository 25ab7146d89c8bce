import { describe, it, expect } from "vitest";
import { readFileSync } from "node:fs";
import { theisModel, hantushJacobModel, thiemModel } from "../src/models/index.js";
import { fitModel } from "../src/fit/index.js";
import { withRateSchedule, SuperpositionInputError, type PumpingStep } from "../src/superposition/index.js";

// Reference: tests/fixtures/superposition/superposition.json, written by generate_superposition.py
// (Theis unit drawdown from scipy.special.exp1, summed over the rate changes in Python).
const fixture = JSON.parse(
  readFileSync(new URL("../../../tests/fixtures/superposition/superposition.json", import.meta.url), "utf8"),
) as {
  cases: {
    stepTest: { T: number; S: number; r: number; steps: PumpingStep[]; t: number[]; s: number[] };
    recovery: { T: number; S: number; Q: number; r: number; tp: number; dt: number[]; residual: number[]; tPumping: number[]; sPumping: number[] };
  };
};

function maxRelative(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let worst = 0;
  for (let i = 0; i < b.length; i++) {
    if (b[i] === 0) expect(a[i]).toBe(0);
    else worst = Math.max(worst, Math.abs(a[i]! - b[i]!) / Math.abs(b[i]!));
  }
  return worst;
}

describe("withRateSchedule", () => {
  const step = fixture.cases.stepTest;

  it("reproduces a four-step test with recovery computed independently with scipy to 1e-12 relative", () => {
    const model = withRateSchedule(theisModel, step.steps);
    const s = model.drawdown([step.T, step.S], { r: step.r, Q: 400 }, step.t);
    expect(maxRelative(s, step.s)).toBeLessThan(1e-12);
  });

  it("keeps the base model's parameters and equals the base model for a single constant step", () => {
    const model = withRateSchedule(theisModel, [{ start: 0, rate: 500 }]);
    expect(model.parameters).toBe(theisModel.parameters);
    const t = [0.01, 0.1, 1, 10];
    const a = model.drawdown([300, 1e-4], { r: 40, Q: 1 }, t);
    const b = theisModel.drawdown([300, 1e-4], { r: 40, Q: 500 }, t);
    // Linearity in Q: 500 * s(Q = 1) equals s(Q = 500) to rounding.
    expect(maxRelative(a, b)).toBeLessThan(1e-14);
  });

  it("gives zero drawdown before the first step and at its start", () => {
    const model = withRateSchedule(theisModel, [{ start: 0.5, rate: 500 }]);
    const s = model.drawdown([300, 1e-4], { r: 40, Q: 500 }, [0.1, 0.5, 0.6]);
    expect(s[0]).toBe(0);
    expect(s[1]).toBe(0);
    expect(s[2]).toBeGreaterThan(0);
  });

  it("has a superposed Jacobian that matches central differences to 1e-6 of the column's largest entry", () => {
    const model = withRateSchedule(theisModel, step.steps);
    const p = [step.T, step.S];
    const g = { r: step.r, Q: 400 };
    const J = model.jacobian!(p, g, step.t);
    for (let k = 0; k < 2; k++) {
      const h = 1e-6 * p[k]!;
      const up = p.slice();
      const down = p.slice();
      up[k]! += h;
      down[k]! -= h;
      const su = model.drawdown(up, g, step.t);
      const sd = model.drawdown(down, g, step.t);
      const largest = J[k]!.reduce((m, v) => Math.max(m, Math.abs(v)), 0);
      expect(largest).toBeGreaterThan(0);
      for (let i = 0; i < step.t.length; i++) {
        const fd = (su[i]! - sd[i]!) / (2 * h);
        expect(Math.abs(J[k]![i]! - fd)).toBeLessThanOrEqual(1e-6 * largest);
      }
    }
  });

  it("is linear in the rates: doubling every rate doubles the drawdown (Hantush-Jacob base)", () => {
    const a = withRateSchedule(hantushJacobModel, [{ start: 0, rate: 300 }, { start: 1, rate: 700 }]);
    const b = withRateSchedule(hantushJacobModel, [{ start: 0, rate: 600 }, { start: 1, rate: 1400 }]);
    const p = [200, 1e-4, 800];
    const t = [0.2, 1.5, 4];
    const sa = a.drawdown(p, { r: 50, Q: 1 }, t);
    const sb = b.drawdown(p, { r: 50, Q: 1 }, t);
    for (let i = 0; i < t.length; i++) expect(sb[i]).toBeCloseTo(2 * sa[i]!, 12);
  });

  it("gives the steady drawdown of the current rate for a steady base model (Thiem)", () => {
    const model = withRateSchedule(thiemModel, [{ start: 0, rate: 300 }, { start: 1, rate: 700 }]);
    const s = model.drawdown([400, 600], { r: 30, Q: 1 }, [0.5, 2]);
    // Thiem (1906): s = Q/(2 pi T) ln(R/r) with the rate in force.
    expect(s[0]).toBeCloseTo((300 / (2 * Math.PI * 400)) * Math.log(600 / 30), 12);
    expect(s[1]).toBeCloseTo((700 / (2 * Math.PI * 400)) * Math.log(600 / 30), 12);
  });

  it("refuses an empty schedule, unordered steps and non-finite rates with messages naming the step", () => {
    expect(() => withRateSchedule(theisModel, [])).toThrow(SuperpositionInputError);
    expect(() => withRateSchedule(theisModel, [{ start: 0, rate: 1 }, { start: 0, rate: 2 }])).toThrow(/step 1 starts at 0 d/);
    expect(() => withRateSchedule(theisModel, [{ start: 0, rate: Number.NaN }])).toThrow(/step 0 has rate NaN/);
  });

  it("is fit-ready: fitModel recovers T and S from pumping and recovery data of a pump-then-stop schedule", () => {
    const rec = fixture.cases.recovery;
    const schedule = [{ start: 0, rate: rec.Q }, { start: rec.tp, rate: 0 }];
    const model = withRateSchedule(theisModel, schedule);
    const t = [...rec.tPumping.slice(1), ...rec.dt.map((d) => rec.tp + d)];
    const s = [...rec.sPumping.slice(1), ...rec.residual];
    const result = fitModel({ model, wells: [{ name: "OB-R", geometry: { r: rec.r, Q: rec.Q }, t, s }], start: { T: 60, S: 1e-3 } });
    expect(result.converged).toBe(true);
    expect(result.jacobianMethod).toBe("analytic");
    // Noise-free synthetic data from scipy: the fit must return the generating values.
    expect(Math.abs(result.parameters[0]!.estimate / rec.T - 1)).toBeLessThan(1e-6);
    expect(Math.abs(result.parameters[1]!.estimate / rec.S - 1)).toBeLessThan(1e-6);
  });

  it("fits recovery data alone (residual drawdown after the stop) and returns T and S", () => {
    const rec = fixture.cases.recovery;
    const model = withRateSchedule(theisModel, [{ start: 0, rate: rec.Q }, { start: rec.tp, rate: 0 }]);
    const t = rec.dt.map((d) => rec.tp + d);
    const result = fitModel({ model, wells: [{ name: "OB-R", geometry: { r: rec.r, Q: rec.Q }, t, s: rec.residual }], start: { T: 100, S: 1e-3 } });
    expect(Math.abs(result.parameters[0]!.estimate / rec.T - 1)).toBeLessThan(1e-6);
    expect(Math.abs(result.parameters[1]!.estimate / rec.S - 1)).toBeLessThan(1e-5);
  });
});
