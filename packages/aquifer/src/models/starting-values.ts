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
import { portableExp10 } from "../numerics/portable-math.js";

/** Kz/Kr to start from when it is fitted (common practice, no source: a vertical conductivity a tenth of the horizontal). */
const START_ANISOTROPY = 0.1;
/** Skin and fracture skin to start from (common practice, no source: a slightly damaged well face). */
const START_SKIN = 1;

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
    const rB = portableExp10(lb);
    for (let kc = 0; kc <= nc; kc++) {
      const lc = lcLo + kc * step;
      const c = portableExp10(lc);
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
  const c = portableExp10(best.lc);
  const rB = portableExp10(best.lb);
  return { T, S: (4 * T * c) / (geometry.r * geometry.r), B: geometry.r / rB, rB, points: tt.length };
}

/** Usable (t > 0, finite s) points in time order. */
function usablePoints(t: ArrayLike<number>, s: ArrayLike<number>): { t: number[]; s: number[] } {
  const idx: number[] = [];
  for (let i = 0; i < t.length; i++) if (Number.isFinite(t[i]!) && t[i]! > 0 && Number.isFinite(s[i]!)) idx.push(i);
  idx.sort((a, b) => t[a]! - t[b]!);
  return { t: idx.map((i) => t[i]!), s: idx.map((i) => s[i]!) };
}

/** Geometric middle of the record's time span, d (used as 1/rate for lag and drainage constants). */
function middleTime(t: ArrayLike<number>, s: ArrayLike<number>): number {
  const u = usablePoints(t, s);
  if (u.t.length === 0) throw new ModelInputError("startingValues: the record has no point with t > 0 and a finite value.");
  return Math.sqrt(u.t[0]! * u.t[u.t.length - 1]!);
}

/** Least-squares line y = a + b x. */
function line(x: readonly number[], y: readonly number[]): { a: number; b: number } {
  const n = x.length;
  const mx = x.reduce((p, v) => p + v, 0) / n;
  const my = y.reduce((p, v) => p + v, 0) / n;
  let sxy = 0;
  let sxx = 0;
  for (let i = 0; i < n; i++) {
    sxy += (x[i]! - mx) * (y[i]! - my);
    sxx += (x[i]! - mx) * (x[i]! - mx);
  }
  const b = sxy / sxx;
  return { a: my - b * mx, b };
}

/**
 * Coarse search over T (m2/d) and S on a grid of factors 10^0.25 and 10^0.5, the other parameters held at
 * `values`: the grid point with the smallest sum of squared residuals on up to 32 points of the record.
 */
function gridSearchTS(m: DrawdownModel, geometry: ObservationGeometry, t: ArrayLike<number>, s: ArrayLike<number>, values: Float64Array): void {
  const u = usablePoints(t, s);
  const pick = u.t.length <= 32 ? u.t.map((_, i) => i) : Array.from({ length: 32 }, (_, k) => Math.round((k * (u.t.length - 1)) / 31));
  const tt = pick.map((i) => u.t[i]!);
  const ss = pick.map((i) => u.s[i]!);
  const p = Float64Array.from(values);
  let best = Infinity;
  let bestT = values[0]!;
  let bestS = values[1]!;
  for (let lt = -2; lt <= 5; lt += 0.25) {
    for (let ls = -7; ls <= -0.5; ls += 0.5) {
      p[0] = portableExp10(lt);
      p[1] = portableExp10(ls);
      const model = m.drawdown(p, geometry, tt);
      let ssr = 0;
      for (let i = 0; i < tt.length; i++) ssr += (model[i]! - ss[i]!) ** 2;
      if (ssr < best) {
        best = ssr;
        bestT = p[0];
        bestS = p[1];
      }
    }
  }
  values[0] = bestT;
  values[1] = bestS;
}

/** T and S of the Cooper-Jacob line of a record, with the line and its notes. */
function cooperJacobStart(m: DrawdownModel, geometry: ObservationGeometry, t: ArrayLike<number>, s: ArrayLike<number>, uMax: number | undefined) {
  const fitted = cooperJacobLine(t, s, { r: geometry.r, Q: geometry.Q, uMax });
  const notes: string[] = [
    `T and S from the Cooper-Jacob line through ${fitted.used.length} late points ` +
      `(slope ${fitted.slope.toPrecision(4)} m per log cycle, t0 = ${fitted.t0.toPrecision(4)} d).`,
    ...fitted.warnings,
  ];
  return { line: fitted, notes, T: clamp(m, 0, fitted.T, notes), S: fitted.S };
}

/** Starting values of a slug-test model (normalized head H/H0 against t in d). */
function slugStart(m: DrawdownModel, t: ArrayLike<number>, h: ArrayLike<number>): StartingValues {
  const u = usablePoints(t, h);
  const notes: string[] = [];
  const values = new Float64Array(m.parameters.length);
  let t37 = u.t[u.t.length - 1]!;
  for (let i = 0; i < u.t.length; i++) {
    if (u.s[i]! <= Math.exp(-1)) {
      t37 = u.t[i]!;
      break;
    }
  }
  if (m.id === "kgs-slug") {
    const g = (m as DrawdownModel & { geometry: { thickness: number; screenTop: number; screenBottom: number; rc: number; rw: number } }).geometry;
    const L = g.screenBottom - g.screenTop;
    const shape = Math.max(1, Math.log(L / g.rw));
    // Hvorslev (1951): K = rc^2 ln(L/rw) / (2 L T0), T0 the time to H/H0 = 0.37; T = K b.
    values[0] = clamp(m, 0, (g.thickness * g.rc * g.rc * shape) / (2 * L * t37), notes);
    values[1] = clamp(m, 1, 1e-5, notes);
    notes.push(`T from the Hvorslev (1951) time lag: H/H0 reaches 0.37 at ${t37.toPrecision(3)} d; S = 1e-5 (common practice, no source).`);
    m.parameters.forEach((d, k) => {
      if (d.name === "KzKr") values[k] = START_ANISOTROPY;
      if (d.name === "Sk") values[k] = START_SKIN;
    });
    return { values, notes };
  }
  // Underdamped: the oscillation's period and decay give sqrt(g / Le) and C_D; without an oscillation, the
  // Bouwer-Rice line of the overdamped limit gives K.
  const g = (m as DrawdownModel & { geometry: { rc: number; screenLength: number; lnReRw: number } }).geometry;
  const crossings: number[] = [];
  for (let i = 1; i < u.t.length; i++) {
    if (u.s[i - 1]! > 0 !== u.s[i]! > 0) {
      const f = u.s[i - 1]! / (u.s[i - 1]! - u.s[i]!);
      crossings.push(u.t[i - 1]! + f * (u.t[i]! - u.t[i - 1]!));
    }
  }
  let minimum = 0;
  let tMin = Number.NaN;
  for (let i = 0; i < u.t.length; i++) {
    if (crossings.length >= 2 && u.t[i]! > crossings[1]!) break;
    if (u.s[i]! < minimum) {
      minimum = u.s[i]!;
      tMin = u.t[i]!;
    }
  }
  const G = 9.80665 * 86400 * 86400;
  if (crossings.length >= 2 && minimum < 0) {
    const halfPeriod = crossings[1]! - crossings[0]!;
    const wd = Math.PI / halfPeriod;
    // |trough| = exp(-beta t_min) for a lightly damped record: beta = -ln|trough| / t_min.
    const beta = Math.max(-Math.log(-minimum) / tMin, 1e-12);
    const w = Math.sqrt(wd * wd + beta * beta);
    const CD = (2 * beta) / w;
    values[1] = clamp(m, 1, G / (w * w), notes);
    values[0] = clamp(m, 0, (g.rc * g.rc * g.lnReRw * w) / (2 * CD * g.screenLength), notes);
    notes.push(
      `Le from the oscillation (half period ${halfPeriod.toPrecision(3)} d) and K from its decay (trough ${minimum.toPrecision(3)} at ${tMin.toPrecision(3)} d).`,
    );
  } else {
    values[1] = clamp(m, 1, 5, notes);
    values[0] = clamp(m, 0, (g.rc * g.rc * g.lnReRw) / (2 * g.screenLength * t37), notes);
    notes.push("No oscillation: K from the Bouwer-Rice time to H/H0 = 0.37; Le = 5 m (common practice, no source).");
  }
  return { values, notes };
}

/** Starting values of a step test with well loss, from the step-end drawdowns and the first step. */
function stepStart(m: DrawdownModel, geometry: ObservationGeometry, t: ArrayLike<number>, s: ArrayLike<number>, uMax: number | undefined): StartingValues {
  const steps = (m as DrawdownModel & { steps?: readonly { start: number; rate: number }[] }).steps;
  if (!steps) throw new ModelInputError(`startingValues: model "${m.id}" carries no rate schedule; make it with getModel or stepDrawdownModel.`);
  const u = usablePoints(t, s);
  const ends: { Q: number; s: number }[] = [];
  steps.forEach((step, i) => {
    const end = i + 1 < steps.length ? steps[i + 1]!.start : Infinity;
    let last = -1;
    for (let j = 0; j < u.t.length; j++) if (u.t[j]! > step.start && u.t[j]! <= end) last = j;
    if (step.rate > 0 && last >= 0) ends.push({ Q: step.rate, s: u.s[last]! });
  });
  if (ends.length < 2) throw new ModelInputError(`startingValues: readings in ${ends.length} pumping step(s); the step test needs readings in at least two.`);
  const jacob = line(ends.map((e) => e.Q), ends.map((e) => e.s / e.Q));
  const notes: string[] = [];
  const C = jacob.b > 0 ? jacob.b : 1e-8;
  notes.push(
    `C from the step-end drawdowns (Jacob 1947: s/Q = B + C Q over ${ends.length} steps${jacob.b > 0 ? "" : "; the line fell, C started small"}), n = 2.`,
  );
  const first = steps.find((step) => step.rate > 0)!;
  const next = steps[steps.indexOf(first) + 1];
  const inFirst = u.t.map((ti, j) => j).filter((j) => u.t[j]! > first.start && (next === undefined || u.t[j]! <= next.start));
  const wellLoss = C * first.rate * first.rate;
  const cj = cooperJacobStart(
    m,
    { r: geometry.r, Q: first.rate },
    inFirst.map((j) => u.t[j]! - first.start),
    inFirst.map((j) => u.s[j]! - wellLoss),
    uMax,
  );
  notes.push(`T and S from the first step with the well loss C Q^2 = ${wellLoss.toPrecision(3)} m taken off:`, ...cj.notes);
  const values = new Float64Array(m.parameters.length);
  values[0] = cj.T;
  values[1] = clamp(m, 1, cj.S, notes);
  values[m.parameters.length - 2] = clamp(m, m.parameters.length - 2, C, notes);
  values[m.parameters.length - 1] = 2;
  return { values, line: cj.line, notes };
}

/** Starting values of the Jacob-Lohman model: the discharge's straight line at the well, a grid search elsewhere. */
function constantDrawdownStart(m: DrawdownModel, geometry: ObservationGeometry, t: ArrayLike<number>, s: ArrayLike<number>): StartingValues {
  const well = (m as DrawdownModel & { well: { rw: number; drawdown: number } }).well;
  const notes: string[] = [];
  const values = Float64Array.of(10, 1e-4);
  if (geometry.r <= well.rw * (1 + 1e-9)) {
    const u = usablePoints(t, s);
    const late = Math.floor(u.t.length / 2);
    const x = u.t.slice(late).map((v) => Math.log10(v));
    const y = u.s.slice(late).map((q) => well.drawdown / q);
    if (x.length < 2 || y.some((v) => !(v > 0))) throw new ModelInputError("startingValues: the discharge record needs at least four positive readings.");
    // sw/Q = 2.303/(4 pi T) log10(2.25 T t/(S rw^2)) (Jacob and Lohman 1952), on the later half of the record.
    const fitted = line(x, y);
    const T = 2.302585092994046 / (4 * Math.PI * fitted.b);
    const S = (2.25 * T) / (well.rw * well.rw * portableExp10(fitted.a / fitted.b));
    values[0] = clamp(m, 0, T, notes);
    values[1] = clamp(m, 1, S, notes);
    notes.push(`T and S from the straight line sw/Q against log10 t through the later ${x.length} readings (Jacob and Lohman 1952).`);
  } else {
    gridSearchTS(m, geometry, t, s, values);
    notes.push("T and S from a coarse grid search (factors 1.8 in T and 3.2 in S) of the drawdown around the well.");
  }
  return { values, notes };
}

/**
 * Starting values for `model` (a model, its id, or its id with geometry options: a model spec) from a record s at
 * times t (d) at the given geometry (s is the drawdown in m, except H/H0 for the slug tests and the discharge in
 * m3/d at the well of the Jacob-Lohman model):
 * - theis, cooper-jacob: T and S of the Cooper-Jacob line on the points with u <= uMax;
 * - hantush-jacob and hantush-leaky-partial-penetration: T, S and B of the best point of a type-curve search over
 *   u and r/B (final grid factor 1.12 in each), since levelling-off makes the late straight line too flat;
 * - thiem: T of the Cooper-Jacob line; R from the drawdown at the latest time, R = r exp(2 pi T s / Q);
 *   dupuit-thiem: K = T / H and the R that gives the latest drawdown;
 * - neuman: S from the early readings and S + Sy from the late ones (neuman-start.ts), so that the elastic
 *   storativity and the specific yield start the right way round, and Kz/Kr from a search;
 * - boulton and the water-table models: T of the Cooper-Jacob line on the late data and Sy from its S
 *   (late data follow Theis with S + Sy), S = Sy / 100; double porosity likewise with Sm in the place of Sy;
 * - a drainage constant alpha or block rate starts at 1 over the geometric middle of the record's times, Kz/Kr at
 *   0.1, a skin or fracture skin at 1 (common practice, no source);
 * - papadopulos-anisotropy: Tmax = 1.5 T and Tmin = T / 1.5 of the line, theta = 0 (common practice, no source);
 * - kgs-slug: T from the Hvorslev (1951) time lag (H/H0 = 0.37), S = 1e-5; underdamped-slug: Le and K from the
 *   period and decay of the oscillation (or the Bouwer-Rice time lag when it does not oscillate);
 * - the step tests with well loss: C from the step-end drawdowns (Jacob 1947), n = 2, T and S from the first
 *   step with that well loss taken off;
 * - jacob-lohman: the straight line sw/Q against log t at the well, a coarse grid search elsewhere;
 * - any other model whose parameters begin with T and S: T and S of the Cooper-Jacob line, further parameters at
 *   the geometric middle of their bounds.
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
  if (m.id === "hantush-jacob" || m.id === "hantush-leaky-partial-penetration") {
    const g = hantushTypeCurveSearch(t, s, geometry);
    const notes = [
      `T, S and B from a coarse type-curve match on ${g.points} points (best r/B = ${g.rB.toPrecision(3)}).`,
    ];
    const values = new Float64Array(m.parameters.length);
    values[0] = clamp(m, 0, g.T, notes);
    values[1] = clamp(m, 1, g.S, notes);
    values[2] = clamp(m, 2, g.B, notes);
    if (values.length > 3) {
      values[3] = START_ANISOTROPY;
      notes.push(`KzKr = ${START_ANISOTROPY} as a first guess (common practice, no source).`);
    }
    return { values, notes };
  }
  if (m.id === "kgs-slug" || m.id === "underdamped-slug") return slugStart(m, t, s);
  if (m.id.endsWith("+well-loss")) return stepStart(m, geometry, t, s, options.uMax);
  if (m.id === "jacob-lohman") return constantDrawdownStart(m, geometry, t, s);
  const { line: cj, notes, T, S } = cooperJacobStart(m, geometry, t, s, options.uMax);
  const names = m.parameters.map((q) => q.name);
  switch (m.id) {
    case "theis":
    case "cooper-jacob":
      return { values: Float64Array.of(T, clamp(m, 1, S, notes)), line: cj, notes };
    case "thiem": {
      const last = cj.used[cj.used.length - 1]!;
      const R = geometry.r * Math.exp((2 * Math.PI * T * s[last]!) / geometry.Q);
      notes.push(`R from the drawdown ${s[last]} m at the latest time ${t[last]} d.`);
      return { values: Float64Array.of(T, clamp(m, 1, R, notes)), line: cj, notes };
    }
    case "dupuit-thiem": {
      const H = (m as DrawdownModel & { saturatedThickness: number }).saturatedThickness;
      const last = cj.used[cj.used.length - 1]!;
      const K = clamp(m, 0, T / H, notes);
      const h = H - s[last]!;
      const R = geometry.r * Math.exp((Math.PI * K * (H * H - h * h)) / geometry.Q);
      notes.push(`K = T / H with H = ${H} m; R gives the drawdown ${s[last]} m at the latest time ${t[last]} d.`);
      return { values: Float64Array.of(K, clamp(m, 1, R, notes)), line: cj, notes };
    }
    case "papadopulos-anisotropy": {
      notes.push("Tmax = 1.5 T and Tmin = T / 1.5 of the line, theta = 0 (common practice, no source); aq.fitAnisotropy tries several directions.");
      return { values: Float64Array.of(clamp(m, 0, 1.5 * T, notes), clamp(m, 1, T / 1.5, notes), 0, clamp(m, 3, S, notes)), line: cj, notes };
    }
    default: {
      if (names[0] !== "T" || names[1] !== "S") {
        throw new ModelInputError(
          `startingValues: no starting-value rule for model "${m.id}"; supported: ${"theis, cooper-jacob, hantush-jacob, thiem, " +
            "the registered models and models whose first parameters are T and S"}. Give starting values explicitly.`,
        );
      }
      const values = new Float64Array(names.length);
      values[0] = T;
      const late = names.includes("Sy") ? "Sy" : names.includes("Sm") ? "Sm" : null;
      if (late !== null) {
        const k = names.indexOf(late);
        values[k] = clamp(m, k, S, notes);
        values[1] = clamp(m, 1, values[k]! / 100, notes);
        notes.push(`${late} from the line's S (late data follow Theis with S + ${late}); S = ${late} / 100 (common practice, no source).`);
      } else {
        values[1] = clamp(m, 1, S, notes);
      }
      for (let k = 2; k < names.length; k++) {
        const name = names[k]!;
        if (name === late) continue;
        if (name === "KzKr") {
          values[k] = START_ANISOTROPY;
          notes.push(`KzKr = ${START_ANISOTROPY} as a first guess (common practice, no source).`);
        } else if (name === "Sk" || name === "sf") {
          values[k] = START_SKIN;
          notes.push(`${name} = ${START_SKIN} as a first guess (common practice, no source).`);
        } else if (name === "alpha" || name === "blockRate") {
          values[k] = clamp(m, k, 1 / middleTime(t, s), notes);
          notes.push(`${name} = 1 / ${middleTime(t, s).toPrecision(3)} d, one over the middle of the record's times (common practice, no source).`);
        } else {
          const [lo, hi] = m.parameters[k]!.bounds;
          values[k] = lo > 0 ? Math.sqrt(lo * hi) : (lo + hi) / 2;
          notes.push(`${name} starts at the middle of its bounds (${values[k]!.toPrecision(3)} ${m.parameters[k]!.unit}): no data-based rule for it.`);
        }
      }
      return { values, line: cj, notes };
    }
  }
}
