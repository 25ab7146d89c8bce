import { describe, expect, it } from "vitest";
import {
  cooperJacobLine,
  cooperJacobModel,
  cooperJacobValidity,
} from "../src/models/cooper-jacob.js";
import { ModelInputError } from "../src/models/errors.js";
import { theisModel } from "../src/models/theis.js";
import { centralDifferences, fixture, relDiff } from "./models-fixture.js";

const EULER_GAMMA = 0.5772156649015329; // Euler-Mascheroni constant (from memory; 16 digits agree with mpmath.euler)

/** Log-spaced times from 10^a to 10^b d, n points. */
function logTimes(a: number, b: number, n: number): number[] {
  return Array.from({ length: n }, (_, i) => Math.pow(10, a + ((b - a) * i) / (n - 1)));
}

describe("Cooper-Jacob (1946) straight line", () => {
  it("stays within 0.5 % of the Theis drawdown for u <= 0.01; the largest gap is 0.201 % at u = 0.01", () => {
    // Theis W(u) from mpmath. With T, S, r, t chosen so that u is each grid value, the Cooper-Jacob drawdown
    // divided by Q/(4 pi T) is ln(2.25/(4u)).
    const T = 100;
    const g = { r: 1, Q: 4 * Math.PI * T };
    let worst = 0;
    let worstU = 0;
    for (const { u, W } of fixture.smallU) {
      const S = 1e-4;
      const t = (g.r * g.r * S) / (4 * T * u);
      const cj = cooperJacobModel.drawdown([T, S], g, [t])[0]!;
      const d = relDiff(cj, W);
      expect(d, `u = ${u}`).toBeLessThan(0.005);
      if (u <= 1e-3) expect(d, `u = ${u}`).toBeLessThan(5e-4);
      if (d > worst) {
        worst = d;
        worstU = u;
      }
    }
    expect(worstU).toBeCloseTo(0.01, 12);
    expect(worst).toBeGreaterThan(0.00200);
    expect(worst).toBeLessThan(0.00202);
  });

  it("differs from Theis by the series tail u - u^2/4 + u^3/18 - u^4/96 minus the 2.25 rounding offset", () => {
    // W(u) = -gamma - ln u + sum_{k>=1} (-1)^(k+1) u^k / (k k!) (the standard series of E1; A&S 5.1.11,
    // from memory). Cooper-Jacob keeps ln(2.25/(4u)) = -ln u + ln 0.5625, so
    // W - CJ = (u - u^2/4 + u^3/18 - u^4/96 + ...) - (gamma + ln 0.5625), the constant being 0.0018515.
    const offset = EULER_GAMMA + Math.log(0.5625);
    expect(offset).toBeCloseTo(0.0018515, 7);
    const T = 50;
    const g = { r: 1, Q: 4 * Math.PI * T };
    for (const { u, W } of fixture.smallU) {
      const S = 2e-4;
      const t = (g.r * g.r * S) / (4 * T * u);
      const cj = cooperJacobModel.drawdown([T, S], g, [t])[0]!;
      const tail = u - (u * u) / 4 + (u * u * u) / 18 - (u * u * u * u) / 96;
      expect(W - cj - (tail - offset), `u = ${u}`).toBeCloseTo(0, 12);
    }
  });

  it("is about 2 % below Theis at u = 0.05, the looser criterion also in use", () => {
    const p = [200, 1e-3];
    const g = { r: 20, Q: 500 };
    const t = (20 * 20 * 1e-3) / (4 * 200 * 0.05);
    const theis = theisModel.drawdown(p, g, [t])[0]!;
    const cj = cooperJacobModel.drawdown(p, g, [t])[0]!;
    // W(0.05) = 2.4679, ln(11.25) = 2.4204 (mpmath), relative gap 1.92 %.
    expect((theis - cj) / theis).toBeGreaterThan(0.019);
    expect((theis - cj) / theis).toBeLessThan(0.0195);
  });

  it("has an analytic Jacobian that agrees with central finite differences within 1e-6", () => {
    const g = { r: 25, Q: 700 };
    const t = logTimes(-1, 2, 7);
    const p = [150, 3e-4];
    const J = cooperJacobModel.jacobian!(p, g, t);
    const fd = centralDifferences((q) => cooperJacobModel.drawdown(q, g, t), p);
    const s = cooperJacobModel.drawdown(p, g, t);
    for (let k = 0; k < 2; k++) {
      for (let i = 0; i < t.length; i++) {
        const scale = Math.max(Math.abs(J[k]![i]!), Math.abs(s[i]!) / p[k]!);
        expect(Math.abs(J[k]![i]! - fd[k]![i]!) / scale, `param ${k}, t = ${t[i]}`).toBeLessThan(1e-6);
      }
    }
  });

  it("flags the times where u <= uMax", () => {
    // T = 100 m2/d, S = 1e-4, r = 50 m: u = 6.25e-4 / t, so u <= 0.01 from t = 0.0625 d and u <= 0.05
    // from t = 0.0125 d.
    const t = [0.01, 0.02, 0.07, 5, 0, Number.NaN];
    expect(cooperJacobValidity(100, 1e-4, 50, t)).toEqual([false, false, true, true, false, false]);
    expect(cooperJacobValidity(100, 1e-4, 50, t, 0.05)).toEqual([false, true, true, true, false, false]);
  });

  it("recovers T and S exactly from drawdowns that lie on a Cooper-Jacob line", () => {
    const p = [420, 6e-5];
    const g = { r: 80, Q: 1500 };
    const t = logTimes(-2, 1, 31);
    const s = cooperJacobModel.drawdown(p, g, t);
    const line = cooperJacobLine(t, s, { ...g });
    expect(relDiff(line.T, 420)).toBeLessThan(1e-12);
    expect(relDiff(line.S, 6e-5)).toBeLessThan(1e-10);
    // Slope per log cycle 2.303 Q / (4 pi T) and intercept t0 = r^2 S / (2.25 T).
    expect(relDiff(line.slope, (Math.LN10 * 1500) / (4 * Math.PI * 420))).toBeLessThan(1e-12);
    expect(relDiff(line.t0, (80 * 80 * 6e-5) / (2.25 * 420))).toBeLessThan(1e-10);
    expect(line.rmsResidual).toBeLessThan(1e-12);
    expect(line.converged).toBe(true);
  });

  it("recovers T within 0.5 % and S within 3 % from late Theis drawdowns, leaving out the points with u > 0.01", () => {
    // Invented scenario: T = 250 m2/d, S = 2e-4, r = 60 m, Q = 1000 m3/d, 3 log cycles of data.
    const p = [250, 2e-4];
    const g = { r: 60, Q: 1000 };
    const t = logTimes(-3, 1, 41);
    const s = theisModel.drawdown(p, g, t);
    const line = cooperJacobLine(t, s, { ...g });
    expect(line.converged).toBe(true);
    expect(relDiff(line.T, 250)).toBeLessThan(0.005);
    expect(relDiff(line.S, 2e-4)).toBeLessThan(0.03);
    for (const i of line.used) expect(line.u[i]!).toBeLessThanOrEqual(0.01);
    expect(line.excluded.length).toBeGreaterThan(0);
    for (const e of line.excluded) {
      expect(e.reason).toBe("u-above-limit");
      expect(e.u).toBeGreaterThan(0.01);
    }
    expect(line.used.length + line.excluded.length).toBe(t.length);
  });

  it("reaches the same line from prior estimates as from the later half of the record", () => {
    const p = [250, 2e-4];
    const g = { r: 60, Q: 1000 };
    const t = logTimes(-3, 1, 41);
    const s = theisModel.drawdown(p, g, t);
    const a = cooperJacobLine(t, s, { ...g });
    const b = cooperJacobLine(t, s, { ...g, T0: 250, S0: 2e-4 });
    expect(b.used).toEqual(a.used);
    expect(b.T).toBe(a.T);
  });

  it("fits every point once when not iterating, and warns that early points bias T upwards", () => {
    const p = [250, 2e-4];
    const g = { r: 60, Q: 1000 };
    const t = logTimes(-3, 1, 41);
    const s = theisModel.drawdown(p, g, t);
    const once = cooperJacobLine(t, s, { ...g, iterate: false });
    expect(once.used.length).toBe(41);
    expect(once.iterations).toBe(1);
    // The early points (slope below the asymptote) pull T up by about 4 % in this record.
    expect(once.T).toBeGreaterThan(250 * 1.02);
    expect(once.warnings.join(" ")).toMatch(/have u > 0.01/);
    expect(once.converged).toBe(false);
  });

  it("lists non-positive and non-finite times as excluded with their reasons", () => {
    const p = [250, 2e-4];
    const g = { r: 60, Q: 1000 };
    const t = [0, ...logTimes(-1, 1, 11), Number.NaN];
    const s = Array.from(theisModel.drawdown(p, g, t));
    s[12] = 1;
    const line = cooperJacobLine(t, s, { ...g });
    const reasons = line.excluded.map((e) => [e.index, e.reason]);
    expect(reasons).toContainEqual([0, "time-not-positive"]);
    expect(reasons).toContainEqual([12, "not-finite"]);
  });

  it("warns, and does not claim convergence, when the record is too short for u <= uMax", () => {
    // r = 300 m, T = 100, S = 1e-3: u = 0.225 / t, so u <= 0.01 needs t >= 22.5 d; the record ends at 1 d.
    const p = [100, 1e-3];
    const g = { r: 300, Q: 800 };
    const t = logTimes(-1, 0, 11);
    const s = theisModel.drawdown(p, g, t);
    const line = cooperJacobLine(t, s, { ...g });
    expect(line.converged).toBe(false);
    expect(line.warnings.join(" ")).toMatch(/too short/);
  });

  it("refuses drawdowns that fall with time, explaining why", () => {
    const t = [1, 2, 4, 8];
    const s = [1, 0.9, 0.8, 0.7];
    expect(() => cooperJacobLine(t, s, { r: 10, Q: 100 })).toThrow(ModelInputError);
    expect(() => cooperJacobLine(t, s, { r: 10, Q: 100 })).toThrow(/does not match the sign of Q/);
  });

  it("refuses arrays of different lengths and records with fewer than two usable points", () => {
    expect(() => cooperJacobLine([1, 2], [1], { r: 10, Q: 100 })).toThrow(/2 times but 1 drawdowns/);
    expect(() => cooperJacobLine([0, 1], [0, 1], { r: 10, Q: 100 })).toThrow(/only 1 point/);
  });
});
