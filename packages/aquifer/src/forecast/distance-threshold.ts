/**
 * Distance to a drawdown threshold: the radius r* (m) at which the drawdown after pumping Q (m3/d) for t (d) falls
 * to a threshold, for models whose drawdown decreases with distance.
 *
 * Method: bracket r* on a geometric grid (factor 2) from rMin outwards, checking on the way that s(r) does not
 * increase; then Brent's method (Brent 1973, Algorithms for Minimization without Derivatives, ch. 4) on
 * g(ln r) = s(r) - threshold until the bracket is 4 eps wide in ln r, which puts s(r*) within about
 * 1e-15 |ds/dln r| of the threshold.
 */
import type { DrawdownModel } from "../models/index.js";
import { ForecastInputError } from "./errors.js";
import { parameterVector } from "./parameters.js";

/** Options of {@link distanceToThreshold}. */
export interface DistanceToThresholdOptions {
  /** Smallest radius searched, m; default 0.01. */
  readonly rMin?: number;
  /** Largest radius searched, m; default 1e7. */
  readonly rMax?: number;
}

/** Result of {@link distanceToThreshold}. */
export interface DistanceToThresholdResult {
  /** Radius where drawdown equals the threshold, m. */
  readonly r: number;
  /** Drawdown at r, m (equals the threshold to rounding). */
  readonly drawdown: number;
  /** Model evaluations used. */
  readonly evaluations: number;
}

/**
 * Radius r* (m) where the drawdown of `model` with parameters `params` (by name or in descriptor order, base units)
 * for a well pumping Q (m3/d) for t (d) equals `threshold` (m, > 0); beyond r* it is smaller. Throws
 * ForecastInputError when the drawdown is below the threshold already at rMin, stays above it out to rMax, or
 * increases with distance. Source: Brent (1973) root finding on the model's s(r).
 */
export function distanceToThreshold(
  model: DrawdownModel,
  params: Readonly<Record<string, number>> | ArrayLike<number>,
  Q: number,
  t: number,
  threshold: number,
  options: DistanceToThresholdOptions = {},
): DistanceToThresholdResult {
  const where = "distanceToThreshold";
  if (!model || typeof model.drawdown !== "function") throw new ForecastInputError(`${where}: model is missing or is not a drawdown model.`);
  const p = parameterVector(where, model, params);
  if (!(Number.isFinite(Q) && Q > 0)) throw new ForecastInputError(`${where}: rate Q is ${Q} m3/d; give an abstraction rate > 0.`);
  if (!(Number.isFinite(t) && t > 0)) throw new ForecastInputError(`${where}: time t is ${t} d; give a pumping time > 0.`);
  if (!(Number.isFinite(threshold) && threshold > 0)) throw new ForecastInputError(`${where}: threshold is ${threshold} m; give a drawdown > 0.`);
  const rMin = options.rMin ?? 0.01;
  const rMax = options.rMax ?? 1e7;
  if (!(rMin > 0 && rMax > rMin && Number.isFinite(rMax))) throw new ForecastInputError(`${where}: search range [${rMin}, ${rMax}] m must satisfy 0 < rMin < rMax.`);
  let evaluations = 0;
  const times = [t];
  const s = (r: number): number => {
    evaluations++;
    const v = model.drawdown(p, { r, Q }, times)[0]!;
    if (!Number.isFinite(v)) throw new ForecastInputError(`${where}: the model gives drawdown ${v} at r = ${r} m, t = ${t} d.`);
    return v;
  };
  let lo = rMin;
  let sLo = s(lo);
  if (sLo < threshold) {
    throw new ForecastInputError(
      `${where}: drawdown is ${sLo.toPrecision(4)} m already at r = ${rMin} m after ${t} d, below the threshold ${threshold} m; ` +
        "the threshold is never exceeded at the distances searched (lower rMin, or the threshold is not reached).",
    );
  }
  let hi = lo;
  let sHi = sLo;
  while (sHi >= threshold) {
    if (hi >= rMax) {
      throw new ForecastInputError(
        `${where}: drawdown is still ${sHi.toPrecision(4)} m at r = ${rMax} m after ${t} d, above the threshold ${threshold} m; ` +
          "it does not fall below the threshold within the range searched (raise rMax, or the model's drawdown does not decay with distance).",
      );
    }
    lo = hi;
    sLo = sHi;
    hi = Math.min(hi * 2, rMax);
    sHi = s(hi);
    if (sHi > sLo) {
      throw new ForecastInputError(`${where}: drawdown increases from ${sLo.toPrecision(6)} m at ${lo} m to ${sHi.toPrecision(6)} m at ${hi} m; the model is not monotone in r, so the threshold radius is not unique.`);
    }
  }
  // Brent's method on g(x) = s(e^x) - threshold, x = ln r, with g(a) >= 0 > g(b).
  let a = Math.log(lo);
  let b = Math.log(hi);
  let fa = sLo - threshold;
  let fb = sHi - threshold;
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  for (let iteration = 0; iteration < 200; iteration++) {
    if ((fb > 0 && fc > 0) || (fb < 0 && fc < 0)) {
      c = a;
      fc = fa;
      d = b - a;
      e = d;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    const tol = 2 * Number.EPSILON * Math.max(1, Math.abs(b));
    const m = 0.5 * (c - b);
    if (Math.abs(m) <= tol || fb === 0) break;
    if (Math.abs(e) >= tol && Math.abs(fa) > Math.abs(fb)) {
      let q: number;
      let r: number;
      let pp: number;
      const sr = fb / fa;
      if (a === c) {
        pp = 2 * m * sr;
        q = 1 - sr;
      } else {
        q = fa / fc;
        r = fb / fc;
        pp = sr * (2 * m * q * (q - r) - (b - a) * (r - 1));
        q = (q - 1) * (r - 1) * (sr - 1);
      }
      if (pp > 0) q = -q;
      else pp = -pp;
      if (2 * pp < Math.min(3 * m * q - Math.abs(tol * q), Math.abs(e * q))) {
        e = d;
        d = pp / q;
      } else {
        d = m;
        e = m;
      }
    } else {
      d = m;
      e = m;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol ? d : m > 0 ? tol : -tol;
    fb = s(Math.exp(b)) - threshold;
  }
  const r = Math.exp(b);
  return { r, drawdown: fb + threshold, evaluations };
}
