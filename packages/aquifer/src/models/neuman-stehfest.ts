/**
 * Gaver-Stehfest inversion of a Laplace transform together with its parameter derivatives, so that a
 * model's Jacobian is the exact derivative of the drawdown it reports (the same weights, the same
 * transform evaluations). Used by the Neuman (1974) and Hantush (1960) Laplace-domain models.
 *
 * With a = ln 2 / t and weights V_k (Stehfest 1970): f(t) ~ a sum_k V_k F(k a). Differentiating that sum,
 *   t df/dt ~ -a sum_k V_k (F(k a) + k a dF/dp(k a)),  df/dq ~ a sum_k V_k dF/dq(k a) for a parameter q.
 */
import { stehfestCoefficients } from "../numerics/index.js";

/**
 * Evaluates a transform at real p > 0: writes F(p) to values[0], dF/dp to values[1] and dF/dq_j to
 * values[2 + j] (only values[0] when `derivatives` is false).
 */
export type TransformWithDerivatives = (p: number, derivatives: boolean, values: Float64Array) => void;

/**
 * Stehfest inversion at time t > 0 (units of the transform's time variable) with `terms` weights (even,
 * 2..20). Writes f(t) to result[0]; with `derivatives`, t df/dt to result[1] and df/dq_j to result[2 + j].
 * `scratch` and `result` have the same length as the transform's `values`.
 * Source: Stehfest (1970), Comm. ACM 13(1), 47-49 (algorithm 368) and its remark, Comm. ACM 13(10), 624.
 */
export function stehfestWithDerivatives(
  transform: TransformWithDerivatives,
  t: number,
  terms: number,
  derivatives: boolean,
  scratch: Float64Array,
  result: Float64Array,
): void {
  const v = stehfestCoefficients(terms);
  const a = Math.LN2 / t;
  result.fill(0);
  const width = derivatives ? result.length : 1;
  for (let k = 1; k <= terms; k++) {
    const p = k * a;
    transform(p, derivatives, scratch);
    const weight = v[k - 1]!;
    result[0]! += weight * scratch[0]!;
    if (!derivatives) continue;
    result[1]! -= weight * (scratch[0]! + p * scratch[1]!);
    for (let j = 2; j < width; j++) result[j]! += weight * scratch[j]!;
  }
  for (let j = 0; j < width; j++) result[j]! *= a;
}
