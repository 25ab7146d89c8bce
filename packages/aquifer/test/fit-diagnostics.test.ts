import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { chiSquareSurvival, normalCdf, regularizedGammaP, regularizedGammaQ } from "../src/fit/index.js";
import { ar1RestrictedLogLikelihood, correlatedCovariance } from "../src/fit/correlated-covariance.js";
import type { PackedWell } from "../src/fit/observations.js";
import { residualDiagnostics } from "../src/fit/residual-diagnostics.js";
import { inTimeOrder, orthonormalBasis, projectedSquareTrace, projectedTraces, timeOrder } from "../src/fit/residual-structure.js";

// Reference: tests/fixtures/fit/diagnostics.json from generate_diagnostics.py (numpy dense matrices, mpmath
// Imhof integral, scipy.special and scipy.stats).
interface DiagnosticsFixture {
  design: { sizes: number[]; packedTimes: number[]; packedColumns: number[][]; packedResiduals: number[] };
  durbinWatson: { statistic: number; mean: number; variance: number; betaPValue: number; points: { d: number; exact: number; beta: number }[] };
  runs: { runs: number; expected: number; variance: number; pValue: number };
  lag1: number;
  traces: { rho: number; mSigma: number; mcmSigma: number; mSigmaSquared: number }[];
  reml: { rho: number; difference: number }[];
  sandwichAt05: number[][];
  mixture: { rho: number; covariance: number[][]; halfWidths: number[] };
  distributions: {
    gammaP: { a: number; x: number; value: number }[];
    gammaQ: { a: number; x: number; value: number }[];
    normalCdf: { z: number; value: number }[];
    chiSquareSurvival: { x: number; nu: number; value: number }[];
  };
}
const fixture = JSON.parse(readFileSync(new URL("../../../tests/fixtures/fit/diagnostics.json", import.meta.url), "utf8")) as DiagnosticsFixture;

const relative = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

/** The fixture's two wells as packed wells (the second stored in reverse time order). */
function design() {
  const { sizes, packedTimes, packedColumns, packedResiduals } = fixture.design;
  let offset = 0;
  const wells: PackedWell[] = sizes.map((m, k) => {
    const w: PackedWell = {
      name: `W${k + 1}`,
      geometry: { r: 10, Q: 100 },
      offset,
      index: Int32Array.from({ length: m }, (_, i) => i),
      t: Float64Array.from(packedTimes.slice(offset, offset + m)),
      s: new Float64Array(m),
      sqrtWeights: new Float64Array(m).fill(1),
      absolute: false,
    };
    offset += m;
    return w;
  });
  const n = offset;
  const p = packedColumns.length;
  const jacobian = new Float64Array(n * p);
  packedColumns.forEach((column, j) => jacobian.set(column, j * n));
  return { order: timeOrder(wells), jacobian, residuals: Float64Array.from(packedResiduals), n, p };
}

describe("distribution functions of the residual checks", () => {
  it("match scipy's regularised incomplete gamma functions to 1e-13 relative", () => {
    for (const { a, x, value } of fixture.distributions.gammaP) expect(relative(regularizedGammaP(a, x), value)).toBeLessThan(1e-13);
    for (const { a, x, value } of fixture.distributions.gammaQ) expect(relative(regularizedGammaQ(a, x), value)).toBeLessThan(1e-12);
  });

  it("match scipy.stats.norm.cdf and chi2.sf to 1e-12 relative, including the far tails", () => {
    for (const { z, value } of fixture.distributions.normalCdf) expect(relative(normalCdf(z), value)).toBeLessThan(1e-12);
    for (const { x, nu, value } of fixture.distributions.chiSquareSurvival) expect(relative(chiSquareSurvival(x, nu), value)).toBeLessThan(1e-12);
  });

  it("give the textbook values Phi(0) = 1/2 and Phi(1.96) = 0.975 (A&S table 26.1)", () => {
    expect(normalCdf(0)).toBe(0.5);
    expect(normalCdf(1.959963984540054)).toBeCloseTo(0.975, 14);
  });
});

describe("residualDiagnostics on a two-well design", () => {
  const { order, jacobian, residuals, p } = design();
  const result = residualDiagnostics(order, residuals, jacobian, p);

  it("sorts each well by time before pairing neighbours: lag-1 autocorrelation as numpy's dense e'Ce/e'e to 1e-13", () => {
    expect(relative(result.lag1Autocorrelation!, fixture.lag1)).toBeLessThan(1e-13);
  });

  it("computes Durbin-Watson d and its null mean and variance for this design as the dense formulas do, to 1e-12", () => {
    const dw = result.durbinWatson!;
    expect(relative(dw.statistic, fixture.durbinWatson.statistic)).toBeLessThan(1e-12);
    expect(relative(dw.expected, fixture.durbinWatson.mean)).toBeLessThan(1e-12);
    expect(relative(dw.standardDeviation ** 2, fixture.durbinWatson.variance)).toBeLessThan(1e-11);
    // The beta approximation as scipy.stats.beta.cdf computes it.
    expect(relative(dw.pValue, fixture.durbinWatson.betaPValue)).toBeLessThan(1e-9);
  });

  it("has a beta-approximated p-value close to the exact Durbin-Watson distribution (Imhof 1961 by mpmath)", () => {
    // Exact P(d <= d0) by Imhof's integral in the fixture (checked there against 400000 simulated draws).
    for (const point of fixture.durbinWatson.points) {
      if (point.exact > 1e-3) expect(Math.abs(point.beta - point.exact)).toBeLessThan(0.1 * point.exact + 2e-3);
    }
    // The observed d lies far in the tail: both say p < 1e-4, so independence is rejected.
    expect(fixture.durbinWatson.points[0]!.exact).toBeLessThan(1e-4);
    expect(result.independent).toBe(false);
    expect(result.note).toContain("NOT independent");
  });

  it("counts runs of sign per well and sums their null moments (Wald and Wolfowitz 1940) as the fixture does", () => {
    expect(result.runs!.runs).toBe(fixture.runs.runs);
    expect(result.runs!.expected).toBeCloseTo(fixture.runs.expected, 12);
    expect(result.runs!.standardDeviation ** 2).toBeCloseTo(fixture.runs.variance, 12);
    expect(result.runs!.pValue).toBeCloseTo(fixture.runs.pValue, 12);
  });

  it("declares residuals not assessed when there are too few readings, and then assumes independence", () => {
    const few = residualDiagnostics(timeOrder([]), new Float64Array(0), new Float64Array(0), 0);
    expect(few.assessed).toBe(false);
    expect(few.independent).toBe(true);
    expect(few.note).toContain("not checked");
  });
});

describe("the O(n) products behind the AR(1) correction", () => {
  const { order, jacobian, residuals, n, p } = design();
  const basis = orthonormalBasis(order, jacobian, p);

  it("give tr(M Sigma), tr(M C M Sigma) and tr((M Sigma)^2) of the dense matrices to 1e-12", () => {
    for (const row of fixture.traces) {
      const traces = projectedTraces(order, basis, row.rho);
      expect(relative(traces.mSigma, row.mSigma)).toBeLessThan(1e-12);
      expect(Math.abs(traces.mcmSigma - row.mcmSigma)).toBeLessThan(1e-11 * n);
      expect(relative(projectedSquareTrace(order, basis, row.rho), row.mSigmaSquared)).toBeLessThan(1e-11);
    }
  });

  it("give the restricted log-likelihood of rho (Harville 1974) of the dense formula, as differences from rho = 0, to 1e-9", () => {
    const e = inTimeOrder(order, residuals);
    const base = ar1RestrictedLogLikelihood(order, e, basis, 0);
    for (const { rho, difference } of fixture.reml) {
      expect(Math.abs(ar1RestrictedLogLikelihood(order, e, basis, rho) - base - difference)).toBeLessThan(1e-9);
    }
  });

  it("integrate rho out exactly as the fixture's dense mixture: most likely rho, mixture covariance and half-widths", () => {
    // (X'X)^-1 of the design, the pseudo-inverse the fit passes in.
    const columns = fixture.design.packedColumns;
    const gram = columns.map((a) => columns.map((b) => a.reduce((s, v, i) => s + v * b[i]!, 0)));
    const inverse = invert(gram);
    const ssr = residuals.reduce((s, v) => s + v * v, 0);
    const result = correlatedCovariance(order, residuals, jacobian, p, inverse, ssr);
    expect(result.rho).toBe(fixture.mixture.rho);
    for (let a = 0; a < p; a++) {
      for (let b = 0; b < p; b++) expect(relative(result.covariance[a]![b]!, fixture.mixture.covariance[a]![b]!)).toBeLessThan(1e-9);
      const halfWidth = result.quantiles[a]! * Math.sqrt(result.covariance[a]![a]!);
      expect(relative(halfWidth, fixture.mixture.halfWidths[a]!)).toBeLessThan(2e-5);
    }
  });
});

/** Inverse of a small matrix by Gauss-Jordan elimination with partial pivoting (test helper). */
function invert(matrix: number[][]): number[][] {
  const m = matrix.length;
  const a = matrix.map((row, i) => [...row, ...Array.from({ length: m }, (_, j) => (i === j ? 1 : 0))]);
  for (let c = 0; c < m; c++) {
    let pivot = c;
    for (let r = c + 1; r < m; r++) if (Math.abs(a[r]![c]!) > Math.abs(a[pivot]![c]!)) pivot = r;
    [a[c], a[pivot]] = [a[pivot]!, a[c]!];
    const d = a[c]![c]!;
    for (let j = 0; j < 2 * m; j++) a[c]![j]! /= d;
    for (let r = 0; r < m; r++) {
      if (r === c) continue;
      const f = a[r]![c]!;
      for (let j = 0; j < 2 * m; j++) a[r]![j]! -= f * a[c]![j]!;
    }
  }
  return a.map((row) => row.slice(m));
}
