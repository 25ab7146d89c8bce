/**
 * The slug-test type curve of Cooper, Bredehoeft & Papadopulos (1967) for a fully penetrating well of finite
 * diameter in a confined aquifer:
 *
 *   H/H0 = (8 alpha / pi^2) integral_0^inf exp(-beta u^2 / alpha) / (u f(u)) du,
 *   f(u) = [u J0(u) - 2 alpha J1(u)]^2 + [u Y0(u) - 2 alpha Y1(u)]^2,
 *   alpha = rw^2 S / rc^2,  beta = T t / rc^2.
 *
 * Source: Cooper, H.H., Bredehoeft, J.D. & Papadopulos, I.S. (1967). Response of a finite-diameter well to an
 * instantaneous charge of water. Water Resources Research 3(1), 263-269.
 *
 * Evaluation (module note):
 * - f(u) = |u H0(u) - 2 alpha H1(u)|^2 with H_n the Hankel functions, so the integrand does not oscillate: the
 *   oscillations of J and Y cancel in the sum of squares. For u > 8 f is computed from the Hankel amplitudes as
 *   (2/(pi u)) [(u P0 - 2 alpha Q1)^2 + (u Q0 + 2 alpha P1)^2], with no trigonometric function at all.
 * - The integral is taken in v = ln u (du/u = dv), H/H0 = (8 alpha/pi^2) integral exp(-beta e^(2v)/alpha)/f dv,
 *   by adaptive Gauss-Kronrod quadrature over panels split where the integrand changes character: near
 *   u = sqrt(alpha) (where u Y0 - 2 alpha Y1 changes sign and the integrand peaks), u = 1, u = 8 and
 *   u = sqrt(alpha/beta) (where the exponential cuts off).
 * - u -> 0 end: f ~ 16 alpha^2 / (pi^2 u^2), so the integrand in v vanishes like u^2; the part below
 *   u0 = 1e-8 min(1, sqrt alpha) is u0^2/(4 alpha) <= 2.5e-17 and is left out.
 * - u -> inf end: the integrand in v decays like (pi/2)/u times the exponential; the range ends where
 *   beta u^2/alpha = 46 (exp < 1e-20) or at u = 1e16 max(1, alpha) (tail below 4 alpha/(pi u) <= 1.3e-16).
 * Accuracy: within 1e-12 relative (measured: 1.0e-13 relative, 1.1e-15 absolute) of an independent mpmath evaluation over
 * alpha = 1e-10..0.1 and beta = 1e-4..1e3 (packages/aquifer/test/slug-cbp.test.ts).
 */

import { integrate } from "../numerics/quadrature.js";
import { besselHankelAmplitudes, besselJ0, besselJ1, besselY0, besselY1 } from "../special/bessel-jy.js";
import { SlugTestInputError } from "./errors.js";

/** f(u) = [u J0 - 2a J1]^2 + [u Y0 - 2a Y1]^2, dimensionless. */
export function cbpDenominator(u: number, alpha: number): number {
  if (u > 8) {
    const h = besselHankelAmplitudes(u);
    const re = u * h.p0 - 2 * alpha * h.q1;
    const im = u * h.q0 + 2 * alpha * h.p1;
    return (2 / (Math.PI * u)) * (re * re + im * im);
  }
  const a = u * besselJ0(u) - 2 * alpha * besselJ1(u);
  const b = u * besselY0(u) - 2 * alpha * besselY1(u);
  return a * a + b * b;
}

function checkArguments(alpha: number, beta: number): void {
  if (!(Number.isFinite(alpha) && alpha > 0)) {
    throw new SlugTestInputError(
      `Cooper-Bredehoeft-Papadopulos: alpha = rw^2 S / rc^2 = ${alpha}; it must be a positive number (S > 0, radii > 0).`,
    );
  }
  if (!(beta >= 0) || beta === Infinity) {
    throw new SlugTestInputError(
      `Cooper-Bredehoeft-Papadopulos: beta = T t / rc^2 = ${beta}; it must be finite and >= 0 (time since the slug, >= 0).`,
    );
  }
}

/**
 * Normalized head H/H0 in the well of a slug test after Cooper, Bredehoeft & Papadopulos (1967), for
 * alpha = rw^2 S / rc^2 > 0 and beta = T t / rc^2 >= 0 (both dimensionless). H/H0 = 1 at beta = 0 and falls
 * to 0 as beta grows. Accuracy: module note (1e-12 relative against mpmath). About 0.6 ms per value.
 * @throws SlugTestInputError for alpha <= 0 or beta < 0.
 */
export function cbpNormalizedHead(alpha: number, beta: number): number {
  checkArguments(alpha, beta);
  const uLow = 1e-8 * Math.min(1, Math.sqrt(alpha));
  const uCap = 1e16 * Math.max(1, alpha);
  const uHigh = beta > 0 ? Math.min(uCap, Math.sqrt((46 * alpha) / beta)) : uCap;
  if (uHigh <= uLow) return 0;
  const vLow = Math.log(uLow);
  const vHigh = Math.log(uHigh);
  const scale = (8 * alpha) / (Math.PI * Math.PI);
  const ratio = beta / alpha;
  const integrand = (v: number): number => {
    const u = Math.exp(v);
    const decay = ratio === 0 ? 1 : Math.exp(-ratio * u * u);
    return decay === 0 ? 0 : decay / cbpDenominator(u, alpha);
  };
  const marks = [0.5 * Math.log(alpha) - 1, 0.5 * Math.log(alpha), 0.5 * Math.log(alpha) + 1, 0, Math.log(8)];
  if (beta > 0) marks.push(0.5 * Math.log(alpha / beta));
  const points = [vLow, ...marks.filter((v) => v > vLow && v < vHigh).sort((a, b) => a - b), vHigh];
  let sum = 0;
  for (let i = 0; i + 1 < points.length; i++) {
    if (points[i + 1]! - points[i]! < 1e-12) continue;
    sum += integrate(integrand, points[i]!, points[i + 1]!, {
      relTol: 1e-12,
      absTol: 1e-16 / scale,
      maxSubdivisions: 200,
    }).value;
  }
  return scale * sum;
}
