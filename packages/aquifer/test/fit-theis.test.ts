import { describe, it, expect } from "vitest";
import { readFileSync } from "node:fs";
import { fitModel, FitInputError, type FitResult, type ObservationWell } from "../src/fit/index.js";
import { theisModel } from "../src/models/index.js";

interface FixtureWell {
  name: string;
  r: number;
  Q: number;
  t: number[];
  s: number[];
  weights?: number[];
}
interface FixtureFit {
  estimates: { T: number; S: number };
  standard_errors: { T: number; S: number };
  ci95: { T: [number, number]; S: [number, number] };
  correlation_T_S: number;
  ssr: number;
  n: number;
  dof: number;
  aic: number;
  bic: number;
}
interface Dataset {
  id: string;
  true: { T: number; S: number };
  start: { T: number; S: number };
  wells: FixtureWell[];
  fit: FixtureFit;
}

// Reference: tests/fixtures/fit/theis-fits.json, written by generate_fit.py with
// scipy.optimize.least_squares(method="lm") in ln T, ln S and the same covariance definition.
const fixture = JSON.parse(
  readFileSync(new URL("../../../tests/fixtures/fit/theis-fits.json", import.meta.url), "utf8"),
) as { datasets: Dataset[] };

function dataset(id: string): Dataset {
  const d = fixture.datasets.find((x) => x.id === id);
  if (!d) throw new Error(`fixture has no data set ${id}`);
  return d;
}

function wellsOf(d: Dataset): ObservationWell[] {
  return d.wells.map((w) => ({
    name: w.name,
    geometry: { r: w.r, Q: w.Q },
    t: Float64Array.from(w.t),
    s: Float64Array.from(w.s),
    weights: w.weights ? Float64Array.from(w.weights) : undefined,
  }));
}

const TIGHT = { ftol: 1e-13, xtol: 1e-13, gtol: 1e-13 };

function param(result: FitResult, name: string) {
  const p = result.parameters.find((x) => x.name === name);
  if (!p) throw new Error(`no parameter ${name}`);
  return p;
}

function relative(a: number, b: number): number {
  return Math.abs(a - b) / Math.abs(b);
}

describe("fitModel against scipy.optimize.least_squares", () => {
  for (const id of ["single-well", "two-well", "weighted", "thousand-point"]) {
    it(`reproduces scipy's estimates within 0.1 % and standard errors within 2 % on the ${id} data set`, () => {
      const d = dataset(id);
      const result = fitModel({ model: theisModel, wells: wellsOf(d), start: d.start, ...TIGHT });
      expect(result.converged).toBe(true);
      expect(result.n).toBe(d.fit.n);
      expect(result.dof).toBe(d.fit.dof);
      for (const name of ["T", "S"] as const) {
        const p = param(result, name);
        // Acceptance criteria: estimates within 0.1 %, standard errors within 2 % of scipy's.
        expect(relative(p.estimate, d.fit.estimates[name])).toBeLessThan(1e-3);
        expect(relative(p.standardError!, d.fit.standard_errors[name])).toBeLessThan(0.02);
        // Both minimise the same sum of squares to tight tolerances, so they agree far more closely.
        expect(relative(p.estimate, d.fit.estimates[name])).toBeLessThan(1e-8);
        expect(relative(p.ci95![0], d.fit.ci95[name][0])).toBeLessThan(1e-7);
        expect(relative(p.ci95![1], d.fit.ci95[name][1])).toBeLessThan(1e-7);
      }
      expect(result.correlation[0]![1]).toBeCloseTo(d.fit.correlation_T_S, 7);
      expect(relative(result.ssr, d.fit.ssr)).toBeLessThan(1e-10);
      expect(result.aic).toBeCloseTo(d.fit.aic, 8);
      expect(result.bic).toBeCloseTo(d.fit.bic, 8);
    });
  }

  it("reaches the same optimum from starting values derived from the data", () => {
    const d = dataset("single-well");
    const result = fitModel({ model: theisModel, wells: wellsOf(d), ...TIGHT });
    expect(result.start.method).toBe("cooper-jacob");
    expect(relative(param(result, "T").estimate, d.fit.estimates.T)).toBeLessThan(1e-8);
    expect(relative(param(result, "S").estimate, d.fit.estimates.S)).toBeLessThan(1e-8);
  });

  it("converges to the same optimum when the start for T is 100 times too large or too small", () => {
    const d = dataset("single-well");
    for (const factor of [100, 0.01]) {
      const result = fitModel({
        model: theisModel,
        wells: wellsOf(d),
        start: { T: d.fit.estimates.T * factor, S: d.start.S },
        ...TIGHT,
      });
      expect(result.converged).toBe(true);
      expect(relative(param(result, "T").estimate, d.fit.estimates.T)).toBeLessThan(1e-8);
      expect(relative(param(result, "S").estimate, d.fit.estimates.S)).toBeLessThan(1e-8);
    }
  });
});

describe("fitModel on noise-free data", () => {
  it("returns the T and S that generated the data to 1e-6 relative", () => {
    const T = 450;
    const S = 2e-4;
    const t = new Float64Array(40).map((_, i) => Math.exp(Math.log(1 / 1440) + (i / 39) * Math.log(3 * 1440)));
    const s = theisModel.drawdown([T, S], { r: 35, Q: 1200 }, t);
    const result = fitModel({ model: theisModel, wells: [{ name: "P", geometry: { r: 35, Q: 1200 }, t, s }], start: { T: 100, S: 1e-3 } });
    expect(relative(param(result, "T").estimate, T)).toBeLessThan(1e-6);
    expect(relative(param(result, "S").estimate, S)).toBeLessThan(1e-6);
    expect(result.rmse).toBeLessThan(1e-9);
  });
});

describe("fitModel options", () => {
  const d = dataset("single-well");

  it("holds a fixed parameter at its value and fits the other", () => {
    const result = fitModel({ model: theisModel, wells: wellsOf(d), fixed: { S: 2e-4 }, start: { T: 100 } });
    const S = param(result, "S");
    expect(S.fixed).toBe(true);
    expect(S.estimate).toBe(2e-4);
    expect(S.standardError).toBeNull();
    expect(result.p).toBe(1);
    expect(result.dof).toBe(result.n - 1);
    expect(result.freeParameters).toEqual(["T"]);
    // With S held near the scipy optimum, T moves only a little from scipy's joint estimate.
    expect(relative(param(result, "T").estimate, d.fit.estimates.T)).toBeLessThan(0.01);
  });

  it("keeps the estimate inside bounds that exclude the unconstrained optimum and reports it at the bound as an error", () => {
    const result = fitModel({ model: theisModel, wells: wellsOf(d), bounds: { T: [10, 400] }, start: { T: 100, S: 1e-3 } });
    const T = param(result, "T");
    expect(T.estimate).toBeLessThanOrEqual(400);
    expect(relative(T.estimate, 400)).toBeLessThan(1e-12);
    expect(T.atBound).toBe("upper");
    expect(result.errors.some((w) => w.includes("T = 400") && w.includes("upper bound"))).toBe(true);
    expect(result.converged).toBe(false);
  });

  it("gives the same estimates with finite differences as with the analytic Jacobian", () => {
    const analytic = fitModel({ model: theisModel, wells: wellsOf(d), start: d.start, ...TIGHT });
    const central = fitModel({ model: theisModel, wells: wellsOf(d), start: d.start, jacobian: "central", ...TIGHT });
    expect(central.jacobianMethod).toBe("central");
    expect(relative(param(central, "T").estimate, param(analytic, "T").estimate)).toBeLessThan(1e-7);
    expect(relative(param(central, "S").standardError!, param(analytic, "S").standardError!)).toBeLessThan(1e-5);
  });

  it("leaves masked points out of the fit", () => {
    const wells = wellsOf(d);
    const mask = new Array<boolean>(wells[0]!.t.length).fill(true);
    mask[0] = false;
    mask[1] = false;
    const masked = fitModel({ model: theisModel, wells: [{ ...wells[0]!, mask }], start: d.start });
    expect(masked.n).toBe(d.fit.n - 2);
    expect(Array.from(masked.residuals[0]!.index.slice(0, 2))).toEqual([2, 3]);
  });

  it("weights shift the fit towards the heavily weighted points", () => {
    const base = wellsOf(d)[0]!;
    const weights = new Float64Array(base.t.length).fill(1);
    const late = base.t.length - 5;
    for (let i = late; i < base.t.length; i++) weights[i] = 1e6;
    const plain = fitModel({ model: theisModel, wells: [base], start: d.start });
    const weighted = fitModel({ model: theisModel, wells: [{ ...base, weights }], start: d.start });
    let plainLate = 0;
    let weightedLate = 0;
    for (let i = late; i < base.t.length; i++) {
      plainLate += plain.residuals[0]!.residual[i]! ** 2;
      weightedLate += weighted.residuals[0]!.residual[i]! ** 2;
    }
    expect(weightedLate).toBeLessThan(plainLate);
  });
});

describe("fitModel statistics", () => {
  const d = dataset("two-well");
  const result = fitModel({ model: theisModel, wells: wellsOf(d), start: d.start });

  it("fits two wells jointly: n counts both and residuals come back per well", () => {
    expect(result.n).toBe(d.wells[0]!.t.length + d.wells[1]!.t.length);
    expect(result.residuals.map((r) => r.name)).toEqual(["OB-A", "OB-B"]);
    let ssr = 0;
    for (const r of result.residuals) for (const e of r.residual) ssr += e * e;
    expect(relative(ssr, result.ssr)).toBeLessThan(1e-12);
  });

  it("computes AIC and BIC as n ln(SSR/n) + 2k and n ln(SSR/n) + k ln n with k = p + 1", () => {
    // Formulas: Akaike (1974), Schwarz (1978) for Gaussian errors, constants dropped; k counts the variance.
    const k = result.p + 1;
    const n = result.n;
    expect(result.aic).toBeCloseTo(n * Math.log(result.ssr / n) + 2 * k, 12);
    expect(result.bic).toBeCloseTo(n * Math.log(result.ssr / n) + k * Math.log(n), 12);
    expect(result.aicc!).toBeCloseTo(result.aic + (2 * k * (k + 1)) / (n - k - 1), 12);
  });

  it("reports RMSE, the residual standard error and a symmetric correlation matrix", () => {
    expect(result.rmse).toBeCloseTo(Math.sqrt(result.ssr / result.n), 15);
    expect(result.residualStandardError).toBeCloseTo(Math.sqrt(result.ssr / result.dof), 15);
    expect(result.correlation[0]![0]).toBe(1);
    expect(result.correlation[0]![1]).toBe(result.correlation[1]![0]);
    const seT = param(result, "T").standardError!;
    expect(result.covariance[0]![0]).toBeCloseTo(seT * seT, 10);
  });

  it("is deterministic: two fits of the same input are bit-identical", () => {
    const again = fitModel({ model: theisModel, wells: wellsOf(d), start: d.start });
    expect(JSON.stringify(again.parameters)).toBe(JSON.stringify(result.parameters));
    expect(Array.from(again.residuals[1]!.residual)).toEqual(Array.from(result.residuals[1]!.residual));
    expect(Object.is(again.ssr, result.ssr)).toBe(true);
    expect(again.evaluations).toBe(result.evaluations);
  });

  it("warns about strongly correlated parameters", () => {
    const one = dataset("single-well");
    const wells = wellsOf(one);
    // Late data only: T and S are then nearly interchangeable along the Cooper-Jacob line.
    const mask = Array.from(wells[0]!.t, (t) => t > 0.3);
    const late = fitModel({ model: theisModel, wells: [{ ...wells[0]!, mask }], start: one.start });
    expect(Math.abs(late.correlation[0]![1]!)).toBeGreaterThan(0.95);
    const shown = late.correlation[0]![1]!.toFixed(2);
    expect(late.warnings.some((w) => w.startsWith(`T and S are correlated at ${shown}:`))).toBe(true);
  });
});

describe("fitModel input errors", () => {
  const d = dataset("single-well");
  const well = wellsOf(d)[0]!;

  it("rejects a call without wells", () => {
    expect(() => fitModel({ model: theisModel, wells: [] })).toThrow(FitInputError);
    expect(() => fitModel({ model: theisModel, wells: [] })).toThrow(/no observation wells/);
  });

  it("rejects too few points for the free parameters", () => {
    const two: ObservationWell = { name: "W", geometry: well.geometry, t: [0.1, 0.2], s: [0.5, 0.6] };
    expect(() => fitModel({ model: theisModel, wells: [two], start: d.start })).toThrow(/2 points for 2 free parameters/);
  });

  it("names the well and index of a NaN drawdown", () => {
    const s = Float64Array.from(well.s);
    s[7] = NaN;
    expect(() => fitModel({ model: theisModel, wells: [{ ...well, name: "OB-9", s }] })).toThrow(/well "OB-9", point 7: drawdown is NaN/);
  });

  it("names a non-positive time and unknown parameter names", () => {
    const t = Float64Array.from(well.t);
    t[0] = 0;
    expect(() => fitModel({ model: theisModel, wells: [{ ...well, t }] })).toThrow(/point 0: time is 0 d; times must be > 0/);
    expect(() => fitModel({ model: theisModel, wells: [well], fixed: { K: 1 } })).toThrow(/"K".*T, S/);
  });

  it("rejects a start value outside the bounds", () => {
    expect(() => fitModel({ model: theisModel, wells: [well], start: { T: 5000 }, bounds: { T: [1, 1000] } })).toThrow(
      /start value of T .* within the bounds \[1, 1000\]/,
    );
  });
});
