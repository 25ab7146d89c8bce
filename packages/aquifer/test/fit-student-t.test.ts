import { describe, it, expect } from "vitest";
import { readFileSync } from "node:fs";
import { lnGamma, studentTCdf, studentTQuantile } from "../src/fit/index.js";

interface QuantileRow {
  p: number;
  dof: number;
  scipy: number;
  scipy_newton: number;
  mpmath: number;
}
interface StudentTFixture {
  quantiles: QuantileRow[];
  cdf: { t: number; dof: number; mpmath: number; scipy: number }[];
  lnGamma: { x: number; mpmath: number }[];
}

// Reference: tests/fixtures/fit/student-t.json from generate_fit.py (scipy.stats.t, mpmath 40 digits).
const fixture = JSON.parse(
  readFileSync(new URL("../../../tests/fixtures/fit/student-t.json", import.meta.url), "utf8"),
) as StudentTFixture;

function relativeError(actual: number, expected: number): number {
  if (expected === 0) return Math.abs(actual);
  return Math.abs(actual - expected) / Math.abs(expected);
}

describe("studentTQuantile", () => {
  it("matches scipy.stats.t.ppf polished by one Newton step on scipy's t.cdf to 1e-10 relative", () => {
    // Source: scipy.stats.t.ppf + Newton step on scipy.stats.t.cdf (see scipy_newton_quantile in the script).
    let worst = 0;
    for (const row of fixture.quantiles) {
      const q = studentTQuantile(row.p, row.dof);
      worst = Math.max(worst, row.p === 0.5 ? Math.abs(q) : relativeError(q, row.scipy_newton));
    }
    expect(worst).toBeLessThan(1e-10);
  });

  it("matches a 40-digit mpmath root of the t CDF to 1e-12 relative up to 1e4 degrees of freedom, 2e-11 at 1e6", () => {
    // Source: mpmath.betainc root found by mpmath.findroot at 40 digits. At 1e6 degrees of freedom the
    // continued fraction of the incomplete beta function runs long enough to lose about four digits.
    for (const row of fixture.quantiles) {
      const q = studentTQuantile(row.p, row.dof);
      const error = row.p === 0.5 ? Math.abs(q) : relativeError(q, row.mpmath);
      expect(error).toBeLessThan(row.dof <= 1e4 ? 1e-12 : 2e-11);
    }
  });

  it("agrees with raw scipy.stats.t.ppf to the 1e-8 relative that scipy's cdflib search reaches", () => {
    // Source: scipy.stats.t.ppf (scipy 1.10, special.stdtrit), whose own t.cdf misses p by up to 4e-9.
    for (const row of fixture.quantiles) {
      const q = studentTQuantile(row.p, row.dof);
      if (row.p === 0.5) expect(q).toBe(0);
      else expect(relativeError(q, row.scipy)).toBeLessThan(1e-8);
    }
  });

  it("gives the familiar 95 % two-sided value 1.95996... for very many degrees of freedom", () => {
    // Fact of the trade: the normal 97.5 % quantile is 1.959963985 (common practice, no source).
    expect(studentTQuantile(0.975, 1e6)).toBeCloseTo(1.959966, 5);
  });

  it("rejects probabilities outside (0, 1) and non-positive degrees of freedom with a message", () => {
    expect(() => studentTQuantile(1, 5)).toThrow(/strictly between 0 and 1/);
    expect(() => studentTQuantile(0.5, 0)).toThrow(/degrees of freedom/);
  });
});

describe("studentTCdf and lnGamma", () => {
  it("evaluates the t CDF to 1e-13 relative against mpmath", () => {
    for (const row of fixture.cdf) expect(relativeError(studentTCdf(row.t, row.dof), row.mpmath)).toBeLessThan(1e-13);
  });

  it("evaluates ln Gamma to 1e-14 absolute against mpmath.loggamma", () => {
    for (const row of fixture.lnGamma) {
      expect(Math.abs(lnGamma(row.x) - row.mpmath)).toBeLessThan(1e-14 * Math.max(1, Math.abs(row.mpmath)));
    }
  });
});
