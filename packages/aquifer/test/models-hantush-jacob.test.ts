import { describe, expect, it } from "vitest";
import {
  hantushJacobDrawdown,
  hantushJacobModel,
  hantushJacobSteadyDrawdown,
  hantushTypeCurves,
  leakageFactorFromLeakance,
  leakanceFromLeakageFactor,
} from "../src/models/hantush-jacob.js";
import { theisModel } from "../src/models/theis.js";
import { centralDifferences, fixture, relDiff } from "./models-fixture.js";

describe("Hantush-Jacob (1955) leaky aquifer", () => {
  it("matches mpmath drawdown for r/B from 0.01 to 3 and u from 3e-4 to 5 within 1e-12 relative", () => {
    // Reference: mpmath quadrature of W(u, r/B) at 30 digits (tests/fixtures/models/generate_models.py).
    expect(fixture.hantushJacob.length).toBeGreaterThanOrEqual(8);
    for (const c of fixture.hantushJacob) {
      const s = hantushJacobDrawdown(c.T, c.S, c.B, c.Q, c.r, c.t);
      expect(relDiff(s, c.s), `u = ${c.u}, r/B = ${c.rB}`).toBeLessThan(1e-12);
    }
  });

  it("has an analytic Jacobian that agrees with mpmath derivatives within 1e-12 relative", () => {
    // Reference: mpmath.diff of the quadrature expression, independent of the chain rule used here.
    for (const c of fixture.hantushJacob) {
      const [dT, dS, dB] = hantushJacobModel.jacobian!([c.T, c.S, c.B], { r: c.r, Q: c.Q }, [c.t]);
      const where = `u = ${c.u}, r/B = ${c.rB}`;
      expect(relDiff(dT![0]!, c.dsdT), `dT at ${where}`).toBeLessThan(1e-12);
      expect(relDiff(dS![0]!, c.dsdS), `dS at ${where}`).toBeLessThan(1e-12);
      expect(relDiff(dB![0]!, c.dsdB), `dB at ${where}`).toBeLessThan(1e-12);
    }
  });

  it("has an analytic Jacobian that agrees with central finite differences within 1e-6", () => {
    const g = { r: 45, Q: 750 };
    const t = [1e-3, 1e-2, 0.1, 1, 10, 100];
    const p = [180, 3e-4, 400];
    const J = hantushJacobModel.jacobian!(p, g, t);
    const fd = centralDifferences((q) => hantushJacobModel.drawdown(q, g, t), p);
    const s = hantushJacobModel.drawdown(p, g, t);
    for (let k = 0; k < 3; k++) {
      for (let i = 0; i < t.length; i++) {
        // Scaled by |s| / p_k: dT and dB pass through or approach zero at some times.
        const scale = Math.max(Math.abs(J[k]![i]!), Math.abs(s[i]!) / p[k]!);
        expect(Math.abs(J[k]![i]! - fd[k]![i]!) / scale, `param ${k}, t = ${t[i]}`).toBeLessThan(1e-6);
      }
    }
  });

  it("reduces to Theis as B grows without bound", () => {
    // W(u, r/B) -> E1(u) as r/B -> 0 (Hantush and Jacob 1955).
    const g = { r: 30, Q: 500 };
    const t = [1e-3, 0.01, 0.1, 1, 10];
    const theis = theisModel.drawdown([150, 2e-4], g, t);
    const leaky = hantushJacobModel.drawdown([150, 2e-4, 1e9], g, t);
    t.forEach((ti, i) => expect(relDiff(leaky[i]!, theis[i]!), `t = ${ti}`).toBeLessThan(1e-8));
  });

  it("levels off at the de Glee / Hantush steady drawdown Q/(2 pi T) K0(r/B) at late time", () => {
    // Reference: mpmath besselk(0, r/B). With u = 1e-12, W(u, b) - 2 K0(b) = -W(b^2/(4u), b) is far
    // below double precision for every r/B >= 0.01 in the fixture; the match is to 1e-13.
    for (const c of fixture.hantushSteady) {
      const B = 100;
      const r = c.rB * B;
      const S = 1e-4;
      const t = (r * r * S) / (4 * c.T * 1e-12);
      const late = hantushJacobDrawdown(c.T, S, B, c.Q, r, t);
      expect(relDiff(late, c.s), `r/B = ${c.rB}`).toBeLessThan(1e-13);
      expect(relDiff(hantushJacobSteadyDrawdown(c.T, B, c.Q, r), c.s), `r/B = ${c.rB}`).toBeLessThan(1e-13);
    }
  });

  it("converts between leakage factor and leakance K'/b' = T / B^2", () => {
    // T = 100 m2/d, B = 500 m: K'/b' = 100 / 250000 = 4e-4 1/d.
    expect(leakanceFromLeakageFactor(100, 500)).toBeCloseTo(4e-4, 15);
    expect(leakageFactorFromLeakance(100, 4e-4)).toBeCloseTo(500, 10);
    expect(() => leakanceFromLeakageFactor(100, 0)).toThrow(/leakage factor B is 0 m/);
  });

  it("gives a type-curve family that starts with the Theis curve at r/B = 0 and matches mpmath", () => {
    const cases = fixture.hantushJacob;
    const family = hantushTypeCurves(
      cases.map((c) => 1 / c.u),
      [0, ...cases.map((c) => c.rB)],
    );
    const theis = theisModel.drawdown([1, 1], { r: 2, Q: 4 * Math.PI }, cases.map((c) => 1 / c.u));
    // With T = 1, S = 1, r = 2: u = 1/t, and s = W(u), so the Theis curve at 1/u = t.
    family.curves[0]!.W.forEach((w, i) => expect(relDiff(w, theis[i]!)).toBeLessThan(1e-12));
    cases.forEach((c, k) => {
      expect(family.curves[k + 1]!.rB).toBe(c.rB);
      expect(relDiff(family.curves[k + 1]!.W[k]!, c.W), `u = ${c.u}, r/B = ${c.rB}`).toBeLessThan(1e-12);
    });
  });

  it("rejects a negative r/B in the type-curve family", () => {
    expect(() => hantushTypeCurves([1], [-0.1])).toThrow(/r\/B at index 0 is -0.1/);
  });
});
