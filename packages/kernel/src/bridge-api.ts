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
import {
  convert,
  convertArray,
  cooperJacobLine,
  describeUnit,
  expint1,
  expint1Scaled,
  getModel,
  hantushJacobDrawdown,
  leakageFactorFromLeakance,
  leakanceFromLeakageFactor,
  modelIds,
  studentTQuantile,
  theisDrawdown,
  theisMatchPoint,
  theisTypeCurve,
  thiemDrawdown,
  thiemTwoWells,
} from "@conebook/aquifer";
import {
  booleanArg,
  finite,
  nonNegative,
  numberArg,
  numbersArg,
  optional,
  positive,
  recordArg,
  stringArg,
  type Checked,
  type Validator,
} from "./validators.js";
import {
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
function describeModel(id: string): unknown {
  const { drawdown: _d, jacobian: _j, ...descriptor } = getModel(id);
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
    "A model's descriptor: name, source, assumptions, validity, cautions, parameters with units and bounds",
    [arg("id", stringArg())],
    (id) => describeModel(id),
  ),
  "aq.studentTQuantile": fn(
    "Quantile of Student's t distribution for probability p (0 < p < 1) and dof degrees of freedom",
    [arg("p", numberArg({ min: 0, max: 1, exclusiveMin: true })), arg("dof", positive)],
    (p, dof) => studentTQuantile(p, dof),
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
  "charts.stepTest": fn(
    "Step-drawdown plot of sw/Q against Q { Q, sw, line?: { B, C }, rateUnit?, lengthUnit?, title? }",
    [arg("input", recordArg({ Q: values, sw: values, line: optional(recordArg({ B: finite, C: finite })), rateUnit: text, lengthUnit: text, title: text }))],
    (input) => stepTestChart(input),
  ),
};

/** Every bridge function, aquifer and chart builders together, by guest name. */
export const BRIDGE_API: Readonly<Record<string, BridgeEntry>> = { ...AQUIFER_API, ...CHART_API };
