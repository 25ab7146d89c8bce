/**
 * The Laplace-domain Neuman (1974) solution for fully penetrating pumping and observation wells, as a
 * series over the roots of a transcendental equation, with its partial derivatives.
 *
 * Dimensionless variables (r the radial distance, b the saturated thickness):
 *   t_s = T t / (S r^2),  sigma = S / Sy,  beta = (Kz / Kr) r^2 / b^2,  s_D = 4 pi T s / Q.
 * With p the Laplace variable conjugate to t_s, the transform of s_D is
 *   F(p) = (2 / p) sum_{n >= 0} w_n K0(x_n),   x_n = sqrt(p + beta eps_n^2),
 *   eps_n tan(eps_n) = c,  c = p / (sigma beta),  n pi < eps_n < n pi + pi/2,
 *   w_n = 4 sin^2(eps_n) / (eps_n (2 eps_n + sin 2 eps_n)) = 2 c^2 / (eps_n^2 (eps_n^2 + c^2 + c)).
 * This is the vertically averaged drawdown of Neuman (1974) in Laplace form, as written by Moench (1997,
 * fully penetrating wells with instantaneous drainage at the water table). It follows from separation of
 * variables: the eigenfunctions cos(eps_n z/b) meet no flow at the base and the linearised water-table
 * condition Kz ds/dz = -Sy ds/dt at z = b; the uniform well flux expands into them with coefficients
 * 4 sin(eps_n) / (2 eps_n + sin 2 eps_n), and averaging over the thickness gives w_n (the second form of w_n
 * uses tan(eps_n) = c / eps_n). The weights sum to 1 for every c (the expansion of 1, averaged), which gives
 * the truncation bound used below.
 */
import { besselK0, besselK1 } from "../special/index.js";

/** Most terms summed before the series is declared not converged. */
export const NEUMAN_MAX_TERMS = 100000;

/**
 * Root eps of eps tan(eps) = c (c > 0) in (n pi, n pi + pi/2), solved as h(eps) = eps - n pi - atan(c / eps)
 * = 0 (h increases monotonically across the bracket, h < 0 at the left end and h > 0 at the right end) by
 * Newton's method kept inside the bracket, with bisection whenever a step would leave it; stops when the
 * Newton step is below 1e-15 eps. `guess` must lie in
 * the bracket. About 3 Newton steps from the guesses used here.
 */
export function neumanRoot(n: number, c: number, guess: number): number {
  const base = n * Math.PI;
  let lo = base;
  let hi = base + Math.PI / 2;
  let e = guess > lo && guess < hi ? guess : 0.5 * (lo + hi);
  for (let iteration = 0; iteration < 100; iteration++) {
    const h = e - base - Math.atan(c / e);
    if (h < 0) lo = e;
    else if (h > 0) hi = e;
    else return e;
    const step = h / (1 + c / (e * e + c * c));
    if (Math.abs(step) <= 1e-15 * e) return e - step;
    const next = e - step;
    e = next > lo && next < hi ? next : 0.5 * (lo + hi);
  }
  return e;
}

/** First guess for eps_0 from eps^2 (1 + eps^2 / 3) ~ c at small c and eps ~ (pi/2) c / (1 + c) at large c. */
function firstRootGuess(c: number): number {
  return c < 2 ? Math.sqrt(c / (1 + c / 3)) : (Math.PI / 2) * (c / (1 + c));
}

/** Value of the transform and, when asked, its partial derivatives; scratch reused between calls. */
export interface NeumanTransform {
  /** F(p). */
  value: number;
  /** dF/dp. */
  dp: number;
  /** dF/dsigma. */
  dSigma: number;
  /** dF/dbeta. */
  dBeta: number;
  /** Terms summed in the last call. */
  terms: number;
}

/** A fresh result record for {@link neumanTransform}. */
export function newNeumanTransform(): NeumanTransform {
  return { value: 0, dp: 0, dSigma: 0, dBeta: 0, terms: 0 };
}

/**
 * Evaluates F(p) (see the module comment) for real p > 0, sigma > 0, beta > 0 into `out`; with
 * `derivatives` also dF/dp, dF/dsigma and dF/dbeta (implicit differentiation of eps_n(c):
 * d eps/d c = eps / (eps^2 + c^2 + c)). The series stops after term m once
 * K0(x_m) (1 - w_0 - ... - w_m) <= tolerance * (partial sum): since K0(x_n) decreases with n and the weights
 * are positive and sum to 1, this bounds the neglected tail, so the relative truncation error is below
 * `tolerance`. The same bound with K1 in place of K0 truncates the derivative sums. Dimensionless.
 * Returns false when NEUMAN_MAX_TERMS terms do not reach the tolerance.
 */
export function neumanTransform(
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
