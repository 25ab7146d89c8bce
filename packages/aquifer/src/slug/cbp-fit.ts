/**
 * Fitting the Cooper, Bredehoeft & Papadopulos (1967) curve to a slug-test record: transmissivity T (m2/d) and
 * storativity S by nonlinear least squares on H/H0 (unweighted residuals H_model/H0 - H_obs/H0), in ln T and
 * ln S, with the library's Levenberg-Marquardt engine and central finite differences.
 *
 * Start values: for alpha = 1e-10, 1e-9, ..., 1e-1 the curve is matched to the record at the median observed
 * H/H0 (T = beta_L rc^2 / t_L, beta_L where the curve equals that level, t_L where the record does, by
 * interpolation in ln t), and the alpha with the least sum of squares is kept: a numerical form of type-curve
 * matching. Covariance s^2 (J^T J)^-1 in (ln T, ln S), s^2 = SSR/(n - p), with SE(T) = T SE(ln T) and 95 %
 * intervals exp(ln T +- t SE(ln T)).
 *
 * S is poorly determined: the curves of neighbouring alpha differ by a nearly uniform shift in ln beta, so
 * ln T and ln S trade off along a valley of the sum of squares (Cooper et al. 1967 already noted that S from
 * the match is of questionable reliability; from memory). The result always carries that warning, with the
 * fitted correlation and the width of the S interval.
 */

import type { ValueWithUnit } from "../data/index.js";
import { levenbergMarquardt } from "../fit/levenberg-marquardt.js";
import type { LeastSquaresProblem } from "../fit/levenberg-marquardt.js";
import { fitSpaceCovariance } from "../fit/statistics.js";
import { studentTQuantile } from "../fit/student-t.js";
import { cbpNormalizedHead } from "./cooper-bredehoeft-papadopulos.js";
import { SlugTestInputError } from "./errors.js";
import { lengthInMetres, normalizeSlugRecord, type SlugFitRange, type SlugTestRecord } from "./slug-data.js";

/**
 * Well geometry for cooperBredehoeftPapadopulosFit: rc, rw and optionally the aquifer thickness b, as lengths
 * with their units (any length unit, converted to m).
 */
export interface CbpGeometry {
  /** Radius of the casing where the water level moves, rc. */
  readonly casingRadius: ValueWithUnit;
  /** Radius of the well screen or open hole, rw. */
  readonly wellRadius: ValueWithUnit;
  /** Aquifer thickness b, optional: gives K = T/b and Ss = S/b. */
  readonly aquiferThickness?: ValueWithUnit;
}

/**
 * Settings of cooperBredehoeftPapadopulosFit: the part of the record fitted (times in the record's time unit,
 * heads as H/H0), start values, a fixed S, and bounds; T in m2/d, S dimensionless.
 */
export interface CbpFitOptions {
  readonly range?: SlugFitRange;
  /** Starting values (base units); missing ones come from the alpha grid match. */
  readonly start?: { readonly T?: number; readonly S?: number };
  /** Hold S at this value and fit T alone. */
  readonly fixedS?: number;
  /** Bounds, base units; default T in [1e-6, 1e6] m2/d and S in [1e-12, 0.5]. */
  readonly boundsT?: readonly [number, number];
  readonly boundsS?: readonly [number, number];
}

/**
 * One parameter p of cooperBredehoeftPapadopulosFit: T (m2/d) or S (dimensionless), with its standard error
 * p SE(ln p) and 95 % interval exp(ln p +- t SE(ln p)), both in the unit of p; null when fixed or not identifiable.
 */
export interface CbpEstimate {
  readonly name: "T" | "S";
  readonly unit: "m2/d" | "1";
  readonly estimate: number;
  readonly standardError: number | null;
  readonly ci95: readonly [number, number] | null;
  readonly fixed: boolean;
}

/**
 * Outcome of cooperBredehoeftPapadopulosFit: T (m2/d) and S (dimensionless) with uncertainties and their ln T -
 * ln S correlation, alpha = rw^2 S / rc^2, K (m/d) and Ss (1/m) when the thickness is given, the residual
 * standard error (in H/H0), observed and fitted H/H0 at times t (d), start values, convergence, notes, warnings.
 */
export interface CbpFitResult {
  readonly method: "cooper-bredehoeft-papadopulos-1967";
  /** Transmissivity, m2/d. */
  readonly T: number;
  /** Storativity, dimensionless. */
  readonly S: number;
  readonly parameters: CbpEstimate[];
  /** Correlation of ln T and ln S (null when S is fixed or not identifiable). */
  readonly correlation: number | null;
  /** alpha = rw^2 S / rc^2 at the fit. */
  readonly alpha: number;
  /** K = T / b (m/d) and Ss = S / b (1/m), when the aquifer thickness is given. */
  readonly K: number | null;
  readonly specificStorage: number | null;
  /** sqrt(SSR/(n - p)) in H/H0. */
  readonly residualStandardError: number | null;
  readonly points: number;
  /** Times (d), observed and fitted H/H0. */
  readonly t: Float64Array;
  readonly observed: Float64Array;
  readonly fitted: Float64Array;
  readonly start: { readonly T: number; readonly S: number; readonly method: string };
  readonly iterations: number;
  readonly convergence: string;
  readonly notes: string[];
  readonly warnings: string[];
}

/** The time (d) where the record first falls to `level`, by linear interpolation in ln t; NaN if it never does. */
function crossingTime(t: Float64Array, h: Float64Array, level: number): number {
  for (let i = 1; i < t.length; i++) {
    if (h[i - 1]! >= level && h[i]! <= level && t[i - 1]! > 0) {
      if (h[i - 1] === h[i]) return t[i]!;
      const w = (h[i - 1]! - level) / (h[i - 1]! - h[i]!);
      return Math.exp(Math.log(t[i - 1]!) + w * (Math.log(t[i]!) - Math.log(t[i - 1]!)));
    }
  }
  return NaN;
}

/** beta where the curve for alpha equals level (0 < level < 1), by bisection in ln beta. */
function betaAtLevel(alpha: number, level: number): number {
  let lo = Math.log(1e-8);
  let hi = Math.log(1e5);
  for (let k = 0; k < 40; k++) {
    const mid = 0.5 * (lo + hi);
    if (cbpNormalizedHead(alpha, Math.exp(mid)) > level) lo = mid;
    else hi = mid;
  }
  return Math.exp(0.5 * (lo + hi));
}

/**
 * Fits T (m2/d) and S of the Cooper, Bredehoeft & Papadopulos (1967) solution to a slug-test record in a
 * confined aquifer (fully penetrating well), with standard errors, 95 % intervals and the ln T - ln S
 * correlation; see the module note for the method and why S is poorly determined.
 * @throws SlugTestInputError for bad units or geometry, or fewer than 3 usable points.
 */
export function cooperBredehoeftPapadopulosFit(
  record: SlugTestRecord,
  geometry: CbpGeometry,
  options: CbpFitOptions = {},
): CbpFitResult {
  const rc = lengthInMetres(geometry.casingRadius, "the casing radius rc");
  const rw = lengthInMetres(geometry.wellRadius, "the well radius rw");
  const b = geometry.aquiferThickness ? lengthInMetres(geometry.aquiferThickness, "the aquifer thickness") : null;
  const data = normalizeSlugRecord(record, options.range ?? {}, false);
  const n = data.t.length;
  const fixS = options.fixedS;
  const p = fixS === undefined ? 2 : 1;
  if (n < p + 1) {
    throw new SlugTestInputError(`Slug test "${record.name}": ${n} point(s) in range; fitting needs at least ${p + 1}.`);
  }
  const rc2 = rc * rc;
  const alphaOf = (S: number) => (rw * rw * S) / rc2;
  const [tLo, tHi] = options.boundsT ?? [1e-6, 1e6];
  const [sLo, sHi] = options.boundsS ?? [1e-12, 0.5];
  const model = (T: number, S: number, out: Float64Array) => {
    const alpha = alphaOf(S);
    for (let i = 0; i < n; i++) out[i] = cbpNormalizedHead(alpha, (T * data.t[i]!) / rc2);
  };

  const start = startValues(data.t, data.h, rc2, rw, fixS, options.start);
  const prediction = new Float64Array(n);
  const problem: LeastSquaresProblem = {
    residualCount: n,
    parameterCount: p,
    residuals(x, out) {
      model(Math.exp(x[0]!), fixS ?? Math.exp(x[1]!), prediction);
      for (let i = 0; i < n; i++) out[i] = prediction[i]! - data.h[i]!;
    },
  };
  const x0 = fixS === undefined ? [Math.log(start.T), Math.log(start.S)] : [Math.log(start.T)];
  const lm = levenbergMarquardt(problem, new Float64Array(x0), {
    lower: new Float64Array(fixS === undefined ? [Math.log(tLo), Math.log(sLo)] : [Math.log(tLo)]),
    upper: new Float64Array(fixS === undefined ? [Math.log(tHi), Math.log(sHi)] : [Math.log(tHi)]),
    maxEvaluations: 400,
  });
  const T = Math.exp(lm.x[0]!);
  const S = fixS ?? Math.exp(lm.x[1]!);
  const dof = n - p;
  const cov = fitSpaceCovariance(lm.jacobian, n, p, lm.ssr / dof).covariance;
  const tq = studentTQuantile(0.975, dof);
  const estimate = (name: "T" | "S", value: number, k: number): CbpEstimate => {
    const v = cov[k]?.[k];
    const seLn = v !== undefined && Number.isFinite(v) ? Math.sqrt(v) : null;
    return {
      name,
      unit: name === "T" ? "m2/d" : "1",
      estimate: value,
      standardError: seLn === null ? null : value * seLn,
      ci95: seLn === null ? null : [value * Math.exp(-tq * seLn), value * Math.exp(tq * seLn)],
      fixed: false,
    };
  };
  const parameters = [estimate("T", T, 0)];
  parameters.push(
    fixS === undefined
      ? estimate("S", S, 1)
      : { name: "S", unit: "1", estimate: S, standardError: null, ci95: null, fixed: true },
  );
  const correlation =
    fixS === undefined && Number.isFinite(cov[0]![1]!) ? cov[0]![1]! / Math.sqrt(cov[0]![0]! * cov[1]![1]!) : null;
  model(T, S, prediction);
  const warnings: string[] = [];
  const sCi = parameters[1]!.ci95;
  warnings.push(
    "S from a slug test is poorly determined: curves for different alpha = rw^2 S/rc^2 differ mostly by a shift " +
      "along the time axis, which T can absorb" +
      (sCi ? `; the 95 % interval of S spans ${Number((sCi[1] / sCi[0]).toPrecision(2))}x` : "") +
      (correlation !== null ? ` and corr(ln T, ln S) = ${correlation.toFixed(3)}` : "") +
      ". Use S as an order of magnitude at most.",
  );
  if (lm.reason === "max-evaluations") warnings.push("The fit stopped at its evaluation limit before converging.");
  if (fixS === undefined && (S <= sLo * 1.0001 || S >= sHi * 0.9999)) {
    warnings.push(`S = ${S.toPrecision(3)} sits on its bound [${sLo}, ${sHi}]; the record does not constrain S.`);
  }
  if (data.t[n - 1]! * T / rc2 < 1) {
    warnings.push("The record ends before beta = T t/rc^2 = 1: the head has not fallen far enough to fix T well.");
  }
  return {
    method: "cooper-bredehoeft-papadopulos-1967",
    T,
    S,
    parameters,
    correlation,
    alpha: alphaOf(S),
    K: b === null ? null : T / b,
    specificStorage: b === null ? null : S / b,
    residualStandardError: Math.sqrt(lm.ssr / dof),
    points: n,
    t: data.t,
    observed: data.h,
    fitted: prediction.slice(),
    start,
    iterations: lm.iterations,
    convergence: lm.reason,
    notes: [
      `Cooper, Bredehoeft & Papadopulos (1967): least squares on H/H0 over ${n} points in ln T${fixS === undefined ? " and ln S" : " (S fixed)"}; ` +
        `started from ${start.method}; stopped: ${lm.reason} after ${lm.iterations} iterations.`,
    ],
    warnings,
  };
}

function startValues(
  t: Float64Array,
  h: Float64Array,
  rc2: number,
  rw: number,
  fixS: number | undefined,
  given: { readonly T?: number; readonly S?: number } | undefined,
): { T: number; S: number; method: string } {
  if (given?.T !== undefined && (given.S !== undefined || fixS !== undefined)) {
    return { T: given.T, S: fixS ?? given.S!, method: "the given start values" };
  }
  const inside = Array.from(h).filter((v) => v > 0.05 && v < 0.95).sort((a, b) => a - b);
  const level = inside.length > 0 ? inside[Math.floor(inside.length / 2)]! : 0.5;
  const tL = crossingTime(t, h, level);
  if (!Number.isFinite(tL)) {
    throw new SlugTestInputError(
      `The record never falls to H/H0 = ${level.toPrecision(3)} in the chosen range; a start for T cannot be matched. ` +
        `Give start values or a longer record.`,
    );
  }
  const candidates = fixS !== undefined ? [fixS] : given?.S !== undefined ? [given.S] : [];
  if (candidates.length === 0) for (let k = -10; k <= -1; k++) candidates.push((Math.pow(10, k) * rc2) / (rw * rw));
  let best = { T: NaN, S: NaN, ssr: Infinity };
  for (const S of candidates) {
    const alpha = (rw * rw * S) / rc2;
    const T = given?.T ?? (betaAtLevel(alpha, level) * rc2) / tL;
    let ssr = 0;
    for (let i = 0; i < t.length; i++) {
      const r = cbpNormalizedHead(alpha, (T * t[i]!) / rc2) - h[i]!;
      ssr += r * r;
    }
    if (ssr < best.ssr) best = { T, S, ssr };
  }
  return {
    T: best.T,
    S: Math.min(Math.max(best.S, 1e-12), 0.5),
    method: `the best of ${candidates.length} alpha values matched at H/H0 = ${level.toPrecision(3)}`,
  };
}
