import { describe, it, expect } from "vitest";
import { besselK0Complex, complex, cdiv, cexp, clog, cmul, csqrt, cabs } from "../src/numerics/index.js";
import { besselK0 } from "../src/special/index.js";
import fixture from "../../../tests/fixtures/numerics/besselk0_complex.json" with { type: "json" };

describe("complex arithmetic", () => {
  it("divides, takes roots, logs and exponentials consistently", () => {
    const a = complex(3, -4);
    const b = complex(-1e-300, 2e-300);
    const q = cdiv(a, b);
    const back = cmul(q, b);
    expect(Math.abs(back.re - 3) + Math.abs(back.im + 4)).toBeLessThan(1e-14);
    expect(cabs(a)).toBe(5);
    const r = csqrt(complex(-4, -0));
    expect(r.re).toBe(0);
    expect(Math.abs(r.im)).toBe(2);
    const s = csqrt(a);
    const sq = cmul(s, s);
    expect(Math.abs(sq.re - 3) + Math.abs(sq.im + 4)).toBeLessThan(1e-14);
    const e = cexp(clog(a));
    expect(Math.abs(e.re - 3) + Math.abs(e.im + 4)).toBeLessThan(1e-14);
  });
});

describe("besselK0Complex", () => {
  for (const regime of ["series", "continued-fraction"] as const) {
    it(`matches mpmath besselk(0, z) within 5e-15 relative in the ${regime} regime`, () => {
      let worst = 0;
      let where = "";
      for (const p of fixture.points.filter((q) => q.regime === regime)) {
        const k = besselK0Complex(complex(p.re, p.im));
        const error = Math.hypot(k.re - p.k0re, k.im - p.k0im) / Math.hypot(p.k0re, p.k0im);
        if (error > worst) {
          worst = error;
          where = `z = ${p.re} + ${p.im}i`;
        }
      }
      expect(worst, `max relative error ${worst.toExponential(2)} at ${where}`).toBeLessThan(5e-15);
    });
  }

  it("agrees with the real K0 of the special-function module on the positive axis", () => {
    for (const x of [1e-5, 0.5, 2, 2.0000001, 7, 40]) {
      const k = besselK0Complex(complex(x));
      expect(Math.abs(k.re / besselK0(x) - 1), `x = ${x}`).toBeLessThan(5e-15);
      expect(k.im).toBe(0);
    }
  });

  it("satisfies the conjugate symmetry K0(conj z) = conj K0(z)", () => {
    const a = besselK0Complex(complex(1.3, 0.9));
    const b = besselK0Complex(complex(1.3, -0.9));
    expect(a.re).toBe(b.re);
    expect(a.im).toBe(-b.im);
  });

  it("rejects z outside the right half plane with a RangeError", () => {
    expect(() => besselK0Complex(complex(0, 1))).toThrow(/Re z > 0/);
    expect(() => besselK0Complex(complex(-1, 0))).toThrow(RangeError);
    expect(() => besselK0Complex(complex(Number.NaN, 0))).toThrow(RangeError);
  });
});
