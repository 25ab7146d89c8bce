import { describe, expect, it } from "vitest";
import { hantushJacobDrawdown, hantushJacobMatchPoint, neumanMatchPoint, neumanModel } from "../src/models/index.js";
import { fixture } from "./models-fixture.js";

describe("Hantush-Jacob match points", () => {
  it("reads W(u, r/B) off the mpmath table with no reading error and returns T, S, B of the case", () => {
    // Reference: tests/fixtures/models/models.json (mpmath), each case gives u, r/B, W and s at t.
    for (const c of fixture.hantushJacob.slice(0, 6)) {
      const m = hantushJacobMatchPoint({ Q: c.Q, r: c.r, W: c.W, u: c.u, rB: c.rB, s: c.s, t: c.t });
      expect(Math.abs(m.T / c.T - 1)).toBeLessThan(1e-9);
      expect(Math.abs(m.S / c.S - 1)).toBeLessThan(1e-9);
      expect(Math.abs(m.B / c.B - 1)).toBeLessThan(1e-12);
      expect(Math.abs(m.readingError)).toBeLessThan(1e-9);
    }
  });

  it("reports the reading error of a match point read 3 % high off the sheet", () => {
    const [T, S, B, Q, r, t] = [250, 2e-4, 400, 900, 40, 0.05];
    const s = hantushJacobDrawdown(T, S, B, Q, r, t);
    const u = (r * r * S) / (4 * T * t);
    const W = (4 * Math.PI * T * s) / Q;
    const m = hantushJacobMatchPoint({ Q, r, W: W * 1.03, u, rB: r / B, s, t });
    expect(m.readingError).toBeCloseTo(0.03, 9);
    expect(m.T / T).toBeCloseTo(1.03, 9);
  });
});

describe("Neuman match points", () => {
  it("returns T, S (type A), Sy (type B) and Kz/Kr from points on the curve, with no reading error", () => {
    const [T, S, Sy, KzKr, b, Q, r] = [150, 2e-3, 0.12, 0.3, 20, 800, 10];
    const model = neumanModel(b);
    const sigma = S / Sy;
    const beta = (KzKr * r * r) / (b * b);
    for (const [branch, t] of [["A", 2e-3], ["B", 3]] as const) {
      const s = model.drawdown([T, S, Sy, KzKr], { r, Q }, [t])[0]!;
      const sD = (4 * Math.PI * T * s) / Q;
      const tDimensionless = branch === "A" ? (T * t) / (S * r * r) : (T * t) / (Sy * r * r);
      const m = neumanMatchPoint({ Q, r, b, branch, sD, tDimensionless, beta, sigma, s, t });
      expect(Math.abs(m.T / T - 1)).toBeLessThan(1e-12);
      expect(Math.abs(m.storage.value / (branch === "A" ? S : Sy) - 1)).toBeLessThan(1e-12);
      expect(m.KzKr).toBeCloseTo(KzKr, 12);
      expect(Math.abs(m.readingError)).toBeLessThan(1e-12);
    }
  });
});
