/**
 * Cooper and Jacob (1946): the straight-line (logarithmic) approximation of the Theis solution for small u.
 *
 *   s = Q / (4 pi T) ln(2.25 T t / (r^2 S))
 *
 * It drops every term after -gamma - ln u of the series W(u) = -gamma - ln u + u - u^2/4 + ..., and rounds
 * 4 exp(-gamma) = 2.2458 to 2.25 as in the original paper. On s against log10 t it is a straight line of slope
 * 2.303 Q / (4 pi T) per log cycle that crosses s = 0 at t0 = r^2 S / (2.25 T).
 *
 * Source: Cooper, H.H. and Jacob, C.E. (1946), Trans. Am. Geophys. Union 27(4), 526-534.
 */
import { checkGeometry, checkParameters, checkScalar, outputArray } from "./checks.js";
import { ModelInputError } from "./errors.js";
import type { DrawdownModel, ObservationGeometry } from "./model.js";
import { storativityParameter, transmissivityParameter } from "./parameters.js";

const FOUR_PI = 4 * Math.PI;

/**
 * Default largest u for the straight-line approximation. 0.01 is common practice (no source); 0.05 is also
 * used. At u = 0.01 the line is within 0.2 % of the Theis drawdown, at u = 0.05 within 2 %.
 */
export const COOPER_JACOB_DEFAULT_U_MAX = 0.01;

/** Cooper-Jacob straight line as a DrawdownModel; parameter vector [T (m2/d), S (1)]. */
export const cooperJacobModel: DrawdownModel = {
  id: "cooper-jacob",
  name: "Cooper-Jacob (1946) straight-line approximation",
  source:
    "Cooper, H.H. and Jacob, C.E. (1946). A generalized graphical method for evaluating formation " +
    "constants and summarizing well-field history. Transactions, American Geophysical Union 27(4), 526-534.",
  assumptions: [
    "All assumptions of the Theis (1935) solution: confined, homogeneous, isotropic, infinite aquifer; " +
      "constant rate; fully penetrating well of infinitesimal radius; instantaneous release from storage.",
    "u = r^2 S / (4 T t) is small enough that W(u) is replaced by -0.5772 - ln u.",
  ],
  validity: [
    "u <= 0.01 (common practice, no source; 0.05 is also used): the line is then within 0.2 % (0.05: 2 %) " +
      "of the Theis drawdown.",
    "Late time at a given distance: t >= 25 r^2 S / T for u <= 0.01.",
  ],
  cautions: [
    "The formula is returned as it stands at every time: it is negative before t0 = r^2 S / (2.25 T) and " +
      "too low wherever u is not small; fit it to late data only.",
    "A straight line on s against log t is necessary, not sufficient: leakage, boundaries and delayed yield " +
      "also produce straight segments with other slopes. Check the whole record against Theis.",
    "Projecting the line beyond the tested duration assumes no boundary or recharge is met later; state the " +
      "duration tested beside any long-term yield derived from it.",
  ],
  parameters: [transmissivityParameter, storativityParameter],

  drawdown(p: ArrayLike<number>, geometry: ObservationGeometry, t: ArrayLike<number>, out?: Float64Array): Float64Array {
    checkParameters(cooperJacobModel, p);
    checkGeometry(cooperJacobModel.name, geometry);
    const T = p[0]!;
    const S = p[1]!;
    const result = outputArray(cooperJacobModel.name, t.length, out);
    const coef = geometry.Q / (FOUR_PI * T);
    const factor = (2.25 * T) / (geometry.r * geometry.r * S);
    for (let i = 0; i < t.length; i++) {
      const ti = t[i]!;
      result[i] = ti > 0 ? coef * Math.log(factor * ti) : ti <= 0 ? 0 : Number.NaN;
    }
    return result;
  },

  jacobian(p: ArrayLike<number>, geometry: ObservationGeometry, t: ArrayLike<number>): Float64Array[] {
    checkParameters(cooperJacobModel, p);
    checkGeometry(cooperJacobModel.name, geometry);
    const T = p[0]!;
    const S = p[1]!;
    const dT = new Float64Array(t.length);
    const dS = new Float64Array(t.length);
    const coef = geometry.Q / (FOUR_PI * T);
    const factor = (2.25 * T) / (geometry.r * geometry.r * S);
    for (let i = 0; i < t.length; i++) {
      const ti = t[i]!;
      if (ti > 0) {
        // ds/dT = (coef - s) / T,  ds/dS = -coef / S.
        const s = coef * Math.log(factor * ti);
        dT[i] = (coef - s) / T;
        dS[i] = -coef / S;
      } else if (!(ti <= 0)) {
        dT[i] = Number.NaN;
        dS[i] = Number.NaN;
      }
    }
    return [dT, dS];
  },
};

/**
 * For each time t (d), whether u = r^2 S / (4 T t) <= uMax, i.e. whether the Cooper-Jacob line may be used
 * there. T in m2/d, S dimensionless, r in m. Times <= 0 or not finite are flagged false. uMax defaults to
 * 0.01 (common practice, no source; 0.05 is also used).
 */
export function cooperJacobValidity(
  T: number,
  S: number,
  r: number,
  t: ArrayLike<number>,
  uMax: number = COOPER_JACOB_DEFAULT_U_MAX,
): boolean[] {
  const where = "cooperJacobValidity";
  checkScalar(where, "transmissivity T", T, "m2/d", true);
  checkScalar(where, "storativity S", S, "1", true);
  checkScalar(where, "radial distance r", r, "m", true);
  checkScalar(where, "uMax", uMax, "1", true);
  const uTimesT = (r * r * S) / (4 * T);
  const flags: boolean[] = new Array<boolean>(t.length);
  for (let i = 0; i < t.length; i++) {
    const ti = t[i]!;
    flags[i] = Number.isFinite(ti) && ti > 0 && uTimesT / ti <= uMax;
  }
  return flags;
}

/** Options of {@link cooperJacobLine}. */
export interface CooperJacobLineOptions {
  /** Radial distance of the observation point, m. */
  readonly r: number;
  /** Constant pumping rate, m3/d (positive for abstraction). */
  readonly Q: number;
  /** Largest u accepted, dimensionless; default 0.01 (common practice, no source). */
  readonly uMax?: number;
  /** Prior transmissivity estimate, m2/d; with S0 it selects the first set of points. */
  readonly T0?: number;
  /** Prior storativity estimate; with T0 it selects the first set of points. */
  readonly S0?: number;
  /** Refit until the set of points with u <= uMax is stable (default true). */
  readonly iterate?: boolean;
  /** Cap on refits when iterating (default 50). */
  readonly maxIterations?: number;
}

/** Why a point was left out of the straight-line fit. */
export type CooperJacobExclusionReason = "time-not-positive" | "not-finite" | "u-above-limit";

/** One point left out of the fit. */
export interface CooperJacobExcludedPoint {
  /** Index into the input arrays. */
  readonly index: number;
  readonly t: number;
  readonly s: number;
  readonly reason: CooperJacobExclusionReason;
  /** The u that decided the exclusion (for "u-above-limit"), else NaN. */
  readonly u: number;
  /** A sentence for the user. */
  readonly message: string;
}

/** Result of {@link cooperJacobLine}. */
export interface CooperJacobLineResult {
  /** Drawdown change per log10 cycle of time, m. */
  readonly slope: number;
  /** Time at which the line crosses s = 0, d. */
  readonly t0: number;
  /** Transmissivity 2.303 Q / (4 pi slope), m2/d (ln 10 is used for 2.303). */
  readonly T: number;
  /** Storativity 2.25 T t0 / r^2, dimensionless. */
  readonly S: number;
  /** Root-mean-square residual of the used points about the line, m. */
  readonly rmsResidual: number;
  /** Indices of the points the final line was fitted to, in increasing time order. */
  readonly used: number[];
  /** Points left out, with reasons. */
  readonly excluded: CooperJacobExcludedPoint[];
  /** u = r^2 S / (4 T t) of every input point under the final T and S (NaN where t <= 0 or not finite). */
  readonly u: Float64Array;
  /** The criterion applied. */
  readonly uMax: number;
  /** Number of line fits made. */
  readonly iterations: number;
  /** True when the final set of points is exactly the set with u <= uMax under the final T and S. */
  readonly converged: boolean;
  /** Plain-language notes on anything the user should check. */
  readonly warnings: string[];
}

interface LineFit {
  slope: number;
  intercept: number;
  rms: number;
}

/** Least squares s = intercept + slope log10 t over the given indices. */
function fitLine(t: ArrayLike<number>, s: ArrayLike<number>, indices: readonly number[]): LineFit {
  const n = indices.length;
  let mx = 0;
  let my = 0;
  for (const i of indices) {
    mx += Math.log10(t[i]!);
    my += s[i]!;
  }
  mx /= n;
  my /= n;
  let sxx = 0;
  let sxy = 0;
  for (const i of indices) {
    const dx = Math.log10(t[i]!) - mx;
    sxx += dx * dx;
    sxy += dx * (s[i]! - my);
  }
  if (!(sxx > 0)) {
    throw new ModelInputError(
      "cooperJacobLine: the selected points all have the same time; a straight line needs at least two " +
        "different times. Supply more late-time data or raise uMax.",
    );
  }
  const slope = sxy / sxx;
  const intercept = my - slope * mx;
  let ssr = 0;
  for (const i of indices) {
    const e = s[i]! - (intercept + slope * Math.log10(t[i]!));
    ssr += e * e;
  }
  return { slope, intercept, rms: Math.sqrt(ssr / n) };
}

function sameSet(a: readonly number[], b: readonly number[]): boolean {
  return a.length === b.length && a.every((v, k) => v === b[k]);
}

/**
 * Fits the Cooper-Jacob straight line to drawdown s (m) against log10 of time t (d) at distance r (m) from a
 * well pumping Q (m3/d), on the points where u <= uMax, and returns slope (m per log cycle), t0 (d),
 * T = 2.303 Q / (4 pi slope) (m2/d) and S = 2.25 T t0 / r^2.
 *
 * Point selection: with T0 and S0 the first set is the points with u <= uMax under them; otherwise it is the
 * later half of the usable points. When iterating (default), T and S from each line decide the next set
 * (u <= uMax) until it no longer changes. Since u = 0.5625 t0 / t on the line, the criterion amounts to
 * t >= 0.5625 t0 / uMax. Source: Cooper and Jacob (1946).
 *
 * @throws ModelInputError when the arrays differ in length, r or Q is invalid, fewer than two usable points
 *   remain, or drawdown does not grow with time on the selected points.
 */
export function cooperJacobLine(
  t: ArrayLike<number>,
  s: ArrayLike<number>,
  options: CooperJacobLineOptions,
): CooperJacobLineResult {
  const where = "cooperJacobLine";
  if (t.length !== s.length) {
    throw new ModelInputError(`${where}: ${t.length} times but ${s.length} drawdowns; pass one drawdown per time.`);
  }
  const { r, Q } = options;
  checkScalar(where, "radial distance r", r, "m", true);
  checkScalar(where, "pumping rate Q", Q, "m3/d", false);
  if (Q === 0) throw new ModelInputError(`${where}: pumping rate Q is 0 m3/d; the line needs a non-zero rate.`);
  const uMax = options.uMax ?? COOPER_JACOB_DEFAULT_U_MAX;
  checkScalar(where, "uMax", uMax, "1", true);
  const iterate = options.iterate ?? true;
  const maxIterations = options.maxIterations ?? 50;
  const hasPrior = options.T0 !== undefined || options.S0 !== undefined;
  if (hasPrior) {
    if (options.T0 === undefined || options.S0 === undefined) {
      throw new ModelInputError(`${where}: give both T0 and S0, or neither.`);
    }
    checkScalar(where, "T0", options.T0, "m2/d", true);
    checkScalar(where, "S0", options.S0, "1", true);
  }

  const excludedUpFront: CooperJacobExcludedPoint[] = [];
  const usable: number[] = [];
  for (let i = 0; i < t.length; i++) {
    const ti = t[i]!;
    const si = s[i]!;
    if (!Number.isFinite(ti) || !Number.isFinite(si)) {
      excludedUpFront.push({
        index: i, t: ti, s: si, reason: "not-finite", u: Number.NaN,
        message: `Point ${i} (t = ${ti} d, s = ${si} m) is not a finite number pair.`,
      });
    } else if (!(ti > 0)) {
      excludedUpFront.push({
        index: i, t: ti, s: si, reason: "time-not-positive", u: Number.NaN,
        message: `Point ${i} has t = ${ti} d; a logarithmic time axis needs t > 0 (pumping started at t = 0).`,
      });
    } else {
      usable.push(i);
    }
  }
  usable.sort((a, b) => t[a]! - t[b]! || a - b);
  if (usable.length < 2) {
    throw new ModelInputError(
      `${where}: only ${usable.length} point(s) with t > 0 and finite drawdown; the line needs at least two.`,
    );
  }

  const r2 = r * r;
  const selectBy = (T: number, S: number): number[] => usable.filter((i) => (r2 * S) / (4 * T * t[i]!) <= uMax);

  const warnings: string[] = [];
  let set: number[];
  if (hasPrior) {
    set = selectBy(options.T0!, options.S0!);
    if (set.length < 2) {
      warnings.push(
        `Under T0 = ${options.T0} m2/d and S0 = ${options.S0}, only ${set.length} point(s) have u <= ${uMax}; ` +
          "started from the later half of the record instead.",
      );
      set = usable.slice(Math.floor(usable.length / 2));
    }
  } else {
    set = iterate ? usable.slice(Math.floor(usable.length / 2)) : usable.slice();
  }

  const seen: number[][] = [];
  let fit = fitLine(t, s, set);
  let iterations = 1;
  let converged = false;
  let decidedBy: { T: number; S: number } | undefined = hasPrior ? { T: options.T0!, S: options.S0! } : undefined;
  const estimate = (f: LineFit): { T: number; S: number; t0: number } => {
    if (!(f.slope * Q > 0)) {
      throw new ModelInputError(
        `${where}: on the ${set.length} selected points drawdown changes by ${f.slope.toPrecision(3)} m per log ` +
          "cycle, which does not match the sign of Q; the record has no straight-line segment to use. " +
          "Check the sign of drawdown and the late-time data.",
      );
    }
    const T = (Math.LN10 * Q) / (FOUR_PI * f.slope);
    const t0 = Math.pow(10, -f.intercept / f.slope);
    return { T, S: (2.25 * T * t0) / r2, t0 };
  };
  let est = estimate(fit);
  if (iterate) {
    while (iterations < maxIterations) {
      const next = selectBy(est.T, est.S);
      if (sameSet(next, set)) {
        converged = true;
        break;
      }
      if (next.length < 2) {
        warnings.push(
          `Only ${next.length} point(s) reach u <= ${uMax} under T = ${est.T.toPrecision(4)} m2/d and ` +
            `S = ${est.S.toPrecision(3)}: the record is too short at r = ${r} m for the straight-line method ` +
            "(it needs t >= 0.5625 t0 / uMax). The line shown is fitted to points that violate the criterion.",
        );
        break;
      }
      if (seen.some((prev) => sameSet(prev, next))) {
        warnings.push("The selection of points oscillates between sets; the last line fitted is reported.");
        set = next;
        decidedBy = est;
        fit = fitLine(t, s, set);
        iterations++;
        est = estimate(fit);
        break;
      }
      seen.push(set);
      set = next;
      decidedBy = est;
      fit = fitLine(t, s, set);
      iterations++;
      est = estimate(fit);
    }
    if (!converged && iterations >= maxIterations) {
      warnings.push(`No stable set of points after ${maxIterations} fits; the last line fitted is reported.`);
    }
  }

  const u = new Float64Array(t.length).fill(Number.NaN);
  for (const i of usable) u[i] = (r2 * est.S) / (4 * est.T * t[i]!);
  if (!iterate) {
    converged = sameSet(selectBy(est.T, est.S), set);
    const violating = set.filter((i) => u[i]! > uMax).length;
    if (violating > 0) {
      warnings.push(
        `${violating} of the ${set.length} points fitted have u > ${uMax} under the resulting T and S; ` +
          "the line is biased towards a low slope (T too high). Iterate or drop the early points.",
      );
    }
  }

  const inSet = new Set(set);
  const excluded = excludedUpFront.slice();
  for (const i of usable) {
    if (inSet.has(i)) continue;
    const basis = converged ? est : (decidedBy ?? est);
    const ui = (r2 * basis.S) / (4 * basis.T * t[i]!);
    excluded.push({
      index: i, t: t[i]!, s: s[i]!, reason: "u-above-limit", u: ui,
      message:
        `Point ${i} (t = ${t[i]} d) has u = ${ui.toPrecision(3)} > ${uMax} under T = ${basis.T.toPrecision(4)} ` +
        `m2/d and S = ${basis.S.toPrecision(3)}: too early for the straight line.`,
    });
  }
  excluded.sort((a, b) => a.index - b.index);

  return {
    slope: fit.slope,
    t0: est.t0,
    T: est.T,
    S: est.S,
    rmsResidual: fit.rms,
    used: set,
    excluded,
    u,
    uMax,
    iterations,
    converged,
    warnings,
  };
}
