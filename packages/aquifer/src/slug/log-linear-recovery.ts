/**
 * The straight line ln(H/H0) = a - b t behind the Hvorslev (1951) and Bouwer & Rice (1976) analyses, fitted by
 * least squares over a chosen part of the record (see `SlugFitRange`).
 *
 * What is reported: b (1/d), the decay rate; the basic time lag T0 = 1/b (d), the time for the fitted line to
 * fall by a factor e (H/H0 from 1 to e^-1 = 0.368 when the line passes through H/H0 = 1 at t = 0); the
 * intercept a, with e^a the apparent H0/H0 of the line (far from 1 means a disturbed start or a wrong H0); and
 * the time where the fitted line crosses H/H0 = 0.37, the graphical reading of T0.
 * With `throughOrigin` the line is forced through H/H0 = 1 at t = 0 (regression without intercept:
 * b = -sum t ln h / sum t^2, SE(b) = s / sqrt(sum t^2), s^2 = SSR/(n - 1)).
 */

import { studentTQuantile } from "../fit/student-t.js";
import { fitStraightLine } from "../steptest/line-fit.js";
import { SlugTestInputError } from "./errors.js";
import type { NormalizedSlugRecord } from "./slug-data.js";

/**
 * The least-squares line ln(H/H0) = a - b t of a slug-test record, as returned by fitRecoveryLine: decay rate b
 * (1/d) with its standard error (1/d), basic time lag T0 = 1/b (d), intercept a and residuals (in ln(H/H0),
 * dimensionless), times (d) and H/H0 of the points used, and R^2.
 */
export interface RecoveryLine {
  /** Decay rate b of ln(H/H0) = a - b t, 1/d. */
  readonly decayRate: number;
  readonly decayRateStandardError: number | null;
  /** Student t 0.975 quantile for the residual degrees of freedom; null when there are none. */
  readonly tQuantile: number | null;
  /** T0 = 1/b, d. */
  readonly basicTimeLag: number;
  /** Intercept a (0 when forced through the origin). */
  readonly intercept: number;
  /** Time where the fitted line reaches H/H0 = 0.37, d. */
  readonly timeAt037: number;
  /** Points used, their times (d) and H/H0. */
  readonly points: number;
  readonly t: Float64Array;
  readonly h: Float64Array;
  /** ln(H/H0) residuals. */
  readonly residuals: Float64Array;
  readonly rSquared: number;
  readonly throughOrigin: boolean;
}

/**
 * Least-squares line ln(H/H0) = a - b t through the selected points of a normalized record.
 * @throws SlugTestInputError with fewer than 2 points (3 with an intercept for standard errors) or b <= 0.
 */
export function fitRecoveryLine(record: NormalizedSlugRecord, name: string, throughOrigin = false): RecoveryLine {
  const n = record.t.length;
  if (n < 2) {
    throw new SlugTestInputError(
      `Slug test "${name}": ${n} point(s) in the chosen range; the straight-line fit needs at least 2 with H/H0 > 0. Widen the range.`,
    );
  }
  const y = record.h.map(Math.log);
  let b: number;
  let se: number | null;
  let a: number;
  let tq: number | null;
  let residuals: Float64Array;
  let rSquared: number;
  if (throughOrigin) {
    let stt = 0;
    let sty = 0;
    for (let i = 0; i < n; i++) {
      stt += record.t[i]! * record.t[i]!;
      sty += record.t[i]! * y[i]!;
    }
    b = -sty / stt;
    a = 0;
    residuals = y.map((v, i) => v + b * record.t[i]!);
    const ssr = residuals.reduce((s, r) => s + r * r, 0);
    const ybar = y.reduce((s, v) => s + v, 0) / n;
    const syy = y.reduce((s, v) => s + (v - ybar) * (v - ybar), 0);
    rSquared = syy > 0 ? 1 - ssr / syy : 1;
    se = Math.sqrt(ssr / (n - 1) / stt);
    tq = studentTQuantile(0.975, n - 1);
  } else {
    const line = fitStraightLine(record.t, y);
    b = -line.slope;
    a = line.intercept;
    se = line.slopeStandardError;
    tq = line.tQuantile;
    residuals = line.residuals;
    rSquared = line.rSquared;
  }
  if (!(b > 0)) {
    throw new SlugTestInputError(
      `Slug test "${name}": the displacement does not decay over the chosen range (fitted rate ${b} per day); ` +
        `check the sign of H0 and the range.`,
    );
  }
  return {
    decayRate: b,
    decayRateStandardError: se,
    tQuantile: tq,
    basicTimeLag: 1 / b,
    intercept: a,
    timeAt037: (a - Math.log(0.37)) / b,
    points: n,
    t: record.t,
    h: record.h,
    residuals,
    rSquared,
    throughOrigin,
  };
}
