/**
 * Boulton (1963): drawdown around a fully penetrating well pumping at a constant rate from an unconfined aquifer
 * with delayed yield from storage. Water is released at once by compression (S) and, from the drained zone, with
 * an exponential lag of rate constant alpha (1/d; 1/alpha is Boulton's delay index):
 *
 *   T (d2s/dr2 + (1/r) ds/dr) = S ds/dt + alpha Sy integral_0^t ds/dtau e^(-alpha (t - tau)) dtau.
 *
 * Laplace transform (p in 1/d), with a line-source well:
 *   s(r, p) = Q / (2 pi T p) K0(r m),   m^2 = (S p + Sy alpha p / (alpha + p)) / T,
 * inverted by Stehfest's algorithm (N = 16). Early time: Theis with S; late time: Theis with S + Sy; between
 * them the flat stretch of delayed yield. Boulton's equation is the limit Kz -> infinity (no vertical head
 * loss) of the gradual-drainage water-table model (Moench 1997), which the tests check, and its real-integral
 * form (inverse Hankel transform with the time dependence in closed form) is the mpmath reference.
 * Source: Boulton, N.S. (1963). Analysis of data from non-equilibrium pumping tests allowing for delayed yield
 * from storage. Proceedings of the Institution of Civil Engineers 26(3), 469-482.
 */
import { stehfestCoefficients } from "../numerics/index.js";
import { besselK0, besselK1 } from "../special/index.js";
import { checkGeometry, checkParameters, outputArray } from "./checks.js";
import type { DrawdownModel, ObservationGeometry } from "./model.js";
import { elasticStorativityParameter, specificYieldParameter } from "./neuman.js";
import { transmissivityParameter } from "./parameters.js";
import { drainageConstantParameter } from "./screened-well.js";

/** Stehfest terms of the Boulton inversion. */
export const BOULTON_STEHFEST_TERMS = 16;

const WEIGHTS = stehfestCoefficients(BOULTON_STEHFEST_TERMS);

/** Values and derivatives of the transform at one p, for the Jacobian. */
function transformAndSlopes(T: number, S: number, Sy: number, alpha: number, r: number, Q: number, p: number, out: Float64Array): void {
  const lag = alpha / (alpha + p);
  const D = S * p + Sy * p * lag;
  const x = r * Math.sqrt(D / T);
  const k0 = besselK0(x);
  const k1 = besselK1(x);
  const a = Q / (2 * Math.PI * T * p);
  const sbar = a * k0;
  // d x / d D = r^2 / (2 x T); d sbar / d x = -a K1(x).
  const dxdD = (r * r) / (2 * x * T);
  out[0] = sbar;
  out[1] = -sbar / T + a * k1 * (x / (2 * T));
  out[2] = -a * k1 * dxdD * p;
  out[3] = -a * k1 * dxdD * p * lag;
  out[4] = -a * k1 * dxdD * (Sy * p * p) / ((alpha + p) * (alpha + p));
}

/** Boulton (1963) delayed-yield model; parameters [T (m2/d), S (1), Sy (1), alpha (1/d)]. Drawdown in m, t in d. */
export const boultonModel: DrawdownModel = {
  id: "boulton",
  name: "Boulton (1963) unconfined aquifer with delayed yield",
  source:
    "Boulton, N.S. (1963). Analysis of data from non-equilibrium pumping tests allowing for delayed yield from " +
    "storage. Proceedings of the Institution of Civil Engineers 26(3), 469-482.",
  assumptions: [
    "The aquifer is unconfined, homogeneous, isotropic, of uniform thickness and infinite in areal extent; the " +
      "well penetrates it fully, has an infinitesimal radius and pumps at a constant rate.",
    "Water comes from elastic storage (S) at once and from drainage of the zone above the falling water table " +
      "(Sy) with an exponential lag of rate constant alpha; there is no vertical head loss in the aquifer.",
    "Drawdown is small compared with the saturated thickness.",
  ],
  validity: [
    "All t > 0 at observation points (r > 0). Early data follow Theis with S, late data Theis with S + Sy.",
    "Stehfest inversion (N = 16): within 1e-5 relative of the real-integral form where s exceeds 1 % of its late value, 3e-4 below (docs/methods.md).",
  ],
  cautions: [
    "alpha is an empirical constant of the model, not a property measured elsewhere; Neuman (1974) explained the " +
      "delayed response by vertical flow instead, and the two models read the flat stretch differently.",
    "Sy from a test that ends on the flat stretch is not determined; do not project long-term yield from it.",
    "For comparison with older reports; for new analyses prefer a model with vertical flow (Neuman 1974, Moench 1997).",
  ],
  parameters: [transmissivityParameter, elasticStorativityParameter, specificYieldParameter, drainageConstantParameter],

  drawdown(p: ArrayLike<number>, g: ObservationGeometry, t: ArrayLike<number>, out?: Float64Array): Float64Array {
    checkParameters(boultonModel, p);
    checkGeometry(boultonModel.name, g);
    const T = p[0]!;
    const S = p[1]!;
    const Sy = p[2]!;
    const alpha = p[3]!;
    const result = outputArray(boultonModel.name, t.length, out);
    const a0 = g.Q / (2 * Math.PI * T);
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
        const m = Math.sqrt((S * pk + (Sy * pk * alpha) / (alpha + pk)) / T);
        sum += (WEIGHTS[k - 1]! * besselK0(g.r * m)) / pk;
      }
      result[i] = a0 * a * sum;
    }
    return result;
  },

  jacobian(p: ArrayLike<number>, g: ObservationGeometry, t: ArrayLike<number>): Float64Array[] {
    checkParameters(boultonModel, p);
    checkGeometry(boultonModel.name, g);
    const columns = [0, 1, 2, 3].map(() => new Float64Array(t.length));
    const v = new Float64Array(5);
    for (let i = 0; i < t.length; i++) {
      const ti = t[i]!;
      if (!(ti > 0 && Number.isFinite(ti))) {
        for (const c of columns) c[i] = ti <= 0 ? 0 : Number.NaN;
        continue;
      }
      const a = Math.LN2 / ti;
      const sums = [0, 0, 0, 0];
      for (let k = 1; k <= WEIGHTS.length; k++) {
        transformAndSlopes(p[0]!, p[1]!, p[2]!, p[3]!, g.r, g.Q, k * a, v);
        for (let j = 0; j < 4; j++) sums[j]! += WEIGHTS[k - 1]! * v[j + 1]!;
      }
      for (let j = 0; j < 4; j++) columns[j]![i] = a * sums[j]!;
    }
    return columns;
  },
};
