import { describe, it, expect } from "vitest";
import {
  integrate,
  integrateToInfinity,
  QuadratureError,
  kronrod15,
  KRONROD15_NODES,
} from "../src/numerics/index.js";

function relativeError(value: number, exact: number): number {
  return Math.abs(value / exact - 1);
}

describe("the G7-K15 pair", () => {
  // Exactness degrees of Gauss (2·7 − 1 = 13) and Kronrod (3·7 + 1 = 22) rules: common practice, no source.
  it("integrates x^22 exactly with the Kronrod rule and x^13 (odd) / x^12 with the Gauss rule", () => {
    const k22 = kronrod15((x) => x ** 22, -1, 1);
    expect(Math.abs(k22.kronrod - 2 / 23), `K15 on x^22: ${k22.kronrod}`).toBeLessThan(1e-15);
    const g12 = kronrod15((x) => x ** 12, -1, 1);
    expect(Math.abs(g12.gauss - 2 / 13), `G7 on x^12: ${g12.gauss}`).toBeLessThan(1e-15);
    const k24 = kronrod15((x) => x ** 24, -1, 1);
    expect(Math.abs(k24.kronrod - 2 / 25)).toBeGreaterThan(1e-10);
  });

  it("uses the 7-point Gauss-Legendre nodes among the Kronrod nodes", () => {
    // Gauss-Legendre 7-point nodes are the roots of the Legendre polynomial P7; its coefficients here agree
    // with mpmath.legendre(7, x) (checked at x = 0.3, 0.7, −0.45 with /usr/bin/python3).
    const p7 = (x: number) => (429 * x ** 7 - 693 * x ** 5 + 315 * x ** 3 - 35 * x) / 16;
    for (const j of [1, 3, 5, 7]) expect(Math.abs(p7(KRONROD15_NODES[j]!))).toBeLessThan(1e-14);
  });
});

describe("integrate on integrals with closed forms", () => {
  it("gives ∫0^∞ e^−x dx = 1 to 1e-14", () => {
    const r = integrateToInfinity((x) => Math.exp(-x), 0);
    expect(Math.abs(r.value - 1), `value ${r.value}`).toBeLessThan(1e-14);
    expect(r.evaluations).toBeGreaterThan(0);
  });

  it("gives ∫0^1 ln x dx = −1 to 1e-11 despite the endpoint singularity", () => {
    const r = integrate((x) => Math.log(x), 0, 1);
    expect(Math.abs(r.value + 1), `value ${r.value}, estimate ${r.errorEstimate}`).toBeLessThan(1e-11);
    expect(r.errorEstimate).toBeGreaterThanOrEqual(Math.abs(r.value + 1));
  });

  it("gives ∫0^1 x^−1/2 dx = 2 to 1e-10", () => {
    const r = integrate((x) => 1 / Math.sqrt(x), 0, 1);
    expect(Math.abs(r.value - 2), `value ${r.value}`).toBeLessThan(1e-10);
  });

  it("gives the Gaussian integral ∫−∞^∞ e^−x² dx = sqrt(π) to 1e-14", () => {
    const r = integrate((x) => Math.exp(-x * x), -Infinity, Infinity);
    expect(relativeError(r.value, Math.sqrt(Math.PI)), `value ${r.value}`).toBeLessThan(1e-14);
  });

  it("gives ∫−∞^0 e^x dx = 1 and ∫0^∞ 1/(1 + x²) dx = π/2", () => {
    expect(Math.abs(integrate((x) => Math.exp(x), -Infinity, 0).value - 1)).toBeLessThan(1e-13);
    const r = integrateToInfinity((x) => 1 / (1 + x * x), 0);
    expect(relativeError(r.value, Math.PI / 2), `value ${r.value}`).toBeLessThan(1e-12);
  });

  it("gives ∫0^π sin x dx = 2 and the negated value for reversed limits", () => {
    expect(Math.abs(integrate(Math.sin, 0, Math.PI).value - 2)).toBeLessThan(1e-14);
    expect(Math.abs(integrate(Math.sin, Math.PI, 0).value + 2)).toBeLessThan(1e-14);
    expect(integrate(Math.sin, 1, 1).value).toBe(0);
  });

  it("meets a requested relative tolerance of 1e-6 with fewer evaluations than the default", () => {
    const f = (x: number) => Math.exp(-x) * Math.cos(3 * x);
    const exact = 1 / 10; // ∫0^∞ e^−x cos 3x dx = 1/(1 + 9): standard Laplace transform of cos, common practice, no source
    const loose = integrateToInfinity(f, 0, { relTol: 1e-6, absTol: 0 });
    const tight = integrateToInfinity(f, 0);
    expect(relativeError(loose.value, exact)).toBeLessThan(1e-6);
    expect(relativeError(tight.value, exact)).toBeLessThan(1e-12);
    expect(loose.evaluations).toBeLessThan(tight.evaluations);
  });
});

describe("integrate when it cannot succeed", () => {
  it("throws a QuadratureError carrying the estimate for ∫0^∞ sin x / x, which it does not handle", () => {
    // Conditionally convergent: the mapped integrand oscillates without bound near t = 1.
    let caught: unknown;
    try {
      integrateToInfinity((x) => (x === 0 ? 1 : Math.sin(x) / x), 0, { maxSubdivisions: 100 });
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(QuadratureError);
    expect((caught as QuadratureError).message).toMatch(/maxSubdivisions/);
    expect(Number.isFinite((caught as QuadratureError).value)).toBe(true);
  });

  it("names the point where the integrand is not finite", () => {
    expect(() => integrate((x) => 1 / (x - 0.5), 0, 1)).toThrow(/x = 0\.5/);
  });

  it("rejects invalid tolerances and limits", () => {
    expect(() => integrate(Math.sin, 0, 1, { absTol: 0, relTol: 0 })).toThrow(RangeError);
    expect(() => integrate(Math.sin, Number.NaN, 1)).toThrow(/limits/);
    expect(() => integrate(Math.sin, 0, 1, { maxSubdivisions: 0 })).toThrow(/maxSubdivisions/);
  });
});
