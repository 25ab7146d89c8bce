/**
 * Match-point arithmetic of Theis type-curve matching: once the data plot (s against t, log-log) is laid on
 * the type curve (W against 1/u), any point read on both axes gives T and S.
 *
 *   T = Q W / (4 pi s),  S = 4 T t u / r^2.
 *
 * Source: Theis (1935), rearranged; the overlay procedure is common practice, no source.
 */
import { checkScalar } from "./checks.js";

/** One match point: a pair read on the type-curve axes and the same point on the data axes. */
export interface TheisMatchPointInput {
  /** Pumping rate, m3/d. */
  readonly Q: number;
  /** Distance of the observation point, m. */
  readonly r: number;
  /** Type-curve ordinate W(u) at the match point, dimensionless. */
  readonly W: number;
  /** u at the match point, dimensionless (the reciprocal of the abscissa 1/u read on the type-curve sheet). */
  readonly u: number;
  /** Data ordinate: drawdown at the match point, m. */
  readonly s: number;
  /** Data abscissa: time at the match point, d. */
  readonly t: number;
}

/** Transmissivity (m2/d) and storativity from a match point. */
export interface TheisMatchPointResult {
  readonly T: number;
  readonly S: number;
}

/**
 * T = Q W / (4 pi s) in m2/d and S = 4 T t u / r^2 from a Theis match point (all inputs finite and > 0).
 * Source: Theis (1935).
 */
export function theisMatchPoint(input: TheisMatchPointInput): TheisMatchPointResult {
  const where = "theisMatchPoint";
  checkScalar(where, "pumping rate Q", input.Q, "m3/d", true);
  checkScalar(where, "radial distance r", input.r, "m", true);
  checkScalar(where, "type-curve W", input.W, "1", true);
  checkScalar(where, "type-curve u", input.u, "1", true);
  checkScalar(where, "drawdown s", input.s, "m", true);
  checkScalar(where, "time t", input.t, "d", true);
  const T = (input.Q * input.W) / (4 * Math.PI * input.s);
  const S = (4 * T * input.t * input.u) / (input.r * input.r);
  return { T, S };
}
