/**
 * Bessel functions of the first and second kind of orders 0 and 1: J0, J1, Y0, Y1, dimensionless.
 * They enter the slug-test solution of Cooper, Bredehoeft & Papadopulos (1967).
 *
 * Method (module note). For 0 <= x <= 8, with t = 2 (x/8)^2 - 1 and Chebyshev sums S(t) = sum c_k T_k(t):
 *   J0(x) = S_J0(t),  J1(x) = x S_J1(t),  Y0(x) = (2/pi) ln(x) J0(x) + S_Y0(t),
 *   Y1(x) = (2/pi) ln(x) J1(x) - 2/(pi x) + x S_Y1(t);
 * the remainders are entire functions of x^2 (ascending series, DLMF 10.2.2, 10.8.1 and 10.8.2).
 * For x > 8, with w = (8/x)^2 and t = 2w - 1, the Hankel form (DLMF 10.17.3, 10.17.4)
 *   J_n(x) = sqrt(2/(pi x)) [P_n cos(chi) - Q_n sin(chi)],  Y_n(x) = sqrt(2/(pi x)) [P_n sin(chi) + Q_n cos(chi)],
 *   chi = x - n pi/2 - pi/4,  P_n = S_Pn(t),  Q_n = (8/x) S_Qn(t),
 * with cos(chi) and sin(chi) expanded into cos x and sin x so that no multiple of pi is subtracted from x.
 * The coefficients were computed by Chebyshev interpolation at 90 nodes with mpmath at 50 digits and
 * truncated below 1e-18 of the largest coefficient: tests/fixtures/slug/bessel_jy_coefficients.py.
 *
 * Accuracy (packages/aquifer/test/special-bessel-jy.test.ts, against mpmath at 30 digits): relative error
 * below 1e-13 wherever |f(x)| is not small against the envelope M(x) = sqrt(J^2 + Y^2) of its order; near a
 * zero the error is absolute, below 2e-15 M(x) (measured: at most 1.3e-15 M(x); near a zero no double-precision
 * method keeps a relative bound without knowing the zero to extra precision). "Not small": |f| >= 1e-3 M(x).
 */

import { portableCos, portableSin } from "../numerics/portable-math.js";

// 17 terms; first dropped coefficient -1.74e-19
const J0_SMALL = [
  1.5772797147489012e-1, -8.7234423528522213e-3, 2.6517861320333681e-1, -3.7009499387264978e-1,
  1.5806710233209726e-1, -3.4893769411408885e-2, 4.8191800694676045e-3, -4.6062616620627505e-4,
  3.2460328821005081e-5, -1.7619469077621507e-6, 7.6081635924187819e-8, -2.6792535305576729e-9,
  7.8486963144794644e-11, -1.9438346867370166e-12, 4.1253205956343739e-14, -7.5885081254475463e-16,
  1.2218515873961411e-17,
];
// 17 terms; first dropped coefficient -4.94e-21
const J1_SMALL = [
  8.1044846325658115e-2, -1.4897514506765211e-1, 1.609992623572097e-1, -8.2680491766817907e-2,
  2.2213639654966035e-2, -3.646940600769276e-3, 4.0503377283548218e-4, -3.2555548668572585e-5,
  1.9858774049915167e-6, -9.5219847567504362e-8, 3.6871337590971482e-9, -1.1780266226958848e-10,
  3.1601545803480033e-12, -7.2217552396517734e-14, 1.4232144003513942e-15, -2.4441972916190464e-17,
  3.6912682997929333e-19,
];
// 18 terms; first dropped coefficient -5.02e-21
const Y0_SMALL = [
  -3.3146113203284942e-2, -2.7447430552974527e-1, 1.7903431407718266e-1, 2.6156734625504664e-1,
  -1.7730201278114358e-1, 4.7196689595763387e-2, -7.2879624795520792e-3, 7.5311359325777423e-4,
  -5.632079141056987e-5, 3.206532537654801e-6, -1.4407233274018699e-7, 5.2487947873305161e-9,
  -1.5837552541812015e-10, 4.0263308183061208e-12, -8.7473412033107696e-14, 1.6434898714919469e-15,
  -2.6977881152566836e-17, 3.9032584173475983e-19,
];
// 17 terms; first dropped coefficient 1.12e-20
const Y1_SMALL = [
  2.5380132357417817e-3, -1.608717304766875e-2, -9.5912045360830742e-2, 8.4451972596523458e-2,
  -2.8328123944594366e-2, 5.289897544167113e-3, -6.414551451326356e-4, 5.5059828733387438e-5,
  -3.5380800186893499e-6, 1.7707804556154403e-7, -7.1105500498992798e-9, 2.3443379059115164e-10,
  -6.4651518414115942e-12, 1.51429151205002e-13, -3.0511859694473253e-15, 5.3466803857286701e-17,
  -8.2249113720215846e-19,
];
// 14 terms; first dropped coefficient 5.47e-19
const P0_LARGE = [
  9.9946034934751867e-1, -5.3652204681321174e-4, 3.0751847875194746e-6, -5.1705945376060977e-8,
  1.6306464635151383e-9, -7.86409137723707e-11, 5.1682623873491925e-12, -4.3045788699253912e-13,
  4.3265957431549406e-14, -5.0690340959352361e-15, 6.7480722157338737e-16, -1.0011513723467786e-16,
  1.6305919233744185e-17, -2.8808661694828712e-18,
];
// 17 terms; first dropped coefficient 6.84e-21
const Q0_LARGE = [
  -1.5555854605337009e-2, 6.8385199426116496e-5, -7.4144984110606473e-7, 1.7972457247968992e-8,
  -7.27191593686632e-10, 4.2201219046687384e-11, -3.2067474209966347e-12, 3.0061451253517063e-13,
  -3.336328185322427e-14, 4.2552250402454611e-15, -6.09993013164005e-16, 9.6621289703032567e-17,
  -1.6686065214378146e-17, 3.1082440486738144e-18, -6.1911157873581449e-19, 1.3091448717220122e-19,
  -2.9211627152642774e-20,
];
// 14 terms; first dropped coefficient -5.77e-19
const P1_LARGE = [
  1.0009030408600137, 8.9898983308594086e-4, -3.9872843004889085e-6, 6.1776339606442985e-8,
  -1.8718907491063066e-9, 8.8168986595823389e-11, -5.7048636403956447e-12, 4.6991955152305424e-13,
  -4.6842237839904892e-14, 5.4526748960447172e-15, -7.2211808422740179e-16, 1.0667689114335412e-16,
  -1.7312313216116335e-17, 3.0492991197665872e-18,
];
// 16 terms; first dropped coefficient 3.07e-20
const Q1_LARGE = [
  4.6777787069535325e-2, -9.6277235491570793e-5, 9.1386152579554541e-7, -2.0959781384083422e-8,
  8.2291933276505541e-10, -4.6863636881769452e-11, 3.5152187949686081e-12, -3.2643156743278999e-13,
  3.5967765829165292e-14, -4.5612523950772972e-15, 6.508282957783384e-16, -1.0269147531823243e-16,
  1.7676355487764792e-17, -3.2834519872981615e-18, 6.5240811495892603e-19, -1.3765771484849488e-19,
];

const TWO_OVER_PI = 2 / Math.PI;
const SQRT_HALF = Math.SQRT1_2;
const CUT = 8;

/** sum_k c_k T_k(t) by Clenshaw's recurrence. */
function chebyshev(c: readonly number[], t: number): number {
  let b1 = 0;
  let b2 = 0;
  const twoT = 2 * t;
  for (let k = c.length - 1; k >= 1; k--) {
    const b0 = c[k]! + twoT * b1 - b2;
    b2 = b1;
    b1 = b0;
  }
  return c[0]! + t * b1 - b2;
}

function negativeArgument(name: string, x: number): RangeError {
  return new RangeError(
    `${name}(x): x = ${x} is negative; ${name} is real only for x >= 0. Pass the absolute value of a radius-like argument.`,
  );
}

/** P_n, Q_n and sqrt(2/(pi x)) of the Hankel form for x > 8. */
function hankelParts(x: number, p: readonly number[], q: readonly number[]): [number, number, number] {
  const t = (2 * CUT * CUT) / (x * x) - 1;
  return [chebyshev(p, t), (CUT / x) * chebyshev(q, t), Math.sqrt(TWO_OVER_PI / x)];
}

/**
 * Bessel function of the first kind of order zero, J0(x), for any real x (even); dimensionless.
 * J0(0) = 1; J0(+-Infinity) = 0; NaN gives NaN. Source and accuracy: module note (DLMF 10.2.2, 10.17.3).
 */
export function besselJ0(x: number): number {
  const ax = Math.abs(x);
  if (ax <= CUT) return chebyshev(J0_SMALL, (ax * ax) / 32 - 1);
  if (ax === Infinity) return 0;
  const [p, q, amplitude] = hankelParts(ax, P0_LARGE, Q0_LARGE);
  const c = portableCos(ax);
  const s = portableSin(ax);
  // chi = x - pi/4: cos(chi) = (c + s)/sqrt2, sin(chi) = (s - c)/sqrt2.
  return amplitude * SQRT_HALF * (p * (c + s) - q * (s - c));
}

/**
 * Bessel function of the first kind of order one, J1(x), for any real x (odd); dimensionless.
 * J1(0) = 0; J1(+-Infinity) = 0; NaN gives NaN. Source and accuracy: module note (DLMF 10.2.2, 10.17.3).
 */
export function besselJ1(x: number): number {
  const ax = Math.abs(x);
  let v: number;
  if (ax <= CUT) {
    v = ax * chebyshev(J1_SMALL, (ax * ax) / 32 - 1);
  } else if (ax === Infinity) {
    v = 0;
  } else {
    const [p, q, amplitude] = hankelParts(ax, P1_LARGE, Q1_LARGE);
    const c = portableCos(ax);
    const s = portableSin(ax);
    // chi = x - 3pi/4: cos(chi) = (s - c)/sqrt2, sin(chi) = -(s + c)/sqrt2.
    v = amplitude * SQRT_HALF * (p * (s - c) + q * (s + c));
  }
  return x < 0 ? -v : v;
}

/**
 * Bessel function of the second kind of order zero, Y0(x), for x >= 0; dimensionless.
 * Y0(0) = -Infinity; Y0(+Infinity) = 0; NaN gives NaN; RangeError for x < 0.
 * Source and accuracy: module note (DLMF 10.8.2, 10.17.4).
 */
export function besselY0(x: number): number {
  if (x < 0) throw negativeArgument("besselY0", x);
  if (x === 0) return -Infinity;
  if (x <= CUT) {
    const t = (x * x) / 32 - 1;
    return TWO_OVER_PI * Math.log(x) * chebyshev(J0_SMALL, t) + chebyshev(Y0_SMALL, t);
  }
  if (x === Infinity) return 0;
  const [p, q, amplitude] = hankelParts(x, P0_LARGE, Q0_LARGE);
  const c = portableCos(x);
  const s = portableSin(x);
  return amplitude * SQRT_HALF * (p * (s - c) + q * (c + s));
}

/**
 * Bessel function of the second kind of order one, Y1(x), for x >= 0; dimensionless.
 * Y1(0) = -Infinity (Y1(x) ~ -2/(pi x)); Y1(+Infinity) = 0; NaN gives NaN; RangeError for x < 0.
 * Source and accuracy: module note (DLMF 10.8.1, 10.17.4).
 */
export function besselY1(x: number): number {
  if (x < 0) throw negativeArgument("besselY1", x);
  if (x === 0) return -Infinity;
  if (x <= CUT) {
    const t = (x * x) / 32 - 1;
    const j1 = x * chebyshev(J1_SMALL, t);
    return TWO_OVER_PI * (Math.log(x) * j1 - 1 / x) + x * chebyshev(Y1_SMALL, t);
  }
  if (x === Infinity) return 0;
  const [p, q, amplitude] = hankelParts(x, P1_LARGE, Q1_LARGE);
  const c = portableCos(x);
  const s = portableSin(x);
  // Y1 = A [P sin(chi) + Q cos(chi)], chi = x - 3pi/4.
  return amplitude * SQRT_HALF * (-p * (s + c) + q * (s - c));
}

/** The Hankel-form amplitudes of orders 0 and 1 at one argument (x > 8), dimensionless. */
export interface HankelAmplitudes {
  readonly p0: number;
  readonly q0: number;
  readonly p1: number;
  readonly q1: number;
}

/**
 * P0, Q0, P1, Q1 of H_n^(1)(x) = sqrt(2/(pi x)) (P_n + i Q_n) e^(i (x - n pi/2 - pi/4)) (DLMF 10.17.3-4) for
 * x > 8: smooth, non-oscillating functions of x, for quantities such as |x H0 - a H1|^2 whose oscillations cancel
 * exactly. Accuracy: as the module note (the same Chebyshev sums as besselJ0...besselY1 use for x > 8).
 * @throws RangeError for x <= 8 (the expansion is not used there).
 */
export function besselHankelAmplitudes(x: number): HankelAmplitudes {
  if (!(x > CUT)) throw new RangeError(`besselHankelAmplitudes(x): x = ${x}; the Hankel form here needs x > ${CUT}.`);
  const t = (2 * CUT * CUT) / (x * x) - 1;
  return {
    p0: chebyshev(P0_LARGE, t),
    q0: (CUT / x) * chebyshev(Q0_LARGE, t),
    p1: chebyshev(P1_LARGE, t),
    q1: (CUT / x) * chebyshev(Q1_LARGE, t),
  };
}
