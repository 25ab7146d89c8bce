/**
 * Interference: the drawdown a pumping scheme causes at neighbouring wells, in total and well by well. By
 * superposition the per-well parts add up to the total (each part includes that well's image wells).
 */
import type { DrawdownModel } from "../models/index.js";
import type { StraightBoundary } from "../superposition/boundaries.js";
import { isFinitePoint, type NamedPoint } from "../superposition/plane.js";
import { evaluateScheme, prepareScheme, STRIP_TOLERANCE, type PumpingWell } from "../superposition/scheme.js";
import { ForecastInputError } from "./errors.js";
import { parameterVector } from "./parameters.js";

/** Options of {@link interferenceAtNeighbours}. */
export interface InterferenceOptions {
  readonly model: DrawdownModel;
  /** Parameter values by name or in descriptor order, base units. */
  readonly parameters: Readonly<Record<string, number>> | ArrayLike<number>;
  /** Pumping wells with coordinates (m) and schedules (d, m3/d). */
  readonly schedule: readonly PumpingWell[];
  /** Neighbouring wells (m). */
  readonly neighbours: readonly NamedPoint[];
  /** Times, d. */
  readonly times: ArrayLike<number>;
  readonly boundaries?: readonly StraightBoundary[];
  readonly tolerance?: number;
}

/** Interference at one neighbour. */
export interface NeighbourInterference {
  readonly name: string;
  /** Total drawdown caused by the scheme, m, one per time. */
  readonly total: Float64Array;
  /** Drawdown caused by each pumping well (with its images), m, by well name. */
  readonly byWell: Record<string, Float64Array>;
}

/**
 * Drawdown (m) at each named neighbour (x, y in m) and time (d) caused by the pumping scheme, in total and by
 * pumping well. Source: superposition of linear solutions; images after Ferris et al. (1962).
 */
export function interferenceAtNeighbours(options: InterferenceOptions): NeighbourInterference[] {
  const where = "interferenceAtNeighbours";
  const { model } = options;
  if (!model || typeof model.drawdown !== "function") throw new ForecastInputError(`${where}: model is missing or is not a drawdown model.`);
  const p = parameterVector(where, model, options.parameters);
  const boundaries = options.boundaries ?? [];
  const tolerance = options.tolerance ?? STRIP_TOLERANCE;
  const whole = prepareScheme(where, options.schedule, boundaries, tolerance);
  const single = options.schedule.map((w) => prepareScheme(where, [w], boundaries, tolerance));
  if (!Array.isArray(options.neighbours) || options.neighbours.length === 0) {
    throw new ForecastInputError(`${where}: no neighbours given; pass neighbours: [{ name, x, y }] (m).`);
  }
  const t = Float64Array.from(options.times ?? []);
  if (t.length === 0 || t.some((v) => !Number.isFinite(v))) throw new ForecastInputError(`${where}: give finite times in d.`);
  return options.neighbours.map((n, i) => {
    if (!isFinitePoint(n)) throw new ForecastInputError(`${where}: neighbour ${i} ("${n?.name}") needs finite x and y (m).`);
    const byWell: Record<string, Float64Array> = {};
    single.forEach((s) => {
      byWell[s.wells[0]!.name] = evaluateScheme(where, model, s, p, n, t, false).drawdown;
    });
    return { name: n.name, total: evaluateScheme(where, model, whole, p, n, t, false).drawdown, byWell };
  });
}
