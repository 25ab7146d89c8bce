import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { papadopulosCooperModel } from "../src/models/papadopulos-cooper.js";
import { wellboreStorageTime } from "../src/models/wellbore-storage-time.js";

// Reference: tests/fixtures/wellbore/generate_storage_time.py, mpmath.invertlaplace (Talbot, 30 digits, checked
// against de Hoog) of the Papadopulos-Cooper pumped-well transform, against Theis at r = rw plus Q Sk/(2 pi T);
// times where the gap falls to each level by mpmath.findroot. T = 1, Q = 1, rc = rw = 1, S = alpha.
interface Case {
  alpha: number;
  skin: number;
  gaps: { t: number; gap: number; drawdown: number }[];
  levelTimes: { gap: number; time: number }[];
}
const cases = (
  JSON.parse(readFileSync(new URL("../../../tests/fixtures/wellbore/storage_time.json", import.meta.url), "utf8")) as {
    cases: Case[];
  }
).cases;

const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);

describe("wellboreStorageTime against mpmath", () => {
  it("reports the gap at 25 rc^2/T within 1e-4 of mpmath (1.9 % at alpha = 0.1 to 3.2 % at alpha = 1e-7)", () => {
    expect(cases.length).toBe(6);
    for (const c of cases) {
      const reference = c.gaps.find((g) => g.t === 25)!.gap;
      const { gapAtRuleOfThumb } = wellboreStorageTime(1, c.alpha, { rc: 1, rw: 1, skin: c.skin });
      expect(Math.abs(gapAtRuleOfThumb - reference), `alpha ${c.alpha}, skin ${c.skin}`).toBeLessThan(1e-4);
    }
    const noSkin = cases.filter((c) => c.skin === 0);
    const at25 = noSkin.map((c) => c.gaps.find((g) => g.t === 25)!.gap);
    expect(Math.min(...at25)).toBeCloseTo(0.0188, 4);
    expect(Math.max(...at25)).toBeCloseTo(0.0324, 4);
  });

  it("finds the time at which the gap falls to 5, 2, 1, 0.5 and 0.2 % within 1 % of the time mpmath finds", () => {
    for (const c of cases) {
      for (const level of c.levelTimes) {
        const found = wellboreStorageTime(1, c.alpha, { rc: 1, rw: 1, skin: c.skin }, level.gap);
        expect(rel(found.multipleOfRc2OverT, level.time), `alpha ${c.alpha}, skin ${c.skin}, gap ${level.gap}`).toBeLessThan(0.01);
        expect(found.time).toBeCloseTo(found.multipleOfRc2OverT, 12);
      }
    }
  });

  it("scales the time with rc^2/T: the same alpha with rc = 0.1 m and T = 50 m2/d gives the same multiple", () => {
    const c = cases.find((k) => k.alpha === 1e-3 && k.skin === 0)!;
    const rc = 0.1;
    const rw = 0.15;
    const T = 50;
    const S = (c.alpha * rc * rc) / (rw * rw);
    const found = wellboreStorageTime(T, S, { rc, rw });
    const oneCent = c.levelTimes.find((l) => l.gap === 0.01)!.time;
    expect(rel(found.multipleOfRc2OverT, oneCent)).toBeLessThan(0.01);
    expect(rel(found.time, (oneCent * rc * rc) / T)).toBeLessThan(0.01);
  });

  it("inverts the pumped-well transform within 1e-4 relative of mpmath with 12 Stehfest terms, 6e-6 with 16", () => {
    // Measured: at most 8.8e-5 with N = 12 (alpha = 1e-7, t = 25 rc^2/T, the bend between casing storage and
    // Theis), above the 5e-5 of the 46 points of wellbore.json; at most 5.1e-6 with N = 16.
    let worst12 = 0;
    let worst16 = 0;
    for (const c of cases) {
      const times = c.gaps.map((g) => g.t);
      const s12 = papadopulosCooperModel({ rc: 1, rw: 1, skin: c.skin }).drawdown([1, c.alpha], { r: 1, Q: 1 }, times);
      const s16 = papadopulosCooperModel({ rc: 1, rw: 1, skin: c.skin, stehfestTerms: 16 }).drawdown([1, c.alpha], { r: 1, Q: 1 }, times);
      c.gaps.forEach((g, i) => {
        worst12 = Math.max(worst12, rel(s12[i]!, g.drawdown));
        worst16 = Math.max(worst16, rel(s16[i]!, g.drawdown));
      });
    }
    expect(worst12).toBeLessThan(1e-4);
    expect(worst16).toBeLessThan(6e-6);
  });
});
