import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { fitAnisotropy } from "../src/analysis/index.js";
import { fitModel } from "../src/fit/index.js";
import { papadopulosAnisotropyModel, theisModel, transmissivityEllipse } from "../src/models/index.js";

const fixture = JSON.parse(readFileSync(new URL("../../../tests/fixtures/anisotropy/anisotropy.json", import.meta.url), "utf8")) as {
  truth: { Tmax: number; Tmin: number; theta: number; S: number; Q: number };
  noise: number;
  wells: { name: string; x: number; y: number; t: number[]; s: number[]; sNoisy: number[] }[];
};
const { truth } = fixture;
const p = [truth.Tmax, truth.Tmin, truth.theta, truth.S];
const wells = (key: "s" | "sNoisy") =>
  fixture.wells.map((w) => ({ name: w.name, geometry: { r: Math.hypot(w.x, w.y), Q: truth.Q, x: w.x, y: w.y }, t: w.t, s: w[key] }));

describe("Papadopulos (1965) horizontal anisotropy", () => {
  it("reproduces the scipy tensor form at three wells on different rays (1e-13 relative)", () => {
    // Reference: tests/fixtures/anisotropy/generate_anisotropy.py (numpy rotation, scipy exp1).
    for (const w of fixture.wells) {
      const s = papadopulosAnisotropyModel.drawdown(p, { r: Math.hypot(w.x, w.y), Q: truth.Q, x: w.x, y: w.y }, w.t);
      w.s.forEach((v, i) => expect(Math.abs(s[i]! / v - 1), `${w.name} t ${w.t[i]}`).toBeLessThan(1e-13));
    }
  });

  it("is Theis with T = Tmax = Tmin whatever the direction (identity)", () => {
    const s = papadopulosAnisotropyModel.drawdown([150, 150, 1.1, 2e-4], { r: 25, Q: 500, x: 15, y: -20 }, [0.01, 1]);
    const theis = theisModel.drawdown([150, 2e-4], { r: 25, Q: 500 }, [0.01, 1]);
    for (let i = 0; i < 2; i++) expect(Math.abs(s[i]! / theis[i]! - 1)).toBeLessThan(1e-14);
  });

  it("recovers Tmax, Tmin, theta and S from three noise-free wells from a start near the truth", () => {
    const clean = fitModel({ model: papadopulosAnisotropyModel, wells: wells("s"), start: { Tmax: 300, Tmin: 100, theta: 0.5, S: 3e-4 } });
    clean.parameters.forEach((q, k) => expect(Math.abs(q.estimate / p[k]! - 1), q.name).toBeLessThan(1e-6));
  });

  it("finds the direction from the data alone (multi-start) and brackets the truth on noisy records", () => {
    const clean = fitAnisotropy(wells("s"));
    expect(Math.abs(clean.Tmax.value / truth.Tmax - 1)).toBeLessThan(1e-6);
    expect(Math.abs(clean.Tmin.value / truth.Tmin - 1)).toBeLessThan(1e-6);
    expect(Math.abs(clean.directionDegrees.value - (truth.theta * 180) / Math.PI)).toBeLessThan(1e-4);
    const noisy = fitAnisotropy(wells("sNoisy"));
    expect(noisy.Tmax.ci95![0]).toBeLessThan(truth.Tmax);
    expect(noisy.Tmax.ci95![1]).toBeGreaterThan(truth.Tmax);
    expect(noisy.Tmin.ci95![0]).toBeLessThan(truth.Tmin);
    expect(noisy.Tmin.ci95![1]).toBeGreaterThan(truth.Tmin);
    expect(noisy.directionDegrees.ci95![0]).toBeLessThan((truth.theta * 180) / Math.PI);
    expect(noisy.directionDegrees.ci95![1]).toBeGreaterThan((truth.theta * 180) / Math.PI);
    expect(noisy.wells.map((w) => w.name)).toEqual(["OW-N", "OW-E", "OW-SW"]);
    expect(() => fitAnisotropy(wells("s").slice(0, 2))).toThrow(/at least three wells/);
  });

  it("draws the ellipse with radius sqrt(Tmax) along theta and sqrt(Tmin) across it", () => {
    const e = transmissivityEllipse(400, 90, 0.6, 5);
    expect(Math.hypot(e.x[0]!, e.y[0]!)).toBeCloseTo(20, 12);
    expect(Math.atan2(e.y[0]!, e.x[0]!)).toBeCloseTo(0.6, 12);
    expect(Math.hypot(e.x[1]!, e.y[1]!)).toBeCloseTo(Math.sqrt(90), 12);
  });

  it("asks for plan coordinates when an observation point has none", () => {
    expect(() => papadopulosAnisotropyModel.drawdown(p, { r: 10, Q: 100 }, [1])).toThrow(/plan coordinates x and y/);
  });
});
