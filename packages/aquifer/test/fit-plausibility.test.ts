/**
 * Plausibility notes on fits: estimates outside the ranges the trade usually meets, and drawdown beyond the
 * saturated thickness, are stated; ordinary fits get none. Ranges are common practice, no source.
 */
import { describe, expect, it } from "vitest";
import { fitModel, forecastAt, getModel, plausibilityNotes, theisModel } from "../src/index.js";

const t = Array.from({ length: 25 }, (_, i) => 1e-3 * Math.pow(10, (3 * i) / 24));

describe("plausibility notes", () => {
  it("gives an ordinary confined fit no note", () => {
    const s = theisModel.drawdown([250, 2e-4], { r: 30, Q: 900 }, t);
    const fit = fitModel({ model: theisModel, wells: [{ name: "OB", geometry: { r: 30, Q: 900 }, t, s }] });
    expect(fit.plausibility).toEqual([]);
  });

  it("notes a storativity that looks like a specific yield, naming the unit check", () => {
    // Late data of a water-table aquifer (storage from drainage, 0.05) fitted as a confined one.
    const s = theisModel.drawdown([250, 0.05], { r: 30, Q: 900 }, t);
    const fit = fitModel({ model: theisModel, wells: [{ name: "OB", geometry: { r: 30, Q: 900 }, t, s }] });
    expect(fit.parameters[1]!.estimate).toBeGreaterThan(5e-3);
    expect(fit.plausibility).toHaveLength(1);
    expect(fit.plausibility[0]).toMatch(/^Plausibility: S = 0\.05 is outside the storativities of confined aquifers usually met, 0\.00001 to 0\.005 \(common practice, no source\): this may be a value more like a specific yield/);
    expect(fit.plausibility[0]).toContain("check the units of the rate, the distance and the drawdown");
  });

  it("notes a transmissivity far above what aquifers usually have", () => {
    const notes = plausibilityNotes(theisModel, { T: 5e5, S: 1e-4 }, 0.5);
    expect(notes).toEqual([expect.stringMatching(/^Plausibility: T = 500000 m2\/d is outside the transmissivities of aquifers worth testing usually met, 1 to 20000 m2\/d/)]);
  });

  it("notes drawdown larger than the saturated thickness of a Neuman aquifer, in the fit and in a forecast", () => {
    const model = getModel({ id: "neuman", saturatedThickness: 5 });
    expect(plausibilityNotes(model, { T: 100, S: 1e-3, Sy: 0.1, KzKr: 0.1 }, 6.2)).toEqual([
      "Plausibility: the largest drawdown, 6.2 m, exceeds the saturated thickness 5 m: the aquifer cannot be drawn down further than its thickness; check the thickness, the drawdown units and the static level.",
    ]);
    const fit = { modelId: "neuman", modelSpec: model.spec!, parameters: [{ name: "T", estimate: 20 }, { name: "S", estimate: 1e-3 }, { name: "Sy", estimate: 0.1 }, { name: "KzKr", estimate: 0.1 }], freeParameters: [], covariance: [] };
    const forecast = forecastAt({ fit, points: [{ name: "PW", distance: { value: 0.2, unit: "m" } }], times: { values: [30], unit: "d" }, rate: { value: 500, unit: "m3/d" }, lengthUnit: "m" });
    expect(forecast.points[0]!.drawdown[0]).toBeGreaterThan(5);
    expect(forecast.notes.some((n) => n.startsWith("Plausibility: the forecast drawdown reaches"))).toBe(true);
  });
});
