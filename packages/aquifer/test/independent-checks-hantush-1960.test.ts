import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { hantushAquitardStorageModel, hantushStorageDimensionless } from "../src/models/hantush-aquitard-storage.js";

// Reference: tests/fixtures/hantush-1960/generate_hantush_1960.py (mpmath, 30 digits). Hantush's (1960) early-time
// function H(u, beta) = int_u^inf (e^-y/y) erfc(beta sqrt(u)/sqrt(y (y - u))) dy, beta = (r/4B) sqrt(S'/S), by
// quadrature (formula recalled from memory; the script confirms it against a Talbot inversion of the full
// transform, agreement 1e-17 or better inside t_D < gamma/(10 rho^2)); and the steady state 2 K0(r/B). Neither
// uses the Laplace-domain form that the library inverts by Stehfest.
interface Early { rB: number; ratio: number; tD: number; H: number; withinEarlyLimit: boolean }
interface Late { rB: number; ratio: number; tD: number; steady: number; relativeGap: number }
const fixture = JSON.parse(
  readFileSync(new URL("../../../tests/fixtures/hantush-1960/hantush_1960.json", import.meta.url), "utf8"),
) as { early: Early[]; late: Late[] };

const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);

describe("Hantush (1960) with aquitard storage against independent routes", () => {
  it("follows H(u, beta) at early time within 1e-4 relative (t_D 0.1 to 100, r/B 0.01 to 1, S'/S 0.01 to 100; measured 3.8e-5)", () => {
    const early = fixture.early.filter((q) => q.withinEarlyLimit);
    expect(early.length).toBe(21);
    for (const q of early) {
      const e = rel(hantushStorageDimensionless(q.tD, q.rB, q.ratio), q.H);
      expect(e, `r/B ${q.rB}, S'/S ${q.ratio}, t_D ${q.tD}`).toBeLessThan(1e-4);
    }
  });

  it("reaches the steady state 2 K0(r/B) at late time within 1e-5 relative (measured 4.7e-6)", () => {
    const late = fixture.late.filter((q) => q.relativeGap < 1e-9);
    expect(late.length).toBe(9);
    for (const q of late) {
      expect(rel(hantushStorageDimensionless(q.tD, q.rB, q.ratio), q.steady), `r/B ${q.rB}, S'/S ${q.ratio}, t_D ${q.tD}`).toBeLessThan(1e-5);
    }
  });

  it("gives Q/(4 pi T) H(u, beta) in metres through the model with T, S, B and S'", () => {
    // r = 30 m, B = 100 m: r/B = 0.3; S = 2e-4, S' = 2e-3: S'/S = 10.
    const [T, S, B, Sa, Q, r] = [120, 2e-4, 100, 2e-3, 500, 30];
    const points = fixture.early.filter((q) => q.rB === 0.3 && q.ratio === 10 && q.withinEarlyLimit);
    expect(points.length).toBe(5);
    const s = hantushAquitardStorageModel.drawdown([T, S, B, Sa], { r, Q }, points.map((q) => (q.tD * S * r * r) / T));
    points.forEach((q, i) => expect(rel(s[i]!, (Q / (4 * Math.PI * T)) * q.H), `t_D ${q.tD}`).toBeLessThan(1e-4));
  });
});
