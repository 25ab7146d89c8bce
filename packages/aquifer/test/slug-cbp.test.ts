import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { stehfest } from "../src/numerics/index.js";
import { besselK0, besselK1 } from "../src/special/index.js";
import { cbpNormalizedHead, SlugTestInputError } from "../src/slug/index.js";

// Reference: tests/fixtures/slug/cbp.json (generate_cbp.py): mpmath quad at 20 digits of the same integral
// with mpmath's J and Y, integrated in u; scipy quad in ln u with cephes J and Y stored beside it.
interface CbpCase {
  readonly alpha: number;
  readonly beta: number;
  readonly value: number;
  readonly scipy: number;
}
const fixture = JSON.parse(
  readFileSync(new URL("../../../tests/fixtures/slug/cbp.json", import.meta.url), "utf8"),
) as { cases: CbpCase[] };

describe("Cooper-Bredehoeft-Papadopulos (1967) slug-test curve", () => {
  it("agrees with the independent mpmath evaluation within 1e-12 relative for alpha 1e-10..0.1, beta 1e-4..1e3", () => {
    let worst = { error: 0, alpha: NaN, beta: NaN };
    for (const c of fixture.cases) {
      const error = Math.abs(cbpNormalizedHead(c.alpha, c.beta) - c.value) / c.value;
      if (error > worst.error) worst = { error, alpha: c.alpha, beta: c.beta };
    }
    expect(fixture.cases.length).toBe(55);
    expect(worst.error, `worst at alpha = ${worst.alpha}, beta = ${worst.beta}`).toBeLessThan(1e-12);
  });

  it("starts at H/H0 = 1: exactly the normalisation of the integral at beta = 0, and continuously as beta -> 0", () => {
    // At beta = 0 the integral (8 alpha/pi^2) int du/(u f(u)) equals 1 (the slug is all in the well at t = 0).
    for (const alpha of [1e-10, 1e-6, 1e-3, 0.1, 1]) {
      expect(Math.abs(cbpNormalizedHead(alpha, 0) - 1)).toBeLessThan(1e-11);
      expect(1 - cbpNormalizedHead(alpha, 1e-12)).toBeGreaterThan(0);
      expect(1 - cbpNormalizedHead(alpha, 1e-12)).toBeLessThan(1e-5);
    }
  });

  it("follows the early-time limit 1 - H/H0 = 4 sqrt(alpha beta / pi) when beta << alpha", () => {
    // Derivation (common practice, no source): while the pressure front has moved a distance much smaller than rw
    // (T t / S << rw^2, i.e. beta << alpha), the screen sees one-dimensional diffusion from a step of H0:
    // inflow 2 pi rw H0 sqrt(T S / (pi t)); volume balance pi rc^2 dH/dt = -inflow integrates to
    // (H0 - H)/H0 = (4 rw / rc^2) sqrt(T S t / pi) = 4 sqrt(alpha beta / pi). The next term is O(beta/alpha)
    // relative, so at beta/alpha = 1e-4 the agreement should be within about 1 %.
    for (const alpha of [1e-3, 0.1]) {
      const beta = 1e-4 * alpha;
      const limit = 4 * Math.sqrt((alpha * beta) / Math.PI);
      const value = 1 - cbpNormalizedHead(alpha, beta);
      expect(Math.abs(value / limit - 1)).toBeLessThan(0.01);
    }
  });

  it("matches the numerical inversion of its Laplace transform K0(x) / (s K0(x) + 2 x K1(x)), x = sqrt(alpha s)", () => {
    // Laplace transform in beta of H/H0 (derived from the well's volume balance and K0(q r) for the aquifer);
    // inverted by Stehfest (N = 14), whose own accuracy is about 1e-5 here, with the library's K0 and K1: a
    // check that uses neither J nor Y.
    const transform = (alpha: number) => (s: number) => {
      const x = Math.sqrt(alpha * s);
      const k0 = besselK0(x);
      return k0 / (s * k0 + 2 * x * besselK1(x));
    };
    for (const alpha of [1e-5, 1e-3, 0.1]) {
      for (const beta of [0.1, 1, 10]) {
        const inverted = stehfest(transform(alpha), beta, 14);
        expect(Math.abs(cbpNormalizedHead(alpha, beta) - inverted)).toBeLessThan(1e-4);
      }
    }
  });

  it("falls monotonically, and faster for larger alpha at a given beta", () => {
    for (const alpha of [1e-9, 1e-5, 1e-2]) {
      let previous = 1;
      for (let beta = 1e-3; beta < 1e3; beta *= 2) {
        const h = cbpNormalizedHead(alpha, beta);
        expect(h).toBeLessThan(previous);
        previous = h;
      }
    }
    expect(cbpNormalizedHead(1e-2, 1)).toBeLessThan(cbpNormalizedHead(1e-6, 1));
  });

  it("refuses alpha <= 0 and negative beta", () => {
    expect(() => cbpNormalizedHead(0, 1)).toThrow(SlugTestInputError);
    expect(() => cbpNormalizedHead(1e-3, -1)).toThrow(/beta/);
  });
});
