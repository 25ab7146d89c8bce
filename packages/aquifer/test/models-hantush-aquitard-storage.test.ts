import { readFileSync } from "node:fs";
import { describe, it, expect } from "vitest";
import {
  hantushAquitardStorageModel,
  hantushStorageDimensionless,
  hantushStorageTypeCurves,
} from "../src/models/hantush-aquitard-storage.js";
import { hantushJacobModel } from "../src/models/hantush-jacob.js";
import { hantushW } from "../src/wells/index.js";
import { fitModel } from "../src/fit/index.js";

interface Point { rB: number; ratio: number; tD: number; sD: number }
const fixture = JSON.parse(
  readFileSync(new URL("../../../tests/fixtures/laplace-models/laplace_models.json", import.meta.url), "utf8"),
) as { hantushStorage: Point[] };

describe("hantushStorageDimensionless", () => {
  it("agrees with mpmath de Hoog inversion of the same transform within 1e-4 relative for t_D >= 1", () => {
    // Fixture: generate_laplace_models.py (mpmath invertlaplace, method "dehoog", 20 digits).
    let worst = 0;
    for (const q of fixture.hantushStorage.filter((x) => x.tD >= 1)) {
      worst = Math.max(worst, Math.abs(hantushStorageDimensionless(q.tD, q.rB, q.ratio) / q.sD - 1));
    }
    expect(worst, `max relative difference ${worst.toExponential(2)}`).toBeLessThan(1e-4);
  });

  it("agrees with mpmath within 2e-3 relative at t_D = 0.1 (u = 2.5), where Stehfest is weakest", () => {
    for (const q of fixture.hantushStorage.filter((x) => x.tD < 1)) {
      expect(Math.abs(hantushStorageDimensionless(q.tD, q.rB, q.ratio) / q.sD - 1)).toBeLessThan(2e-3);
    }
  });

  it("reduces to Hantush-Jacob W(u, r/B) without aquitard storage: 1e-5 relative for t_D >= 1", () => {
    // Identity limit S' -> 0 (Hantush 1960); reference: the library's hantushW (Hantush and Jacob 1955).
    for (const rho of [0.05, 0.3, 1]) {
      for (const tD of [1, 10, 100]) {
        expect(Math.abs(hantushStorageDimensionless(tD, rho, 0) / hantushW(1 / (4 * tD), rho) - 1)).toBeLessThan(2e-5);
      }
    }
  });

  it("gives more early drawdown deficit as S'/S grows (aquitard storage feeds the aquifer)", () => {
    const family = hantushStorageTypeCurves([1, 10], 0, [0.3]);
    const stored = hantushStorageTypeCurves([1, 10], 10, [0.3]);
    expect(stored.curves[0]!.sD[0]!).toBeLessThan(family.curves[0]!.sD[0]!);
  });
});

describe("hantushAquitardStorageModel", () => {
  const truth = [300, 1e-4, 200, 1e-3];
  const geometry = { r: 30, Q: 600 };

  it("matches hantushJacobModel within 1e-5 relative for t >= 0.05 d when S' is tiny", () => {
    const t = [0.05, 0.5, 5];
    const a = hantushAquitardStorageModel.drawdown([300, 1e-4, 200, 1e-12], geometry, t);
    const b = hantushJacobModel.drawdown([300, 1e-4, 200], geometry, t);
    t.forEach((_, i) => expect(Math.abs(a[i]! / b[i]! - 1)).toBeLessThan(1e-5));
  });

  it("has a Jacobian matching central differences within 1e-2 of each column's largest value", () => {
    const t = [0.001, 0.01, 0.1, 1, 5];
    const J = hantushAquitardStorageModel.jacobian!(truth, geometry, t);
    truth.forEach((pk, k) => {
      const up = truth.slice();
      const down = truth.slice();
      up[k] = pk * (1 + 1e-5);
      down[k] = pk * (1 - 1e-5);
      const a = hantushAquitardStorageModel.drawdown(up, geometry, t);
      const b = hantushAquitardStorageModel.drawdown(down, geometry, t);
      const fd = t.map((_, i) => (a[i]! - b[i]!) / (2e-5 * pk));
      const scale = Math.max(...fd.map(Math.abs));
      fd.forEach((v, i) => expect(Math.abs(J[k]![i]! - v) / scale, `parameter ${k}, t ${t[i]}`).toBeLessThan(1e-2));
    });
  });

  it("returns T, S, B and S' from noise-free synthetic data through fitModel within 1e-5 relative", () => {
    const t = Array.from({ length: 200 }, (_, i) => 1e-3 * Math.pow(10, (4 * i) / 199));
    const s = hantushAquitardStorageModel.drawdown(truth, geometry, t);
    const fit = fitModel({
      model: hantushAquitardStorageModel,
      wells: [{ name: "OB-2", geometry, t, s }],
      start: { T: 200, S: 2e-4, B: 300, Sa: 3e-4 },
    });
    fit.parameters.forEach((q, k) => expect(Math.abs(q.estimate / truth[k]! - 1), q.name).toBeLessThan(1e-5));
  });
});
