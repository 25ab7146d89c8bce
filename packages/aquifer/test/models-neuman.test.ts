import { readFileSync } from "node:fs";
import { describe, it, expect } from "vitest";
import { neumanDimensionless, neumanModel, neumanTypeCurves } from "../src/models/neuman.js";
import { neumanNextRoot, neumanRoot, neumanTransform, neumanTransformValue, newNeumanTransform } from "../src/models/neuman-laplace.js";
import { neumanTransformBySeries } from "../src/models/neuman-laplace-reference.js";
import { stehfestWithDerivatives } from "../src/models/neuman-stehfest.js";
import { besselK0, expint1 } from "../src/special/index.js";
import { fitModel } from "../src/fit/index.js";

interface NeumanPoint { sigma: number; beta: number; ts: number; sD: number }
const fixture = JSON.parse(
  readFileSync(new URL("../../../tests/fixtures/laplace-models/laplace_models.json", import.meta.url), "utf8"),
) as { neuman: NeumanPoint[]; neumanHankelCheck: { sigma: number; beta: number; p: number; series: number; hankel: number }[] };

describe("the Neuman Laplace-domain series", () => {
  it("finds each root of eps tan eps = c inside its bracket (n pi, n pi + pi/2) to round-off", () => {
    for (const c of [1e-8, 0.3, 7, 1e6]) {
      for (const n of [0, 1, 5, 40]) {
        const e = neumanRoot(n, c, n * Math.PI + 0.1);
        expect(e).toBeGreaterThan(n * Math.PI);
        expect(e).toBeLessThan(n * Math.PI + Math.PI / 2);
        // Residual of the well-conditioned form eps = n pi + atan(c / eps) (eps tan eps loses digits near n pi).
        expect(Math.abs(e - n * Math.PI - Math.atan(c / e)), `n = ${n}, c = ${c}`).toBeLessThan(4e-16 * e);
      }
    }
  });

  it("steps from root to root (one arctangent and one Newton step) to the residual of the bracketed solver", () => {
    for (const c of [1e-8, 0.03, 0.3, 2, 7, 300, 1e6]) {
      let e = neumanRoot(0, c, 0.5);
      for (let n = 1; n <= 60; n++) {
        e = neumanNextRoot(n, c, e);
        expect(e).toBeGreaterThan(n * Math.PI);
        expect(e).toBeLessThan(n * Math.PI + Math.PI / 2);
        expect(Math.abs(e - n * Math.PI - Math.atan(c / e)), `n = ${n}, c = ${c}`).toBeLessThan(4e-16 * e);
        expect(Math.abs(e / neumanRoot(n, c, e) - 1)).toBeLessThan(4e-16);
      }
    }
  });

  it("gives the same transform, derivatives and s_D as the direct series (t_s 1e-2..1e7, beta 1e-3..10)", () => {
    // Reference: neumanTransformBySeries, every root solved to a verified Newton step (the evaluation this
    // project used before the fast root steps); both at the model's series tolerance.
    const fast = newNeumanTransform();
    const direct = newNeumanTransform();
    const toValues = (f: typeof neumanTransform, sigma: number, beta: number, record: typeof fast) =>
      (p: number, derivatives: boolean, values: Float64Array) => {
        f(p, sigma, beta, 1e-10, derivatives, record);
        values[0] = record.value;
        values[1] = record.dp;
        values[2] = record.dSigma;
        values[3] = record.dBeta;
      };
    const scratch = new Float64Array(4);
    const a = new Float64Array(4);
    const b = new Float64Array(4);
    let worstTransform = 0;
    let worstDrawdown = 0;
    for (const ts of [1e-2, 0.3, 3, 30, 1e3, 1e5, 1e7]) {
      for (const sigma of [1e-6, 1e-2, 0.3, 1]) {
        for (const beta of [1e-3, 0.01, 0.1, 1, 10]) {
          for (let k = 1; k <= 12; k++) {
            const p = (k * Math.LN2) / ts;
            neumanTransform(p, sigma, beta, 1e-10, false, fast);
            neumanTransformBySeries(p, sigma, beta, 1e-10, false, direct);
            expect(fast.terms).toBe(direct.terms);
            worstTransform = Math.max(worstTransform, Math.abs(fast.value / direct.value - 1));
          }
          stehfestWithDerivatives(toValues(neumanTransform, sigma, beta, fast), ts, 12, true, scratch, a);
          stehfestWithDerivatives(toValues(neumanTransformBySeries, sigma, beta, direct), ts, 12, true, scratch, b);
          expect(Math.abs(a[0]! / b[0]! - 1), `s_D at t_s ${ts}, sigma ${sigma}, beta ${beta}`).toBeLessThan(1e-9);
          worstDrawdown = Math.max(worstDrawdown, Math.abs(a[0]! / b[0]! - 1));
          // Sensitivities: relative to the largest of t_s ds/dt_s, sigma ds/dsigma, beta ds/dbeta (one may cross 0).
          const scale = Math.max(Math.abs(b[1]!), Math.abs(sigma * b[2]!), Math.abs(beta * b[3]!));
          expect(Math.abs(a[1]! - b[1]!) / scale).toBeLessThan(1e-9);
          expect(Math.abs(sigma * (a[2]! - b[2]!)) / scale).toBeLessThan(1e-9);
          expect(Math.abs(beta * (a[3]! - b[3]!)) / scale).toBeLessThan(1e-9);
        }
      }
    }
    expect(worstTransform).toBeLessThan(1e-13);
    expect(worstDrawdown).toBeLessThan(1e-9);
  });

  it("computes F(p) in the value-only loop bit for bit as the full evaluation does (p 1e-3..1e6)", () => {
    const record = newNeumanTransform();
    for (const sigma of [1e-4, 0.02, 1]) {
      for (const beta of [1e-3, 0.05, 3]) {
        for (const p of [1e-3, 0.1, 7, 300, 1e6]) {
          neumanTransform(p, sigma, beta, 1e-10, false, record);
          expect(neumanTransformValue(p, sigma, beta, 1e-10), `p ${p}, sigma ${sigma}, beta ${beta}`).toBe(record.value);
        }
      }
    }
  });

  it("matches the root-free Hankel-space evaluation of mpmath to 1e-9 relative (checks the series itself)", () => {
    // Fixture: mpmath quadosc of the Laplace-Hankel solution of the same boundary-value problem.
    const record = newNeumanTransform();
    for (const c of fixture.neumanHankelCheck) {
      expect(c.series / c.hankel - 1).toBeLessThan(1e-15);
      neumanTransform(c.p, c.sigma, c.beta, 1e-12, false, record);
      expect(Math.abs(record.value / c.hankel - 1), `p = ${c.p}`).toBeLessThan(1e-9);
    }
  });

  it("approaches the Theis transform with S as p grows (early time): 8 % at p = 1e2, 2.6 % at p = 1e4", () => {
    // Identity limit: as p grows the roots tend to (n + 1/2) pi and the weights 2/eps^2, which sum to 1.
    const record = newNeumanTransform();
    const gaps = [1e2, 1e3, 1e4].map((p) => {
      neumanTransform(p, 1e-3, 0.1, 1e-12, false, record);
      return Math.abs(record.value / ((2 * besselK0(Math.sqrt(p))) / p) - 1);
    });
    expect(gaps[1]!).toBeLessThan(gaps[0]!);
    expect(gaps[2]!).toBeLessThan(gaps[1]!);
    expect(gaps[0]!).toBeLessThan(0.085);
    expect(gaps[2]!).toBeLessThan(0.026);
  });
});

describe("neumanDimensionless", () => {
  it("agrees with mpmath de Hoog inversion of the same transform within 1e-4 relative for t_s >= 1", () => {
    // Fixture: generate_laplace_models.py (mpmath invertlaplace, method "dehoog", 20 digits).
    let worst = 0;
    for (const q of fixture.neuman.filter((x) => x.ts >= 1)) {
      worst = Math.max(worst, Math.abs(neumanDimensionless(q.ts, q.sigma, q.beta) / q.sD - 1));
    }
    expect(worst, `max relative difference ${worst.toExponential(2)}`).toBeLessThan(1e-4);
  });

  it("agrees with mpmath within 3e-4 relative at t_s = 0.3 (u = 0.83), where Stehfest is weaker", () => {
    for (const q of fixture.neuman.filter((x) => x.ts < 1)) {
      expect(Math.abs(neumanDimensionless(q.ts, q.sigma, q.beta) / q.sD - 1)).toBeLessThan(3e-4);
    }
  });

  it("follows Theis with S + Sy at late time within 2e-5 relative (beta = 0.01 to 1)", () => {
    const sigma = 1e-3;
    for (const beta of [0.01, 0.1, 1]) {
      for (const ts of [1e7, 1e8]) {
        const late = expint1((1 + 1 / sigma) / (4 * ts));
        expect(Math.abs(neumanDimensionless(ts, sigma, beta) / late - 1), `beta ${beta}, t_s ${ts}`).toBeLessThan(2e-5);
      }
    }
  });

  it("follows Theis with S at early time for small beta (within 1.5 % at t_s = 0.1 for beta = 0.001)", () => {
    // Early-time identity limit; the residual mixes the onset of drainage and Stehfest error at large u.
    const ratio = neumanDimensionless(0.1, 1e-3, 0.001) / expint1(1 / 0.4);
    expect(Math.abs(ratio - 1)).toBeLessThan(0.015);
  });

  it("reproduces Neuman's type-A values for beta = 0.001 at 2-3 digits", () => {
    // Values of W(u_A, beta) for beta = 0.001 at 1/u_A = 4 t_s, from memory of Neuman (1975), Water Resources
    // Research 11(2), table 1; sigma -> 0 taken as 1e-9.
    const recalled: [number, number][] = [
      [0.4, 2.48e-2], [0.8, 1.45e-1], [1.4, 3.58e-1], [2.4, 6.62e-1], [4, 1.02], [8, 1.57], [14, 2.05], [24, 2.52],
      [40, 2.97], [80, 3.56], [140, 4.01], [240, 4.42], [400, 4.77], [800, 5.16], [1400, 5.40], [2400, 5.54],
      [4000, 5.59], [8000, 5.62],
    ];
    const family = neumanTypeCurves(recalled.map(([x]) => x / 4), 1e-9, [0.001]);
    recalled.forEach(([x, w], i) => {
      expect(Math.abs(family.curves[0]!.sD[i]! / w - 1), `1/u_A = ${x}`).toBeLessThan(8e-3);
    });
  });
});

describe("neumanModel", () => {
  const model = neumanModel(20);
  const truth = [500, 2e-4, 0.15, 0.2];
  const geometry = { r: 15, Q: 800 };

  it("scales s_D by Q/(4 pi T) with t_s = T t/(S r^2) and beta = (Kz/Kr) r^2/b^2, writing into out", () => {
    const out = new Float64Array(2);
    const result = model.drawdown(truth, geometry, [0.01, 1], out);
    expect(result).toBe(out);
    const beta = (0.2 * 15 * 15) / (20 * 20);
    const expected = (800 / (4 * Math.PI * 500)) * neumanDimensionless((500 * 1) / (2e-4 * 225), 2e-4 / 0.15, beta);
    expect(Math.abs(out[1]! / expected - 1)).toBeLessThan(1e-9);
  });

  it("has a Jacobian matching central differences within 1e-2 of each column's largest value", () => {
    const t = [0.001, 0.01, 0.1, 1, 5];
    const J = model.jacobian!(truth, geometry, t);
    truth.forEach((pk, k) => {
      const up = truth.slice();
      const down = truth.slice();
      up[k] = pk * (1 + 1e-5);
      down[k] = pk * (1 - 1e-5);
      const a = model.drawdown(up, geometry, t);
      const b = model.drawdown(down, geometry, t);
      const fd = t.map((_, i) => (a[i]! - b[i]!) / (2e-5 * pk));
      const scale = Math.max(...fd.map(Math.abs));
      fd.forEach((v, i) => expect(Math.abs(J[k]![i]! - v) / scale, `parameter ${k}, t ${t[i]}`).toBeLessThan(1e-2));
    });
  });

  it("returns T, S, Sy and Kz/Kr from noise-free synthetic data through fitModel within 1e-5 relative", () => {
    const t = Array.from({ length: 60 }, (_, i) => 1e-3 * Math.pow(10, (4 * i) / 59));
    const s = model.drawdown(truth, geometry, t);
    const fit = fitModel({ model, wells: [{ name: "PZ-1", geometry, t, s }], start: { T: 300, S: 5e-4, Sy: 0.08, KzKr: 0.5 } });
    fit.parameters.forEach((q, k) => expect(Math.abs(q.estimate / truth[k]! - 1), q.name).toBeLessThan(1e-5));
  });

  it("rejects a non-positive saturated thickness with a message naming b", () => {
    expect(() => neumanModel(0)).toThrow(/saturated thickness b/);
  });
});
