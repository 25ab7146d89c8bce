/**
 * fitSeries: a fit of a drawdown model to observation series given in the units of the data (ft, min, US gal/min,
 * ...), with the parameter table reported in the units the practitioner asks for. The series are converted to
 * base units (m, d, m3/d) with the units module (data/base-units.ts), the fit is fitModel's, and the estimates,
 * standard errors and 95 % intervals are converted back with the units module; no factor is written here.
 */
import { createObservationSeries, toBaseUnits, type ObservationSeries, type SeriesInBaseUnits, type ValueWithUnit } from "../data/index.js";
import { fitModel, type FitOptions, type FitParameter, type FitResult } from "../fit/index.js";
import { getModel, modelSpecOf, type DrawdownModel, type ModelSpec } from "../models/index.js";
import { withRateSchedule, type PumpingStep } from "../superposition/index.js";
import { AnalysisInputError } from "./errors.js";
import { convertAt, parameterDescriptor, recordToBase, type NumberOrQuantity } from "./unit-values.js";

/** Bounds of one parameter: [low, high] in base units, or with their unit. */
export type BoundsWithUnit = readonly [number, number] | { readonly low: number; readonly high: number; readonly unit: string };

/** Options of {@link fitSeries}: the fit options of fitModel, with series and values in their own units. */
export interface FitSeriesOptions {
  /**
   * The model, its id in the registry ("theis", "hantush-jacob", ...), or for a model bound to geometry its id
   * with options ({ id: "neuman", saturatedThickness: { value: 40, unit: "ft" } }).
   */
  readonly model: DrawdownModel | ModelSpec;
  /**
   * One or several series, each in its own time, length, rate and radius units. All share the model parameters.
   * A series whose rate follows a schedule of several steps is fitted by superposition in time (withRateSchedule);
   * then every series must follow the same schedule (one pumping well, several observation points).
   */
  readonly series: readonly ObservationSeries[];
  /** Starting values by parameter name: a number in the parameter's base unit, or { value, unit }. */
  readonly start?: Readonly<Record<string, NumberOrQuantity>>;
  /** Parameters held fixed: a number in the base unit, or { value, unit }. */
  readonly fixed?: Readonly<Record<string, NumberOrQuantity>>;
  /** Bounds by parameter name. */
  readonly bounds?: Readonly<Record<string, BoundsWithUnit>>;
  /** Units of the reported table by parameter name, e.g. { T: "ft2/d", B: "ft" }; others are reported in base units. */
  readonly reportUnits?: Readonly<Record<string, string>>;
  /** Length unit of the reported RMSE; default the first series' lengthUnit. */
  readonly lengthUnit?: string;
  readonly jacobian?: FitOptions["jacobian"];
  readonly ftol?: number;
  readonly xtol?: number;
  readonly gtol?: number;
  readonly maxEvaluations?: number;
  readonly correlationWarning?: number;
  /**
   * Known standard deviation of every reading: a number in the first series' length unit, or { value, unit }.
   * The weights become absolute and a chi-square test checks the fit (see FitOptions.measurementSd).
   */
  readonly measurementSd?: NumberOrQuantity;
  readonly correlation?: FitOptions["correlation"];
  readonly profile?: FitOptions["profile"];
  readonly independenceLevel?: number;
  /** For the cooper-jacob model: the u limit and what to do with readings beyond it. */
  readonly cooperJacob?: FitOptions["cooperJacob"];
}

/** One row of a parameter table in report units. */
export interface ParameterTableRow {
  readonly parameter: string;
  readonly label: string;
  /** Estimate (or fixed value), in `unit`. */
  readonly estimate: number;
  /** Standard error in `unit`; null when fixed or not identifiable. */
  readonly standardError: number | null;
  /** 95 % interval in `unit` (the fit's interval converted, so it stays asymmetric for ln-space parameters). */
  readonly low95: number | null;
  readonly high95: number | null;
  readonly unit: string;
  readonly fixed: boolean;
  /** Which interval low95..high95 is (FitParameter.ci95Method). */
  readonly interval: FitParameter["ci95Method"];
}

/** The fit in base units (as fitModel returns it) with the table and RMSE in report units. */
export interface SeriesFitResult extends FitResult {
  /** One row per model parameter, in descriptor order, in the report units. */
  readonly table: ParameterTableRow[];
  /** sqrt(SSR / n) in the report length unit. */
  readonly rmseReported: ValueWithUnit;
  /** The unit each parameter is reported in. */
  readonly reportUnits: Record<string, string>;
}

const WHERE = "fitSeries";

/** Relative tolerance for two schedules, converted to base units from different units, to count as the same. */
const SAME_SCHEDULE = 1e-9;

function resolveModel(model: DrawdownModel | ModelSpec): DrawdownModel {
  if (typeof model === "string") return getModel(model);
  if (model && typeof (model as DrawdownModel).drawdown === "function" && Array.isArray((model as DrawdownModel).parameters)) return model as DrawdownModel;
  if (model && typeof (model as { id?: unknown }).id === "string") return getModel(model as ModelSpec);
  throw new AnalysisInputError(`${WHERE}: model must be a drawdown model, a model id such as "theis", or { id, ...options } for a model bound to geometry.`);
}

function sameSchedule(a: SeriesInBaseUnits["steps"], b: SeriesInBaseUnits["steps"]): boolean {
  if (a.start.length !== b.start.length) return false;
  const close = (x: number, y: number) => Math.abs(x - y) <= SAME_SCHEDULE * Math.max(Math.abs(x), Math.abs(y), 1e-300);
  for (let i = 0; i < a.start.length; i++) {
    if (!(a.start[i] === b.start[i] || close(a.start[i]!, b.start[i]!))) return false;
    if (!(a.rate[i] === b.rate[i] || close(a.rate[i]!, b.rate[i]!))) return false;
  }
  return true;
}

/** The model the wells are fitted with: the base model, or the base model driven by the series' common schedule. */
function scheduleModel(model: DrawdownModel, bases: readonly SeriesInBaseUnits[]): { model: DrawdownModel; steps: PumpingStep[] | null } {
  const stepped = bases.findIndex((b) => b.Q === null);
  const own = (model as DrawdownModel & { steps?: readonly PumpingStep[] }).steps;
  if (model.id.endsWith("+well-loss") && own !== undefined) {
    // A step test with well loss carries its schedule: the series must follow it and are not wrapped again.
    const start = Float64Array.from(own, (s) => s.start);
    const rate = Float64Array.from(own, (s) => s.rate);
    for (const b of bases) {
      if (b.Q === null && !sameSchedule(b.steps, { start, rate } as SeriesInBaseUnits["steps"])) {
        throw new AnalysisInputError(
          `${WHERE}: series "${b.name}" does not follow the steps of model "${model.id}"; give the model the series' rate schedule (in d and m3/d) as its steps.`,
        );
      }
    }
    return { model, steps: own.map((s) => ({ start: s.start, rate: s.rate })) };
  }
  if (stepped < 0) return { model, steps: null };
  const reference = bases[stepped]!;
  bases.forEach((b) => {
    if (!sameSchedule(b.steps, reference.steps)) {
      throw new AnalysisInputError(
        `${WHERE}: series "${b.name}" does not follow the rate schedule of series "${reference.name}"; series fitted together share one pumping well ` +
          "and its schedule. Give every series the same pumpingRate steps, or fit them separately.",
      );
    }
  });
  const steps = Array.from(reference.steps.start, (start, i) => ({ start, rate: reference.steps.rate[i]! }));
  return { model: withRateSchedule(model, steps), steps };
}

function boundsToBase(model: DrawdownModel, bounds: FitSeriesOptions["bounds"]): Record<string, readonly [number, number]> | undefined {
  if (bounds === undefined) return undefined;
  const out: Record<string, readonly [number, number]> = {};
  for (const [name, given] of Object.entries(bounds)) {
    const d = parameterDescriptor(WHERE, model, name, "bounds");
    if (Array.isArray(given)) {
      out[name] = [given[0]!, given[1]!];
    } else {
      const b = given as { low: number; high: number; unit: string };
      out[name] = [convertAt(WHERE, `bounds.${name}`, b.low, b.unit, d.unit), convertAt(WHERE, `bounds.${name}`, b.high, b.unit, d.unit)];
    }
  }
  return out;
}

/**
 * Report unit of every parameter, checked against its dimension before any fitting is done. Names the model does
 * not have are listed in `ignored` (one set of report units may serve several models, e.g. B for the leaky one).
 */
function checkReportUnits(model: DrawdownModel, reportUnits: FitSeriesOptions["reportUnits"]): { units: Record<string, string>; ignored: string[] } {
  const units: Record<string, string> = {};
  const ignored: string[] = [];
  for (const d of model.parameters) units[d.name] = d.unit;
  for (const [name, unit] of Object.entries(reportUnits ?? {})) {
    const d = model.parameters.find((p) => p.name === name);
    if (!d) {
      ignored.push(name);
      continue;
    }
    convertAt(WHERE, `reportUnits.${name} (${d.label})`, 1, d.unit, unit);
    units[name] = unit;
  }
  return { units, ignored };
}

/** A known measurement standard deviation in m: a number in `lengthUnit`, or a length with its unit. */
function measurementSdInMetres(value: NumberOrQuantity | undefined, lengthUnit: string): number | undefined {
  if (value === undefined) return undefined;
  if (typeof value === "number") return convertAt(WHERE, "measurementSd", value, lengthUnit, "m");
  return convertAt(WHERE, "measurementSd", value.value, value.unit, "m");
}

/** The fit's parameters converted with the units module into the report units. */
export function parameterTable(fit: FitResult, units: Readonly<Record<string, string>>): ParameterTableRow[] {
  return fit.parameters.map((p) => {
    const unit = units[p.name] ?? p.unit;
    const to = (v: number) => convertAt("parameterTable", p.name, v, p.unit, unit);
    return {
      parameter: p.name,
      label: p.label,
      estimate: to(p.estimate),
      standardError: p.standardError === null ? null : to(p.standardError),
      low95: p.ci95 === null ? null : to(p.ci95[0]),
      high95: p.ci95 === null ? null : to(p.ci95[1]),
      unit,
      fixed: p.fixed,
      interval: p.ci95Method,
    };
  });
}

/**
 * Fits `model` to observation series in their own units: each series is checked (createObservationSeries) and
 * converted to base units (t d, s m, r m, Q m3/d) with the units module; series with a stepped rate are fitted by
 * superposition in time (withRateSchedule; Theis 1935, Birsoy and Summers 1980). Start, fixed and bounds may carry
 * units. Returns fitModel's result (base units) plus `table`: estimate, standard error and 95 % interval per
 * parameter converted to `reportUnits`, and the RMSE in `lengthUnit`.
 * A report unit for a parameter the model does not have is not used and is named in `warnings`.
 * @throws UnitError (units module) for a report, start, fixed or bounds unit of the wrong dimension;
 *   AnalysisInputError for unknown parameter names in start, fixed or bounds or series on different schedules; SeriesError and
 *   FitInputError from the series check and the fit.
 */
export function fitSeries(options: FitSeriesOptions): SeriesFitResult {
  const base = resolveModel(options.model);
  if (!Array.isArray(options.series) || options.series.length === 0) {
    throw new AnalysisInputError(`${WHERE}: no series given; pass series: [an observation series, ...] (e.g. from parseObservationCsv).`);
  }
  const { units: reportUnits, ignored } = checkReportUnits(base, options.reportUnits);
  const lengthUnit = options.lengthUnit ?? options.series[0]!.lengthUnit;
  convertAt(WHERE, "lengthUnit", 1, "m", lengthUnit);
  const bases = options.series.map((s) => toBaseUnits(createObservationSeries(s)));
  const { model, steps } = scheduleModel(base, bases);
  const firstRate = steps?.find((s) => s.rate !== 0)?.rate;
  const wells = bases.map((b) => ({ name: b.name, geometry: { r: b.r, Q: b.Q ?? firstRate! }, t: b.t, s: b.s }));
  const fit = fitModel({
    model,
    wells,
    start: recordToBase(WHERE, "start", base, options.start),
    fixed: recordToBase(WHERE, "fixed", base, options.fixed),
    bounds: boundsToBase(base, options.bounds),
    jacobian: options.jacobian,
    ftol: options.ftol,
    xtol: options.xtol,
    gtol: options.gtol,
    maxEvaluations: options.maxEvaluations,
    correlationWarning: options.correlationWarning,
    measurementSd: measurementSdInMetres(options.measurementSd, options.series[0]!.lengthUnit),
    correlation: options.correlation,
    profile: options.profile,
    independenceLevel: options.independenceLevel,
    cooperJacob: options.cooperJacob,
  });
  const list = base.parameters.map((p) => p.name).join(", ");
  const warnings = ignored.length === 0 ? fit.warnings : [...fit.warnings, `reportUnits names ${ignored.join(", ")}, which model "${base.id}" does not have (${list}); ${ignored.length === 1 ? "it was" : "they were"} not used.`];
  return {
    ...fit,
    modelSpec: modelSpecOf(base),
    warnings,
    table: parameterTable(fit, reportUnits),
    rmseReported: { value: convertAt(WHERE, "lengthUnit", fit.rmse, "m", lengthUnit), unit: lengthUnit },
    reportUnits,
  };
}
