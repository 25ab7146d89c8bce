import { describe, expect, it } from "vitest";
import { cooperJacobModel } from "../src/models/cooper-jacob.js";
import { ModelInputError } from "../src/models/errors.js";
import { theisModel } from "../src/models/theis.js";
import { thiemDrawdown, thiemModel, thiemRadiusOfInfluence, thiemTwoWells } from "../src/models/thiem.js";
import { centralDifferences, relDiff } from "./models-fixture.js";

describe("Thiem (1906) steady state", () => {
  it("gives T from two observation wells as worked by hand", () => {
    // Invented numbers: Q = 1000 m3/d, s1 = 2.0 m at r1 = 10 m, s2 = 1.5 m at r2 = 20 m.
    // T = Q ln(r2/r1) / (2 pi (s1 - s2)) = 1000 x 0.693147 / (6.283185 x 0.5) = 693.147 / 3.141593 = 220.636 m2/d.
    expect(thiemTwoWells(1000, 10, 2.0, 20, 1.5)).toBeCloseTo(220.636, 3);
    // The same pair listed the other way round gives the same T.
    expect(thiemTwoWells(1000, 20, 1.5, 10, 2.0)).toBeCloseTo(220.636, 3);
  });

  it("matches the late-time Cooper-Jacob distance-drawdown difference exactly (an identity)", () => {
    // s_CJ(r1) - s_CJ(r2) = Q/(4 pi T) ln(r2^2 / r1^2) = Q/(2 pi T) ln(r2/r1), whatever S and t.
    const p = [340, 1.5e-4];
    const Q = 1800;
    const [r1, r2] = [15, 90];
    for (const t of [0.5, 3, 40]) {
      const s1 = cooperJacobModel.drawdown(p, { r: r1, Q }, [t])[0]!;
      const s2 = cooperJacobModel.drawdown(p, { r: r2, Q }, [t])[0]!;
      expect(relDiff(s1 - s2, (Q / (2 * Math.PI * 340)) * Math.log(r2 / r1))).toBeLessThan(1e-12);
      expect(relDiff(thiemTwoWells(Q, r1, s1, r2, s2), 340)).toBeLessThan(1e-12);
      // and with any R, the Thiem model gives the same difference.
      const R = 5000;
      const d = thiemDrawdown(340, R, Q, r1) - thiemDrawdown(340, R, Q, r2);
      expect(relDiff(d, s1 - s2)).toBeLessThan(1e-12);
    }
  });

  it("agrees with the Theis drawdown difference between two radii once u <= 1e-4 at both", () => {
    // W(u1) - W(u2) = ln(u2/u1) + (u1 - u2) + ..., so the gap is below max(u) / ln(r2/r1) relative.
    const p = [340, 1.5e-4];
    const Q = 1800;
    const [r1, r2] = [15, 90];
    const t = (r2 * r2 * 1.5e-4) / (4 * 340 * 1e-4); // u = 1e-4 at r2
    const d = theisModel.drawdown(p, { r: r1, Q }, [t])[0]! - theisModel.drawdown(p, { r: r2, Q }, [t])[0]!;
    expect(relDiff(thiemTwoWells(Q, r1, d, r2, 0), 340)).toBeLessThan(1e-4 / Math.log(6));
  });

  it("is zero at the radius of influence, ignores time, and inverts through thiemRadiusOfInfluence", () => {
    const g = { r: 250, Q: 900 };
    expect(thiemModel.drawdown([120, 250], g, [1])[0]).toBe(0);
    const s = thiemModel.drawdown([120, 2000], { r: 30, Q: 900 }, [0, 1, 100, -1]);
    expect(new Set(s).size).toBe(1);
    expect(relDiff(s[0]!, (900 / (2 * Math.PI * 120)) * Math.log(2000 / 30))).toBeLessThan(1e-15);
    expect(relDiff(thiemRadiusOfInfluence(120, 900, 30, s[0]!), 2000)).toBeLessThan(1e-13);
  });

  it("has an analytic Jacobian that agrees with central finite differences within 1e-6", () => {
    const g = { r: 40, Q: 600 };
    const t = [1, 2];
    const p = [80, 1500];
    const J = thiemModel.jacobian!(p, g, t);
    const fd = centralDifferences((q) => thiemModel.drawdown(q, g, t), p);
    for (let k = 0; k < 2; k++) {
      for (let i = 0; i < t.length; i++) expect(relDiff(J[k]![i]!, fd[k]![i]!)).toBeLessThan(1e-6);
    }
  });

  it("refuses two wells at the same distance or drawdowns that grow away from the well", () => {
    expect(() => thiemTwoWells(1000, 10, 2, 10, 1)).toThrow(/both distances are 10 m/);
    expect(() => thiemTwoWells(1000, 10, 1, 20, 2)).toThrow(ModelInputError);
    expect(() => thiemTwoWells(1000, 10, 1, 20, 2)).toThrow(/do not decrease away from a well/);
    expect(() => thiemTwoWells(1000, 10, 1, 20, 1)).toThrow(/equal drawdowns/);
  });
});
