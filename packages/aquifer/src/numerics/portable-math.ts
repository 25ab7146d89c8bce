/**
 * Sine, cosine and powers computed from IEEE-754 arithmetic and Math.exp, Math.log and Math.sqrt only, so that they
 * give the same bits in every JavaScript engine the library runs in. Math.sin, Math.cos and Math.pow are not
 * specified to the last bit, and the engines of Node and of the page's Chromium differ in the last bit for about one
 * argument in ten (measured: sin, cos and pow differ, exp, log, sqrt, tan, atan do not); a Laplace inversion with
 * alternating weights or an ill-conditioned fit amplifies such a bit to the eighth significant digit, which a
 * recorded document would then not reproduce across engines.
 *
 * sin and cos: reduction to |r| <= pi/4 by r = (x - n p1) - n p1t with p1 the first 33 bits of pi/2 (so that n p1 is
 * exact for |n| < 2^20) and p1t the rest of pi/2 to about 1e-26, then the minimax polynomials of fdlibm's
 * __kernel_sin and __kernel_cos (Sun Microsystems 1993, as in FreeBSD msun k_sin.c and k_cos.c, coefficients from
 * memory and checked in numerics-portable-math.test.ts against Math.sin and Math.cos to 2 ulp over 1e5 arguments;
 * near a zero of the function the error is absolute, about 1e-26).
 * Arguments beyond 2^19 pi/2 (about 8e5) fall back to Math.sin and Math.cos: the library's arguments stay far below.
 * pow(x, y): exact repeated multiplication for integer |y| <= 64, otherwise exp(y ln x) (relative error about
 * |y ln x| 1e-16).
 */

const PIO2 = Math.PI / 2;
/** The first 33 bits of pi/2: n * PIO2_HI is exact for |n| < 2^20. */
const PIO2_HI = Math.round(PIO2 * 4294967296) / 4294967296;
/** pi/2 - PIO2_HI: the rest of double pi/2 plus its own rounding error, 6.123233995736766e-17 (cos of double pi/2). */
const PIO2_LO = PIO2 - PIO2_HI + 6.123233995736766e-17;
const LARGE = 524288 * PIO2;

const S1 = -1.66666666666666324348e-1;
const S2 = 8.33333333332248946124e-3;
const S3 = -1.98412698298579493134e-4;
const S4 = 2.75573137070700676789e-6;
const S5 = -2.50507602534068634195e-8;
const S6 = 1.58969099521155010221e-10;
const C1 = 4.16666666666666019037e-2;
const C2 = -1.38888888888741095749e-3;
const C3 = 2.48015872894767294178e-5;
const C4 = -2.75573143513906633035e-7;
const C5 = 2.08757232129817482790e-9;
const C6 = -1.13596475577881948265e-11;

/** sin(r) for |r| <= pi/4 (fdlibm __kernel_sin without the tail term). */
function kernelSin(r: number): number {
  const z = r * r;
  return r + r * z * (S1 + z * (S2 + z * (S3 + z * (S4 + z * (S5 + z * S6)))));
}

/** cos(r) for |r| <= pi/4 (fdlibm __kernel_cos, its split of 1 - z/2 kept for accuracy near pi/4). */
function kernelCos(r: number): number {
  const z = r * r;
  const p = z * z * (C1 + z * (C2 + z * (C3 + z * (C4 + z * (C5 + z * C6)))));
  const hz = 0.5 * z;
  const w = 1 - hz;
  return w + (1 - w - hz + p);
}

/** Sine of x (radians), the same bits in every engine for |x| < 8e5; Math.sin beyond. */
export function portableSin(x: number): number {
  if (x === 0) return x;
  if (!(Math.abs(x) < LARGE)) return Math.sin(x);
  if (Math.abs(x) <= 0.7853981633974483) return kernelSin(x);
  const n = Math.round(x / PIO2);
  const r = x - n * PIO2_HI - n * PIO2_LO;
  switch (((n % 4) + 4) % 4) {
    case 0:
      return kernelSin(r);
    case 1:
      return kernelCos(r);
    case 2:
      return -kernelSin(r);
    default:
      return -kernelCos(r);
  }
}

/** Cosine of x (radians), the same bits in every engine for |x| < 8e5; Math.cos beyond. */
export function portableCos(x: number): number {
  if (!(Math.abs(x) < LARGE)) return Math.cos(x);
  if (Math.abs(x) <= 0.7853981633974483) return kernelCos(x);
  const n = Math.round(x / PIO2);
  const r = x - n * PIO2_HI - n * PIO2_LO;
  switch (((n % 4) + 4) % 4) {
    case 0:
      return kernelCos(r);
    case 1:
      return -kernelSin(r);
    case 2:
      return -kernelCos(r);
    default:
      return kernelSin(r);
  }
}

/** x^y, the same bits in every engine: repeated squaring for integer |y| <= 64, exp(y ln x) for x > 0 otherwise. */
export function portablePow(x: number, y: number): number {
  if (Number.isInteger(y) && Math.abs(y) <= 64) {
    let result = 1;
    let base = x;
    let e = Math.abs(y);
    while (e > 0) {
      if (e & 1) result *= base;
      base *= base;
      e >>= 1;
    }
    return y < 0 ? 1 / result : result;
  }
  if (x > 0) return Math.exp(y * Math.log(x));
  if (x === 0) return y > 0 ? 0 : Infinity;
  return Math.pow(x, y);
}

/** 10^x, the same bits in every engine (exp(x ln 10)). */
export function portableExp10(x: number): number {
  return Math.exp(x * Math.LN10);
}
