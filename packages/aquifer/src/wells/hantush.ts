import { besselK0, besselK1, expint1 } from "../special/index.js";
import { KRONROD15_NODES, KRONROD15_WEIGHTS } from "../numerics/index.js";
import { integrate, integrateToInfinity } from "../numerics/index.js";
import { leakySeries } from "./leakySeries.js";
import { checkRB, checkU } from "./validate.js";

/** Local copies of the G7-K15 nodes and weights (a plain typed array is the fastest to index in a hot loop). */
const NODES = Float64Array.from(KRONROD15_NODES);
const WEIGHTS = Float64Array.from(KRONROD15_WEIGHTS);

/** Largest x = b²/(4u) (or u, on the early side) for which the series route is used. */
const SERIES_LIMIT = 3;
/** Largest |sqrt(u) − sqrt(x)| for which the near-symmetric route is used. */
const NEAR_SYMMETRIC_LIMIT = 1.5;

/**
 * The Hantush-Jacob leaky well function (Hantush & Jacob 1955; tables in Hantush 1956)
 * W(u, b) = ∫_u^∞ (1/y) exp(−y − b²/(4y)) dy, with u = r²S/(4Tt) > 0 and b = r/B >= 0; dimensionless.
 * b = 0 gives the Theis function E1(u).
 *
 * Route (fixed cost, no adaptivity), with x = b²/(4u):
 * 1. late side (u >= b/2, i.e. x <= u) with x <= 3: the convergent series W = Σ (−x)^n/n! E_{n+1}(u)
 *    (term-by-term expansion of e^{−b²/(4y)}; attributed to Hantush & Jacob 1955 from memory), at most
 *    about 30 terms of a recurrence;
 * 2. early side (u < b/2) with u <= 3: the symmetry W(u, b) = 2 K0(b) − W(b²/(4u), b) (the integral is
 *    symmetric under y → b²/(4y); used by Hantush 1956, from memory), the second term by the same series
 *    with the roles of u and x exchanged;
 * 3. otherwise (both u and x above 3, so b > 6, near the inflection point u = b/2): with y = (b/2) e^s and
 *    w = sqrt(2b) sinh(s/2), W = 2 e^{−b} ∫_α^∞ e^{−w²} (w² + 2b)^{−1/2} dw, α = sqrt(u) − sqrt(x), so
 *    W = K0(b) − 2 e^{−b} ∫_0^α e^{−w²} (w² + 2b)^{−1/2} dw, the short integral by one 15-point Kronrod rule
 *    (the integrand is analytic within a distance sqrt(2b) > 3 of an interval of length |α| <= 1.5).
 *    This change of variable is derived here (not taken from a publication); r/B > 10 with |α| > 1.5 falls
 *    back to the adaptive quadrature of `hantushWByQuadrature` (slow but correct).
 * Accuracy against mpmath (30 digits, tests/fixtures/wells/hantush.json: a 31 × 21 log grid over u in
 * [1e-8, 50], r/B in [1e-4, 10] plus a band around u = r/B / 2 for r/B in [6, 10]): max relative error
 * 2.4e-12 (at u = 7.2, r/B = 9, cancellation in the series at x = 2.8), 1.1e-13 on the early side, 1e-15
 * near u = r/B / 2;
 * wells-hantush.test.ts asserts <= 1e-8 per regime. Cost on Node 20 (bundled ESM, loaded 2-core machine):
 * about 0.2 µs per evaluation averaged over that grid, about 0.55 µs near u = r/B / 2 for r/B in [6, 10].
 * No underflow for u <= 50; for u above about 700 the result underflows to 0.
 * @throws RangeError when u is not finite and > 0, or r/B is not finite and >= 0.
 */
export function hantushW(u: number, rB: number): number {
  checkU("hantushW", u);
  checkRB("hantushW", rB);
  if (rB === 0) return expint1(u);
  const x = (rB * rB) / (4 * u);
  if (x <= u) {
    if (x <= SERIES_LIMIT) return leakySeries(u, x, 1);
  } else if (u <= SERIES_LIMIT) {
    return 2 * besselK0(rB) - leakySeries(x, u, 1);
  }
  const alpha = Math.sqrt(u) - Math.sqrt(x);
  if (Math.abs(alpha) <= NEAR_SYMMETRIC_LIMIT) {
    const { w } = nearSymmetricIntegrals(alpha, rB, false);
    return besselK0(rB) - 2 * Math.exp(-rB) * w;
  }
  return hantushWByQuadrature(u, rB);
}

/**
 * ∂W/∂u of the Hantush-Jacob well function: −exp(−u − b²/(4u)) / u (the integrand at its lower limit),
 * b = r/B. Dimensionless. Exact in closed form.
 * @throws RangeError when u is not finite and > 0, or r/B is not finite and >= 0.
 */
export function hantushWdU(u: number, rB: number): number {
  checkU("hantushWdU", u);
  checkRB("hantushWdU", rB);
  return -Math.exp(-u - (rB * rB) / (4 * u)) / u;
}

/**
 * ∂W/∂b of the Hantush-Jacob well function, b = r/B (dimensionless):
 * ∂W/∂b = −(b/2) ∫_u^∞ y^{−2} exp(−y − b²/(4y)) dy (differentiating under the integral sign).
 * Route, with x = b²/(4u), matching `hantushW`:
 * 1. late side, x <= 3: ∂W/∂b = −(b/(2u)) Σ (−x)^n/n! E_{n+2}(u) (the same expansion as W);
 * 2. early side, u <= 3: with y = (b/2)e^s the derivative is −∫_{s0}^∞ e^{−s − b cosh s} ds, and since
 *    ∫_{−∞}^∞ e^{−s − b cosh s} ds = 2 K1(b), ∂W/∂b = −2 K1(b) + (2x/b) Σ (−u)^n/n! E_n(x), E_0(x) = e^{−x}/x;
 * 3. near u = b/2: ∂W/∂b = −K1(b) + 2 e^{−b} ∫_0^α (1 + w²/b) e^{−w²} (w² + 2b)^{−1/2} dw + e^{−u−x}/b
 *    with the same w and α as `hantushW`. Routes 2 and 3 are derived here.
 * Accuracy: max relative error 9e-12 against mpmath on the same fixture (wells-hantush.test.ts asserts
 * <= 1e-8 per regime); cost about that of `hantushW`. At b = 0 the derivative is 0.
 * @throws RangeError when u is not finite and > 0, or r/B is not finite and >= 0.
 */
export function hantushWdRB(u: number, rB: number): number {
  checkU("hantushWdRB", u);
  checkRB("hantushWdRB", rB);
  if (rB === 0) return 0;
  const x = (rB * rB) / (4 * u);
  if (x <= u) {
    if (x <= SERIES_LIMIT) return (-rB / (2 * u)) * leakySeries(u, x, 2);
  } else if (u <= SERIES_LIMIT) {
    return -2 * besselK1(rB) + ((2 * x) / rB) * leakySeries(x, u, 0);
  }
  const alpha = Math.sqrt(u) - Math.sqrt(x);
  if (Math.abs(alpha) <= NEAR_SYMMETRIC_LIMIT) {
    const { dw } = nearSymmetricIntegrals(alpha, rB, true);
    return -besselK1(rB) + 2 * Math.exp(-rB) * dw + Math.exp(-u - x) / rB;
  }
  return hantushWdRBByQuadrature(u, rB);
}

/**
 * ∫_0^α e^{−w²}/sqrt(w² + 2b) dw and, when asked, ∫_0^α (1 + w²/b) e^{−w²}/sqrt(w² + 2b) dw, by one
 * 15-point Kronrod rule on [0, α] (α may be negative: the integral is then signed).
 */
function nearSymmetricIntegrals(alpha: number, b: number, withDerivative: boolean): { w: number; dw: number } {
  const half = 0.5 * alpha;
  const twoB = 2 * b;
  let w = 0;
  let dw = 0;
  for (let j = 0; j < 15; j++) {
    const node = j < 8 ? NODES[j]! : -NODES[14 - j]!;
    const weight = WEIGHTS[j < 8 ? j : 14 - j]!;
    const p = half + half * node;
    const p2 = p * p;
    const g = (weight * Math.exp(-p2)) / Math.sqrt(p2 + twoB);
    w += g;
    if (withDerivative) dw += g * (1 + p2 / b);
  }
  return { w: w * half, dw: dw * half };
}

/**
 * The Hantush-Jacob well function by adaptive G7-K15 quadrature after the substitution y = u e^t:
 * W(u, b) = ∫_0^∞ exp(−u e^t − b² e^{−t}/(4u)) dt. A slow, independent reference for `hantushW`
 * (hundreds of integrand evaluations); relative tolerance 1e-13. Dimensionless.
 * @throws RangeError when u is not finite and > 0, or r/B is not finite and >= 0.
 */
export function hantushWByQuadrature(u: number, rB: number): number {
  checkU("hantushWByQuadrature", u);
  checkRB("hantushWByQuadrature", rB);
  const x = (rB * rB) / (4 * u);
  return integrateAroundPeak((t) => Math.exp(-u * Math.exp(t) - x * Math.exp(-t)), u, rB);
}

/**
 * ∫_0^∞ g(t) dt for an integrand of the form exp(−u e^t − x e^{−t}) times a slowly varying factor, split at the
 * peak e^t = b/(2u) when it lies beyond t = 0 (otherwise the adaptive rule could miss a narrow peak far out).
 */
function integrateAroundPeak(g: (t: number) => number, u: number, rB: number): number {
  const options = { relTol: 1e-13, absTol: 0, maxSubdivisions: 2000 };
  const peak = Math.log(rB / (2 * u));
  if (!(peak > 0)) return integrateToInfinity(g, 0, options).value;
  return integrate(g, 0, peak, options).value + integrateToInfinity(g, peak, options).value;
}

/**
 * ∂W/∂b by adaptive quadrature after y = u e^t: −(b/(2u)) ∫_0^∞ e^{−t} exp(−u e^t − b² e^{−t}/(4u)) dt.
 * Slow reference for `hantushWdRB`; relative tolerance 1e-13. Dimensionless.
 * @throws RangeError when u is not finite and > 0, or r/B is not finite and >= 0.
 */
export function hantushWdRBByQuadrature(u: number, rB: number): number {
  checkU("hantushWdRBByQuadrature", u);
  checkRB("hantushWdRBByQuadrature", rB);
  if (rB === 0) return 0;
  const x = (rB * rB) / (4 * u);
  const integral = integrateAroundPeak((t) => Math.exp(-t - u * Math.exp(t) - x * Math.exp(-t)), u, rB);
  return (-rB / (2 * u)) * integral;
}
