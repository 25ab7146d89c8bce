/**
 * forecastAt: drawdown forecasts around one pumping well in the units of the practitioner (distances, times and
 * rates with their units, drawdown in a chosen length unit), with the uncertainty bands of forecastDrawdown. Values
 * are converted to base units and back with the units module only.
 */
import { isRateSchedule, type PumpingRate, type ValueWithUnit } from "../data/index.js";
import type { FitParameter, FitResult } from "../fit/index.js";
import { forecastDrawdown, type ForecastUncertainty, type GivenParameters } from "../forecast/index.js";
import { getModel, type DrawdownModel, type ModelSpec } from "../models/index.js";
import { convertArray } from "../units/index.js";
import { AnalysisInputError } from "./errors.js";
import { convertAt } from "./unit-values.js";
import { largestOfAll } from "../numerics/extremes.js";

/** The parts of a fit result a forecast reads (a FitResult has them all; plain data from a cell may carry just these). */
export interface ForecastableFit {
  readonly modelId: string;
  /** The fitted model as a spec (id with geometry options); needed to forecast with a model bound to geometry. */
  readonly modelSpec?: ModelSpec;
  readonly parameters: readonly Pick<FitParameter, "name" | "estimate">[];
  /** Names of the free parameters, in covariance order. */
  readonly freeParameters: readonly string[];
  /** Covariance of the free parameters, base units. */
  readonly covariance: readonly (readonly number[])[] | readonly ArrayLike<number>[];
  /** n - p of the fit; with uncertainty.dof it gives the Student t quantile of the bands (normal without either). */
  readonly dof?: number;
  /** s = sqrt(SSR/(n - p)), m: the scatter of a prediction band when uncertainty.scatter is absent. */
  readonly residualStandardError?: number;
  /** The fit's uncertainty record: degrees of freedom of the intervals in use and the scatter of one reading (m). */
  readonly uncertainty?: { readonly dof: number; readonly scatter: number };
}

/** A forecast point at a distance from the pumping well. */
export interface DistancePoint {
  readonly name: string;
  readonly distance: ValueWithUnit;
}

/** Options of {@link forecastAt}. */
export interface ForecastAtOptions {
  /** The fit whose estimates (and covariance, for bands) are used. */
  readonly fit: ForecastableFit | FitResult;
  /** The model to forecast with (a model or a spec); default the fit's model (the base model of a "+schedule" fit). */
  readonly model?: DrawdownModel | ModelSpec;
  readonly points: readonly DistancePoint[];
  /** Times since pumping started, in `unit`. */
  readonly times: { readonly values: ArrayLike<number>; readonly unit: string };
  /** A constant rate, or a schedule whose step starts are in `times.unit`. */
  readonly rate: PumpingRate;
  /** Default "none". */
  readonly uncertainty?: ForecastUncertainty;
  /** Length unit of the forecast drawdowns. */
  readonly lengthUnit: string;
  /** Called before each Monte Carlo sample (see forecastDrawdown's `checkpoint`). */
  readonly checkpoint?: () => void;
}

/** The forecast at one point, in the requested units. */
export interface PointForecastInUnits {
  readonly name: string;
  readonly distance: ValueWithUnit;
  /** Times, in the result's timeUnit. */
  readonly times: Float64Array;
  /** Drawdown at the estimates and its band, in the result's lengthUnit; band fields null for "none". */
  readonly drawdown: Float64Array;
  readonly standardDeviation: Float64Array | null;
  readonly p05: Float64Array | null;
  readonly p50: Float64Array | null;
  readonly p95: Float64Array | null;
  /** 5 and 95 % values of the prediction band of one reading, in lengthUnit; null without a scatter or for "none". */
  readonly prediction05: Float64Array | null;
  readonly prediction95: Float64Array | null;
  readonly mean: Float64Array | null;
}

/** Result of {@link forecastAt}. */
export interface ForecastAtResult {
  readonly modelId: string;
  readonly method: "none" | "linear" | "monte-carlo";
  readonly lengthUnit: string;
  readonly timeUnit: string;
  readonly points: PointForecastInUnits[];
  readonly uncertainParameters: string[];
  readonly samples: number | null;
  readonly seed: number | null;
  /** Degrees of freedom behind the bands (Infinity: normal quantiles) and what each band covers. */
  readonly dof: number;
  readonly bands: { readonly confidence: string; readonly prediction: string | null; readonly notCovered: string } | null;
  readonly notes: string[];
}

const WHERE = "forecastAt";

/** Suffix of the registered step-test models with a well loss C Q^n ("theis+well-loss", ...). */
const WELL_LOSS = "+well-loss";

/**
 * The aquifer model under a step test with well loss: Theis, or Papadopulos-Cooper with the casing, screen and
 * skin of the fit's spec.
 */
function wellLossAquifer(fit: ForecastableFit): DrawdownModel {
  const base = fit.modelId.slice(0, -WELL_LOSS.length);
  const spec = fit.modelSpec;
  if (spec !== undefined && typeof spec === "object") {
    const { id: _id, steps: _steps, ...options } = spec as { id: string; steps?: unknown; [option: string]: unknown };
    return getModel(Object.keys(options).length === 0 ? base : { id: base, ...options });
  }
  return getModel(base);
}

/** The model to forecast with: the given one, or the fit's model; fits with boundaries or several wells are refused. */
function forecastModel(fit: ForecastableFit, model: DrawdownModel | ModelSpec | undefined): DrawdownModel {
  if (model !== undefined) return typeof model === "object" && typeof (model as DrawdownModel).drawdown === "function" ? (model as DrawdownModel) : getModel(model as ModelSpec);
  if (fit.modelId.endsWith(WELL_LOSS)) return wellLossAquifer(fit);
  const [baseId, wrapper] = fit.modelId.split("+");
  if (wrapper !== undefined && wrapper !== "schedule") {
    throw new AnalysisInputError(
      `${WHERE}: the fit is of "${fit.modelId}", whose ${wrapper} are not part of the fit result; forecastAt forecasts around one well without ` +
        "boundaries. Use forecastDrawdown with the same wells and boundaries, or pass model explicitly if ignoring them is intended.",
    );
  }
  const spec = fit.modelSpec;
  if (spec !== undefined && typeof spec === "object" && spec.id === baseId) return getModel(spec);
  return getModel(baseId!);
}

/**
 * Estimates and covariance (base units) of a fit as the given-parameters input of forecastDrawdown, with the
 * fit's degrees of freedom and residual scatter (m) for Student t confidence and prediction bands. The forecasts
 * then work in the fit's own space: fitModel fits exactly the positive parameters in ln space, which is what
 * forecastDrawdown assumes for given parameters (forecast/parameters.ts), so the numbers are those of { fit }.
 * A fit with parameters the forecast model lacks (the well loss C, n of a step test forecast with its aquifer
 * model) gives the covariance of the model's parameters only: the marginal covariance, the sub-matrix.
 * @throws AnalysisInputError when the fit is of another model or lacks one of the model's parameters.
 */
export function fitAsGivenParameters(where: string, fit: ForecastableFit, model: DrawdownModel): GivenParameters {
  if (fit.modelId !== model.id && !fit.modelId.startsWith(`${model.id}+`)) {
    throw new AnalysisInputError(`${where}: the fit is of model "${fit.modelId}" but the forecast uses "${model.id}"; forecast with the model that was fitted.`);
  }
  const parameters: Record<string, number> = {};
  for (const d of model.parameters) {
    const fp = fit.parameters.find((q) => q.name === d.name);
    if (!fp) throw new AnalysisInputError(`${where}: the fit has no parameter ${d.name} (${d.label}).`);
    parameters[d.name] = fp.estimate;
  }
  const keep = fit.freeParameters.map((name, i) => ({ name, i })).filter(({ name }) => model.parameters.some((d) => d.name === name));
  const matrix = keep.map(({ i }) => keep.map(({ i: j }) => fit.covariance[i]![j]!));
  const dof = fit.uncertainty?.dof ?? fit.dof;
  const scatter = fit.uncertainty?.scatter ?? fit.residualStandardError;
  return {
    parameters,
    covariance: { names: keep.map(({ name }) => name), matrix },
    ...(dof !== undefined ? { dof } : {}),
    ...(scatter !== undefined ? { scatter } : {}),
  };
}

/** The well loss C Q^n (m) at each distinct rate of the forecast, as notes, for a step-test fit. */
function wellLossNotes(fit: ForecastableFit, steps: readonly { rate: number }[]): string[] {
  const C = fit.parameters.find((q) => q.name === "C")?.estimate;
  const n = fit.parameters.find((q) => q.name === "n")?.estimate;
  if (C === undefined || n === undefined) return [];
  const rates = [...new Set(steps.map((s) => s.rate).filter((q) => q > 0))];
  const losses = rates.map((q) => `${Number((C * Math.pow(q, n)).toPrecision(3))} m at ${Number(q.toPrecision(6))} m3/d`);
  return [
    `The fit is of a step test with well loss: the forecast is the aquifer's drawdown (${fit.modelId.slice(0, -WELL_LOSS.length)}) without it. ` +
      `Inside the pumped well add the well loss C Q^n = ${losses.join(", ")} (C and n at their estimates; the band covers the aquifer parameters only).`,
  ];
}

/** The rate as pumping steps in base units (d, m3/d), step starts in `timeUnit`. */
function stepsInBase(rate: PumpingRate, timeUnit: string): { start: number; rate: number }[] {
  if (!rate || typeof rate.unit !== "string") throw new AnalysisInputError(`${WHERE}: rate must be { value, unit } or { unit, steps: [{ start, rate }] }.`);
  if (!isRateSchedule(rate)) return [{ start: 0, rate: convertAt(WHERE, "rate", rate.value, rate.unit, "m3/d") }];
  const starts = convertArray(rate.steps.map((s) => s.start), timeUnit, "d");
  return rate.steps.map((s, i) => ({ start: starts[i]!, rate: convertAt(WHERE, "rate", s.rate, rate.unit, "m3/d") }));
}

/**
 * Drawdown forecast in `lengthUnit` at points given by their distance (with unit) from one pumping well, at times
 * (with unit) for a constant rate or a schedule (with unit), from a fit: the estimates and, with uncertainty
 * "linear" or { monteCarlo }, the 5/50/95 % band and standard deviation of forecastDrawdown (delta method,
 * JCGM 100:2008 section 5.1; or seeded Monte Carlo in the fit's space). Conversions by the units module.
 * @throws UnitError (units module) for a unit of the wrong dimension; AnalysisInputError and ForecastInputError
 *   for unusable input.
 */
export function forecastAt(options: ForecastAtOptions): ForecastAtResult {
  const { fit } = options;
  if (!fit || typeof fit.modelId !== "string" || !Array.isArray(fit.parameters)) {
    throw new AnalysisInputError(`${WHERE}: fit must be a fit result (from fitModel or fitSeries).`);
  }
  const model = forecastModel(fit, options.model);
  if (!Array.isArray(options.points) || options.points.length === 0) {
    throw new AnalysisInputError(`${WHERE}: no points given; pass points: [{ name, distance: { value, unit } }].`);
  }
  const lengthUnit = options.lengthUnit;
  convertAt(WHERE, "lengthUnit", 1, "m", lengthUnit);
  if (!options.times || typeof options.times.unit !== "string") {
    throw new AnalysisInputError(`${WHERE}: times must be { values, unit }, e.g. { values: [1, 10, 100], unit: "d" }.`);
  }
  const timeUnit = options.times.unit;
  convertAt(WHERE, "times.unit", 1, timeUnit, "d");
  const t = convertArray(options.times.values, timeUnit, "d");
  const distances = options.points.map((p, i) => {
    if (!p?.distance) throw new AnalysisInputError(`${WHERE}: point ${i} ("${p?.name}") needs distance: { value, unit }.`);
    return convertAt(WHERE, `points[${i}].distance`, p.distance.value, p.distance.unit, "m");
  });
  const steps = stepsInBase(options.rate, timeUnit);
  const result = forecastDrawdown({
    model,
    ...fitAsGivenParameters(WHERE, fit, model),
    schedule: [{ name: "pumping well", x: 0, y: 0, steps }],
    points: options.points.map((p, i) => ({ name: p.name, r: distances[i]! })),
    times: t,
    uncertainty: options.uncertainty ?? "none",
    ...(options.checkpoint ? { checkpoint: options.checkpoint } : {}),
  });
  const inUnit = (values: Float64Array | null) => (values === null ? null : convertArray(values, "m", lengthUnit));
  const notes = [...result.notes, ...(options.model === undefined && fit.modelId.endsWith(WELL_LOSS) ? wellLossNotes(fit, steps) : [])];
  const spec = (model as { spec?: Record<string, unknown> }).spec;
  const thickness = typeof spec?.saturatedThickness === "number" ? spec.saturatedThickness : typeof spec?.aquiferThickness === "number" ? spec.aquiferThickness : undefined;
  const largest = largestOfAll(result.points.map((p) => p.drawdown));
  if (thickness !== undefined && largest > thickness) {
    notes.push(
      `Plausibility: the forecast drawdown reaches ${Number(largest.toPrecision(3))} m, more than the saturated thickness ${thickness} m: the aquifer ` +
        "would be dewatered there and the model no longer applies; the forecast overstates what can happen.",
    );
  }
  return {
    modelId: model.id,
    method: result.method,
    lengthUnit,
    timeUnit,
    points: result.points.map((p, i) => ({
      name: p.name,
      distance: { value: options.points[i]!.distance.value, unit: options.points[i]!.distance.unit },
      times: Float64Array.from(options.times.values),
      drawdown: convertArray(p.drawdown, "m", lengthUnit),
      standardDeviation: inUnit(p.standardDeviation),
      p05: inUnit(p.p05),
      p50: inUnit(p.p50),
      p95: inUnit(p.p95),
      prediction05: inUnit(p.prediction05),
      prediction95: inUnit(p.prediction95),
      mean: inUnit(p.mean),
    })),
    uncertainParameters: result.uncertainParameters,
    samples: result.samples,
    seed: result.seed,
    dof: result.dof,
    bands: result.bands,
    notes,
  };
}
