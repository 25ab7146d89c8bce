/**
 * Laplace-domain drawdown of Hantush (1960) for a leaky aquifer with storage in the aquitard, the far side
 * of the aquitard held at constant head (Moench 1985, case of a constant-head source bed), with its partial
 * derivatives.
 *
 * Dimensionless: t_D = T t / (S r^2) (= 1/(4u)), rho = r/B, gamma = S'/S, s_D = 4 pi T s / Q. With p
 * conjugate to t_D:
 *   F(p) = (2/p) K0(x),  x^2 = p + rho^2 g(y),  g(y) = y coth y,  y = sqrt(p gamma) / rho.
 * It follows from the aquitard's one-dimensional diffusion K' d2s'/dz2 = Ss' ds'/dt with s' = s at the aquifer
 * and s' = 0 at the far side: the leakage into the aquifer is (K'/b') g(y) s in Laplace space, with
 * y = b' sqrt(Ss' p_phys / K'). gamma -> 0 gives g = 1, the Hantush-Jacob (1955) transform.
 */
import { besselK0, besselK1 } from "../special/index.js";

/** g(y) = y coth y and g'(y) = coth y - y / sinh^2 y, with series below y = 1e-3 (cancellation). */
function cothTerms(y: number): { g: number; dg: number } {
  if (y < 1e-3) {
    const y2 = y * y;
    return { g: 1 + y2 / 3 - (y2 * y2) / 45, dg: (2 * y) / 3 - (4 * y * y2) / 45 };
  }
  if (y > 20) return { g: y, dg: 1 };
  const tanh = Math.tanh(y);
  const sinh = Math.sinh(y);
  return { g: y / tanh, dg: 1 / tanh - y / (sinh * sinh) };
}

/**
 * Writes F(p) to values[0] and, with `derivatives`, dF/dp, dF/drho and dF/dgamma to values[1..3], for real
 * p > 0, rho > 0, gamma >= 0. Dimensionless; accuracy that of besselK0/besselK1 (about 1e-15 relative).
 */
export function leakyStorageTransform(
  p: number,
  rho: number,
  gamma: number,
  derivatives: boolean,
  values: Float64Array,
): void {
  const y = Math.sqrt(p * gamma) / rho;
  const { g, dg } = cothTerms(y);
  const rho2 = rho * rho;
  const x = Math.sqrt(p + rho2 * g);
  const k0 = besselK0(x);
  values[0] = (2 * k0) / p;
  if (!derivatives) return;
  // dF/dq = -(2/p) K1(x) d(x^2)/dq / (2x), plus the explicit -F/p for q = p.
  const factor = (-2 * besselK1(x)) / (p * 2 * x);
  const dx2dp = 1 + rho2 * dg * (y / (2 * p));
  const dx2drho = 2 * rho * g - rho2 * dg * (y / rho);
  const dx2dgamma = gamma > 0 ? rho2 * dg * (y / (2 * gamma)) : (rho2 * (2 / 3) * (p / rho2)) / 2;
  values[1] = -values[0]! / p + factor * dx2dp;
  values[2] = factor * dx2drho;
  values[3] = factor * dx2dgamma;
}
