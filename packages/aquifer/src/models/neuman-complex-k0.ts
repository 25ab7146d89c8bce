/**
 * K0(z) for complex z with Re z > 0 in plain re/im arithmetic, for the Neuman series at complex p
 * (neuman-early-laplace.ts): the algorithm of `besselK0Complex` (numerics/besselK0Complex.ts) with every
 * operation of its complex records written out on re/im pairs in the same order, so that it returns the same
 * bits without a record per operation. For |z| > 2 Steed's continued fraction CF2 (Thompson & Barnett 1987,
 * J. Comput. Phys. 64:490), K0(z) = sqrt(pi/(2z)) e^(-z) / s; for |z| <= 2 `besselK0Complex` itself (its
 * ascending series, Abramowitz & Stegun 9.6.13). Accuracy as `besselK0Complex`'s (2.4e-15 relative against
 * mpmath over 1e-3 <= |z| <= 200). The exponential uses portableCos and portableSin as the library's complex
 * exponential does, so Node and the page give the same bits, and moduli use `hypot` below (the bits of
 * Math.hypot).
 */
import { besselK0Complex, complex } from "../numerics/index.js";
import { portableCos, portableSin } from "../numerics/portable-math.js";

/** A complex value written in place: re + i im. */
export interface ComplexScratch {
  re: number;
  im: number;
}

const MAX_TERMS = 500;

/**
 * The coefficients of CF2 that depend on the iteration i alone, formed once by the same operations as the
 * reference forms them in every call: a_i = a_(i-1) - 2 (i - 1) from -1/4, c_i = c_(i-1) (-a_i / i) from 1/4 (its
 * imaginary part stays 0) and 1 / a_i. Two divisions an iteration fewer, the same bits.
 */
const CF_C = new Float64Array(MAX_TERMS + 1);
const CF_A = new Float64Array(MAX_TERMS + 1);
const CF_INVERSE = new Float64Array(MAX_TERMS + 1);
{
  let a = -0.25;
  let c = 0.25;
  for (let i = 2; i <= MAX_TERMS; i++) {
    a -= 2 * (i - 1);
    c = c * (-a / i);
    CF_A[i] = a;
    CF_C[i] = c;
    CF_INVERSE[i] = 1 / a;
  }
}

/**
 * Math.hypot(a, b) for two arguments, the same bits as Node's, at about a sixth of its cost: the arguments scaled
 * by the larger magnitude, their squares summed and the square root scaled back (V8's compensated sum, recalled
 * from memory, reduces to one addition for two arguments, the compensation of the first being 0). Checked bit for
 * bit against Math.hypot on 10^5 arguments spread over 60 decades (models-neuman-early.test.ts). Only IEEE
 * arithmetic and Math.sqrt, so it gives the same bits in every engine. Infinite or NaN arguments go to Math.hypot.
 */
export function hypot(a: number, b: number): number {
  const x = Math.abs(a);
  const y = Math.abs(b);
  if (!(x < Infinity && y < Infinity)) return Math.hypot(a, b);
  // The larger argument divided by itself is exactly 1.
  if (x >= y) {
    if (x === 0) return 0;
    const v = y / x;
    return Math.sqrt(1 + v * v) * x;
  }
  const u = x / y;
  return Math.sqrt(u * u + 1) * y;
}

/**
 * hypot(aRe, aIm) < scale * hypot(bRe, bIm) (`orEqual`: <=) for scale in [1e-20, 1], the same decision: from
 * the squared moduli when they are more than 1e-12 relative from the boundary (their rounding errors are below
 * 1e-15, and where |b|^2 lies outside [1e-250, 1e250] they are not used), else from `hypot`.
 */
export function modulusBelow(aRe: number, aIm: number, scale: number, bRe: number, bIm: number, orEqual: boolean): boolean {
  const bb = bRe * bRe + bIm * bIm;
  if (bb >= 1e-250 && bb <= 1e250) {
    const aa = aRe * aRe + aIm * aIm;
    const threshold = scale * scale * bb;
    if (aa < threshold * (1 - 1e-12)) return true;
    if (aa > threshold * (1 + 1e-12)) return false;
  }
  return orEqual ? hypot(aRe, aIm) <= scale * hypot(bRe, bIm) : hypot(aRe, aIm) < scale * hypot(bRe, bIm);
}

/** Scratch of `divide`. */
const Q = { re: 0, im: 0 };

/** (aRe + i aIm) / (bRe + i bIm) into Q by Smith's algorithm, the operations of `cdiv` (numerics/complex.ts). */
export function divide(aRe: number, aIm: number, bRe: number, bIm: number, out: ComplexScratch = Q): void {
  if (Math.abs(bRe) >= Math.abs(bIm)) {
    const r = bIm / bRe;
    const d = bRe + bIm * r;
    out.re = (aRe + aIm * r) / d;
    out.im = (aIm - aRe * r) / d;
    return;
  }
  const r = bRe / bIm;
  const d = bRe * r + bIm;
  out.re = (aRe * r + aIm) / d;
  out.im = (aIm * r - aRe) / d;
}

/**
 * Writes K0(re + i im) into `out` for finite z with Re z > 0 (dimensionless), the same bits as
 * `besselK0Complex` (module comment). Source: Thompson & Barnett (1987); Abramowitz & Stegun 9.6.13.
 * @throws RangeError, as `besselK0Complex`, when Re z <= 0 or z is not finite.
 */
export function complexK0(re: number, im: number, out: ComplexScratch): void {
  if (!(re > 0) || !Number.isFinite(re) || !Number.isFinite(im) || !(hypot(re, im) > 2)) {
    const value = besselK0Complex(complex(re, im));
    out.re = value.re;
    out.im = value.im;
    return;
  }
  // b = 2 (1 + z), d = 1 / b, delh = d.
  let bRe = (1 + re) * 2;
  let bIm = (0 + im) * 2;
  divide(1, 0, bRe, bIm);
  let dRe = Q.re;
  let dIm = Q.im;
  let delhRe = dRe;
  let delhIm = dIm;
  let q1Re = 0;
  let q1Im = 0;
  let q2Re = 1;
  let q2Im = 0;
  const a1 = 0.25;
  let qRe = a1;
  let qIm = 0;
  const cIm = 0;
  // s = 1 + q delh.
  let sRe = 1 + (qRe * delhRe - qIm * delhIm);
  let sIm = 0 + (qRe * delhIm + qIm * delhRe);
  for (let i = 2; i <= MAX_TERMS; i++) {
    const a = CF_A[i]!;
    const cRe = CF_C[i]!;
    // qNew = (q1 - b q2) (1/a).
    const inverse = CF_INVERSE[i]!;
    const qNewRe = (q1Re - (bRe * q2Re - bIm * q2Im)) * inverse;
    const qNewIm = (q1Im - (bRe * q2Im + bIm * q2Re)) * inverse;
    q1Re = q2Re;
    q1Im = q2Im;
    q2Re = qNewRe;
    q2Im = qNewIm;
    qRe = qRe + (cRe * qNewRe - cIm * qNewIm);
    qIm = qIm + (cRe * qNewIm + cIm * qNewRe);
    bRe = bRe + 2;
    bIm = bIm + 0;
    // d = 1 / (b + d a).
    divide(1, 0, bRe + dRe * a, bIm + dIm * a);
    dRe = Q.re;
    dIm = Q.im;
    // delh = (b d - 1) delh.
    const fRe = bRe * dRe - bIm * dIm - 1;
    const fIm = bRe * dIm + bIm * dRe - 0;
    const nRe = fRe * delhRe - fIm * delhIm;
    const nIm = fRe * delhIm + fIm * delhRe;
    delhRe = nRe;
    delhIm = nIm;
    const delsRe = qRe * delhRe - qIm * delhIm;
    const delsIm = qRe * delhIm + qIm * delhRe;
    sRe = sRe + delsRe;
    sIm = sIm + delsIm;
    if (modulusBelow(delsRe, delsIm, 1e-17, sRe, sIm, false)) break;
  }
  finish(re, im, sRe, sIm, out);
}


/** K0(z) = sqrt(pi/2 / z) e^(-z) / s into `out`, the reference's operations in order. */
function finish(re: number, im: number, sRe: number, sIm: number, out: ComplexScratch): void {
  // prefactor = sqrt(pi/2 / z) e^(-z).
  divide(Math.PI / 2, 0, re, im);
  const gRe = Q.re;
  const gIm = Q.im;
  let rootRe: number;
  let rootIm: number;
  if (gRe === 0 && gIm === 0) {
    rootRe = 0;
    rootIm = 0;
  } else {
    const m = hypot(gRe, gIm);
    if (gRe >= 0) {
      const t = Math.sqrt(0.5 * (m + gRe));
      rootRe = t;
      rootIm = gIm / (2 * t);
    } else {
      const t = Math.sqrt(0.5 * (m - gRe));
      rootRe = Math.abs(gIm) / (2 * t);
      rootIm = gIm >= 0 ? t : -t;
    }
  }
  const negRe = re * -1;
  const negIm = im * -1;
  const m = Math.exp(negRe);
  const eRe = m * portableCos(negIm);
  const eIm = m * portableSin(negIm);
  const pRe = rootRe * eRe - rootIm * eIm;
  const pIm = rootRe * eIm + rootIm * eRe;
  divide(pRe, pIm, sRe, sIm, out);
}

/** Whether `complexK0` takes Steed's continued fraction at z (finite, Re z > 0, |z| > 2). */
export function continuedFractionApplies(re: number, im: number): boolean {
  return re > 0 && Number.isFinite(re) && Number.isFinite(im) && hypot(re, im) > 2;
}

/**
 * K0 at two arguments z1, z2 at which `continuedFractionApplies`, into out1 and out2: the two continued
 * fractions of `complexK0` advanced in one loop, each by exactly its own operations and stopped at its own test
 * (so the same bits as two calls), which lets the processor overlap their chains of dependent divisions.
 * Dimensionless. Source: Thompson & Barnett (1987), as `complexK0`.
 */
export function complexK0Pair(re1: number, im1: number, re2: number, im2: number, out1: ComplexScratch, out2: ComplexScratch): void {
  let bRe1 = (1 + re1) * 2;
  let bIm1 = (0 + im1) * 2;
  let bRe2 = (1 + re2) * 2;
  let bIm2 = (0 + im2) * 2;
  divide(1, 0, bRe1, bIm1);
  let dRe1 = Q.re;
  let dIm1 = Q.im;
  divide(1, 0, bRe2, bIm2);
  let dRe2 = Q.re;
  let dIm2 = Q.im;
  let delhRe1 = dRe1;
  let delhIm1 = dIm1;
  let delhRe2 = dRe2;
  let delhIm2 = dIm2;
  let q1Re1 = 0;
  let q1Im1 = 0;
  let q2Re1 = 1;
  let q2Im1 = 0;
  let q1Re2 = 0;
  let q1Im2 = 0;
  let q2Re2 = 1;
  let q2Im2 = 0;
  const a1 = 0.25;
  let qRe1 = a1;
  let qIm1 = 0;
  let qRe2 = a1;
  let qIm2 = 0;
  // c and a follow the same sequence in both fractions.
  const cIm = 0;
  let sRe1 = 1 + (qRe1 * delhRe1 - qIm1 * delhIm1);
  let sIm1 = 0 + (qRe1 * delhIm1 + qIm1 * delhRe1);
  let sRe2 = 1 + (qRe2 * delhRe2 - qIm2 * delhIm2);
  let sIm2 = 0 + (qRe2 * delhIm2 + qIm2 * delhRe2);
  let running1 = true;
  let running2 = true;
  for (let i = 2; i <= MAX_TERMS && (running1 || running2); i++) {
    const a = CF_A[i]!;
    const cRe = CF_C[i]!;
    const inverse = CF_INVERSE[i]!;
    if (running1) {
      const qNewRe = (q1Re1 - (bRe1 * q2Re1 - bIm1 * q2Im1)) * inverse;
      const qNewIm = (q1Im1 - (bRe1 * q2Im1 + bIm1 * q2Re1)) * inverse;
      q1Re1 = q2Re1;
      q1Im1 = q2Im1;
      q2Re1 = qNewRe;
      q2Im1 = qNewIm;
      qRe1 = qRe1 + (cRe * qNewRe - cIm * qNewIm);
      qIm1 = qIm1 + (cRe * qNewIm + cIm * qNewRe);
      bRe1 = bRe1 + 2;
      bIm1 = bIm1 + 0;
      divide(1, 0, bRe1 + dRe1 * a, bIm1 + dIm1 * a);
      dRe1 = Q.re;
      dIm1 = Q.im;
      const fRe = bRe1 * dRe1 - bIm1 * dIm1 - 1;
      const fIm = bRe1 * dIm1 + bIm1 * dRe1 - 0;
      const nRe = fRe * delhRe1 - fIm * delhIm1;
      const nIm = fRe * delhIm1 + fIm * delhRe1;
      delhRe1 = nRe;
      delhIm1 = nIm;
      const delsRe = qRe1 * delhRe1 - qIm1 * delhIm1;
      const delsIm = qRe1 * delhIm1 + qIm1 * delhRe1;
      sRe1 = sRe1 + delsRe;
      sIm1 = sIm1 + delsIm;
      if (modulusBelow(delsRe, delsIm, 1e-17, sRe1, sIm1, false)) running1 = false;
    }
    if (running2) {
      const qNewRe = (q1Re2 - (bRe2 * q2Re2 - bIm2 * q2Im2)) * inverse;
      const qNewIm = (q1Im2 - (bRe2 * q2Im2 + bIm2 * q2Re2)) * inverse;
      q1Re2 = q2Re2;
      q1Im2 = q2Im2;
      q2Re2 = qNewRe;
      q2Im2 = qNewIm;
      qRe2 = qRe2 + (cRe * qNewRe - cIm * qNewIm);
      qIm2 = qIm2 + (cRe * qNewIm + cIm * qNewRe);
      bRe2 = bRe2 + 2;
      bIm2 = bIm2 + 0;
      divide(1, 0, bRe2 + dRe2 * a, bIm2 + dIm2 * a);
      dRe2 = Q.re;
      dIm2 = Q.im;
      const fRe = bRe2 * dRe2 - bIm2 * dIm2 - 1;
      const fIm = bRe2 * dIm2 + bIm2 * dRe2 - 0;
      const nRe = fRe * delhRe2 - fIm * delhIm2;
      const nIm = fRe * delhIm2 + fIm * delhRe2;
      delhRe2 = nRe;
      delhIm2 = nIm;
      const delsRe = qRe2 * delhRe2 - qIm2 * delhIm2;
      const delsIm = qRe2 * delhIm2 + qIm2 * delhRe2;
      sRe2 = sRe2 + delsRe;
      sIm2 = sIm2 + delsIm;
      if (modulusBelow(delsRe, delsIm, 1e-17, sRe2, sIm2, false)) running2 = false;
    }
  }
  finish(re1, im1, sRe1, sIm1, out1);
  finish(re2, im2, sRe2, sIm2, out2);
}
