import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { besselJ0, besselJ1, besselY0, besselY1 } from "../src/special/bessel-jy.js";

// Reference: tests/fixtures/slug/bessel_jy.json, mpmath 1.2.1 at 30 digits (generate_bessel_jy.py); scipy.special
// values are stored beside them and agree with mpmath to 3.9e-12 of the envelope (printed by the script).
interface Regime {
  readonly x: readonly number[];
  readonly [name: string]: readonly number[];
}
const fixture = JSON.parse(
  readFileSync(new URL("../../../tests/fixtures/slug/bessel_jy.json", import.meta.url), "utf8"),
) as { regimes: Record<string, Regime> };

const functions = { J0: besselJ0, J1: besselJ1, Y0: besselY0, Y1: besselY1 } as const;
const RELATIVE = 1e-13;
/** Absolute error allowed near a zero, as a multiple of the envelope M(x) = sqrt(J^2 + Y^2) of the same order. */
const ENVELOPE = 2e-15;

interface Worst {
  error: number;
  x: number;
  got: number;
  want: number;
}

/** Worst relative error over the points where |f| >= 1e-3 M(x) ("away from zeros"). */
function worstRelative(name: keyof typeof functions, regime: Regime): Worst {
  const f = functions[name];
  const want = regime[name]!;
  const envelope = regime[`M${name[1]}`];
  let worst: Worst = { error: 0, x: NaN, got: NaN, want: NaN };
  regime.x.forEach((x, i) => {
    const ref = want[i]!;
    if (envelope !== undefined && Math.abs(ref) < 1e-3 * envelope[i]!) return;
    const got = f(x);
    const error = Math.abs(got - ref) / Math.abs(ref);
    if (!(error <= worst.error)) worst = { error, x, got, want: ref };
  });
  return worst;
}

/** Worst |f - ref| / M(x) over every point of a regime. */
function worstAbsolute(name: keyof typeof functions, regime: Regime): Worst {
  const f = functions[name];
  const want = regime[name]!;
  const envelope = regime[`M${name[1]}`]!;
  let worst: Worst = { error: 0, x: NaN, got: NaN, want: NaN };
  regime.x.forEach((x, i) => {
    const got = f(x);
    const error = Math.abs(got - want[i]!) / envelope[i]!;
    if (!(error <= worst.error)) worst = { error, x, got, want: want[i]! };
  });
  return worst;
}

const describeWorst = (label: string, w: Worst) =>
  `${label}: error ${w.error.toExponential(2)} at x = ${w.x}: got ${w.got}, mpmath ${w.want}`;

describe("Bessel J0, J1, Y0, Y1 against mpmath", () => {
  for (const name of Object.keys(functions) as (keyof typeof functions)[]) {
    for (const regime of ["tiny", "small", "medium", "large", "edges"]) {
      it(`${name} stays within 1e-13 relative error away from its zeros in the ${regime} regime`, () => {
        const w = worstRelative(name, fixture.regimes[regime]!);
        expect(w.error, describeWorst(`${name} ${regime}`, w)).toBeLessThanOrEqual(RELATIVE);
      });
    }
    for (const regime of ["small", "medium", "large", "zeros"]) {
      it(`${name} stays within 2e-15 of the envelope sqrt(J^2 + Y^2) everywhere in the ${regime} regime`, () => {
        const w = worstAbsolute(name, fixture.regimes[regime]!);
        expect(w.error, describeWorst(`${name} ${regime}`, w)).toBeLessThanOrEqual(ENVELOPE);
      });
    }
  }

  it("J0 is even and J1 odd for negative arguments, within 1e-13 relative", () => {
    const w0 = worstRelative("J0", fixture.regimes.negative!);
    const w1 = worstRelative("J1", fixture.regimes.negative!);
    expect(w0.error, describeWorst("J0 negative", w0)).toBeLessThanOrEqual(RELATIVE);
    expect(w1.error, describeWorst("J1 negative", w1)).toBeLessThanOrEqual(RELATIVE);
  });

  it("gives the limits at 0 and infinity and refuses negative arguments of Y", () => {
    expect(besselJ0(0)).toBe(1);
    expect(besselJ1(0)).toBe(0);
    expect(besselY0(0)).toBe(-Infinity);
    expect(besselY1(0)).toBe(-Infinity);
    expect(besselJ0(Infinity)).toBe(0);
    expect(besselY1(Infinity)).toBe(0);
    expect(Number.isNaN(besselJ0(NaN))).toBe(true);
    expect(() => besselY0(-1)).toThrow(/x = -1 is negative/);
    expect(() => besselY1(-2)).toThrow(RangeError);
  });

  it("satisfies the Wronskian J1 Y0 - J0 Y1 = 2/(pi x) to 1e-14 relative (DLMF 10.5.2)", () => {
    let worst = 0;
    for (let x = 0.01; x < 500; x *= 1.37) {
      const w = besselJ1(x) * besselY0(x) - besselJ0(x) * besselY1(x);
      worst = Math.max(worst, Math.abs(w * ((Math.PI * x) / 2) - 1));
    }
    expect(worst).toBeLessThan(1e-14);
  });
});
