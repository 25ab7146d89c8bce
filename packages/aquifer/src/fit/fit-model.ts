/**
 * fitModel: weighted nonlinear least-squares fit of a drawdown model to one or several observation wells
 * with shared parameters, with standard errors, 95 % intervals that say how they were obtained, residual
 * diagnostics, checks of the data and of the model's validity, correlations and information criteria.
 */

import { isComputationStopped } from "../numerics/computation-stopped.js";
import { modelSpecOf, type DrawdownModel, type ModelSpec } from "../models/index.js";
import { correlatedCovariance, type CorrelatedCovariance } from "./correlated-covariance.js";
import { checkObservations, checkTrend } from "./data-checks.js";
import { chiSquareSurvival, Z975 } from "./distributions.js";
import { FitInputError } from "./errors.js";
import { levenbergMarquardt, type ConvergenceReason, type LeastSquaresProblem, type LevenbergMarquardtResult } from "./levenberg-marquardt.js";
import { packWells, weightedResiduals, type ObservationWell, type PackedWell } from "./observations.js";
import { buildParameterSpace, naturalMap, toFitSpace, toNative, type ParameterSpace } from "./parameter-space.js";
import { plausibilityNotes } from "./plausibility.js";
import { profileInterval, type ProfileInterval } from "./profile-intervals.js";
import { residualDiagnostics, type ResidualDiagnostics } from "./residual-diagnostics.js";
import { timeOrder } from "./residual-structure.js";
import { deriveStartValues, type StartMethod } from "./start-values.js";
import { fitSpaceCovariance, informationCriteria } from "./statistics.js";
import { studentTQuantile } from "./student-t.js";
import { cooperJacobCheck, wellboreStorageCheck, type ExcludedReading } from "./validity-checks.js";
import { largestOfAll } from "../numerics/extremes.js";

/** How the Jacobian is obtained: the model's analytic one, or finite differences in the fitting space. */
export type JacobianMethod = "analytic" | "forward" | "central";

/**
 * How the errors are treated for the intervals: "auto" (default) takes them as independent unless the
 * Durbin-Watson test of the residuals rejects that, then as AR(1); "independent" and "ar1" force the choice.
 */
export type ResidualCorrelation = "auto" | "independent" | "ar1";

/**
 * When profile-likelihood intervals are computed: "auto" (default) for parameters whose quadratic interval
 * reaches a bound or spans more than a factor of about 4 (SE of ln p above 0.35), unless the parameter sits on a
 * bound or the Jacobian is rank-deficient (errors then say the values are meaningless); "always" for every free
 * parameter; "never".
 */
export type ProfileChoice = "auto" | "always" | "never";

/** Enforcement of the Cooper-Jacob condition u = r^2 S/(4 T t) <= uMax in a fit of the straight-line model. */
export interface CooperJacobFitOptions {
  /** Largest u accepted, dimensionless; default 0.01 (common practice, no source; 0.05 is also used). */
  readonly uMax?: number;
  /** "exclude" (default): leave readings with u > uMax out and refit until the set is stable; "warn": keep them and warn. */
  readonly outside?: "exclude" | "warn";
}

/**
 * Input of fitModel: the drawdown model, the observation wells (t in d, s in m, r in m, Q in m3/d) and optional
 * start values, fixed values and bounds by parameter name (base units of each parameter, e.g. T m2/d, S
 * dimensionless), the Jacobian method, the stopping tolerances (dimensionless) and the uncertainty settings.
 */
export interface FitOptions {
  readonly model: DrawdownModel;
  /** One or several wells; all share the model parameters. */
  readonly wells: readonly ObservationWell[];
  /** Starting values by parameter name, base units; missing ones are derived (see start-values.ts). */
  readonly start?: Readonly<Record<string, number>>;
  /** Parameters held at the given values (base units) instead of fitted. */
  readonly fixed?: Readonly<Record<string, number>>;
  /** Bounds by parameter name, base units, replacing the descriptor bounds. */
  readonly bounds?: Readonly<Record<string, readonly [number, number]>>;
  /** Default "analytic" when the model has a Jacobian, else "central". */
  readonly jacobian?: JacobianMethod;
  /** Relative sum-of-squares tolerance; default 1e-10. */
  readonly ftol?: number;
  /** Relative step tolerance (scaled fitting-space parameters); default 1e-10. */
  readonly xtol?: number;
  /** Gradient-cosine tolerance; default 1e-10. */
  readonly gtol?: number;
  /** Most model evaluations (finite-difference ones included); default 200 (p + 1). */
  readonly maxEvaluations?: number;
  /** |correlation| at or above which a warning is given; default 0.95. */
  readonly correlationWarning?: number;
  /**
   * Known standard deviation of every reading, m (> 0), for wells that give neither weights nor sigma: the
   * weights become absolute, the intervals rest on it and a chi-square test checks the fit against it.
   */
  readonly measurementSd?: number;
  /** Treatment of serial correlation of the errors; default "auto". */
  readonly correlation?: ResidualCorrelation;
  /** Profile-likelihood intervals; default "auto". */
  readonly profile?: ProfileChoice;
  /** Level of the Durbin-Watson test that decides "auto"; default 0.05. */
  readonly independenceLevel?: number;
  /** For the cooper-jacob model: the u limit and what to do with readings beyond it. */
  readonly cooperJacob?: CooperJacobFitOptions;
}

/** How a parameter's 95 % interval was obtained. */
export type IntervalMethod = "linearised" | "ar1-corrected" | "profile" | "ar1-corrected-profile";

/**
 * One model parameter after a fit: its estimate, standard error and 95 % interval in the parameter's base unit
 * (named by `unit`, e.g. "m2/d" for transmissivity), which kind of interval is shown, the alternatives, whether
 * it was fixed, and how it was fitted.
 */
export interface FitParameter {
  readonly name: string;
  readonly label: string;
  readonly unit: string;
  /** Estimate (or fixed value), base units. */
  readonly estimate: number;
  /**
   * Standard error, base units (delta method for ln-space parameters), of the covariance in use (linearised, or
   * AR(1)-corrected); null when fixed or not identifiable.
   */
  readonly standardError: number | null;
  /**
   * The 95 % interval shown, base units (see `ci95Method`); for ln-space parameters exp(ln p +- t SE(ln p)) or
   * its profile counterpart; null when fixed or not identifiable.
   */
  readonly ci95: readonly [number, number] | null;
  /** Which interval `ci95` is; null when fixed or not identifiable. */
  readonly ci95Method: IntervalMethod | null;
  /**
   * Every interval computed, base units: linearised (s^2 (J'J)^-1, t for n - p), AR(1)-corrected (when the
   * correction is in use) and profile (when computed; the same calibration as the shown quadratic interval).
   */
  readonly intervals: {
    readonly linearised: readonly [number, number] | null;
    readonly ar1Corrected: readonly [number, number] | null;
    readonly profile: readonly [number, number] | null;
  };
  /** Where the profile interval ends at a bound instead of a crossing: the data do not bound it there. */
  readonly profileOpen: "lower" | "upper" | "both" | null;
  readonly fixed: boolean;
  /** "ln" when fitted as ln(value), "linear" otherwise. */
  readonly scale: "ln" | "linear";
  /** Which bound (or order constraint, as "upper") the estimate sits on, if any. */
  readonly atBound: "lower" | "upper" | null;
}

/**
 * The used points of one observation well after a fit: times t (d since pumping started), observed and fitted
 * drawdown (m), and their difference (m); index gives each point's position in the caller's arrays.
 */
export interface WellResiduals {
  readonly name: string;
  /** Indices of the used points in the caller's arrays. */
  readonly index: Int32Array;
  readonly t: Float64Array;
  readonly observed: Float64Array;
  readonly fitted: Float64Array;
  /** observed - fitted, m (unweighted). */
  readonly residual: Float64Array;
}

/** What the intervals of a fit rest on, and why. */
export interface FitUncertainty {
  /** "relative": weights give ratios only, the scale is the residuals'; "absolute": known standard deviations. */
  readonly weighting: "relative" | "absolute";
  /** Chi-square check of the residuals against known standard deviations; null for relative weights. */
  readonly chiSquare: { readonly statistic: number; readonly dof: number; readonly pValue: number } | null;
  /** How the errors were treated for the intervals shown. */
  readonly residuals: "independent" | "ar1";
  /**
   * AR(1) correction in use: the most likely rho and its likelihood-weighted 95 % range, the effective number of
   * readings n (1 - rho)/(1 + rho), the largest interval quantile with its equivalent Student t degrees of freedom,
   * and the noise standard deviation (weighted units: m at unit weight).
   */
  readonly ar1: {
    readonly rho: number;
    readonly rhoRange: readonly [number, number];
    readonly effectiveN: number;
    readonly dof: number;
    readonly tQuantile: number;
    readonly noiseStandardDeviation: number;
  } | null;
  /** Degrees of freedom and 0.975 quantile of the quadratic intervals shown (Infinity and 1.96 for absolute weights). */
  readonly dof: number;
  readonly tQuantile: number;
  /**
   * Standard deviation of one reading's error at the average weight, m: what a prediction band adds to the
   * parameter uncertainty.
   */
  readonly scatter: number;
  /** Parameters with profile-likelihood intervals. */
  readonly profiled: string[];
  /** Which interval is shown and why, in plain language. */
  readonly statement: string;
}

/**
 * Outcome of fitModel: parameter estimates with uncertainties (base units), covariance and correlation of the
 * free parameters, goodness of fit (SSR in m^2 times the weight unit, RMSE and residual standard error in m,
 * AIC/BIC/AICc dimensionless), residuals per well, residual diagnostics, what the intervals rest on, iteration
 * counts, convergence reason, errors (the result must not be used as it stands) and warnings.
 */
export interface FitResult {
  readonly modelId: string;
  /** The model as a spec (its id, or its id with the geometry options it was made with), for forecasts. */
  readonly modelSpec: ModelSpec;
  readonly parameters: FitParameter[];
  /** Names of the free parameters: the row and column order of covariance and correlation. */
  readonly freeParameters: string[];
  /** Covariance of the free parameters in use (linearised or AR(1)-corrected), base units (delta method); NaN where not identifiable. */
  readonly covariance: number[][];
  readonly correlation: number[][];
  /** Weighted sum of squared residuals, m^2 (times the weight unit). */
  readonly ssr: number;
  /** sqrt(SSR / n), m. */
  readonly rmse: number;
  /** s = sqrt(SSR / (n - p)), m: the residual standard error behind the linearised standard errors. */
  readonly residualStandardError: number;
  /** Points used. */
  readonly n: number;
  /** Free parameters. */
  readonly p: number;
  /** n - p. */
  readonly dof: number;
  /** 0.975 quantile of the linearised intervals: Student t for n - p degrees of freedom (normal for absolute weights). */
  readonly tQuantile: number;
  /** n ln(SSR/n) + 2k, k = p + 1 (the error variance counts). */
  readonly aic: number;
  /** n ln(SSR/n) + k ln n, k = p + 1. */
  readonly bic: number;
  /** AIC + 2k(k + 1)/(n - k - 1); null when n <= k + 1. */
  readonly aicc: number | null;
  readonly residuals: WellResiduals[];
  /** Independence checks of the residuals (lag-1 autocorrelation, Durbin-Watson, runs). */
  readonly diagnostics: ResidualDiagnostics;
  /** What the intervals rest on and which are shown. */
  readonly uncertainty: FitUncertainty;
  /** Readings left out by a validity rule (Cooper-Jacob u limit), with the reason. */
  readonly excluded: ExcludedReading[];
  readonly iterations: number;
  /** Model evaluations for residuals (finite-difference ones included). */
  readonly evaluations: number;
  readonly jacobianEvaluations: number;
  readonly convergence: ConvergenceReason;
  /** True when the optimiser met a tolerance and no error was found: false whenever `errors` is not empty. */
  readonly converged: boolean;
  readonly jacobianMethod: JacobianMethod;
  readonly start: { readonly values: Record<string, number>; readonly method: StartMethod; readonly notes: string[] };
  /** Problems that make the result meaningless as it stands (wrong-sign or empty data, a parameter at its bound or not identifiable). */
  readonly errors: string[];
  readonly warnings: string[];
  /** Estimates far outside the ranges usually met, or drawdown beyond the saturated thickness (fit/plausibility.ts). */
  readonly plausibility: string[];
}

/** SE of ln p above which "auto" computes a profile interval (a 95 % interval wider than a factor of about 4). */
const PROFILE_TRIGGER = 0.35;
/** Interval width (ratio high/low) above which a positive parameter is called poorly determined, and not identified. */
const POORLY_DETERMINED = 10;
const NOT_IDENTIFIED = 1000;

/** " m2/d" for a unit, nothing for a dimensionless quantity ("1"). */
function unitSuffix(unit: string): string {
  return unit === "1" || unit === "" ? "" : ` ${unit}`;
}

function formatNumber(v: number): string {
  return Number(v.toPrecision(3)).toString();
}

function makeProblem(
  model: DrawdownModel,
  space: ParameterSpace,
  wells: readonly PackedWell[],
  n: number,
  method: JacobianMethod,
): LeastSquaresProblem {
  const native = new Float64Array(space.descriptors.length);
  const prediction = new Float64Array(n);
  const p = space.freeIndex.length;
  const problem: LeastSquaresProblem = {
    residualCount: n,
    parameterCount: p,
    residuals(theta, out) {
      toNative(space, theta, native);
      try {
        weightedResiduals(model, wells, native, prediction, out);
      } catch {
        out.fill(NaN);
      }
    },
  };
  if (method === "analytic" && model.jacobian) {
    const jacobianOf = model.jacobian.bind(model);
    return {
      ...problem,
      jacobian(theta, out) {
        toNative(space, theta, native);
        for (const w of wells) {
          const m = w.t.length;
          if (m === 0) continue;
          const columns = jacobianOf(native, w.geometry, w.t);
          for (let j = 0; j < p; j++) {
            const k = space.freeIndex[j]!;
            const column = columns[k]!;
            const scale = space.logScale[j] ? native[k]! : 1;
            const base = j * n + w.offset;
            for (let i = 0; i < m; i++) out[base + i] = w.sqrtWeights[i]! * column[i]! * scale;
          }
        }
        // A ratio coordinate theta_a = ln(a/b) moves a with b: d/d theta_b gains the column of a.
        space.ratioOf.forEach((partner, j) => {
          if (partner < 0) return;
          for (let i = 0; i < n; i++) out[partner * n + i]! += out[j * n + i]!;
        });
      },
    };
  }
  return problem;
}

/** A A' style product: A C A' for p-by-p arrays. */
function congruence(a: number[][], c: number[][]): number[][] {
  const p = a.length;
  const out: number[][] = [];
  for (let i = 0; i < p; i++) {
    const row: number[] = [];
    for (let j = 0; j < p; j++) {
      let sum = 0;
      for (let k = 0; k < p; k++) {
        if (a[i]![k] === 0) continue;
        for (let l = 0; l < p; l++) if (a[j]![l] !== 0) sum += a[i]![k]! * c[k]![l]! * a[j]![l]!;
      }
      row.push(sum);
    }
    out.push(row);
  }
  return out;
}

interface Prepared {
  readonly model: DrawdownModel;
  readonly space: ParameterSpace;
  readonly method: JacobianMethod;
  readonly names: string[];
}

function prepare(options: FitOptions): Prepared {
  const { model } = options;
  if (!model || typeof model.drawdown !== "function" || !Array.isArray(model.parameters)) {
    throw new FitInputError("fitModel: `model` is missing or is not a drawdown model (it needs parameters and drawdown()).");
  }
  const space = buildParameterSpace(model.parameters, options.fixed, options.bounds, options.start, model.orderedParameters);
  const method: JacobianMethod = options.jacobian ?? (model.jacobian ? "analytic" : "central");
  if (method === "analytic" && !model.jacobian) {
    throw new FitInputError(`fitModel: model "${model.id}" has no analytic Jacobian; use jacobian: "forward" or "central".`);
  }
  const correlation = options.correlation ?? "auto";
  if (!["auto", "independent", "ar1"].includes(correlation)) {
    throw new FitInputError(`fitModel: correlation is "${correlation}"; use "auto", "independent" or "ar1".`);
  }
  const profile = options.profile ?? "auto";
  if (!["auto", "always", "never"].includes(profile)) {
    throw new FitInputError(`fitModel: profile is "${profile}"; use "auto", "always" or "never".`);
  }
  const level = options.independenceLevel ?? 0.05;
  if (!(level > 0 && level < 0.5)) throw new FitInputError(`fitModel: independenceLevel is ${level}; give a test level between 0 and 0.5, e.g. 0.05.`);
  return { model, space, method, names: model.parameters.map((d) => d.name) };
}

/**
 * Fits `model` to the wells by weighted least squares: minimises sum_i w_i (s_model(t_i) - s_obs(t_i))^2 (m^2)
 * over the free parameters, positive ones in ln space, inside the bounds (and order constraints such as
 * Neuman's S < Sy), with a bounded Levenberg-Marquardt method (levenberg-marquardt.ts).
 *
 * Uncertainty: linearised covariance s^2 (J^T J)^-1 with s^2 = SSR/(n - p) for relative weights (1 for known
 * standard deviations, with a chi-square check), mapped to base units by the delta method (statistics.ts); the
 * residuals are checked for independence (residual-diagnostics.ts) and, when they are serially correlated, the
 * AR(1)-corrected covariance with its effective degrees of freedom is used instead (correlated-covariance.ts);
 * profile-likelihood intervals replace quadratic ones where the likelihood is far from quadratic
 * (profile-intervals.ts). `uncertainty.statement` says which interval is shown and why.
 *
 * Validity: the data are checked for all-zero drawdowns, a sign that contradicts Q and no trend in time
 * (data-checks.ts); a Cooper-Jacob fit leaves out readings with u > 0.01 (option `cooperJacob`); a
 * Papadopulos-Cooper fit flags pumped-well readings inside the well-bore storage period (validity-checks.ts).
 * Findings that void the result are listed in `errors`, and `converged` is then false.
 *
 * Throws FitInputError for unusable input (no wells, too few points, non-finite data with the well and point
 * index, unknown parameter names, bad bounds or options).
 */
export function fitModel(options: FitOptions): FitResult {
  const prepared = prepare(options);
  const cooperJacob = prepared.model.id === "cooper-jacob";
  if (!cooperJacob || (options.cooperJacob?.outside ?? "exclude") === "warn") {
    const fit = fitOnce(prepared, options, options.wells, options.start, []);
    if (!cooperJacob) return fit;
    const check = cooperJacobCheck(fit, options.wells, options.cooperJacob?.uMax);
    return check.outside.length === 0 ? fit : { ...fit, warnings: [...fit.warnings, check.message] };
  }
  let wells = options.wells;
  let start = options.start;
  let excluded: ExcludedReading[] = [];
  let fit = fitOnce(prepared, options, wells, start, excluded);
  for (let iteration = 0; iteration < 20; iteration++) {
    const check = cooperJacobCheck(fit, options.wells, options.cooperJacob?.uMax);
    const same =
      check.outside.length === excluded.length && check.outside.every((e, i) => e.well === excluded[i]!.well && e.index === excluded[i]!.index);
    if (same) return fit;
    const remaining = options.wells.reduce((sum, w) => sum + w.t.length, 0) - check.outside.length;
    if (remaining <= fit.p + 1) {
      return {
        ...fit,
        converged: false,
        errors: [
          ...fit.errors,
          `Only ${remaining} readings have u <= ${check.uMax} under T and S from the fit: the record is too short or too close to the well for ` +
            "the Cooper-Jacob line. Fit the Theis model instead, which holds at every u.",
        ],
      };
    }
    excluded = check.outside;
    wells = check.masked;
    start = Object.fromEntries(fit.parameters.filter((p) => !p.fixed).map((p) => [p.name, p.estimate]));
    fit = fitOnce(prepared, options, wells, start, excluded);
  }
  return { ...fit, warnings: [...fit.warnings, "The set of readings with u <= uMax did not settle after 20 refits; the last fit is reported."] };
}

function fitOnce(
  prepared: Prepared,
  options: FitOptions,
  inputWells: readonly ObservationWell[],
  givenStart: Readonly<Record<string, number>> | undefined,
  excluded: ExcludedReading[],
): FitResult {
  const { model, space, method, names } = prepared;
  const { wells, count: n, absolute } = packWells(inputWells, options.measurementSd);
  const p = space.freeIndex.length;
  if (n === 0) throw new FitInputError("fitModel: every point is masked out or has zero weight; there is nothing to fit.");
  if (n <= p) {
    throw new FitInputError(
      `fitModel: ${n} point${n === 1 ? "" : "s"} for ${p} free parameters; a fit needs more points than free parameters ` +
        "(and uncertainties need at least one more). Add data or fix parameters.",
    );
  }
  for (const k of space.freeIndex) {
    const d = model.parameters[k]!;
    const v = givenStart?.[d.name];
    if (v === undefined) continue;
    const [lo, hi] = space.nativeBounds[k]!;
    if (!Number.isFinite(v) || (d.positive && !(v > 0)) || v < lo || v > hi) {
      throw new FitInputError(
        `fitModel: start value of ${d.name} (${d.label}) is ${v} ${d.unit}; it must be a finite number within the bounds [${lo}, ${hi}]${d.positive ? " and > 0" : ""}.`,
      );
    }
  }
  for (const [ka, kb] of space.ordered) {
    const a = givenStart?.[names[ka]!] ?? space.fixedValues[ka]!;
    const b = givenStart?.[names[kb]!] ?? space.fixedValues[kb]!;
    if (Number.isFinite(a) && Number.isFinite(b) && !(a < b)) {
      throw new FitInputError(`fitModel: start values give ${names[ka]} = ${a} and ${names[kb]} = ${b}, but the model needs ${names[ka]} < ${names[kb]}.`);
    }
  }

  const start = deriveStartValues(model, space, wells, givenStart);
  const problem = makeProblem(model, space, wells, n, method);
  const theta0 = toFitSpace(space, start.values);
  const probe = new Float64Array(n);
  {
    try {
      weightedResiduals(model, wells, toNative(space, theta0, new Float64Array(names.length)), new Float64Array(n), probe);
    } catch (error) {
      if (isComputationStopped(error)) throw error;
      throw new FitInputError(`fitModel: the model cannot be evaluated at the start values: ${error instanceof Error ? error.message : String(error)}`);
    }
    for (const w of wells) {
      for (let i = 0; i < w.t.length; i++) {
        if (!Number.isFinite(probe[w.offset + i]!)) {
          throw new FitInputError(
            `fitModel: the model gives a non-finite drawdown for well "${w.name}", point ${w.index[i]} (t = ${w.t[i]} d) at the start values; give other start values.`,
          );
        }
      }
    }
  }
  const findings = checkObservations(wells);
  const lm = levenbergMarquardt(problem, theta0, {
    lower: space.lower,
    upper: space.upper,
    ftol: options.ftol,
    xtol: options.xtol,
    gtol: options.gtol,
    maxEvaluations: options.maxEvaluations,
    finiteDifferences: method === "forward" ? "forward" : "central",
    initialResiduals: probe,
  });
  const result = assemble(prepared, options, wells, n, absolute, problem, lm, start, excluded);
  if (!findings.some((f) => f.severity === "error")) findings.push(...checkTrend(model, wells, toNative(space, lm.x, new Float64Array(names.length)), lm.ssr, p));
  const dataErrors = findings.filter((f) => f.severity === "error").map((f) => f.message);
  const dataWarnings = findings.filter((f) => f.severity === "warning").map((f) => f.message);
  const storage = wellboreStorageCheck(model, wells, result);
  const errors = [...dataErrors, ...result.errors];
  return {
    ...result,
    errors,
    warnings: [...dataWarnings, ...storage, ...result.warnings],
    converged: result.converged && errors.length === 0,
  };
}

function assemble(
  prepared: Prepared,
  options: FitOptions,
  wells: readonly PackedWell[],
  n: number,
  absolute: boolean,
  problem: LeastSquaresProblem,
  lm: LevenbergMarquardtResult,
  start: ReturnType<typeof deriveStartValues>,
  excluded: ExcludedReading[],
): FitResult {
  const { model, space, names } = prepared;
  const p = space.freeIndex.length;
  const estimate = toNative(space, lm.x, new Float64Array(names.length));
  const dof = n - p;
  const s2 = absolute ? 1 : lm.ssr / dof;
  const tLinear = absolute ? Z975 : studentTQuantile(0.975, dof);
  const warnings: string[] = [];
  const errors: string[] = [];
  const freeNames = space.freeIndex.map((k) => names[k]!);
  const A = naturalMap(space);

  // Linearised covariance (fitting space), its pseudo-inverse form and the residual diagnostics.
  const linear = p > 0 ? fitSpaceCovariance(lm.jacobian, n, p, s2) : null;
  const pseudoInverse = linear ? linear.covariance.map((row) => row.map((v) => v / s2)) : [];
  const order = timeOrder(wells);
  const diagnostics: ResidualDiagnostics = residualDiagnostics(order, lm.residuals, lm.jacobian, p, options.independenceLevel ?? 0.05);
  const mode = options.correlation ?? "auto";
  let useAr1 = mode === "ar1" || (mode === "auto" && !diagnostics.independent);
  if (useAr1 && diagnostics.ar1Coefficient === null) {
    warnings.push("correlation \"ar1\" was asked for, but the residuals are too few to estimate their autocorrelation; the intervals assume independent errors.");
    useAr1 = false;
  }
  let ar1: CorrelatedCovariance | null = null;
  if (useAr1 && p > 0) {
    ar1 = correlatedCovariance(order, lm.residuals, lm.jacobian, p, pseudoInverse, lm.ssr, absolute ? 1 : undefined);
    if (ar1.rho >= 0.95) {
      warnings.push(
        `The residual autocorrelation is near the limit of the AR(1) correction (rho = ${ar1.rho}): the residuals wander like a random walk, as drift or ` +
          "a model that misses a systematic part of the response produce. Even the corrected intervals are then unreliable; look at the residual plot.",
      );
    }
  }
  const shownFit = ar1 ? ar1.covariance : linear ? linear.covariance : [];
  const tShown = ar1 ? ar1.tQuantile : tLinear;
  const quantileOf = (j: number) => (ar1 ? (space.ratioOf[j]! >= 0 || !Number.isFinite(ar1.quantiles[j]!) ? ar1.tQuantile : ar1.quantiles[j]!) : tLinear);
  const dofShown = ar1 ? ar1.dof : absolute ? Infinity : dof;
  const linearNatural = linear ? congruence(A, linear.covariance) : [];
  const shownNatural = p > 0 ? congruence(A, shownFit) : [];
  const naturalEstimate = space.freeIndex.map((k, j) => (space.logScale[j] ? Math.log(estimate[k]!) : estimate[k]!));

  // Native covariance and correlation (delta method) of the covariance in use.
  const gain = space.freeIndex.map((k, j) => (space.logScale[j] ? estimate[k]! : 1));
  const covariance: number[][] = [];
  const correlation: number[][] = [];
  for (let a = 0; a < p; a++) {
    const rowCov: number[] = [];
    const rowCorr: number[] = [];
    for (let b = 0; b < p; b++) {
      const c = shownNatural[a]![b]!;
      rowCov.push(c * gain[a]! * gain[b]!);
      const denom = Math.sqrt(shownNatural[a]![a]! * shownNatural[b]![b]!);
      rowCorr.push(a === b ? (Number.isNaN(c) ? NaN : 1) : denom > 0 ? c / denom : NaN);
    }
    covariance.push(rowCov);
    correlation.push(rowCorr);
  }

  // Profile-likelihood intervals where asked for or where the quadratic interval is doubtful.
  const profileChoice = options.profile ?? "auto";
  const profiles = new Map<number, ProfileInterval>();
  const toNativeValue = (j: number, v: number) => (space.logScale[j] ? Math.exp(v) : v);
  const quadratic = (cov: number[][], j: number, t: number): readonly [number, number] | null => {
    const v = cov[j]?.[j];
    if (v === undefined || !Number.isFinite(v)) return null;
    const se = Math.sqrt(v);
    return [toNativeValue(j, naturalEstimate[j]! - t * se), toNativeValue(j, naturalEstimate[j]! + t * se)];
  };
  const rankDeficient = linear !== null && linear.nullDirections.length > 0;
  for (let j = 0; j < p && profileChoice !== "never"; j++) {
    const v = shownFit[j]![j]!;
    if (!Number.isFinite(v) || space.ratioOf[j]! >= 0) continue;
    // "auto" leaves out fits whose Jacobian is rank-deficient and parameters on a bound: errors say those are meaningless.
    const onBound = lm.x[j]! <= space.lower[j]! || lm.x[j]! >= space.upper[j]!;
    if (profileChoice === "auto" && (rankDeficient || onBound)) continue;
    const se = Math.sqrt(v);
    const level = quantileOf(j);
    const crosses = lm.x[j]! - level * se <= space.lower[j]! || lm.x[j]! + level * se >= space.upper[j]!;
    const wide = space.logScale[j] ? se > PROFILE_TRIGGER : se > PROFILE_TRIGGER * Math.abs(lm.x[j]!);
    if (profileChoice === "always" || crosses || wide) {
      const inflation = ar1 && linear ? ar1.covariance[j]![j]! / linear.covariance[j]![j]! : 1;
      const profile = profileInterval(
        {
          problem,
          optimum: lm.x,
          ssrMin: lm.ssr,
          lower: space.lower,
          upper: space.upper,
          scale: s2 * inflation,
          level,
          standardError: se,
          ftol: options.ftol,
          xtol: options.xtol,
          gtol: options.gtol,
          finiteDifferences: prepared.method === "forward" ? "forward" : "central",
        },
        j,
      );
      profiles.set(j, profile);
      if (profile.betterMinimum) {
        warnings.push(
          `While profiling ${freeNames[j]}, a fit with ${freeNames[j]} held elsewhere reached a smaller sum of squares: the fit stopped in a local ` +
            "minimum. Refit from other start values.",
        );
      }
    }
  }

  const parameters: FitParameter[] = model.parameters.map((d, k) => {
    const j = space.freeIndex.indexOf(k);
    const value = estimate[k]!;
    const base = { name: d.name, label: d.label, unit: d.unit, estimate: value };
    if (j < 0) {
      return {
        ...base,
        standardError: null,
        ci95: null,
        ci95Method: null,
        intervals: { linearised: null, ar1Corrected: null, profile: null },
        profileOpen: null,
        fixed: true,
        scale: d.positive ? "ln" : "linear",
        atBound: null,
      };
    }
    const variance = shownNatural[j]![j]!;
    const seNatural = Number.isFinite(variance) ? Math.sqrt(variance) : NaN;
    const linearised = quadratic(linearNatural, j, tLinear);
    const ar1Corrected = ar1 ? quadratic(shownNatural, j, quantileOf(j)) : null;
    const profile = profiles.get(j);
    const profileCi: readonly [number, number] | null = profile ? [toNativeValue(j, profile.lower), toNativeValue(j, profile.upper)] : null;
    const open = profile ? (profile.lowerOpen && profile.upperOpen ? "both" : profile.lowerOpen ? "lower" : profile.upperOpen ? "upper" : null) : null;
    const ci95 = profileCi ?? (ar1 ? ar1Corrected : linearised);
    const ci95Method: IntervalMethod | null = ci95 === null ? null : profileCi ? (ar1 ? "ar1-corrected-profile" : "profile") : ar1 ? "ar1-corrected" : "linearised";
    const theta = lm.x[j]!;
    const atBound = theta <= space.lower[j]! ? "lower" : theta >= space.upper[j]! ? "upper" : null;
    return {
      ...base,
      standardError: Number.isNaN(seNatural) ? null : seNatural * gain[j]!,
      ci95,
      ci95Method,
      intervals: { linearised, ar1Corrected, profile: profileCi },
      profileOpen: open,
      fixed: false,
      scale: space.logScale[j] ? "ln" : "linear",
      atBound,
    };
  });

  if (linear) {
    for (const direction of linear.nullDirections) {
      const terms = direction
        .map(({ index, weight }) => `${weight < 0 ? "-" : "+"} ${formatNumber(Math.abs(weight))} ${space.logScale[index] ? "ln " : ""}${freeNames[index]}`)
        .join(" ")
        .replace(/^\+ /, "");
      const involved = direction.map(({ index }) => freeNames[index]!).join(" and ");
      errors.push(
        `${involved} cannot be determined separately from these data: the combination ${terms} is not constrained ` +
          (linear.singularValues[0]! > 0
            ? `(smallest singular value of the Jacobian is ${formatNumber(linear.singularValues[linear.singularValues.length - 1]! / linear.singularValues[0]!)} of the largest). `
            : "(the model's drawdown does not respond to the parameters at all at these readings). ") +
          "Fix one of them, or add data that separate them (e.g. a second observation well or a longer record).",
      );
    }
  }
  const threshold = options.correlationWarning ?? 0.95;
  for (let a = 0; a < p; a++) {
    for (let b = a + 1; b < p; b++) {
      const rho = correlation[a]![b]!;
      if (Math.abs(rho) >= threshold) {
        warnings.push(
          `${freeNames[a]} and ${freeNames[b]} are correlated at ${rho.toFixed(2)}: the data fix a combination of them ` +
            "better than either alone, so their individual uncertainties are large.",
        );
      }
    }
  }
  for (const fp of parameters) {
    if (fp.atBound) {
      const k = names.indexOf(fp.name);
      const j = space.freeIndex.indexOf(k);
      if (j >= 0 && space.ratioOf[j]! >= 0 && fp.atBound === "upper") {
        const partner = names[space.freeIndex[space.ratioOf[j]!]!]!;
        errors.push(
          `${fp.name} = ${formatNumber(fp.estimate)} reached the constraint ${fp.name} < ${partner}: the data do not separate the two, so neither value ` +
            `means much. The record may not show the stages this model needs; fit a simpler model or fix ${fp.name} or ${partner} from other evidence.`,
        );
        continue;
      }
      const bound = space.nativeBounds[k]![fp.atBound === "lower" ? 0 : 1];
      errors.push(
        `${fp.name} = ${formatNumber(fp.estimate)} ${fp.unit} is at its ${fp.atBound} bound ${bound}: the bound, not the data, ` +
          "sets this value and its uncertainty means nothing; check the model choice (e.g. Theis instead of a leaky model whose B runs to its upper bound) or widen the bound.",
      );
    }
  }
  for (const fp of parameters) {
    if (!fp.profileOpen || fp.atBound) continue;
    const side = fp.profileOpen === "both" ? "either side" : fp.profileOpen === "upper" ? "above" : "below";
    warnings.push(
      `The data do not bound ${fp.name} from ${side}: its profile-likelihood interval runs to the bound ` +
        `(${formatNumber(fp.ci95![0])} to ${formatNumber(fp.ci95![1])} ${fp.unit}), so any value out to the bound fits about as well` +
        (fp.name === "B" && fp.profileOpen !== "lower" ? "; the record shows no clear leakage, and a model without it may serve as well." : "."),
    );
  }
  for (const [ka, kb] of space.ordered) {
    const [lo, hi] = space.nativeBounds[ka]!;
    if (estimate[ka]! < lo || estimate[ka]! > hi) {
      warnings.push(`${names[ka]} = ${formatNumber(estimate[ka]!)} lies outside its bounds [${lo}, ${hi}] (its coordinate is the ratio ${names[ka]}/${names[kb]}).`);
    }
  }
  for (const fp of parameters) {
    if (fp.fixed || fp.atBound || fp.ci95 === null || fp.scale !== "ln") continue;
    const width = fp.ci95[1] / fp.ci95[0];
    if (width > NOT_IDENTIFIED) {
      errors.push(
        `${fp.name} is not identified by these data: its 95 % interval ${formatNumber(fp.ci95[0])} to ${formatNumber(fp.ci95[1])}${unitSuffix(fp.unit)} spans a factor of ` +
          `${formatNumber(width)}. The estimate is arbitrary; fix ${fp.name} from other evidence or add data that constrain it.`,
      );
    } else if (width > POORLY_DETERMINED) {
      warnings.push(
        `${fp.name} is poorly determined: its 95 % interval spans a factor of ${formatNumber(width)} (${formatNumber(fp.ci95[0])} to ${formatNumber(fp.ci95[1])}${unitSuffix(fp.unit)}).`,
      );
    }
  }
  if (p > 0 && n < 2 * p) warnings.push(`Only ${n} points for ${p} free parameters: fewer than 2 points per parameter; the uncertainties are poorly determined.`);
  if (lm.reason === "max-evaluations") {
    warnings.push(`The fit stopped after ${lm.evaluations} model evaluations without meeting a tolerance; raise maxEvaluations or give better start values.`);
  }
  if (lm.reason === "stalled") {
    warnings.push("The fit stopped where rounding error prevents further progress; the tolerances are tighter than the data allow.");
  }

  // Weighting and the chi-square check against known standard deviations.
  let chiSquare: FitUncertainty["chiSquare"] = null;
  if (absolute) {
    const pValue = chiSquareSurvival(lm.ssr, dof);
    chiSquare = { statistic: lm.ssr, dof, pValue };
    if (pValue < 0.05) {
      warnings.push(
        `The residuals are larger than the stated measurement standard deviations allow: chi-square = ${formatNumber(lm.ssr)} for ${dof} degrees of freedom ` +
          `(p = ${formatNumber(pValue)}). Either the standard deviations are understated or the model misses part of the response; the intervals, ` +
          "which rest on the stated values, are then too narrow. Fit with relative weights (no sigma) to let the scatter set the scale.",
      );
    } else if (1 - pValue < 0.05) {
      warnings.push(
        `The residuals are smaller than the stated measurement standard deviations imply (chi-square = ${formatNumber(lm.ssr)} for ${dof} degrees of freedom, ` +
          `P(smaller) = ${formatNumber(1 - pValue)}): the standard deviations look overstated, so the intervals are wider than the data need.`,
      );
    }
  }
  let weightSum = 0;
  for (const w of wells) for (let i = 0; i < w.t.length; i++) weightSum += w.sqrtWeights[i]! ** 2;
  const unitVariance = ar1 ? ar1.noiseVariance : s2;
  const scatter = Math.sqrt((unitVariance * n) / weightSum);

  const profiled = [...profiles.keys()].map((j) => freeNames[j]!);
  const statement = uncertaintyStatement(absolute, diagnostics, ar1, mode, profiled, profiles, freeNames, tShown, dofShown);

  // Fitted values from the final weighted residuals r_i = sqrt(w_i) (fitted_i - observed_i), all w_i > 0.
  const residuals: WellResiduals[] = wells.map((w) => {
    const m = w.t.length;
    const fitted = new Float64Array(m);
    const residual = new Float64Array(m);
    for (let i = 0; i < m; i++) {
      const difference = lm.residuals[w.offset + i]! / w.sqrtWeights[i]!;
      fitted[i] = w.s[i]! + difference;
      residual[i] = -difference;
    }
    return { name: w.name, index: w.index.slice(), t: w.t.slice(), observed: w.s.slice(), fitted, residual };
  });

  const criteria = informationCriteria(lm.ssr, n, p);
  const startRecord: Record<string, number> = {};
  names.forEach((name, k) => {
    startRecord[name] = start.values[k]!;
  });
  return {
    modelId: model.id,
    modelSpec: modelSpecOf(model),
    parameters,
    freeParameters: freeNames,
    covariance,
    correlation,
    ssr: lm.ssr,
    rmse: Math.sqrt(lm.ssr / n),
    residualStandardError: Math.sqrt(lm.ssr / dof),
    n,
    p,
    dof,
    tQuantile: tLinear,
    aic: criteria.aic,
    bic: criteria.bic,
    aicc: criteria.aicc,
    residuals,
    diagnostics,
    uncertainty: {
      weighting: absolute ? "absolute" : "relative",
      chiSquare,
      residuals: ar1 ? "ar1" : "independent",
      ar1: ar1
        ? {
            rho: ar1.rho,
            rhoRange: ar1.rhoRange,
            effectiveN: ar1.effectiveN,
            dof: ar1.dof,
            tQuantile: ar1.tQuantile,
            noiseStandardDeviation: Math.sqrt(ar1.noiseVariance),
          }
        : null,
      dof: dofShown,
      tQuantile: tShown,
      scatter,
      profiled,
      statement,
    },
    excluded,
    iterations: lm.iterations,
    evaluations: lm.evaluations,
    jacobianEvaluations: lm.jacobianEvaluations,
    convergence: lm.reason,
    converged: lm.reason !== "max-evaluations" && lm.reason !== "stalled" && errors.length === 0,
    jacobianMethod: prepared.method,
    start: { values: startRecord, method: start.method, notes: start.notes },
    errors,
    warnings,
    plausibility: plausibilityNotes(model, Object.fromEntries(parameters.map((q) => [q.name, q.estimate])), largestOfAll(residuals.map((w) => w.observed))),
  };
}

function uncertaintyStatement(
  absolute: boolean,
  diagnostics: ResidualDiagnostics,
  ar1: CorrelatedCovariance | null,
  mode: ResidualCorrelation,
  profiled: readonly string[],
  profiles: ReadonlyMap<number, ProfileInterval>,
  freeNames: readonly string[],
  t: number,
  dof: number,
): string {
  const parts: string[] = [];
  parts.push(
    absolute
      ? "Weights are absolute: the stated measurement standard deviations set the scale of the errors (normal quantile 1.96)."
      : "Weights are relative (only their ratios matter): the scale of the errors comes from the residual scatter, s^2 = SSR/(n - p).",
  );
  const tText = Number.isFinite(dof) ? `Student t ${formatNumber(t)} for ${formatNumber(dof)} degrees of freedom` : `normal quantile ${formatNumber(t)}`;
  if (ar1) {
    parts.push(
      `95 % intervals are AR(1)-corrected (${mode === "ar1" ? "as asked" : "because the residuals are serially correlated"}): ` +
        (ar1.rhoRange[0] === ar1.rhoRange[1]
          ? `rho = ${formatNumber(ar1.rho)} (at the upper end of the range the correction covers), `
          : `rho = ${formatNumber(ar1.rho)} (likely range ${formatNumber(ar1.rhoRange[0])} to ${formatNumber(ar1.rhoRange[1])}, integrated over), `) +
        `about ${formatNumber(ar1.effectiveN)} effective readings, widest quantile ${formatNumber(t)}` +
        `${Number.isFinite(dof) ? ` (as Student t for ${formatNumber(dof)} degrees of freedom)` : ""}; independent-error intervals would be too narrow.`,
    );
  } else {
    parts.push(
      `95 % intervals are linearised (${tText}), assuming independent errors` +
        (mode === "independent" ? " as asked." : diagnostics.assessed ? ", which the Durbin-Watson test does not reject." : "; too few readings to test that."),
    );
  }
  if (profiled.length > 0) {
    const open = [...profiles.entries()].filter(([, v]) => v.lowerOpen || v.upperOpen).map(([j]) => freeNames[j]!);
    parts.push(
      `For ${profiled.join(", ")} the profile-likelihood interval is shown, because the sum of squares is far from quadratic there (or the ` +
        `quadratic interval reaches a bound)${open.length > 0 ? `; for ${open.join(", ")} it runs to a bound, which the data do not exclude` : ""}.`,
    );
  }
  return parts.join(" ");
}
