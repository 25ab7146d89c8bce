/**
 * The 7-point Gauss / 15-point Kronrod pair on [−1, 1], with the nodes and weights printed in QUADPACK's
 * qk15 (Piessens, de Doncker-Kapenga, Überhuber & Kahaner 1983). The Kronrod rule is exact for polynomials of
 * degree <= 22, the embedded Gauss rule for degree <= 13 (checked in numerics-quadrature.test.ts).
 */

import { portablePow } from "./portable-math.js";

/** Kronrod nodes in [0, 1), largest first; the odd-indexed ones (1, 3, 5) are the Gauss nodes, 7 is the centre. */
export const KRONROD15_NODES: readonly number[] = [
  0.991455371120812639206854697526329, 0.949107912342758524526189684047851, 0.864864423359769072789712788640926,
  0.741531185599394439863864773280788, 0.586087235467691130294144838258730, 0.405845151377397166906606412076961,
  0.207784955007898467600689403773245, 0,
];

/** Kronrod weights matching KRONROD15_NODES. */
export const KRONROD15_WEIGHTS: readonly number[] = [
  0.02293532201052922496373200805897, 0.063092092629978553290700663189204, 0.104790010322250183839876322541518,
  0.140653259715525918745189590510238, 0.16900472663926790282658342659855, 0.190350578064785409913256402421014,
  0.204432940075298892414161999234649, 0.209482141084727828012999174891714,
];

/** Gauss weights for the nodes KRONROD15_NODES[1], [3], [5] and the centre [7]. */
export const GAUSS7_WEIGHTS: readonly number[] = [
  0.129484966168869693270611432679082, 0.27970539148927666790146777142378, 0.381830050505118944950369775488975,
  0.417959183673469387755102040816327,
];

/** One application of the G7-K15 pair on [a, b]. */
export interface KronrodPanel {
  /** Kronrod (15-point) estimate of the integral. */
  readonly kronrod: number;
  /** Gauss (7-point) estimate of the integral. */
  readonly gauss: number;
  /** Kronrod estimate of the integral of |f − mean f| over the panel (QUADPACK's resasc). */
  readonly meanDeviation: number;
  /** Kronrod estimate of the integral of |f| (QUADPACK's resabs). */
  readonly absIntegral: number;
}

/**
 * Applies the G7-K15 pair to f on [a, b] (15 evaluations). Throws a RangeError naming x when f returns a
 * value that is not finite.
 */
export function kronrod15(f: (x: number) => number, a: number, b: number): KronrodPanel {
  const centre = 0.5 * (a + b);
  const half = 0.5 * (b - a);
  const values = new Array<number>(15);
  let kronrod = 0;
  let gauss = 0;
  let absIntegral = 0;
  for (let j = 0; j < 8; j++) {
    const w = KRONROD15_WEIGHTS[j]!;
    const gw = j % 2 === 1 ? GAUSS7_WEIGHTS[(j - 1) / 2]! : j === 7 ? GAUSS7_WEIGHTS[3]! : 0;
    if (j === 7) {
      const fc = evaluate(f, centre);
      values[7] = fc;
      kronrod += w * fc;
      gauss += gw * fc;
      absIntegral += w * Math.abs(fc);
      continue;
    }
    const dx = half * KRONROD15_NODES[j]!;
    const f1 = evaluate(f, centre - dx);
    const f2 = evaluate(f, centre + dx);
    values[j] = f1;
    values[14 - j] = f2;
    kronrod += w * (f1 + f2);
    gauss += gw * (f1 + f2);
    absIntegral += w * (Math.abs(f1) + Math.abs(f2));
  }
  const mean = 0.5 * kronrod;
  let meanDeviation = KRONROD15_WEIGHTS[7]! * Math.abs(values[7]! - mean);
  for (let j = 0; j < 7; j++) {
    meanDeviation += KRONROD15_WEIGHTS[j]! * (Math.abs(values[j]! - mean) + Math.abs(values[14 - j]! - mean));
  }
  const scale = Math.abs(half);
  return {
    kronrod: kronrod * half,
    gauss: gauss * half,
    meanDeviation: meanDeviation * scale,
    absIntegral: absIntegral * scale,
  };
}

function evaluate(f: (x: number) => number, x: number): number {
  const y = f(x);
  if (!Number.isFinite(y)) {
    throw new RangeError(
      `The integrand returned ${y} at x = ${x}; it must be finite at every interior point (an endpoint singularity is fine, an interior one needs the interval split there).`,
    );
  }
  return y;
}

/**
 * QUADPACK's error estimate for one panel: |K − G| scaled by the panel's mean deviation,
 * min(1, (200 |K − G| / resasc)^1.5) · resasc, and never below 50 ε · resabs.
 */
export function kronrodErrorEstimate(panel: KronrodPanel): number {
  let err = Math.abs(panel.kronrod - panel.gauss);
  if (panel.meanDeviation !== 0 && err !== 0) {
    err = panel.meanDeviation * Math.min(1, portablePow((200 * err) / panel.meanDeviation, 1.5));
  }
  const floor = 50 * Number.EPSILON * panel.absIntegral;
  return Math.max(err, floor);
}
