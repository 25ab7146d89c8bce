import { describe, expect, it } from "vitest";
import { expint1, expint1Scaled } from "../src/special/index.js";
import { describeWorst, specialFixture, worstRelativeError } from "./special-fixture.js";

// Reference: tests/fixtures/special/special.json, mpmath 1.2.1 at 40 digits (generate_special.py).
const REQUIRED = 1e-14;
const MAIN_REGIMES = ["tiny", "small", "medium", "large", "edges"] as const;

describe("expint1 against mpmath", () => {
  for (const regime of MAIN_REGIMES) {
    it(`stays within 1e-14 relative error in the ${regime} regime`, () => {
      const w = worstRelativeError(expint1, specialFixture.regimes[regime]!, "expint1");
      expect(w.error, describeWorst("expint1", regime, w, REQUIRED)).toBeLessThanOrEqual(REQUIRED);
    });
  }

  it("keeps the digits a subnormal result can hold between 700 and 745, and underflows to 0", () => {
    // Tolerance: one unit of the smallest subnormal (4.9e-324) plus 1e-14 relative.
    const regime = specialFixture.regimes["underflow"]!;
    regime.x.forEach((x, i) => {
      const want = regime.values["expint1"]![i]!;
      const tolerance = Number.MIN_VALUE + REQUIRED * want;
      expect(Math.abs(expint1(x) - want), `E1(${x}) = ${expint1(x)}, mpmath ${want}`).toBeLessThanOrEqual(tolerance);
    });
  });
});

describe("expint1Scaled against mpmath", () => {
  for (const regime of [...MAIN_REGIMES, "beyond"] as const) {
    it(`stays within 1e-14 relative error in the ${regime} regime`, () => {
      const w = worstRelativeError(expint1Scaled, specialFixture.regimes[regime]!, "expint1Scaled");
      expect(w.error, describeWorst("expint1Scaled", regime, w, REQUIRED)).toBeLessThanOrEqual(REQUIRED);
    });
  }

  it("agrees with the asymptotic series x e^x E1(x) ~ 1 - 1/x + 2/x^2 - 6/x^3 + 24/x^4 for x >= 1e4", () => {
    // Source: Abramowitz & Stegun (1964) eq. 5.1.51; at x = 1e4 the first neglected term is 120/x^5 = 1.2e-18.
    for (const x of [1e4, 3e4, 1e5, 1e7, 1e10, 1e100]) {
      const r = 1 / x;
      const series = r * (1 - r * (1 - r * (2 - r * (6 - 24 * r))));
      expect(Math.abs(expint1Scaled(x) / series - 1), `x = ${x}`).toBeLessThanOrEqual(2e-16);
    }
  });
});

describe("expint1 against Abramowitz & Stegun Table 5.1", () => {
  // Values from memory of A&S (1964) Table 5.1, which prints them to 9 decimals. The last recalled digit may
  // be off by one, so the tolerance is 1.5 units of the 9th decimal.
  const table: readonly (readonly [number, number])[] = [
    [0.5, 0.559773595],
    [1.0, 0.219383934],
    [2.0, 0.048900511],
  ];
  for (const [x, value] of table) {
    it(`gives E1(${x}) = ${value} to within 1.5 units of the 9th decimal`, () => {
      expect(Math.abs(expint1(x) - value)).toBeLessThanOrEqual(1.5e-9);
    });
  }

  // Same table (from memory), auxiliary column x e^x E1(x) for x = 5 and 10, same tolerance.
  const auxiliary: readonly (readonly [number, number])[] = [
    [5, 0.85211088],
    [10, 0.915633339],
  ];
  for (const [x, value] of auxiliary) {
    it(`gives x e^x E1(x) = ${value.toFixed(9)} at x = ${x} to within 1.5 units of the 9th decimal`, () => {
      expect(Math.abs(x * expint1Scaled(x) - value)).toBeLessThanOrEqual(1.5e-9);
    });
  }
});

describe("expint1 as the Theis well function", () => {
  it("exceeds the Cooper-Jacob approximation -gamma - ln u by Ein(u), between u - u^2/4 and u for small u", () => {
    // A&S eq. 5.1.11: W(u) = -gamma - ln u + Ein(u), Ein an alternating series u - u^2/4 + u^3/18 - ...,
    // so u - u^2/4 < Ein(u) < u - u^2/4 + u^3/18. Allowance: 8 units in the last place of W(u).
    for (const u of [1e-2, 1e-3, 1e-4]) {
      const w = expint1(u);
      const ein = w - (-0.5772156649015329 - Math.log(u));
      const allowance = 8 * Number.EPSILON * w;
      expect(ein, `u = ${u}`).toBeGreaterThan(u - (u * u) / 4 - allowance);
      expect(ein, `u = ${u}`).toBeLessThan(u - (u * u) / 4 + (u * u * u) / 18 + allowance);
    }
  });

  it("has the derivative dW/du = -e^-u / u (central difference check)", () => {
    // A&S eq. 5.1.26 with n = 1: dE1/dx = -E0(x) = -e^-x / x.
    for (const u of [0.003, 0.3, 1.5, 3, 6, 12, 40]) {
      const h = 1e-5 * Math.min(u, 1);
      const numeric = (expint1(u + h) - expint1(u - h)) / (2 * h);
      const exact = -Math.exp(-u) / u;
      expect(Math.abs(numeric / exact - 1), `u = ${u}`).toBeLessThan(1e-8);
    }
  });
});

describe("expint1 special values", () => {
  it("is +Infinity at 0 (also at -0)", () => {
    expect(expint1(0)).toBe(Infinity);
    expect(expint1(-0)).toBe(Infinity);
    expect(expint1Scaled(0)).toBe(Infinity);
  });

  it("is 0 at +Infinity", () => {
    expect(expint1(Infinity)).toBe(0);
    expect(expint1Scaled(Infinity)).toBe(0);
  });

  it("is 0 beyond underflow and positive just before it", () => {
    expect(expint1(736)).toBeGreaterThan(0);
    expect(expint1(746)).toBe(0);
    expect(expint1(1e6)).toBe(0);
  });

  it("returns NaN for NaN", () => {
    expect(expint1(NaN)).toBeNaN();
    expect(expint1Scaled(NaN)).toBeNaN();
  });

  it("throws a RangeError naming the value for a negative argument", () => {
    expect(() => expint1(-2.5)).toThrow(RangeError);
    expect(() => expint1(-2.5)).toThrow(/x = -2\.5 is negative; expint1 is defined here for x >= 0/);
    expect(() => expint1(-Infinity)).toThrow(/x = -Infinity/);
    expect(() => expint1Scaled(-1e-300)).toThrow(/x = -1e-300 is negative; expint1Scaled is defined here for x >= 0/);
  });
});
