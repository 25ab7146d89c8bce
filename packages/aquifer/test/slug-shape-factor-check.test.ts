import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { BOUWER_RICE_RATIO_RANGE, bouwerRiceLnReRw, hvorslevShapeFactor } from "../src/slug/index.js";

// Reference: tests/fixtures/slug/shape_factors.json from generate_shape_factors.py: an axisymmetric steady-state
// finite-difference solution (scipy.sparse) of each slug-test geometry, independent of the formulas checked here.
// Its grid error is below 1 % (two grid levels compared) and it reproduces exact radial flow to 0.3 %.
interface ShapeFixture {
  radialCheck: { fd: number; exact: number };
  hvorslev: { LeOverR: number; open: number; casing: number }[];
  slenderBody16: number;
  bouwerRice: { LeOverRw: number; LwOverRw: number; DOverRw: number; lnReRw: number }[];
}
const fixture = JSON.parse(readFileSync(new URL("../../../tests/fixtures/slug/shape_factors.json", import.meta.url), "utf8")) as ShapeFixture;

describe("Hvorslev's shape factor against a finite-difference solution of the intake", () => {
  it("the finite-difference solver itself reproduces radial flow exactly (0.3 %) and the slender-body limit (3 %)", () => {
    expect(Math.abs(fixture.radialCheck.fd / fixture.radialCheck.exact - 1)).toBeLessThan(3e-3);
    const long = fixture.hvorslev.find((r) => r.LeOverR === 16)!;
    // Slender-body capacitance of a cylinder, F = 2 pi L / (ln(L/R) + ln 2 - 1) (from memory).
    expect(Math.abs(long.open / fixture.slenderBody16 - 1)).toBeLessThan(0.03);
  });

  it("agrees within -12 % to +2 % with a cased intake over the accepted range Le/R >= 2, and overstates F below it", () => {
    for (const row of fixture.hvorslev) {
      const ratio = hvorslevShapeFactor(row.LeOverR, 1) / row.casing - 1;
      if (row.LeOverR >= 2) {
        expect(ratio).toBeGreaterThan(-0.125);
        expect(ratio).toBeLessThan(0.025);
      } else {
        // Le/R = 1: +19 %, 0.5: +40 %: the reason such intakes are refused.
        expect(ratio).toBeGreaterThan(0.15);
      }
    }
  });
});

describe("Bouwer & Rice's ln(Re/rw) curves (Van Rooy's fits) against a finite-difference solution of the slug-test geometry", () => {
  it("lie 2 to 30 % below the finite-difference ln(Re/rw) everywhere in the accepted range, closest for long screens", () => {
    const gaps: number[] = [];
    for (const row of fixture.bouwerRice) {
      expect(row.LeOverRw).toBeGreaterThanOrEqual(BOUWER_RICE_RATIO_RANGE[0]);
      expect(row.LeOverRw).toBeLessThanOrEqual(BOUWER_RICE_RATIO_RANGE[1]);
      const curve = bouwerRiceLnReRw(1, row.LeOverRw, row.LwOverRw, row.DOverRw).lnReRw;
      const gap = curve / row.lnReRw - 1;
      gaps.push(gap);
      expect(gap).toBeLessThan(-0.02);
      expect(gap).toBeGreaterThan(-0.3);
    }
    // Long screens (Le/rw = 1000) agree within 10 %.
    fixture.bouwerRice.forEach((row, i) => {
      if (row.LeOverRw === 1000) expect(gaps[i]!).toBeGreaterThan(-0.1);
    });
  });

  it("and the finite-difference ln(Re/rw) grows with the screen length as the curves do", () => {
    const series = fixture.bouwerRice.filter((r) => r.LwOverRw === 3 * r.LeOverRw && r.DOverRw === 2 * r.LwOverRw).sort((a, b) => a.LeOverRw - b.LeOverRw);
    for (let i = 1; i < series.length; i++) {
      expect(series[i]!.lnReRw).toBeGreaterThan(series[i - 1]!.lnReRw);
      const a = bouwerRiceLnReRw(1, series[i - 1]!.LeOverRw, series[i - 1]!.LwOverRw, series[i - 1]!.DOverRw).lnReRw;
      const b = bouwerRiceLnReRw(1, series[i]!.LeOverRw, series[i]!.LwOverRw, series[i]!.DOverRw).lnReRw;
      expect(b).toBeGreaterThan(a);
    }
  });
});
