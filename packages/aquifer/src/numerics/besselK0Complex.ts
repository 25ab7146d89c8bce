import type { Complex } from "./complex.js";
import { cadd, cdiv, cexp, clog, cmul, complex, cscale, csqrt, csub } from "./complex.js";

const EULER_GAMMA = 0.5772156649015329;
const SERIES_RADIUS = 2;
const MAX_TERMS = 500;

/**
 * Modified Bessel function of the second kind K0(z) for complex z with Re z > 0 (the half plane that
 * Laplace-domain well solutions use: z = r sqrt(S p / T) with Re p > 0 gives |arg z| < π/4).
 * For |z| <= 2 the ascending series K0(z) = −(ln(z/2) + γ) I0(z) + Σ_{k>=1} (z²/4)^k / (k!)² H_k
 * (Abramowitz & Stegun 9.6.13, H_k the harmonic numbers); for |z| > 2 Steed's continued fraction CF2 as in
 * Thompson & Barnett (1987, J. Comput. Phys. 64:490; also Numerical Recipes' bessik) in complex arithmetic,
 * K0(z) = sqrt(π/(2z)) e^{−z} / S. Accuracy against mpmath besselk (fixture tests/fixtures/numerics/
 * besselk0_complex.json, 153 points): max relative error 2.4e-15 over 1e-3 <= |z| <= 200,
 * |arg z| <= 1.2. Dimensionless.
 * Underflows to 0 for Re z above about 700.
 * @throws RangeError when Re z <= 0 or z is not finite.
 */
export function besselK0Complex(z: Complex): Complex {
  if (!(z.re > 0) || !Number.isFinite(z.re) || !Number.isFinite(z.im)) {
    throw new RangeError(
      `besselK0Complex: z = ${z.re} + ${z.im}i; the routine covers finite z with Re z > 0 (the right half plane).`,
    );
  }
  const modulus = Math.hypot(z.re, z.im);
  return modulus <= SERIES_RADIUS ? seriesK0(z) : continuedFractionK0(z);
}

function seriesK0(z: Complex): Complex {
  const quarterSquare = cscale(cmul(z, z), 0.25);
  let term: Complex = complex(1);
  let i0: Complex = complex(1);
  let harmonicSum: Complex = complex(0);
  let harmonic = 0;
  for (let k = 1; k < MAX_TERMS; k++) {
    term = cscale(cmul(term, quarterSquare), 1 / (k * k));
    harmonic += 1 / k;
    i0 = cadd(i0, term);
    harmonicSum = cadd(harmonicSum, cscale(term, harmonic));
    if (Math.hypot(term.re, term.im) * harmonic < 1e-17 * Math.hypot(i0.re, i0.im)) break;
  }
  const logPart = cadd(clog(cscale(z, 0.5)), complex(EULER_GAMMA));
  return csub(harmonicSum, cmul(logPart, i0));
}

function continuedFractionK0(z: Complex): Complex {
  const one = complex(1);
  let b = cscale(cadd(one, z), 2);
  let d = cdiv(one, b);
  let h = d;
  let delh = d;
  let q1: Complex = complex(0);
  let q2: Complex = complex(1);
  const a1 = 0.25;
  let q: Complex = complex(a1);
  let c: Complex = complex(a1);
  let a = -a1;
  let s = cadd(one, cmul(q, delh));
  for (let i = 2; i <= MAX_TERMS; i++) {
    a -= 2 * (i - 1);
    c = cscale(c, -a / i);
    const qNew = cscale(csub(q1, cmul(b, q2)), 1 / a);
    q1 = q2;
    q2 = qNew;
    q = cadd(q, cmul(c, qNew));
    b = cadd(b, complex(2));
    d = cdiv(one, cadd(b, cscale(d, a)));
    delh = cmul(csub(cmul(b, d), one), delh);
    h = cadd(h, delh);
    const dels = cmul(q, delh);
    s = cadd(s, dels);
    if (Math.hypot(dels.re, dels.im) < 1e-17 * Math.hypot(s.re, s.im)) break;
  }
  const prefactor = cmul(csqrt(cdiv(complex(Math.PI / 2), z)), cexp(cscale(z, -1)));
  return cdiv(prefactor, s);
}
