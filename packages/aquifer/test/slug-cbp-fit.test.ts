import { describe, expect, it } from "vitest";
import { cbpNormalizedHead, cooperBredehoeftPapadopulosFit } from "../src/slug/index.js";
import { normalGenerator } from "../../../tests/support/seeded-noise.js";

// Invented well in a confined aquifer: casing radius 5 cm, screen radius 5 cm (alpha = S), T = 5 m2/d,
// S = 1e-4, aquifer 10 m thick; 24 readings log-spaced from 2 s to 1 h (beta = T t / rc^2 from 0.05 to 83).
const RC = 0.05;
const T = 5;
const S = 1e-4;
const TIMES_S = Array.from({ length: 24 }, (_, i) => 2 * Math.pow(1800, i / 23));

function record(noise?: () => number) {
  return {
    name: "PZ-3",
    times: TIMES_S,
    timeUnit: "s",
    displacements: TIMES_S.map(
      (t) => 0.5 * cbpNormalizedHead((RC * RC * S) / (RC * RC), (T * (t / 86400)) / (RC * RC)) + (noise ? noise() : 0),
    ),
    lengthUnit: "m",
    initialDisplacement: { value: 0.5, unit: "m" },
  };
}
const GEOMETRY = {
  casingRadius: { value: 5, unit: "cm" },
  wellRadius: { value: 0.05, unit: "m" },
  aquiferThickness: { value: 10, unit: "m" },
};

describe("fitting the Cooper-Bredehoeft-Papadopulos curve", () => {
  it("recovers T and S from a noise-free synthetic record, and K = T/b, Ss = S/b", () => {
    const r = cooperBredehoeftPapadopulosFit(record(), GEOMETRY);
    expect(Math.abs(r.T / T - 1)).toBeLessThan(1e-6);
    expect(Math.abs(r.S / S - 1)).toBeLessThan(1e-4);
    expect(r.K).toBeCloseTo(T / 10, 6);
    expect(r.specificStorage! / (S / 10)).toBeCloseTo(1, 3);
    expect(r.warnings[0]).toMatch(/S from a slug test is poorly determined/);
  });

  it("with seeded noise of 3 mm keeps T within its 95 % interval and shows S far less certain than T", () => {
    const r = cooperBredehoeftPapadopulosFit(record(((n) => () => 0.003 * n())(normalGenerator(11))), GEOMETRY);
    const [t, s] = r.parameters;
    expect(t!.ci95![0]).toBeLessThanOrEqual(T);
    expect(t!.ci95![1]).toBeGreaterThanOrEqual(T);
    expect(s!.ci95![0]).toBeLessThanOrEqual(S);
    expect(s!.ci95![1]).toBeGreaterThanOrEqual(S);
    // Interval widths in ln: S's is many times wider than T's, and ln T, ln S are strongly anti-correlated.
    const widthT = Math.log(t!.ci95![1] / t!.ci95![0]);
    const widthS = Math.log(s!.ci95![1] / s!.ci95![0]);
    expect(widthS).toBeGreaterThan(5 * widthT);
    expect(r.correlation!).toBeLessThan(-0.9);
  });

  it("fits T alone when S is held fixed", () => {
    const r = cooperBredehoeftPapadopulosFit(record(), GEOMETRY, { fixedS: S });
    expect(Math.abs(r.T / T - 1)).toBeLessThan(1e-8);
    expect(r.parameters[1]!.fixed).toBe(true);
  });
});
