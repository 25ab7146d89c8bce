import { describe, it, expect } from "vitest";
import {
  theisW,
  theisWdU,
  hantushW,
  hantushWdU,
  hantushWdRB,
  hantushWByQuadrature,
  hantushWdRBByQuadrature,
} from "../src/wells/index.js";
import { besselK0 } from "../src/special/index.js";
import fixture from "../../../tests/fixtures/wells/hantush.json" with { type: "json" };

// Reference: tests/fixtures/wells/hantush.json, mpmath quad at 30 digits (generate_wells.py), cross-checked
// there against a second integral representation.

type Point = (typeof fixture.points)[number];

function worstRelative(points: readonly Point[], value: (p: Point) => number, reference: (p: Point) => number) {
  let worst = 0;
  let where = "none";
  for (const p of points) {
    const error = Math.abs(value(p) / reference(p) - 1);
    if (!(error <= worst)) {
      worst = error;
      where = `u = ${p.u}, r/B = ${p.rB}`;
    }
  }
  return { worst, where };
}

const regimes = [...new Set(fixture.points.map((p) => p.regime))];

describe("hantushW against mpmath", () => {
  it("has a fixture of at least 400 points covering u in [1e-8, 50] and r/B in [1e-4, 10]", () => {
    expect(fixture.points.length).toBeGreaterThanOrEqual(400);
    const us = fixture.points.map((p) => p.u);
    const bs = fixture.points.map((p) => p.rB);
    expect(Math.min(...us)).toBeCloseTo(1e-8, 20);
    expect(Math.max(...us)).toBeCloseTo(50, 10);
    expect(Math.min(...bs)).toBeCloseTo(1e-4, 15);
    expect(Math.max(...bs)).toBeCloseTo(10, 10);
    expect(regimes.length).toBeGreaterThanOrEqual(3);
  });

  for (const regime of regimes) {
    it(`is within 1e-8 relative of mpmath in the regime "${regime}"`, () => {
      const points = fixture.points.filter((p) => p.regime === regime);
      const { worst, where } = worstRelative(points, (p) => hantushW(p.u, p.rB), (p) => p.W);
      expect(worst, `max relative error ${worst.toExponential(2)} at ${where} (${points.length} points)`).toBeLessThan(1e-8);
    });
  }

  it("is within 5e-12 relative of mpmath over the whole grid (the figure reached, with margin)", () => {
    // The largest error, 2.4e-12 at u = 7.2, r/B = 9, is the e^(2x) cancellation of the series at x = 2.8.
    const { worst, where } = worstRelative(fixture.points, (p) => hantushW(p.u, p.rB), (p) => p.W);
    expect(worst, `max relative error ${worst.toExponential(2)} at ${where}`).toBeLessThan(5e-12);
  });

  it("agrees with the slow quadrature reference within 1e-11 relative on every 10th grid point", () => {
    const sample = fixture.points.filter((_, i) => i % 10 === 0);
    const { worst, where } = worstRelative(sample, (p) => hantushWByQuadrature(p.u, p.rB), (p) => p.W);
    expect(worst, `quadrature vs mpmath: ${worst.toExponential(2)} at ${where}`).toBeLessThan(1e-11);
  });
});

describe("hantushW identities", () => {
  it("reduces to E1(u) at r/B = 0 and tends to it as r/B → 0", () => {
    for (const { u, E1 } of fixture.limits.smallRB) {
      expect(hantushW(u, 0)).toBe(theisW(u));
      expect(Math.abs(theisW(u) / E1 - 1), `E1(${u})`).toBeLessThan(1e-14);
      // W(u, b) = E1(u) − (b²/(4u)) E2(u) + ...: at b = 1e-10 the correction is below 2e-14 relative here.
      expect(Math.abs(hantushW(u, 1e-10) / E1 - 1), `u = ${u}`).toBeLessThan(1e-13);
    }
  });

  it("tends to 2 K0(r/B) as u → 0", () => {
    for (const { rB, twoK0 } of fixture.limits.smallU) {
      // the gap 2K0(b) − W(u, b) = W(b²/(4u), b) <= E1(b²/(4u)), negligible for u = 1e-300
      expect(Math.abs(hantushW(1e-300, rB) / twoK0 - 1), `r/B = ${rB}`).toBeLessThan(1e-14);
    }
  });

  it("satisfies W(u, b) + W(b²/(4u), b) = 2 K0(b) within 1e-13 relative", () => {
    let worst = 0;
    for (const b of [1e-4, 0.01, 0.3, 1, 3, 6.5, 10]) {
      for (const u of [1e-6, 1e-3, 0.05, 0.4, 1, b / 2, 2.5, 4.9, 20]) {
        const sum = hantushW(u, b) + hantushW((b * b) / (4 * u), b);
        worst = Math.max(worst, Math.abs(sum / (2 * besselK0(b)) - 1));
      }
    }
    expect(worst, `max relative defect ${worst.toExponential(2)}`).toBeLessThan(1e-13);
  });

  it("equals K0(b) at the inflection point u = b/2", () => {
    // From the symmetry identity with u = b²/(4u) (Hantush 1956).
    for (const b of [1e-3, 0.5, 2, 7, 10]) {
      expect(Math.abs(hantushW(b / 2, b) / besselK0(b) - 1), `b = ${b}`).toBeLessThan(1e-13);
    }
  });

  it("reproduces the u → 0 row of Hantush's (1956) table, 2 K0(r/B), at its printed four decimals", () => {
    // Values from memory of the table's first row (they are also 2 K0(r/B) from Abramowitz & Stegun Table 9.8).
    const row: ReadonlyArray<readonly [number, number]> = [
      [0.01, 9.4425],
      [0.1, 4.8541],
      [0.5, 1.8488],
      [1.0, 0.842],
      [2.0, 0.2278],
    ];
    for (const [rB, printed] of row) expect(hantushW(1e-12, rB), `r/B = ${rB}`).toBeCloseTo(printed, 4);
  });
});

describe("hantushW derivatives", () => {
  for (const regime of regimes) {
    it(`gives ∂W/∂(r/B) within 1e-8 relative of mpmath in the regime "${regime}"`, () => {
      const points = fixture.points.filter((p) => p.regime === regime);
      const { worst, where } = worstRelative(points, (p) => hantushWdRB(p.u, p.rB), (p) => p.dWdRB);
      expect(worst, `max relative error ${worst.toExponential(2)} at ${where}`).toBeLessThan(1e-8);
    });
  }

  it("gives ∂W/∂(r/B) that matches a central finite difference to 1e-6 relative", () => {
    // A difference quotient has a rounding error of about ε W / h, so points where b |∂W/∂b| < 1e-4 W
    // (late time with little leakage: the derivative is too small against W to be resolved) are skipped.
    let worst = 0;
    let compared = 0;
    for (const b of [1e-3, 0.1, 1, 4, 9]) {
      for (const u of [1e-5, 0.01, 0.3, 2, b / 2, 8, 30]) {
        const exact = hantushWdRB(u, b);
        if (b * Math.abs(exact) < 1e-4 * hantushW(u, b)) continue;
        const h = 1e-4 * b;
        const fd = (hantushW(u, b + h) - hantushW(u, b - h)) / (2 * h);
        worst = Math.max(worst, Math.abs(fd - exact) / Math.abs(exact));
        compared++;
      }
    }
    expect(compared).toBeGreaterThan(25);
    expect(worst, `max relative difference ${worst.toExponential(2)} over ${compared} points`).toBeLessThan(1e-6);
  });

  it("gives ∂W/∂u = −exp(−u − b²/(4u))/u, matching a central finite difference to 1e-7 relative", () => {
    for (const [u, b] of [[1e-4, 0.01], [0.2, 0.5], [3, 6], [10, 1]] as const) {
      const h = 1e-5 * u;
      const fd = (hantushW(u + h, b) - hantushW(u - h, b)) / (2 * h);
      expect(Math.abs(fd / hantushWdU(u, b) - 1), `u = ${u}, b = ${b}`).toBeLessThan(1e-7);
    }
    expect(hantushWdU(2, 0)).toBe(theisWdU(2));
  });

  it("agrees with the slow quadrature reference for ∂W/∂(r/B)", () => {
    for (const [u, b] of [[1e-6, 0.02], [0.5, 0.5], [5, 9.5], [40, 2]] as const) {
      expect(Math.abs(hantushWdRBByQuadrature(u, b) / hantushWdRB(u, b) - 1), `u = ${u}, b = ${b}`).toBeLessThan(1e-11);
    }
    expect(hantushWdRB(1, 0)).toBe(0);
  });
});

describe("well function arguments", () => {
  it("rejects u <= 0, u not finite and negative or non-finite r/B with a RangeError naming the value", () => {
    expect(() => theisW(0)).toThrow(/u = 0/);
    expect(() => theisW(-1)).toThrow(RangeError);
    expect(() => theisW(Number.NaN)).toThrow(RangeError);
    expect(() => theisW(Infinity)).toThrow(RangeError);
    expect(() => hantushW(1, -0.1)).toThrow(/r\/B = -0.1/);
    expect(() => hantushW(1, Infinity)).toThrow(RangeError);
    expect(() => hantushWdRB(0, 1)).toThrow(/hantushWdRB/);
  });

  it("returns 0 (underflow) rather than NaN for very large u and stays finite beyond r/B = 10", () => {
    expect(hantushW(800, 1)).toBe(0);
    // u = 3.5 is far below r/B / 2 = 20, so W ≈ 2 K0(40) with a gap W(114.3, 40) < E1(114) ≈ 1e-52.
    const far = hantushW(3.5, 40);
    expect(Math.abs(far / (2 * besselK0(40)) - 1), `W(3.5, 40) = ${far}`).toBeLessThan(1e-11);
  });
});
