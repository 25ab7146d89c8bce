/**
 * A small complex-number helper for the Laplace-domain routines. Values are plain immutable records
 * `{ re, im }` so they cross any boundary as data; every operation returns a new record.
 */

import { portableCos, portableSin } from "./portable-math.js";

/** A complex number re + i im. */
export interface Complex {
  readonly re: number;
  readonly im: number;
}

/** Builds re + i im (im defaults to 0). */
export function complex(re: number, im = 0): Complex {
  return { re, im };
}

/** a + b. */
export function cadd(a: Complex, b: Complex): Complex {
  return { re: a.re + b.re, im: a.im + b.im };
}

/** a − b. */
export function csub(a: Complex, b: Complex): Complex {
  return { re: a.re - b.re, im: a.im - b.im };
}

/** a · b. */
export function cmul(a: Complex, b: Complex): Complex {
  return { re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re };
}

/** s · a for a real s. */
export function cscale(a: Complex, s: number): Complex {
  return { re: a.re * s, im: a.im * s };
}

/** a / b by Smith's algorithm (Smith 1962, CACM 5:435), which avoids needless overflow. */
export function cdiv(a: Complex, b: Complex): Complex {
  if (Math.abs(b.re) >= Math.abs(b.im)) {
    const r = b.im / b.re;
    const d = b.re + b.im * r;
    return { re: (a.re + a.im * r) / d, im: (a.im - a.re * r) / d };
  }
  const r = b.re / b.im;
  const d = b.re * r + b.im;
  return { re: (a.re * r + a.im) / d, im: (a.im * r - a.re) / d };
}

/** |a|, computed without overflow through Math.hypot. */
export function cabs(a: Complex): number {
  return Math.hypot(a.re, a.im);
}

/** Principal argument of a in (−π, π]. */
export function carg(a: Complex): number {
  return Math.atan2(a.im, a.re);
}

/** e^a. */
export function cexp(a: Complex): Complex {
  const m = Math.exp(a.re);
  return { re: m * portableCos(a.im), im: m * portableSin(a.im) };
}

/** Principal natural logarithm ln|a| + i arg a. */
export function clog(a: Complex): Complex {
  return { re: Math.log(cabs(a)), im: carg(a) };
}

/** Principal square root (branch cut on the negative real axis, Re result >= 0). */
export function csqrt(a: Complex): Complex {
  if (a.re === 0 && a.im === 0) return { re: 0, im: 0 };
  const m = cabs(a);
  if (a.re >= 0) {
    const t = Math.sqrt(0.5 * (m + a.re));
    return { re: t, im: a.im / (2 * t) };
  }
  const t = Math.sqrt(0.5 * (m - a.re));
  return { re: Math.abs(a.im) / (2 * t), im: a.im >= 0 ? t : -t };
}
