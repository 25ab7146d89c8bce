import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { papadopulosCooperModel } from "../src/models/papadopulos-cooper.js";

// Reference: tests/fixtures/wellbore/generate_skin_integral.py - the real-integral form of Agarwal, Al-Hussainy and
// Ramey (1970) for a well with storage and skin (recalled from memory; the script confirms it against mpmath's
// Talbot inversion of the Laplace-domain solution to 1.3e-16), by mpmath.quad at 20 digits. The library inverts the
// Laplace form by Stehfest; this route uses J0, J1, Y0, Y1 and no transform.
interface Point { alpha: number; skin: number; tDOverCD: number; t: number; drawdown: number }
const points = (
  JSON.parse(readFileSync(new URL("../../../tests/fixtures/wellbore/skin_integral.json", import.meta.url), "utf8")) as {
    points: Point[];
  }
).points;

const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);

function worst(selected: readonly Point[], stehfestTerms?: number): number {
  let e = 0;
  for (const q of selected) {
    const model = papadopulosCooperModel({ rc: 1, rw: 1, skin: q.skin, ...(stehfestTerms ? { stehfestTerms } : {}) });
    e = Math.max(e, rel(model.drawdown([1, q.alpha], { r: 1, Q: 1 }, [q.t])[0]!, q.drawdown));
  }
  return e;
}

describe("Papadopulos-Cooper with skin against the real integral of Agarwal et al. (1970)", () => {
  it("covers alpha 1e-5 to 0.1, skin 1 to 20 and t_D/C_D 1e-2 to 1e3 (54 points)", () => {
    expect(points.length).toBe(54);
  });

  it("agrees within 5e-6 relative while casing storage dominates, t_D/C_D <= 1 (measured 3.0e-6)", () => {
    expect(worst(points.filter((q) => q.tDOverCD <= 1))).toBeLessThan(5e-6);
  });

  it("agrees within 1e-4 relative in the transition, t_D/C_D 10 to 100 (measured 6.8e-5, skin 20)", () => {
    expect(worst(points.filter((q) => q.tDOverCD > 1 && q.tDOverCD < 1000))).toBeLessThan(1e-4);
  });

  it("agrees within 3e-5 relative at late time, t_D/C_D = 1000 (measured 1.2e-5)", () => {
    expect(worst(points.filter((q) => q.tDOverCD === 1000))).toBeLessThan(3e-5);
  });

  it("agrees within 1e-5 relative everywhere with 16 Stehfest terms (measured 8.0e-6)", () => {
    expect(worst(points, 16)).toBeLessThan(1e-5);
  });
});
