import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { theisModel } from "../src/models/index.js";
import { fitStepDrawdown, stepDrawdownModel, transmissivityFromSpecificCapacity } from "../src/steptest/index.js";

const fixture = JSON.parse(
  readFileSync(new URL("../../../tests/fixtures/steptest/step_fit.json", import.meta.url), "utf8"),
) as {
  truth: { T: number; S: number; rw: number; C: number; n: number };
  steps: { start: number; rate: number }[];
  t: number[]; s: number[]; sNoisy: number[]; noise: number;
  specificCapacity: { T: number; S: number; rw: number; t: number; specificCapacity: number; brentqT: number }[];
};
const { truth } = fixture;

describe("transient step-drawdown fit with well loss", () => {
  it("reproduces the scipy superposition of Theis plus C Q^n through every step (1e-13 relative)", () => {
    // Reference: tests/fixtures/steptest/generate_step_fit.py (scipy.special.exp1).
    const model = stepDrawdownModel(theisModel, fixture.steps);
    const s = model.drawdown([truth.T, truth.S, truth.C, truth.n], { r: truth.rw, Q: 400 }, fixture.t);
    fixture.s.forEach((v, i) => expect(Math.abs(s[i]! / v - 1), `t ${fixture.t[i]}`).toBeLessThan(1e-13));
  });

  it("recovers T, S, C and n from the noise-free scipy record within 1e-6", () => {
    const result = fitStepDrawdown({
      aquifer: theisModel, steps: fixture.steps, wellRadius: truth.rw, t: fixture.t, s: fixture.s,
      start: { T: 100, S: 1e-3, C: 1e-6, n: 2 },
    });
    const values = Object.fromEntries(result.fit.parameters.map((q) => [q.name, q.estimate]));
    for (const name of ["T", "S", "C", "n"] as const) expect(Math.abs(values[name]! / truth[name] - 1), name).toBeLessThan(1e-6);
    expect(result.wellLossUnit).toBe("d^2.3/m^5.9");
  });

  it("brackets the true values with its 95 % intervals on the noisy record and reports per-step losses", () => {
    const result = fitStepDrawdown({
      aquifer: theisModel, steps: fixture.steps, wellRadius: truth.rw, t: fixture.t, s: fixture.sNoisy,
      start: { T: 100, S: 1e-3, C: 1e-6, n: 2 },
    });
    for (const q of result.fit.parameters) {
      const ci = q.ci95!;
      expect(ci[0], q.name).toBeLessThan(truth[q.name as keyof typeof truth]);
      expect(ci[1], q.name).toBeGreaterThan(truth[q.name as keyof typeof truth]);
    }
    expect(Math.abs(result.fit.residualStandardError / fixture.noise - 1)).toBeLessThan(0.25);
    // Efficiency falls as the rate rises (the well loss grows faster than Q).
    const eff = result.steps.map((s) => s.efficiency);
    for (let i = 1; i < eff.length; i++) expect(eff[i]!).toBeLessThan(eff[i - 1]!);
  });

  it("fits Jacob's n = 2 when n is held fixed", () => {
    const result = fitStepDrawdown({
      aquifer: theisModel, steps: fixture.steps, wellRadius: truth.rw, t: fixture.t, s: fixture.s, fixed: { n: 2 },
    });
    const n = result.fit.parameters.find((q) => q.name === "n")!;
    expect(n.fixed).toBe(true);
    expect(n.estimate).toBe(2);
  });

  it("refuses a record with a single pumping step", () => {
    expect(() =>
      fitStepDrawdown({ aquifer: theisModel, steps: [{ start: 0, rate: 500 }], wellRadius: 0.1, t: [0.1], s: [1] }),
    ).toThrow(/at least two steps/);
  });
});

describe("transmissivity from specific capacity", () => {
  it("inverts the Theis relation at the well as scipy's brentq does (1e-10 relative)", () => {
    for (const c of fixture.specificCapacity) {
      const estimate = transmissivityFromSpecificCapacity(c.specificCapacity, c.t, c.rw, c.S);
      expect(Math.abs(estimate.T / c.brentqT - 1)).toBeLessThan(1e-10);
      expect(Math.abs(estimate.T / c.T - 1)).toBeLessThan(1e-10);
    }
  });

  it("states that well losses make the estimate a lower bound", () => {
    const estimate = transmissivityFromSpecificCapacity(50, 1, 0.1, 1e-4);
    expect(estimate.notes.join(" ")).toMatch(/underestimated/);
  });
});
