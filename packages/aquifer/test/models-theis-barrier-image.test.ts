import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { fitModel } from "../src/fit/index.js";
import { getModel } from "../src/models/registry.js";
import { barrierDistanceFromImage, theisBarrierImageModel } from "../src/models/theis-barrier-image.js";
import { theisModel } from "../src/models/theis.js";
import { centralDifferences, relDiff } from "./models-fixture.js";

interface Case {
  name: string;
  T: number;
  S: number;
  Q: number;
  x: number;
  y: number;
  distance: number;
  angle: number;
  r: number;
  ri: number;
  values: { t: number; s: number }[];
}

// Reference: mpmath e1 at 30 digits, positions to image distances in mpmath (tests/fixtures/barrier-image/generate_barrier_image.py).
const fixture = JSON.parse(readFileSync(new URL("../../../tests/fixtures/barrier-image/barrier_image.json", import.meta.url), "utf8")) as { cases: Case[] };

describe("Theis with one barrier image well", () => {
  it("is registered under its id with T, S and the image distance ri", () => {
    expect(getModel("theis-barrier-image")).toBe(theisBarrierImageModel);
    expect(theisBarrierImageModel.parameters.map((p) => `${p.name} ${p.unit}`)).toEqual(["T m2/d", "S 1", "ri m"]);
  });

  it("matches mpmath's sum of the real and image Theis drawdowns within 1e-13 relative", () => {
    expect(fixture.cases.length).toBe(4);
    for (const c of fixture.cases) {
      const s = theisBarrierImageModel.drawdown([c.T, c.S, c.ri], { r: c.r, Q: c.Q }, c.values.map((v) => v.t));
      c.values.forEach((v, i) => expect(relDiff(s[i]!, v.s), `${c.name}, t = ${v.t}`).toBeLessThan(1e-13));
    }
  });

  it("is the Theis drawdown at r plus the Theis drawdown at ri, and zero before pumping", () => {
    const g = { r: 40, Q: 800 };
    const t = [-1, 0, 1e-3, 0.1, 10];
    const s = theisBarrierImageModel.drawdown([300, 2e-4, 700], g, t);
    const a = theisModel.drawdown([300, 2e-4], g, t);
    const b = theisModel.drawdown([300, 2e-4], { r: 700, Q: 800 }, t);
    t.forEach((_, i) => expect(Math.abs(s[i]! - (a[i]! + b[i]!))).toBeLessThanOrEqual(4e-16 * Math.abs(s[i]!)));
    expect([s[0], s[1]]).toEqual([0, 0]);
  });

  it("doubles the late Cooper-Jacob slope: ds/dln t tends to 2 Q/(4 pi T)", () => {
    // Common practice, no source: a barrier's image adds a second Theis term whose late slope equals the first.
    const g = { r: 30, Q: 1000 };
    const [a, b] = theisBarrierImageModel.drawdown([500, 1e-4, 400], g, [100, 100 * Math.E]);
    expect(Math.abs(b! - a! - (2 * 1000) / (4 * Math.PI * 500)) / ((2 * 1000) / (4 * Math.PI * 500))).toBeLessThan(1e-4);
  });

  it("has an analytic Jacobian that agrees with central finite differences within 1e-6", () => {
    const g = { r: 45, Q: 1600 };
    const t = [1e-4, 1e-3, 0.01, 0.1, 1, 10];
    const p = [520, 1.8e-4, 504];
    const J = theisBarrierImageModel.jacobian!(p, g, t);
    const fd = centralDifferences((q) => theisBarrierImageModel.drawdown(q, g, t), p);
    const s = theisBarrierImageModel.drawdown(p, g, t);
    for (let k = 0; k < 3; k++) {
      for (let i = 0; i < t.length; i++) {
        const scale = Math.max(Math.abs(J[k]![i]!), Math.abs(s[i]!) / p[k]!);
        expect(Math.abs(J[k]![i]! - fd[k]![i]!) / scale, `param ${k}, t = ${t[i]}`).toBeLessThan(1e-6);
      }
    }
  });

  it("gives back the boundary distance from the image distance and the direction of the boundary", () => {
    for (const c of fixture.cases) {
      expect(relDiff(barrierDistanceFromImage(c.x, c.y, c.angle, c.ri), c.distance), c.name).toBeLessThan(1e-12);
    }
    // An image distance shorter than the observation point's own distance has no barrier on that side.
    expect(barrierDistanceFromImage(30, 40, 0, 20)).toBeNaN();
  });

  it("recovers T, S and ri from noise-free drawdown", () => {
    const c = fixture.cases[0]!;
    const t = Array.from({ length: 40 }, (_, i) => 1e-4 * Math.pow(3 / 1e-4, i / 39));
    const s = theisBarrierImageModel.drawdown([c.T, c.S, c.ri], { r: c.r, Q: c.Q }, t);
    const fit = fitModel({ model: theisBarrierImageModel, wells: [{ name: "OB", geometry: { r: c.r, Q: c.Q }, t, s }], start: { T: 300, S: 4e-4, ri: 300 } });
    expect(relDiff(fit.parameters[0]!.estimate, c.T)).toBeLessThan(1e-6);
    expect(relDiff(fit.parameters[1]!.estimate, c.S)).toBeLessThan(1e-6);
    expect(relDiff(fit.parameters[2]!.estimate, c.ri)).toBeLessThan(1e-6);
  });
});
