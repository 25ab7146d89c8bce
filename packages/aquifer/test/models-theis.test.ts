import { describe, expect, it } from "vitest";
import { ModelInputError } from "../src/models/errors.js";
import { theisDrawdown, theisModel, theisTypeCurve } from "../src/models/theis.js";
import { centralDifferences, fixture, relDiff } from "./models-fixture.js";

describe("Theis (1935) model", () => {
  it("matches mpmath drawdown for u from 1e-11 to 20 within 1e-13 relative", () => {
    // Reference: mpmath e1 at 30 digits (tests/fixtures/models/generate_models.py).
    expect(fixture.theis.length).toBeGreaterThanOrEqual(10);
    for (const c of fixture.theis) {
      const s = theisDrawdown(c.T, c.S, c.Q, c.r, c.t);
      expect(relDiff(s, c.s), `u = ${c.u}`).toBeLessThan(1e-13);
    }
  });

  it("evaluates many times at once, writing into a supplied array", () => {
    const c = fixture.theis[2]!;
    const times = [c.t, 2 * c.t, 0, -1];
    const out = new Float64Array(4).fill(99);
    const result = theisModel.drawdown([c.T, c.S], { r: c.r, Q: c.Q }, times, out);
    expect(result).toBe(out);
    expect(relDiff(out[0]!, c.s)).toBeLessThan(1e-13);
    expect(out[1]!).toBeGreaterThan(c.s);
    // Before pumping starts (t <= 0) drawdown is zero.
    expect(out[2]).toBe(0);
    expect(out[3]).toBe(0);
  });

  it("has an analytic Jacobian that agrees with mpmath derivatives within 1e-13 relative", () => {
    // Reference: mpmath.diff of the Theis expression (not the closed form used by the library).
    for (const c of fixture.theis) {
      const [dT, dS] = theisModel.jacobian!([c.T, c.S], { r: c.r, Q: c.Q }, [c.t]);
      expect(relDiff(dT![0]!, c.dsdT), `dT at u = ${c.u}`).toBeLessThan(1e-13);
      expect(relDiff(dS![0]!, c.dsdS), `dS at u = ${c.u}`).toBeLessThan(1e-13);
    }
  });

  it("has an analytic Jacobian that agrees with central finite differences within 1e-6", () => {
    const g = { r: 35, Q: 900 };
    const t = [1e-4, 1e-3, 0.01, 0.1, 1, 10, 100];
    const p = [320, 2.5e-4];
    const J = theisModel.jacobian!(p, g, t);
    const fd = centralDifferences((q) => theisModel.drawdown(q, g, t), p);
    const s = theisModel.drawdown(p, g, t);
    for (let k = 0; k < 2; k++) {
      for (let i = 0; i < t.length; i++) {
        // Scale by the log-parameter sensitivity |s| / p_k so that a derivative passing through zero
        // (dT changes sign near u = 0.3) is still compared at a meaningful size.
        const scale = Math.max(Math.abs(J[k]![i]!), Math.abs(s[i]!) / p[k]!);
        expect(Math.abs(J[k]![i]! - fd[k]![i]!) / scale, `param ${k}, t = ${t[i]}`).toBeLessThan(1e-6);
      }
    }
  });

  it("gives the type curve W(u) against 1/u as mpmath does, within 1e-13 relative", () => {
    const x = fixture.theisTypeCurve.map((p) => p.uInverse);
    const curve = theisTypeCurve(x);
    expect(Array.from(curve.uInverse)).toEqual(x);
    fixture.theisTypeCurve.forEach((p, i) => expect(relDiff(curve.W[i]!, p.W), `1/u = ${p.uInverse}`).toBeLessThan(1e-13));
  });

  it("rejects a non-positive transmissivity with a message naming the parameter", () => {
    expect(() => theisDrawdown(-5, 1e-4, 100, 10, 1)).toThrow(ModelInputError);
    expect(() => theisDrawdown(-5, 1e-4, 100, 10, 1)).toThrow(/parameter T \(transmissivity\) is -5 m2\/d/);
  });

  it("rejects a zero distance and points to the well radius", () => {
    expect(() => theisDrawdown(100, 1e-4, 100, 0, 1)).toThrow(/radial distance r is 0 m.*well radius/);
  });

  it("rejects a parameter vector of the wrong length", () => {
    expect(() => theisModel.drawdown([100], { r: 10, Q: 100 }, [1])).toThrow(/expected 2 parameters \(T, S\) but got 1/);
  });

  it("returns NaN for a time that is not a number", () => {
    expect(theisDrawdown(100, 1e-4, 100, 10, Number.NaN)).toBeNaN();
  });

  it("rejects a type-curve abscissa that is not positive", () => {
    expect(() => theisTypeCurve([1, 0])).toThrow(/1\/u at index 1 is 0/);
  });
});
