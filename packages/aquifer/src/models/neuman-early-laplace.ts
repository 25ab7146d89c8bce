/**
 * Neuman's (1974) transform at complex p for de Hoog's inversion at early time, in plain re/im arithmetic: the
 * series, roots, weights, K0 and truncation of `neumanTransformComplex` (early-time-laplace.ts) with every
 * operation of its complex records written out on re/im pairs in the same order, so that it returns the same
 * bits (tested in models-neuman-early.test.ts) without a record per operation, with moduli by `hypot`
 * (neuman-complex-k0.ts: the bits of Math.hypot at a sixth of its cost), and with the sine and cosine of each
 * root formed once for the root test and the weight.
 *
 * Roots: Newton's method on h(eps) = eps - n pi - atan(c/eps) (principal atan) from the previous root plus pi,
 * else from n pi + atan(c/(n pi + pi/4)), accepted when |eps sin eps - c cos eps| <= 1e-12 (|eps| + |c|) with
 * Re eps in (n pi - pi/2, n pi + pi/2]; where neither start gives an accepted root (the reference then follows
 * the root from real c) the caller is told to use the reference (returns false).
 * Weights w_n = 4 sin^2 eps / (eps (2 eps + sin 2 eps)); terms w_n K0(sqrt(p + beta eps^2)); the series stops
 * once three successive terms after n = 3 fall below 1e-14 of the sum.
 */
import {
  complexK0,
  complexK0Pair,
  continuedFractionApplies,
  divide,
  hypot,
  modulusBelow,
  type ComplexScratch,
} from "./neuman-complex-k0.js";
import { portableCos, portableSin } from "../numerics/portable-math.js";

const MAX_TERMS = 100000;
const K0: ComplexScratch = { re: 0, im: 0 };
const D: ComplexScratch = { re: 0, im: 0 };
const ATAN: ComplexScratch = { re: 0, im: 0 };
/** The last root with its sine and cosine. */
const ROOT = { re: 0, im: 0, sinRe: 0, sinIm: 0, cosRe: 0, cosIm: 0 };

/**
 * Writes Neuman's transform F(p) = (2/p) sum_n w_n K0(sqrt(p + beta eps_n^2)) at complex p = pRe + i pIm
 * (Re p > 0) for sigma = S/Sy > 0 and beta > 0 into `out` (dimensionless; the series as in neuman-laplace.ts),
 * the same bits as `neumanTransformComplex`. Returns false, leaving `out` unspecified, where a root needs the
 * reference's path from real c; the caller then evaluates `neumanTransformComplex`. Source: Neuman (1974), WRR
 * 10(2) 303-312, in the Laplace form of Moench (1997), WRR 33(6) 1397-1407.
 */
export function neumanTransformComplexFast(pRe: number, pIm: number, sigma: number, beta: number, out: ComplexScratch): boolean {
  const scale = 1 / (sigma * beta);
  const cRe = pRe * scale;
  const cIm = pIm * scale;
  const series = SERIES;
  series.re = 0;
  series.im = 0;
  series.small = 0;
  // Terms are prepared one ahead so that two K0 continued fractions run in one loop (complexK0Pair); a term
  // prepared beyond the last one summed changes nothing, and where its root needs the reference's path the
  // reference is asked only if the series did not stop first.
  let carried = false;
  let n = 0;
  while (n < MAX_TERMS) {
    if (carried) {
      copyTerm(NEXT, TERM);
      carried = false;
    } else {
      if (!prepareTerm(n, pRe, pIm, cRe, cIm, beta, TERM)) return false;
    }
    let nextFailed = false;
    if (n + 1 < MAX_TERMS && continuedFractionApplies(TERM.xRe, TERM.xIm)) {
      if (prepareTerm(n + 1, pRe, pIm, cRe, cIm, beta, NEXT)) {
        if (continuedFractionApplies(NEXT.xRe, NEXT.xIm)) {
          complexK0Pair(TERM.xRe, TERM.xIm, NEXT.xRe, NEXT.xIm, K0, K0_NEXT);
          if (addTerm(n, TERM, K0, series)) break;
          if (addTerm(n + 1, NEXT, K0_NEXT, series)) break;
          n += 2;
          continue;
        }
        carried = true;
      } else nextFailed = true;
    }
    complexK0(TERM.xRe, TERM.xIm, K0);
    if (addTerm(n, TERM, K0, series)) break;
    if (nextFailed) return false;
    n += 1;
  }
  finishTransform(series, pRe, pIm, out);
  return true;
}

/** One term's weight w and argument x of K0. */
interface Term {
  wRe: number;
  wIm: number;
  xRe: number;
  xIm: number;
}

const TERM: Term = { wRe: 0, wIm: 0, xRe: 0, xIm: 0 };
const NEXT: Term = { wRe: 0, wIm: 0, xRe: 0, xIm: 0 };
const K0_NEXT: ComplexScratch = { re: 0, im: 0 };
/** The partial sum and the count of successive small terms. */
const SERIES = { re: 0, im: 0, small: 0 };

function copyTerm(from: Term, to: Term): void {
  to.wRe = from.wRe;
  to.wIm = from.wIm;
  to.xRe = from.xRe;
  to.xIm = from.xIm;
}

/**
 * Root n (from ROOT, root n - 1, for n >= 1), weight and K0 argument of term n into `term`; false where the root
 * needs the reference's path.
 */
function prepareTerm(n: number, pRe: number, pIm: number, cRe: number, cIm: number, beta: number, term: Term): boolean {
  if (!root(n, cRe, cIm, n > 0)) return false;
  const eRe = ROOT.re;
  const eIm = ROOT.im;
  const sRe = ROOT.sinRe;
  const sIm = ROOT.sinIm;
  // w = (4 s^2) / (e (2e + sin 2e)).
  const ssRe = (sRe * sRe - sIm * sIm) * 4;
  const ssIm = (sRe * sIm + sIm * sRe) * 4;
  const twoRe = eRe * 2;
  const twoIm = eIm * 2;
  const gRe = twoRe + portableSin(twoRe) * Math.cosh(twoIm);
  const gIm = twoIm + portableCos(twoRe) * Math.sinh(twoIm);
  divide(ssRe, ssIm, eRe * gRe - eIm * gIm, eRe * gIm + eIm * gRe, D);
  term.wRe = D.re;
  term.wIm = D.im;
  argument(pRe, pIm, eRe, eIm, beta, term);
  return true;
}

/** x = sqrt(p + beta e^2) (principal root) into `term`. */
function argument(pRe: number, pIm: number, eRe: number, eIm: number, beta: number, term: Term): void {
  const zRe = pRe + (eRe * eRe - eIm * eIm) * beta;
  const zIm = pIm + (eRe * eIm + eIm * eRe) * beta;
  if (zRe === 0 && zIm === 0) {
    term.xRe = 0;
    term.xIm = 0;
    return;
  }
  const m = hypot(zRe, zIm);
  if (zRe >= 0) {
    const t = Math.sqrt(0.5 * (m + zRe));
    term.xRe = t;
    term.xIm = zIm / (2 * t);
  } else {
    const t = Math.sqrt(0.5 * (m - zRe));
    term.xRe = Math.abs(zIm) / (2 * t);
    term.xIm = zIm >= 0 ? t : -t;
  }
}

const SERIES_TWIN = { re: 0, im: 0, small: 0 };

/**
 * The transform for two betas that share c = p / (sigma beta), as the two forward differences of the early-time
 * sensitivities in sigma and in beta do when (sigma up) beta and sigma (beta up) round alike: F(p; c, beta1) into
 * out1 and F(p; c, beta2) into out2, where `scale` = 1 / (sigma beta) as the single evaluation forms it. The roots
 * and weights depend on c alone and are formed once; each series keeps its own K0 arguments, sum and stopping
 * test, so each value has the bits of {@link neumanTransformComplexFast} for its own (sigma, beta). Returns a mask:
 * 1 when out1 holds its value, 2 when out2 does (a series whose root needs the reference's path is left out).
 * Dimensionless. Source: as neumanTransformComplexFast.
 */
export function neumanTransformComplexTwin(
  pRe: number,
  pIm: number,
  scale: number,
  beta1: number,
  beta2: number,
  out1: ComplexScratch,
  out2: ComplexScratch,
): number {
  const cRe = pRe * scale;
  const cIm = pIm * scale;
  const first = SERIES;
  const second = SERIES_TWIN;
  first.re = 0;
  first.im = 0;
  first.small = 0;
  second.re = 0;
  second.im = 0;
  second.small = 0;
  let running1 = true;
  let running2 = true;
  let done = 0;
  let failed = false;
  for (let n = 0; n < MAX_TERMS && (running1 || running2); n++) {
    if (!prepareTerm(n, pRe, pIm, cRe, cIm, beta1, TERM)) {
      failed = true;
      break;
    }
    copyTerm(TERM, NEXT);
    argument(pRe, pIm, ROOT.re, ROOT.im, beta2, NEXT);
    if (
      running1 &&
      running2 &&
      continuedFractionApplies(TERM.xRe, TERM.xIm) &&
      continuedFractionApplies(NEXT.xRe, NEXT.xIm)
    ) {
      complexK0Pair(TERM.xRe, TERM.xIm, NEXT.xRe, NEXT.xIm, K0, K0_NEXT);
    } else {
      if (running1) complexK0(TERM.xRe, TERM.xIm, K0);
      if (running2) complexK0(NEXT.xRe, NEXT.xIm, K0_NEXT);
    }
    if (running1 && addTerm(n, TERM, K0, first)) {
      running1 = false;
      finishTransform(first, pRe, pIm, out1);
      done |= 1;
    }
    if (running2 && addTerm(n, NEXT, K0_NEXT, second)) {
      running2 = false;
      finishTransform(second, pRe, pIm, out2);
      done |= 2;
    }
  }
  if (!failed) {
    // MAX_TERMS summed without stopping: the single evaluation returns that sum.
    if (running1) {
      finishTransform(first, pRe, pIm, out1);
      done |= 1;
    }
    if (running2) {
      finishTransform(second, pRe, pIm, out2);
      done |= 2;
    }
  }
  return done;
}

/** (sum / p) 2 into `out`, by Smith's division. */
function finishTransform(series: typeof SERIES, pRe: number, pIm: number, out: ComplexScratch): void {
  divide(series.re, series.im, pRe, pIm, D);
  out.re = D.re * 2;
  out.im = D.im * 2;
}

/** Adds term n = w K0 to the series; true when the series stops there (the reference's rule). */
function addTerm(n: number, term: Term, k0: ComplexScratch, series: typeof SERIES): boolean {
  const tRe = term.wRe * k0.re - term.wIm * k0.im;
  const tIm = term.wRe * k0.im + term.wIm * k0.re;
  series.re = series.re + tRe;
  series.im = series.im + tIm;
  if (n >= 3 && modulusBelow(tRe, tIm, 1e-14, series.re, series.im, true)) {
    if (++series.small >= 3) return true;
  } else series.small = 0;
  return false;
}

/** Root n into ROOT (module comment); false where the reference would follow the root from real c. */
function root(n: number, cRe: number, cIm: number, previous: boolean): boolean {
  const base = n * Math.PI;
  if (previous) {
    newton(base, ROOT.re + Math.PI, ROOT.im + 0, cRe, cIm);
    if (isRoot(base, cRe, cIm)) return true;
  }
  divide(cRe, cIm, base + Math.PI / 4, 0, D);
  atan(D.re, D.im);
  newton(base, base + ATAN.re, 0 + ATAN.im, cRe, cIm);
  return isRoot(base, cRe, cIm);
}

/** Principal atan z = (i/2) ln((1 - i z)/(1 + i z)) into ATAN, the operations of the reference's catan. */
function atan(zRe: number, zIm: number): void {
  // iz = i z.
  const izRe = 0 * zRe - 1 * zIm;
  const izIm = 0 * zIm + 1 * zRe;
  divide(1 - izRe, 0 - izIm, 1 + izRe, 0 + izIm, ATAN);
  const lRe = Math.log(hypot(ATAN.re, ATAN.im));
  const lIm = Math.atan2(ATAN.im, ATAN.re);
  ATAN.re = 0 * lRe - 0.5 * lIm;
  ATAN.im = 0 * lIm + 0.5 * lRe;
}

/** The reference's Newton iteration on h (at most 60 steps, until a step is below 1e-15 |eps|) into ROOT. */
function newton(base: number, startRe: number, startIm: number, cRe: number, cIm: number): void {
  let eRe = startRe;
  let eIm = startIm;
  for (let k = 0; k < 60; k++) {
    divide(cRe, cIm, eRe, eIm, D);
    atan(D.re, D.im);
    // h = (e - base) - atan(c/e).
    const hRe = eRe - base - ATAN.re;
    const hIm = eIm - 0 - ATAN.im;
    // slope = 1 + c / (e^2 + c^2).
    const e2Re = eRe * eRe - eIm * eIm;
    const e2Im = eRe * eIm + eIm * eRe;
    const c2Re = cRe * cRe - cIm * cIm;
    const c2Im = cRe * cIm + cIm * cRe;
    divide(cRe, cIm, e2Re + c2Re, e2Im + c2Im, D);
    const slopeRe = 1 + D.re;
    const slopeIm = 0 + D.im;
    divide(hRe, hIm, slopeRe, slopeIm, D);
    const stepRe = D.re;
    const stepIm = D.im;
    eRe = eRe - stepRe;
    eIm = eIm - stepIm;
    if (!(Number.isFinite(eRe) && Number.isFinite(eIm))) break;
    if (modulusBelow(stepRe, stepIm, 1e-15, eRe, eIm, true)) break;
  }
  ROOT.re = eRe;
  ROOT.im = eIm;
}

/** The reference's acceptance test on ROOT; stores sin and cos of the root (portable sine and cosine). */
function isRoot(base: number, cRe: number, cIm: number): boolean {
  const eRe = ROOT.re;
  const eIm = ROOT.im;
  const ch = Math.cosh(eIm);
  const sh = Math.sinh(eIm);
  const sine = portableSin(eRe);
  const cosine = portableCos(eRe);
  const sRe = sine * ch;
  const sIm = cosine * sh;
  const coRe = cosine * ch;
  const coIm = -sine * sh;
  ROOT.sinRe = sRe;
  ROOT.sinIm = sIm;
  ROOT.cosRe = coRe;
  ROOT.cosIm = coIm;
  // e sin e - c cos e.
  const gRe = eRe * sRe - eIm * sIm - (cRe * coRe - cIm * coIm);
  const gIm = eRe * sIm + eIm * sRe - (cRe * coIm + cIm * coRe);
  return (
    Number.isFinite(eRe) &&
    Number.isFinite(eIm) &&
    residualSmall(gRe, gIm, eRe, eIm, cRe, cIm) &&
    eRe > base - Math.PI / 2 &&
    eRe <= base + Math.PI / 2 + 1e-9
  );
}

/**
 * hypot(g) <= 1e-12 (hypot(e) + hypot(c)), the same decision: from square roots of the squared moduli (within
 * 2e-16 relative of hypot where every modulus lies in [1e-150, 1e150]) when more than 1e-12 relative from the
 * boundary, else from `hypot`.
 */
function residualSmall(gRe: number, gIm: number, eRe: number, eIm: number, cRe: number, cIm: number): boolean {
  const g = Math.sqrt(gRe * gRe + gIm * gIm);
  const e = Math.sqrt(eRe * eRe + eIm * eIm);
  const c = Math.sqrt(cRe * cRe + cIm * cIm);
  if (g >= 1e-150 && g <= 1e150 && e >= 1e-150 && e <= 1e150 && c >= 1e-150 && c <= 1e150) {
    const bound = 1e-12 * (e + c);
    if (g < bound * (1 - 1e-12)) return true;
    if (g > bound * (1 + 1e-12)) return false;
  }
  return hypot(gRe, gIm) <= 1e-12 * (hypot(eRe, eIm) + hypot(cRe, cIm));
}
