import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { doughertyBabuModel, moenchDoublePorosityModel, papadopulosCooperModel } from "../src/models/index.js";

const fixture = JSON.parse(
  readFileSync(new URL("../../../tests/fixtures/double-porosity/double_porosity.json", import.meta.url), "utf8"),
) as { cases: { T: number; S: number; Sm: number; rate: number; sf: number; shape: "slab" | "sphere"; rw: number; rc: number; skin: number; Q: number; pumped: boolean; r: number; t: number; s: number }[] };

const times = [1e-4, 1e-3, 1e-2, 0.1, 1, 10];

describe("Moench (1984) double porosity", () => {
  it("matches mpmath Talbot inversion for slab and spherical blocks, with and without fracture skin (3e-4)", () => {
    // Reference: tests/fixtures/double-porosity (mpmath, 25 digits).
    let worst = 0;
    for (const c of fixture.cases) {
      const model = moenchDoublePorosityModel({ thickness: 30, screenTop: 0, screenBottom: 30, anisotropy: 1, rw: c.rw, rc: c.rc, skin: c.skin, blockShape: c.shape, fractureSkin: c.sf });
      const s = model.drawdown([c.T, c.S, c.Sm, c.rate], { r: c.pumped ? c.rw : c.r, Q: c.Q }, [c.t])[0]!;
      worst = Math.max(worst, Math.abs(s / c.s - 1));
    }
    expect(fixture.cases.length).toBe(40);
    expect(worst).toBeLessThan(3e-4);
  });

  it("follows the fractures alone for a slow block rate and S + Sm for a fast one (Papadopulos-Cooper limits)", () => {
    const well = { rc: 0.1, rw: 0.1, skin: 1 };
    const geometry = { thickness: 30, screenTop: 0, screenBottom: 30, anisotropy: 1, ...well };
    const model = moenchDoublePorosityModel(geometry);
    const slow = model.drawdown([80, 1e-5, 5e-4, 1e-14], { r: 20, Q: 300 }, times);
    const fast = model.drawdown([80, 1e-5, 5e-4, 1e9], { r: 20, Q: 300 }, times);
    const fractures = papadopulosCooperModel(well).drawdown([80, 1e-5], { r: 20, Q: 300 }, times);
    const total = papadopulosCooperModel(well).drawdown([80, 5.1e-4], { r: 20, Q: 300 }, times);
    for (let i = 1; i < times.length; i++) {
      expect(Math.abs(slow[i]! / fractures[i]! - 1), `slow, t ${times[i]}`).toBeLessThan(1e-4);
      expect(Math.abs(fast[i]! / total[i]! - 1), `fast, t ${times[i]}`).toBeLessThan(1e-3);
    }
  });

  it("carries the blocks into a partially penetrating well (slow blocks give Dougherty-Babu)", () => {
    const geometry = { thickness: 30, screenTop: 10, screenBottom: 16, anisotropy: 0.5, rw: 0.1, rc: 0.1, skin: 0 };
    const dp = moenchDoublePorosityModel(geometry).drawdown([80, 1e-5, 5e-4, 1e-14], { r: 0.1, Q: 300 }, times);
    const db = doughertyBabuModel(geometry).drawdown([80, 1e-5], { r: 0.1, Q: 300 }, times);
    for (let i = 0; i < times.length; i++) expect(Math.abs(dp[i]! / db[i]! - 1)).toBeLessThan(1e-4);
  });
});
