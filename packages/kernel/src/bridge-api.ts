/**
 * The allow-list: every host function a cell can call, by its guest name, with one validator per argument.
 *
 * Nothing else of the host is reachable from a cell. To expose another aquifer function add one line to
 * AQUIFER_API: `"aq.name": fn("what it does, with units", [arg("x", positive)], (x) => name(x))`.
 * Arguments arrive as plain data (see wire.ts) and pass their validators before the host function sees them;
 * the return value goes back as plain data (functions in it are left out, Float64Array stays Float64Array).
 * Errors thrown by the host function reach the cell as errors named after the guest function.
 * docs/api.md ("Inside a cell") lists these functions for users; keep the two in step.
 */
import { deadlineCheckedModel, hostCheckpoint } from "./host-budget.js";
import {
  agarwalEquivalentTime,
  barrierDistanceFromImage,
  boundariesFromRecords,
  bouwerRiceSlugTest,
  cbpNormalizedHead,
  compareModels,
  convert,
  convertArray,
  cooperBredehoeftPapadopulosFit,
  cooperJacobDistance,
  cooperJacobLine,
  correctBarometric,
  correctJacobUnconfined,
  distanceToThreshold,
  estimateBarometricEfficiency,
  fitAsGivenParameters,
  fitSeries,
  forecastAt,
  forecastDrawdown,
  hantushBierschenkStepTest,
  hvorslevSlugTest,
  jacobStepTest,
  recoveryAsDrawdown,
  removeLinearTrend,
  rorabaughStepTest,
  schemeDrawdown,
  stepEndDrawdowns,
  theisRecoveryLine,
  thiemDistance,
  cooperJacobValidity,
  createObservationSeries,
  describeUnit,
  bourdetDerivative,
  dimensionName,
  estimateStaticLevel,
  expint1,
  expint1Scaled,
  fitModel,
  describeModel as describeRegisteredModel,
  getModel,
  hantushJacobDrawdown,
  ModelInputError,
  UnknownModelError,
  leakageFactorFromLeakance,
  leakanceFromLeakageFactor,
  logResample,
  modelIds,
  parseObservationCsv,
  parseUnit,
  regimeHints,
  removeStaticLevel,
  SeriesError,
  startingValues,
  studentTQuantile,
  theisDrawdown,
  theisMatchPoint,
  theisTypeCurve,
  thiemDrawdown,
  thiemTwoWells,
  toBaseUnits,
  transmissivityFromDerivativeLevel,
  type BarometricEfficiencyEstimate,
  type BourdetOptions,
  type BoundaryRecord,
  type ComparableFit,
  type FitOptions,
  type FitSeriesOptions,
  type ForecastableFit,
  type ForecastAtOptions,
  type ForecastUncertainty,
  type GivenParameters,
  type PumpingWell,
  type ObservationCsvOptions,
  type ObservationSeries,
  type ObservationWell,
  type DrawdownModel,
  type ModelSpec,
} from "@conebook/aquifer";
import {
  barometricResponse,
  bouwerRiceLnReRw,
  compositePlot,
  dupuitThiemTwoWells,
  earthTideCheck,
  fitAnisotropy,
  fitKgsSlugTest,
  fitStepDrawdown,
  fitUnderdampedSlugTest,
  hantushJacobMatchPoint,
  hornerPlot,
  jacobLohmanG,
  neumanMatchPoint,
  normalizeSlugRecord,
  powerTimePlot,
  slopeHints,
  slugRecordChecks,
  transmissivityEllipse,
  transmissivityFromSpecificCapacity,
  type NormalizedSlugRecord,
} from "@conebook/aquifer";
import {
  ArgumentError,
  arrayOf,
  booleanArg,
  booleansArg,
  finite,
  mapOf,
  nonNegative,
  nullArg,
  numberArg,
  numbersArg,
  oneOf,
  optional,
  pickArg,
  plainData,
  positive,
  quantityArg,
  rangeArg,
  recordArg,
  refine,
  stringArg,
  stringsArg,
  type Checked,
  type Validator,
} from "./validators.js";
import { anisotropyEllipseChart, slugResponseChart, specialisedPlotChart } from "./charts/index.js";
import {
  curvesChart,
  distanceDrawdownChart,
  logLogDrawdownChart,
  recoveryChart,
  residualsChart,
  semilogDrawdownChart,
  stepTestChart,
} from "./charts/index.js";

/** One named argument of a bridge function. */
export interface BridgeArgument<T = unknown> {
  readonly name: string;
  readonly validator: Validator<T>;
}

/** One allow-listed host function. */
export interface BridgeEntry {
  /** One line for docs and completion: what it computes, with units. */
  readonly summary: string;
  readonly args: readonly BridgeArgument[];
  /** Called with the validated arguments, in order. */
  readonly call: (...args: never[]) => unknown;
}

/** Declares one argument. */
export function arg<T>(name: string, validator: Validator<T>): BridgeArgument<T> {
  return { name, validator };
}

type ArgValues<A extends readonly BridgeArgument[]> = { [K in keyof A]: Checked<A[K]["validator"]> };

/** Declares one bridge function; the types tie `call`'s parameters to the validators. */
export function fn<const A extends readonly BridgeArgument[]>(
  summary: string,
  args: A,
  call: (...values: ArgValues<A>) => unknown,
): BridgeEntry {
  return { summary, args, call: call as (...args: never[]) => unknown };
}

/** A model descriptor as plain data (the forward model's functions are host code and stay on the host). */
function describeModel(model: DrawdownModel): unknown {
  const { drawdown: _d, jacobian: _j, ...descriptor } = model;
  return descriptor;
}

const cooperJacobOptions = recordArg({
  r: positive,
  Q: finite,
  uMax: optional(positive),
  T0: optional(positive),
  S0: optional(positive),
  iterate: optional(booleanArg),
  maxIterations: optional(numberArg({ min: 1, max: 1000, integer: true })),
});

const matchPointInput = recordArg({ Q: positive, r: positive, W: positive, u: positive, s: positive, t: positive });

// ---- Argument shapes of the data and fitting functions -------------------------------------------------------

/**
 * A model: a registered id ("theis"), or for a model bound to geometry its id with options
 * ({ id: "neuman", saturatedThickness: 12 }, lengths in m or { value, unit }). The options are checked by the
 * registry (names, presence, types, units) and the built model is what the host function receives.
 */
const modelIdArg: Validator<DrawdownModel> = {
  expects: `a model id (${modelIds.join(", ")}) or { id, ...options } for a model bound to geometry`,
  check(value, at) {
    const spec = plainData.check(value, at);
    if (typeof spec !== "string" && (spec === null || typeof spec !== "object" || Array.isArray(spec) || typeof (spec as { id?: unknown }).id !== "string")) {
      throw new ArgumentError(`${at} must be ${this.expects}, got ${spec === null ? "null" : Array.isArray(spec) ? "an array" : typeof spec}`);
    }
    try {
      return getModel(spec as ModelSpec);
    } catch (e) {
      if (e instanceof ModelInputError || e instanceof UnknownModelError) throw new ArgumentError(`${at}: ${e.message}`);
      throw e;
    }
  },
};

/** A model spec as a fit result carries it: an id, or { id, ...options } with the options as numbers (base units). */
const modelSpecData: Validator<ModelSpec> = oneOf(stringArg(), refine(mapOf(oneOf(stringArg(), finite, booleanArg, arrayOf(recordArg({ start: finite, rate: finite })))), "{ id, ...options }", (o, at) => {
  if (typeof o.id !== "string") throw new ArgumentError(`${at} must have an id (a model id)`);
  return o as ModelSpec;
}));
const geometryArg = recordArg({ r: positive, Q: finite, x: optional(finite), y: optional(finite) });
/** Times or drawdowns as the aquifer functions take them; they report non-finite entries with the point index. */
const samples = numbersArg({ allowNonFinite: true }, 0);

/** A Q that may be null: toBaseUnits gives null for a record whose rate follows a schedule of several steps. */
const rateOrNull: Validator<number | null> = {
  expects: "a finite number, or null for a stepped rate",
  check(value, at) {
    return value === null ? null : finite.check(value, at);
  },
};

const wellFields = recordArg({
  name: optional(stringArg()),
  geometry: optional(geometryArg),
  r: optional(positive),
  Q: optional(rateOrNull),
  t: samples,
  s: samples,
  weights: optional(samples),
  sigma: optional(samples),
  mask: optional(booleansArg()),
  steps: optional(recordArg({ start: samples, rate: samples })),
});

/**
 * One observation well for a fit: `{ name, geometry: { r, Q }, t, s, weights?, mask? }` (t in d, s and r in m,
 * Q in m3/d), or the same with r and Q at the top level, so that the result of aq.toBaseUnits can be passed
 * as it is.
 */
const wellArg: Validator<ObservationWell> = refine(wellFields, `${wellFields.expects} (geometry or r and Q)`, (w, at) => {
  if (w.Q === null) {
    throw new ArgumentError(`${at} has Q = null: its pumping rate follows a schedule of several steps; fitModel takes constant-rate records (give Q in m3/d)`);
  }
  if (w.geometry && (w.r !== undefined || w.Q !== undefined)) {
    throw new ArgumentError(`${at} gives both geometry and r/Q; give the distance and rate once, either as geometry: { r, Q } or as r and Q`);
  }
  const geometry = w.geometry ?? (w.r !== undefined && w.Q !== undefined ? { r: w.r, Q: w.Q } : undefined);
  if (!geometry) throw new ArgumentError(`${at} has no distance and rate; give geometry: { r, Q } (m, m3/d) or r and Q`);
  const well: { -readonly [K in keyof ObservationWell]: ObservationWell[K] } = { name: w.name ?? "", geometry, t: w.t, s: w.s };
  if (w.weights) well.weights = w.weights;
  if (w.sigma) well.sigma = w.sigma;
  if (w.mask) well.mask = w.mask;
  return well;
});

/** The uncertainty and validity options of a fit with their string choices narrowed to the library's types. */
function uncertaintyOptions(o: { correlation?: string; profile?: string; cooperJacob?: { uMax?: number; outside?: string } }): { correlation: FitOptions["correlation"]; profile: FitOptions["profile"]; cooperJacob: FitOptions["cooperJacob"] } {
  return {
    correlation: o.correlation as FitOptions["correlation"],
    profile: o.profile as FitOptions["profile"],
    cooperJacob: o.cooperJacob as FitOptions["cooperJacob"],
  };
}

const fitOptionsArg = refine(
  recordArg({
    model: modelIdArg,
    wells: arrayOf(wellArg, 1),
    start: optional(mapOf(finite)),
    fixed: optional(mapOf(finite)),
    bounds: optional(mapOf(rangeArg)),
    jacobian: optional(stringArg(["analytic", "forward", "central"])),
    ftol: optional(positive),
    xtol: optional(positive),
    gtol: optional(positive),
    maxEvaluations: optional(numberArg({ min: 1, max: 100000, integer: true })),
    correlationWarning: optional(numberArg({ min: 0, max: 1, exclusiveMin: true })),
    measurementSd: optional(positive),
    correlation: optional(stringArg(["auto", "independent", "ar1"])),
    profile: optional(stringArg(["auto", "always", "never"])),
    independenceLevel: optional(numberArg({ min: 0, max: 0.5, exclusiveMin: true })),
    cooperJacob: optional(recordArg({ uMax: optional(positive), outside: optional(stringArg(["exclude", "warn"])) })),
  }),
  "fit options { model, wells, start?, fixed?, bounds?, jacobian?, ftol?, xtol?, gtol?, maxEvaluations?, correlationWarning?, measurementSd?, correlation?, profile?, independenceLevel?, cooperJacob? }",
  (o): FitOptions => ({ ...o, jacobian: o.jacobian as FitOptions["jacobian"], ...uncertaintyOptions(o) }),
);

const rateStepsArg = recordArg({ unit: stringArg(), steps: arrayOf(recordArg({ start: finite, rate: finite }), 1) });
const pumpingRateArg = oneOf(quantityArg, rateStepsArg);

const csvOptionsArg = recordArg({
  name: optional(stringArg()),
  timeColumn: stringArg(),
  valueColumn: stringArg(),
  timeFormat: optional(stringArg(["elapsed", "timestamp"])),
  timeUnit: optional(stringArg()),
  pumpingStart: optional(stringArg()),
  assumedUtcOffset: optional(stringArg()),
  kind: optional(stringArg(["drawdown", "head", "depth-to-water"])),
  lengthUnit: stringArg(),
  staticLevel: optional(finite),
  radius: quantityArg,
  pumpingRate: pumpingRateArg,
  separator: optional(stringArg([",", ";", "\t"])),
  decimalComma: optional(booleanArg),
  headerLine: optional(numberArg({ min: 1, integer: true })),
  outOfOrder: optional(stringArg(["refuse", "sort"])),
  missing: optional(stringArg(["refuse", "exclude"])),
  missingMarkers: optional(stringsArg()),
  beforeStart: optional(stringArg(["refuse", "exclude"])),
  checkLevelKind: optional(booleanArg),
  metadata: optional(mapOf(stringArg())),
});

const excludedPointArg = recordArg({
  row: finite,
  time: numberArg({ allowNonFinite: true }),
  value: numberArg({ allowNonFinite: true }),
  reason: stringArg(),
});

const seriesFields = recordArg({
  name: stringArg(),
  times: samples,
  drawdowns: samples,
  timeUnit: stringArg(),
  lengthUnit: stringArg(),
  radius: quantityArg,
  pumpingRate: pumpingRateArg,
  metadata: optional(mapOf(stringArg())),
  excluded: optional(arrayOf(excludedPointArg)),
});

/**
 * An observation series as aq.parseObservationCsv returns it. It is rebuilt with createObservationSeries, so a
 * series edited in a cell meets the same rules (times > 0 and increasing, units of the right dimension) as one
 * built on the host; the numbers are copied unchanged.
 */
const seriesArg: Validator<ObservationSeries> = refine(seriesFields, `an observation series (${seriesFields.expects})`, (fields, at) => {
  try {
    return createObservationSeries(fields);
  } catch (e) {
    if (e instanceof SeriesError) throw new ArgumentError(`${at}: ${e.message}`);
    throw e;
  }
});

const resampleOptionsArg = recordArg({ pointsPerDecade: positive, method: optional(stringArg(["nearest-centre", "median"])) });

/** A parameter vector in descriptor order, or a record by parameter name. */
const parametersArg = oneOf(numbersArg({}, 1), mapOf(finite));

/**
 * The parameter vector of model `id` from a vector (descriptor order) or a record by name; a missing or
 * unknown name is an ArgumentError listing the model's parameters with their units.
 */
function parameterVector(model: DrawdownModel, values: Float64Array | Record<string, number>, where = "aq.drawdown"): Float64Array {
  const { parameters } = model;
  const id = model.id;
  const list = parameters.map((p) => `${p.name} (${p.label}, ${p.unit})`).join(", ");
  if (values instanceof Float64Array) {
    if (values.length !== parameters.length) {
      throw new ArgumentError(`${where}: model "${id}" takes ${parameters.length} parameters in this order: ${list}; got ${values.length}`);
    }
    return values;
  }
  for (const key of Object.keys(values)) {
    if (!parameters.some((p) => p.name === key)) throw new ArgumentError(`${where}: model "${id}" has no parameter "${key}"; its parameters are ${list}`);
  }
  return Float64Array.from(parameters, (p) => {
    const v = values[p.name];
    if (v === undefined) throw new ArgumentError(`${where}: parameter ${p.name} of model "${id}" is missing; its parameters are ${list}`);
    return v;
  });
}

/** Drawdown (m) of `model` at times t (d) for the geometry { r (m), Q (m3/d) }; the model's own formula. */
function modelDrawdown(model: DrawdownModel, values: Float64Array | Record<string, number>, geometry: { r: number; Q: number }, t: Float64Array): Float64Array {
  return model.drawdown(parameterVector(model, values), geometry, t);
}

const bourdetOptionsArg = recordArg({ smoothingLog10: optional(nonNegative), endpoints: optional(stringArg(["one-sided", "omit"])) });

const regimeOptionsArg = recordArg({
  lengthUnit: stringArg(),
  timeUnit: optional(stringArg()),
  pumpingRate: optional(quantityArg),
  windowLog10: optional(positive),
  flatTolerance: optional(positive),
  unitSlopeTolerance: optional(positive),
  fallingSlope: optional(finite),
  minSpanLog10: optional(nonNegative),
  minPoints: optional(numberArg({ min: 2, integer: true })),
  doublingRatio: optional(rangeArg),
});

const staticLevelOptionsArg = recordArg({
  times: samples,
  levels: samples,
  pumpingStart: finite,
  count: numberArg({ min: 1, integer: true }),
  timeUnit: stringArg(),
  lengthUnit: stringArg(),
});

/** A static level: a number, or the estimate aq.estimateStaticLevel returned. */
const staticLevelArg = oneOf(
  finite,
  pickArg({
    level: finite,
    count: numberArg({ min: 1, integer: true }),
    standardDeviation: oneOf(nullArg, nonNegative),
    range: nonNegative,
    timeSpan: rangeArg,
    lengthUnit: stringArg(),
  }),
);

// ---- Argument shapes of the corrections, step, slug, recovery, distance and forecasting methods ---------------

/** A pair of numbers that may be NaN (an interval a result carries back), as [low, high]. */
const pairOrNaN = refine(numbersArg({ allowNonFinite: true }, 2), "an array of two numbers [low, high]", (v, at): readonly [number, number] => {
  if (v.length !== 2) throw new ArgumentError(`${at} must be an array of two numbers [low, high], got ${v.length} numbers`);
  return [v[0]!, v[1]!];
});
const anyNumber = numberArg({ allowNonFinite: true });

const barometricFields = {
  levels: samples,
  levelKind: stringArg(["depth-to-water", "drawdown", "head"]),
  levelUnit: stringArg(),
  pressures: samples,
  pressureUnit: stringArg(),
};

/** A barometric efficiency as aq.estimateBarometricEfficiency returned it (only the fields the correction reads). */
const efficiencyEstimateArg: Validator<BarometricEfficiencyEstimate> = pickArg({
  efficiency: finite,
  standardError: anyNumber,
  interval95: pairOrNaN,
  rSquared: anyNumber,
  n: numberArg({ min: 0, integer: true }),
  method: stringArg(["differences", "levels"]),
  intercept: anyNumber,
  levelUnit: stringArg(),
  warnings: stringsArg(),
}) as Validator<BarometricEfficiencyEstimate>;

const stepInputArg = recordArg({
  rateUnit: stringArg(),
  drawdownUnit: stringArg(),
  steps: arrayOf(recordArg({ rate: finite, drawdown: finite }), 1),
});

const slugRecordArg = recordArg({
  name: stringArg(),
  times: samples,
  timeUnit: stringArg(),
  displacements: samples,
  lengthUnit: stringArg(),
  initialDisplacement: quantityArg,
});
const slugRangeArg = recordArg({
  fromTime: optional(finite),
  toTime: optional(finite),
  minNormalizedHead: optional(finite),
  maxNormalizedHead: optional(finite),
});
const slugLineOptionsArg = recordArg({ range: optional(slugRangeArg), throughOrigin: optional(booleanArg) });

const uncertaintyArg: Validator<ForecastUncertainty> = oneOf(
  stringArg(["none", "linear"]),
  recordArg({ monteCarlo: recordArg({ samples: numberArg({ min: 10, max: 1e6, integer: true }), seed: numberArg({ integer: true }) }) }),
) as Validator<ForecastUncertainty>;

/** A fit result as plain data, with the fields a forecast reads (the result of aq.fitModel or aq.fitSeries as it is). */
const forecastableFitArg: Validator<ForecastableFit> = pickArg({
  modelId: stringArg(),
  modelSpec: optional(modelSpecData),
  parameters: arrayOf(pickArg({ name: stringArg(), estimate: finite }), 1),
  freeParameters: stringsArg(),
  covariance: arrayOf(numbersArg({ allowNonFinite: true }, 0)),
  dof: optional(anyNumber),
  residualStandardError: optional(anyNumber),
  uncertainty: optional(pickArg({ dof: anyNumber, scatter: anyNumber })),
});

/** A fit result as plain data, with the fields a model comparison reads. */
const comparableFitArg: Validator<ComparableFit> = pickArg({
  modelId: stringArg(),
  n: numberArg({ min: 1, integer: true }),
  p: numberArg({ min: 0, integer: true }),
  aic: anyNumber,
  bic: anyNumber,
  aicc: oneOf(nullArg, anyNumber),
  rmse: nonNegative,
  converged: booleanArg,
  residuals: arrayOf(pickArg({ name: stringArg(), observed: samples }), 1),
  diagnostics: optional(pickArg({ independent: booleanArg, lag1Autocorrelation: oneOf(nullArg, anyNumber) })),
});

const pumpingStepsArg = arrayOf(recordArg({ start: finite, rate: finite }), 1);
const pumpingWellArg: Validator<PumpingWell> = recordArg({ name: stringArg(), x: finite, y: finite, steps: pumpingStepsArg });
/** A straight boundary seen from the first pumping well: kind, distance (m), angle (degrees from +x towards the line). */
const boundaryRecordArg: Validator<BoundaryRecord> = recordArg({ kind: stringArg(["constant-head", "no-flow"]), distance: positive, angle: finite }) as Validator<BoundaryRecord>;

const forecastSchemeFields = recordArg({
  model: modelIdArg,
  fit: optional(forecastableFitArg),
  parameters: optional(mapOf(finite)),
  covariance: optional(recordArg({ names: stringsArg(), matrix: arrayOf(numbersArg({ allowNonFinite: true }, 0)) })),
  wells: arrayOf(pumpingWellArg, 1),
  points: arrayOf(recordArg({ name: stringArg(), x: optional(finite), y: optional(finite), r: optional(positive) }), 1),
  times: samples,
  boundaries: optional(arrayOf(boundaryRecordArg)),
  tolerance: optional(positive),
  uncertainty: optional(uncertaintyArg),
});
/** Options of aq.forecastDrawdown: exactly one of fit or parameters (with an optional covariance). */
const forecastSchemeArg = refine(forecastSchemeFields, forecastSchemeFields.expects, (o, at) => {
  if ((o.fit === undefined) === (o.parameters === undefined)) {
    throw new ArgumentError(`${at} needs exactly one of fit (a fit result) or parameters (values by name, base units)`);
  }
  if (o.fit !== undefined && o.covariance !== undefined) {
    throw new ArgumentError(`${at} gives both fit and covariance; the fit carries its own covariance`);
  }
  return o;
});

/** forecastDrawdown with the model by id, the fit as plain data and boundaries as records seen from the first well. */
function forecastScheme(o: Checked<typeof forecastSchemeArg>): unknown {
  const model = o.model;
  const given: GivenParameters = o.fit
    ? fitAsGivenParameters("aq.forecastDrawdown", o.fit, model)
    : { parameters: o.parameters!, ...(o.covariance ? { covariance: { names: o.covariance.names, matrix: o.covariance.matrix.map((row) => Array.from(row)) } } : {}) };
  return forecastDrawdown({
    model,
    ...given,
    schedule: o.wells,
    points: o.points,
    times: o.times,
    boundaries: boundariesFromRecords(o.wells[0]!, o.boundaries ?? []),
    tolerance: o.tolerance,
    uncertainty: o.uncertainty,
    checkpoint: hostCheckpoint("aq.forecastDrawdown"),
  });
}

const schemeDrawdownArg = recordArg({
  model: modelIdArg,
  parameters: parametersArg,
  wells: arrayOf(pumpingWellArg, 1),
  boundaries: optional(arrayOf(boundaryRecordArg)),
  point: recordArg({ x: finite, y: finite }),
  t: samples,
  tolerance: optional(positive),
  jacobian: optional(booleanArg),
});

/** schemeDrawdown with the model by id and boundaries as records seen from the first well. */
function schemeDrawdownFromRecords(o: Checked<typeof schemeDrawdownArg>): unknown {
  return schemeDrawdown(
    o.model,
    parameterVector(o.model, o.parameters, "aq.schemeDrawdown"),
    { wells: o.wells, boundaries: boundariesFromRecords(o.wells[0]!, o.boundaries ?? []), tolerance: o.tolerance, jacobian: o.jacobian },
    o.point,
    o.t,
  );
}

const numberOrQuantity = oneOf(finite, quantityArg);
const fitSeriesArg = refine(
  recordArg({
    model: modelIdArg,
    series: arrayOf(seriesArg, 1),
    start: optional(mapOf(numberOrQuantity)),
    fixed: optional(mapOf(numberOrQuantity)),
    bounds: optional(mapOf(oneOf(rangeArg, recordArg({ low: finite, high: finite, unit: stringArg() })))),
    reportUnits: optional(mapOf(stringArg())),
    lengthUnit: optional(stringArg()),
    jacobian: optional(stringArg(["analytic", "forward", "central"])),
    ftol: optional(positive),
    xtol: optional(positive),
    gtol: optional(positive),
    maxEvaluations: optional(numberArg({ min: 1, max: 100000, integer: true })),
    correlationWarning: optional(numberArg({ min: 0, max: 1, exclusiveMin: true })),
    measurementSd: optional(oneOf(positive, quantityArg)),
    correlation: optional(stringArg(["auto", "independent", "ar1"])),
    profile: optional(stringArg(["auto", "always", "never"])),
    independenceLevel: optional(numberArg({ min: 0, max: 0.5, exclusiveMin: true })),
    cooperJacob: optional(recordArg({ uMax: optional(positive), outside: optional(stringArg(["exclude", "warn"])) })),
  }),
  "series fit options { model, series, start?, fixed?, bounds?, reportUnits?, lengthUnit?, jacobian?, ftol?, xtol?, gtol?, maxEvaluations?, correlationWarning?, measurementSd?, correlation?, profile?, independenceLevel?, cooperJacob? }",
  (o): FitSeriesOptions => ({ ...o, jacobian: o.jacobian as FitSeriesOptions["jacobian"], ...uncertaintyOptions(o) }),
);

const forecastAtArg = recordArg({
  fit: forecastableFitArg,
  model: optional(modelIdArg),
  points: arrayOf(recordArg({ name: stringArg(), distance: quantityArg }), 1),
  times: recordArg({ values: samples, unit: stringArg() }),
  rate: pumpingRateArg,
  uncertainty: optional(uncertaintyArg),
  lengthUnit: stringArg(),
});

/** A unit as plain data: the symbol, its dimension (exponents of L, T, M and a name) and the factor to base units. */
function describeParsedUnit(text: string): unknown {
  const unit = parseUnit(text);
  return { symbol: unit.symbol, dimension: { ...unit.dimension }, dimensionName: dimensionName(unit.dimension), factor: unit.factor, description: describeUnit(unit) };
}

// ---- Argument shapes of the screened-well, step, slug, anisotropy, diagnostic and barometric methods ----------

const scheduleStepsArg = arrayOf(recordArg({ start: finite, rate: finite }), 2);
const fittedOrNumber = oneOf(nonNegative, stringArg(["fitted"]));
const fitTolerancesArg = optional(recordArg({ ftol: optional(positive), xtol: optional(positive), gtol: optional(positive), maxEvaluations: optional(numberArg({ min: 1, max: 100000, integer: true })) }));
const startFixedArg = optional(recordArg({ start: optional(mapOf(finite)), fixed: optional(mapOf(finite)), fit: fitTolerancesArg }));
const kgsGeometryArg = recordArg({
  thickness: positive,
  screenTop: nonNegative,
  screenBottom: positive,
  rc: positive,
  rw: positive,
  anisotropy: optional(positive),
  skin: optional(fittedOrNumber),
});
const underdampedGeometryArg = recordArg({ rc: positive, screenLength: positive, lnReRw: positive });
const lineRangeArg = optional(recordArg({ fitFrom: optional(finite), fitTo: optional(finite) }));
const normalizedSlugArg = pickArg({ t: samples, h: samples, H0: finite });
const slopeOptionsArg = recordArg({
  windowLog10: optional(positive),
  halfTolerance: optional(positive),
  quarterTolerance: optional(positive),
  minSpanLog10: optional(nonNegative),
  troughDepth: optional(positive),
});

/** Aquifer functions callable from a cell, by guest name. Base units: m, d, m3/d, m2/d (see the aquifer docs). */
export const AQUIFER_API: Readonly<Record<string, BridgeEntry>> = {
  "aq.expint1": fn("Exponential integral E1(x) = Theis well function W(u), x >= 0, dimensionless", [arg("x", nonNegative)], (x) => expint1(x)),
  "aq.expint1Scaled": fn("e^x E1(x) for x >= 0, dimensionless", [arg("x", nonNegative)], (x) => expint1Scaled(x)),
  "aq.theisDrawdown": fn(
    "Theis drawdown (m) for T (m2/d), S (1), Q (m3/d), r (m), t (d)",
    [arg("T", positive), arg("S", positive), arg("Q", finite), arg("r", positive), arg("t", finite)],
    (T, S, Q, r, t) => theisDrawdown(T, S, Q, r, t),
  ),
  "aq.theisTypeCurve": fn(
    "Theis type curve: { uInverse, W } at the given 1/u values (each > 0)",
    [arg("uInverse", numbersArg({ min: 0, exclusiveMin: true }))],
    (uInverse) => theisTypeCurve(uInverse),
  ),
  "aq.theisMatchPoint": fn(
    "T (m2/d) and S from a type-curve match point { Q, r, W, u, s, t } (m3/d, m, 1, 1, m, d)",
    [arg("input", matchPointInput)],
    (input) => theisMatchPoint(input),
  ),
  "aq.cooperJacobLine": fn(
    "Cooper-Jacob straight line through s (m) against log t (d): slope, t0, T, S and the points used",
    [arg("t", numbersArg({ allowNonFinite: true })), arg("s", numbersArg({ allowNonFinite: true })), arg("options", cooperJacobOptions)],
    (t, s, options) => cooperJacobLine(t, s, options),
  ),
  "aq.hantushJacobDrawdown": fn(
    "Hantush-Jacob leaky-aquifer drawdown (m) for T (m2/d), S (1), B (m), Q (m3/d), r (m), t (d)",
    [arg("T", positive), arg("S", positive), arg("B", positive), arg("Q", finite), arg("r", positive), arg("t", finite)],
    (T, S, B, Q, r, t) => hantushJacobDrawdown(T, S, B, Q, r, t),
  ),
  "aq.thiemDrawdown": fn(
    "Thiem steady drawdown (m) for T (m2/d), radius of influence R (m), Q (m3/d), r (m)",
    [arg("T", positive), arg("R", positive), arg("Q", finite), arg("r", positive)],
    (T, R, Q, r) => thiemDrawdown(T, R, Q, r),
  ),
  "aq.thiemTwoWells": fn(
    "Thiem transmissivity (m2/d) from steady drawdowns s1, s2 (m) at r1, r2 (m) for Q (m3/d)",
    [arg("Q", finite), arg("r1", positive), arg("s1", finite), arg("r2", positive), arg("s2", finite)],
    (Q, r1, s1, r2, s2) => thiemTwoWells(Q, r1, s1, r2, s2),
  ),
  "aq.leakanceFromLeakageFactor": fn(
    "Leakance (1/d) = T / B^2 for T (m2/d) and leakage factor B (m)",
    [arg("T", positive), arg("B", positive)],
    (T, B) => leakanceFromLeakageFactor(T, B),
  ),
  "aq.leakageFactorFromLeakance": fn(
    "Leakage factor B (m) = sqrt(T / leakance) for T (m2/d) and leakance (1/d)",
    [arg("T", positive), arg("leakance", positive)],
    (T, leakance) => leakageFactorFromLeakance(T, leakance),
  ),
  "aq.convert": fn(
    "A number converted between units of the same dimension, e.g. convert(5, 'L/s', 'm3/d')",
    [arg("value", numberArg({ allowNonFinite: true })), arg("from", stringArg()), arg("to", stringArg())],
    (value, from, to) => convert(value, from, to),
  ),
  "aq.convertArray": fn(
    "An array of numbers converted between units; returns a Float64Array",
    [arg("values", numbersArg({ allowNonFinite: true }, 0)), arg("from", stringArg()), arg("to", stringArg())],
    (values, from, to) => convertArray(values, from, to),
  ),
  "aq.describeUnit": fn("A unit written out in words, e.g. 'm3/d' -> cubic metre per day", [arg("unit", stringArg())], (unit) =>
    describeUnit(unit),
  ),
  "aq.modelIds": fn("Identifiers of the drawdown models, e.g. ['theis', 'cooper-jacob', ...]", [], () => [...modelIds]),
  "aq.describeModel": fn(
    "A model's descriptor: name, source, assumptions, validity, cautions, parameters with units and bounds, and the geometry options it takes",
    [arg("id", stringArg())],
    (id) => describeRegisteredModel(id),
  ),
  "aq.studentTQuantile": fn(
    "Quantile of Student's t distribution for probability p (0 < p < 1) and dof degrees of freedom",
    [arg("p", numberArg({ min: 0, max: 1, exclusiveMin: true })), arg("dof", positive)],
    (p, dof) => studentTQuantile(p, dof),
  ),
  "aq.getModel": fn(
    "The descriptor of the model an id or { id, ...options } makes (options checked): the forward model itself stays on the host",
    [arg("model", modelIdArg)],
    (model) => describeModel(model),
  ),
  "aq.parseUnit": fn("A unit as data: { symbol, dimension: { L, T, M }, dimensionName, factor (to base units), description }", [arg("unit", stringArg())], (unit) =>
    describeParsedUnit(unit),
  ),
  "aq.drawdown": fn(
    "Drawdown (m) of a model (id, or { id, ...geometry options }) at times t (d) for parameters (vector or record, base units) and { r (m), Q (m3/d) }",
    [arg("model", modelIdArg), arg("parameters", parametersArg), arg("geometry", geometryArg), arg("t", oneOf(samples, refine(finite, "a number", (t) => Float64Array.of(t))))],
    (model, parameters, geometry, t) => modelDrawdown(model, parameters, geometry, t),
  ),
  "aq.cooperJacobValidity": fn(
    "For each t (d): whether u = r^2 S / (4 T t) <= uMax (default 0.01), for T (m2/d), S (1), r (m)",
    [arg("T", positive), arg("S", positive), arg("r", positive), arg("t", samples), arg("uMax", optional(positive))],
    (T, S, r, t, uMax) => cooperJacobValidity(T, S, r, t, uMax),
  ),
  "aq.parseObservationCsv": fn(
    "An observation record read from CSV text: { series (times, drawdowns, units, radius, rate, excluded), notes }",
    [arg("text", stringArg()), arg("options", csvOptionsArg)],
    (text, options) =>
      parseObservationCsv(text, options as ObservationCsvOptions, { checkpoint: hostCheckpoint("aq.parseObservationCsv") }),
  ),
  "aq.toBaseUnits": fn("A series in base units: { name, t (d), s (m), r (m), Q (m3/d, null if stepped), steps }", [arg("series", seriesArg)], (series) =>
    toBaseUnits(series),
  ),
  "aq.logResample": fn(
    "A series thinned to about pointsPerDecade real readings per decade of log t: { series, kept, removed, indices }",
    [arg("series", seriesArg), arg("options", resampleOptionsArg)],
    (series, options) => logResample(series, options as Parameters<typeof logResample>[1]),
  ),
  "aq.startingValues": fn(
    "Starting parameters of model id from one record t (d), s (m) at { r (m), Q (m3/d) }: { values, line?, notes }",
    [arg("model", modelIdArg), arg("geometry", geometryArg), arg("t", samples), arg("s", samples), arg("options", optional(recordArg({ uMax: optional(positive) })))],
    (model, geometry, t, s, options) => startingValues(model, geometry, t, s, options),
  ),
  "aq.bourdetDerivative": fn(
    "Bourdet (1989) log derivative ds/d ln t of drawdowns (any length unit) at times (> 0, increasing): { times, derivative, ... }",
    [arg("times", samples), arg("drawdowns", samples), arg("options", optional(bourdetOptionsArg))],
    (times, drawdowns, options) => bourdetDerivative(times, drawdowns, options as BourdetOptions | undefined),
  ),
  "aq.regimeHints": fn(
    "Patterns of a log derivative (unit slope, flat, falling, doubling) with time ranges and, when flat, T (m2/d): hints, never verdicts",
    [arg("derivative", pickArg({ times: samples, derivative: samples })), arg("options", regimeOptionsArg)],
    (derivative, options) => regimeHints(derivative, options),
  ),
  "aq.transmissivityFromDerivativeLevel": fn(
    "T (m2/d) = Q / (4 pi level) from the pumping rate { value, unit } and a flat derivative level { value, unit }",
    [arg("pumpingRate", quantityArg), arg("level", quantityArg)],
    (pumpingRate, level) => transmissivityFromDerivativeLevel(pumpingRate, level),
  ),
  "aq.estimateStaticLevel": fn(
    "Static level: mean of the last count pre-test readings { times, levels, pumpingStart, count, timeUnit, lengthUnit }, with its spread",
    [arg("options", staticLevelOptionsArg)],
    (options) => estimateStaticLevel(options),
  ),
  "aq.removeStaticLevel": fn(
    "Drawdowns from levels and a static level (number or estimate): { values, record } with s = d - d0 or s = h0 - h",
    [arg("options", recordArg({ levels: samples, levelKind: stringArg(["depth-to-water", "head"]), lengthUnit: stringArg(), staticLevel: staticLevelArg }))],
    (options) => removeStaticLevel(options as Parameters<typeof removeStaticLevel>[0]),
  ),
  "aq.fitModel": fn(
    "Least-squares fit of model id to one or more wells: estimates, standard errors, 95 % intervals, RMSE, AIC, BIC, residuals",
    [arg("options", fitOptionsArg)],
    (options) => fitModel({ ...options, model: deadlineCheckedModel(options.model, "aq.fitModel") }),
  ),
  "aq.estimateBarometricEfficiency": fn(
    "Barometric efficiency BE (1) by regression of levels on barometric pressure as water column { levels, levelKind, levelUnit, pressures, pressureUnit, method? }",
    [arg("options", recordArg({ ...barometricFields, method: optional(stringArg(["differences", "levels"])) }))],
    (options) => estimateBarometricEfficiency(options as Parameters<typeof estimateBarometricEfficiency>[0]),
  ),
  "aq.correctBarometric": fn(
    "Levels corrected for barometric pressure with BE (a number or an estimate): { values (levelUnit), record }",
    [arg("options", recordArg({ ...barometricFields, efficiency: oneOf(finite, efficiencyEstimateArg), referencePressure: optional(finite) }))],
    (options) => correctBarometric(options as Parameters<typeof correctBarometric>[0]),
  ),
  "aq.removeLinearTrend": fn(
    "Readings with the pre-test linear trend removed { times, values, pumpingStart, timeUnit, valueUnit }: { values, trend, record }",
    [arg("options", recordArg({ times: samples, values: samples, pumpingStart: finite, timeUnit: stringArg(), valueUnit: stringArg() }))],
    (options) => removeLinearTrend(options),
  ),
  "aq.correctJacobUnconfined": fn(
    "Jacob (1944) unconfined correction s' = s - s^2/(2b) { drawdowns, lengthUnit, saturatedThickness: { value, unit } }: { values, record }",
    [arg("options", recordArg({ drawdowns: samples, lengthUnit: stringArg(), saturatedThickness: quantityArg }))],
    (options) => correctJacobUnconfined(options),
  ),
  "aq.jacobStepTest": fn(
    "Jacob (1947) step test s_w = B Q + C Q^2 from { rateUnit, drawdownUnit, steps: [{ rate, drawdown }] }: B (d/m2), C (d2/m5), efficiency per step",
    [arg("input", stepInputArg)],
    (input) => jacobStepTest(input),
  ),
  "aq.rorabaughStepTest": fn(
    "Rorabaugh (1953) step test s_w = B Q + C Q^n: B, C, n with standard errors and efficiency per step; options { exponentBounds?, startExponent? }",
    [arg("input", stepInputArg), arg("options", optional(recordArg({ exponentBounds: optional(rangeArg), startExponent: optional(finite) })))],
    (input, options) => rorabaughStepTest(input, options),
  ),
  "aq.hantushBierschenkStepTest": fn(
    "Hantush-Bierschenk (1964) step test from a stepped drawdown series: B(dt), C, increments; options { elapsed? (d), tailFraction? }",
    [arg("series", seriesArg), arg("options", optional(recordArg({ elapsed: optional(positive), tailFraction: optional(positive) })))],
    (series, options) => hantushBierschenkStepTest(series, options),
  ),
  "aq.stepEndDrawdowns": fn(
    "Step-end drawdowns of a stepped series: { input (m3/d, m; ready for aq.jacobStepTest), readings, method, warnings }",
    [arg("series", seriesArg)],
    (series) => stepEndDrawdowns(series),
  ),
  "aq.hvorslevSlugTest": fn(
    "Hvorslev (1951) K (m/d) from a slug record { name, times, timeUnit, displacements, lengthUnit, initialDisplacement } and { casingRadius, intakeRadius, intakeLength }",
    [arg("record", slugRecordArg), arg("geometry", recordArg({ casingRadius: quantityArg, intakeRadius: quantityArg, intakeLength: quantityArg })), arg("options", optional(slugLineOptionsArg))],
    (record, geometry, options) => hvorslevSlugTest(record, geometry, options),
  ),
  "aq.bouwerRiceSlugTest": fn(
    "Bouwer-Rice (1976) K (m/d) from a slug record and { casingRadius, wellRadius, screenLength, screenBottomDepth, saturatedThickness }",
    [
      arg("record", slugRecordArg),
      arg("geometry", recordArg({ casingRadius: quantityArg, wellRadius: quantityArg, screenLength: quantityArg, screenBottomDepth: quantityArg, saturatedThickness: quantityArg })),
      arg("options", optional(slugLineOptionsArg)),
    ],
    (record, geometry, options) => bouwerRiceSlugTest(record, geometry, options),
  ),
  "aq.cooperBredehoeftPapadopulosFit": fn(
    "Cooper-Bredehoeft-Papadopulos (1967) fit of T (m2/d) and S to a slug record with { casingRadius, wellRadius, aquiferThickness? }",
    [
      arg("record", slugRecordArg),
      arg("geometry", recordArg({ casingRadius: quantityArg, wellRadius: quantityArg, aquiferThickness: optional(quantityArg) })),
      arg("options", optional(recordArg({
        range: optional(slugRangeArg),
        start: optional(recordArg({ T: optional(positive), S: optional(positive) })),
        fixedS: optional(positive),
        boundsT: optional(rangeArg),
        boundsS: optional(rangeArg),
      }))),
    ],
    (record, geometry, options) => cooperBredehoeftPapadopulosFit(record, geometry, options),
  ),
  "aq.cbpNormalizedHead": fn(
    "Cooper-Bredehoeft-Papadopulos (1967) H/H0 for alpha = rw^2 S/rc^2 > 0 and beta = T t/rc^2 >= 0 (dimensionless)",
    [arg("alpha", positive), arg("beta", nonNegative)],
    (alpha, beta) => cbpNormalizedHead(alpha, beta),
  ),
  "aq.theisRecoveryLine": fn(
    "Theis (1935) recovery line: T (m2/d) from residual drawdown s' (m) against log t/t' { tp (d), dt (d), residual (m), Q (m3/d), maxRatio?, screen? }",
    [arg("input", recordArg({ tp: positive, dt: samples, residual: samples, Q: finite, maxRatio: optional(finite), screen: optional(recordArg({ r: positive, S: positive, uMax: optional(positive) })) }))],
    (input) => theisRecoveryLine(input),
  ),
  "aq.agarwalEquivalentTime": fn(
    "Agarwal (1980) equivalent time te = tp dt/(tp + dt), d, for pumping duration tp (d) and time since the stop dt (d)",
    [arg("tp", positive), arg("dt", positive)],
    (tp, dt) => agarwalEquivalentTime(tp, dt),
  ),
  "aq.recoveryAsDrawdown": fn(
    "Recovery as drawdown at Agarwal equivalent times: { te (d), s (m) } from tp (d), drawdown at the stop (m), dt (d), residual drawdowns (m)",
    [arg("tp", positive), arg("sAtStop", finite), arg("dt", samples), arg("residual", samples)],
    (tp, sAtStop, dt, residual) => recoveryAsDrawdown(tp, sAtStop, dt, residual),
  ),
  "aq.barrierDistanceFromImage": fn(
    "Perpendicular distance (m) from a pumping well at the origin to a barrier whose normal points at angle (deg from +x), from the observation point (x, y) (m) and the fitted image distance ri (m); NaN when none",
    [arg("x", finite), arg("y", finite), arg("angle", finite), arg("ri", positive)],
    (x, y, angle, ri) => barrierDistanceFromImage(x, y, angle, ri),
  ),
  "aq.cooperJacobDistance": fn(
    "Cooper-Jacob distance-drawdown line { r (m), s (m), Q (m3/d), t (d), uMax? }: T (m2/d), S, slope per log cycle, r0",
    [arg("input", recordArg({ r: samples, s: samples, Q: finite, t: positive, uMax: optional(positive) }))],
    (input) => cooperJacobDistance(input),
  ),
  "aq.thiemDistance": fn(
    "Thiem steady distance-drawdown { r (m), s (m), Q (m3/d) }: T (m2/d), radius of influence R (m)",
    [arg("input", recordArg({ r: samples, s: samples, Q: finite }))],
    (input) => thiemDistance(input),
  ),
  "aq.distanceToThreshold": fn(
    "Radius r* (m) where drawdown of model id after pumping Q (m3/d) for t (d) equals threshold (m); options { rMin?, rMax? } (m)",
    [
      arg("model", modelIdArg),
      arg("parameters", parametersArg),
      arg("Q", finite),
      arg("t", finite),
      arg("threshold", finite),
      arg("options", optional(recordArg({ rMin: optional(positive), rMax: optional(positive) }))),
    ],
    (model, parameters, Q, t, threshold, options) => distanceToThreshold(model, parameters, Q, t, threshold, options),
  ),
  "aq.forecastDrawdown": fn(
    "Drawdown forecast (m) at points (m) and times (d) for wells [{ name, x, y, steps }] and boundaries [{ kind, distance (m), angle (deg) }], from a fit or parameters, with bands",
    [arg("options", forecastSchemeArg)],
    (options) => forecastScheme(options),
  ),
  "aq.forecastAt": fn(
    "Drawdown forecast in lengthUnit at distances { value, unit } from one well, times { values, unit }, rate { value, unit } or schedule, from a fit, with bands",
    [arg("options", forecastAtArg)],
    (options) => forecastAt({ ...(options as ForecastAtOptions), checkpoint: hostCheckpoint("aq.forecastAt") }),
  ),
  "aq.schemeDrawdown": fn(
    "Drawdown (m) at a point { x, y } (m) and times t (d) for wells [{ name, x, y, steps }] and boundaries [{ kind, distance (m), angle (deg) }], model by id",
    [arg("options", schemeDrawdownArg)],
    (options) => schemeDrawdownFromRecords(options),
  ),
  "aq.fitSeries": fn(
    "Fit of model id to observation series in their own units; estimates in base units plus a table in reportUnits (e.g. { T: 'ft2/d' })",
    [arg("options", fitSeriesArg)],
    (options) => fitSeries({ ...options, model: deadlineCheckedModel(options.model as DrawdownModel, "aq.fitSeries") }),
  ),
  "aq.compareModels": fn(
    "Ranking of fits to the same data by AIC with delta AIC and Akaike weights, BIC, AICc and RMSE in lengthUnit; options { names?, lengthUnit? }",
    [arg("fits", arrayOf(comparableFitArg, 1)), arg("options", optional(recordArg({ names: optional(stringsArg()), lengthUnit: optional(stringArg()) })))],
    (fits, options) => compareModels(fits, options),
  ),
  "aq.fitStepDrawdown": fn(
    "Transient step test: aquifer model (id or spec) by superposition plus well loss C Q^n fitted to the whole pumped-well record { aquifer, steps, wellRadius (m), t (d), s (m), start?, fixed? }",
    [arg("input", recordArg({ aquifer: modelIdArg, steps: scheduleStepsArg, wellRadius: positive, t: samples, s: samples, start: optional(mapOf(finite)), fixed: optional(mapOf(finite)), fit: fitTolerancesArg }))],
    (input) => fitStepDrawdown(input),
  ),
  "aq.transmissivityFromSpecificCapacity": fn(
    "T (m2/d) from specific capacity Q/s (m2/d) after pumping time t (d) at well radius rw (m) with an assumed S (Theis at the well): { T, u, notes }",
    [arg("specificCapacity", positive), arg("t", positive), arg("rw", positive), arg("S", positive)],
    (specificCapacity, t, rw, S) => transmissivityFromSpecificCapacity(specificCapacity, t, rw, S),
  ),
  "aq.fitKgsSlugTest": fn(
    "KGS slug test (Hyder et al. 1994) fitted to H/H0 at t (d) for { thickness, screenTop, screenBottom, rc, rw (m), anisotropy?, skin? }: { fit, Kr (m/d), KrCi95 }",
    [arg("geometry", kgsGeometryArg), arg("t", samples), arg("h", samples), arg("options", startFixedArg)],
    (geometry, t, h, options) => fitKgsSlugTest(geometry as Parameters<typeof fitKgsSlugTest>[0], t, h, options ?? {}),
  ),
  "aq.fitUnderdampedSlugTest": fn(
    "Underdamped slug test (van der Kamp 1976) fitted to H/H0 at t (d) for { rc (m), screenLength (m), lnReRw }: { fit (K m/d, Le m), CD }",
    [arg("geometry", underdampedGeometryArg), arg("t", samples), arg("h", samples), arg("options", startFixedArg)],
    (geometry, t, h, options) => fitUnderdampedSlugTest(geometry, t, h, options ?? {}),
  ),
  "aq.normalizeSlugRecord": fn(
    "A slug record in base units: { t (d), h = H/H0, H0 (m), index, dropped } within range { fromTime?, toTime?, minNormalizedHead?, maxNormalizedHead? }",
    [arg("record", slugRecordArg), arg("range", optional(slugRangeArg)), arg("positiveOnly", optional(booleanArg))],
    (record, range, positiveOnly) => normalizeSlugRecord(record, range ?? {}, positiveOnly ?? true),
  ),
  "aq.slugRecordChecks": fn(
    "Slug-test data checks: H0 against the expected displacement (m), first reading against H/H0 = 1, repeat tests against each other: [{ test, kind, ok, message }]",
    [arg("records", arrayOf(recordArg({ name: stringArg(), record: normalizedSlugArg, expectedH0: optional(finite) }), 1)), arg("options", optional(recordArg({ tolerance: optional(positive), agreement: optional(positive) })))],
    (records, options) => slugRecordChecks(records.map((r) => ({ ...r, record: { ...r.record, index: new Int32Array(0) } as NormalizedSlugRecord })), options ?? {}),
  ),
  "aq.bouwerRiceLnReRw": fn(
    "Bouwer-Rice (1976) shape factor ln(Re/rw) from rw, Le, Lw, D (one length unit): { lnReRw, fullyPenetrating, cappedLog }",
    [arg("rw", positive), arg("Le", positive), arg("Lw", positive), arg("D", positive)],
    (rw, Le, Lw, D) => bouwerRiceLnReRw(rw, Le, Lw, D),
  ),
  "aq.fitAnisotropy": fn(
    "Papadopulos (1965) horizontal anisotropy from three or more wells with geometry { r, Q, x, y } (m): Tmax, Tmin (m2/d), direction (deg) with intervals, S, ellipse",
    [arg("wells", arrayOf(wellArg, 3))],
    (wells) => fitAnisotropy(wells),
  ),
  "aq.transmissivityEllipse": fn(
    "Points { x, y } of the transmissivity ellipse (radius sqrt(T), m/d^0.5) for Tmax, Tmin (m2/d) and the direction theta (rad)",
    [arg("Tmax", positive), arg("Tmin", positive), arg("theta", finite), arg("count", optional(numberArg({ min: 3, max: 10000, integer: true })))],
    (Tmax, Tmin, theta, count) => transmissivityEllipse(Tmax, Tmin, theta, count),
  ),
  "aq.slopeHints": fn(
    "Hints of linear (1/2), bilinear (1/4), spherical (-1/2) flow and of a delayed-yield trough from a log derivative { times, derivative }: { hints, localSlopes }",
    [arg("derivative", pickArg({ times: samples, derivative: samples })), arg("options", optional(slopeOptionsArg))],
    (derivative, options) => slopeHints(derivative, options ?? {}),
  ),
  "aq.powerTimePlot": fn(
    "Specialised plot s against t^power (1/2 linear flow, 1/4 bilinear) with its line over x in [fitFrom, fitTo]: { x, y, slope, intercept }",
    [arg("t", samples), arg("s", samples), arg("power", finite), arg("fit", lineRangeArg)],
    (t, s, power, fit) => powerTimePlot(t, s, power, fit ?? {}),
  ),
  "aq.hornerPlot": fn(
    "Horner-type recovery plot: residual drawdown against log10((tp + dt)/dt) with its line: { x, y, slope, intercept }",
    [arg("tp", positive), arg("dt", samples), arg("residual", samples), arg("fit", lineRangeArg)],
    (tp, dt, residual, fit) => hornerPlot(tp, dt, residual, fit ?? {}),
  ),
  "aq.compositePlot": fn(
    "Composite plot data: s against t/r^2 (d/m2) for wells [{ name, r (m), t (d), s (m) }]",
    [arg("wells", arrayOf(recordArg({ name: stringArg(), r: positive, t: samples, s: samples }), 1))],
    (wells) => compositePlot(wells),
  ),
  "aq.hantushJacobMatchPoint": fn(
    "T (m2/d), S, B (m) and leakance (1/d) from a Hantush-Jacob match point { Q, r, W, u, rB, s, t }, with the reading error of W",
    [arg("input", recordArg({ Q: positive, r: positive, W: positive, u: positive, rB: positive, s: positive, t: positive }))],
    (input) => hantushJacobMatchPoint(input),
  ),
  "aq.neumanMatchPoint": fn(
    "T (m2/d), S or Sy and Kz/Kr from a Neuman match point { Q, r, b, branch 'A' or 'B', sD, tDimensionless, beta, sigma, s, t }, with the reading error",
    [arg("input", recordArg({ Q: positive, r: positive, b: positive, branch: stringArg(["A", "B"]), sD: positive, tDimensionless: positive, beta: positive, sigma: positive, s: positive, t: positive }))],
    (input) => neumanMatchPoint(input as Parameters<typeof neumanMatchPoint>[0]),
  ),
  "aq.dupuitThiemTwoWells": fn(
    "Dupuit-Thiem K (m/d) from steady saturated thicknesses h1, h2 (m above the base) at r1, r2 (m) for Q (m3/d)",
    [arg("Q", positive), arg("r1", positive), arg("h1", positive), arg("r2", positive), arg("h2", positive)],
    (Q, r1, h1, r2, h2) => dupuitThiemTwoWells(Q, r1, h1, r2, h2),
  ),
  "aq.jacobLohmanG": fn(
    "Jacob-Lohman (1952) G(alpha), alpha = T t / (S rw^2): the discharge of a well at constant drawdown is 2 pi T sw G",
    [arg("alpha", positive)],
    (alpha) => jacobLohmanG(alpha),
  ),
  "aq.barometricResponse": fn(
    "Barometric response function by lagged regression (Rasmussen-Crawford 1997) { times, timeUnit, levels, levelKind, levelUnit, pressures, pressureUnit, lags, earthTides? }",
    [arg("options", recordArg({ times: samples, timeUnit: stringArg(), ...barometricFields, lags: numberArg({ min: 0, integer: true }), earthTides: optional(booleanArg) }))],
    (options) => barometricResponse(options as Parameters<typeof barometricResponse>[0]),
  ),
  "aq.earthTideCheck": fn(
    "Earth-tide check: amplitudes of O1, K1, M2, S2 (valueUnit) with standard errors by harmonic regression { times, timeUnit, values, valueUnit }",
    [arg("options", recordArg({ times: samples, timeUnit: stringArg(), values: samples, valueUnit: stringArg() }))],
    (options) => earthTideCheck(options),
  ),
};

const values = numbersArg({ allowNonFinite: true }, 0);
const text = optional(stringArg());

/** Chart builders callable from a cell; each returns a Vega-Lite spec the cell shows as a chart. */
export const CHART_API: Readonly<Record<string, BridgeEntry>> = {
  "charts.logLogDrawdown": fn(
    "Log-log drawdown plot { t, s, model?: { t, s, label? }, derivative?: { t, ds }, timeUnit?, lengthUnit?, title? }",
    [arg("input", recordArg({
      t: values, s: values,
      model: optional(recordArg({ t: values, s: values, label: text })),
      derivative: optional(recordArg({ t: values, ds: values })),
      timeUnit: text, lengthUnit: text, title: text,
    }))],
    (input) => logLogDrawdownChart(input),
  ),
  "charts.semilogDrawdown": fn(
    "Semilog drawdown plot with straight line { t, s, line?: { slope, t0 }, timeUnit?, lengthUnit?, title? }",
    [arg("input", recordArg({ t: values, s: values, line: optional(recordArg({ slope: finite, t0: positive })), timeUnit: text, lengthUnit: text, title: text }))],
    (input) => semilogDrawdownChart(input),
  ),
  "charts.residuals": fn(
    "Residuals against log time { t, residual, timeUnit?, lengthUnit?, title? }",
    [arg("input", recordArg({ t: values, residual: values, timeUnit: text, lengthUnit: text, title: text }))],
    (input) => residualsChart(input),
  ),
  "charts.recovery": fn(
    "Recovery plot { timeRatio, residualDrawdown, line?: { slope }, lengthUnit?, title? }",
    [arg("input", recordArg({ timeRatio: values, residualDrawdown: values, line: optional(recordArg({ slope: finite })), lengthUnit: text, title: text }))],
    (input) => recoveryChart(input),
  ),
  "charts.distanceDrawdown": fn(
    "Distance-drawdown plot { r, s, line?: { slope, r0 }, lengthUnit?, title? }",
    [arg("input", recordArg({ r: values, s: values, line: optional(recordArg({ slope: finite, r0: positive })), lengthUnit: text, title: text }))],
    (input) => distanceDrawdownChart(input),
  ),
  "charts.curves": fn(
    "Several named series of points or lines { series: [{ label, x, y, mark? }], xTitle, yTitle, xScale?, yScale?, title? }, each axis 'log' (default) or 'linear'",
    [arg("input", recordArg({
      series: arrayOf(recordArg({ label: stringArg(), x: values, y: values, mark: optional(stringArg(["point", "line"])) }), 1),
      xTitle: stringArg(), yTitle: stringArg(),
      xScale: optional(stringArg(["log", "linear"])), yScale: optional(stringArg(["log", "linear"])), title: text,
    }))],
    (input) => curvesChart(input),
  ),
  "charts.stepTest": fn(
    "Step-drawdown plot of sw/Q against Q { Q, sw, line?: { B, C }, rateUnit?, lengthUnit?, title? }",
    [arg("input", recordArg({ Q: values, sw: values, line: optional(recordArg({ B: finite, C: finite })), rateUnit: text, lengthUnit: text, title: text }))],
    (input) => stepTestChart(input),
  ),
  "charts.specialisedPlot": fn(
    "Specialised plot of series [{ name, x, y }] with a line { slope, intercept }: s against sqrt t, Horner, composite t/r^2 { xTitle, yTitle, logX?, title? }",
    [arg("input", recordArg({
      series: arrayOf(recordArg({ name: stringArg(), x: values, y: values }), 1),
      line: optional(recordArg({ slope: finite, intercept: finite, label: text })),
      xTitle: stringArg(), yTitle: stringArg(), logX: optional(booleanArg), title: text,
    }))],
    (input) => specialisedPlotChart(input),
  ),
  "charts.slugResponse": fn(
    "Slug test H/H0 against time { t, h, model?: { t, h, label? }, timeUnit?, logTime?, title? }",
    [arg("input", recordArg({ t: values, h: values, model: optional(recordArg({ t: values, h: values, label: text })), timeUnit: text, logTime: optional(booleanArg), title: text }))],
    (input) => slugResponseChart(input),
  ),
  "charts.anisotropyEllipse": fn(
    "The transmissivity ellipse (scaled to the farthest well) with the observation wells { ellipse: { x, y }, wells: [{ name, x, y }], title? }",
    [arg("input", recordArg({ ellipse: recordArg({ x: values, y: values }), wells: arrayOf(recordArg({ name: stringArg(), x: finite, y: finite }), 1), title: text }))],
    (input) => anisotropyEllipseChart(input),
  ),
};

/** Every bridge function, aquifer and chart builders together, by guest name. */
export const BRIDGE_API: Readonly<Record<string, BridgeEntry>> = { ...AQUIFER_API, ...CHART_API };
