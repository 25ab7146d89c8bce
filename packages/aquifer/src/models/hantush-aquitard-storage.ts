/**
 * Hantush (1960): drawdown around a well pumping at a constant rate from a leaky aquifer when the aquitard
 * releases water from its own storage, the far side of the aquitard staying at constant head. Computed for
 * all times by numerical Laplace inversion (Stehfest) of
 *
 *   s = Q / (4 pi T) s_D,  L{s_D}(p) = (2/p) K0(sqrt(p + (r/B)^2 y coth y)),  y = sqrt(p S'/S) / (r/B),
 *
 * with p conjugate to t_D = T t / (S r^2) and B = sqrt(T b'/K'). Hantush's early-time function H(u, beta),
 * beta = (r / 4B) sqrt(S'/S), is the limit coth y -> 1 of the same transform.
 * Sources: Hantush, M.S. (1960), J. Geophys. Res. 65(11), 3713-3725; Laplace form as in Moench, A.F. (1985),
 * Water Resources Research 21(8), 1121-1131 (constant-head source bed, no storage in the pumped well).
 * Inversion: Stehfest from t_D = 0.2 on, de Hoog below (early-time-laplace.ts), where Stehfest's error exceeds 1e-4.
 */
import { checkGeometry, checkParameters, checkScalar, outputArray } from "./checks.js";
import { ModelInputError } from "./errors.js";
import { leakageFactorParameter } from "./hantush-jacob.js";
import { leakyStorageTransform } from "./leaky-storage-laplace.js";
import type { DrawdownModel, ObservationGeometry, ParameterDescriptor } from "./model.js";
import { stehfestWithDerivatives, type TransformWithDerivatives } from "./neuman-stehfest.js";
import { storativityParameter, transmissivityParameter } from "./parameters.js";
import { deHoog } from "../numerics/index.js";
import { leakyStorageTransformComplex } from "./early-time-laplace.js";

const FOUR_PI = 4 * Math.PI;

/**
 * Below this t_D the drawdown is inverted by de Hoog's method at complex p (early-time-laplace.ts): Stehfest's
 * error is 4.6e-4 at t_D = 0.1 and 6e-3 at 0.05 against mpmath, and below 1.1e-4 from t_D = 0.15 on.
 */
export const LEAKY_STORAGE_DEHOOG_BELOW = 0.2;
const EARLY_STEP = 1e-4;

/** de Hoog settings at early time: order 12, tolerance 1e-9 (within 2.2e-8 of mpmath at t_D = 0.1). */
const EARLY_INVERSION = { order: 12, tolerance: 1e-9 } as const;

function earlyTime(tD: number, rho: number, gamma: number): number {
  return deHoog((p) => leakyStorageTransformComplex(p, rho, gamma), tD, EARLY_INVERSION);
}

/** Stehfest weights used by the model. */
export const LEAKY_STORAGE_STEHFEST_TERMS = 14;

/** Aquitard storativity S' = Ss' b'. */
export const aquitardStorativityParameter: ParameterDescriptor = {
  name: "Sa",
  label: "aquitard storativity S'",
  unit: "1",
  positive: true,
  bounds: [1e-9, 0.5],
  description: "Storativity of the aquitard, S' = Ss' b' (specific storage times aquitard thickness).",
};

/**
 * Dimensionless drawdown s_D = 4 pi T s / Q at t_D = T t / (S r^2) > 0 for rho = r/B > 0 and gamma = S'/S >= 0.
 * With `sensitivities` (length 4) also writes [s_D, t_D ds_D/dt_D, ds_D/drho, ds_D/dgamma]. Inversion: Stehfest
 * N = 14 from t_D = 0.2 on, de Hoog at complex p below (sensitivities there by central differences, step 1e-4 in
 * ln t_D, ln rho and ln gamma). Accuracy: see docs/methods.md. Source: Hantush (1960), Laplace form of Moench (1985).
 */
export function hantushStorageDimensionless(tD: number, rho: number, gamma: number, sensitivities?: Float64Array): number {
  if (tD < LEAKY_STORAGE_DEHOOG_BELOW) {
    const value = earlyTime(tD, rho, gamma);
    if (sensitivities) {
      const up = Math.exp(EARLY_STEP);
      const down = Math.exp(-EARLY_STEP);
      const h2 = 2 * EARLY_STEP;
      sensitivities[0] = value;
      sensitivities[1] = (earlyTime(tD * up, rho, gamma) - earlyTime(tD * down, rho, gamma)) / h2;
      sensitivities[2] = (earlyTime(tD, rho * up, gamma) - earlyTime(tD, rho * down, gamma)) / (h2 * rho);
      // gamma may be 0 (no aquitard storage): a one-sided step in gamma there.
      sensitivities[3] = gamma > 0
        ? (earlyTime(tD, rho, gamma * up) - earlyTime(tD, rho, gamma * down)) / (h2 * gamma)
        : (earlyTime(tD, rho, EARLY_STEP) - value) / EARLY_STEP;
    }
    return value;
  }
  const transform: TransformWithDerivatives = (p, derivatives, values) =>
    leakyStorageTransform(p, rho, gamma, derivatives, values);
  const result = sensitivities ?? new Float64Array(4);
  stehfestWithDerivatives(transform, tD, LEAKY_STORAGE_STEHFEST_TERMS, sensitivities !== undefined, new Float64Array(4), result);
  return result[0]!;
}

/** Hantush (1960) leaky aquifer with aquitard storage; parameter vector [T (m2/d), S (1), B (m), S' (1)]. */
export const hantushAquitardStorageModel: DrawdownModel = {
  id: "hantush-aquitard-storage",
  name: "Hantush (1960) leaky aquifer with aquitard storage",
  source:
    "Hantush, M.S. (1960). Modification of the theory of leaky aquifers. Journal of Geophysical Research " +
    "65(11), 3713-3725. Laplace-domain form: Moench, A.F. (1985). Transient flow to a large-diameter well in an " +
    "aquifer with storative semiconfining layers. Water Resources Research 21(8), 1121-1131.",
  assumptions: [
    "The pumped aquifer is confined above or below by one aquitard, homogeneous, isotropic, of uniform " +
      "thickness and infinite in areal extent; flow in it is horizontal, flow in the aquitard vertical.",
    "The aquitard releases water from its own storage (S' = Ss' b') as well as transmitting leakage; its far " +
      "side is held at constant head by an unpumped aquifer; the other confining bed is impermeable.",
    "The well pumps at a constant rate, fully penetrates the aquifer and has an infinitesimal radius.",
  ],
  validity: [
    "All t > 0, r/B > 0, S' >= 0; S' -> 0 gives Hantush-Jacob (1955).",
    "Early data follow Hantush's H(u, beta) with beta = (r/4B) sqrt(S'/S); late data level off at " +
      "Q / (2 pi T) K0(r/B), reached with an effective storativity near S + S'/3.",
  ],
  cautions: [
    "If the far side of the aquitard is in fact impermeable, or the overlying aquifer's head falls, drawdown " +
      "keeps growing where this model levels off: do not extrapolate yield or dewatering beyond the tested duration.",
    "S' is often poorly determined (strongly correlated with S and B); report it with its interval, or fix it " +
      "from laboratory specific storage times aquitard thickness.",
  ],
  parameters: [transmissivityParameter, storativityParameter, leakageFactorParameter, aquitardStorativityParameter],

  drawdown(p: ArrayLike<number>, geometry: ObservationGeometry, t: ArrayLike<number>, out?: Float64Array): Float64Array {
    const m = hantushAquitardStorageModel;
    checkParameters(m, p);
    checkGeometry(m.name, geometry);
    const [T, S, B, Sa] = [p[0]!, p[1]!, p[2]!, p[3]!];
    const result = outputArray(m.name, t.length, out);
    const coef = geometry.Q / (FOUR_PI * T);
    const tDPerDay = T / (S * geometry.r * geometry.r);
    const rho = geometry.r / B;
    const gamma = Sa / S;
    for (let i = 0; i < t.length; i++) {
      const ti = t[i]!;
      result[i] = ti > 0 ? coef * hantushStorageDimensionless(ti * tDPerDay, rho, gamma) : ti <= 0 ? 0 : Number.NaN;
    }
    return result;
  },

  jacobian(p: ArrayLike<number>, geometry: ObservationGeometry, t: ArrayLike<number>): Float64Array[] {
    const m = hantushAquitardStorageModel;
    checkParameters(m, p);
    checkGeometry(m.name, geometry);
    const [T, S, B, Sa] = [p[0]!, p[1]!, p[2]!, p[3]!];
    const coef = geometry.Q / (FOUR_PI * T);
    const tDPerDay = T / (S * geometry.r * geometry.r);
    const rho = geometry.r / B;
    const gamma = Sa / S;
    const columns = [0, 1, 2, 3].map(() => new Float64Array(t.length));
    const d = new Float64Array(4);
    for (let i = 0; i < t.length; i++) {
      const ti = t[i]!;
      if (!(ti > 0)) {
        if (!(ti <= 0)) for (const column of columns) column[i] = Number.NaN;
        continue;
      }
      hantushStorageDimensionless(ti * tDPerDay, rho, gamma, d);
      // d = [s_D, t_D ds_D/dt_D, ds_D/drho, ds_D/dgamma]; t_D ~ T/S, rho ~ 1/B, gamma ~ Sa/S.
      const s = coef * d[0]!;
      columns[0]![i] = (-s + coef * d[1]!) / T;
      columns[1]![i] = (coef * (-d[1]! - gamma * d[3]!)) / S;
      columns[2]![i] = (-coef * rho * d[2]!) / B;
      columns[3]![i] = (coef * gamma * d[3]!) / Sa;
    }
    return columns;
  },
};

/** One member of the type-curve family: s_D against t_D for one r/B. */
export interface HantushStorageTypeCurve {
  readonly rB: number;
  readonly sD: Float64Array;
}

/** Type curves for one ratio S'/S. */
export interface HantushStorageTypeCurveFamily {
  readonly ratio: number;
  /** t_D = T t / (S r^2) = 1/(4u). */
  readonly tD: Float64Array;
  readonly curves: HantushStorageTypeCurve[];
}

/**
 * Type curves s_D = 4 pi T s / Q against t_D = 1/(4u) (each > 0) for S'/S = `ratio` (>= 0) and each
 * r/B (> 0). Source: Hantush (1960), Laplace form of Moench (1985).
 */
export function hantushStorageTypeCurves(
  tD: ArrayLike<number>,
  ratio: number,
  rB: ArrayLike<number>,
): HantushStorageTypeCurveFamily {
  if (!(Number.isFinite(ratio) && ratio >= 0)) {
    throw new ModelInputError(`hantushStorageTypeCurves: S'/S is ${ratio}; it must be a finite number >= 0.`);
  }
  const x = Float64Array.from(tD);
  for (let i = 0; i < x.length; i++) checkScalar("hantushStorageTypeCurves", `t_D at index ${i}`, x[i]!, "1", true);
  const curves: HantushStorageTypeCurve[] = [];
  for (let k = 0; k < rB.length; k++) {
    const rho = rB[k]!;
    checkScalar("hantushStorageTypeCurves", `r/B at index ${k}`, rho, "1", true);
    curves.push({ rB: rho, sD: x.map((v) => hantushStorageDimensionless(v, rho, ratio)) });
  }
  return { ratio, tD: x, curves };
}
