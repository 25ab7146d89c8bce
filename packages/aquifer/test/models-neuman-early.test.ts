import { describe, it, expect } from "vitest";
import { neumanTransformComplex } from "../src/models/early-time-laplace.js";
import { neumanTransformComplexFast } from "../src/models/neuman-early-laplace.js";
import { complexK0, complexK0Pair, hypot, modulusBelow } from "../src/models/neuman-complex-k0.js";
import {
  NeumanTermLog,
  neumanTransform,
  neumanTransformValue,
  neumanTransformValueLogged,
  newNeumanTransform,
} from "../src/models/neuman-laplace.js";
import { NEUMAN_DEHOOG_BELOW, NEUMAN_THEIS_BELOW, neumanDimensionless, neumanModel } from "../src/models/neuman.js";
import { besselK0Complex, complex, deHoog } from "../src/numerics/index.js";
import { uniformGenerator } from "../../../tests/support/seeded-noise.js";

// These pin the plain-arithmetic early-time evaluation to the record-based one it replaces, bit for bit (the
// recorded unconfined template's fit follows the exact bits of the Jacobian). The reference itself is checked
// against mpmath in models-neuman.test.ts and numerics-laplace.test.ts.

/** The de Hoog nodes the model uses at t_s (order 12, tolerance 1e-9, period 2 t_s): gamma + i k pi / (2 t_s). */
function nodes(ts: number): { re: number; im: number }[] {
  const gamma = -Math.log(1e-9) / (2 * 2 * ts);
  return Array.from({ length: 25 }, (_, k) => ({ re: gamma, im: (k * Math.PI) / (2 * ts) }));
}

describe("Neuman's transform at complex p in plain arithmetic", () => {
  it("gives the bits of the record-based reference at every de Hoog node (t_s 0.01..0.15, sigma 1e-4..1, beta 1e-3..10)", () => {
    const out = { re: 0, im: 0 };
    let compared = 0;
    for (const ts of [0.01, 0.05, 0.149]) {
      for (const sigma of [1e-4, 0.0167, 1]) {
        for (const beta of [1e-3, 0.075, 10]) {
          for (const p of nodes(ts)) {
            const reference = neumanTransformComplex(complex(p.re, p.im), sigma, beta);
            expect(neumanTransformComplexFast(p.re, p.im, sigma, beta, out)).toBe(true);
            expect(out.re, `t_s ${ts}, sigma ${sigma}, beta ${beta}, p ${p.re} + ${p.im}i`).toBe(reference.re);
            expect(out.im).toBe(reference.im);
            compared++;
          }
        }
      }
    }
    expect(compared).toBe(675);
  });

  it("gives the early-time drawdown bit for bit as de Hoog's inversion of the reference transform", () => {
    for (const ts of [NEUMAN_THEIS_BELOW, 0.03, 0.08, 0.149]) {
      for (const [sigma, beta] of [[0.0167, 0.075], [0.3, 2], [1e-3, 1e-3]] as const) {
        const reference = deHoog((p) => neumanTransformComplex(p, sigma, beta), ts, { order: 12, tolerance: 1e-9 });
        expect(ts).toBeLessThan(NEUMAN_DEHOOG_BELOW);
        expect(neumanDimensionless(ts, sigma, beta)).toBe(reference);
      }
    }
  });
});

describe("the early-time sensitivities", () => {
  it("are the forward differences of single evaluations bit for bit, with and without shared roots for sigma and beta", () => {
    const up = Math.exp(1e-5);
    let shared = 0;
    let apart = 0;
    const d = new Float64Array(4);
    for (const ts of [0.02, 0.07, 0.14]) {
      for (const [sigma, beta] of [[0.0167, 0.075], [0.0167, 0.47], [0.3, 2], [0.123, 0.0456], [0.05, 0.3]] as const) {
        if ((sigma * up) * beta === sigma * (beta * up)) shared++;
        else apart++;
        const value = neumanDimensionless(ts, sigma, beta, d);
        expect(d[0]).toBe(value);
        expect(d[1]).toBe((neumanDimensionless(ts * up, sigma, beta) - value) / 1e-5);
        expect(d[2], `t_s ${ts}, sigma ${sigma}, beta ${beta}`).toBe((neumanDimensionless(ts, sigma * up, beta) - value) / (1e-5 * sigma));
        expect(d[3]).toBe((neumanDimensionless(ts, sigma, beta * up) - value) / (1e-5 * beta));
      }
    }
    expect(shared).toBeGreaterThan(0);
    expect(apart).toBeGreaterThan(0);
  });
});

describe("the Neuman series with logged terms", () => {
  it("logs while giving neumanTransformValue's bits, and the transform with derivatives reading the log gives its own bits", () => {
    const log = new NeumanTermLog();
    // Past its first capacity (4096 numbers) the log grows and keeps what it holds.
    for (let i = 0; i < 2100; i++) log.push(i, -i);
    expect([log.length, log.data[0], log.data[4199], log.data[4198]]).toEqual([4200, 0, -2099, 2099]);
    const fresh = newNeumanTransform();
    const reading = newNeumanTransform();
    for (const p of [1e-3, 0.05, 2, 80, 3e3]) {
      for (const [sigma, beta] of [[0.0167, 0.019], [0.3, 2], [1e-4, 1e-3]] as const) {
        const start = log.length;
        expect(neumanTransformValueLogged(p, sigma, beta, 1e-10, log)).toBe(neumanTransformValue(p, sigma, beta, 1e-10));
        const known = { log, start, count: (log.length - start) / 2 };
        expect(known.count).toBeGreaterThan(1);
        for (const derivatives of [true, false]) {
          neumanTransform(p, sigma, beta, 1e-10, derivatives, fresh);
          neumanTransform(p, sigma, beta, 1e-10, derivatives, reading, known);
          expect(reading, `p ${p}, sigma ${sigma}, beta ${beta}`).toEqual(fresh);
        }
      }
    }
  });
});

describe("the Neuman Jacobian after a drawdown call at the same parameters", () => {
  it("gives the same columns, bit for bit, as a Jacobian without the preceding call (early points reuse s_D)", () => {
    const parameters = [150, 2e-3, 0.12, 0.3];
    const geometry = { r: 25, Q: 800 };
    // t from 1e-4 d: t_s = T t / (S r^2) from 0.012, so the first points are inverted by de Hoog.
    const t = Float64Array.from({ length: 12 }, (_, i) => 1e-4 * 2 ** i);
    const warmed = neumanModel(20);
    const drawdown = warmed.drawdown(parameters, geometry, t);
    const after = warmed.jacobian!(parameters, geometry, t);
    const alone = neumanModel(20).jacobian!(parameters, geometry, t);
    expect((150 * t[0]!) / (2e-3 * 25 * 25)).toBeLessThan(NEUMAN_DEHOOG_BELOW);
    expect(after.map((c) => Array.from(c))).toEqual(alone.map((c) => Array.from(c)));
    // And after a call at other parameters nothing stale is used.
    warmed.drawdown([120, 2e-3, 0.12, 0.3], geometry, t);
    expect(warmed.jacobian!(parameters, geometry, t).map((c) => Array.from(c))).toEqual(alone.map((c) => Array.from(c)));
    expect(drawdown[0]).toBeGreaterThan(0);
  });

  it("does not mix up two wells whose times give the same t_s (r = 10 m at t, r = 20 m at 4 t: other beta)", () => {
    const parameters = [150, 2e-3, 0.12, 0.3];
    const t = Float64Array.from({ length: 6 }, (_, i) => 0.01 * 3 ** i);
    const t4 = t.map((v) => 4 * v);
    const warmed = neumanModel(20);
    warmed.drawdown(parameters, { r: 10, Q: 800 }, t);
    warmed.drawdown(parameters, { r: 20, Q: 800 }, t4);
    const near = warmed.jacobian!(parameters, { r: 10, Q: 800 }, t).map((c) => Array.from(c));
    const far = warmed.jacobian!(parameters, { r: 20, Q: 800 }, t4).map((c) => Array.from(c));
    expect(near).toEqual(neumanModel(20).jacobian!(parameters, { r: 10, Q: 800 }, t).map((c) => Array.from(c)));
    expect(far).toEqual(neumanModel(20).jacobian!(parameters, { r: 20, Q: 800 }, t4).map((c) => Array.from(c)));
  });
});

describe("the plain-arithmetic helpers of the complex K0", () => {
  it("hypot gives the bits of Math.hypot over 60 decades, with zeros, infinities and NaN", () => {
    const u = uniformGenerator(20261204);
    const differing: number[][] = [];
    for (let i = 0; i < 100000; i++) {
      const a = (u() - 0.5) * 10 ** Math.floor(60 * u() - 30);
      const b = (u() - 0.5) * 10 ** (i % 3 === 0 ? Math.log10(Math.abs(a) + 1e-300) : Math.floor(60 * u() - 30));
      if (hypot(a, b) !== Math.hypot(a, b)) differing.push([a, b]);
    }
    expect(differing).toEqual([]);
    expect(hypot(0, -0)).toBe(0);
    expect(hypot(-Infinity, Number.NaN)).toBe(Infinity);
    expect(hypot(Number.NaN, 1)).toBeNaN();
  });

  it("modulusBelow decides as the comparison of hypot values does, also within 1e-13 of the boundary", () => {
    const u = uniformGenerator(7);
    const differing: number[][] = [];
    let nearBoundary = 0;
    for (let i = 0; i < 20000; i++) {
      const scale = [1e-17, 1e-15, 1e-14][i % 3]!;
      const bRe = (u() - 0.5) * 10 ** Math.floor(20 * u() - 10);
      const bIm = (u() - 0.5) * 10 ** Math.floor(20 * u() - 10);
      const angle = 2 * Math.PI * u();
      // |a| within a few 1e-13 of the boundary scale |b| (and sometimes far from it).
      const ratio = i % 5 === 0 ? 10 ** (4 * u() - 2) : 1 + (u() - 0.5) * 1e-12;
      const size = scale * Math.hypot(bRe, bIm) * ratio;
      const aRe = size * Math.cos(angle);
      const aIm = size * Math.sin(angle);
      for (const orEqual of [false, true]) {
        const expected = orEqual
          ? Math.hypot(aRe, aIm) <= scale * Math.hypot(bRe, bIm)
          : Math.hypot(aRe, aIm) < scale * Math.hypot(bRe, bIm);
        if (modulusBelow(aRe, aIm, scale, bRe, bIm, orEqual) !== expected) differing.push([aRe, aIm, scale, bRe, bIm]);
      }
      if (Math.abs(ratio - 1) < 1e-12) nearBoundary++;
    }
    expect(differing).toEqual([]);
    expect(nearBoundary).toBeGreaterThan(10000);
  });

  it("complexK0 gives the bits of besselK0Complex for 0.01 <= |z| <= 300, |arg z| <= 1.2", () => {
    const out = { re: 0, im: 0 };
    for (const modulus of [0.01, 0.5, 1.9, 2, 2.1, 5, 17, 60, 300]) {
      for (const angle of [-1.2, -0.5, 0, 0.3, 0.785, 1.2]) {
        const z = complex(modulus * Math.cos(angle), modulus * Math.sin(angle));
        const reference = besselK0Complex(z);
        complexK0(z.re, z.im, out);
        expect(out.re, `|z| ${modulus}, arg ${angle}`).toBe(reference.re);
        expect(out.im).toBe(reference.im);
      }
    }
  });

  it("complexK0Pair gives the bits of two besselK0Complex calls, also when the two stop at different iterations", () => {
    const first = { re: 0, im: 0 };
    const second = { re: 0, im: 0 };
    const arguments_ = [complex(2.01, 0), complex(3, -2.5), complex(7.5, 6), complex(40, 1), complex(250, -80)];
    for (const a of arguments_) {
      for (const b of arguments_) {
        complexK0Pair(a.re, a.im, b.re, b.im, first, second);
        expect([first.re, first.im]).toEqual([besselK0Complex(a).re, besselK0Complex(a).im]);
        expect([second.re, second.im]).toEqual([besselK0Complex(b).re, besselK0Complex(b).im]);
      }
    }
  });
});
