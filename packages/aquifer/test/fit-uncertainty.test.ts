import { describe, expect, it } from "vitest";
import { compareModels } from "../src/analysis/index.js";
import { fitModel, studentTQuantile } from "../src/fit/index.js";
import { forecastDrawdown } from "../src/forecast/index.js";
import {
  cooperJacobModel,
  hantushJacobModel,
  neumanModel,
  papadopulosCooperModel,
  theisModel,
  type DrawdownModel,
} from "../src/models/index.js";
import { normalGenerator } from "../../../tests/support/seeded-noise.js";

// Invented test: an observation well 30 m from a well pumping 864 m3/d, 30 readings from 1 min to 2 d; seeded
// noise. Nothing here is a reference value: the checks are identities of the definitions and limits of the methods.
const geometry = { r: 30, Q: 864 };
const t = Float64Array.from({ length: 30 }, (_, i) => Math.pow(10, Math.log10(1 / 1440) + (i * (Math.log10(2) - Math.log10(1 / 1440))) / 29));
const theisExact = theisModel.drawdown([250, 2e-4], geometry, t);
const relative = (a: number, b: number) => Math.abs(a / b - 1);

function noisy(seed: number, sd: number, phi = 0): Float64Array {
  const z = normalGenerator(seed);
  let e = z() * sd;
  return theisExact.map((v, i) => {
    if (i > 0) e = phi * e + Math.sqrt(1 - phi * phi) * sd * z();
    return v + e;
  });
}

describe("known measurement standard deviations (absolute weights)", () => {
  it("take the scale of the errors from sigma, use the normal quantile 1.96 and pass the chi-square check when sigma is right", () => {
    const s = noisy(5, 0.01);
    const fit = fitModel({ model: theisModel, wells: [{ name: "OB", geometry, t, s }], measurementSd: 0.01 });
    expect(fit.uncertainty.weighting).toBe("absolute");
    expect(fit.tQuantile).toBe(1.959963984540054);
    const T = fit.parameters[0]!;
    // ln-space interval: exp(ln T +- 1.96 SE(ln T)) with SE(ln T) = SE(T)/T (delta method).
    expect(relative(T.intervals.linearised![1], T.estimate * Math.exp((1.959963984540054 * T.standardError!) / T.estimate))).toBeLessThan(1e-12);
    expect(fit.uncertainty.chiSquare!.dof).toBe(28);
    expect(fit.uncertainty.chiSquare!.pValue).toBeGreaterThan(0.05);
    expect(fit.warnings.some((w) => w.includes("chi-square"))).toBe(false);
  });

  it("give intervals that scale with the stated sigma, and warn when the residuals are larger than sigma allows", () => {
    const s = noisy(5, 0.01);
    const right = fitModel({ model: theisModel, wells: [{ name: "OB", geometry, t, s }], measurementSd: 0.01 });
    const under = fitModel({ model: theisModel, wells: [{ name: "OB", geometry, t, s, sigma: new Float64Array(30).fill(0.002) }] });
    // Standard errors proportional to sigma: 0.002/0.01 = 0.2.
    expect(relative(under.parameters[0]!.standardError! / right.parameters[0]!.standardError!, 0.2)).toBeLessThan(1e-6);
    expect(under.uncertainty.chiSquare!.pValue).toBeLessThan(1e-6);
    expect(under.warnings.some((w) => w.includes("larger than the stated measurement standard deviations allow"))).toBe(true);
  });

  it("say that relative weights take the scale from the residuals", () => {
    const fit = fitModel({ model: theisModel, wells: [{ name: "OB", geometry, t, s: noisy(5, 0.01) }] });
    expect(fit.uncertainty.weighting).toBe("relative");
    expect(fit.uncertainty.statement).toContain("Weights are relative");
  });

  it("refuse relative weights and known standard deviations on the same well", () => {
    expect(() =>
      fitModel({ model: theisModel, wells: [{ name: "OB", geometry, t, s: theisExact, weights: new Float64Array(30).fill(1), sigma: new Float64Array(30).fill(0.01) }] }),
    ).toThrow(/both weights \(relative\) and sigma/);
  });
});

describe("intervals for correlated residuals", () => {
  it("switch to the AR(1)-corrected interval when the Durbin-Watson test rejects independence, and say so", () => {
    const fit = fitModel({ model: theisModel, wells: [{ name: "OB", geometry, t, s: noisy(21, 0.01, 0.8) }] });
    expect(fit.diagnostics.independent).toBe(false);
    expect(fit.uncertainty.residuals).toBe("ar1");
    for (const p of fit.parameters) {
      expect(p.ci95Method).toMatch(/^ar1-corrected/);
      // Never narrower than the linearised interval.
      expect(p.ci95![0]).toBeLessThanOrEqual(p.intervals.linearised![0]);
      expect(p.ci95![1]).toBeGreaterThanOrEqual(p.intervals.linearised![1]);
    }
    expect(fit.uncertainty.statement).toContain("AR(1)-corrected (because the residuals are serially correlated)");
  });

  it("keep the linearised interval with independent noise, and on request even with correlated noise", () => {
    const independent = fitModel({ model: theisModel, wells: [{ name: "OB", geometry, t, s: noisy(8, 0.01) }] });
    expect(independent.diagnostics.independent).toBe(true);
    expect(independent.parameters.map((p) => p.ci95Method)).toEqual(["linearised", "linearised"]);
    const forced = fitModel({ model: theisModel, wells: [{ name: "OB", geometry, t, s: noisy(21, 0.01, 0.8) }], correlation: "independent" });
    expect(forced.parameters.map((p) => p.ci95Method)).toEqual(["linearised", "linearised"]);
    expect(forced.uncertainty.statement).toContain("as asked");
  });
});

describe("profile-likelihood intervals", () => {
  /** A model linear in its parameters, s = a + b ln t: the profile interval must equal the linearised one. */
  const line: DrawdownModel = {
    id: "line",
    name: "straight line in ln t",
    source: "test",
    assumptions: [],
    validity: [],
    cautions: [],
    parameters: [
      { name: "a", label: "a", unit: "m", positive: false, bounds: [-100, 100], description: "" },
      { name: "b", label: "b", unit: "m", positive: false, bounds: [-100, 100], description: "" },
    ],
    drawdown: (p, _g, times, out) => {
      const r = out ?? new Float64Array(times.length);
      for (let i = 0; i < times.length; i++) r[i] = p[0]! + p[1]! * Math.log(times[i]!);
      return r;
    },
  };

  it("equal the linearised interval for a model linear in its parameters (where the likelihood is exactly quadratic), to 1e-6", () => {
    const s = Float64Array.from(t, (v, i) => 0.4 + 0.1 * Math.log(v) + 0.01 * Math.sin(3 * i));
    const fit = fitModel({ model: line, wells: [{ name: "L", geometry, t, s }], profile: "always", correlation: "independent", start: { a: 0, b: 0 } });
    for (const p of fit.parameters) {
      expect(p.ci95Method).toBe("profile");
      const [lo, hi] = p.intervals.linearised!;
      const [plo, phi] = p.intervals.profile!;
      expect(Math.abs(plo - lo) / (hi - lo)).toBeLessThan(1e-6);
      expect(Math.abs(phi - hi) / (hi - lo)).toBeLessThan(1e-6);
    }
  });

  it("end where the sum of squares with the parameter held there reaches SSR_min + s^2 t^2 (checked by direct evaluation)", () => {
    const s = noisy(9, 0.01);
    const fit = fitModel({ model: theisModel, wells: [{ name: "OB", geometry, t, s }], fixed: { T: 250 }, profile: "always", correlation: "independent" });
    const S = fit.parameters[1]!;
    const ssrAt = (value: number) => theisModel.drawdown([250, value], geometry, t).reduce((sum, v, i) => sum + (v - s[i]!) ** 2, 0);
    const s2 = fit.ssr / fit.dof;
    const level = fit.tQuantile ** 2;
    for (const end of S.intervals.profile!) expect(Math.abs((ssrAt(end) - fit.ssr) / s2 - level)).toBeLessThan(2e-3 * level);
  });

  it("run to the bound and say the data do not bound B when Hantush-Jacob is fitted to Theis data", () => {
    const fit = fitModel({ model: hantushJacobModel, wells: [{ name: "OB", geometry, t, s: noisy(8, 0.01) }] });
    const B = fit.parameters[2]!;
    if (B.atBound) {
      expect(fit.errors.some((e) => e.startsWith("B = ") && e.includes("bound"))).toBe(true);
    } else {
      expect(B.ci95Method).toBe("profile");
      expect(B.profileOpen).toBe("upper");
      expect(B.ci95![1]).toBeCloseTo(1e6, 0);
      expect(fit.warnings.some((w) => w.startsWith("The data do not bound B from above"))).toBe(true);
    }
  });
});

describe("poor data are errors, never a converged fit with arbitrary values", () => {
  it("all-zero drawdowns", () => {
    const fit = fitModel({ model: theisModel, wells: [{ name: "Z", geometry, t, s: new Float64Array(30) }] });
    expect(fit.converged).toBe(false);
    expect(fit.errors[0]).toContain('Well "Z": all 30 drawdowns are 0');
  });

  it("drawdowns of the wrong sign for the pumping rate (water levels passed as drawdowns)", () => {
    const fit = fitModel({ model: theisModel, wells: [{ name: "W", geometry, t, s: theisExact.map((v) => -v) }] });
    expect(fit.converged).toBe(false);
    expect(fit.errors[0]).toContain("opposite sign to the pumping rate");
  });

  it("a record with no trend in time", () => {
    const flat = Float64Array.from(t, (_, i) => 0.5 + 0.01 * Math.sin(2.1 * i));
    const fit = fitModel({ model: theisModel, wells: [{ name: "F", geometry, t, s: flat }] });
    expect(fit.converged).toBe(false);
    expect(fit.errors.some((e) => e.startsWith("No trend in time"))).toBe(true);
  });

  it("parameters that the data cannot separate (readings bunched at one time)", () => {
    // Five readings within 0.4 % of 1 d: they fix one combination of T and S, not both.
    const bunched = Float64Array.from({ length: 5 }, (_, i) => 1 + 0.001 * i);
    const s = theisModel.drawdown([250, 2e-4], geometry, bunched).map((v, i) => v + 0.002 * (i % 2 ? 1 : -1));
    const fit = fitModel({ model: theisModel, wells: [{ name: "E", geometry, t: bunched, s }] });
    expect(fit.converged).toBe(false);
    expect(fit.errors.length).toBeGreaterThan(0);
  });
});

describe("Cooper-Jacob validity enforced in fits", () => {
  // Noise-free Theis data with u from 0.26 down to 9e-5: the early readings violate u <= 0.01.
  it("leaves out the readings with u > 0.01 and refits, recovering T within 0.5 % and S within 2 %", () => {
    const fit = fitModel({ model: cooperJacobModel, wells: [{ name: "OB", geometry, t, s: theisExact }] });
    expect(fit.excluded.length).toBeGreaterThan(0);
    for (const e of fit.excluded) expect(e.u).toBeGreaterThan(0.01);
    expect(fit.n).toBe(30 - fit.excluded.length);
    expect(relative(fit.parameters[0]!.estimate, 250)).toBeLessThan(0.005);
    expect(relative(fit.parameters[1]!.estimate, 2e-4)).toBeLessThan(0.02);
    // Every used reading satisfies the limit under the final estimates.
    const [T, S] = fit.parameters.map((p) => p.estimate);
    for (const ti of fit.residuals[0]!.t) expect((geometry.r ** 2 * S!) / (4 * T! * ti)).toBeLessThanOrEqual(0.01);
  });

  it("with outside: \"warn\" keeps every reading, is biased (S more than 5 % off) and says why", () => {
    const fit = fitModel({ model: cooperJacobModel, wells: [{ name: "OB", geometry, t, s: theisExact }], cooperJacob: { outside: "warn" } });
    expect(fit.n).toBe(30);
    expect(relative(fit.parameters[1]!.estimate, 2e-4)).toBeGreaterThan(0.05);
    expect(fit.warnings.some((w) => w.includes("above 0.01") && w.includes("Cooper-Jacob"))).toBe(true);
  });

  it("accepts the looser limit u <= 0.05", () => {
    const strict = fitModel({ model: cooperJacobModel, wells: [{ name: "OB", geometry, t, s: theisExact }] });
    const loose = fitModel({ model: cooperJacobModel, wells: [{ name: "OB", geometry, t, s: theisExact }], cooperJacob: { uMax: 0.05 } });
    expect(loose.n).toBeGreaterThan(strict.n);
    for (const e of loose.excluded) expect(e.u).toBeGreaterThan(0.05);
  });
});

describe("Neuman: S < Sy and starting values the right way round", () => {
  const model = neumanModel(20);
  const tn = Float64Array.from({ length: 20 }, (_, i) => Math.pow(10, -4 + (i * 6) / 19));
  const sn = model.drawdown([250, 1e-4, 0.1, 0.3], geometry, tn);

  it("starts S from the early and Sy from the late readings (S < Sy), and recovers the generating values from noise-free data", () => {
    const fit = fitModel({ model, wells: [{ name: "N", geometry, t: tn, s: sn }] });
    expect(fit.start.values.S!).toBeLessThan(fit.start.values.Sy!);
    expect(fit.start.values.Sy! / 0.1).toBeGreaterThan(0.5);
    const truth = [250, 1e-4, 0.1, 0.3];
    fit.parameters.forEach((p, k) => expect(relative(p.estimate, truth[k]!)).toBeLessThan(1e-4));
    expect(fit.converged).toBe(true);
  });

  it("never returns S >= Sy, reports the constraint as an error when the data do not separate them, and refuses start values that break the order", () => {
    // Theis data with S = 0.05: no delayed yield to separate S from Sy. Kz/Kr bounded to [1e-3, 10] to keep the
    // series short (its cost grows like 1/sqrt(beta)).
    const short = tn.filter((_, i) => i % 3 === 0);
    const theisLike = theisModel.drawdown([250, 0.05], geometry, short);
    const fit = fitModel({
      model,
      wells: [{ name: "N", geometry, t: short, s: theisLike }],
      bounds: { KzKr: [1e-3, 10] },
      start: { T: 200, S: 0.01, Sy: 0.04, KzKr: 0.5 },
      profile: "never",
    });
    expect(fit.parameters[1]!.estimate).toBeLessThan(fit.parameters[2]!.estimate);
    expect(fit.converged).toBe(false);
    expect(fit.errors.length).toBeGreaterThan(0);
    expect(() => fitModel({ model, wells: [{ name: "N", geometry, t: tn, s: sn }], start: { T: 250, S: 0.09, Sy: 0.05, KzKr: 0.3 } })).toThrow(/needs S < Sy/);
  });
});

describe("Papadopulos-Cooper fits flag pumped-well readings inside the well-bore storage time", () => {
  it("counts the readings before the time at which casing storage stops holding the drawdown 1 % below Theis", () => {
    const model = papadopulosCooperModel({ rc: 0.1, rw: 0.1 });
    const tw = Float64Array.from({ length: 30 }, (_, i) => Math.pow(10, -5 + (i * 4) / 29));
    const s = model.drawdown([50, 1e-3], { r: 0.1, Q: 500 }, tw);
    const fit = fitModel({ model, wells: [{ name: "PW", geometry: { r: 0.1, Q: 500 }, t: tw, s }] });
    const warning = fit.warnings.find((w) => w.includes("well-bore") || w.includes("casing storage"));
    expect(warning).toBeDefined();
    expect(warning).toContain("rc^2/T");
  });
});

describe("forecast bands", () => {
  const fit = fitModel({ model: theisModel, wells: [{ name: "OB", geometry, t, s: noisy(8, 0.01) }] });
  const base = { model: theisModel, schedule: [{ name: "PW", x: 0, y: 0, steps: [{ start: 0, rate: 864 }] }], points: [{ name: "P", r: 100 }], times: [1, 10, 30] };

  it("use the Student t quantile of the fit's degrees of freedom for the confidence band, not the normal 1.645", () => {
    const result = forecastDrawdown({ ...base, fit, uncertainty: "linear" });
    const point = result.points[0]!;
    const q = studentTQuantile(0.95, fit.uncertainty.dof);
    expect(q).toBeGreaterThan(1.6449);
    point.drawdown.forEach((s, m) => expect(relative(point.p95![m]! - s, q * point.standardDeviation![m]!)).toBeLessThan(1e-12));
    expect(result.dof).toBe(fit.uncertainty.dof);
  });

  it("add a prediction band of one reading, wider by the residual scatter, and label what each band covers", () => {
    const result = forecastDrawdown({ ...base, fit, uncertainty: "linear" });
    const point = result.points[0]!;
    const q = studentTQuantile(0.95, fit.uncertainty.dof);
    point.drawdown.forEach((s, m) => {
      const sd = point.standardDeviation![m]!;
      expect(relative(point.prediction95![m]! - s, q * Math.sqrt(sd * sd + fit.uncertainty.scatter ** 2))).toBeLessThan(1e-12);
      expect(point.prediction05![m]!).toBeLessThan(point.p05![m]!);
    });
    expect(result.bands!.confidence).toContain("uncertainty of the fitted parameters");
    expect(result.bands!.prediction).toContain("single reading");
    expect(result.bands!.notCovered).toContain("choice of model");
  });

  it("use normal quantiles and give no prediction band for parameters given without degrees of freedom or scatter", () => {
    const result = forecastDrawdown({ ...base, parameters: { T: 250, S: 2e-4 }, covariance: { names: ["T", "S"], matrix: [[25, 0], [0, 1e-10]] }, uncertainty: "linear" });
    const point = result.points[0]!;
    point.drawdown.forEach((s, m) => expect(relative(point.p95![m]! - s, 1.6448536269514722 * point.standardDeviation![m]!)).toBeLessThan(1e-12));
    expect(point.prediction95).toBeNull();
  });
});

describe("compareModels with correlated residuals", () => {
  it("marks the ranking unreliable and says why when a fit's residuals are serially correlated", () => {
    const s = noisy(21, 0.01, 0.8);
    const wells = [{ name: "OB", geometry, t, s }];
    const fits = [fitModel({ model: theisModel, wells }), fitModel({ model: hantushJacobModel, wells })];
    const comparison = compareModels(fits);
    expect(comparison.rankingReliable).toBe(false);
    expect(comparison.notes.some((n) => n.startsWith("The ranking is unreliable") && n.includes("overstate the evidence"))).toBe(true);
  });

  it("keeps the ranking reliable for independent residuals", () => {
    const wells = [{ name: "OB", geometry, t, s: noisy(8, 0.01) }];
    const fits = [fitModel({ model: theisModel, wells }), fitModel({ model: hantushJacobModel, wells })];
    expect(fits.every((f) => f.diagnostics.independent)).toBe(true);
    expect(compareModels(fits).rankingReliable).toBe(true);
  });
});
