/**
 * Gringarten, Ramey and Raghavan (1974): drawdown for a well intersecting a single vertical fracture of
 * half-length xf in a confined, homogeneous, isotropic aquifer, the fracture fully penetrating and the flux
 * into it uniform along its length (uniform-flux fracture), as the superposition of line sinks along the
 * fracture (x axis, well at the origin):
 *
 *   s(x, y, t) = Q / (8 pi T xf) integral_{-xf}^{xf} E1(((x - xi)^2 + y^2) S / (4 T t)) d xi.
 *
 * On the fracture's line (y = 0) the integral is closed form: with c = S / (4 T t) and
 * F(L) = sign(L) (|L| E1(c L^2) + sqrt(pi / c) erf(sqrt(c) |L|)) (integration by parts),
 * s = Q / (8 pi T xf) (F(xf + x) + F(xf - x)). Early time: s = (Q / (2 xf)) sqrt(t / (pi T S)) at the well
 * (linear flow, half slope); late time: radial flow with slope Q / (4 pi T) per ln t.
 * Infinite-conductivity fracture: approximated, after Gringarten et al. (1974), by the uniform-flux solution
 * evaluated at x = 0.732 xf on the fracture (from memory; at late time it makes the fracture an equivalent
 * well of radius xf / 2, checked in the tests).
 * Source: Gringarten, A.C., Ramey, H.J. Jr. and Raghavan, R. (1974). Unsteady-state pressure distributions
 * created by a well with a single infinite-conductivity vertical fracture. Society of Petroleum Engineers
 * Journal 14(4), 347-360; Gringarten, A.C. and Witherspoon, P.A. (1972), IASH-AIRH Symposium on percolation
 * through fissured rock, T3-B, 1-9.
 */
import { integrate } from "../numerics/index.js";
import { expint1 } from "../special/index.js";
import { checkParameters, checkScalar, outputArray } from "./checks.js";
import { ModelInputError } from "./errors.js";
import type { DrawdownModel, ObservationGeometry } from "./model.js";
import { storativityParameter, transmissivityParameter } from "./parameters.js";

/** Error function erf(x), x >= 0: series with positive terms below 3, continued fraction for erfc above. */
function erf(x: number): number {
  if (x >= 6) return 1;
  if (x < 3) {
    // erf x = (2/sqrt(pi)) e^(-x^2) sum_n 2^n x^(2n+1) / (1 3 5 ... (2n+1)) (A&S 7.1.6).
    let term = x;
    let sum = x;
    for (let n = 1; n < 200; n++) {
      term *= (2 * x * x) / (2 * n + 1);
      sum += term;
      if (term < 1e-17 * sum) break;
    }
    return (2 / Math.sqrt(Math.PI)) * Math.exp(-x * x) * sum;
  }
  // erfc x = e^(-x^2)/sqrt(pi) / (x + (1/2)/(x + 1/(x + (3/2)/(x + ...)))) (A&S 7.1.14), evaluated backwards.
  let f = x;
  for (let k = 60; k >= 1; k--) f = x + k / 2 / f;
  return 1 - Math.exp(-x * x) / (Math.sqrt(Math.PI) * f);
}

/** F(L) of the module comment for c > 0, in m. */
function lineIntegral(L: number, c: number): number {
  const a = Math.abs(L);
  if (a === 0) return 0;
  return Math.sign(L) * (a * expint1(c * a * a) + Math.sqrt(Math.PI / c) * erf(Math.sqrt(c) * a));
}

/** Options of the fracture model. */
export interface FractureGeometry {
  /** Fracture half-length xf, m (> 0). */
  readonly halfLength: number;
  /** "uniform-flux" (default) or "infinite-conductivity" (the 0.732 xf approximation, pumped well only). */
  readonly conductivity?: "uniform-flux" | "infinite-conductivity";
}

/** Position at which the model evaluates a record: plan coordinates, or the pumped well. */
function pointOf(g: ObservationGeometry, xf: number, infinite: boolean): { x: number; y: number } {
  if (Number.isFinite(g.x) && Number.isFinite(g.y)) return { x: g.x!, y: g.y! };
  return { x: infinite ? 0.732 * xf : 0, y: 0 };
}

/**
 * Gringarten et al. (1974) single vertical fracture of half-length xf (m); parameters [T (m2/d), S]. A record
 * with plan coordinates geometry.x (along the fracture) and geometry.y (across it), m from the well, is an
 * observation point; without them it is the pumped well. Drawdown in m at t in d.
 * @throws ModelInputError for xf <= 0 or an unknown conductivity.
 */
export function gringartenFractureModel(geometry: FractureGeometry): DrawdownModel & { geometry: FractureGeometry } {
  const where = "gringartenFractureModel";
  checkScalar(where, "fracture half-length", geometry.halfLength, "m", true);
  const kind = geometry.conductivity ?? "uniform-flux";
  if (kind !== "uniform-flux" && kind !== "infinite-conductivity") {
    throw new ModelInputError(`${where}: conductivity is ${String(kind)}; use "uniform-flux" or "infinite-conductivity".`);
  }
  const xf = geometry.halfLength;
  const infinite = kind === "infinite-conductivity";
  const model: DrawdownModel & { geometry: FractureGeometry } = {
    id: "gringarten-fracture",
    name: `Gringarten (1974) single vertical fracture, ${kind}`,
    source:
      "Gringarten, A.C., Ramey, H.J. Jr. and Raghavan, R. (1974). Unsteady-state pressure distributions created by a " +
      "well with a single infinite-conductivity vertical fracture. SPE Journal 14(4), 347-360. Gringarten, A.C. and " +
      "Witherspoon, P.A. (1972). A method of analyzing pump test data from fractured aquifers. IASH-AIRH Symposium " +
      "on Percolation through Fissured Rock, T3-B, 1-9.",
    assumptions: [
      "The aquifer is confined, homogeneous, isotropic and infinite; the well intersects one vertical fracture of " +
        "half-length xf that spans the aquifer thickness, symmetric about the well.",
      infinite
        ? "The fracture has infinite conductivity; approximated by the uniform-flux solution at x = 0.732 xf (common practice)."
        : "Water enters the fracture at a uniform rate per unit length (uniform-flux fracture); the fracture stores no water.",
      "The well pumps at a constant rate; well-bore storage and skin are neglected.",
    ],
    validity: [
      "All t > 0. Early data show linear flow (s ~ sqrt(t), half slope); late data radial flow (slope Q/(4 pi T) " +
        "per ln t), the transition near t = S xf^2 / T.",
    ],
    cautions: [
      "A half slope also comes from flow in a channel between parallel boundaries; the geology decides.",
      "xf and S trade off in the pumped well; an observation point fixes S.",
      "Finite-conductivity fractures (quarter slope, bilinear flow) are not represented.",
    ],
    parameters: [transmissivityParameter, storativityParameter],
    directional: true,
    geometry,
    drawdown(p: ArrayLike<number>, g: ObservationGeometry, t: ArrayLike<number>, out?: Float64Array): Float64Array {
      checkParameters(model, p);
      if (!Number.isFinite(g.Q)) throw new ModelInputError(`${model.name}: pumping rate Q is ${g.Q} m3/d; it must be finite.`);
      const T = p[0]!;
      const S = p[1]!;
      const { x, y } = pointOf(g, xf, infinite);
      const coef = g.Q / (8 * Math.PI * T * xf);
      const result = outputArray(model.name, t.length, out);
      for (let i = 0; i < t.length; i++) {
        const ti = t[i]!;
        if (!(ti > 0 && Number.isFinite(ti))) {
          result[i] = ti <= 0 ? 0 : Number.NaN;
          continue;
        }
        const c = S / (4 * T * ti);
        if (y === 0) {
          result[i] = coef * (lineIntegral(xf + x, c) + lineIntegral(xf - x, c));
        } else {
          const f = (xi: number) => expint1(((x - xi) * (x - xi) + y * y) * c);
          result[i] = coef * integrate(f, -xf, xf, { relTol: 1e-11, absTol: 0 }).value;
        }
      }
      return result;
    },
  };
  return model;
}
