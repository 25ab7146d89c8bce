/**
 * Parameter values and their covariance as the forecasts use them: a full native vector (descriptor order, base
 * units) and, for the free parameters, the fitting-space coordinates theta (ln p for positive parameters, p
 * otherwise) with their covariance.
 *
 * FitResult.covariance is in base units, obtained from the fitting-space covariance C_theta by the delta method
 * cov_ab = g_a g_b C_theta,ab with g = p for ln-space parameters and 1 otherwise (fit/fit-model.ts). The forecasts
 * undo that map, C_theta,ab = cov_ab/(g_a g_b), so that sampling and propagation happen in the space the fit used:
 * a positive parameter stays positive and its uncertainty is log-normal.
 */
import type { FitResult } from "../fit/index.js";
import type { DrawdownModel } from "../models/index.js";
import { ForecastInputError } from "./errors.js";

/** Parameters given directly: native values by name, optional covariance of some of them in base units. */
export interface GivenParameters {
  /** Values by parameter name, base units. */
  readonly parameters: Readonly<Record<string, number>>;
  /** Covariance in base units (like FitResult.covariance) of the parameters `names`, in that order. */
  readonly covariance?: { readonly names: readonly string[]; readonly matrix: readonly (readonly number[])[] };
  /**
   * Degrees of freedom of the covariance (the fit's, for Student t bands); absent or Infinity: normal quantiles,
   * as for a covariance known exactly.
   */
  readonly dof?: number;
  /** Standard deviation of one reading's error about the model, m (for prediction bands); absent: no prediction band. */
  readonly scatter?: number;
}

/** Where the parameters come from: a fit, or given values with an optional covariance. */
export type ParameterInput = { readonly fit: FitResult } | GivenParameters;

/** Resolved parameters. */
export interface ResolvedParameters {
  /** Native values, descriptor order, base units. */
  readonly values: Float64Array;
  /** Descriptor indices of the parameters with uncertainty. */
  readonly free: readonly number[];
  /** Per free parameter: theta = ln p. */
  readonly logScale: readonly boolean[];
  /** Fitting-space coordinates of the free parameters. */
  readonly theta: Float64Array;
  /** Covariance of theta; null when none was given. */
  readonly covariance: number[][] | null;
  /** Degrees of freedom of the covariance (Infinity: known exactly, normal quantiles). */
  readonly dof: number;
  /** Residual scatter of one reading, m; null when unknown. */
  readonly scatter: number | null;
}

/** Native vector for fitting-space coordinates theta. */
export function nativeFromTheta(resolved: ResolvedParameters, theta: ArrayLike<number>, out: Float64Array): Float64Array {
  out.set(resolved.values);
  resolved.free.forEach((k, j) => {
    out[k] = resolved.logScale[j] ? Math.exp(theta[j]!) : theta[j]!;
  });
  return out;
}

/**
 * Resolves the parameter input against the model's descriptors: every parameter needs a finite value (> 0 for
 * positive ones); the covariance, when present, must be finite and square. Throws ForecastInputError otherwise.
 */
export function resolveParameters(where: string, model: DrawdownModel, input: ParameterInput): ResolvedParameters {
  const names = model.parameters.map((d) => d.name);
  const values = new Float64Array(names.length);
  let covNames: readonly string[] = [];
  let matrix: readonly (readonly number[])[] | null = null;
  let scales: readonly boolean[] = [];
  let dof = Infinity;
  let scatter: number | null = null;
  if ("fit" in input && input.fit) {
    const fit = input.fit;
    // A fit of a superposition wrapper ("theis+schedule", "theis+boundaries", ...) has the base model's parameters.
    if (fit.modelId !== model.id && !fit.modelId.startsWith(`${model.id}+`)) {
      throw new ForecastInputError(
        `${where}: the fit is of model "${fit.modelId}" but the forecast uses "${model.id}"; forecast with the model that was fitted (or its base model).`,
      );
    }
    names.forEach((name, k) => {
      const fp = fit.parameters.find((q) => q.name === name);
      if (!fp) throw new ForecastInputError(`${where}: the fit has no parameter ${name}.`);
      values[k] = fp.estimate;
    });
    covNames = fit.freeParameters;
    matrix = fit.covariance;
    scales = covNames.map((name) => fit.parameters.find((q) => q.name === name)?.scale === "ln");
    dof = fit.uncertainty?.dof ?? fit.dof;
    scatter = fit.uncertainty?.scatter ?? fit.residualStandardError;
  } else {
    const given = input as GivenParameters;
    if (!given.parameters) throw new ForecastInputError(`${where}: give either fit (a FitResult) or parameters { ${names.join(", ")} } in base units.`);
    names.forEach((name, k) => {
      const v = given.parameters[name];
      if (v === undefined) throw new ForecastInputError(`${where}: parameters has no value for ${name}; the model needs ${names.join(", ")}.`);
      values[k] = v;
    });
    for (const key of Object.keys(given.parameters)) {
      if (!names.includes(key)) throw new ForecastInputError(`${where}: parameters names "${key}", which model "${model.id}" does not have (${names.join(", ")}).`);
    }
    if (given.dof !== undefined) {
      if (!(given.dof > 0)) throw new ForecastInputError(`${where}: dof is ${given.dof}; give the degrees of freedom of the covariance as a number > 0 (Infinity for a known covariance).`);
      dof = given.dof;
    }
    if (given.scatter !== undefined) {
      if (!(Number.isFinite(given.scatter) && given.scatter >= 0)) throw new ForecastInputError(`${where}: scatter is ${given.scatter} m; give the residual standard deviation as a finite number >= 0.`);
      scatter = given.scatter;
    }
    if (given.covariance) {
      covNames = given.covariance.names;
      matrix = given.covariance.matrix;
      scales = covNames.map((name) => model.parameters.find((d) => d.name === name)?.positive === true);
    }
  }
  model.parameters.forEach((d, k) => {
    const v = values[k]!;
    if (!Number.isFinite(v) || (d.positive && !(v > 0))) {
      throw new ForecastInputError(`${where}: ${d.name} (${d.label}) is ${v} ${d.unit}; it must be finite${d.positive ? " and > 0" : ""}.`);
    }
  });
  const free = covNames.map((name) => {
    const k = names.indexOf(name);
    if (k < 0) throw new ForecastInputError(`${where}: the covariance names "${name}", which model "${model.id}" does not have.`);
    return k;
  });
  if (new Set(free).size !== free.length) throw new ForecastInputError(`${where}: the covariance names a parameter twice.`);
  const theta = Float64Array.from(free, (k, j) => (scales[j] ? Math.log(values[k]!) : values[k]!));
  let covariance: number[][] | null = null;
  if (matrix) {
    const m = free.length;
    if (matrix.length !== m || matrix.some((row) => row.length !== m)) {
      throw new ForecastInputError(`${where}: the covariance must be ${m} x ${m} for ${covNames.join(", ")}.`);
    }
    covariance = [];
    for (let a = 0; a < m; a++) {
      const row: number[] = [];
      for (let b = 0; b < m; b++) {
        const c = matrix[a]![b]!;
        if (!Number.isFinite(c)) {
          throw new ForecastInputError(
            `${where}: the covariance of ${covNames[a]} and ${covNames[b]} is ${c}: the data did not determine these parameters. ` +
              "Fix one of them in the fit, or forecast with uncertainty \"none\".",
          );
        }
        const ga = scales[a] ? values[free[a]!]! : 1;
        const gb = scales[b] ? values[free[b]!]! : 1;
        row.push(c / (ga * gb));
      }
      covariance.push(row);
    }
  }
  return { values, free, logScale: scales, theta, covariance, dof, scatter };
}

/** Native vector from a record by name or an array in descriptor order, checked against the model. */
export function parameterVector(where: string, model: DrawdownModel, params: Readonly<Record<string, number>> | ArrayLike<number>): Float64Array {
  const names = model.parameters.map((d) => d.name);
  let values: Float64Array;
  if (typeof (params as ArrayLike<number>).length === "number") {
    values = Float64Array.from(params as ArrayLike<number>);
    if (values.length !== names.length) throw new ForecastInputError(`${where}: ${values.length} parameter values for ${names.length} parameters (${names.join(", ")}).`);
  } else {
    values = Float64Array.from(names, (name) => {
      const v = (params as Readonly<Record<string, number>>)[name];
      if (v === undefined) throw new ForecastInputError(`${where}: no value for ${name}; the model needs ${names.join(", ")}.`);
      return v;
    });
  }
  model.parameters.forEach((d, k) => {
    const v = values[k]!;
    if (!Number.isFinite(v) || (d.positive && !(v > 0))) {
      throw new ForecastInputError(`${where}: ${d.name} (${d.label}) is ${v} ${d.unit}; it must be finite${d.positive ? " and > 0" : ""}.`);
    }
  });
  return values;
}
