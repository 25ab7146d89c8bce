/**
 * Superposition in space and time: drawdown at one observation point caused by several pumping wells, each with
 * its own rate schedule, in an aquifer bounded by straight boundaries (image wells, boundaries.ts).
 *
 *   s(x, t) = sum_wells sum_images sign_j sum_i (Q_i - Q_{i-1}) s1(|x - x_j|, t - t_i)
 *
 * with s1 the base model's drawdown for a unit rate (m per m3/d). An infinite image series is summed row by row
 * (row m: the images of order m of a strip, two per well; for two perpendicular families with images of orders i and
 * j, the pairs with max(i, j) = m) until, for two rows in a row and at every time, both
 * the row's change c_m and the geometric estimate of the rest of the series c_m q/(1 - q), q = |c_m|/|c_{m-1}| < 1,
 * are below `tolerance` times the scale max(|s|, 1e-3 sum |contributions|). The tail estimate matters for two
 * barriers at late time, where many small rows of one sign add up. The floor on the scale
 * keeps the test meaningful where the total tends to 0 (on or next to a constant-head line); elsewhere the
 * tolerance is relative to the total drawdown itself.
 * Source: superposition of linear solutions; images after Ferris et al. (1962), USGS Water-Supply Paper 1536-E.
 */
import type { DrawdownModel } from "../models/index.js";
import { imageLayout, nextFamilyImages, checkBoundaries, type BoundaryFamily, type ImageLayout, type ImageWell, type StraightBoundary } from "./boundaries.js";
import { SuperpositionInputError } from "./errors.js";
import { distanceBetween, isFinitePoint, type Point } from "./plane.js";
import { addScheduleResponse, rateChanges, shiftTimes, type PumpingStep, type RateChanges, type ShiftedTimes } from "./rate-schedule.js";

/** A pumping well placed by coordinates (m) with its rate schedule. */
export interface PumpingWell {
  readonly name: string;
  readonly x: number;
  readonly y: number;
  readonly steps: readonly PumpingStep[];
}

/** Default relative truncation tolerance of strip image series. */
export const STRIP_TOLERANCE = 1e-9;
/** Fraction of the sum of absolute contributions below which the total is not used as the truncation scale. */
const SCALE_FLOOR = 1e-3;
/** Most image rows summed for a strip before giving up. */
export const STRIP_MAX_ROWS = 20000;
/** Most images summed in one evaluation of a strip or rectangle series before giving up. */
export const SERIES_MAX_IMAGES = 2000000;

/** A checked scheme: wells with rate changes and image layouts, ready to evaluate. */
export interface PreparedScheme {
  readonly wells: readonly { readonly name: string; readonly point: Point; readonly changes: RateChanges; readonly layout: ImageLayout }[];
  readonly boundaries: readonly StraightBoundary[];
  readonly tolerance: number;
}

/** What one evaluation used. */
export interface SchemeEvaluation {
  /** Drawdown, m, one per time. */
  readonly drawdown: Float64Array;
  /** d s / d p_k per parameter (m per base unit), when asked for. */
  readonly jacobian: Float64Array[] | null;
  /** Image wells summed over all pumping wells. */
  readonly imagesUsed: number;
  /** Strip rows summed (0 without a strip). */
  readonly rows: number;
  /** Largest of the last row and its tail estimate, relative to max(|s|, 1e-3 sum |contributions|) (0 without a strip). */
  readonly lastRowRelative: number;
}

/** Checks wells and boundaries (observation points are checked when evaluated). */
export function prepareScheme(
  where: string,
  wells: readonly PumpingWell[],
  boundaries: readonly StraightBoundary[] = [],
  tolerance: number = STRIP_TOLERANCE,
): PreparedScheme {
  if (!Array.isArray(wells) || wells.length === 0) {
    throw new SuperpositionInputError(`${where}: no pumping wells given; pass [{ name, x, y, steps: [{ start, rate }] }].`);
  }
  if (!(Number.isFinite(tolerance) && tolerance > 0 && tolerance < 1)) {
    throw new SuperpositionInputError(`${where}: tolerance is ${tolerance}; give a relative tolerance between 0 and 1, e.g. 1e-9.`);
  }
  const names = new Set<string>();
  const points = wells.map((w, i) => {
    const name = typeof w?.name === "string" && w.name !== "" ? w.name : `#${i + 1}`;
    if (names.has(name)) throw new SuperpositionInputError(`${where}: two pumping wells are named "${name}"; give each its own name.`);
    names.add(name);
    if (!isFinitePoint(w)) throw new SuperpositionInputError(`${where}: pumping well "${name}" needs finite coordinates x and y (m).`);
    return { name, point: { x: w.x, y: w.y } as Point };
  });
  checkBoundaries(where, boundaries, points, []);
  const prepared = wells.map((w, i) => ({
    name: points[i]!.name,
    point: points[i]!.point,
    changes: rateChanges(w.steps, `${where}: pumping well "${points[i]!.name}"`),
    layout: imageLayout(where, points[i]!.point, boundaries),
  }));
  return { wells: prepared, boundaries, tolerance };
}

/** Distance from an image (or real well) to the observation point, checked to be > 0. */
function sourceDistance(where: string, wellName: string, source: Point, point: Point, isReal: boolean): number {
  const r = distanceBetween(source, point);
  if (!(r > 0)) {
    throw new SuperpositionInputError(
      `${where}: the observation point coincides with ${isReal ? `pumping well "${wellName}"` : `an image of well "${wellName}"`}; ` +
        "for drawdown in a pumped well place the point at the well's effective radius from its centre.",
    );
  }
  return r;
}

/**
 * Drawdown (m) at `point` and times t (d) for parameters p, and the Jacobian when `withJacobian` (the base model
 * must have one). Throws SuperpositionInputError for points outside the aquifer and when a strip series does not
 * converge within STRIP_MAX_ROWS rows.
 */
export function evaluateScheme(
  where: string,
  model: DrawdownModel,
  scheme: PreparedScheme,
  p: ArrayLike<number>,
  point: Point,
  t: ArrayLike<number>,
  withJacobian: boolean,
  out?: Float64Array,
): SchemeEvaluation {
  if (!isFinitePoint(point)) throw new SuperpositionInputError(`${where}: the observation point needs finite x and y (m).`);
  if (typeof model.notSuperposable === "string") {
    throw new SuperpositionInputError(`${where}: model "${model.id}" cannot be superposed over rate changes, wells or boundaries: ${model.notSuperposable}`);
  }
  if (model.directional === true && scheme.boundaries.length > 0) {
    throw new SuperpositionInputError(
      `${where}: model "${model.id}" depends on the direction from the well, and image wells for it are not implemented ` +
        "(an image of an anisotropic aquifer or of a fracture is mirrored as well); forecast it without boundaries.",
    );
  }
  checkBoundaries(where, scheme.boundaries, [], [{ name: "observation", point }]);
  if (withJacobian && typeof model.jacobian !== "function") {
    throw new SuperpositionInputError(`${where}: model "${model.id}" has no analytic Jacobian.`);
  }
  const n = t.length;
  const s = out ?? new Float64Array(n);
  if (s.length !== n) throw new SuperpositionInputError(`${where}: output array has length ${s.length} for ${n} times.`);
  s.fill(0);
  const jacobian = withJacobian ? model.parameters.map(() => new Float64Array(n)) : null;
  const magnitude = new Float64Array(n);
  const term = new Float64Array(n);
  const termJacobian = withJacobian ? model.parameters.map(() => new Float64Array(n)) : undefined;
  let imagesUsed = 0;

  const shifted = new Map<RateChanges, ShiftedTimes>();
  for (const w of scheme.wells) shifted.set(w.changes, shiftTimes(w.changes, t));
  const add = (wellName: string, changes: RateChanges, source: Point, sign: number, isReal: boolean): void => {
    const r = sourceDistance(where, wellName, source, point, isReal);
    term.fill(0);
    if (termJacobian) for (const c of termJacobian) c.fill(0);
    const offset = model.directional === true ? { x: point.x - source.x, y: point.y - source.y } : undefined;
    addScheduleResponse(model, p, r, changes, sign, shifted.get(changes)!, term, termJacobian, offset);
    for (let i = 0; i < n; i++) {
      s[i]! += term[i]!;
      magnitude[i]! += Math.abs(term[i]!);
    }
    if (jacobian && termJacobian) {
      for (let k = 0; k < jacobian.length; k++) {
        const target = jacobian[k]!;
        const source = termJacobian[k]!;
        for (let i = 0; i < n; i++) target[i]! += source[i]!;
      }
    }
    if (!isReal) imagesUsed++;
  };

  const series: { name: string; changes: RateChanges; real: Point; families: readonly BoundaryFamily[]; orders: ImageWell[][][] }[] = [];
  for (const w of scheme.wells) {
    add(w.name, w.changes, w.point, 1, true);
    if (w.layout.kind === "finite") {
      for (const image of w.layout.images) add(w.name, w.changes, image, image.sign, false);
    } else if (w.layout.kind === "series") {
      const real: ImageWell = { ...w.point, sign: 1, order: 0 };
      series.push({ name: w.name, changes: w.changes, real, families: w.layout.families, orders: w.layout.families.map(() => [[real]]) });
    }
  }
  const imagesOfOrder = (entry: (typeof series)[number], f: number, m: number): readonly ImageWell[] => {
    if (f >= entry.families.length) return m === 0 ? [entry.real as ImageWell] : [];
    const orders = entry.orders[f]!;
    while (orders.length <= m) orders.push(nextFamilyImages(entry.families[f]!, orders.length, orders[orders.length - 1]!));
    return orders[m]!;
  };
  const addPair = (entry: (typeof series)[number], i: number, j: number): void => {
    const A = imagesOfOrder(entry, 0, i);
    const B = imagesOfOrder(entry, 1, j);
    for (const a of A) {
      for (const b of B) {
        // Reflections across perpendicular lines commute; a B-word moves a point along B's normal only, by the
        // same displacement for every A-image, so g_a g_b P = g_a P + (g_b P - P).
        const image = { x: a.x + b.x - entry.real.x, y: a.y + b.y - entry.real.y };
        add(entry.name, entry.changes, image, a.sign * b.sign, false);
      }
    }
  };

  let rows = 0;
  let lastRowRelative = 0;
  if (series.length > 0) {
    const before = new Float64Array(n);
    const previousChange = new Float64Array(n).fill(Infinity);
    let quietRows = 0;
    while (quietRows < 2) {
      if (rows >= STRIP_MAX_ROWS || imagesUsed >= SERIES_MAX_IMAGES) {
        throw new SuperpositionInputError(
          `${where}: the image series has not converged to a relative tolerance of ${scheme.tolerance} after ${rows} rows and ${imagesUsed} images ` +
            `(${Number.isFinite(lastRowRelative) ? `last row ${lastRowRelative.toExponential(2)} of the total` : "the rows are not yet getting smaller"}); ` +
            "the strip is narrow for the times and parameters asked for (the rows needed grow as sqrt(T t / S) / width). " +
            "Loosen the tolerance, shorten the times, or check the strip width.",
        );
      }
      rows++;
      before.set(s);
      const m = rows;
      for (const entry of series) {
        // Row m of the (A order, B order) grid: the pairs with max(i, j) = m.
        for (let j = 0; j <= m; j++) addPair(entry, m, j);
        for (let i = 0; i < m; i++) addPair(entry, i, m);
      }
      lastRowRelative = 0;
      for (let i = 0; i < n; i++) {
        const change = Math.abs(s[i]! - before[i]!);
        const ratio = change / previousChange[i]!;
        previousChange[i] = change;
        if (!(change > 0)) continue;
        const tail = ratio < 1 ? (change * ratio) / (1 - ratio) : Infinity;
        const scale = Math.max(Math.abs(s[i]!), SCALE_FLOOR * magnitude[i]!);
        lastRowRelative = Math.max(lastRowRelative, scale > 0 ? Math.max(change, tail) / scale : Infinity);
      }
      quietRows = lastRowRelative <= scheme.tolerance ? quietRows + 1 : 0;
    }
  }
  return { drawdown: s, jacobian, imagesUsed, rows, lastRowRelative };
}
