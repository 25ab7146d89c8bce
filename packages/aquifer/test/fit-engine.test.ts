import { describe, it, expect } from "vitest";
import {
  applyQTranspose,
  fitModel,
  householderQr,
  jacobiSvd,
  levenbergMarquardt,
  type LeastSquaresProblem,
} from "../src/fit/index.js";
import type { DrawdownModel } from "../src/models/index.js";

/** Test model: s = A (1 - exp(-k t)), A in m (linear), k in 1/d (positive); no analytic Jacobian. */
const recoveryCurve: DrawdownModel = {
  id: "test-saturating",
  name: "saturating exponential (test model)",
  source: "test model",
  assumptions: [],
  validity: [],
  cautions: [],
  parameters: [
    { name: "A", label: "amplitude", unit: "m", positive: false, bounds: [-100, 100], description: "final drawdown" },
    { name: "k", label: "rate", unit: "1/d", positive: true, bounds: [1e-4, 1e4], description: "rate constant" },
  ],
  drawdown(p, _g, t, out) {
    const result = out ?? new Float64Array(t.length);
    for (let i = 0; i < t.length; i++) result[i] = p[0]! * (1 - Math.exp(-p[1]! * t[i]!));
    return result;
  },
};

/** Test model whose drawdown depends on a and b only through a b: not identifiable separately. */
const productOnly: DrawdownModel = {
  ...recoveryCurve,
  id: "test-product",
  parameters: [
    { name: "a", label: "a", unit: "1", positive: true, bounds: [1e-6, 1e6], description: "factor" },
    { name: "b", label: "b", unit: "1", positive: true, bounds: [1e-6, 1e6], description: "factor" },
  ],
  drawdown(p, _g, t, out) {
    const result = out ?? new Float64Array(t.length);
    for (let i = 0; i < t.length; i++) result[i] = 1 - Math.exp(-p[0]! * p[1]! * t[i]!);
    return result;
  },
};

const times = Float64Array.from({ length: 30 }, (_, i) => 0.05 * (i + 1));
const geometry = { r: 10, Q: 100 };

describe("dense linear algebra", () => {
  it("Householder QR keeps the column norms and Q^T preserves vector length", () => {
    const a = Float64Array.of(3, 4, 0, 1, 2, 2); // columns (3, 4, 0) and (1, 2, 2)
    const tau = new Float64Array(2);
    householderQr(a, 3, 2, tau);
    // |R[0,0]| = ||(3, 4, 0)|| = 5 and R[0,1]^2 + R[1,1]^2 = ||(1, 2, 2)||^2 = 9 (hand computation).
    expect(Math.abs(a[0]!)).toBeCloseTo(5, 14);
    expect(a[3]! ** 2 + a[4]! ** 2).toBeCloseTo(9, 13);
    const b = Float64Array.of(1, -2, 3);
    applyQTranspose(a, 3, 2, tau, b);
    expect(b[0]! ** 2 + b[1]! ** 2 + b[2]! ** 2).toBeCloseTo(14, 13);
  });

  it("one-sided Jacobi SVD gives sqrt(45) and sqrt(5) for [[3, 0], [4, 5]]", () => {
    // A^T A = [[25, 20], [20, 25]] has eigenvalues 45 and 5 (hand computation).
    const svd = jacobiSvd(Float64Array.of(3, 4, 0, 5), 2, 2);
    expect(svd.sigma[0]).toBeCloseTo(Math.sqrt(45), 14);
    expect(svd.sigma[1]).toBeCloseTo(Math.sqrt(5), 14);
  });
});

describe("levenbergMarquardt", () => {
  it("solves the Rosenbrock problem from (-1.2, 1) to (1, 1)", () => {
    // Rosenbrock (1960) as residuals r = (10 (x2 - x1^2), 1 - x1); Moré, Garbow & Hillstrom (1981) problem 1.
    const problem: LeastSquaresProblem = {
      residualCount: 2,
      parameterCount: 2,
      residuals(x, out) {
        out[0] = 10 * (x[1]! - x[0]! * x[0]!);
        out[1] = 1 - x[0]!;
      },
      jacobian(x, out) {
        out[0] = -20 * x[0]!;
        out[1] = -1;
        out[2] = 10;
        out[3] = 0;
      },
    };
    const result = levenbergMarquardt(problem, Float64Array.of(-1.2, 1));
    expect(result.x[0]).toBeCloseTo(1, 10);
    expect(result.x[1]).toBeCloseTo(1, 10);
    expect(result.ssr).toBeLessThan(1e-20);
  });

  it("stops with max-evaluations when the budget is too small", () => {
    const problem: LeastSquaresProblem = {
      residualCount: 2,
      parameterCount: 2,
      residuals(x, out) {
        out[0] = 10 * (x[1]! - x[0]! * x[0]!);
        out[1] = 1 - x[0]!;
      },
    };
    const result = levenbergMarquardt(problem, Float64Array.of(-1.2, 1), { maxEvaluations: 8 });
    expect(result.reason).toBe("max-evaluations");
    expect(result.evaluations).toBeGreaterThanOrEqual(8);
  });
});

describe("fitModel with models without an analytic Jacobian", () => {
  const truth = [0.8, 2.5];
  const s = recoveryCurve.drawdown(truth, geometry, times);

  it("recovers the parameters by central differences, with a linear and an ln-space parameter", () => {
    const result = fitModel({ model: recoveryCurve, wells: [{ name: "W", geometry, t: times, s }], start: { A: 0.1, k: 0.1 } });
    expect(result.jacobianMethod).toBe("central");
    expect(result.parameters[0]!.scale).toBe("linear");
    expect(result.parameters[1]!.scale).toBe("ln");
    expect(result.parameters[0]!.estimate).toBeCloseTo(0.8, 9);
    expect(result.parameters[1]!.estimate).toBeCloseTo(2.5, 8);
  });

  it("finds a start by grid search when no straight-line rule applies", () => {
    const result = fitModel({ model: recoveryCurve, wells: [{ name: "W", geometry, t: times, s }] });
    expect(result.start.method).toBe("grid-search");
    expect(result.start.notes.join(" ")).toMatch(/grid search/);
    expect(result.parameters[1]!.estimate).toBeCloseTo(2.5, 7);
  });

  it("names the parameters that cannot be told apart, as an error that withholds convergence", () => {
    const data = productOnly.drawdown([2, 3], geometry, times);
    const noisy = data.map((v, i) => v + 1e-3 * Math.sin(7 * i));
    const result = fitModel({ model: productOnly, wells: [{ name: "W", geometry, t: times, s: noisy }], start: { a: 1, b: 1 } });
    expect(result.parameters[0]!.standardError).toBeNull();
    expect(result.parameters[1]!.standardError).toBeNull();
    expect(result.errors.some((w) => w.startsWith("a and b cannot be determined separately"))).toBe(true);
    expect(result.converged).toBe(false);
    // The product is still fitted.
    expect(result.parameters[0]!.estimate * result.parameters[1]!.estimate).toBeCloseTo(6, 2);
  });

  it("warns when there are fewer than 2 points per parameter", () => {
    const three = fitModel({
      model: recoveryCurve,
      wells: [{ name: "W", geometry, t: times.subarray(0, 3), s: s.subarray(0, 3).map((v, i) => v + 1e-3 * (i - 1)) }],
      start: { A: 0.5, k: 2 },
    });
    expect(three.warnings.some((w) => w.includes("fewer than 2 points per parameter"))).toBe(true);
  });
});
