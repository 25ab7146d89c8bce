/**
 * Drawdown models built by superposition in space: a well near straight boundaries (image wells) and several
 * pumping wells with their own schedules. Each is a DrawdownModel with the base model's parameters, so fitModel
 * and the forecasts use it like any other model.
 *
 * Locating the observation point. The model contract passes only { r, Q } per observation well, and fitModel
 * passes on nothing else. These models therefore take the observation points (x, y in m) when they are built and
 * pick the one whose distance from the reference pumping well (the first one) equals geometry.r (to 1e-6
 * relative). When geometry also carries finite x and y (m), as PlaneGeometry allows, those are used directly.
 */
import type { DrawdownModel, ObservationGeometry } from "../models/index.js";
import type { StraightBoundary } from "./boundaries.js";
import { SuperpositionInputError } from "./errors.js";
import { distanceBetween, isFinitePoint, type NamedPoint, type Point } from "./plane.js";
import { addScheduleResponse, checkBaseModel, checkDistance, rateChanges, outputFor, type PumpingStep, type RateChanges } from "./rate-schedule.js";
import { evaluateScheme, prepareScheme, STRIP_TOLERANCE, type PreparedScheme, type PumpingWell, type SchemeEvaluation } from "./scheme.js";

/** Observation geometry with optional plane coordinates of the observation point (m). */
export interface PlaneGeometry extends ObservationGeometry {
  readonly x?: number;
  readonly y?: number;
}

/** A pumping well given only by its distance r (m) to the single observation point, with its schedule. */
export interface PumpingWellAtDistance {
  readonly name: string;
  readonly r: number;
  readonly steps: readonly PumpingStep[];
}

/** Setup of {@link withBoundaries}. */
export interface BoundedWellSetup {
  /** Pumping well position, m. */
  readonly well: Point;
  /** One boundary, two parallel ones, or two meeting at 180/n degrees. */
  readonly boundaries: readonly StraightBoundary[];
  /** Observation points (m); each observation well's geometry.r selects the point at that distance from the well. */
  readonly observations: readonly NamedPoint[];
  /** Relative truncation tolerance of a strip's image series; default 1e-9. */
  readonly tolerance?: number;
}

/** Options of {@link multiWell}. */
export interface MultiWellOptions {
  /** Observation points (m), for wells given by coordinates; selected by geometry.r from the first well. */
  readonly observations?: readonly NamedPoint[];
  /** Straight boundaries (wells given by coordinates only). */
  readonly boundaries?: readonly StraightBoundary[];
  /** Relative truncation tolerance of a strip's image series; default 1e-9. */
  readonly tolerance?: number;
}

const MATCH = 1e-6;

/** Picks the observation point for a geometry: its own x, y, or the listed point at distance r from `reference`. */
export function locateObservation(where: string, geometry: PlaneGeometry, reference: Point, observations: readonly NamedPoint[]): Point {
  if (isFinitePoint(geometry as Point)) return { x: geometry.x!, y: geometry.y! };
  checkDistance(where, geometry.r);
  const matches = observations.filter((o) => Math.abs(distanceBetween(o, reference) - geometry.r) <= MATCH * geometry.r);
  if (matches.length === 1) return matches[0]!;
  const listed = observations.map((o) => `"${o.name}" at ${Number(distanceBetween(o, reference).toPrecision(6))} m`).join(", ");
  if (matches.length === 0) {
    throw new SuperpositionInputError(
      `${where}: no observation point lies ${geometry.r} m from the reference pumping well (listed: ${listed || "none"}); ` +
        "give r as the distance of one of the listed points, or add the point to `observations`.",
    );
  }
  throw new SuperpositionInputError(
    `${where}: ${matches.map((o) => `"${o.name}"`).join(" and ")} are both ${geometry.r} m from the reference pumping well, so r cannot tell them apart; ` +
      "pass geometry with x and y, or fit them with separate models.",
  );
}

function checkObservations(where: string, observations: readonly NamedPoint[] | undefined): readonly NamedPoint[] {
  if (observations === undefined) return [];
  if (!Array.isArray(observations)) throw new SuperpositionInputError(`${where}: observations must be a list of { name, x, y } (m).`);
  observations.forEach((o, i) => {
    if (!isFinitePoint(o)) throw new SuperpositionInputError(`${where}: observation point ${i} ("${o?.name}") needs finite x and y (m).`);
  });
  return observations;
}

function describeBoundaries(scheme: PreparedScheme): string {
  const layout = scheme.wells[0]!.layout;
  return layout.kind === "none" ? "no boundaries" : layout.description;
}

function boundedDescriptor(model: DrawdownModel, id: string, name: string, scheme: PreparedScheme, extraAssumption: string): Omit<DrawdownModel, "drawdown" | "jacobian"> {
  return {
    id,
    name,
    source: `${model.source} Image wells: Ferris, J.G., Knowles, D.B., Brown, R.H. and Stallman, R.W. (1962). Theory of aquifer tests. USGS Water-Supply Paper 1536-E.`,
    assumptions: [
      ...model.assumptions,
      "Where the base model assumes an aquifer of infinite extent without boundaries, the boundaries below replace that assumption.",
      "The flow equation is linear, so the drawdowns of wells and image wells add.",
      `Boundaries: ${describeBoundaries(scheme)}; each is straight, fully penetrating and sharp (a constant-head line holds its head exactly, a no-flow line passes no water).`,
      extraAssumption,
    ],
    validity: [
      ...model.validity,
      scheme.wells[0]!.layout.kind === "series"
        ? `Infinite image series truncated at a relative tolerance of ${scheme.tolerance}.`
        : "The image set is finite and exact for the boundary geometry.",
    ],
    cautions: [
      ...model.cautions,
      "A river or lake that only partly penetrates the aquifer or has a clogged bed acts as a constant-head line farther away than its bank; the fitted distance is an effective one.",
      "Boundaries represented as straight lines at known places: a wrong position or kind biases T and S, and a forecast extends that bias.",
    ],
    parameters: model.parameters,
  };
}

function attach(
  model: DrawdownModel,
  descriptor: Omit<DrawdownModel, "drawdown" | "jacobian">,
  evaluate: (p: ArrayLike<number>, geometry: PlaneGeometry, t: ArrayLike<number>, withJacobian: boolean, out?: Float64Array) => SchemeEvaluation,
): DrawdownModel {
  const wrapped: DrawdownModel = {
    ...descriptor,
    drawdown(p, geometry, t, out) {
      const result = outputFor(descriptor.name, t.length, out);
      return evaluate(p, geometry, t, false, result).drawdown;
    },
  };
  if (typeof model.jacobian === "function") wrapped.jacobian = (p, geometry, t) => evaluate(p, geometry, t, true).jacobian!;
  return wrapped;
}

/**
 * The base model for one well pumping at the constant rate geometry.Q (m3/d) from t = 0, next to straight
 * boundaries given as lines in the plane, by the method of images. Drawdown in m at times t (d). The observation
 * point is picked from `observations` by geometry.r (its distance in m from the well), or taken from geometry.x,
 * geometry.y when given. Source: Ferris et al. (1962), USGS Water-Supply Paper 1536-E.
 */
export function withBoundaries(model: DrawdownModel, setup: BoundedWellSetup): DrawdownModel {
  const where = "withBoundaries";
  checkBaseModel(where, model);
  if (!setup || !isFinitePoint(setup.well)) throw new SuperpositionInputError(`${where}: give the pumping well position as well: { x, y } (m).`);
  const observations = checkObservations(where, setup.observations);
  const scheme = prepareScheme(where, [{ name: "pumping well", x: setup.well.x, y: setup.well.y, steps: [{ start: 0, rate: 1 }] }], setup.boundaries ?? [], setup.tolerance ?? STRIP_TOLERANCE);
  const descriptor = boundedDescriptor(model, `${model.id}+boundaries`, `${model.name}, with ${describeBoundaries(scheme)}`, scheme, "The well pumps at the constant rate geometry.Q from t = 0.");
  return attach(model, descriptor, (p, geometry, t, withJacobian, out) => {
    if (!Number.isFinite(geometry.Q)) throw new SuperpositionInputError(`${where}: pumping rate Q is ${geometry.Q} m3/d; give a finite rate.`);
    const point = locateObservation(where, geometry, setup.well, observations);
    const result = evaluateScheme(where, model, scheme, p, point, t, withJacobian, out);
    result.drawdown.forEach((v, i) => (result.drawdown[i] = v * geometry.Q));
    result.jacobian?.forEach((column) => column.forEach((v, i) => (column[i] = v * geometry.Q)));
    return result;
  });
}

function isAtDistance(w: PumpingWell | PumpingWellAtDistance): w is PumpingWellAtDistance {
  return (w as PumpingWellAtDistance).r !== undefined && (w as PumpingWell).x === undefined && (w as PumpingWell).y === undefined;
}

/**
 * Several pumping wells, each with its own rate schedule (steps in d and m3/d), superposed at one observation
 * point: s = sum_wells sum_i dQ_i s1(r_w, t - t_i) (m), plus image wells for boundaries. Wells are given either all
 * by distance r (m) to a single observation point (geometry.r must then equal the first well's r), or all by
 * coordinates x, y (m) with the observation points in `options.observations` (picked by geometry.r from the first
 * well) or in geometry.x, geometry.y. geometry.Q is not used. Source: superposition of linear solutions; images
 * after Ferris et al. (1962).
 */
export function multiWell(model: DrawdownModel, wells: readonly (PumpingWell | PumpingWellAtDistance)[], options: MultiWellOptions = {}): DrawdownModel {
  const where = "multiWell";
  checkBaseModel(where, model);
  if (!Array.isArray(wells) || wells.length === 0) {
    throw new SuperpositionInputError(`${where}: no pumping wells given; pass [{ name, x, y, steps }] or [{ name, r, steps }].`);
  }
  const byDistance = wells.map(isAtDistance);
  if (byDistance.some((d) => d !== byDistance[0])) {
    throw new SuperpositionInputError(`${where}: some wells are given by distance r and some by coordinates x, y; give all wells the same way.`);
  }
  if (byDistance[0]) {
    if ((options.boundaries ?? []).length > 0) {
      throw new SuperpositionInputError(`${where}: boundaries need well coordinates; give the wells as { name, x, y, steps } and the observation points as options.observations.`);
    }
    const sources = (wells as readonly PumpingWellAtDistance[]).map((w, i) => {
      const name = w.name || `#${i + 1}`;
      checkDistance(`${where}: well "${name}"`, w.r);
      return { r: w.r, changes: rateChanges(w.steps, `${where}: well "${name}"`) as RateChanges };
    });
    const reference = sources[0]!.r;
    const descriptor: Omit<DrawdownModel, "drawdown" | "jacobian"> = {
      id: `${model.id}+wells`,
      name: `${model.name}, ${wells.length} pumping wells by superposition`,
      source: `${model.source} Superposition in space and time of linear solutions.`,
      assumptions: [...model.assumptions, "The flow equation is linear, so the drawdowns of the wells and of their rate changes add."],
      validity: [...model.validity],
      cautions: [...model.cautions, "geometry.Q is not used: each well's schedule sets its rates."],
      parameters: model.parameters,
    };
    return attach(model, descriptor, (p, geometry, t, withJacobian, out) => {
      checkDistance(where, geometry.r);
      if (Math.abs(geometry.r - reference) > MATCH * reference) {
        throw new SuperpositionInputError(
          `${where}: geometry.r is ${geometry.r} m but the first well is ${reference} m from the observation point; with wells given by distance the model serves that one point only.`,
        );
      }
      const s = out ?? new Float64Array(t.length);
      s.fill(0);
      const jacobian = withJacobian ? model.parameters.map(() => new Float64Array(t.length)) : undefined;
      for (const source of sources) addScheduleResponse(model, p, source.r, source.changes, 1, t, s, jacobian);
      return { drawdown: s, jacobian: jacobian ?? null, imagesUsed: 0, rows: 0, lastRowRelative: 0 };
    });
  }
  const located = wells as readonly PumpingWell[];
  const observations = checkObservations(where, options.observations);
  const scheme = prepareScheme(where, located, options.boundaries ?? [], options.tolerance ?? STRIP_TOLERANCE);
  const descriptor = boundedDescriptor(
    model,
    `${model.id}+wells`,
    `${model.name}, ${wells.length} pumping well${wells.length === 1 ? "" : "s"} with ${describeBoundaries(scheme)}`,
    scheme,
    "geometry.Q is not used: each well's schedule sets its rates.",
  );
  const reference: Point = { x: located[0]!.x, y: located[0]!.y };
  return attach(model, descriptor, (p, geometry, t, withJacobian, out) =>
    evaluateScheme(where, model, scheme, p, locateObservation(where, geometry, reference, observations), t, withJacobian, out),
  );
}

/** Options of {@link schemeDrawdown}. */
export interface SchemeDrawdownOptions {
  readonly wells: readonly PumpingWell[];
  readonly boundaries?: readonly StraightBoundary[];
  /** Relative truncation tolerance of a strip's image series; default 1e-9. */
  readonly tolerance?: number;
  /** Also return the Jacobian (the base model must have one). */
  readonly jacobian?: boolean;
}

/**
 * Drawdown (m) at a point (m) and times t (d) for parameters p (descriptor order, base units) from pumping wells
 * with schedules and optional boundaries, with the number of image wells and strip rows used and the size of the
 * last row relative to the sum of absolute contributions. Source: as {@link multiWell}.
 */
export function schemeDrawdown(model: DrawdownModel, p: ArrayLike<number>, options: SchemeDrawdownOptions, point: Point, t: ArrayLike<number>): SchemeEvaluation {
  const where = "schemeDrawdown";
  checkBaseModel(where, model);
  const scheme = prepareScheme(where, options.wells, options.boundaries ?? [], options.tolerance ?? STRIP_TOLERANCE);
  return evaluateScheme(where, model, scheme, p, point, t, options.jacobian === true);
}
