/**
 * Starting values for fitting a model to one drawdown record. Theis-type models start from the Cooper-Jacob
 * straight line on the late data (the points with u <= uMax); the leaky model, whose late data level off and
 * bias that line, starts from a coarse type-curve search. They need only be close enough for a fit to converge.
 */
import { hantushW } from "../wells/index.js";
import { cooperJacobLine, type CooperJacobLineResult } from "./cooper-jacob.js";
import { checkGeometry } from "./checks.js";
import { ModelInputError } from "./errors.js";
import type { DrawdownModel, ObservationGeometry } from "./model.js";
import { neumanStartingValues } from "./neuman-start.js";
import { getModel, type ModelSpec } from "./registry.js";

/** Starting parameter vector and how it was obtained. */
export interface StartingValues {
  /** Parameter vector in the model's descriptor order, base units, inside the descriptor bounds. */
  readonly values: Float64Array;
  /** The straight-line fit the values came from, when they came from one. */
  readonly line?: CooperJacobLineResult;
  /** How each value was derived, one sentence each, plus any warnings of the line fit. */
  readonly notes: string[];
}

function clamp(model: DrawdownModel, k: number, v: number, notes: string[]): number {
  const d = model.parameters[k]!;
  const [lo, hi] = d.bounds;
  if (v < lo || v > hi || !Number.isFinite(v)) {
    const c = Number.isFinite(v) ? Math.min(Math.max(v, lo), hi) : hi;
    notes.push(`${d.name} = ${v.toPrecision(4)} ${d.unit} lies outside the bounds [${lo}, ${hi}]; started at ${c}.`);
    return c;
  }
  return v;
}

function isDrawdownModel(m: DrawdownModel | ModelSpec): m is DrawdownModel {
  return typeof m === "object" && m !== null && typeof (m as DrawdownModel).drawdown === "function";
}

/** Steps of the two type-curve search passes, in log10 units (factors 1.58 and 1.12). */
const COARSE_STEP = 0.2;
const FINE_STEP = 0.05;
/** Most points used by the type-curve search; longer records are thinned evenly in time order. */
const GRID_MAX_POINTS = 64;

interface GridBest {
  ssr: number;
  A: number;
  lc: number;
  lb: number;
}

/**
 * Best amplitude A and sum of squared residuals over the grid log10 c in [lcLo, lcHi], log10(r/B) in
 * [lbLo, lbHi] with the given step; u = c / t and A = sum(s W) / sum(W^2) at each grid point.
 */
function searchGrid(
  tt: readonly number[],
  ss: readonly number[],
  lcLo: number,
  lcHi: number,
  lbLo: number,
  lbHi: number,
  step: number,
  best: GridBest,
): GridBest {
  const W = new Float64Array(tt.length);
  const nb = Math.round((lbHi - lbLo) / step);
  const nc = Math.round((lcHi - lcLo) / step);
  for (let kb = 0; kb <= nb; kb++) {
    const lb = lbLo + kb * step;
    const rB = Math.pow(10, lb);
    for (let kc = 0; kc <= nc; kc++) {
      const lc = lcLo + kc * step;
      const c = Math.pow(10, lc);
      let sw = 0;
      let ww = 0;
      for (let i = 0; i < tt.length; i++) {
        W[i] = hantushW(c / tt[i]!, rB);
        sw += ss[i]! * W[i]!;
        ww += W[i]! * W[i]!;
      }
      if (!(ww > 0) || !(sw / ww > 0)) continue;
      const A = sw / ww;
      let ssr = 0;
      for (let i = 0; i < tt.length; i++) {
        const e = ss[i]! - A * W[i]!;
        ssr += e * e;
      }
      if (ssr < best.ssr) best = { ssr, A, lc, lb };
    }
  }
  return best;
}

/**
 * Coarse Hantush-Jacob type-curve match: over a grid of c = r^2 S / (4 T) (so u = c / t) and of r/B, the
 * amplitude A = Q / (4 pi T) is the least-squares factor sum(s W) / sum(W^2), and the grid point with the
 * smallest sum of squared residuals wins. First pass: c from 1e-3 t_min to 10 t_max (d) and r/B from 1e-3
 * to 5 (the span of published type-curve families) in steps of 0.2 in log10; second pass: steps of 0.05
 * within one coarse step of the best point.
 */
function hantushTypeCurveSearch(
  t: ArrayLike<number>,
  s: ArrayLike<number>,
  geometry: ObservationGeometry,
): { T: number; S: number; B: number; rB: number; points: number } {
  const usable: number[] = [];
  for (let i = 0; i < t.length; i++) {
    if (Number.isFinite(t[i]!) && t[i]! > 0 && Number.isFinite(s[i]!)) usable.push(i);
  }
  if (usable.length < 3) {
    throw new ModelInputError(
      `startingValues: only ${usable.length} point(s) with t > 0 and finite drawdown; the leaky model needs at least three.`,
    );
  }
  usable.sort((a, b) => t[a]! - t[b]!);
  const pick =
    usable.length <= GRID_MAX_POINTS
      ? usable
      : Array.from({ length: GRID_MAX_POINTS }, (_, k) => usable[Math.round((k * (usable.length - 1)) / (GRID_MAX_POINTS - 1))]!);
  const tt = pick.map((i) => t[i]!);
  const ss = pick.map((i) => s[i]!);
  const lcLo = Math.log10(tt[0]!) - 3;
  const lcHi = Math.log10(tt[tt.length - 1]!) + 1;
  const lbLo = -3;
  const lbHi = Math.log10(5);
  const none: GridBest = { ssr: Infinity, A: Number.NaN, lc: Number.NaN, lb: Number.NaN };
  const coarse = searchGrid(tt, ss, lcLo, lcHi, lbLo, lbHi, COARSE_STEP, none);
  if (!Number.isFinite(coarse.ssr)) {
    throw new ModelInputError(
      "startingValues: no leaky type curve matches drawdowns of the sign of Q; check the sign of drawdown and Q.",
    );
  }
  const best = searchGrid(
    tt, ss,
    coarse.lc - COARSE_STEP, coarse.lc + COARSE_STEP,
    Math.max(lbLo, coarse.lb - COARSE_STEP), Math.min(lbHi, coarse.lb + COARSE_STEP),
    FINE_STEP, coarse,
  );
  const T = geometry.Q / (4 * Math.PI * best.A);
  const c = Math.pow(10, best.lc);
  const rB = Math.pow(10, best.lb);
  return { T, S: (4 * T * c) / (geometry.r * geometry.r), B: geometry.r / rB, rB, points: tt.length };
}

/**
 * Starting values for `model` (a model, its id, or its id with geometry options: a model spec) from drawdown s (m) at times t (d) at the given geometry:
 * - theis, cooper-jacob: T and S of the Cooper-Jacob line on the points with u <= uMax;
 * - hantush-jacob: T, S and B of the best point of a type-curve search over u and r/B (final grid
 *   factor 1.12 in each), since levelling-off makes the late straight line too flat;
 * - thiem: T of the Cooper-Jacob line; R from the drawdown at the latest time, R = r exp(2 pi T s / Q);
 * - neuman: S from the early readings and S + Sy from the late ones (neuman-start.ts), so that the elastic
 *   storativity and the specific yield start the right way round, and Kz/Kr from a search;
 * - any other model whose parameters begin with T and S (well-bore storage, partial penetration...): T and S
 *   of the Cooper-Jacob line, further parameters at the geometric middle of their bounds.
 * Values outside the descriptor bounds are moved to the nearest bound, with a note.
 * @throws ModelInputError when the record has too few usable points or no line or curve matches it.
 */
export function startingValues(
  model: DrawdownModel | ModelSpec,
  geometry: ObservationGeometry,
  t: ArrayLike<number>,
  s: ArrayLike<number>,
  options: { readonly uMax?: number } = {},
): StartingValues {
  const m = isDrawdownModel(model) ? model : getModel(model);
  checkGeometry(`startingValues for ${m.name}`, geometry);
  if (m.id === "neuman") {
    const start = neumanStartingValues(m, geometry, t, s);
    return { values: start.values.map((v, k) => clamp(m, k, v, start.notes)), notes: start.notes };
  }
  if (m.id === "hantush-jacob") {
    const g = hantushTypeCurveSearch(t, s, geometry);
    const notes = [
      `T, S and B from a coarse type-curve match on ${g.points} points (best r/B = ${g.rB.toPrecision(3)}).`,
    ];
    return {
      values: Float64Array.of(clamp(m, 0, g.T, notes), clamp(m, 1, g.S, notes), clamp(m, 2, g.B, notes)),
      notes,
    };
  }
  const line = cooperJacobLine(t, s, { r: geometry.r, Q: geometry.Q, uMax: options.uMax });
  const notes: string[] = [
    `T and S from the Cooper-Jacob line through ${line.used.length} late points ` +
      `(slope ${line.slope.toPrecision(4)} m per log cycle, t0 = ${line.t0.toPrecision(4)} d).`,
    ...line.warnings,
  ];
  const T = clamp(m, 0, line.T, notes);
  switch (m.id) {
    case "theis":
    case "cooper-jacob":
      return { values: Float64Array.of(T, clamp(m, 1, line.S, notes)), line, notes };
    case "thiem": {
      const last = line.used[line.used.length - 1]!;
      const R = geometry.r * Math.exp((2 * Math.PI * T * s[last]!) / geometry.Q);
      notes.push(`R from the drawdown ${s[last]} m at the latest time ${t[last]} d.`);
      return { values: Float64Array.of(T, clamp(m, 1, R, notes)), line, notes };
    }
    default: {
      const names = m.parameters.map((q) => q.name);
      if (names[0] === "T" && names[1] === "S") {
        const values = new Float64Array(names.length);
        values[0] = T;
        values[1] = clamp(m, 1, line.S, notes);
        for (let k = 2; k < names.length; k++) {
          const [lo, hi] = m.parameters[k]!.bounds;
          values[k] = lo > 0 ? Math.sqrt(lo * hi) : (lo + hi) / 2;
          notes.push(
            `${names[k]} starts at the middle of its bounds (${values[k]!.toPrecision(3)} ${m.parameters[k]!.unit}): ` +
              "no data-based rule for it.",
          );
        }
        return { values, line, notes };
      }
      throw new ModelInputError(
        `startingValues: no starting-value rule for model "${m.id}"; supported: theis, cooper-jacob, ` +
          "hantush-jacob, thiem, neuman and models whose first parameters are T and S. Give starting values explicitly.",
      );
    }
  }
}
