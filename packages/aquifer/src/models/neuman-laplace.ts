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
 * uses tan(eps_n) = c / eps_n). The weights sum to 1 for every c (the expansion of 1, averaged).
 *
 * Evaluation (neumanTransform): each root from the previous one with one arctangent and one Newton step
 * accepted by its quadratic error estimate (neumanNextRoot), K0 and K1 sharing one exponential; the
 * truncation rule is that of the direct series in neuman-laplace-reference.ts (kept as the test reference),
 * so both sum the same terms and agree to round-off (about 1e-15 relative, measured in the tests).
 */
import { besselK0, besselK0e, besselK1, besselK1e } from "../special/index.js";

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
export function firstRootGuess(c: number): number {
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
 * Root eps_n (n >= 1) of eps tan(eps) = c (c > 0) in (n pi, n pi + pi/2), from the root `previous` = eps_(n-1).
 * Guess g = n pi + atan(c / (previous + pi)) (one fixed-point step of eps = n pi + atan(c / eps)), then one
 * Newton step on h(eps) = eps - n pi - atan(c / eps), where h(g) = atan(z), z = c (g - previous - pi) /
 * ((previous + pi) g + c^2) by the arctangent subtraction formula (its Taylor series for |z| <= 1e-2, to
 * 1e-19 absolute), then Newton steps on h, each new residual again from the subtraction formula. A Newton
 * result is accepted when its quadratic error estimate |h''| / (2 h') step^2 (twice, as a margin;
 * |h''| = 2 c eps / (eps^2 + c^2)^2) is below 1e-16 eps and the step is below 1e-3 eps; after four steps
 * (not met in the tests) the bracketed solver neumanRoot finishes. Accuracy as neumanRoot's.
 */
export function neumanNextRoot(n: number, c: number, previous: number): number {
  const base = n * Math.PI;
  const shifted = previous + Math.PI;
  let g = base + Math.atan(c / shifted);
  const z = (c * (g - shifted)) / (shifted * g + c * c);
  const z2 = z * z;
  let h = Math.abs(z) <= 1e-2 ? z * (1 - z2 * (1 / 3 - z2 * (1 / 5 - z2 / 7))) : Math.atan(z);
  for (let iteration = 0; iteration < 4; iteration++) {
    const g2c2 = g * g + c * c;
    const slope = 1 + c / g2c2;
    const step = h / slope;
    const e = g - step;
    const curvature = (c * g) / (g2c2 * g2c2 * slope);
    if (Math.abs(step) <= 1e-3 * g && 2 * curvature * step * step <= 1e-16 * e) return e;
    if (!(e > base && e < base + Math.PI / 2)) break;
    // h(e) = e - base - atan(c / e) = (h(g) - step) + atan(c / g) - atan(c / e), the difference of the
    // arctangents by the subtraction formula atan(c (e - g) / (g e + c^2)), so no digits cancel.
    h = h - step + Math.atan((c * (e - g)) / (g * e + c * c));
    g = e;
  }
  return neumanRoot(n, c, g);
}

/**
 * Evaluates F(p) (see the module comment) for real p > 0, sigma > 0, beta > 0 into `out`; with
 * `derivatives` also dF/dp, dF/dsigma and dF/dbeta (implicit differentiation of eps_n(c):
 * d eps/d c = eps / (eps^2 + c^2 + c)). The series stops after term m once
 * K0(x_m) (1 - w_0 - ... - w_m) <= tolerance * (partial sum): since K0(x_n) decreases with n and the weights
 * are positive and sum to 1, this bounds the neglected tail, so the relative truncation error is below
 * `tolerance`. The same bound with K1 in place of K0 truncates the derivative sums. Dimensionless.
 * Returns false when NEUMAN_MAX_TERMS terms do not reach the tolerance. Roots by neumanNextRoot; K0 and K1
 * from their scaled forms times one shared e^-x for x > 2. With `known` (the terms {@link neumanTransformValueLogged}
 * logged for the same p, sigma and beta) the first known.count roots and K0 values are read instead of computed:
 * the same numbers, so the same bits.
 */
export function neumanTransform(
  p: number,
  sigma: number,
  beta: number,
  tolerance: number,
  derivatives: boolean,
  out: NeumanTransform,
  known?: NeumanKnownTerms,
): boolean {
  const knownCount = known === undefined ? 0 : known.count;
  const knownData = known === undefined ? EMPTY : known.log.data;
  const knownStart = known === undefined ? 0 : known.start;
  const c = p / (sigma * beta);
  let sum = 0;
  let weightSum = 0;
  // Derivative accumulators: d/dc of the sum through the roots and weights, d/dp and d/dbeta explicit in x.
  let sumDc = 0;
  let sumDx2p = 0;
  let sumDx2beta = 0;
  let e = knownCount > 0 ? knownData[knownStart]! : neumanRoot(0, c, firstRootGuess(c));
  let converged = false;
  let n = 0;
  for (; n < NEUMAN_MAX_TERMS; n++) {
    const isKnown = n < knownCount;
    if (n > 0) e = isKnown ? knownData[knownStart + 2 * n]! : neumanNextRoot(n, c, e);
    const e2 = e * e;
    const denominator = e2 + c * c + c;
    const w = (2 * c * c) / (e2 * denominator);
    const x = Math.sqrt(p + beta * e2);
    let k0: number;
    let k1 = 0;
    if (x > 2) {
      const decay = Math.exp(-x);
      k0 = isKnown ? knownData[knownStart + 2 * n + 1]! : besselK0e(x) * decay;
      if (derivatives) k1 = besselK1e(x) * decay;
    } else {
      k0 = isKnown ? knownData[knownStart + 2 * n + 1]! : besselK0(x);
      if (derivatives) k1 = besselK1(x);
    }
    sum += w * k0;
    weightSum += w;
    if (derivatives) {
      const deDc = e / denominator;
      // ln w = ln 2 + 2 ln c - 2 ln e - ln(denominator); d denominator = 2 e de + (2c + 1) dc.
      const dlnwDc = 2 / c - (2 / e) * deDc - (2 * e * deDc + 2 * c + 1) / denominator;
      // dK0(x)/dc through eps: -K1(x) beta e / x * de/dc.
      sumDc += w * (k0 * dlnwDc - (k1 * beta * e * deDc) / x);
      // Explicit parts: dx/dp = 1/(2x), dx/dbeta = e^2/(2x).
      const termDx2p = (w * k1) / (2 * x);
      sumDx2p -= termDx2p;
      sumDx2beta -= termDx2p * e2;
    }
    const tail = Math.max(0, 1 - weightSum);
    if (n >= 1 && Math.max(k0, k1) * tail <= tolerance * sum) {
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

/**
 * F(p) alone (no derivatives), as {@link neumanTransform} computes it: the same roots, terms and truncation
 * rule in a loop without the derivative work, for the drawdown evaluations that need no Jacobian.
 * Dimensionless; NaN when NEUMAN_MAX_TERMS terms do not reach the tolerance.
 */
export function neumanTransformValue(p: number, sigma: number, beta: number, tolerance: number): number {
  const c = p / (sigma * beta);
  const cc = c * c;
  const twoC2 = 2 * c * c;
  let sum = 0;
  let weightSum = 0;
  let e = neumanRoot(0, c, firstRootGuess(c));
  for (let n = 0; n < NEUMAN_MAX_TERMS; n++) {
    if (n > 0) e = neumanNextRoot(n, c, e);
    const e2 = e * e;
    const w = twoC2 / (e2 * (e2 + cc + c));
    const x = Math.sqrt(p + beta * e2);
    const k0 = x > 2 ? besselK0e(x) * Math.exp(-x) : besselK0(x);
    sum += w * k0;
    weightSum += w;
    if (n >= 1 && k0 * (1 - weightSum) <= tolerance * sum) return (2 / p) * sum;
  }
  return Number.NaN;
}


const EMPTY = new Float64Array(0);

/** Roots eps_n and K0(x_n) of evaluated terms, appended in pairs (e, K0) in the order they are summed. */
export class NeumanTermLog {
  /** [e_0, K0_0, e_1, K0_1, ...] of every logged evaluation, back to back. */
  data = new Float64Array(4096);
  /** Numbers used in `data`. */
  length = 0;

  /** Appends one term. */
  push(e: number, k0: number): void {
    if (this.length + 2 > this.data.length) {
      const grown = new Float64Array(this.data.length * 2);
      grown.set(this.data);
      this.data = grown;
    }
    this.data[this.length++] = e;
    this.data[this.length++] = k0;
  }

  /** Forgets every logged term. */
  clear(): void {
    this.length = 0;
  }
}

/** The terms of one logged evaluation: `count` pairs from `start` in `log.data`. */
export interface NeumanKnownTerms {
  log: NeumanTermLog;
  start: number;
  count: number;
}

/**
 * {@link neumanTransformValue} that also appends each summed term's root and K0 value to `log` (the same loop and
 * operations, so the same F(p)), for a later {@link neumanTransform} with derivatives at the same p, sigma, beta.
 * Dimensionless; NaN when NEUMAN_MAX_TERMS terms do not reach the tolerance.
 */
export function neumanTransformValueLogged(p: number, sigma: number, beta: number, tolerance: number, log: NeumanTermLog): number {
  const c = p / (sigma * beta);
  const cc = c * c;
  const twoC2 = 2 * c * c;
  let sum = 0;
  let weightSum = 0;
  let e = neumanRoot(0, c, firstRootGuess(c));
  for (let n = 0; n < NEUMAN_MAX_TERMS; n++) {
    if (n > 0) e = neumanNextRoot(n, c, e);
    const e2 = e * e;
    const w = twoC2 / (e2 * (e2 + cc + c));
    const x = Math.sqrt(p + beta * e2);
    const k0 = x > 2 ? besselK0e(x) * Math.exp(-x) : besselK0(x);
    log.push(e, k0);
    sum += w * k0;
    weightSum += w;
    if (n >= 1 && k0 * (1 - weightSum) <= tolerance * sum) return (2 / p) * sum;
  }
  return Number.NaN;
}
