import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { neumanDimensionless, neumanModel } from "../src/models/neuman.js";

// Reference: tests/fixtures/neuman-integral/generate_neuman_integral.py - Neuman's (1974) real-integral form
// (recalled from memory; the script confirms it against mpmath's de Hoog inversion of the Laplace series to
// 1.4e-14 before writing), integrated by scipy quad between the zeros of J0 with Shanks extrapolation. It shares
// no code and no solution form with the library's Stehfest inversion of the Laplace-domain series.
interface Point { sigma: number; beta: number; ts: number; sD: number; regime: "early" | "intermediate" | "late" }
const fixture = JSON.parse(
  readFileSync(new URL("../../../tests/fixtures/neuman-integral/neuman_integral.json", import.meta.url), "utf8"),
) as { points: Point[]; formulaCheckAgainstDehoog: { relativeDifference: number }[] };

const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);

function worst(points: readonly Point[]): { error: number; where: string } {
  let error = 0;
  let where = "";
  for (const q of points) {
    const e = rel(neumanDimensionless(q.ts, q.sigma, q.beta), q.sD);
    if (e > error) [error, where] = [e, `sigma ${q.sigma}, beta ${q.beta}, t_s ${q.ts}`];
  }
  return { error, where };
}

describe("Neuman (1974) against its real-integral form by quadrature", () => {
  it("covers sigma 1e-3 to 0.1, beta 1e-3 to 4 and t_s 0.1 to 1e6 in all three regimes (150 points)", () => {
    expect(fixture.points.length).toBe(150);
    for (const regime of ["early", "intermediate", "late"] as const) {
      expect(fixture.points.filter((q) => q.regime === regime).length).toBeGreaterThanOrEqual(15);
    }
    expect(Math.max(...fixture.formulaCheckAgainstDehoog.map((c) => c.relativeDifference))).toBeLessThan(1e-9);
  });

  it("agrees within 2e-4 relative at early time, on the Theis curve with S (measured at most 1.1e-4, at t_s = 0.3)", () => {
    const { error, where } = worst(fixture.points.filter((q) => q.regime === "early"));
    expect(error, where).toBeLessThan(2e-4);
  });

  it("agrees within 1e-3 relative at intermediate time (measured at most 7.5e-4, beta = 4 at t_s = 0.3)", () => {
    const { error, where } = worst(fixture.points.filter((q) => q.regime === "intermediate"));
    expect(error, where).toBeLessThan(1e-3);
  });

  it("agrees within 4e-4 relative from t_s = 1 on, every regime (measured at most 2.9e-4, beta = 4 at t_s = 1)", () => {
    const { error, where } = worst(fixture.points.filter((q) => q.ts >= 1));
    expect(error, where).toBeLessThan(4e-4);
  });

  it("agrees within 1e-4 relative at late time, on the Theis curve with S + Sy (measured at most 4.3e-5)", () => {
    const { error, where } = worst(fixture.points.filter((q) => q.regime === "late"));
    expect(error, where).toBeLessThan(1e-4);
  });

  it("maps T, S, Sy, Kz/Kr, b, r and Q onto the same reference points in drawdown units (m)", () => {
    // b = 20 m, r = 10 m, Kz/Kr = 0.4: beta = 0.4 * 100 / 400 = 0.1; S = 1e-3, Sy = 0.1: sigma = 0.01.
    const b = 20;
    const r = 10;
    const [T, S, Sy, KzKr, Q] = [250, 1e-3, 0.1, 0.4, 800];
    const points = fixture.points.filter((q) => q.sigma === 0.01 && q.beta === 0.1);
    expect(points.length).toBe(10);
    const times = points.map((q) => (q.ts * S * r * r) / T);
    const s = neumanModel(b).drawdown([T, S, Sy, KzKr], { r, Q }, times);
    points.forEach((q, i) => expect(rel(s[i]!, (Q / (4 * Math.PI * T)) * q.sD), `t_s ${q.ts}`).toBeLessThan(2e-4));
  });
});
