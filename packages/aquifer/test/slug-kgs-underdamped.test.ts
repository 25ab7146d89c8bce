import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import {
  GRAVITY_M_PER_D2,
  cbpNormalizedHead,
  fitKgsSlugTest,
  fitUnderdampedSlugTest,
  kgsSlugModel,
  slugRecordChecks,
  underdampedNormalizedHead,
  underdampedSlugModel,
} from "../src/slug/index.js";

const fixture = JSON.parse(readFileSync(new URL("../../../tests/fixtures/slug/slug_models.json", import.meta.url), "utf8")) as {
  kgs: { thickness: number; screenTop: number; screenBottom: number; anisotropy: number; skin: number; T: number; S: number; rc: number; rw: number; t: number; h: number }[];
  oscillator: { CD: number; tD: number; w: number }[];
};

describe("the KGS slug model", () => {
  it("matches Talbot inversion of the brute-force scipy series (partial penetration, skin) within 2e-4 of H0", () => {
    // Reference: tests/fixtures/slug/generate_slug_models.py.
    for (const c of fixture.kgs) {
      const model = kgsSlugModel({ thickness: c.thickness, screenTop: c.screenTop, screenBottom: c.screenBottom, rc: c.rc, rw: c.rw, anisotropy: c.anisotropy, skin: c.skin });
      const h = model.drawdown([c.T, c.S], { r: c.rw, Q: 1 }, [c.t])[0]!;
      expect(Math.abs(h - c.h), `t ${c.t}, screen ${c.screenTop}-${c.screenBottom}`).toBeLessThan(2e-4);
    }
  });

  it("reduces to Cooper-Bredehoeft-Papadopulos (1967) for a full screen without skin (1e-4 of H0)", () => {
    // Reference: cbpNormalizedHead, the real-integral form (tested against mpmath in slug-cbp.test.ts).
    const rc = 0.03;
    const rw = 0.06;
    const T = 4;
    const S = 2e-5;
    const model = kgsSlugModel({ thickness: 10, screenTop: 0, screenBottom: 10, rc, rw, anisotropy: 1 });
    for (const t of [1e-5, 1e-4, 1e-3, 5e-3]) {
      const h = model.drawdown([T, S], { r: rw, Q: 1 }, [t])[0]!;
      expect(Math.abs(h - cbpNormalizedHead((rw * rw * S) / (rc * rc), (T * t) / (rc * rc))), `t ${t}`).toBeLessThan(1e-4);
    }
  });

  it("recovers Kr from a noise-free record of the model itself with the anisotropy fixed", () => {
    const geometry = { thickness: 12, screenTop: 4, screenBottom: 6, rc: 0.025, rw: 0.05, anisotropy: 0.2 };
    const model = kgsSlugModel(geometry);
    const t = Array.from({ length: 40 }, (_, i) => 1e-5 * Math.pow(600, i / 39));
    const h = model.drawdown([6, 3e-5], { r: 0.05, Q: 1 }, t);
    const result = fitKgsSlugTest(geometry, t, h, { fixed: { S: 3e-5 } });
    expect(Math.abs(result.Kr / 0.5 - 1)).toBeLessThan(1e-5);
  });
});

describe("the underdamped slug model", () => {
  it("matches scipy's numerical integration of the oscillator equation (1e-10)", () => {
    for (const c of fixture.oscillator) {
      expect(Math.abs(underdampedNormalizedHead(c.CD, c.tD) - c.w), `C_D ${c.CD}, t_D ${c.tD}`).toBeLessThan(1e-10);
    }
  });

  it("tends to the Bouwer-Rice line ln(H0/H) = 2 K Ls t / (rc^2 ln(Re/rw)) as the column length goes to 0", () => {
    const geometry = { rc: 0.05, screenLength: 1.5, lnReRw: 3.2 };
    const model = underdampedSlugModel(geometry);
    const K = 0.4;
    for (const t of [1e-4, 5e-4, 2e-3]) {
      const h = model.drawdown([K, 1e-4], { r: 1, Q: 1 }, [t])[0]!;
      const line = Math.exp((-2 * K * geometry.screenLength * t) / (geometry.rc * geometry.rc * geometry.lnReRw));
      expect(Math.abs(h / line - 1), `t ${t}`).toBeLessThan(1e-3);
    }
  });

  it("oscillates with the period 2 pi sqrt(Le / g) / sqrt(1 - C_D^2 / 4) and is recovered by the fit", () => {
    const geometry = { rc: 0.05, screenLength: 1.5, lnReRw: 3.2 };
    const model = underdampedSlugModel(geometry);
    const t = Array.from({ length: 120 }, (_, i) => (i + 1) * 0.05 / 86400);
    const h = model.drawdown([300, 6], { r: 1, Q: 1 }, t);
    expect(Math.min(...h)).toBeLessThan(0);
    const result = fitUnderdampedSlugTest(geometry, t, h, { start: { K: 100, Le: 4 } });
    expect(Math.abs(result.fit.parameters[0]!.estimate / 300 - 1)).toBeLessThan(1e-6);
    expect(Math.abs(result.fit.parameters[1]!.estimate / 6 - 1)).toBeLessThan(1e-6);
    expect(GRAVITY_M_PER_D2).toBeCloseTo(9.80665 * 86400 ** 2, 6);
  });
});

describe("slug record checks", () => {
  const record = (h: number[], H0: number) => ({ t: Float64Array.from([1e-6, 1e-5, 1e-4, 1e-3]), h: Float64Array.from(h), H0, index: Int32Array.from([0, 1, 2, 3]) });
  it("flags an initial displacement far from the expected one and repeat tests that disagree", () => {
    const checks = slugRecordChecks([
      { name: "A", record: record([1, 0.8, 0.4, 0.05], 0.5), expectedH0: 0.5 },
      { name: "B", record: record([0.7, 0.6, 0.3, 0.02], 0.3), expectedH0: 0.5 },
    ]);
    expect(checks.find((c) => c.test === "A" && c.kind === "initial-displacement")!.ok).toBe(true);
    expect(checks.find((c) => c.test === "B" && c.kind === "initial-displacement")!.message).toMatch(/differs from the expected/);
    expect(checks.find((c) => c.test === "B" && c.kind === "first-reading")!.ok).toBe(false);
    expect(checks.find((c) => c.kind === "repeat-agreement")!.message).toMatch(/differ by up to 0.300/);
  });
});
