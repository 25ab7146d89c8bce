import { describe, expect, it } from "vitest";
import { coverageStudy } from "../../../tests/support/coverage-study.js";

// Coverage of the stated 95 % intervals by simulation (invented records, seeded noise; see
// tests/support/coverage-study.ts). With N records the Monte Carlo standard error of a coverage near 95 % is
// sqrt(0.95 0.05 / N): 0.69 % at N = 1000, 1.26 % at N = 300. `npm run bench` runs larger studies.
// The targets: 93-97 % with independent noise, at least 90 % with AR(1) noise (rho = 0.8) under the default
// "auto" treatment, which must detect the correlation and correct for it.

describe("coverage of the 95 % intervals of fitModel", () => {
  it("Theis, independent noise, 1000 records: the intervals shown cover T and S 93-97 % of the time", () => {
    const result = coverageStudy({ model: "theis", phi: 0, records: 1000, seed: 101 });
    for (const c of result.shown) {
      expect(c).toBeGreaterThanOrEqual(0.93);
      expect(c).toBeLessThanOrEqual(0.97);
    }
    // About 5 % of independent records are flagged by the 5 % Durbin-Watson test.
    expect(result.ar1Chosen).toBeLessThan(0.1);
  });

  it("Theis, AR(1) noise with rho = 0.8, 300 records: the linearised intervals cover only about half; the ones shown at least 90 %", () => {
    const result = coverageStudy({ model: "theis", phi: 0.8, records: 300, seed: 202 });
    for (const c of result.linearised) expect(c).toBeLessThan(0.65);
    for (const c of result.shown) expect(c).toBeGreaterThanOrEqual(0.9);
    expect(result.ar1Chosen).toBeGreaterThan(0.9);
  });

  it("Hantush-Jacob, independent noise, 300 records: T, S and B covered 93-97 % of the time", () => {
    const result = coverageStudy({ model: "hantush-jacob", phi: 0, records: 300, seed: 303 });
    for (const c of result.shown) {
      expect(c).toBeGreaterThanOrEqual(0.93);
      expect(c).toBeLessThanOrEqual(0.97);
    }
  });

  it("Hantush-Jacob, AR(1) noise with rho = 0.8, 300 records: the intervals shown cover T, S and B at least 90 % of the time", () => {
    const result = coverageStudy({ model: "hantush-jacob", phi: 0.8, records: 300, seed: 404 });
    for (const c of result.linearised) expect(c).toBeLessThan(0.75);
    for (const c of result.shown) expect(c).toBeGreaterThanOrEqual(0.9);
  });
});
