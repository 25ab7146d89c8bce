import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { fitModel } from "../src/fit/index.js";
import {
  partialPenetrationCorrection,
  partialPenetrationModel,
  partialPenetrationNegligibleDistance,
  type PartialPenetrationGeometry,
} from "../src/models/partial-penetration.js";
import { penetrationLeakyW, penetrationLeakyWdBeta } from "../src/models/penetration-leaky-function.js";
import { theisModel } from "../src/models/theis.js";
import { expint1 } from "../src/special/index.js";
import { hantushWByQuadrature, hantushWdRBByQuadrature } from "../src/wells/index.js";

interface Case {
  label: string;
  T: number; S: number; Q: number; b: number; d: number; l: number; anisotropy: number; r: number;
  observation: { z: number } | { z1: number; z2: number };
  t: number; u: number; W: number; correction: number; s: number; terms: number; sImages?: number;
}

// Reference: tests/fixtures/wellbore/generate_wellbore.py: the Hantush (1961) series with W(u, beta) by
// mpmath.quad at 30 digits, summed to 1e-18 W(u); for piezometers also an image-source line-source integral
// (scipy), which the script requires to agree to 1e-8.
const cases = (
  JSON.parse(readFileSync(new URL("../../../tests/fixtures/wellbore/wellbore.json", import.meta.url), "utf8")) as {
    partialPenetration: Case[];
  }
).partialPenetration;

function geometryOf(c: Case): PartialPenetrationGeometry {
  const o = c.observation;
  return {
    thickness: c.b,
    screenTop: c.d,
    screenBottom: c.l,
    anisotropy: c.anisotropy,
    observation: "z" in o ? { depth: o.z } : { screenTop: o.z1, screenBottom: o.z2 },
  };
}

describe("Hantush (1961) partial penetration, confined aquifer", () => {
  it("matches the mpmath series within 1e-10 of Q W(u) / (4 pi T) at every fixture point", () => {
    expect(cases.length).toBeGreaterThanOrEqual(20);
    for (const c of cases) {
      const model = partialPenetrationModel(geometryOf(c));
      const s = model.drawdown([c.T, c.S], { r: c.r, Q: c.Q }, [c.t])[0]!;
      const scale = (c.Q / (4 * Math.PI * c.T)) * c.W;
      expect(Math.abs(s - c.s) / scale, `${c.label}, t = ${c.t}`).toBeLessThan(1e-10);
      // Measured 2.5e-11 W(u) at worst for the correction term alone.
      expect(Math.abs(partialPenetrationCorrection(c.u, c.r, geometryOf(c)) - c.correction) / c.W).toBeLessThan(1e-10);
    }
  });

  it("agrees with the independent image-source integral for piezometers within 1e-8 relative", () => {
    const piezometers = cases.filter((c) => c.sImages !== undefined);
    expect(piezometers.length).toBeGreaterThanOrEqual(12);
    for (const c of piezometers) {
      const s = partialPenetrationModel(geometryOf(c)).drawdown([c.T, c.S], { r: c.r, Q: c.Q }, [c.t])[0]!;
      expect(Math.abs(s - c.sImages!) / c.sImages!, `${c.label}, t = ${c.t}`).toBeLessThan(1e-8);
    }
  });

  it("gives the Theis drawdown exactly for a fully penetrating well", () => {
    // Every coefficient sin(n pi) - sin(0) vanishes (Hantush 1961).
    const t = [1e-3, 0.01, 0.1, 1, 10];
    const g = { r: 15, Q: 500 };
    const full = partialPenetrationModel({ thickness: 20, screenTop: 0, screenBottom: 20, anisotropy: 0.1, observation: { depth: 3 } });
    expect(Array.from(full.drawdown([100, 2e-4], g, t))).toEqual(Array.from(theisModel.drawdown([100, 2e-4], g, t)));
    const fullObservation = partialPenetrationModel({
      thickness: 20, screenTop: 5, screenBottom: 9, anisotropy: 0.1, observation: { screenTop: 0, screenBottom: 20 },
    });
    expect(Array.from(fullObservation.drawdown([100, 2e-4], g, t))).toEqual(Array.from(theisModel.drawdown([100, 2e-4], g, t)));
  });

  it("leaves a correction of at most 0.021 W-units beyond 1.5 b sqrt(Kr/Kz), under 0.5 % of W(u) once u <= 0.01", () => {
    // Rule of thumb (common practice, no source): partial penetration is negligible beyond 1.5 b sqrt(Kr/Kz).
    // Measured here over screens, piezometer depths and Kz/Kr; early time (u ~ 1) keeps up to 9 % of W(u).
    const b = 10;
    let maxAbs = 0;
    let maxLateRatio = 0;
    for (const anisotropy of [1, 0.1, 0.01]) {
      const r = partialPenetrationNegligibleDistance(b, anisotropy);
      expect(r).toBeCloseTo((1.5 * b) / Math.sqrt(anisotropy), 12);
      for (const [d, l] of [[0, 2], [0, 5], [4, 6], [8, 10], [9.5, 10], [4.9, 5.1]] as const) {
        for (const z of [0, 2.5, 5, 7.5, 10]) {
          const g: PartialPenetrationGeometry = { thickness: b, screenTop: d, screenBottom: l, anisotropy, observation: { depth: z } };
          for (const u of [1, 0.1, 0.01, 1e-4, 1e-8]) {
            const f = partialPenetrationCorrection(u, r, g);
            maxAbs = Math.max(maxAbs, Math.abs(f));
            if (u <= 0.01) maxLateRatio = Math.max(maxLateRatio, Math.abs(f) / expint1(u));
          }
        }
      }
    }
    expect(maxAbs).toBeLessThan(0.021);
    expect(maxAbs).toBeGreaterThan(0.015);
    expect(maxLateRatio).toBeLessThan(0.0051);
  });

  it("evaluates the leaky function in its Gaussian-tail regime like the adaptive quadrature, within 1e-12", () => {
    // Reference: wells/hantush.ts adaptive Gauss-Kronrod quadrature (relTol 1e-13) of the defining integral.
    for (const beta of [10.5, 15, 30, 60]) {
      for (const u of [3.5, 6, 20, 80]) {
        const x = (beta * beta) / (4 * u);
        if (!(x > 3 && Math.abs(Math.sqrt(u) - Math.sqrt(x)) > 1.5)) continue;
        const w = hantushWByQuadrature(u, beta);
        const dw = hantushWdRBByQuadrature(u, beta);
        expect(Math.abs(penetrationLeakyW(u, beta) - w) / w, `u = ${u}, beta = ${beta}`).toBeLessThan(1e-12);
        expect(Math.abs(penetrationLeakyWdBeta(u, beta) - dw) / Math.abs(dw), `u = ${u}, beta = ${beta}`).toBeLessThan(1e-12);
      }
    }
  });

  it("has an analytic Jacobian in T, S and Kz/Kr that agrees with central differences within 1e-6", () => {
    const model = partialPenetrationModel({ thickness: 25, screenTop: 0, screenBottom: 8, observation: { depth: 20 } });
    const g = { r: 10, Q: 600 };
    const t = [1e-3, 1e-2, 0.1, 1];
    const p = [150, 2e-4, 0.2];
    const J = model.jacobian!(p, g, t);
    const s = model.drawdown(p, g, t);
    for (let k = 0; k < 3; k++) {
      const h = 1e-5 * p[k]!;
      const up = p.slice();
      const down = p.slice();
      up[k]! += h;
      down[k]! -= h;
      const su = model.drawdown(up, g, t);
      const sd = model.drawdown(down, g, t);
      for (let i = 0; i < t.length; i++) {
        const fd = (su[i]! - sd[i]!) / (2 * h);
        const scale = Math.max(Math.abs(J[k]![i]!), Math.abs(s[i]!) / p[k]!);
        expect(Math.abs(J[k]![i]! - fd) / scale, `parameter ${k}, t = ${t[i]}`).toBeLessThan(1e-6);
      }
    }
  });

  it("writes into the output array and gives 0 before pumping", () => {
    const model = partialPenetrationModel({ thickness: 30, screenTop: 0, screenBottom: 10, anisotropy: 0.1, observation: { depth: 5 } });
    const out = new Float64Array(3);
    expect(model.drawdown([120, 2e-4], { r: 8, Q: 600 }, [-1, 0, 0.1], out)).toBe(out);
    expect(out[0]).toBe(0);
    expect(out[1]).toBe(0);
    const c = cases.find((x) => x.label.startsWith("upper third screened, piezometer at mid") && x.t === 0.1)!;
    expect(Math.abs(out[2]! - c.s) / c.s).toBeLessThan(1e-10);
  });

  it("rejects screens and depths outside the aquifer with messages that say what is allowed", () => {
    const base = { thickness: 20, screenTop: 0, screenBottom: 5, anisotropy: 0.1, observation: { depth: 3 } };
    expect(() => partialPenetrationModel({ ...base, screenBottom: 25 })).toThrow(/0 <= top < bottom <= thickness \(20 m\)/);
    expect(() => partialPenetrationModel({ ...base, observation: { depth: -1 } })).toThrow(/piezometer depth is -1 m/);
    expect(() => partialPenetrationModel({ ...base, anisotropy: 0 })).toThrow(/anisotropy Kz\/Kr is 0/);
  });

  it("describes itself, with Kz/Kr as a third parameter only when the geometry leaves it open", () => {
    const fixed = partialPenetrationModel({ thickness: 20, screenTop: 0, screenBottom: 5, anisotropy: 0.1, observation: { depth: 3 } });
    const open = partialPenetrationModel({ thickness: 20, screenTop: 0, screenBottom: 5, observation: { depth: 3 } });
    expect(fixed.parameters.map((p) => p.name)).toEqual(["T", "S"]);
    expect(open.parameters.map((p) => `${p.name} ${p.unit}`)).toEqual(["T m2/d", "S 1", "KzKr 1"]);
    expect(fixed.name).toMatch(/Hantush \(1961\)/);
    expect(fixed.source).toMatch(/87\(HY4\), 83-98/);
  });

  it("returns T and S within 1e-8 relative from noise-free data of two piezometers via fitModel", () => {
    const T = 150, S = 2e-4, Q = 600;
    const t = Float64Array.from({ length: 16 }, (_, i) => 1e-3 * Math.pow(10, (3 * i) / 15));
    const shallow = partialPenetrationModel({ thickness: 25, screenTop: 0, screenBottom: 8, anisotropy: 0.2, observation: { depth: 4 } });
    const deep = partialPenetrationModel({ thickness: 25, screenTop: 0, screenBottom: 8, anisotropy: 0.2, observation: { depth: 22 } });
    for (const model of [shallow, deep]) {
      const wells = [{ name: "PZ", geometry: { r: 10, Q }, t, s: model.drawdown([T, S], { r: 10, Q }, t) }];
      // Start values a factor of 2 to 3 away; the models module has no starting-value rule for this model yet.
      const fit = fitModel({ model, wells, start: { T: 60, S: 5e-4 }, ftol: 1e-14, xtol: 1e-14, gtol: 1e-14 });
      expect(fit.converged).toBe(true);
      expect(Math.abs(fit.parameters[0]!.estimate - T) / T).toBeLessThan(1e-8);
      expect(Math.abs(fit.parameters[1]!.estimate - S) / S).toBeLessThan(1e-8);
    }
  });
});
