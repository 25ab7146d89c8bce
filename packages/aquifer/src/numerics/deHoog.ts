import type { Complex } from "./complex.js";
import { cadd, cdiv, cmul, complex, cscale, csqrt, csub } from "./complex.js";
import { portableCos, portableSin } from "./portable-math.js";

/** Options of `deHoog`. */
export interface DeHoogOptions {
  /** M: the series uses 2M + 1 transform values (default 20, so 41 evaluations of F). */
  readonly order?: number;
  /** Target size of the discretisation error relative to f, sets the abscissa γ (default 1e-12). */
  readonly tolerance?: number;
  /** Real part of the rightmost singularity of F (default 0). */
  readonly alpha?: number;
  /** Half period T of the Fourier series as a multiple of t (default 2, so T = 2t). */
  readonly periodFactor?: number;
}

/**
 * Inverts the Laplace transform F (a function of complex p; units of f times time) at time t > 0 by the
 * method of de Hoog, Knight & Stokes (1982, SIAM J. Sci. Stat. Comput. 3:357): the Fourier series
 * f(t) ≈ (e^{γt}/T) Re[ F(γ)/2 + Σ_{k=1}^{2M} F(γ + ikπ/T) z^k ], z = e^{iπt/T}, γ = α − ln(tolerance)/(2T),
 * summed as a continued fraction built with the quotient-difference algorithm, with the paper's improved
 * remainder for the last term. Cost: 2M + 1 evaluations of F plus O(M²) complex operations.
 * Handles oscillating f (sin t) better than Stehfest. Accuracy reached with the defaults (M = 20,
 * tolerance 1e-12), measured in numerics-laplace.test.ts over t in [0.01, 20]: about 1e-12 absolute on e^−t
 * and 1/sqrt(pi t) (relative), 2e-11 on sin t, 5e-12 relative on t; on the Theis transform (2/p) K0(sqrt p)
 * with `besselK0Complex`, 1.9e-10 relative at u = 1/(4t) = 5 and about 1e-12 for u <= 0.25.
 * @throws RangeError when t is not a positive finite number or the options are out of range.
 */
export function deHoog(F: (p: Complex) => Complex, t: number, options: DeHoogOptions = {}): number {
  const m = options.order ?? 20;
  const tolerance = options.tolerance ?? 1e-12;
  const alpha = options.alpha ?? 0;
  const periodFactor = options.periodFactor ?? 2;
  if (!(t > 0) || !Number.isFinite(t)) {
    throw new RangeError(`deHoog: time t = ${t}; it must be a positive finite number.`);
  }
  if (!Number.isInteger(m) || m < 2 || m > 60) {
    throw new RangeError(`deHoog: order = ${m}; use an integer from 2 to 60 (20 suits double precision).`);
  }
  if (!(tolerance > 0 && tolerance < 1)) {
    throw new RangeError(`deHoog: tolerance = ${tolerance}; it must lie in (0, 1).`);
  }
  if (!(periodFactor >= 1) || !Number.isFinite(periodFactor)) {
    throw new RangeError(`deHoog: periodFactor = ${periodFactor}; it must be a finite number >= 1.`);
  }
  if (!Number.isFinite(alpha)) throw new RangeError(`deHoog: alpha = ${alpha}; it must be finite.`);

  const period = periodFactor * t;
  const gamma = alpha - Math.log(tolerance) / (2 * period);
  const terms = 2 * m + 1;
  const a: Complex[] = new Array<Complex>(terms);
  for (let k = 0; k < terms; k++) {
    const value = F(complex(gamma, (k * Math.PI) / period));
    if (!Number.isFinite(value.re) || !Number.isFinite(value.im)) {
      throw new RangeError(
        `deHoog: F(p) is not finite at p = ${gamma} + ${(k * Math.PI) / period}i; F must be finite for Re p > alpha = ${alpha}.`,
      );
    }
    a[k] = value;
  }
  a[0] = cscale(a[0]!, 0.5);

  // Quotient-difference table: q[r][i], e[r][i] for column r.
  const d = continuedFractionCoefficients(a, m);
  const z = complex(portableCos((Math.PI * t) / period), portableSin((Math.PI * t) / period));

  // Recurrences A_{n+1} = A_n + d_n z A_{n-1}, B likewise, for n = 1..2M−1.
  let aPrev: Complex = complex(0);
  let aCur: Complex = d[0]!;
  let bPrev: Complex = complex(1);
  let bCur: Complex = complex(1);
  for (let n = 1; n < 2 * m; n++) {
    const dz = cmul(d[n]!, z);
    const aNext = cadd(aCur, cmul(dz, aPrev));
    const bNext = cadd(bCur, cmul(dz, bPrev));
    aPrev = aCur;
    aCur = aNext;
    bPrev = bCur;
    bCur = bNext;
  }
  // Improved remainder: h = (1 + (d_{2M−1} − d_{2M}) z)/2, R = −h (1 − sqrt(1 + d_{2M} z / h²)).
  const h = cscale(cadd(complex(1), cmul(csub(d[2 * m - 1]!, d[2 * m]!), z)), 0.5);
  const ratio = cdiv(cmul(d[2 * m]!, z), cmul(h, h));
  const root = csqrt(cadd(complex(1), ratio));
  const remainder = cmul(h, csub(root, complex(1)));
  const aLast = cadd(aCur, cmul(remainder, aPrev));
  const bLast = cadd(bCur, cmul(remainder, bPrev));
  return (Math.exp(gamma * t) / period) * cdiv(aLast, bLast).re;
}

/** The continued-fraction coefficients d_0..d_{2M} from the power-series coefficients a_0..a_{2M} (QD algorithm). */
function continuedFractionCoefficients(a: readonly Complex[], m: number): Complex[] {
  const terms = 2 * m + 1;
  let e: Complex[] = new Array<Complex>(terms).fill(complex(0));
  let q: Complex[] = new Array<Complex>(terms - 1);
  for (let i = 0; i < terms - 1; i++) q[i] = cdiv(a[i + 1]!, a[i]!);
  const d: Complex[] = new Array<Complex>(terms);
  d[0] = a[0]!;
  d[1] = cscale(q[0]!, -1);
  for (let r = 1; r <= m; r++) {
    const length = 2 * (m - r) + 1;
    const eNext: Complex[] = new Array<Complex>(length);
    for (let i = 0; i < length; i++) eNext[i] = cadd(csub(q[i + 1]!, q[i]!), e[i + 1]!);
    d[2 * r] = cscale(eNext[0]!, -1);
    if (r < m) {
      const qNext: Complex[] = new Array<Complex>(length - 1);
      for (let i = 0; i < length - 1; i++) qNext[i] = cdiv(cmul(q[i + 1]!, eNext[i + 1]!), eNext[i]!);
      d[2 * r + 1] = cscale(qNext[0]!, -1);
      q = qNext;
    }
    e = eNext;
  }
  return d;
}

