import { describe, expect, it } from "vitest";
import { fitModel, papadopulosCooperModel, startingValues, theisDrawdown } from "../src/index.js";

// Invented geometry and aquifer; the reference is the Theis solution itself (identity: with a small casing
// radius the Papadopulos-Cooper drawdown at an observation well is Theis, so the Cooper-Jacob line applies).
const T = 250; // m2/d
const S = 4e-4;
const Q = 900; // m3/d
const r = 30; // m
const t = Array.from({ length: 40 }, (_, i) => 1e-3 * Math.pow(10, (i * 3.5) / 39)); // d, 1.4 min .. 3 d
const s = t.map((ti) => theisDrawdown(T, S, Q, r, ti));

describe("starting values for models without a rule of their own", () => {
  it("take T and S from the Cooper-Jacob line for a model whose parameters begin with T and S", () => {
    const model = papadopulosCooperModel({ rc: 0.01, rw: 0.1 });
    const start = startingValues(model, { r, Q }, t, s);
    expect(start.values.length).toBe(2);
    // The late straight line of Theis data gives T within a few per cent (common practice, no source).
    expect(Math.abs(start.values[0]! / T - 1)).toBeLessThan(0.05);
    expect(start.notes[0]).toMatch(/Cooper-Jacob line/);
  });

  it("let fitModel converge from them without explicit start values", () => {
    const model = papadopulosCooperModel({ rc: 0.01, rw: 0.1 });
    const fit = fitModel({ model, wells: [{ name: "OB-A", geometry: { r, Q }, t: Float64Array.from(t), s: Float64Array.from(s) }] });
    expect(fit.start.method).not.toBe("grid-search");
    expect(Math.abs(fit.parameters[0]!.estimate / T - 1)).toBeLessThan(1e-4);
  });
});
