/**
 * Boulton (1963), Jacob-Lohman (1952) and Hantush (1964) leaky partial penetration, each against the scipy and
 * mpmath references of tests/fixtures/classic-models (generate_classic_models.py) and against limits and
 * neighbouring models of the library.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import {
  boultonModel,
  doughertyBabuModel,
  getModel,
  hantushJacobModel,
  hantushLeakyPartialPenetrationModel,
  jacobLohmanG,
  jacobLohmanModel,
  moenchWaterTableModel,
  partialPenetrationModel,
  theisModel,
  type DrawdownModel,
} from "../src/models/index.js";
import { withRateSchedule } from "../src/superposition/index.js";

interface BoultonCase { T: number; S: number; Sy: number; alpha: number; r: number; Q: number; t: number; s: number; sTalbot: number }
interface LeakyCase { T: number; S: number; Q: number; b: number; d: number; l: number; KzKr: number; r: number; B: number; t: number; s: number; z?: number; z1?: number; z2?: number }
const fixture = JSON.parse(readFileSync(new URL("../../../tests/fixtures/classic-models/classic_models.json", import.meta.url), "utf8")) as {
  boulton: BoultonCase[];
  jacobLohmanG: { alpha: number; G: number; GTalbot: number }[];
  constantDrawdownAround: { alpha: number; rho: number; sOverSw: number }[];
  leakyPartialPenetration: LeakyCase[];
};

const relative = (a: number, b: number) => Math.abs(a / b - 1);

function centralDifferences(model: DrawdownModel, p: number[], g: { r: number; Q: number }, t: number[], step = 1e-6): Float64Array[] {
  return p.map((v, k) => {
    const h = Math.abs(v) * step;
    const up = [...p];
    const down = [...p];
    up[k] = v + h;
    down[k] = v - h;
    const a = model.drawdown(up, g, t);
    const b = model.drawdown(down, g, t);
    return Float64Array.from(a, (x, i) => (x - b[i]!) / (2 * h));
  });
}

describe("Boulton (1963) delayed yield", () => {
  it("matches the real-integral form of the solution (scipy quadrature, confirmed by mpmath Talbot) within 1e-5 where s exceeds 1 % of its late value", () => {
    // Reference: tests/fixtures/classic-models, Boulton case (inverse Hankel transform, scipy; Talbot, mpmath).
    let worst = 0;
    for (const c of fixture.boulton) {
      expect(relative(c.s, c.sTalbot)).toBeLessThan(1e-9);
      const s = boultonModel.drawdown([c.T, c.S, c.Sy, c.alpha], { r: c.r, Q: c.Q }, [c.t])[0]!;
      const late = boultonModel.drawdown([c.T, c.S, c.Sy, c.alpha], { r: c.r, Q: c.Q }, [100])[0]!;
      if (s > 0.01 * late) worst = Math.max(worst, relative(s, c.s));
      else expect(relative(s, c.s)).toBeLessThan(1e-3);
    }
    expect(fixture.boulton.length).toBe(12);
    expect(worst).toBeLessThan(1e-5);
  });

  it("follows Theis with S at early time and Theis with S + Sy at late time", () => {
    // Limits of the solution (Boulton 1963): alpha t << 1 and alpha t >> 1.
    const g = { r: 10, Q: 400 };
    const early = boultonModel.drawdown([150, 2e-4, 0.15, 1e-5], g, [1e-3])[0]!;
    expect(relative(early, theisModel.drawdown([150, 2e-4], g, [1e-3])[0]!)).toBeLessThan(2e-3);
    const late = boultonModel.drawdown([150, 2e-4, 0.15, 50], g, [200])[0]!;
    expect(relative(late, theisModel.drawdown([150, 2e-4 + 0.15], g, [200])[0]!)).toBeLessThan(2e-3);
  });

  it("is the limit of Moench's gradual drainage for a fully penetrating well as Kz/Kr grows", () => {
    // Identity: with no vertical head loss the water-table condition of Moench (1997) becomes Boulton's kernel.
    const moench = moenchWaterTableModel({ thickness: 20, screenTop: 0, screenBottom: 20, anisotropy: 1e4, rw: 1e-3, rc: 0, drainage: "gradual" });
    const t = [1e-3, 1e-2, 0.1, 1, 10];
    const a = boultonModel.drawdown([200, 1e-3, 0.1, 5], { r: 15, Q: 500 }, t);
    const b = moench.drawdown([200, 1e-3, 0.1, 5], { r: 15, Q: 500 }, t);
    for (let i = 0; i < t.length; i++) expect(relative(a[i]!, b[i]!), `t = ${t[i]}`).toBeLessThan(1e-3);
  });

  it("has an analytic Jacobian that agrees with central differences to 2e-3", () => {
    // Richardson extrapolation of steps 1e-1 and 5e-2 relative: the 16-term Stehfest sum amplifies the last-bit
    // errors of K0 to about 1e-7 of s, which smaller steps would turn into noise.
    const p = [200, 1e-3, 0.1, 5];
    const g = { r: 15, Q: 500 };
    const t = [1e-3, 0.03, 1, 30];
    const J = boultonModel.jacobian!(p, g, t);
    const coarse = centralDifferences(boultonModel, p, g, t, 1e-1);
    const D = centralDifferences(boultonModel, p, g, t, 5e-2).map((column, k) => column.map((v, i) => (4 * v - coarse[k]![i]!) / 3));
    for (let k = 0; k < 4; k++) for (let i = 0; i < t.length; i++) {
      const scale = Math.max(...Array.from(D[k]!, Math.abs));
      expect(Math.abs(J[k]![i]! - D[k]![i]!), `k ${k} t ${t[i]}`).toBeLessThan(2e-3 * Math.abs(D[k]![i]!) + 1e-4 * scale);
    }
  });
});

describe("Jacob-Lohman (1952) well at constant drawdown", () => {
  it("gives G(alpha) within 2e-7 of its integral form (scipy) and of the mpmath Talbot inversion", () => {
    // Reference: tests/fixtures/classic-models, Jacob-Lohman G(alpha) (the arctan integral of Jacob and Lohman 1952).
    for (const c of fixture.jacobLohmanG) {
      expect(relative(c.G, c.GTalbot)).toBeLessThan(1e-10);
      expect(relative(jacobLohmanG(c.alpha), c.G), `alpha ${c.alpha}`).toBeLessThan(2e-7);
    }
  });

  it("approaches 1/sqrt(pi alpha) + 1/2 at small alpha and 2 / ln(2.25 alpha) at large alpha", () => {
    // Small-time expansion of the transform (x K1/K0 = x + 1/2 + ...); the straight line of Jacob and Lohman (1952).
    for (const a of [1e-4, 1e-3]) expect(Math.abs(jacobLohmanG(a) - (1 / Math.sqrt(Math.PI * a) + 0.5))).toBeLessThan(Math.sqrt(a));
    const gap = [1e2, 1e4, 1e6, 1e8].map((a) => relative(jacobLohmanG(a), 2 / Math.log(2.25 * a)));
    for (let i = 1; i < gap.length; i++) expect(gap[i]!).toBeLessThan(gap[i - 1]!);
    expect(gap[3]!).toBeLessThan(0.01);
  });

  it("gives the discharge 2 pi T sw G at the well and the drawdown around it within 5e-6 of the mpmath inversion", () => {
    // Reference: tests/fixtures/classic-models, constant-drawdown case (Talbot, mpmath).
    const rw = 0.1;
    const sw = 12;
    const T = 80;
    const S = 2e-4;
    const model = jacobLohmanModel({ rw, drawdown: sw });
    const t = 0.5;
    const Q = model.drawdown([T, S], { r: rw, Q: 0 }, [t])[0]!;
    expect(relative(Q, 2 * Math.PI * T * sw * jacobLohmanG((T * t) / (S * rw * rw)))).toBeLessThan(1e-8);
    for (const c of fixture.constantDrawdownAround) {
      const time = (c.alpha * S * rw * rw) / T;
      const s = model.drawdown([T, S], { r: c.rho * rw, Q: 0 }, [time])[0]!;
      expect(relative(s / sw, c.sOverSw), `alpha ${c.alpha} rho ${c.rho}`).toBeLessThan(5e-6);
    }
  });

  it("refuses superposition over pumping rates, which does not apply to a well held at constant drawdown", () => {
    const model = jacobLohmanModel({ rw: 0.1, drawdown: 5 });
    expect(() => withRateSchedule(model, [{ start: 0, rate: 100 }])).toThrow(/cannot be superposed.*constant drawdown/);
  });
});

describe("Hantush (1964) partially penetrating well in a leaky aquifer", () => {
  const geometryOf = (c: LeakyCase) => ({
    thickness: c.b,
    screenTop: c.d,
    screenBottom: c.l,
    observation: c.z !== undefined ? { depth: c.z } : { screenTop: c.z1!, screenBottom: c.z2! },
    anisotropy: c.KzKr,
  });

  it("matches Hantush's formula evaluated with mpmath from the integral of W(u, beta) within 1e-9", () => {
    // Reference: tests/fixtures/classic-models, leaky partial penetration (mpmath quad, 20 digits).
    let worst = 0;
    for (const c of fixture.leakyPartialPenetration) {
      const s = hantushLeakyPartialPenetrationModel(geometryOf(c)).drawdown([c.T, c.S, c.B], { r: c.r, Q: c.Q }, [c.t])[0]!;
      worst = Math.max(worst, relative(s, c.s));
    }
    expect(fixture.leakyPartialPenetration.length).toBe(60);
    expect(worst).toBeLessThan(1e-9);
  });

  it("becomes Hantush (1961) without leakage and Hantush-Jacob (1955) for a full screen", () => {
    const t = [1e-3, 0.01, 0.1, 1, 10];
    const g = { r: 12, Q: 600 };
    const geometry = { thickness: 25, screenTop: 2, screenBottom: 9, observation: { depth: 18 }, anisotropy: 0.2 };
    const noLeak = hantushLeakyPartialPenetrationModel(geometry).drawdown([150, 2e-4, 1e9], g, t);
    const confined = partialPenetrationModel(geometry).drawdown([150, 2e-4], g, t);
    for (let i = 0; i < t.length; i++) expect(relative(noLeak[i]!, confined[i]!)).toBeLessThan(1e-7);
    const full = hantushLeakyPartialPenetrationModel({ ...geometry, screenTop: 0, screenBottom: 25 }).drawdown([150, 2e-4, 300], g, t);
    expect(Array.from(full)).toEqual(Array.from(hantushJacobModel.drawdown([150, 2e-4, 300], g, t)));
  });

  it("agrees with the Laplace-domain vertical-mode series of Dougherty-Babu (leaky, thin well, no storage) within 3e-4", () => {
    // Independent route: models/vertical-modes.ts inverted by Stehfest, line-source limit of Dougherty and Babu (1984).
    const t = [0.01, 0.1, 1, 10];
    const geometry = { thickness: 20, screenTop: 0, screenBottom: 8, observation: { depth: 15 }, anisotropy: 0.3 };
    const hantush = hantushLeakyPartialPenetrationModel(geometry).drawdown([200, 1e-4, 150], { r: 15, Q: 500 }, t);
    const modes = doughertyBabuModel({ ...geometry, rw: 1e-4, rc: 0, leaky: true }).drawdown([200, 1e-4, 150], { r: 15, Q: 500 }, t);
    for (let i = 0; i < t.length; i++) expect(relative(modes[i]!, hantush[i]!), `t = ${t[i]}`).toBeLessThan(3e-4);
  });

  it("has an analytic Jacobian, Kz/Kr fitted, that agrees with central differences to 1e-5", () => {
    const model = getModel({ id: "hantush-leaky-partial-penetration", aquiferThickness: 20, screenTop: 0, screenBottom: 8, observationScreenTop: 10, observationScreenBottom: 14 });
    const p = [200, 1e-4, 300, 0.3];
    const g = { r: 15, Q: 500 };
    const t = [1e-3, 0.05, 2];
    const J = model.jacobian!(p, g, t);
    const D = centralDifferences(model, p, g, t);
    for (let k = 0; k < 4; k++) for (let i = 0; i < t.length; i++) {
      expect(Math.abs(J[k]![i]! - D[k]![i]!), `k ${k} t ${t[i]}`).toBeLessThan(1e-5 * Math.abs(D[k]![i]!) + 1e-12);
    }
  });
});
