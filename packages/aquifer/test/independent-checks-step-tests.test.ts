import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { getModel } from "../src/models/registry.js";

const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);

// Reference: tests/fixtures/steptest/generate_step_storage.py - the unit-rate Papadopulos-Cooper (1967) pumped-well
// response with skin by mpmath.invertlaplace (Talbot, 30 digits), superposed over the schedule, plus C Q(t)^n.
const storage = JSON.parse(
  readFileSync(new URL("../../../tests/fixtures/steptest/step_storage.json", import.meta.url), "utf8"),
) as {
  parameters: { T: number; S: number; rc: number; rw: number; skin: number; C: number; n: number };
  steps: { start: number; rate: number }[];
  points: { t: number; drawdown: number; aquifer: number; wellLoss: number }[];
};

/** Euler's constant gamma (to 16 digits; common practice, no source). */
const EULER_GAMMA = 0.5772156649015329;
/**
 * Cooper-Jacob (1946) late-time form of the unit-rate Theis drawdown, m per m3/d, with the exact constant
 * 4 e^-gamma = 2.2458... (the usual 2.25 is its rounding, 1e-4 off in s here): (ln(T t / (r^2 S)) + ln 4 - gamma) / (4 pi T).
 */
const cooperJacob = (T: number, S: number, r: number, t: number): number =>
  (Math.log((T * t) / (r * r * S)) + Math.log(4) - EULER_GAMMA) / (4 * Math.PI * T);

describe("step tests with well loss against independent routes", () => {
  it("papadopulos-cooper+well-loss follows the mpmath superposition within 1e-4 relative through four steps (32 points)", () => {
    const p = storage.parameters;
    const model = getModel({ id: "papadopulos-cooper+well-loss", casingRadius: p.rc, wellRadius: p.rw, skin: p.skin, steps: storage.steps });
    const s = model.drawdown([p.T, p.S, p.C, p.n], { r: p.rw, Q: storage.steps[0]!.rate }, storage.points.map((q) => q.t));
    expect(storage.points.length).toBe(32);
    storage.points.forEach((q, i) => expect(rel(s[i]!, q.drawdown), `t = ${q.t} d`).toBeLessThan(1e-4));
  });

  it("theis+well-loss equals the Cooper-Jacob sum over steps plus C Q^n where every u <= 1e-6 (within 1e-6 relative)", () => {
    // Late-time asymptote: W(u) = -0.5772... - ln u + O(u), so each step's term is within u of Cooper-Jacob
    // (Cooper and Jacob 1946). Invented schedule: rw = 0.1 m, T = 300 m2/d, S = 1e-4.
    const [T, S, rw, C, n] = [300, 1e-4, 0.1, 3e-8, 2.5];
    const steps = [{ start: 0, rate: 500 }, { start: 0.1, rate: 900 }, { start: 0.2, rate: 1400 }];
    const model = getModel({ id: "theis+well-loss", steps });
    const times = [0.01, 0.05, 0.0999, 0.11, 0.15, 0.1999, 0.21, 0.3, 0.5];
    const s = model.drawdown([T, S, C, n], { r: rw, Q: 500 }, times);
    times.forEach((t, i) => {
      let expected = 0;
      let previous = 0;
      let rate = 0;
      for (const step of steps) {
        if (t <= step.start) break;
        expect((rw * rw * S) / (4 * T * (t - step.start))).toBeLessThanOrEqual(1e-6);
        expected += (step.rate - previous) * cooperJacob(T, S, rw, t - step.start);
        previous = step.rate;
        rate = step.rate;
      }
      expected += C * rate ** n;
      expect(rel(s[i]!, expected), `t = ${t} d`).toBeLessThan(1e-6);
    });
  });

  it("papadopulos-cooper+well-loss tends to the Cooper-Jacob sum plus skin and C Q^n as casing storage fades", () => {
    // Late-time asymptote of Papadopulos-Cooper with skin: Theis at rw plus Q Sk/(2 pi T) (Agarwal et al. 1970).
    // The storage gap fades as about 0.5 rc^2/(T t) (measured by mpmath in tests/fixtures/wellbore/storage_time.json):
    // 1.26e-5 at 0.99 d and 1.3e-6 or less from 9.9 d on for these values.
    const [T, S, rc, rw, skin, C, n] = [400, 2e-4, 0.1, 0.1, 3, 4e-8, 2];
    const steps = [{ start: 0, rate: 600 }, { start: 10, rate: 1000 }];
    const model = getModel({ id: "papadopulos-cooper+well-loss", casingRadius: rc, wellRadius: rw, skin, steps, stehfestTerms: 16 });
    const times = [0.99, 9.9, 20, 30];
    const s = model.drawdown([T, S, C, n], { r: rw, Q: 600 }, times);
    times.forEach((t, i) => {
      let expected = 0;
      let previous = 0;
      let rate = 0;
      for (const step of steps) {
        if (t <= step.start) break;
        expected += (step.rate - previous) * (cooperJacob(T, S, rw, t - step.start) + skin / (2 * Math.PI * T));
        previous = step.rate;
        rate = step.rate;
      }
      expected += C * rate ** n;
      if (t < 1) {
        const gap = 1 - s[i]! / expected;
        expect(gap / ((0.5 * rc * rc) / (T * t)), "gap over 0.5 rc^2/(T t)").toBeCloseTo(1, 1);
      } else {
        expect(rel(s[i]!, expected), `t = ${t} d`).toBeLessThan(3e-6);
      }
    });
  });
});
