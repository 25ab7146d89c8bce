/**
 * The direct series for the Laplace-domain Neuman (1974) drawdown, kept as the reference against which the
 * fast evaluation in neuman-laplace.ts is tested: every root solved by Newton's method to a verified step
 * below 1e-15 eps, every term summed until the simple tail bound K0(x_m) (1 - w_0 - ... - w_m) meets the
 * tolerance. Formulas, variables and sources as in neuman-laplace.ts (Neuman 1974; Moench 1997).
 */
import { besselK0, besselK1 } from "../special/index.js";
import { NEUMAN_MAX_TERMS, firstRootGuess, neumanRoot, type NeumanTransform } from "./neuman-laplace.js";

/**
 * Reference evaluation of F(p) (the module comment of neuman-laplace.ts) term by term, for real p > 0, sigma > 0, beta > 0 into `out`; with
 * `derivatives` also dF/dp, dF/dsigma and dF/dbeta (implicit differentiation of eps_n(c):
 * d eps/d c = eps / (eps^2 + c^2 + c)). The series stops after term m once
 * K0(x_m) (1 - w_0 - ... - w_m) <= tolerance * (partial sum): since K0(x_n) decreases with n and the weights
 * are positive and sum to 1, this bounds the neglected tail, so the relative truncation error is below
 * `tolerance`. The same bound with K1 in place of K0 truncates the derivative sums. Dimensionless.
 * Returns false when NEUMAN_MAX_TERMS terms do not reach the tolerance.
 */
export function neumanTransformBySeries(
  p: number,
  sigma: number,
  beta: number,
  tolerance: number,
  derivatives: boolean,
  out: NeumanTransform,
): boolean {
  const c = p / (sigma * beta);
  let sum = 0;
  let weightSum = 0;
  // Derivative accumulators: d/dc of the sum through the roots and weights, d/dp and d/dbeta explicit in x.
  let sumDc = 0;
  let sumDx2p = 0;
  let sumDx2beta = 0;
  let e = firstRootGuess(c);
  let converged = false;
  let n = 0;
  for (; n < NEUMAN_MAX_TERMS; n++) {
    // For n >= 1 the previous root plus pi, corrected once by the fixed point eps = n pi + atan(c / eps).
    e = neumanRoot(n, c, n === 0 ? e : n * Math.PI + Math.atan(c / (e + Math.PI)));
    const e2 = e * e;
    const denominator = e2 + c * c + c;
    const w = (2 * c * c) / (e2 * denominator);
    const x = Math.sqrt(p + beta * e2);
    const k0 = besselK0(x);
    sum += w * k0;
    weightSum += w;
    let k1 = 0;
    if (derivatives) {
      k1 = besselK1(x);
      const deDc = e / denominator;
      // ln w = ln 2 + 2 ln c - 2 ln e - ln(denominator); d denominator = 2 e de + (2c + 1) dc.
      const dlnwDc = 2 / c - (2 / e) * deDc - (2 * e * deDc + 2 * c + 1) / denominator;
      // dK0(x)/dc through eps: -K1(x) beta e / x * de/dc.
      sumDc += w * (k0 * dlnwDc - (k1 * beta * e * deDc) / x);
      // Explicit parts: dx/dp = 1/(2x), dx/dbeta = e^2/(2x).
      sumDx2p += (-w * k1) / (2 * x);
      sumDx2beta += (-w * k1 * e2) / (2 * x);
    }
    const tail = Math.max(0, 1 - weightSum);
    const tailBound = Math.max(k0, derivatives ? k1 : 0) * tail;
    if (n >= 1 && tailBound <= tolerance * sum) {
      converged = true;
      break;
    }
  }
  const scale = 2 / p;
  out.value = scale * sum;
  out.terms = Math.min(n + 1, NEUMAN_MAX_TERMS);
  if (derivatives) {
    // c = p / (sigma beta): dc/dp = c/p, dc/dsigma = -c/sigma, dc/dbeta = -c/beta.
    out.dp = -out.value / p + scale * (sumDx2p + (sumDc * c) / p);
    out.dSigma = scale * (-sumDc * c) / sigma;
    out.dBeta = scale * (sumDx2beta - (sumDc * c) / beta);
  } else {
    out.dp = Number.NaN;
    out.dSigma = Number.NaN;
    out.dBeta = Number.NaN;
  }
  return converged;
}
