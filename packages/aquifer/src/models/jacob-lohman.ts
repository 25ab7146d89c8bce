/**
 * Jacob and Lohman (1952): a well held at a constant drawdown sw (a flowing artesian well discharging at its
 * outlet level, or a well pumped to a fixed level) in a confined, homogeneous, isotropic aquifer of infinite
 * extent. Its discharge declines with time,
 *
 *   Q(t) = 2 pi T sw G(alpha),   alpha = T t / (S rw^2),
 *   G(alpha) = (4 / pi^2) integral_0^inf e^(-alpha x^2) / (x (J0(x)^2 + Y0(x)^2)) dx
 *            = (4 alpha / pi) integral_0^inf x e^(-alpha x^2) [pi/2 + arctan(Y0(x)/J0(x))] dx,
 *
 * and the drawdown around it rises (Hantush 1964; the problem of the region outside a cylinder held at a fixed
 * temperature, Carslaw and Jaeger 1959, section 13.5). Laplace transform (p in 1/d, q = sqrt(S p / T)):
 *   s(r, p) = sw K0(q r) / (p K0(q rw)),   Q(p) = 2 pi T sw q rw K1(q rw) / (p K0(q rw)),
 * inverted by Stehfest's algorithm (N = 14). Limits (tested): for small alpha G = 1/sqrt(pi alpha) + 1/2 + ...;
 * for large alpha G -> 2 / ln(2.25 alpha) (the straight line sw/Q against log t of Jacob and Lohman).
 * Source: Jacob, C.E. and Lohman, S.W. (1952). Nonsteady flow to a well of constant drawdown in an extensive
 * aquifer. Transactions, American Geophysical Union 33(4), 559-569.
 */
import { stehfestCoefficients } from "../numerics/index.js";
import { besselK0e, besselK1e } from "../special/index.js";
import { checkParameters, checkScalar, outputArray } from "./checks.js";
import { ModelInputError } from "./errors.js";
import type { DrawdownModel, ObservationGeometry } from "./model.js";
import { storativityParameter, transmissivityParameter } from "./parameters.js";

/** Stehfest terms of the Jacob-Lohman inversion. */
export const JACOB_LOHMAN_STEHFEST_TERMS = 14;

const WEIGHTS = stehfestCoefficients(JACOB_LOHMAN_STEHFEST_TERMS);
/** Relative tolerance within which r counts as the well radius. */
const SAME_RADIUS = 1e-9;

/** The well of a constant-drawdown test. */
export interface ConstantDrawdownWell {
  /** Effective radius of the well rw, m (> 0). */
  readonly rw: number;
  /** Constant drawdown sw held in the well, m (> 0: the head in the well lies sw below the static head). */
  readonly drawdown: number;
}

/** A Jacob-Lohman model bound to its well. */
export interface JacobLohmanModel extends DrawdownModel {
  readonly well: ConstantDrawdownWell;
}

/**
 * G(alpha) of Jacob and Lohman (1952) for alpha = T t / (S rw^2) > 0 (dimensionless), by Stehfest inversion
 * (N = 14) of its transform sqrt(p) K1(sqrt(p)) / (p K0(sqrt(p))) in alpha. Accuracy: see docs/methods.md.
 * @throws ModelInputError for alpha not finite and > 0.
 */
export function jacobLohmanG(alpha: number): number {
  checkScalar("jacobLohmanG", "alpha", alpha, "1", true);
  const a = Math.LN2 / alpha;
  let sum = 0;
  for (let k = 1; k <= WEIGHTS.length; k++) {
    const x = Math.sqrt(k * a);
    sum += (WEIGHTS[k - 1]! * (x * besselK1e(x))) / (k * a * besselK0e(x));
  }
  return a * sum;
}

/**
 * The Jacob-Lohman (1952) model for a well of radius rw (m) held at constant drawdown sw (m); parameters
 * [T (m2/d), S (1)]. At r = rw (within 1e-9) the output is the well's discharge Q(t) in m3/d; at r > rw the
 * drawdown in m at distance r; both are 0 for t <= 0 (before the drawdown is imposed). geometry.Q is not used.
 * @throws ModelInputError for rw or sw not finite and > 0.
 */
export function jacobLohmanModel(well: ConstantDrawdownWell): JacobLohmanModel {
  const where = "jacobLohmanModel";
  checkScalar(where, "well radius rw", well.rw, "m", true);
  checkScalar(where, "drawdown in the well sw", well.drawdown, "m", true);
  const { rw } = well;
  const sw = well.drawdown;
  const model: JacobLohmanModel = {
    id: "jacob-lohman",
    name: "Jacob-Lohman (1952) well at constant drawdown",
    source:
      "Jacob, C.E. and Lohman, S.W. (1952). Nonsteady flow to a well of constant drawdown in an extensive aquifer. " +
      "Transactions, American Geophysical Union 33(4), 559-569. Drawdown around the well as in Hantush, M.S. (1964), " +
      "Hydraulics of wells, Advances in Hydroscience 1, 281-432.",
    assumptions: [
      "The aquifer is confined, homogeneous, isotropic, of uniform thickness and infinite in areal extent; the " +
        "well penetrates it fully.",
      "From t = 0 the head in the well is held sw below the static head (a flowing well discharging at a fixed " +
        "outlet level, or a pump controlled to a fixed level); the discharge Q(t) follows.",
      "Well losses and storage in the well are neglected; sw is the drawdown in the aquifer at the well face.",
    ],
    validity: [
      "All t > 0. At r = rw the model gives the discharge (m3/d) of the well, elsewhere the drawdown (m): fit a " +
        "discharge record at r = rw and drawdown records at their distances, not both in one fit.",
      "For alpha = T t / (S rw^2) above about 100 the discharge follows the straight line sw/Q = 2.303 / (4 pi T) " +
        "log10(2.25 T t / (S rw^2)) (Jacob and Lohman 1952).",
      "Stehfest inversion (N = 14): G within about 1e-7 relative of its integral form (docs/methods.md).",
    ],
    cautions: [
      "S from the discharge of the well alone depends on the effective well radius; a skin or well loss makes it " +
        "meaningless. Read T from the late slope.",
      "sw must be the drawdown at the well face: for a flowing well the static head above the outlet, measured " +
        "with the well shut in.",
      "The model gives a discharge at r = rw; superposition of pumping rates and rate forecasts do not apply.",
    ],
    parameters: [transmissivityParameter, storativityParameter],
    notSuperposable:
      "it gives the discharge of a well held at a constant drawdown and the drawdown around it, both set by the " +
      "imposed drawdown, not by a pumping rate.",
    well: { rw, drawdown: sw },
    drawdown(p: ArrayLike<number>, g: ObservationGeometry, t: ArrayLike<number>, out?: Float64Array): Float64Array {
      checkParameters(model, p);
      const r = g.r;
      if (!(Number.isFinite(r) && r >= rw * (1 - SAME_RADIUS))) {
        throw new ModelInputError(
          `${model.name}: radial distance r = ${r} m is inside the well (rw = ${rw} m); use r = rw for the well's ` +
            "discharge or the distance of an observation point outside it.",
        );
      }
      const T = p[0]!;
      const S = p[1]!;
      const atWell = r <= rw * (1 + SAME_RADIUS);
      const result = outputArray(model.name, t.length, out);
      const c = Math.sqrt(S / T);
      for (let i = 0; i < t.length; i++) {
        const ti = t[i]!;
        if (!(ti > 0 && Number.isFinite(ti))) {
          result[i] = ti <= 0 ? 0 : Number.NaN;
          continue;
        }
        const a = Math.LN2 / ti;
        let sum = 0;
        for (let k = 1; k <= WEIGHTS.length; k++) {
          const pk = k * a;
          const xw = c * Math.sqrt(pk) * rw;
          const k0w = besselK0e(xw);
          if (atWell) {
            sum += (WEIGHTS[k - 1]! * (xw * besselK1e(xw))) / (pk * k0w);
          } else {
            const x = c * Math.sqrt(pk) * r;
            sum += (WEIGHTS[k - 1]! * besselK0e(x) * Math.exp(xw - x)) / (pk * k0w);
          }
        }
        result[i] = (atWell ? 2 * Math.PI * T * sw : sw) * a * sum;
      }
      return result;
    },
  };
  return model;
}
