/**
 * fitModel: weighted nonlinear least-squares fit of a drawdown model to one or several observation wells
 * with shared parameters, with standard errors, 95 % intervals, correlations and information criteria.
 */

import { modelSpecOf, type DrawdownModel, type ModelSpec } from "../models/index.js";
import { FitInputError } from "./errors.js";
import { levenbergMarquardt, type ConvergenceReason, type LeastSquaresProblem } from "./levenberg-marquardt.js";
import { packWells, weightedResiduals, type ObservationWell, type PackedWell } from "./observations.js";
import { buildParameterSpace, toFitSpace, toNative, type ParameterSpace } from "./parameter-space.js";
import { plausibilityNotes } from "./plausibility.js";
import { deriveStartValues, type StartMethod } from "./start-values.js";
import { fitSpaceCovariance, informationCriteria } from "./statistics.js";
import { studentTQuantile } from "./student-t.js";

/** How the Jacobian is obtained: the model's analytic one, or finite differences in the fitting space. */
export type JacobianMethod = "analytic" | "forward" | "central";

/**
 * Input of fitModel: the drawdown model, the observation wells (t in d, s in m, r in m, Q in m3/d) and optional
 * start values, fixed values and bounds by parameter name (base units of each parameter, e.g. T m2/d, S
 * dimensionless), the Jacobian method and the stopping tolerances (dimensionless).
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
}

/**
 * One model parameter after a fit: its estimate, standard error and 95 % interval in the parameter's base unit
 * (named by `unit`, e.g. "m2/d" for transmissivity), whether it was fixed, and how it was fitted.
 */
export interface FitParameter {
  readonly name: string;
  readonly label: string;
  readonly unit: string;
  /** Estimate (or fixed value), base units. */
  readonly estimate: number;
  /** Standard error, base units (delta method for ln-space parameters); null when fixed or not identifiable. */
  readonly standardError: number | null;
  /**
   * 95 % interval, base units: for ln-space parameters exp(ln p +- t SE(ln p)), otherwise p +- t SE, with t the
   * Student t 0.975 quantile for n - p degrees of freedom; null when fixed or not identifiable.
   */
  readonly ci95: readonly [number, number] | null;
  readonly fixed: boolean;
  /** "ln" when fitted as ln(value), "linear" otherwise. */
  readonly scale: "ln" | "linear";
  /** Which bound the estimate sits on, if any. */
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

/**
 * Outcome of fitModel: parameter estimates with uncertainties (base units), covariance and correlation of the
 * free parameters, goodness of fit (SSR in m^2 times the weight unit, RMSE and residual standard error in m,
 * AIC/BIC/AICc dimensionless), residuals per well, iteration counts, convergence reason and warnings.
 */
export interface FitResult {
  readonly modelId: string;
  /** The model as a spec (its id, or its id with the geometry options it was made with), for forecasts. */
  readonly modelSpec: ModelSpec;
  readonly parameters: FitParameter[];
  /** Names of the free parameters: the row and column order of covariance and correlation. */
  readonly freeParameters: string[];
  /** Covariance of the free parameters, base units (delta method); NaN where not identifiable. */
  readonly covariance: number[][];
  readonly correlation: number[][];
  /** Weighted sum of squared residuals, m^2 (times the weight unit). */
  readonly ssr: number;
  /** sqrt(SSR / n), m. */
  readonly rmse: number;
  /** s = sqrt(SSR / (n - p)), m: the residual standard error behind the standard errors. */
  readonly residualStandardError: number;
  /** Points used. */
  readonly n: number;
  /** Free parameters. */
  readonly p: number;
  /** n - p. */
  readonly dof: number;
  /** Student t 0.975 quantile for dof degrees of freedom. */
  readonly tQuantile: number;
  /** n ln(SSR/n) + 2k, k = p + 1 (the error variance counts). */
  readonly aic: number;
  /** n ln(SSR/n) + k ln n, k = p + 1. */
  readonly bic: number;
  /** AIC + 2k(k + 1)/(n - k - 1); null when n <= k + 1. */
  readonly aicc: number | null;
  readonly residuals: WellResiduals[];
  readonly iterations: number;
  /** Model evaluations for residuals (finite-difference ones included). */
  readonly evaluations: number;
  readonly jacobianEvaluations: number;
  readonly convergence: ConvergenceReason;
  readonly converged: boolean;
  readonly jacobianMethod: JacobianMethod;
  readonly start: { readonly values: Record<string, number>; readonly method: StartMethod; readonly notes: string[] };
  readonly warnings: string[];
  /** Estimates far outside the ranges usually met, or drawdown beyond the saturated thickness (fit/plausibility.ts). */
  readonly plausibility: string[];
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
      },
    };
  }
  return problem;
}

/**
 * Fits `model` to the wells by weighted least squares: minimises sum_i w_i (s_model(t_i) - s_obs(t_i))^2 (m^2)
 * over the free parameters, positive ones in ln space, inside the bounds, with a bounded Levenberg-Marquardt
 * method (levenberg-marquardt.ts). Standard errors are s^2 (J^T J)^-1 with s^2 = SSR/(n - p), mapped to base
 * units by the delta method (statistics.ts). Throws FitInputError for unusable input (no wells, too few
 * points, non-finite data with the well and point index, unknown parameter names, bad bounds).
 */
export function fitModel(options: FitOptions): FitResult {
  const { model } = options;
  if (!model || typeof model.drawdown !== "function" || !Array.isArray(model.parameters)) {
    throw new FitInputError("fitModel: `model` is missing or is not a drawdown model (it needs parameters and drawdown()).");
  }
  const space = buildParameterSpace(model.parameters, options.fixed, options.bounds, options.start);
  const { wells, count: n } = packWells(options.wells);
  const p = space.freeIndex.length;
  const names = model.parameters.map((d) => d.name);
  if (n === 0) throw new FitInputError("fitModel: every point is masked out or has zero weight; there is nothing to fit.");
  if (n <= p) {
    throw new FitInputError(
      `fitModel: ${n} point${n === 1 ? "" : "s"} for ${p} free parameters; a fit needs more points than free parameters ` +
        "(and uncertainties need at least one more). Add data or fix parameters.",
    );
  }
  for (const k of space.freeIndex) {
    const d = model.parameters[k]!;
    const v = options.start?.[d.name];
    if (v === undefined) continue;
    const [lo, hi] = space.nativeBounds[k]!;
    if (!Number.isFinite(v) || (d.positive && !(v > 0)) || v < lo || v > hi) {
      throw new FitInputError(
        `fitModel: start value of ${d.name} (${d.label}) is ${v} ${d.unit}; it must be a finite number within the bounds [${lo}, ${hi}]${d.positive ? " and > 0" : ""}.`,
      );
    }
  }
  const method: JacobianMethod = options.jacobian ?? (model.jacobian ? "analytic" : "central");
  if (method === "analytic" && !model.jacobian) {
    throw new FitInputError(`fitModel: model "${model.id}" has no analytic Jacobian; use jacobian: "forward" or "central".`);
  }

  const start = deriveStartValues(model, space, wells, options.start);
  const problem = makeProblem(model, space, wells, n, method);
  const theta0 = toFitSpace(space, start.values);
  const probe = new Float64Array(n);
  {
    try {
      weightedResiduals(model, wells, toNative(space, theta0, new Float64Array(names.length)), new Float64Array(n), probe);
    } catch (error) {
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

  const estimate = toNative(space, lm.x, new Float64Array(names.length));
  const dof = n - p;
  const s2 = lm.ssr / dof;
  const tQuantile = studentTQuantile(0.975, dof);
  const cov = p > 0 ? fitSpaceCovariance(lm.jacobian, n, p, s2) : null;
  const warnings: string[] = [];
  const freeNames = space.freeIndex.map((k) => names[k]!);

  // Native covariance and correlation (delta method).
  const gain = space.freeIndex.map((k, j) => (space.logScale[j] ? estimate[k]! : 1));
  const covariance: number[][] = [];
  const correlation: number[][] = [];
  for (let a = 0; a < p; a++) {
    const rowCov: number[] = [];
    const rowCorr: number[] = [];
    for (let b = 0; b < p; b++) {
      const c = cov!.covariance[a]![b]!;
      rowCov.push(c * gain[a]! * gain[b]!);
      const denom = Math.sqrt(cov!.covariance[a]![a]! * cov!.covariance[b]![b]!);
      rowCorr.push(a === b ? (Number.isNaN(c) ? NaN : 1) : denom > 0 ? c / denom : NaN);
    }
    covariance.push(rowCov);
    correlation.push(rowCorr);
  }

  const parameters: FitParameter[] = model.parameters.map((d, k) => {
    const j = space.freeIndex.indexOf(k);
    const value = estimate[k]!;
    const base = { name: d.name, label: d.label, unit: d.unit, estimate: value };
    if (j < 0) return { ...base, standardError: null, ci95: null, fixed: true, scale: d.positive ? "ln" : "linear", atBound: null };
    const variance = cov!.covariance[j]![j]!;
    const seFit = Number.isNaN(variance) ? NaN : Math.sqrt(variance);
    const theta = lm.x[j]!;
    const ci95: readonly [number, number] | null = Number.isNaN(seFit)
      ? null
      : space.logScale[j]
        ? [Math.exp(theta - tQuantile * seFit), Math.exp(theta + tQuantile * seFit)]
        : [theta - tQuantile * seFit, theta + tQuantile * seFit];
    const atBound = theta <= space.lower[j]! ? "lower" : theta >= space.upper[j]! ? "upper" : null;
    return {
      ...base,
      standardError: Number.isNaN(seFit) ? null : seFit * gain[j]!,
      ci95,
      fixed: false,
      scale: space.logScale[j] ? "ln" : "linear",
      atBound,
    };
  });

  if (cov) {
    for (const direction of cov.nullDirections) {
      const terms = direction
        .map(({ index, weight }) => `${weight < 0 ? "-" : "+"} ${formatNumber(Math.abs(weight))} ${space.logScale[index] ? "ln " : ""}${freeNames[index]}`)
        .join(" ")
        .replace(/^\+ /, "");
      const involved = direction.map(({ index }) => freeNames[index]!).join(" and ");
      warnings.push(
        `${involved} cannot be determined separately from these data: the combination ${terms} is not constrained ` +
          `(smallest singular value of the Jacobian is ${formatNumber(cov.singularValues[cov.singularValues.length - 1]! / cov.singularValues[0]!)} of the largest). ` +
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
      const bound = space.nativeBounds[k]![fp.atBound === "lower" ? 0 : 1];
      warnings.push(
        `${fp.name} = ${formatNumber(fp.estimate)} ${fp.unit} is at its ${fp.atBound} bound ${bound}: the bound, not the data, ` +
          "sets this value and its uncertainty means little; check the model choice or widen the bound.",
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
    residualStandardError: Math.sqrt(s2),
    n,
    p,
    dof,
    tQuantile,
    aic: criteria.aic,
    bic: criteria.bic,
    aicc: criteria.aicc,
    residuals,
    iterations: lm.iterations,
    evaluations: lm.evaluations,
    jacobianEvaluations: lm.jacobianEvaluations,
    convergence: lm.reason,
    converged: lm.reason !== "max-evaluations" && lm.reason !== "stalled",
    jacobianMethod: method,
    start: { values: startRecord, method: start.method, notes: start.notes },
    warnings,
    plausibility: plausibilityNotes(model, Object.fromEntries(parameters.map((q) => [q.name, q.estimate])), Math.max(...residuals.flatMap((w) => Array.from(w.observed)))),
  };
}
