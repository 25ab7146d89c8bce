/**
 * Superposition in time: drawdown for a pumping rate that changes in steps (variable-rate and step tests,
 * recovery after the pump stops).
 *
 * For a model that is linear in the pumping rate (Theis, Cooper-Jacob, Hantush-Jacob, ...), with s1(r, tau)
 * the drawdown for a unit rate (Q = 1 m3/d) started at tau = 0,
 *
 *   s(t) = sum_i (Q_i - Q_{i-1}) s1(r, t - t_i),   Q_0 = 0,  s1(r, tau) = 0 for tau <= 0,
 *
 * where step i runs at rate Q_i from time t_i on. Each rate change starts a new well at the same place whose
 * rate is the change. The Jacobian is the same sum of the unit-rate Jacobians.
 *
 * Source: the principle of superposition for linear flow equations, applied to variable rates by
 * Theis (1935) (recovery) and Birsoy and Summers (1980) (variable rates); Trans. Am. Geophys. Union 16(2),
 * 519-524, and Ground Water 18(2), 137-144.
 */
import type { DrawdownModel, ObservationGeometry } from "../models/index.js";
import { SuperpositionInputError } from "./errors.js";

/** One step of a pumping schedule in base units: from `start` (d) on, the well pumps at `rate` (m3/d). */
export interface PumpingStep {
  /** Time the step begins, d since the start of the test (the first step usually starts at 0). */
  readonly start: number;
  /** Rate during the step, m3/d, positive for abstraction; 0 after the pump stops (recovery). */
  readonly rate: number;
}

/** A checked schedule: start times (d) and rate changes dQ_i = Q_i - Q_{i-1} (m3/d), zero changes dropped. */
export interface RateChanges {
  readonly start: Float64Array;
  readonly change: Float64Array;
}

/**
 * Checks a schedule (finite values, strictly increasing start times, at least one step) and returns its rate
 * changes. `where` names the caller and the schedule in messages.
 */
export function rateChanges(steps: readonly PumpingStep[] | undefined, where: string): RateChanges {
  if (!Array.isArray(steps) || steps.length === 0) {
    throw new SuperpositionInputError(`${where}: the rate schedule is empty; give steps [{ start: 0, rate: Q }, ...] (start in d, rate in m3/d).`);
  }
  const start: number[] = [];
  const change: number[] = [];
  let previous = 0;
  steps.forEach((step, i) => {
    if (!step || !Number.isFinite(step.start)) {
      throw new SuperpositionInputError(`${where}: step ${i} has start ${step?.start}; give a finite start time in d.`);
    }
    if (!Number.isFinite(step.rate)) {
      throw new SuperpositionInputError(`${where}: step ${i} has rate ${step.rate}; give a finite rate in m3/d (0 when the pump is off).`);
    }
    if (i > 0 && !(step.start > steps[i - 1]!.start)) {
      throw new SuperpositionInputError(
        `${where}: step ${i} starts at ${step.start} d, not after step ${i - 1} (${steps[i - 1]!.start} d); list the steps in time order without repeats.`,
      );
    }
    const dQ = step.rate - previous;
    previous = step.rate;
    if (dQ !== 0) {
      start.push(step.start);
      change.push(dQ);
    }
  });
  return { start: Float64Array.from(start), change: Float64Array.from(change) };
}

/** The times after each rate change: for change k, the indices i with t_i > t_k (or NaN) and tau = t_i - t_k. */
export interface ShiftedTimes {
  readonly index: readonly Int32Array[];
  readonly tau: readonly Float64Array[];
  /** Scratch arrays, one per change, for the unit response. */
  readonly scratch: readonly Float64Array[];
}

/** Precomputes the shifted times of a schedule for the times t (d). */
export function shiftTimes(changes: RateChanges, t: ArrayLike<number>): ShiftedTimes {
  const index: Int32Array[] = [];
  const tau: Float64Array[] = [];
  for (let k = 0; k < changes.start.length; k++) {
    const t0 = changes.start[k]!;
    let count = 0;
    for (let i = 0; i < t.length; i++) if (!(t[i]! - t0 <= 0)) count++;
    const idx = new Int32Array(count);
    const shifted = new Float64Array(count);
    let j = 0;
    for (let i = 0; i < t.length; i++) {
      const d = t[i]! - t0;
      if (!(d <= 0)) {
        idx[j] = i;
        shifted[j] = d > 0 ? d : Number.NaN;
        j++;
      }
    }
    index.push(idx);
    tau.push(shifted);
  }
  return { index, tau, scratch: tau.map((x) => new Float64Array(x.length)) };
}

/**
 * Adds factor * sum_i dQ_i s1(r, t - t_i) (m) into `out`, and, when `jacobianOut` is given, the same sum of the
 * unit-rate Jacobian columns (m per base unit of each parameter). `r` in m, times in d (given through `shifted`,
 * from shiftTimes, or as t). Times that are NaN give NaN. `offset` (m), the position of the observation point
 * relative to the well, reaches models whose drawdown depends on direction as geometry.x and geometry.y.
 */
export function addScheduleResponse(
  model: DrawdownModel,
  p: ArrayLike<number>,
  r: number,
  changes: RateChanges,
  factor: number,
  t: ArrayLike<number> | ShiftedTimes,
  out: Float64Array,
  jacobianOut?: Float64Array[],
  offset?: { readonly x: number; readonly y: number },
): void {
  const shifted = isShifted(t) ? t : shiftTimes(changes, t);
  const unit: ObservationGeometry = offset === undefined ? { r, Q: 1 } : { r, Q: 1, x: offset.x, y: offset.y };
  for (let k = 0; k < changes.start.length; k++) {
    const tau = shifted.tau[k]!;
    if (tau.length === 0) continue;
    const index = shifted.index[k]!;
    const weight = factor * changes.change[k]!;
    const s = model.drawdown(p, unit, tau, shifted.scratch[k]!);
    for (let j = 0; j < tau.length; j++) out[index[j]!]! += weight * s[j]!;
    if (jacobianOut) {
      const columns = model.jacobian!(p, unit, tau);
      for (let c = 0; c < columns.length; c++) {
        const column = columns[c]!;
        const target = jacobianOut[c]!;
        for (let j = 0; j < tau.length; j++) target[index[j]!]! += weight * column[j]!;
      }
    }
  }
}

function isShifted(t: ArrayLike<number> | ShiftedTimes): t is ShiftedTimes {
  return (t as ShiftedTimes).tau !== undefined && (t as ShiftedTimes).index !== undefined;
}

/** Output array of length n, checked when given. */
export function outputFor(where: string, n: number, out?: Float64Array): Float64Array {
  if (out === undefined) return new Float64Array(n);
  if (out.length !== n) {
    throw new SuperpositionInputError(`${where}: output array has length ${out.length} but there are ${n} times; pass an array of length ${n}.`);
  }
  out.fill(0);
  return out;
}

/** Checks that r is a finite distance > 0 m. */
export function checkDistance(where: string, r: number): void {
  if (!(Number.isFinite(r) && r > 0)) {
    throw new SuperpositionInputError(
      `${where}: distance r is ${r} m; give a finite distance > 0 (for the pumped well itself, its effective radius).`,
    );
  }
}

/**
 * Checks a base model: it needs drawdown() and parameters, and its output must be a drawdown that superposition
 * may add up (not, for example, a slug test's normalized head; see ModelDescriptor.notSuperposable).
 */
export function checkBaseModel(where: string, model: DrawdownModel | undefined): asserts model is DrawdownModel {
  if (!model || typeof model.drawdown !== "function" || !Array.isArray(model.parameters)) {
    throw new SuperpositionInputError(`${where}: the base model is missing or is not a drawdown model (it needs parameters and drawdown()).`);
  }
  if (typeof model.notSuperposable === "string") {
    throw new SuperpositionInputError(
      `${where}: model "${model.id}" cannot be superposed over rate changes, wells or boundaries: ${model.notSuperposable}`,
    );
  }
}

/**
 * The base model driven by a rate schedule instead of a constant rate: a DrawdownModel with the same parameters
 * whose drawdown at distance geometry.r (m) and times t (d since the first step) is
 * sum_i (Q_i - Q_{i-1}) s1(r, t - t_i) (m), s1 the base model's drawdown for Q = 1 m3/d. A final step with rate 0
 * gives recovery. geometry.Q is not used (the schedule sets the rates); fitModel still asks for a non-zero Q, so
 * pass the first rate there. Exact for models linear in Q. Source: superposition (Theis 1935; Birsoy and Summers 1980).
 */
export function withRateSchedule(model: DrawdownModel, steps: readonly PumpingStep[]): DrawdownModel {
  const where = "withRateSchedule";
  checkBaseModel(where, model);
  const changes = rateChanges(steps, where);
  const directional = model.directional === true;
  const schedule = steps.map((s) => `${s.rate} m3/d from ${s.start} d`).join(", ");
  const wrapped: DrawdownModel = {
    id: `${model.id}+schedule`,
    name: `${model.name}, variable rate by superposition in time`,
    source: `${model.source} Superposition in time: Theis (1935); Birsoy, Y.K. and Summers, W.K. (1980), Ground Water 18(2), 137-144.`,
    assumptions: [
      ...model.assumptions,
      "The flow equation is linear, so drawdowns from rate changes add: confined flow, or unconfined flow with small drawdown.",
      `The rate follows the schedule exactly: ${schedule}.`,
    ],
    validity: [...model.validity, "Times are counted from the start of the schedule's time axis (d)."],
    cautions: [
      ...model.cautions,
      "geometry.Q is not used: the schedule sets the rates. Rates that drift within a step are not represented.",
    ],
    parameters: model.parameters,
    drawdown(p, geometry, t, out) {
      checkDistance(wrapped.name, geometry.r);
      const result = outputFor(wrapped.name, t.length, out);
      addScheduleResponse(model, p, geometry.r, changes, 1, t, result, undefined, directional ? offsetOf(geometry) : undefined);
      return result;
    },
  };
  if (directional) (wrapped as { directional?: boolean }).directional = true;
  if (typeof model.jacobian === "function") {
    wrapped.jacobian = (p, geometry, t) => {
      checkDistance(wrapped.name, geometry.r);
      const columns = model.parameters.map(() => new Float64Array(t.length));
      const scratch = new Float64Array(t.length);
      addScheduleResponse(model, p, geometry.r, changes, 1, t, scratch, columns, directional ? offsetOf(geometry) : undefined);
      return columns;
    };
  }
  return wrapped;
}

/** The plan position of an observation point relative to its well (m) when the geometry gives one. */
function offsetOf(geometry: ObservationGeometry): { x: number; y: number } | undefined {
  return Number.isFinite(geometry.x) && Number.isFinite(geometry.y) ? { x: geometry.x!, y: geometry.y! } : undefined;
}
