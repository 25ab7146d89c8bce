/**
 * Match-point arithmetic of the Hantush-Jacob and Neuman type curves, so that a hand match from an older report
 * can be reproduced and checked: from one point read on both the type-curve axes and the data axes, the
 * parameters follow; and the reading itself is checked against the type curve computed here (a point read
 * off the sheet should lie on the curve it was matched to).
 *
 * Hantush-Jacob (1955): s = Q W(u, r/B) / (4 pi T), u = r^2 S / (4 T t)  =>  T = Q W / (4 pi s),
 *   S = 4 T t u / r^2, B = r / (r/B), leakance K'/b' = T / B^2.
 * Neuman (1974): s = Q s_D / (4 pi T); type A (early) abscissa t_s = T t / (S r^2), type B (late) t_y =
 *   T t / (Sy r^2); beta = (Kz/Kr) r^2 / b^2  =>  T = Q s_D / (4 pi s), S = T t / (t_s r^2) or
 *   Sy = T t / (t_y r^2), Kz/Kr = beta b^2 / r^2.
 * Sources: Hantush and Jacob (1955), Trans. AGU 36(1), 95-100; Neuman (1975), Water Resources Research 11(2),
 * 329-342 (the type-curve procedure); the overlay itself is common practice, no source.
 */
import { hantushW } from "../wells/index.js";
import { checkScalar } from "./checks.js";
import { neumanDimensionless } from "./neuman.js";

/** A Hantush-Jacob match point: type-curve reading (W, u on the curve r/B) and data reading (s in m, t in d). */
export interface HantushJacobMatchInput {
  /** Pumping rate, m3/d, and distance of the observation well, m. */
  readonly Q: number;
  readonly r: number;
  /** Type-curve ordinate W(u, r/B) and abscissa u (the reciprocal of 1/u on the sheet); the curve's r/B. */
  readonly W: number;
  readonly u: number;
  readonly rB: number;
  /** Data ordinate (m) and abscissa (d) of the same point. */
  readonly s: number;
  readonly t: number;
}

/** Parameters from a Hantush-Jacob match and the check of the reading. */
export interface HantushJacobMatchResult {
  /** Transmissivity, m2/d; storativity; leakage factor B, m; leakance K'/b', 1/d. */
  readonly T: number;
  readonly S: number;
  readonly B: number;
  readonly leakance: number;
  /** W(u, r/B) computed at the reading's u and r/B. */
  readonly Wcomputed: number;
  /** W read / W computed - 1: how far the reading lies off the curve (a few % is a careful hand match). */
  readonly readingError: number;
}

/**
 * T (m2/d), S, B (m) and leakance (1/d) from a Hantush-Jacob match point, with the check of the reading against
 * W(u, r/B) computed by the library (hantushW). All inputs finite and > 0. Source: module comment.
 */
export function hantushJacobMatchPoint(input: HantushJacobMatchInput): HantushJacobMatchResult {
  const where = "hantushJacobMatchPoint";
  for (const [name, v, unit] of [["pumping rate Q", input.Q, "m3/d"], ["radial distance r", input.r, "m"], ["type-curve W", input.W, "1"], ["type-curve u", input.u, "1"], ["curve r/B", input.rB, "1"], ["drawdown s", input.s, "m"], ["time t", input.t, "d"]] as const) {
    checkScalar(where, name, v, unit, true);
  }
  const T = (input.Q * input.W) / (4 * Math.PI * input.s);
  const S = (4 * T * input.t * input.u) / (input.r * input.r);
  const B = input.r / input.rB;
  const Wcomputed = hantushW(input.u, input.rB);
  return { T, S, B, leakance: T / (B * B), Wcomputed, readingError: input.W / Wcomputed - 1 };
}

/** A Neuman match point on the early (type A) or late (type B) branch. */
export interface NeumanMatchInput {
  /** Pumping rate (m3/d), distance (m) and saturated thickness b (m). */
  readonly Q: number;
  readonly r: number;
  readonly b: number;
  /** Branch: "A" reads t_s = T t / (S r^2), "B" reads t_y = T t / (Sy r^2) on the abscissa. */
  readonly branch: "A" | "B";
  /** Type-curve ordinate s_D, abscissa (t_s or t_y, dimensionless), curve beta and sigma = S/Sy of the sheet. */
  readonly sD: number;
  readonly tDimensionless: number;
  readonly beta: number;
  readonly sigma: number;
  /** Data ordinate (m) and abscissa (d). */
  readonly s: number;
  readonly t: number;
}

/** Parameters from a Neuman match and the check of the reading. */
export interface NeumanMatchResult {
  /** Transmissivity, m2/d; S (branch A) or Sy (branch B); Kz/Kr from beta. */
  readonly T: number;
  readonly storage: { readonly name: "S" | "Sy"; readonly value: number };
  readonly KzKr: number;
  /** s_D computed at the reading (neumanDimensionless, with t_s = t_y / sigma on branch B). */
  readonly sDcomputed: number;
  /** s_D read / s_D computed - 1. */
  readonly readingError: number;
}

/**
 * T (m2/d), S or Sy, and Kz/Kr = beta b^2 / r^2 from a Neuman match point, with the check of the reading against
 * s_D computed by the library. All inputs finite and > 0. Source: module comment.
 */
export function neumanMatchPoint(input: NeumanMatchInput): NeumanMatchResult {
  const where = "neumanMatchPoint";
  for (const [name, v, unit] of [["pumping rate Q", input.Q, "m3/d"], ["radial distance r", input.r, "m"], ["thickness b", input.b, "m"], ["type-curve s_D", input.sD, "1"], ["type-curve time", input.tDimensionless, "1"], ["beta", input.beta, "1"], ["sigma", input.sigma, "1"], ["drawdown s", input.s, "m"], ["time t", input.t, "d"]] as const) {
    checkScalar(where, name, v, unit, true);
  }
  const T = (input.Q * input.sD) / (4 * Math.PI * input.s);
  const value = (T * input.t) / (input.tDimensionless * input.r * input.r);
  const ts = input.branch === "A" ? input.tDimensionless : input.tDimensionless / input.sigma;
  const sDcomputed = neumanDimensionless(ts, input.sigma, input.beta);
  return {
    T,
    storage: { name: input.branch === "A" ? "S" : "Sy", value },
    KzKr: (input.beta * input.b * input.b) / (input.r * input.r),
    sDcomputed,
    readingError: input.sD / sDcomputed - 1,
  };
}
