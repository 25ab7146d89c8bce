/**
 * Checks of the independence the least-squares intervals assume, on the weighted residuals of a fit, each
 * well's points in time order:
 *
 * - lag-1 autocorrelation r1 = sum e_i e_(i+1) / sum e_i^2 (pairs within a well only);
 * - the Durbin-Watson statistic d = sum (e_(i+1) - e_i)^2 / sum e_i^2 (Durbin, J. and Watson, G.S. (1950),
 *   Biometrika 37, 409-428) against positive serial correlation. Under independent normal errors d = e'MAMe /
 *   e'Me is independent of its denominator, so E d = tr(MA)/nu and var d = 2 (nu tr((MA)^2) - tr(MA)^2) /
 *   (nu^2 (nu + 2)), nu = n - p, M = I - Q Q' the least-squares projection of this fit's own Jacobian. The
 *   p-value P(d <= observed) uses a beta distribution on [0, 4] with these two moments (the approximation
 *   suggested by Durbin and Watson (1971), Biometrika 58, 1-19; from memory); checked against the exact
 *   distribution by Imhof's (1961) integral in tests/fixtures/fit/generate_diagnostics.py;
 * - the runs test of Wald, A. and Wolfowitz, J. (1940), Ann. Math. Statist. 11, 147-162: runs of equal sign,
 *   E R = 1 + 2 n+ n- / m and var R = 2 n+ n- (2 n+ n- - m) / (m^2 (m - 1)) per well, summed over wells,
 *   one-sided normal p-value with continuity correction (too few runs: residuals cluster);
 * - an AR(1) coefficient rho for the interval correction: the rho at which the expected lag-1 autocorrelation of
 *   the residuals of this fit, tr(M C M Sigma) / tr(M Sigma), equals the observed r1. The raw r1 is biased low
 *   because the fit absorbs slow wanders of the noise (at n = 30 and rho = 0.8 it averages about 0.57); matching
 *   the expectation under the fit's own projection removes most of that bias (about 0.75 in the same case).
 *
 * The residuals are declared not independent when the Durbin-Watson p-value is below the level (default 0.05).
 */

import { normalCdf } from "./distributions.js";
import { regularizedIncompleteBeta } from "./student-t.js";
import {
  adjacentPairs,
  differenceProduct,
  dot,
  inTimeOrder,
  orthonormalBasis,
  projectedTracesOf,
  type TimeOrder,
} from "./residual-structure.js";

/** Durbin-Watson statistic with its null moments and one-sided p-value (positive serial correlation). */
export interface DurbinWatsonTest {
  /** d, between 0 and 4; about 2 for independent residuals, small for positively correlated ones. */
  readonly statistic: number;
  /** E d under independent errors for this fit's Jacobian. */
  readonly expected: number;
  readonly standardDeviation: number;
  /** P(d <= observed) under independence (beta approximation). */
  readonly pValue: number;
}

/** Wald-Wolfowitz runs test of the residual signs. */
export interface RunsTest {
  readonly runs: number;
  readonly expected: number;
  readonly standardDeviation: number;
  /** P(R <= observed) under independence (normal approximation with continuity correction). */
  readonly pValue: number;
}

/** Independence checks of a fit's residuals (dimensionless). */
export interface ResidualDiagnostics {
  /** Whether the checks could be made: at least 8 points, 5 adjacent pairs and 3 degrees of freedom. */
  readonly assessed: boolean;
  /** Lag-1 autocorrelation of the weighted residuals in time order, within wells. */
  readonly lag1Autocorrelation: number | null;
  /** AR(1) coefficient corrected for the fit (see the module comment), in [-0.95, 0.99]. */
  readonly ar1Coefficient: number | null;
  readonly durbinWatson: DurbinWatsonTest | null;
  readonly runs: RunsTest | null;
  /** Level of the Durbin-Watson test used for the decision. */
  readonly level: number;
  /** False when the Durbin-Watson test rejects independence at `level`. */
  readonly independent: boolean;
  /** Plain-language statement of what the checks found. */
  readonly note: string;
}

/** Durbin-Watson p-value P(d <= observed) from a beta distribution on [0, 4] with the given moments. */
function durbinWatsonPValue(d: number, mean: number, variance: number): number {
  const m = mean / 4;
  const v = variance / 16;
  const total = (m * (1 - m)) / v - 1;
  if (!(total > 0) || !(m > 0 && m < 1)) return normalCdf((d - mean) / Math.sqrt(variance));
  const x = Math.min(Math.max(d / 4, 0), 1);
  return regularizedIncompleteBeta(x, m * total, (1 - m) * total);
}

function runsTest(order: TimeOrder, e: Float64Array): RunsTest | null {
  let runs = 0;
  let expected = 0;
  let variance = 0;
  for (let w = 0; w + 1 < order.blocks.length; w++) {
    let plus = 0;
    let minus = 0;
    let last = 0;
    let wellRuns = 0;
    for (let k = order.blocks[w]!; k < order.blocks[w + 1]!; k++) {
      const sign = e[k]! > 0 ? 1 : e[k]! < 0 ? -1 : 0;
      if (sign === 0) continue;
      if (sign > 0) plus++;
      else minus++;
      if (sign !== last) wellRuns++;
      last = sign;
    }
    const m = plus + minus;
    if (plus === 0 || minus === 0 || m < 2) continue;
    runs += wellRuns;
    expected += 1 + (2 * plus * minus) / m;
    variance += (2 * plus * minus * (2 * plus * minus - m)) / (m * m * (m - 1));
  }
  if (!(variance > 0)) return null;
  const sd = Math.sqrt(variance);
  return { runs, expected, standardDeviation: sd, pValue: normalCdf((runs - expected + 0.5) / sd) };
}

/**
 * Solves tr(M C M S(rho)) / tr(M S(rho)) = r1 for rho in [-0.95, 0.99] by the Illinois variant of regula falsi
 * (Dowell, M. and Jarratt, P. (1971), BIT 11, 168-174), which keeps the root bracketed and converges
 * superlinearly: about 8 evaluations to 1e-12 where bisection needs 34.
 */
function matchedCoefficient(order: TimeOrder, basis: readonly Float64Array[], r1: number): number {
  const traces = projectedTracesOf(order, basis);
  const f = (rho: number) => {
    const t = traces(rho);
    return t.mcmSigma / t.mSigma - r1;
  };
  let a = -0.95;
  let b = 0.99;
  let fa = f(a);
  if (fa >= 0) return a;
  let fb = f(b);
  if (fb <= 0) return b;
  let side = 0;
  for (let i = 0; i < 100 && b - a > 1e-12; i++) {
    let c = (a * fb - b * fa) / (fb - fa);
    if (!(c > a && c < b)) c = 0.5 * (a + b);
    const fc = f(c);
    if (fc === 0) return c;
    if (fc < 0) {
      a = c;
      fa = fc;
      if (side === -1) fb *= 0.5;
      side = -1;
    } else {
      b = c;
      fb = fc;
      if (side === 1) fa *= 0.5;
      side = 1;
    }
  }
  return 0.5 * (a + b);
}

/**
 * Independence checks of weighted residuals `residuals` (packed order) of a fit with the column-major n-by-p
 * weighted Jacobian `jacobian` (packed order), each well's points taken in time order `order`; `level` is the
 * Durbin-Watson test level (default 0.05). Sources and formulas: see the module comment.
 */
export function residualDiagnostics(
  order: TimeOrder,
  residuals: Float64Array,
  jacobian: Float64Array,
  p: number,
  level = 0.05,
): ResidualDiagnostics {
  const n = order.seq.length;
  const e = inTimeOrder(order, residuals);
  const basis = orthonormalBasis(order, jacobian, p);
  const pairs = adjacentPairs(order);
  const nu = n - basis.length;
  const ssr = dot(e, e);
  if (n < 8 || pairs < 5 || nu < 3 || !(ssr > 0)) {
    return {
      assessed: false,
      lag1Autocorrelation: null,
      ar1Coefficient: null,
      durbinWatson: null,
      runs: null,
      level,
      independent: true,
      note:
        `Independence of the residuals not checked: ${n} points, ${pairs} adjacent pairs and ${nu} degrees of freedom ` +
        "(the checks need at least 8, 5 and 3, and residuals that are not all zero). The intervals assume independent errors.",
    };
  }
  let lagSum = 0;
  let diffSum = 0;
  for (let w = 0; w + 1 < order.blocks.length; w++) {
    for (let k = order.blocks[w]! + 1; k < order.blocks[w + 1]!; k++) {
      lagSum += e[k]! * e[k - 1]!;
      diffSum += (e[k]! - e[k - 1]!) ** 2;
    }
  }
  const r1 = lagSum / ssr;
  const d = diffSum / ssr;

  // Null moments of d: tr(MA) and tr((MA)^2) with M = I - QQ'.
  let traceA = 0;
  let traceA2 = 0;
  for (let w = 0; w + 1 < order.blocks.length; w++) {
    const m = order.blocks[w + 1]! - order.blocks[w]!;
    if (m >= 2) {
      traceA += 2 * (m - 1);
      traceA2 += 6 * m - 8;
    }
  }
  const aq = basis.map((q) => differenceProduct(order, q, new Float64Array(n)));
  let traceMA = traceA;
  let traceMA2 = traceA2;
  for (let k = 0; k < basis.length; k++) {
    traceMA -= dot(basis[k]!, aq[k]!);
    traceMA2 -= 2 * dot(aq[k]!, aq[k]!);
  }
  for (let a = 0; a < basis.length; a++) for (let b = 0; b < basis.length; b++) traceMA2 += dot(basis[a]!, aq[b]!) ** 2;
  const mean = traceMA / nu;
  const variance = (2 * (nu * traceMA2 - traceMA * traceMA)) / (nu * nu * (nu + 2));
  const durbinWatson: DurbinWatsonTest = {
    statistic: d,
    expected: mean,
    standardDeviation: Math.sqrt(variance),
    pValue: durbinWatsonPValue(d, mean, variance),
  };
  const runs = runsTest(order, e);
  const rho = matchedCoefficient(order, basis, r1);
  const independent = !(durbinWatson.pValue < level);
  const fmt = (v: number) => Number(v.toPrecision(2)).toString();
  const runsText = runs
    ? `${runs.runs} runs of equal sign where ${fmt(runs.expected)} are expected (p = ${fmt(runs.pValue)})`
    : "no runs test (residuals of one sign)";
  const note = independent
    ? `Residuals consistent with independent errors: Durbin-Watson d = ${fmt(d)} (p = ${fmt(durbinWatson.pValue)} for positive ` +
      `serial correlation), lag-1 autocorrelation ${fmt(r1)}, ${runsText}.` +
      (runs && runs.pValue < level ? " The runs test alone finds the signs clustered: look at the residual plot." : "")
    : `Residuals are NOT independent: Durbin-Watson d = ${fmt(d)} (p = ${fmt(durbinWatson.pValue)}), lag-1 autocorrelation ${fmt(r1)} ` +
      `(about ${fmt(rho)} after allowing for the fit), ${runsText}. Neighbouring readings share their errors, as logger drift, ` +
      "barometric and tidal effects or a model that misses part of the response produce; intervals that assume independence " +
      "are then too narrow, and information criteria overstate the evidence.";
  return { assessed: true, lag1Autocorrelation: r1, ar1Coefficient: rho, durbinWatson, runs, level, independent, note };
}
