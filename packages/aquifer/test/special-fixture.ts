/**
 * Reads tests/fixtures/special/special.json (mpmath at 40 digits, written by
 * tests/fixtures/special/generate_special.py) and measures errors against it. Test helper, not a test.
 */
import { readFileSync } from "node:fs";

export interface Regime {
  readonly range: readonly [number, number];
  readonly x: readonly number[];
  readonly values: Readonly<Record<string, readonly number[]>>;
}

interface SpecialFixture {
  readonly generator: string;
  readonly reference: string;
  readonly regimes: Readonly<Record<string, Regime>>;
}

const fixtureUrl = new URL("../../../tests/fixtures/special/special.json", import.meta.url);

/** The parsed fixture file. */
export const specialFixture: SpecialFixture = JSON.parse(readFileSync(fixtureUrl, "utf8")) as SpecialFixture;

/** The worst relative error of `f` against the reference values of `name` in one regime, and where. */
export interface WorstError {
  readonly error: number;
  readonly x: number;
  readonly got: number;
  readonly want: number;
}

/** Maximum relative error |f(x) - ref| / |ref| over a regime (reference values must be nonzero). */
export function worstRelativeError(f: (x: number) => number, regime: Regime, name: string): WorstError {
  const want = regime.values[name];
  if (want === undefined) throw new Error(`fixture regime has no values for ${name}`);
  let worst: WorstError = { error: 0, x: NaN, got: NaN, want: NaN };
  regime.x.forEach((x, i) => {
    const ref = want[i]!;
    const got = f(x);
    const error = Math.abs(got - ref) / Math.abs(ref);
    if (!(error <= worst.error)) worst = { error, x, got, want: ref };
  });
  return worst;
}

/** One line for an assertion message: the error found, the tolerance and the worst point. */
export function describeWorst(name: string, regime: string, w: WorstError, tolerance: number): string {
  return (
    `${name} in regime "${regime}": max relative error ${w.error.toExponential(2)} ` +
    `(tolerance ${tolerance.toExponential(0)}) at x = ${w.x}: got ${w.got}, mpmath ${w.want}`
  );
}
