/**
 * Neuman (1974): drawdown around a well pumping at a constant rate from an unconfined (water-table) aquifer
 * with delayed gravity response, for fully penetrating pumping and observation wells, computed by
 * numerical Laplace inversion.
 *
 *   s = Q / (4 pi T) s_D(t_s, sigma, beta),  t_s = T t / (S r^2),  sigma = S / Sy,  beta = (Kz/Kr) r^2 / b^2,
 *   L{s_D}(p) = (2 / p) sum_{n >= 0} w_n K0(sqrt(p + beta eps_n^2)),  eps_n tan eps_n = p / (sigma beta),
 *   w_n = 4 sin^2 eps_n / (eps_n (2 eps_n + sin 2 eps_n))   (p conjugate to t_s).
 * Sources: Neuman, S.P. (1974), Water Resources Research 10(2), 303-312; the Laplace form as in Moench, A.F.
 * (1997), Water Resources Research 33(6), 1397-1407, for fully penetrating wells and instantaneous drainage.
 * The series and its truncation are in neuman-laplace.ts; the inversion is Stehfest's (neuman-stehfest.ts) from
 * t_s = 0.15 on and de Hoog's at complex p below (neuman-early-laplace.ts: the series of early-time-laplace.ts in
 * plain arithmetic, the same bits), where Stehfest's error grows above 1e-3.
 *
 * Geometry: beta depends on the saturated thickness b, which is not part of ObservationGeometry and does not
 * pass through the fitting engine's geometry records; so b is bound when the model is made:
 * `neumanModel(b)`, one model per aquifer thickness.
 */
import { checkGeometry, checkParameters, checkScalar, outputArray } from "./checks.js";
import type { DrawdownModel, ObservationGeometry, ParameterDescriptor } from "./model.js";
import {
  NeumanTermLog,
  neumanTransform,
  neumanTransformValue,
  neumanTransformValueLogged,
  newNeumanTransform,
  type NeumanKnownTerms,
} from "./neuman-laplace.js";
import { stehfestWithDerivatives, type TransformWithDerivatives } from "./neuman-stehfest.js";
import { transmissivityParameter } from "./parameters.js";
import { deHoog, stehfestCoefficients } from "../numerics/index.js";
import { expint1 } from "../special/index.js";
import { neumanTransformComplex } from "./early-time-laplace.js";
import { neumanTransformComplexFast, neumanTransformComplexTwin } from "./neuman-early-laplace.js";
import { complex, type Complex } from "../numerics/index.js";

const FOUR_PI = 4 * Math.PI;

/** Stehfest weights used by the model (even; 12 balances truncation and round-off in double precision). */
export const NEUMAN_STEHFEST_TERMS = 12;
/**
 * Below this t_s the drawdown is inverted by de Hoog's method with complex roots (early-time-laplace.ts):
 * there Stehfest's error exceeds 1e-3 (1.7e-3 to 2.9e-3 at t_s = 0.1, 2.4e-2 at 0.05, against mpmath); from it on
 * Stehfest stays within 7.5e-4 of Neuman's real-integral form at the points of tests/fixtures/neuman-integral (the
 * largest at sigma = 1e-3, beta = 4, t_s = 0.3) and within 2.9e-4 from t_s = 1 (independent-checks-neuman.test.ts).
 */
export const NEUMAN_DEHOOG_BELOW = 0.15;
/** Step in ln of the argument for the forward differences of the early-time sensitivities (error about 1e-5 relative). */
const EARLY_STEP = 1e-5;

/**
 * de Hoog settings at early time: order 12 (25 transform values) and tolerance 1e-9 keep the error within 2e-7 of
 * mpmath from t_s = 0.05 on (1.4e-10 with the default order 20, at three times the cost).
 */
const EARLY_INVERSION = { order: 12, tolerance: 1e-9 } as const;
/**
 * Below this t_s (u = 1/(4 t_s) > 25, s_D < 6e-13) the early Theis branch W(u) is returned: it differs from
 * Neuman's drawdown there by less than 1e-13 in s_D, and the series would need thousands of complex roots.
 */
export const NEUMAN_THEIS_BELOW = 0.01;

const EARLY_SCRATCH = { re: 0, im: 0 };

/** F(p) at complex p: the plain-arithmetic evaluation, or the record-based one where a root needs its path from real c. */
function earlyTransform(p: Complex, sigma: number, beta: number): Complex {
  if (neumanTransformComplexFast(p.re, p.im, sigma, beta, EARLY_SCRATCH)) return complex(EARLY_SCRATCH.re, EARLY_SCRATCH.im);
  return neumanTransformComplex(p, sigma, beta);
}

function earlyTime(ts: number, sigma: number, beta: number): number {
  if (ts < NEUMAN_THEIS_BELOW) return expint1(1 / (4 * ts));
  return deHoog((p) => earlyTransform(p, sigma, beta), ts, EARLY_INVERSION);
}

/** Writes [value, t_s ds_D/dt_s, ds_D/dsigma, ds_D/dbeta] at early time from s_D = value (forward differences). */
function earlySensitivities(ts: number, sigma: number, beta: number, value: number, sensitivities: Float64Array): void {
  const up = Math.exp(EARLY_STEP);
  sensitivities[0] = value;
  sensitivities[1] = (earlyTime(ts * up, sigma, beta) - value) / EARLY_STEP;
  const sigmaUp = sigma * up;
  const betaUp = beta * up;
  if (ts >= NEUMAN_THEIS_BELOW && sigmaUp * beta === sigma * betaUp) {
    earlyTimeTwin(ts, sigma, sigmaUp, beta, betaUp, TWIN);
    sensitivities[2] = (TWIN.first - value) / (EARLY_STEP * sigma);
    sensitivities[3] = (TWIN.second - value) / (EARLY_STEP * beta);
    return;
  }
  sensitivities[2] = (earlyTime(ts, sigmaUp, beta) - value) / (EARLY_STEP * sigma);
  sensitivities[3] = (earlyTime(ts, sigma, betaUp) - value) / (EARLY_STEP * beta);
}

const TWIN = { first: 0, second: 0 };
const TWIN_FIRST = { re: 0, im: 0 };
const TWIN_SECOND = { re: 0, im: 0 };

/**
 * earlyTime(ts, sigmaUp, beta) into out.first and earlyTime(ts, sigma, betaUp) into out.second for a pair whose
 * products sigmaUp beta and sigma betaUp round alike (so c = p / (sigma beta) is the same at every de Hoog node):
 * one pass over the roots for both (neumanTransformComplexTwin), each value with the bits of its own
 * earlyTime. The second inversion reads the transform values kept by the first, at the same nodes in the same order.
 */
function earlyTimeTwin(
  ts: number,
  sigma: number,
  sigmaUp: number,
  beta: number,
  betaUp: number,
  out: { first: number; second: number },
): void {
  const scale = 1 / (sigmaUp * beta);
  const seconds: Complex[] = [];
  out.first = deHoog(
    (p) => {
      const mask = neumanTransformComplexTwin(p.re, p.im, scale, beta, betaUp, TWIN_FIRST, TWIN_SECOND);
      seconds.push(mask & 2 ? complex(TWIN_SECOND.re, TWIN_SECOND.im) : earlyTransform(p, sigma, betaUp));
      return mask & 1 ? complex(TWIN_FIRST.re, TWIN_FIRST.im) : earlyTransform(p, sigmaUp, beta);
    },
    ts,
    EARLY_INVERSION,
  );
  let k = 0;
  out.second = deHoog(() => seconds[k++]!, ts, EARLY_INVERSION);
}

/**
 * What a model's latest drawdown calls at one parameter vector computed, for a Jacobian asked at that vector (as
 * the fitting engine asks, after the residuals), by (t_s, sigma, beta) with exact decimal keys:
 * - early time: s_D, so the Jacobian needs no second de Hoog inversion (about 0.5 ms a point);
 * - Stehfest: the roots and K0 values of every term of the 12 transforms (NeumanTermLog), which the Jacobian's
 *   transforms with derivatives read instead of solving and evaluating again.
 * Drawdown calls only write, and a new parameter vector empties it, so repeated calls do the same work. The kept
 * numbers are those the Jacobian would compute: results are unchanged.
 */
class KeptEvaluations {
  private readonly values = new Map<string, number>();
  private parameters: number[] = [];
  private readonly log = new NeumanTermLog();
  /**
   * Entry of each Stehfest point by t_s: its index into `nodes`, where (start, count) of its 12 transforms follow;
   * its sigma and beta in `keys` (two numbers an entry), checked on reading.
   */
  private readonly entries = new Map<number, number>();
  private nodes = new Int32Array(24 * 256);
  private keys = new Float64Array(2 * 256);
  private used = 0;

  /** Forgets everything unless p is the vector of the kept values. */
  at(p: ArrayLike<number>): void {
    if (!this.holds(p)) {
      this.values.clear();
      this.clearTerms();
      this.parameters = Array.from(p);
    }
  }

  holds(p: ArrayLike<number>): boolean {
    if (p.length !== this.parameters.length) return false;
    for (let i = 0; i < p.length; i++) if (!Object.is(p[i], this.parameters[i])) return false;
    return true;
  }

  set(ts: number, sigma: number, beta: number, value: number): void {
    if (this.values.size >= 4096) this.values.clear();
    this.values.set(`${ts} ${sigma} ${beta}`, value);
  }

  get(ts: number, sigma: number, beta: number): number | undefined {
    return this.values.get(`${ts} ${sigma} ${beta}`);
  }

  /** s_D by Stehfest as neumanDimensionless gives it (the same sum), logging the terms of its transforms. */
  stehfestValue(ts: number, sigma: number, beta: number): number {
    if (this.log.length > KEPT_TERMS_LIMIT) this.clearTerms();
    const terms = NEUMAN_STEHFEST_TERMS;
    if (this.used + 2 * terms > this.nodes.length) {
      const grown = new Int32Array(this.nodes.length * 2);
      grown.set(this.nodes);
      this.nodes = grown;
      const keys = new Float64Array(this.keys.length * 2);
      keys.set(this.keys);
      this.keys = keys;
    }
    const entry = this.used;
    this.used += 2 * terms;
    this.entries.set(ts, entry);
    this.keys[entry / terms] = sigma;
    this.keys[entry / terms + 1] = beta;
    const weights = STEHFEST_WEIGHTS;
    const a = Math.LN2 / ts;
    let sum = 0;
    for (let k = 1; k <= weights.length; k++) {
      const start = this.log.length;
      const value = neumanTransformValueLogged(k * a, sigma, beta, NEUMAN_SERIES_TOLERANCE, this.log);
      this.nodes[entry + 2 * (k - 1)] = start;
      this.nodes[entry + 2 * (k - 1) + 1] = (this.log.length - start) / 2;
      sum += weights[k - 1]! * value;
    }
    return a * sum;
  }

  /** The entry of a logged Stehfest point, or -1. */
  stehfestEntry(ts: number, sigma: number, beta: number): number {
    const entry = this.entries.get(ts);
    if (entry === undefined) return -1;
    const at = entry / NEUMAN_STEHFEST_TERMS;
    return Object.is(this.keys[at], sigma) && Object.is(this.keys[at + 1], beta) ? entry : -1;
  }

  /** Points `known` at the logged terms of transform `node` (0-based) of an entry. */
  terms(entry: number, node: number, known: NeumanKnownTerms): void {
    known.log = this.log;
    known.start = this.nodes[entry + 2 * node]!;
    known.count = this.nodes[entry + 2 * node + 1]!;
  }

  private clearTerms(): void {
    this.log.clear();
    this.entries.clear();
    this.used = 0;
  }
}

/** Logged numbers (two a term) kept at most before the log starts again: 8 MB. */
const KEPT_TERMS_LIMIT = 1 << 20;

/** Relative truncation tolerance of the root series at each Laplace variable. */
export const NEUMAN_SERIES_TOLERANCE = 1e-10;

const STEHFEST_WEIGHTS = stehfestCoefficients(NEUMAN_STEHFEST_TERMS);
/** Scratch records reused by every evaluation (the library runs on one thread and never re-enters here). */
const SCRATCH = newNeumanTransform();
const SENSITIVITY_SCRATCH = new Float64Array(4);

/** Elastic storativity S of the saturated zone. */
export const elasticStorativityParameter: ParameterDescriptor = {
  name: "S",
  label: "elastic storativity",
  unit: "1",
  positive: true,
  bounds: [1e-7, 0.1],
  description: "Volume released per unit area per unit head decline by compression of water and aquifer (early time).",
};

/** Specific yield Sy. */
export const specificYieldParameter: ParameterDescriptor = {
  name: "Sy",
  label: "specific yield",
  unit: "1",
  positive: true,
  bounds: [1e-4, 0.5],
  description: "Volume drained by gravity per unit area per unit decline of the water table (late time).",
};

/** Anisotropy ratio Kz/Kr. */
export const anisotropyRatioParameter: ParameterDescriptor = {
  name: "KzKr",
  label: "anisotropy ratio Kz/Kr",
  unit: "1",
  positive: true,
  bounds: [1e-5, 10],
  description: "Ratio of vertical to horizontal hydraulic conductivity; sets beta = (Kz/Kr) r^2 / b^2 at each well.",
};

/** The Neuman model with its saturated thickness bound in. */
export interface NeumanModel extends DrawdownModel {
  /** Saturated thickness b (m) used for beta = (Kz/Kr) r^2 / b^2. */
  readonly saturatedThickness: number;
}

/**
 * Dimensionless Neuman drawdown s_D = 4 pi T s / Q at dimensionless time t_s = T t / (S r^2) (> 0) for
 * sigma = S/Sy > 0 and beta > 0. With `sensitivities` (length 4) also writes [s_D, t_s ds_D/dt_s,
 * ds_D/dsigma, ds_D/dbeta]. Inversion: Stehfest N = 12 from t_s = 0.15 on (within 7.5e-4 of the real-integral
 * form), de Hoog with complex roots from 0.01 to 0.15 (within 2e-7 of mpmath from t_s = 0.05 on; sensitivities there by forward
 * differences in ln t_s, ln sigma, ln beta with step 1e-5), and Theis's W(1/(4 t_s)) below 0.01, where s_D < 6e-13.
 * Accuracy: see docs/methods.md. Source: Neuman (1974) as above.
 */
export function neumanDimensionless(ts: number, sigma: number, beta: number, sensitivities?: Float64Array): number {
  if (ts < NEUMAN_DEHOOG_BELOW) {
    const value = earlyTime(ts, sigma, beta);
    if (sensitivities) earlySensitivities(ts, sigma, beta, value, sensitivities);
    return value;
  }
  const weights = STEHFEST_WEIGHTS;
  const a = Math.LN2 / ts;
  if (sensitivities === undefined) {
    let sum = 0;
    for (let k = 1; k <= weights.length; k++) {
      sum += weights[k - 1]! * neumanTransformValue(k * a, sigma, beta, NEUMAN_SERIES_TOLERANCE);
    }
    return a * sum;
  }
  stehfestSensitivities(ts, sigma, beta, null, -1, sensitivities);
  return sensitivities[0]!;
}

const KNOWN: NeumanKnownTerms = { log: new NeumanTermLog(), start: 0, count: 0 };

/**
 * The Stehfest branch of neumanDimensionless with sensitivities; with `kept` and an entry >= 0 the transforms read
 * the roots and K0 values logged by the drawdown call (the same numbers).
 */
function stehfestSensitivities(
  ts: number,
  sigma: number,
  beta: number,
  kept: KeptEvaluations | null,
  entry: number,
  sensitivities: Float64Array,
): void {
  let node = 0;
  const transform: TransformWithDerivatives = (p, derivatives, values) => {
    if (kept !== null && entry >= 0) {
      kept.terms(entry, node++, KNOWN);
      neumanTransform(p, sigma, beta, NEUMAN_SERIES_TOLERANCE, derivatives, SCRATCH, KNOWN);
    } else {
      neumanTransform(p, sigma, beta, NEUMAN_SERIES_TOLERANCE, derivatives, SCRATCH);
    }
    values[0] = SCRATCH.value;
    if (derivatives) {
      values[1] = SCRATCH.dp;
      values[2] = SCRATCH.dSigma;
      values[3] = SCRATCH.dBeta;
    }
  };
  stehfestWithDerivatives(transform, ts, NEUMAN_STEHFEST_TERMS, true, SENSITIVITY_SCRATCH, sensitivities);
}

/**
 * The Neuman (1974) model for an aquifer of saturated thickness b (m, > 0); parameter vector
 * [T (m2/d), S (1), Sy (1), Kz/Kr (1)]. Drawdown in m at times in d.
 */
export function neumanModel(b: number): NeumanModel {
  checkScalar("neumanModel", "saturated thickness b", b, "m", true);
  const early = new KeptEvaluations();
  const model: NeumanModel = {
    id: "neuman",
    name: "Neuman (1974) unconfined aquifer with delayed gravity response",
    source:
      "Neuman, S.P. (1974). Effect of partial penetration on flow in unconfined aquifers considering delayed " +
      "gravity response. Water Resources Research 10(2), 303-312. Laplace-domain form for fully penetrating " +
      "wells: Moench, A.F. (1997). Flow to a well of finite diameter in a homogeneous, anisotropic water table " +
      "aquifer. Water Resources Research 33(6), 1397-1407.",
    assumptions: [
      "The aquifer is unconfined, homogeneous, of uniform saturated thickness b, infinite in areal extent, " +
        "and anisotropic with vertical and horizontal conductivities Kz and Kr; its base is impermeable.",
      "Water is released by compression (S) throughout and by gravity drainage at the water table (Sy); " +
        "drainage follows the fall of the water table instantly (no unsaturated-zone lag).",
      "Drawdown is small compared with b, so the water-table condition is linearised at its initial height.",
      "Pumping and observation wells fully penetrate the saturated thickness; the well has an infinitesimal " +
        "radius (no well-bore storage) and pumps at a constant rate.",
    ],
    validity: [
      "All t > 0 and S < Sy; early data follow Theis with S, late data Theis with S + Sy, joined by a flat " +
        "stretch whose level is set by beta = (Kz/Kr) r^2 / b^2.",
      "Drawdown at or below roughly 10 % of b (common practice, no source); larger drawdown reduces the " +
        "transmissivity and breaks the linearised water-table condition.",
      "beta between about 1e-3 and 10; smaller beta needs many series terms (slower), larger beta makes the " +
        "curve indistinguishable from Theis with S + Sy.",
    ],
    cautions: [
      "Sy from a test that ends on the flat stretch is not determined; fitting it anyway gives a number set " +
        "by the bounds or the start. Do not project long-term yield or dewatering beyond the tested duration " +
        "from such an Sy.",
      "A slowly draining unsaturated zone (fine sediments) makes the late data rise more slowly than this " +
        "model, biasing Sy low (Moench 1997 adds a drainage constant for this).",
      "The flat stretch is also produced by leakage or a recharge boundary; the interpretation needs the " +
        "geology and, ideally, several observation distances.",
    ],
    parameters: [transmissivityParameter, elasticStorativityParameter, specificYieldParameter, anisotropyRatioParameter],
    orderedParameters: [["S", "Sy"]],
    saturatedThickness: b,

    drawdown(p: ArrayLike<number>, geometry: ObservationGeometry, t: ArrayLike<number>, out?: Float64Array): Float64Array {
      checkParameters(model, p);
      checkGeometry(model.name, geometry);
      const [T, S, Sy, kappa] = [p[0]!, p[1]!, p[2]!, p[3]!];
      const result = outputArray(model.name, t.length, out);
      const coef = geometry.Q / (FOUR_PI * T);
      const tsPerDay = T / (S * geometry.r * geometry.r);
      const sigma = S / Sy;
      const beta = (kappa * geometry.r * geometry.r) / (b * b);
      early.at(p);
      for (let i = 0; i < t.length; i++) {
        const ti = t[i]!;
        if (!(ti > 0)) {
          result[i] = ti <= 0 ? 0 : Number.NaN;
          continue;
        }
        const ts = ti * tsPerDay;
        let sD: number;
        if (ts < NEUMAN_DEHOOG_BELOW) {
          sD = neumanDimensionless(ts, sigma, beta);
          early.set(ts, sigma, beta, sD);
        } else sD = early.stehfestValue(ts, sigma, beta);
        result[i] = coef * sD;
      }
      return result;
    },

    jacobian(p: ArrayLike<number>, geometry: ObservationGeometry, t: ArrayLike<number>): Float64Array[] {
      checkParameters(model, p);
      checkGeometry(model.name, geometry);
      const [T, S, Sy, kappa] = [p[0]!, p[1]!, p[2]!, p[3]!];
      const coef = geometry.Q / (FOUR_PI * T);
      const tsPerDay = T / (S * geometry.r * geometry.r);
      const sigma = S / Sy;
      const beta = (kappa * geometry.r * geometry.r) / (b * b);
      const columns = [0, 1, 2, 3].map(() => new Float64Array(t.length));
      const d = new Float64Array(4);
      const reuse = early.holds(p);
      for (let i = 0; i < t.length; i++) {
        const ti = t[i]!;
        if (!(ti > 0)) {
          if (!(ti <= 0)) for (const column of columns) column[i] = Number.NaN;
          continue;
        }
        const ts = ti * tsPerDay;
        if (ts < NEUMAN_DEHOOG_BELOW) {
          const known = reuse ? early.get(ts, sigma, beta) : undefined;
          if (known === undefined) neumanDimensionless(ts, sigma, beta, d);
          else earlySensitivities(ts, sigma, beta, known, d);
        } else {
          stehfestSensitivities(ts, sigma, beta, early, reuse ? early.stehfestEntry(ts, sigma, beta) : -1, d);
        }
        // d[1] = t_s ds_D/dt_s, d[2] = ds_D/dsigma, d[3] = ds_D/dbeta; chain rule in ln parameters.
        const s = coef * d[0]!;
        columns[0]![i] = (-s + coef * d[1]!) / T;
        columns[1]![i] = (coef * (-d[1]! + sigma * d[2]!)) / S;
        columns[2]![i] = (-coef * sigma * d[2]!) / Sy;
        columns[3]![i] = (coef * beta * d[3]!) / kappa;
      }
      return columns;
    },
  };
  return model;
}

/** One Neuman type curve: s_D against t_s for one beta. */
export interface NeumanTypeCurve {
  readonly beta: number;
  /** s_D = 4 pi T s / Q at each t_s of the family. */
  readonly sD: Float64Array;
}

/** A family of Neuman type curves for one sigma. */
export interface NeumanTypeCurveFamily {
  readonly sigma: number;
  /** Dimensionless times t_s = T t / (S r^2); t_y = sigma t_s = T t / (Sy r^2). */
  readonly ts: Float64Array;
  readonly curves: NeumanTypeCurve[];
}

/**
 * Neuman type curves s_D(t_s) for sigma = S/Sy (> 0) and each beta (> 0), at the given t_s (> 0). Plot
 * against 4 t_s (= 1/u_A) for the early branch and 4 sigma t_s (= 1/u_B) for the late one. Source: Neuman (1974).
 */
export function neumanTypeCurves(ts: ArrayLike<number>, sigma: number, betas: ArrayLike<number>): NeumanTypeCurveFamily {
  checkScalar("neumanTypeCurves", "sigma = S/Sy", sigma, "1", true);
  const x = Float64Array.from(ts);
  for (let i = 0; i < x.length; i++) checkScalar("neumanTypeCurves", `t_s at index ${i}`, x[i]!, "1", true);
  const curves: NeumanTypeCurve[] = [];
  for (let k = 0; k < betas.length; k++) {
    const beta = betas[k]!;
    checkScalar("neumanTypeCurves", `beta at index ${k}`, beta, "1", true);
    curves.push({ beta, sD: x.map((v) => neumanDimensionless(v, sigma, beta)) });
  }
  return { sigma, ts: x, curves };
}
