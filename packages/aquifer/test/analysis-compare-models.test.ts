import { describe, it, expect } from "vitest";
import { createObservationSeries } from "../src/data/index.js";
import { getModel } from "../src/models/index.js";
import { AnalysisInputError, akaikeWeights, compareModels, fitSeries, type ComparableFit } from "../src/analysis/index.js";

/** A fit-like record with invented criteria, on one shared invented set of observations. */
function invented(modelId: string, p: number, aic: number, bic: number, aicc: number | null, rmse: number): ComparableFit {
  return { modelId, n: 30, p, aic, bic, aicc, rmse, converged: true, residuals: [{ name: "OB", observed: [0.1, 0.2, 0.3] }] };
}

describe("Akaike weights", () => {
  it("match w_i = exp(-Δ_i/2) / Σ exp(-Δ_j/2) worked by hand (Burnham and Anderson 2002, section 2.9)", () => {
    // AIC = 100, 102, 110: Δ = 0, 2, 10; exp(-Δ/2) = 1, e^-1 = 0.36787944117144233, e^-5 = 0.006737946999085467;
    // sum 1.3746173881705277; weights 0.7274751568004648, 0.2676231541498624, 0.004901689049672921
    // (arithmetic by hand, digits checked with /usr/bin/python3 math.exp).
    const { delta, weight } = akaikeWeights([102, 100, 110]);
    expect(Array.from(delta)).toEqual([2, 0, 10]);
    expect(weight[1]).toBeCloseTo(0.7274751568004648, 15);
    expect(weight[0]).toBeCloseTo(0.2676231541498624, 15);
    expect(weight[2]).toBeCloseTo(0.004901689049672921, 15);
    expect(weight.reduce((a, b) => a + b, 0)).toBeCloseTo(1, 15);
  });

  it("refuse a non-finite criterion", () => {
    expect(() => akaikeWeights([1, Number.NaN])).toThrow(/value 1 is NaN/);
  });
});

describe("compareModels", () => {
  const fits = [invented("theis", 2, 102, 105, 102.9, 0.03), invented("hantush-jacob", 3, 100, 104.2, 101.6, 0.0254), invented("cooper-jacob", 2, 110, 112.8, 110.9, 0.05)];

  it("ranks by AIC with ΔAIC, Akaike weights, BIC and AICc weights and RMSE in the chosen unit", () => {
    const table = compareModels(fits, { lengthUnit: "ft" });
    expect(table.rows.map((r) => r.modelId)).toEqual(["hantush-jacob", "theis", "cooper-jacob"]);
    expect(table.rows.map((r) => r.rank)).toEqual([1, 2, 3]);
    expect(table.rows.map((r) => r.deltaAic)).toEqual([0, 2, 10]);
    expect(table.rows[0]!.akaikeWeight).toBeCloseTo(0.7274751568004648, 15);
    expect(table.rows[1]!.akaikeWeight).toBeCloseTo(0.2676231541498624, 15);
    // BIC 104.2, 105, 112.8: Δ = 0, 0.8, 8.6 (by hand).
    expect(table.rows[1]!.deltaBic).toBeCloseTo(0.8, 12);
    expect(table.rows[2]!.deltaBic).toBeCloseTo(8.6, 12);
    // AICc 101.6, 102.9: Δ = 1.3 (by hand).
    expect(table.rows[1]!.deltaAicc).toBeCloseTo(1.3, 12);
    expect(table.rows[0]!.k).toBe(4);
    // 0.0254 m = 1/12 ft (1 ft = 0.3048 m exactly, NIST SP 811).
    expect(table.rows[0]!.rmse).toBeCloseTo(0.0254 / 0.3048, 15);
    expect(table.lengthUnit).toBe("ft");
    expect(table.caution).toMatch(/statistical evidence.*not a verdict on the conceptual model/);
    expect(table.notes.join(" ")).toMatch(/theis is within ΔAIC ≤ 2 of the best/);
  });

  it("leaves AICc out when one fit has none, and says why", () => {
    const table = compareModels([fits[0]!, { ...fits[1]!, aicc: null }]);
    expect(table.rows.every((r) => r.aicc === null || r.deltaAicc === null)).toBe(true);
    expect(table.rows[0]!.aiccWeight).toBeNull();
    expect(table.notes.join(" ")).toMatch(/AICc is left out/);
  });

  it("refuses fits to different data", () => {
    const other = { ...fits[0]!, residuals: [{ name: "OB", observed: [0.1, 0.2, 0.31] }] };
    expect(() => compareModels([fits[1]!, other])).toThrow(AnalysisInputError);
    expect(() => compareModels([fits[1]!, { ...fits[0]!, n: 29 }])).toThrow(/used 29 points .* used 30/);
  });

  it("prefers Hantush-Jacob over Theis on a record generated with leakage", () => {
    // Invented record: T = 300 m2/d, S = 2e-4, B = 400 m, r = 60 m, Q = 1000 m3/d, with a ripple of 3 mm.
    const t = Array.from({ length: 30 }, (_, i) => 1e-3 * Math.pow(10, (i * 3.5) / 29));
    const leaky = getModel("hantush-jacob").drawdown([300, 2e-4, 400], { r: 60, Q: 1000 }, t);
    const series = createObservationSeries({
      name: "OB-LEAK",
      times: t,
      drawdowns: Array.from(leaky, (s, i) => s + 0.003 * Math.sin(2.1 * i)),
      timeUnit: "d",
      lengthUnit: "m",
      radius: { value: 60, unit: "m" },
      pumpingRate: { value: 1000, unit: "m3/d" },
    });
    const theis = fitSeries({ model: "theis", series: [series] });
    const hj = fitSeries({ model: "hantush-jacob", series: [series] });
    const table = compareModels([theis, hj]);
    expect(table.rows[0]!.modelId).toBe("hantush-jacob");
    const { weight } = akaikeWeights([theis.aic, hj.aic]);
    expect(table.rows[0]!.akaikeWeight).toBe(weight[1]);
    expect(table.rows[1]!.deltaAic).toBe(theis.aic - hj.aic);
  });
});
