/**
 * Sine, cosine and powers built from IEEE arithmetic with Math.exp, Math.log and Math.sqrt only, so that Node and the
 * page's Chromium give the same bits (the notebooks' browser test, tests/browser/workbench-security.test.ts, checks the
 * outcome: every notebook reproduces in the page). Here: their accuracy against the engine's own Math functions
 * (within 1 ulp of a faithfully rounded result, the engines' documented accuracy; fact of the trade, no source).
 */
import { describe, expect, it } from "vitest";
import { portableCos, portableExp10, portablePow, portableSin } from "../src/numerics/index.js";

function ulp(v: number): number {
  const a = Math.abs(v);
  return a === 0 ? Number.MIN_VALUE : Math.pow(2, Math.floor(Math.log2(a)) - 52);
}

describe("portable sine, cosine and powers", () => {
  it("agree with Math.sin and Math.cos within 2 ulp from 1e-8 to 1e5 radians, both signs", () => {
    let worst = 0;
    let x = 1e-8;
    for (let i = 0; i < 100000; i++) {
      x *= 1.0003;
      for (const v of [x, -x]) {
        worst = Math.max(worst, Math.abs(portableSin(v) - Math.sin(v)) / ulp(Math.sin(v)), Math.abs(portableCos(v) - Math.cos(v)) / ulp(Math.cos(v)));
      }
    }
    expect(x).toBeGreaterThan(1e5);
    expect(worst).toBeLessThanOrEqual(2);
  });

  it("give exact zeros, signs and quarter-turn values, and near a zero an absolute error of 1e-25 at most", () => {
    expect(portableSin(0)).toBe(0);
    expect(Object.is(portableSin(-0), -0)).toBe(true);
    expect(portableCos(0)).toBe(1);
    expect(portableSin(Math.PI / 2)).toBe(1);
    expect(portableCos(Math.PI)).toBe(-1);
    // Near a zero the reduction leaves an absolute error of about 1e-26 (pi/2 is carried to about 1e-26).
    expect(Math.abs(portableCos(Math.PI / 2) - Math.cos(Math.PI / 2))).toBeLessThan(1e-25);
    expect(portableSin(1e7)).toBe(Math.sin(1e7)); // beyond the reduction's range: Math.sin itself
  });

  it("raise to integer powers exactly by squaring and to other powers within 1e-14 relative", () => {
    expect(portablePow(7, 9)).toBe(40353607);
    expect(portablePow(18, 9)).toBe(198359290368);
    expect(portablePow(2, -3)).toBe(0.125);
    expect(portablePow(3.7, 0)).toBe(1);
    for (const [x, y] of [[1800, 2.2], [0.37, 1.5], [1e-3, 3.3], [250, 0.5]] as const) {
      expect(Math.abs(portablePow(x, y) / Math.pow(x, y) - 1)).toBeLessThan(1e-14);
    }
    expect(portablePow(0, 2.5)).toBe(0);
    expect(Math.abs(portableExp10(-3.25) / Math.pow(10, -3.25) - 1)).toBeLessThan(1e-15);
  });
});
