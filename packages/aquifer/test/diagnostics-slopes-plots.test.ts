import { describe, expect, it } from "vitest";
import { bourdetDerivative, compositePlot, hornerPlot, powerTimePlot, slopeHints } from "../src/diagnostics/index.js";
import { neumanModel, theisDrawdown } from "../src/models/index.js";

const logspace = (a: number, b: number, n: number) => Array.from({ length: n }, (_, i) => a * Math.pow(b / a, i / (n - 1)));

describe("fractional-slope and trough hints", () => {
  // Ideal derivatives (facts of the trade): linear flow s ~ t^(1/2), bilinear s ~ t^(1/4), spherical s = a - b / sqrt(t).
  const t = logspace(1e-3, 10, 60);
  it("reports a half slope for linear flow, a quarter slope for bilinear flow and -1/2 for spherical flow", () => {
    for (const [power, kind] of [[0.5, "half-slope"], [0.25, "quarter-slope"], [-0.5, "negative-half-slope"]] as const) {
      const d = bourdetDerivative(t, t.map((v) => (power > 0 ? 0.3 * Math.pow(v, power) : 5 - 0.3 * Math.pow(v, power))));
      const hints = slopeHints(d).hints.filter((h) => h.kind !== "trough");
      expect(hints.map((h) => h.kind), `power ${power}`).toEqual([kind]);
      expect(Math.abs(hints[0]!.value - power)).toBeLessThan(0.01);
      expect(hints[0]!.message).toMatch(/^Hint, not a verdict/);
    }
  });

  it("finds the delayed-yield trough in the derivative of a Neuman (1974) curve and none for Theis", () => {
    const tt = logspace(1e-4, 50, 80);
    const s = neumanModel(20).drawdown([150, 1e-3, 0.15, 0.5], { r: 10, Q: 800 }, tt);
    const trough = slopeHints(bourdetDerivative(tt, s)).hints.find((h) => h.kind === "trough");
    expect(trough).toBeDefined();
    expect(trough!.value).toBeLessThan(0.5);
    const theis = tt.map((v) => theisDrawdown(150, 1e-3, 800, 10, v));
    expect(slopeHints(bourdetDerivative(tt, theis)).hints.find((h) => h.kind === "trough")).toBeUndefined();
  });
});

describe("specialised plots", () => {
  it("gives slope m and zero intercept on the sqrt(t) plot for s = m sqrt(t)", () => {
    const t = logspace(0.01, 1, 20);
    const plot = powerTimePlot(t, t.map((v) => 0.8 * Math.sqrt(v)), 0.5);
    expect(plot.slope).toBeCloseTo(0.8, 12);
    expect(Math.abs(plot.intercept)).toBeLessThan(1e-12);
  });

  it("gives the Theis recovery slope 2.303 Q / (4 pi T) on the Horner plot once u' is small (within 0.5 %)", () => {
    // Theis (1935) recovery: s' = Q/(4 pi T) [W(u) - W(u')], built from the Theis drawdown by superposition.
    const [T, S, Q, r, tp] = [200, 1e-4, 600, 15, 1];
    const dt = logspace(0.05, 2, 15);
    const residual = dt.map((v) => theisDrawdown(T, S, Q, r, tp + v) - theisDrawdown(T, S, Q, r, v));
    const plot = hornerPlot(tp, dt, residual);
    expect(Math.abs(plot.slope / ((Math.LN10 * Q) / (4 * Math.PI * T)) - 1)).toBeLessThan(5e-3);
  });

  it("puts wells of one Theis aquifer on one curve against t / r^2", () => {
    const series = compositePlot([
      { name: "A", r: 10, t: [0.1, 1], s: [theisDrawdown(100, 1e-4, 500, 10, 0.1), theisDrawdown(100, 1e-4, 500, 10, 1)] },
      { name: "B", r: 40, t: [1.6, 16], s: [theisDrawdown(100, 1e-4, 500, 40, 1.6), theisDrawdown(100, 1e-4, 500, 40, 16)] },
    ]);
    expect(series[1]!.x[0]).toBeCloseTo(series[0]!.x[0]!, 15);
    expect(series[1]!.s[1]).toBeCloseTo(series[0]!.s[1]!, 12);
    expect(() => compositePlot([{ name: "C", r: 0, t: [1], s: [1] }])).toThrow(/r = 0 m/);
  });
});
