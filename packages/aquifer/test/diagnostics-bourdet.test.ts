import { describe, expect, it } from "vitest";
import { bourdetDerivative, bourdetRecoveryDerivative, DiagnosticError } from "../src/diagnostics/index.js";
import { expint1 } from "../src/special/index.js";
import { diagnosticsFixture, relDiff } from "./diagnostics-fixture.js";

/** Log-spaced times, `perDecade` per log10 cycle from 10^from to 10^to. */
function logGrid(from: number, to: number, perDecade: number): number[] {
  const out: number[] = [];
  for (let k = Math.round(from * perDecade); k <= Math.round(to * perDecade); k++) out.push(10 ** (k / perDecade));
  return out;
}

/** Invented aquifer for the synthetic checks (demo numbers, not from any source). */
const T = 250; // m2/d
const S = 2e-4;
const Q = 1200; // m3/d
const r = 40; // m
const C = Q / (4 * Math.PI * T); // m: the late-time derivative level
const a = (r * r * S) / (4 * T); // d: u = a / t

/**
 * Bound on the Bourdet error at a central point: the Bourdet formula is the slope at X_i of the parabola
 * through the three points, so error = (dX1 dX2 / 6) times a mean of f''' on [X_j, X_k] (Taylor expansion);
 * here bounded by the largest |f'''| sampled densely on that interval, times 1.01, plus rounding slack.
 */
function centralBound(dX1: number, dX2: number, xi: number, third: (x: number) => number, scale: number): number {
  let big = 0;
  for (let m = 0; m <= 400; m++) big = Math.max(big, Math.abs(third(xi - dX1 + ((dX1 + dX2) * m) / 400)));
  return ((dX1 * dX2) / 6) * big * 1.01 + 1e-11 * scale;
}

describe("Bourdet et al. (1989) log derivative on Theis drawdown", () => {
  const times = logGrid(-5, 1, 20);
  const s = times.map((t) => C * expint1(a / t));
  // Identity (Theis 1935 differentiated, dE1/du = -e^-u/u): ds/d ln t = Q/(4 pi T) e^(-u), and with
  // X = ln t, u = a e^-X: f''' = d^3 s/dX^3 = C u e^-u (u - 1).
  const third = (x: number): number => {
    const u = a * Math.exp(-x);
    return C * u * Math.exp(-u) * (u - 1);
  };

  it("agrees with the closed form Q/(4 pi T) e^-u at every central point within the three-point Taylor bound", () => {
    for (const L of [0.1, 0.2, 0.4]) {
      const result = bourdetDerivative(times, s, { smoothingLog10: L });
      let checked = 0;
      let worstLateRel = 0;
      result.indices.forEach((i, p) => {
        if (result.stencils[p] !== "central") return;
        const steps = Math.round(L * 20);
        const dX1 = Math.log(times[i]!) - Math.log(times[i - steps]!);
        const dX2 = Math.log(times[i + steps]!) - Math.log(times[i]!);
        const exact = C * Math.exp(-a / times[i]!);
        const err = Math.abs(result.derivative[p]! - exact);
        expect(err, `L = ${L}, t = ${times[i]}`).toBeLessThanOrEqual(centralBound(dX1, dX2, Math.log(times[i]!), third, C));
        if (a / times[i]! <= 0.1) worstLateRel = Math.max(worstLateRel, err / exact);
        checked++;
      });
      expect(checked).toBe(times.length - 2 * Math.round(L * 20));
      // Reached where u <= 0.1 (h = L ln 10, error <= h^2/6 * max u|u - 1| e^-u / e^-u_i): about
      // 4e-3 for L = 0.1, 1.6e-2 for L = 0.2, 6e-2 for L = 0.4 log cycles as the bound; measured below.
      const h = L * Math.LN10;
      expect(worstLateRel).toBeLessThan(((h * h) / 6) * 0.1 * Math.exp(0.1 * (Math.exp(h) - 1)) * 1.01);
    }
  });

  it("agrees with mpmath's numerical derivative of the mpmath Theis drawdown", () => {
    // Reference: tests/fixtures/diagnostics/generate_diagnostics.py (mpmath.e1, mpmath.diff, 30 digits).
    const f = diagnosticsFixture.theis;
    const result = bourdetDerivative(f.times, f.drawdowns, { smoothingLog10: 0.1 });
    const coef = f.Q / (4 * Math.PI * f.T);
    result.indices.forEach((i, p) => {
      const u = (f.r * f.r * f.S) / (4 * f.T * f.times[i]!);
      if (result.stencils[p] === "central" && u <= 0.1) {
        // u <= 0.1, L = 0.1 log cycle: the bound above gives 0.9e-3 relative.
        expect(relDiff(result.derivative[p]!, f.logDerivative[i]!), `t = ${f.times[i]}`).toBeLessThan(1e-3);
      }
    });
    // Late time: the derivative tends to Q/(4 pi T) (last central point: t = 7.9 d, u = 4.0e-5).
    const last = result.indices.length - 1 - result.oneSidedCount / 2;
    expect(relDiff(result.derivative[last]!, coef)).toBeLessThan(1e-4);
  });

  it("has a central error that grows four-fold when L doubles: second order in L", () => {
    const errorAt = (L: number): number => {
      const res = bourdetDerivative(times, s, { smoothingLog10: L });
      const p = res.indices.indexOf(60); // t = 1e-2 d, u = 0.032
      return Math.abs(res.derivative[p]! - C * Math.exp(-a / times[60]!));
    };
    const ratio = errorAt(0.4) / errorAt(0.2);
    expect(ratio).toBeGreaterThan(3.6);
    expect(ratio).toBeLessThan(4.4);
  });

  it("stays within the Taylor bound on unevenly spaced times, where the spacing weights matter", () => {
    // Log times jittered by up to 0.02 cycle (deterministic), so dX1 and dX2 differ at most points.
    const jittered = Array.from({ length: 121 }, (_, k) => 10 ** ((k - 100) / 20 + 0.02 * Math.sin(1.7 * k)));
    const sj = jittered.map((t) => C * expint1(a / t));
    const L = 0.2 * Math.LN10;
    const X = jittered.map(Math.log);
    const res = bourdetDerivative(jittered, sj, { smoothingLog10: 0.2 });
    let unequal = 0;
    res.indices.forEach((i, p) => {
      if (res.stencils[p] !== "central") return;
      // Partners as defined by Bourdet et al. (1989): nearest points at least L away on each side.
      let j = i - 1;
      while (X[i]! - X[j]! < L) j--;
      let k = i + 1;
      while (X[k]! - X[i]! < L) k++;
      const dX1 = X[i]! - X[j]!;
      const dX2 = X[k]! - X[i]!;
      if (Math.abs(dX1 - dX2) > 0.01) unequal++;
      const exact = C * Math.exp(-a / jittered[i]!);
      expect(Math.abs(res.derivative[p]! - exact), `t = ${jittered[i]}`).toBeLessThanOrEqual(centralBound(dX1, dX2, X[i]!, third, C));
    });
    expect(unequal).toBeGreaterThan(50);
  });

  it("gives the points within L of the ends a one-sided slope, or omits them, and counts them", () => {
    // 20 points per cycle and L = 0.2 cycle: the first and last 4 points lack a partner on one side.
    const oneSided = bourdetDerivative(times, s, { smoothingLog10: 0.2 });
    expect(oneSided.oneSidedCount).toBe(8);
    expect(oneSided.omittedCount).toBe(0);
    expect(oneSided.stencils.slice(0, 5)).toEqual(["forward", "forward", "forward", "forward", "central"]);
    expect(oneSided.stencils.at(-1)).toBe("backward");
    // One-sided slope is the plain difference quotient to the partner point.
    const expectFirst = (s[4]! - s[0]!) / (Math.log(times[4]!) - Math.log(times[0]!));
    expect(oneSided.derivative[0]).toBeCloseTo(expectFirst, 14);
    const omitted = bourdetDerivative(times, s, { smoothingLog10: 0.2, endpoints: "omit" });
    expect(omitted.omittedCount).toBe(8);
    expect(omitted.oneSidedCount).toBe(0);
    expect(omitted.indices[0]).toBe(4);
    expect(omitted.times.length).toBe(times.length - 8);
    expect(omitted.smoothingLn).toBeCloseTo(0.2 * Math.LN10, 15);
  });

  it("uses the neighbours when L is 0", () => {
    const t = [1, 2, 4];
    const res = bourdetDerivative(t, [0, 1, 3], { smoothingLog10: 0 });
    // dX1 = dX2 = ln 2; slopes 1/ln2 and 2/ln2; mean weighted equally: 1.5/ln 2.
    expect(res.derivative[1]).toBeCloseTo(1.5 / Math.LN2, 14);
  });

  it("refuses times that are not positive and increasing, with the index", () => {
    expect(() => bourdetDerivative([1, 0.5, 2], [0, 1, 2])).toThrow(/times\[1\] = 0.5 does not follow/);
    expect(() => bourdetDerivative([0, 1, 2], [0, 1, 2])).toThrow(DiagnosticError);
    expect(() => bourdetDerivative([1, 2, 3], [0, 1], {})).toThrow(/one value per time/);
    expect(() => bourdetDerivative([1, 2, 3], [0, 1, 2], { smoothingLog10: -1 })).toThrow(/smoothingLog10/);
  });
});

describe("Bourdet derivative on a barrier-boundary case", () => {
  // Theis plus an image well (method of images): pumping well at distance d = 1000 m from a straight
  // no-flow boundary, observation point 40 m from the well on the side away from the boundary, so the
  // image well is at 2 d + r = 2040 m. s = C [E1(r^2 S/4Tt) + E1(ri^2 S/4Tt)].
  const ri = 2 * 1000 + r;
  const ai = (ri * ri * S) / (4 * T);
  const times = logGrid(-5, 3, 20);
  const s = times.map((t) => C * (expint1(a / t) + expint1(ai / t)));

  it("doubles its level at late time to 2 Q/(4 pi T)", () => {
    const res = bourdetDerivative(times, s, { smoothingLog10: 0.2 });
    const p = res.indices.indexOf(times.length - 5); // last central point, t = 631 d
    // Closed form there: C (e^-u + e^-ui) = 2C (1 - 6.6e-4); Bourdet error there below 1e-5.
    expect(relDiff(res.derivative[p]!, 2 * C)).toBeLessThan(1e-3);
    const early = res.indices.indexOf(60); // t = 1e-2 d: u = 0.032, image still negligible (ui = 83)
    expect(relDiff(res.derivative[early]!, C)).toBeLessThan(0.04);
  });

  it("agrees with the closed form C (e^-u + e^-ui) at every central point within the Taylor bound", () => {
    const third = (x: number): number => {
      const u = a * Math.exp(-x);
      const ui = ai * Math.exp(-x);
      return C * (u * Math.exp(-u) * (u - 1) + ui * Math.exp(-ui) * (ui - 1));
    };
    const res = bourdetDerivative(times, s, { smoothingLog10: 0.2 });
    res.indices.forEach((i, p) => {
      if (res.stencils[p] !== "central") return;
      const exact = C * (Math.exp(-a / times[i]!) + Math.exp(-ai / times[i]!));
      const h = Math.log(times[i + 4]!) - Math.log(times[i]!);
      expect(Math.abs(res.derivative[p]! - exact)).toBeLessThanOrEqual(centralBound(h, h, Math.log(times[i]!), third, C));
    });
  });
});

describe("Bourdet derivative of Theis recovery against Agarwal (1980) equivalent time", () => {
  // Recovery after pumping for tp at a constant rate (superposition of Theis 1935):
  // s'(dt) = C [E1(a/(tp + dt)) - E1(a/dt)]. With te = dt tp/(dt + tp), differentiating gives
  // d(-s')/d ln te = C [e^(-a/dt) (tp + dt) - e^(-a/(tp + dt)) dt] / tp (derived beside this test).
  const tp = 1; // d
  const dts = logGrid(-5, 1, 20);
  const residual = dts.map((dt) => C * (expint1(a / (tp + dt)) - expint1(a / dt)));
  const exactAt = (dt: number): number => (C * (Math.exp(-a / dt) * (tp + dt) - Math.exp(-a / (tp + dt)) * dt)) / tp;

  it("matches the closed form within 2.5e-3 where a/dt <= 0.1 and tends to Q/(4 pi T)", () => {
    const res = bourdetRecoveryDerivative({ timesSinceStop: dts, residualDrawdowns: residual, pumpingDuration: tp }, { smoothingLog10: 0.1 });
    expect(res.timeVariable).toBe("Agarwal equivalent time");
    let worst = 0;
    res.indices.forEach((i, p) => {
      expect(res.times[p]).toBeCloseTo((dts[i]! * tp) / (dts[i]! + tp), 15);
      if (res.stencils[p] !== "central" || a / dts[i]! > 0.1) return;
      worst = Math.max(worst, relDiff(res.derivative[p]!, exactAt(dts[i]!)));
    });
    // Measured 1.6e-3 where a/dt <= 0.1 (second-order error, L = 0.1 cycle; 4.6e-3 with L = 0.2).
    expect(worst).toBeLessThan(2.5e-3);
    // Where dt << tp and a/dt small (dt = 1e-2 d), the recovery derivative is the radial-flow level C.
    const p = res.indices.indexOf(60);
    expect(relDiff(res.derivative[p]!, C)).toBeLessThan(0.04);
  });

  it("returns the recovery s(tp) - s' when the drawdown at the stop is given", () => {
    const sStop = C * expint1(a / tp);
    const res = bourdetRecoveryDerivative({ timesSinceStop: dts, residualDrawdowns: residual, pumpingDuration: tp, drawdownAtStop: sStop });
    expect(res.recovery![0]).toBeCloseTo(sStop - residual[0]!, 14);
    expect(res.equivalentTimes.length).toBe(dts.length);
  });

  it("refuses a pumping duration that is not positive", () => {
    expect(() => bourdetRecoveryDerivative({ timesSinceStop: [1, 2], residualDrawdowns: [1, 0.5], pumpingDuration: 0 })).toThrow(
      /pumpingDuration is 0/,
    );
  });
});
