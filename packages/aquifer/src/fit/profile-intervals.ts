/**
 * Profile-likelihood intervals for one fitted coordinate (Bates, D.M. and Watts, D.G. (1988), Nonlinear
 * Regression Analysis and Its Applications, Wiley, section 6.1): with the coordinate theta_j held at c and the
 * others re-fitted, S(c) is the smallest sum of squares, and the profile t statistic is
 *   tau(c) = sign(c - theta_hat_j) sqrt((S(c) - S_min) / scale),
 * scale = s^2 for the linearised calibration (times the variance inflation of the AR(1) correction when that is
 * in use, an approximation that keeps the profile's shape and the correction's width). The interval is where
 * |tau| <= t, with t the quantile of the interval in use. Unlike the linearised interval it follows a likelihood
 * that is far from quadratic (a leakage factor near its bound, S from a short test) and may be asymmetric; where
 * S(c) never reaches the level before a bound, the bound is the end and the interval is marked open there.
 */

import { levenbergMarquardt, type LeastSquaresProblem } from "./levenberg-marquardt.js";

/** A profile interval in the fitting space. */
export interface ProfileInterval {
  readonly lower: number;
  readonly upper: number;
  /** True where the end is a bound, not a crossing of the level. */
  readonly lowerOpen: boolean;
  readonly upperOpen: boolean;
  /** Conditional fits made. */
  readonly fits: number;
  /** True when a conditional fit found a smaller sum of squares than the fit itself (a local minimum). */
  readonly betterMinimum: boolean;
}

/** The setting of one profile: problem, optimum, bounds (fitting space) and calibration. */
export interface ProfileSetting {
  readonly problem: LeastSquaresProblem;
  readonly optimum: Float64Array;
  readonly ssrMin: number;
  readonly lower: Float64Array;
  readonly upper: Float64Array;
  /** Variance scale of tau (see the module comment). */
  readonly scale: number;
  /** Level of |tau| at the interval ends. */
  readonly level: number;
  /** Linearised standard error of the coordinate (sets the first trial step). */
  readonly standardError: number;
  readonly ftol?: number;
  readonly xtol?: number;
  readonly gtol?: number;
  readonly finiteDifferences?: "forward" | "central";
}

/** Smallest sum of squares with coordinate j held at c, started from `start` (the other coordinates). */
function conditionalFit(setting: ProfileSetting, j: number, c: number, start: Float64Array): { ssr: number; x: Float64Array } {
  const { problem } = setting;
  const p = problem.parameterCount;
  const n = problem.residualCount;
  const full = new Float64Array(p);
  const expand = (x: Float64Array) => {
    for (let k = 0, m = 0; k < p; k++) full[k] = k === j ? c : x[m++]!;
    return full;
  };
  if (p === 1) {
    const r = new Float64Array(n);
    problem.residuals(Float64Array.of(c), r);
    let ssr = 0;
    for (let i = 0; i < n; i++) ssr += r[i]! * r[i]!;
    return { ssr: Number.isFinite(ssr) ? ssr : Infinity, x: new Float64Array(0) };
  }
  const fullJacobian = new Float64Array(n * p);
  const sub: LeastSquaresProblem = {
    residualCount: n,
    parameterCount: p - 1,
    residuals(x, out) {
      problem.residuals(expand(x), out);
    },
    ...(problem.jacobian
      ? {
          jacobian(x: Float64Array, out: Float64Array) {
            problem.jacobian!(expand(x), fullJacobian);
            for (let k = 0, m = 0; k < p; k++) {
              if (k === j) continue;
              out.set(fullJacobian.subarray(k * n, (k + 1) * n), m * n);
              m++;
            }
          },
        }
      : {}),
  };
  const lower = new Float64Array(p - 1);
  const upper = new Float64Array(p - 1);
  for (let k = 0, m = 0; k < p; k++) {
    if (k === j) continue;
    lower[m] = setting.lower[k]!;
    upper[m] = setting.upper[k]!;
    m++;
  }
  const x0 = Float64Array.from(start, (v, m) => Math.min(Math.max(v, lower[m]!), upper[m]!));
  const probe = new Float64Array(n);
  sub.residuals(x0, probe);
  for (let i = 0; i < n; i++) if (!Number.isFinite(probe[i]!)) return { ssr: Infinity, x: x0 };
  const result = levenbergMarquardt(sub, x0, {
    lower,
    upper,
    ftol: setting.ftol ?? 1e-10,
    xtol: setting.xtol ?? 1e-10,
    gtol: setting.gtol ?? 1e-10,
    maxEvaluations: 50 * p,
    finiteDifferences: setting.finiteDifferences ?? "central",
    initialResiduals: probe,
  });
  return { ssr: result.ssr, x: result.x };
}

/**
 * Profile interval of fitting-space coordinate j (see the module comment). Each end is bracketed by doubling
 * the step from theta_hat +- level * SE (at most 8 doublings), then found by regula falsi (Illinois) on tau to
 * 1e-3 of the level (at most 12 steps, then the middle of the bracket).
 */
export function profileInterval(setting: ProfileSetting, j: number): ProfileInterval {
  const { optimum, ssrMin } = setting;
  const centre = optimum[j]!;
  const others: Float64Array = Float64Array.from(Array.from(optimum).filter((_, k) => k !== j));
  let fits = 0;
  let betterMinimum = false;
  const tau = (c: number, start: Float64Array): { tau: number; x: Float64Array } => {
    const fit = conditionalFit(setting, j, c, start);
    fits++;
    if (fit.ssr < ssrMin * (1 - 1e-9)) betterMinimum = true;
    return { tau: Math.sqrt(Math.max(0, fit.ssr - ssrMin) / setting.scale), x: fit.x };
  };
  const firstStep = Number.isFinite(setting.standardError) && setting.standardError > 0 ? setting.level * setting.standardError : 0.1;
  const side = (direction: 1 | -1): { end: number; open: boolean } => {
    const room = direction > 0 ? setting.upper[j]! - centre : centre - setting.lower[j]!;
    if (!(room > 0)) return { end: centre, open: true };
    let dLow = 0;
    let tauLow = 0;
    let startLow: Float64Array = others;
    let d = Math.min(firstStep, room);
    let trial = tau(centre + direction * d, others);
    let guard = 0;
    while (trial.tau < setting.level) {
      if (d >= room || guard++ > 8) return { end: centre + direction * Math.min(d, room), open: true };
      dLow = d;
      tauLow = trial.tau;
      startLow = trial.x;
      d = Math.min(2 * d, room);
      trial = tau(centre + direction * d, trial.x);
    }
    let dHigh = d;
    let fHigh = trial.tau - setting.level;
    let fLow = tauLow - setting.level;
    let startHigh: Float64Array = trial.x;
    let lastSide = 0;
    for (let iteration = 0; iteration < 12; iteration++) {
      const next = (dLow * fHigh - dHigh * fLow) / (fHigh - fLow);
      const dMid = next > dLow && next < dHigh ? next : 0.5 * (dLow + dHigh);
      const nearer = dMid - dLow < dHigh - dMid ? startLow : startHigh;
      const value = tau(centre + direction * dMid, nearer);
      const f = value.tau - setting.level;
      if (Math.abs(f) <= 1e-3 * setting.level || dHigh - dLow <= 1e-6 * Math.max(dHigh, 1e-3)) return { end: centre + direction * dMid, open: false };
      if (f < 0) {
        dLow = dMid;
        fLow = f;
        startLow = value.x;
        if (lastSide === -1) fHigh /= 2;
        lastSide = -1;
      } else {
        dHigh = dMid;
        fHigh = f;
        startHigh = value.x;
        if (lastSide === 1) fLow /= 2;
        lastSide = 1;
      }
    }
    return { end: centre + direction * 0.5 * (dLow + dHigh), open: false };
  };
  const low = side(-1);
  const high = side(1);
  return { lower: low.end, upper: high.end, lowerOpen: low.open, upperOpen: high.open, fits, betterMinimum };
}
