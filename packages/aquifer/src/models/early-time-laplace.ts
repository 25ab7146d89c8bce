/**
 * The Laplace-domain transforms of the Neuman (1974) and Hantush (1960) models at complex p, for inversion by
 * the method of de Hoog, Knight & Stokes (1982) at early time, where Gaver-Stehfest loses accuracy (relative
 * errors of 2e-3 to 2e-2 near t_D = 0.05 against mpmath, where the drawdown grows like exp(-1/(4 t_D))).
 *
 * Neuman: F(p) = (2/p) sum_n w_n K0(sqrt(p + beta eps_n^2)), eps_n sin eps_n = c cos eps_n, c = p/(sigma beta),
 * w_n = 4 sin^2 eps_n / (eps_n (2 eps_n + sin 2 eps_n)) (the same series as neuman-laplace.ts). For complex c
 * each root is found, as in the mpmath fixture script, by Newton's method on its own equation
 * h(eps) = eps - n pi - atan(c/eps) (principal branch), started from the previous root plus pi and, when that fails,
 * from n pi + atan(c/(n pi + pi/4)), accepted when
 * |eps sin eps - c cos eps| is below 1e-12 (|eps| + |c|) with Re eps within (n pi - pi/2, n pi + pi/2]; otherwise
 * followed from the real root for Re c along c = Re c + i tau Im c (16 steps of Newton on eps sin eps - c cos eps).
 * The series stops once three successive terms fall below 1e-14 of the sum.
 * Hantush (1960): F(p) = (2/p) K0(sqrt(p + rho^2 y coth y)), y = sqrt(p gamma)/rho (leaky-storage-laplace.ts).
 */
import { besselK0Complex, cadd, cdiv, cexp, clog, cmul, complex, cscale, csqrt, csub, type Complex } from "../numerics/index.js";
import { neumanRoot } from "./neuman-laplace.js";
import { portableCos, portableSin } from "../numerics/portable-math.js";

const I = complex(0, 1);
const ONE = complex(1);

function csin(z: Complex): Complex {
  return complex(portableSin(z.re) * Math.cosh(z.im), portableCos(z.re) * Math.sinh(z.im));
}

function ccos(z: Complex): Complex {
  return complex(portableCos(z.re) * Math.cosh(z.im), -portableSin(z.re) * Math.sinh(z.im));
}

/** atan z = (i/2) ln((1 - i z)/(1 + i z)) (principal branch, DLMF 4.23.26). */
function catan(z: Complex): Complex {
  const iz = cmul(I, z);
  return cmul(complex(0, 0.5), clog(cdiv(csub(ONE, iz), cadd(ONE, iz))));
}

const abs = (z: Complex) => Math.hypot(z.re, z.im);

function rootResidual(e: Complex, c: Complex): Complex {
  return csub(cmul(e, csin(e)), cmul(c, ccos(e)));
}

function newtonOnResidual(e0: Complex, c: Complex): Complex {
  let e = e0;
  for (let k = 0; k < 60; k++) {
    const s = csin(e);
    const co = ccos(e);
    const g = csub(cmul(e, s), cmul(c, co));
    const dg = cadd(cadd(s, cmul(e, co)), cmul(c, s));
    const step = cdiv(g, dg);
    e = csub(e, step);
    if (abs(step) <= 1e-15 * abs(e)) break;
  }
  return e;
}

function newtonOnOwnEquation(n: number, start: Complex, c: Complex): Complex {
  const base = n * Math.PI;
  let e = start;
  for (let k = 0; k < 60; k++) {
    const h = csub(csub(e, complex(base)), catan(cdiv(c, e)));
    const e2 = cmul(e, e);
    const slope = cadd(ONE, cdiv(c, cadd(e2, cmul(c, c))));
    const step = cdiv(h, slope);
    e = csub(e, step);
    if (!(Number.isFinite(e.re) && Number.isFinite(e.im))) break;
    if (abs(step) <= 1e-15 * abs(e)) break;
  }
  return e;
}

function isRoot(n: number, e: Complex, c: Complex): boolean {
  const base = n * Math.PI;
  return (
    Number.isFinite(e.re) &&
    Number.isFinite(e.im) &&
    abs(rootResidual(e, c)) <= 1e-12 * (abs(e) + abs(c)) &&
    e.re > base - Math.PI / 2 &&
    e.re <= base + Math.PI / 2 + 1e-9
  );
}

/**
 * The n-th root of eps sin eps = c cos eps for complex c with Re c > 0 (see the module comment); for n >= 1 Newton
 * starts first from the previous root plus pi.
 */
function complexRoot(n: number, c: Complex, previous: Complex | null): Complex {
  const base = n * Math.PI;
  if (previous) {
    const e = newtonOnOwnEquation(n, cadd(previous, complex(Math.PI)), c);
    if (isRoot(n, e, c)) return e;
  }
  const e = newtonOnOwnEquation(n, cadd(complex(base), catan(cdiv(c, complex(base + Math.PI / 4)))), c);
  if (isRoot(n, e, c)) return e;
  const cr = c.re;
  const guess = n === 0 ? (cr < 2 ? Math.sqrt(cr / (1 + cr / 3)) : (Math.PI / 2) * (cr / (1 + cr))) : base + Math.PI / 4;
  let path = complex(neumanRoot(n, cr, guess));
  const steps = 16;
  for (let k = 1; k <= steps; k++) path = newtonOnResidual(path, complex(cr, (c.im * k) / steps));
  return path;
}

/** Neuman's transform F(p) at complex p (Re p > 0) for sigma = S/Sy > 0 and beta > 0 (module comment). */
export function neumanTransformComplex(p: Complex, sigma: number, beta: number): Complex {
  const c = cscale(p, 1 / (sigma * beta));
  let sum = complex(0);
  let small = 0;
  let previous: Complex | null = null;
  for (let n = 0; n < 100000; n++) {
    const e = complexRoot(n, c, previous);
    previous = e;
    const s = csin(e);
    const w = cdiv(cscale(cmul(s, s), 4), cmul(e, cadd(cscale(e, 2), csin(cscale(e, 2)))));
    const x = csqrt(cadd(p, cscale(cmul(e, e), beta)));
    const term = cmul(w, besselK0Complex(x));
    sum = cadd(sum, term);
    if (n >= 3 && abs(term) <= 1e-14 * abs(sum)) {
      if (++small >= 3) break;
    } else small = 0;
  }
  return cscale(cdiv(sum, p), 2);
}

/** y coth y for complex y, with its series 1 + y^2/3 - y^4/45 below |y| = 1e-3 and 1 + 2 e^(-2y) y above Re y = 20. */
function yCothY(y: Complex): Complex {
  if (abs(y) < 1e-3) {
    const y2 = cmul(y, y);
    return cadd(ONE, cadd(cscale(y2, 1 / 3), cscale(cmul(y2, y2), -1 / 45)));
  }
  if (y.re > 20) return cmul(y, cadd(ONE, cscale(cexp(cscale(y, -2)), 2)));
  const e2 = cexp(cscale(y, 2));
  return cmul(y, cdiv(cadd(e2, ONE), csub(e2, ONE)));
}

/** Hantush's (1960) transform F(p) at complex p (Re p > 0) for rho = r/B > 0 and gamma = S'/S >= 0. */
export function leakyStorageTransformComplex(p: Complex, rho: number, gamma: number): Complex {
  const leak = gamma > 0 ? yCothY(cscale(csqrt(cscale(p, gamma)), 1 / rho)) : ONE;
  const x = csqrt(cadd(p, cscale(leak, rho * rho)));
  return cscale(cdiv(besselK0Complex(x), p), 2);
}
