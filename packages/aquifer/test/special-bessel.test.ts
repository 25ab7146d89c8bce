import { describe, expect, it } from "vitest";
import {
  besselI0,
  besselI0e,
  besselI1,
  besselI1e,
  besselK0,
  besselK0e,
  besselK1,
  besselK1e,
} from "../src/special/index.js";
import { describeWorst, specialFixture, worstRelativeError } from "./special-fixture.js";

// Reference: tests/fixtures/special/special.json, mpmath 1.2.1 at 40 digits (generate_special.py).
const REQUIRED = 1e-14;
const MAIN_REGIMES = ["tiny", "small", "medium", "large", "edges"] as const;

const functions = {
  besselI0,
  besselI0e,
  besselI1,
  besselI1e,
  besselK0,
  besselK0e,
  besselK1,
  besselK1e,
} as const;

describe("modified Bessel functions against mpmath", () => {
  for (const [name, f] of Object.entries(functions)) {
    for (const regime of MAIN_REGIMES) {
      it(`${name} stays within 1e-14 relative error in the ${regime} regime`, () => {
        const w = worstRelativeError(f, specialFixture.regimes[regime]!, name);
        expect(w.error, describeWorst(name, regime, w, REQUIRED)).toBeLessThanOrEqual(REQUIRED);
      });
    }
  }

  for (const name of ["besselI0e", "besselI1e", "besselK0e", "besselK1e"] as const) {
    it(`${name} stays within 1e-14 relative error for 700 <= x <= 1e12, where it is still finite`, () => {
      const w = worstRelativeError(functions[name], specialFixture.regimes["beyond"]!, name);
      expect(w.error, describeWorst(name, "beyond", w, REQUIRED)).toBeLessThanOrEqual(REQUIRED);
    });
  }

  for (const name of ["besselI0", "besselI1"] as const) {
    it(`${name} stays finite and within 1e-14 up to x = 713.9, just below its overflow`, () => {
      const w = worstRelativeError(functions[name], specialFixture.regimes["nearOverflow"]!, name);
      expect(w.error, describeWorst(name, "nearOverflow", w, REQUIRED)).toBeLessThanOrEqual(REQUIRED);
    });
  }

  for (const name of ["besselK0", "besselK1"] as const) {
    it(`${name} keeps the digits a subnormal result can hold between 700 and 745`, () => {
      // Tolerance: one unit of the smallest subnormal (4.9e-324) plus 1e-14 relative.
      const regime = specialFixture.regimes["underflow"]!;
      regime.x.forEach((x, i) => {
        const want = regime.values[name]![i]!;
        const got = functions[name](x);
        expect(Math.abs(got - want), `${name}(${x}) = ${got}, mpmath ${want}`).toBeLessThanOrEqual(
          Number.MIN_VALUE + REQUIRED * want,
        );
      });
    });
  }
});

describe("modified Bessel functions against Abramowitz & Stegun Table 9.8", () => {
  // Values from memory of A&S (1964) Table 9.8, which prints them to 10 decimals. The last recalled digit
  // may be off by one, so the tolerance is 1.5 units of the 10th decimal. Columns: x, e^-x I0(x),
  // e^-x I1(x), e^x K0(x), e^x K1(x); null where no entry is recalled with confidence.
  const table: readonly (readonly [number, number, number, number | null, number | null])[] = [
    [1.0, 0.4657596077, 0.2079104154, 1.1444630798, 1.6361534863],
    [2.0, 0.3085083225, 0.2152692892, 0.8415682151, 1.0334768471],
    [5.0, 0.1835408126, 0.1639722669, null, 0.6002738587],
    [10.0, 0.1278333372, 0.1212626814, 0.3916319344, null],
  ];
  const tolerance = 1.5e-10;
  for (const [x, i0e, i1e, k0e, k1e] of table) {
    it(`reproduces the row x = ${x} to within 1.5 units of the 10th decimal`, () => {
      expect(Math.abs(besselI0e(x) - i0e), "e^-x I0(x)").toBeLessThanOrEqual(tolerance);
      expect(Math.abs(besselI1e(x) - i1e), "e^-x I1(x)").toBeLessThanOrEqual(tolerance);
      if (k0e !== null) expect(Math.abs(besselK0e(x) - k0e), "e^x K0(x)").toBeLessThanOrEqual(tolerance);
      if (k1e !== null) expect(Math.abs(besselK1e(x) - k1e), "e^x K1(x)").toBeLessThanOrEqual(tolerance);
    });
  }
});

describe("modified Bessel function identities", () => {
  const points: number[] = [];
  for (let e = -300; e <= 2.8; e += 0.37) points.push(10 ** e);
  points.push(1, 2, 4, 8, 10, 16, 20, 700);

  it("satisfy the Wronskian I0 K1 + I1 K0 = 1/x within 4e-15 for 1e-300 <= x <= 700", () => {
    // A&S eq. 9.6.15 with nu = 0.
    let worst = 0;
    let at = NaN;
    for (const x of points) {
      const e = Math.abs(x * (besselI0(x) * besselK1(x) + besselI1(x) * besselK0(x)) - 1);
      if (e > worst) [worst, at] = [e, x];
    }
    expect(worst, `max |x (I0 K1 + I1 K0) - 1| = ${worst} at x = ${at}`).toBeLessThanOrEqual(4e-15);
  });

  it("satisfy the scaled Wronskian I0e K1e + I1e K0e = 1/x within 4e-15 up to x = 1e12", () => {
    let worst = 0;
    let at = NaN;
    for (const x of [...points, 1e3, 1e4, 1e6, 1e9, 1e12]) {
      const e = Math.abs(x * (besselI0e(x) * besselK1e(x) + besselI1e(x) * besselK0e(x)) - 1);
      if (e > worst) [worst, at] = [e, x];
    }
    expect(worst, `max |x (I0e K1e + I1e K0e) - 1| = ${worst} at x = ${at}`).toBeLessThanOrEqual(4e-15);
  });

  it("have K0' = -K1 and I0' = I1 (central differences)", () => {
    // A&S eq. 9.6.27. I0' is checked from x = 0.5 on: below, I1 ~ x/2 is too small for the difference quotient.
    for (const x of [0.01, 0.5, 1.9, 2.1, 3.9, 4.1, 7, 9.9, 10.1, 15, 30]) {
      const h = 1e-5 * Math.min(x, 1);
      const dk0 = (besselK0(x + h) - besselK0(x - h)) / (2 * h);
      expect(Math.abs(dk0 / -besselK1(x) - 1), `K0'(${x})`).toBeLessThan(1e-8);
      if (x < 0.5) continue;
      const di0 = (besselI0(x + h) - besselI0(x - h)) / (2 * h);
      expect(Math.abs(di0 / besselI1(x) - 1), `I0'(${x})`).toBeLessThan(1e-8);
    }
  });

  it("give I0 even and I1 odd for negative arguments, scaled and unscaled", () => {
    for (const x of [1e-300, 1e-5, 0.7, 3, 9.99, 10.01, 25, 400, 712]) {
      expect(besselI0(-x)).toBe(besselI0(x));
      expect(besselI1(-x)).toBe(-besselI1(x));
      expect(besselI0e(-x)).toBe(besselI0e(x));
      expect(besselI1e(-x)).toBe(-besselI1e(x));
    }
  });

  it("follow the large-argument expansion e^x K0(x) sqrt(2x/pi) = 1 - 1/(8x) + 9/(128x^2) - ... for x >= 1e4", () => {
    // A&S eq. 9.7.2 with mu = 0: terms (-1)^k (1^2 3^2 ... (2k-1)^2) / (k! (8x)^k); three terms leave 2e-17 at 1e4.
    for (const x of [1e4, 1e6, 1e9]) {
      const z = 1 / (8 * x);
      const k0Series = 1 - z * (1 - (9 / 2) * z * (1 - (25 / 3) * z));
      const i0Series = 1 + z * (1 + (9 / 2) * z * (1 + (25 / 3) * z));
      const root = Math.sqrt((2 * x) / Math.PI);
      expect(Math.abs(besselK0e(x) * root - k0Series), `K0 at ${x}`).toBeLessThanOrEqual(3e-16);
      expect(Math.abs(besselI0e(x) * Math.sqrt(2 * Math.PI * x) - i0Series), `I0 at ${x}`).toBeLessThanOrEqual(3e-16);
    }
  });
});

describe("modified Bessel function special values", () => {
  it("K0, K1 and their scaled forms are +Infinity at 0", () => {
    for (const f of [besselK0, besselK1, besselK0e, besselK1e]) expect(f(0)).toBe(Infinity);
  });

  it("I0 is 1 and I1 is 0 at 0, scaled and unscaled", () => {
    expect(besselI0(0)).toBe(1);
    expect(besselI0e(0)).toBe(1);
    expect(besselI1(0)).toBe(0);
    expect(besselI1e(0)).toBe(0);
  });

  it("K0 and K1 are 0 at +Infinity and beyond underflow, positive just before it", () => {
    for (const f of [besselK0, besselK1, besselK0e, besselK1e]) expect(f(Infinity)).toBe(0);
    expect(besselK0(740)).toBeGreaterThan(0);
    expect(besselK1(740)).toBeGreaterThan(0);
    expect(besselK0(750)).toBe(0);
    expect(besselK1(750)).toBe(0);
  });

  it("K1 overflows to +Infinity only below about 5.6e-309, where 1/x does", () => {
    expect(besselK1(1e-300)).toBeCloseTo(1e300, -286);
    expect(besselK1(5e-309)).toBe(Infinity);
  });

  it("I0 and I1 overflow to Infinity beyond about 713.99 and are Infinity at +-Infinity", () => {
    expect(Number.isFinite(besselI0(713.9))).toBe(true);
    expect(besselI0(714.1)).toBe(Infinity);
    expect(besselI1(714.1)).toBe(Infinity);
    expect(besselI1(-714.1)).toBe(-Infinity);
    expect(besselI0(Infinity)).toBe(Infinity);
    expect(besselI0(-Infinity)).toBe(Infinity);
    expect(besselI1(Infinity)).toBe(Infinity);
    expect(besselI1(-Infinity)).toBe(-Infinity);
  });

  it("scaled I0 and I1 tend to 0 at +-Infinity", () => {
    expect(besselI0e(Infinity)).toBe(0);
    expect(besselI0e(-Infinity)).toBe(0);
    expect(besselI1e(Infinity)).toBe(0);
    expect(Math.abs(besselI1e(-Infinity))).toBe(0);
  });

  it("return NaN for NaN", () => {
    for (const f of Object.values(functions)) expect(f(NaN)).toBeNaN();
  });

  it("K0 and K1 throw a RangeError naming the value for a negative argument", () => {
    expect(() => besselK0(-1)).toThrow(RangeError);
    expect(() => besselK0(-1)).toThrow(/besselK0\(x\): x = -1 is negative; besselK0 is defined here for x >= 0/);
    expect(() => besselK1(-0.5)).toThrow(/x = -0\.5 is negative/);
    expect(() => besselK0e(-3)).toThrow(/besselK0e is defined here for x >= 0/);
    expect(() => besselK1e(-Infinity)).toThrow(/x = -Infinity/);
  });
});
