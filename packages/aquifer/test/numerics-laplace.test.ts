import { describe, it, expect } from "vitest";
import type { Complex } from "../src/numerics/index.js";
import {
  stehfest,
  stehfestCoefficients,
  deHoog,
  besselK0Complex,
  complex,
  cadd,
  cdiv,
  cmul,
  cscale,
  csqrt,
} from "../src/numerics/index.js";
import { besselK0 } from "../src/special/index.js";
import theis from "../../../tests/fixtures/numerics/theis_laplace.json" with { type: "json" };

const TIMES = [0.01, 0.1, 1, 5, 20];
const one = complex(1);

function maxOver(times: readonly number[], error: (t: number) => number): number {
  return Math.max(...times.map(error));
}

describe("stehfest", () => {
  // Transform pairs 1/p ↔ 1, 1/(p + a) ↔ e^−at, 1/p² ↔ t, 1/sqrt(p) ↔ 1/sqrt(πt): standard Laplace-transform
  // table entries (common practice, no source).
  it("inverts 1/p to 1 within 1e-7 for N = 12, 14, 16 (roundoff grows with N)", () => {
    for (const n of [12, 14, 16]) {
      const worst = maxOver(TIMES, (t) => Math.abs(stehfest((p) => 1 / p, t, n) - 1));
      expect(worst, `N = ${n}: max |f − 1| = ${worst.toExponential(2)}`).toBeLessThan(1e-7);
    }
  });

  it("inverts 1/(p + 1) to e^−t within 2e-5 absolute at N = 16", () => {
    const worst = maxOver(TIMES, (t) => Math.abs(stehfest((p) => 1 / (p + 1), t, 16) - Math.exp(-t)));
    expect(worst, `max absolute error ${worst.toExponential(2)}`).toBeLessThan(2e-5);
  });

  it("inverts 1/p² to t and 1/sqrt(p) to 1/sqrt(πt) within 1e-6 relative at N = 14", () => {
    const a = maxOver(TIMES, (t) => Math.abs(stehfest((p) => 1 / (p * p), t, 14) / t - 1));
    const b = maxOver(TIMES, (t) => Math.abs(stehfest((p) => 1 / Math.sqrt(p), t, 14) * Math.sqrt(Math.PI * t) - 1));
    expect(a, `t: ${a.toExponential(2)}`).toBeLessThan(1e-6);
    expect(b, `1/sqrt(πt): ${b.toExponential(2)}`).toBeLessThan(1e-6);
  });

  it("fails on the oscillating sin t (1/(p² + 1)), which is why a second method exists", () => {
    const error = Math.abs(stehfest((p) => 1 / (p * p + 1), 20, 14) - Math.sin(20));
    expect(error, `error at t = 20: ${error}`).toBeGreaterThan(0.1);
  });

  it("has weights that sum to zero (the inverse of a constant F vanishes) for every accepted N", () => {
    // Σ V_k = 0 is a known property of the Stehfest weights (Stehfest 1970; from memory).
    for (let n = 2; n <= 20; n += 2) {
      const v = stehfestCoefficients(n);
      const scale = Math.max(...Array.from(v, Math.abs));
      const sum = v.reduce((s, x) => s + x, 0);
      expect(Math.abs(sum) / scale, `N = ${n}`).toBeLessThan(1e-13);
    }
  });

  it("rejects odd or out-of-range N and non-positive t with a RangeError naming the value", () => {
    expect(() => stehfest((p) => 1 / p, 1, 13)).toThrow(/N = 13/);
    expect(() => stehfest((p) => 1 / p, 1, 22)).toThrow(/N = 22/);
    expect(() => stehfest((p) => 1 / p, 0)).toThrow(/t = 0/);
  });
});

describe("deHoog", () => {
  it("inverts 1/p to 1 within 1e-11 and 1/p² to t within 1e-11 relative", () => {
    const a = maxOver(TIMES, (t) => Math.abs(deHoog((p) => cdiv(one, p), t) - 1));
    const b = maxOver(TIMES, (t) => Math.abs(deHoog((p) => cdiv(one, cmul(p, p)), t) / t - 1));
    expect(a, `1: ${a.toExponential(2)}`).toBeLessThan(1e-11);
    expect(b, `t: ${b.toExponential(2)}`).toBeLessThan(1e-11);
  });

  it("inverts 1/(p + 2) to e^−2t within 1e-11 absolute", () => {
    const worst = maxOver(TIMES, (t) => Math.abs(deHoog((p) => cdiv(one, cadd(p, complex(2))), t) - Math.exp(-2 * t)));
    expect(worst, `${worst.toExponential(2)}`).toBeLessThan(1e-11);
  });

  it("inverts 1/sqrt(p) to 1/sqrt(πt) within 1e-11 relative", () => {
    const worst = maxOver(TIMES, (t) => Math.abs(deHoog((p) => cdiv(one, csqrt(p)), t) * Math.sqrt(Math.PI * t) - 1));
    expect(worst, `${worst.toExponential(2)}`).toBeLessThan(1e-11);
  });

  it("inverts the oscillating 1/(p² + 1) to sin t within 1e-10 absolute up to t = 20", () => {
    const worst = maxOver(TIMES, (t) => Math.abs(deHoog((p) => cdiv(one, cadd(cmul(p, p), one)), t) - Math.sin(t)));
    expect(worst, `${worst.toExponential(2)}`).toBeLessThan(1e-10);
  });

  it("rejects non-positive t and bad options with a RangeError", () => {
    expect(() => deHoog((p) => cdiv(one, p), -1)).toThrow(/t = -1/);
    expect(() => deHoog((p) => cdiv(one, p), 1, { order: 1 })).toThrow(/order = 1/);
    expect(() => deHoog((p) => cdiv(one, p), 1, { tolerance: 2 })).toThrow(/tolerance = 2/);
  });
});

describe("the Theis solution in Laplace space", () => {
  // s̄ = Q/(2πT p) K0(r sqrt(S p / T)) inverts to Q/(4πT) E1(r²S/(4Tt)) (Theis 1935); dimensionless with
  // r²S/T = 1 and Q/(4πT) = 1 it is F(p) = (2/p) K0(sqrt p) ↔ E1(1/(4t)). References: mpmath.e1 (fixture).
  const realTransform = (p: number) => (2 * besselK0(Math.sqrt(p))) / p;
  const complexTransform = (p: Complex) => cscale(cdiv(besselK0Complex(csqrt(p)), p), 2);

  it("agrees with mpmath's own de Hoog inversion at t = 1 (a check of the transform pair)", () => {
    expect(Math.abs(theis.mpmathDeHoogAtT1 / theis.points.find((p) => p.t === 1)!.w - 1)).toBeLessThan(1e-15);
  });

  it("is inverted by deHoog with complex K0 to within 5e-10 relative for 0.05 <= t <= 1e4", () => {
    const worst = Math.max(...theis.points.map((p) => Math.abs(deHoog(complexTransform, p.t) / p.w - 1)));
    expect(worst, `max relative error ${worst.toExponential(2)}`).toBeLessThan(5e-10);
  });

  it("is inverted by stehfest (N = 14) to within 1e-4 relative for t >= 0.25, and only to 1e-2 at t = 0.05", () => {
    const late = theis.points.filter((p) => p.t >= 0.25);
    const worst = Math.max(...late.map((p) => Math.abs(stehfest(realTransform, p.t, 14) / p.w - 1)));
    expect(worst, `max relative error for t >= 0.25: ${worst.toExponential(2)}`).toBeLessThan(1e-4);
    const early = theis.points.find((p) => p.t === 0.05)!;
    const earlyError = Math.abs(stehfest(realTransform, early.t, 14) / early.w - 1);
    expect(earlyError, `at t = 0.05: ${earlyError.toExponential(2)}`).toBeLessThan(1e-2);
  });
});
