/**
 * Drawdown forecasts for a pumping scheme, with the uncertainty carried over from a fit.
 *
 * Two bands, each labelled for what it covers:
 * - the confidence band of the fitted curve (p05, p95): the drawdown the model would give with the parameters
 *   anywhere in their uncertainty; parameter uncertainty only;
 * - the prediction band of one reading (prediction05, prediction95): parameter uncertainty plus the residual
 *   scatter of a single reading about the curve (the fit's, at the average weight), where one reading will fall.
 * Neither covers the choice of model: a boundary, leakage or recharge the test did not reach is outside both.
 * Linear propagation: with theta the fitting-space coordinates (ln p for positive parameters), C their covariance
 * and J_i = d s_i/d theta the sensitivity of each forecast value, var(s_i) = J_i C J_i^T; the 5/50/95 % band is
 * s_i -/+ t sd, t the Student t 0.95 quantile for the fit's degrees of freedom (normal 1.6449 for a covariance
 * given without them), and the prediction band s_i -/+ t sqrt(sd^2 + scatter^2). J comes from the model's analytic
 * Jacobian times p for ln parameters, or from central differences in theta (step 1e-5) when the model has none.
 * Monte Carlo: theta_k = theta_hat + k L z_k, L L^T = C (Cholesky), z_k standard normal from a seeded generator
 * (random.ts), with k = t_(0.95, nu) / 1.6449 so that, where drawdown is close to linear in the parameters, the 5 and
 * 95 % sample values fall where the Student t band puts them (k = 1 without degrees of freedom). Multivariate t draws
 * would do the same in the linear limit, but their heavy tails (Cauchy-like at nu near 1, as AR(1)-corrected fits
 * can have) send some draws decades away in ln T and ln S, where the forecast means nothing; scaling keeps the
 * nonlinearity of the model and the t quantile. For the prediction band each draw adds k scatter e_k, e_k standard
 * normal. The bands are the 5/50/95 % sample quantiles (Hyndman-Fan definition 7) and sd the sample standard
 * deviation of the scaled draws. The Monte Carlo standard error of a sample sd is about sd/sqrt(2 (N - 1)), of a 5 %
 * quantile about sqrt(0.05 0.95 / N)/phi(1.645) sd = 2.11 sd/sqrt(N) for a normal spread.
 * Sources: linear error propagation (delta method), e.g. JCGM 100:2008 (GUM) section 5.1; multivariate normal
 * sampling by Cholesky, e.g. Gentle (2003), Random Number Generation and Monte Carlo Methods, section 5.3.
 */
import type { DrawdownModel } from "../models/index.js";
import { evaluateScheme, prepareScheme, STRIP_TOLERANCE, type PreparedScheme, type PumpingWell } from "../superposition/scheme.js";
import type { StraightBoundary } from "../superposition/boundaries.js";
import { isFinitePoint, type Point } from "../superposition/plane.js";
import { choleskyLower } from "./cholesky.js";
import { ForecastInputError } from "./errors.js";
import { nativeFromTheta, resolveParameters, type ParameterInput, type ResolvedParameters } from "./parameters.js";
import { sortedQuantile } from "./quantile.js";
import { seededRandom } from "./random.js";
import { studentTQuantile } from "../fit/student-t.js";

/** A forecast point: coordinates (m), or distance r (m) from the only pumping well when there are no boundaries. */
export interface ForecastPoint {
  readonly name: string;
  readonly x?: number;
  readonly y?: number;
  readonly r?: number;
}

/** How uncertainty is carried into the forecast. */
export type ForecastUncertainty = "none" | "linear" | { readonly monteCarlo: { readonly samples: number; readonly seed: number } };

/** Options of {@link forecastDrawdown}: the parameters from `fit`, or `parameters` with optional `covariance`. */
export type ForecastOptions = ParameterInput & {
  readonly model: DrawdownModel;
  /** Pumping wells with coordinates (m) and schedules (d, m3/d). */
  readonly schedule: readonly PumpingWell[];
  readonly points: readonly ForecastPoint[];
  /** Times, d on the schedule's time axis. */
  readonly times: ArrayLike<number>;
  readonly boundaries?: readonly StraightBoundary[];
  /** Relative truncation tolerance of a strip's image series; default 1e-9. */
  readonly tolerance?: number;
  /** Default "none". */
  readonly uncertainty?: ForecastUncertainty;
  /**
   * Called before each Monte Carlo sample; a host that must stop long work (at a deadline) throws from it, and
   * forecastDrawdown lets the error through. Pure callers leave it out.
   */
  readonly checkpoint?: () => void;
};

/**
 * Most drawdown values (samples x points x times) one Monte Carlo forecast computes: they are all kept (8 bytes
 * each, 32 MB at this bound) to take quantiles, so a larger request is refused before any sampling.
 */
export const MAX_MONTE_CARLO_VALUES = 4_000_000;

/** Forecast at one point. */
export interface PointForecast {
  readonly name: string;
  readonly x: number;
  readonly y: number;
  /** Times, d. */
  readonly t: Float64Array;
  /** Drawdown at the parameter estimates, m. */
  readonly drawdown: Float64Array;
  /** Standard deviation, m (linear: sqrt(J C J^T); Monte Carlo: sample sd); null for "none". */
  readonly standardDeviation: Float64Array | null;
  /** 5, 50 and 95 % values of the confidence band of the curve (parameter uncertainty only), m; null for "none". */
  readonly p05: Float64Array | null;
  readonly p50: Float64Array | null;
  readonly p95: Float64Array | null;
  /** 5 and 95 % values of the prediction band of one reading (parameters plus scatter), m; null without a scatter or for "none". */
  readonly prediction05: Float64Array | null;
  readonly prediction95: Float64Array | null;
  /** Monte Carlo sample mean, m; null otherwise. */
  readonly mean: Float64Array | null;
}

/** Result of {@link forecastDrawdown}. */
export interface ForecastResult {
  readonly method: "none" | "linear" | "monte-carlo";
  readonly points: PointForecast[];
  /** Names of the parameters whose uncertainty was carried (in covariance order). */
  readonly uncertainParameters: string[];
  readonly samples: number | null;
  readonly seed: number | null;
  /** Most image wells used in one evaluation at one point, and most strip rows. */
  readonly imagesUsed: number;
  readonly stripRows: number;
  /** Degrees of freedom behind the bands (Infinity: normal) and what each band covers. */
  readonly dof: number;
  readonly bands: { readonly confidence: string; readonly prediction: string | null; readonly notCovered: string } | null;
  readonly notes: string[];
}

/** 0.95 quantile of the standard normal distribution (Abramowitz and Stegun 1964, table 26.1; 1.644854). */
const Z95 = 1.6448536269514722;

function resolvePoints(where: string, points: readonly ForecastPoint[], wells: readonly PumpingWell[], boundaries: readonly StraightBoundary[]): (Point & { name: string })[] {
  if (!Array.isArray(points) || points.length === 0) throw new ForecastInputError(`${where}: no forecast points; pass points: [{ name, x, y }] or [{ name, r }].`);
  return points.map((pt, i) => {
    const name = pt?.name || `#${i + 1}`;
    if (isFinitePoint(pt as Point)) return { name, x: pt.x!, y: pt.y! };
    if (pt?.r !== undefined) {
      if (!(Number.isFinite(pt.r) && pt.r > 0)) throw new ForecastInputError(`${where}: point "${name}" has r = ${pt.r} m; give a finite distance > 0.`);
      if (wells.length !== 1 || boundaries.length > 0) {
        throw new ForecastInputError(`${where}: point "${name}" is given by distance r, which is ambiguous with ${wells.length === 1 ? "boundaries" : "several pumping wells"}; give x and y (m).`);
      }
      return { name, x: wells[0]!.x + pt.r, y: wells[0]!.y };
    }
    throw new ForecastInputError(`${where}: point "${name}" needs x and y (m), or r (m) from the only pumping well.`);
  });
}

function checkTimes(where: string, times: ArrayLike<number>): Float64Array {
  if (!times || times.length === 0) throw new ForecastInputError(`${where}: no times given; pass times in d.`);
  const t = Float64Array.from(times);
  t.forEach((v, i) => {
    if (!Number.isFinite(v)) throw new ForecastInputError(`${where}: time ${i} is ${v}; give finite times in d.`);
  });
  return t;
}

/** Sensitivities d s/d theta_j (m per unit of theta) at `native`, one column per free parameter. */
function sensitivities(
  where: string,
  model: DrawdownModel,
  scheme: PreparedScheme,
  resolved: ResolvedParameters,
  point: Point,
  t: Float64Array,
): Float64Array[] {
  const native = nativeFromTheta(resolved, resolved.theta, new Float64Array(resolved.values.length));
  if (typeof model.jacobian === "function") {
    const columns = evaluateScheme(where, model, scheme, native, point, t, true).jacobian!;
    return resolved.free.map((k, j) => {
      const gain = resolved.logScale[j] ? native[k]! : 1;
      return columns[k]!.map((v) => v * gain);
    });
  }
  return resolved.free.map((_, j) => {
    const h = 1e-5 * (resolved.logScale[j] ? 1 : Math.max(Math.abs(resolved.theta[j]!), 1e-8));
    const up = Float64Array.from(resolved.theta);
    const down = Float64Array.from(resolved.theta);
    up[j]! += h;
    down[j]! -= h;
    const su = evaluateScheme(where, model, scheme, nativeFromTheta(resolved, up, new Float64Array(native.length)), point, t, false).drawdown;
    const sd = evaluateScheme(where, model, scheme, nativeFromTheta(resolved, down, new Float64Array(native.length)), point, t, false).drawdown;
    return su.map((v, i) => (v - sd[i]!) / (2 * h));
  });
}

/**
 * Forecast drawdown (m) at points (m) and times (d) for a pumping scheme (wells with coordinates and rate
 * schedules) with optional straight boundaries, using a fitted or given model; uncertainty "none", "linear"
 * (J C J^T in the fit's space) or Monte Carlo (seeded, multivariate normal in the fit's space, 5/50/95 % sample
 * quantiles; same seed, same output). Sources: see the module comment.
 */
export function forecastDrawdown(options: ForecastOptions): ForecastResult {
  const where = "forecastDrawdown";
  const { model } = options;
  if (!model || typeof model.drawdown !== "function" || !Array.isArray(model.parameters)) {
    throw new ForecastInputError(`${where}: model is missing or is not a drawdown model.`);
  }
  const resolved = resolveParameters(where, model, options);
  const boundaries = options.boundaries ?? [];
  const scheme = prepareScheme(where, options.schedule, boundaries, options.tolerance ?? STRIP_TOLERANCE);
  const points = resolvePoints(where, options.points, options.schedule, boundaries);
  const t = checkTimes(where, options.times);
  const uncertainty = options.uncertainty ?? "none";
  const names = resolved.free.map((k) => model.parameters[k]!.name);
  const notes: string[] = [];
  const fitErrors = "fit" in options && options.fit && Array.isArray(options.fit.errors) ? options.fit.errors : [];
  if (fitErrors.length > 0) {
    notes.push(`The fit behind this forecast has ${fitErrors.length} error${fitErrors.length === 1 ? "" : "s"} (see its errors): its parameters are not reliable, and neither is this forecast.`);
  }
  let imagesUsed = 0;
  let stripRows = 0;
  const evaluate = (native: Float64Array, point: Point): Float64Array => {
    const e = evaluateScheme(where, model, scheme, native, point, t, false);
    imagesUsed = Math.max(imagesUsed, e.imagesUsed);
    stripRows = Math.max(stripRows, e.rows);
    return e.drawdown;
  };
  const central = points.map((pt) => evaluate(resolved.values, pt));
  const base = (i: number) => ({ name: points[i]!.name, x: points[i]!.x, y: points[i]!.y, t: t.slice(), drawdown: central[i]! });

  if (uncertainty === "none") {
    return {
      method: "none",
      points: points.map((_, i) => ({ ...base(i), standardDeviation: null, p05: null, p50: null, p95: null, prediction05: null, prediction95: null, mean: null })),
      uncertainParameters: [],
      samples: null,
      seed: null,
      imagesUsed,
      stripRows,
      dof: resolved.dof,
      bands: null,
      notes,
    };
  }
  const C = resolved.covariance;
  if (!C || C.length === 0) {
    throw new ForecastInputError(`${where}: uncertainty needs a covariance: pass fit (a FitResult with free parameters) or covariance { names, matrix }.`);
  }
  const nu = resolved.dof;
  const scatter = resolved.scatter;
  const q95 = Number.isFinite(nu) ? studentTQuantile(0.95, nu) : Z95;
  const quantileText = Number.isFinite(nu) ? `Student t ${q95.toFixed(3)} for ${Number(nu.toPrecision(3))} degrees of freedom` : `normal 1.645 (no degrees of freedom given)`;
  const bands = {
    confidence:
      "p05..p95: 90 % confidence band of the fitted curve: where the model's drawdown lies given the uncertainty of the fitted parameters " +
      `only (${quantileText}).`,
    prediction:
      scatter === null
        ? null
        : `prediction05..prediction95: 90 % prediction band of a single reading: parameter uncertainty plus the residual scatter of one reading ` +
          `about the curve (${Number(scatter.toPrecision(3))} m at the fit's average weight).`,
    notCovered:
      "Neither band covers the choice of model: boundaries, leakage, recharge or delayed yield that the test did not reach, and any change of " +
      "rate or of the aquifer after the test, lie outside both.",
  };
  notes.push(bands.notCovered);
  if (scatter === null) notes.push("No residual scatter is known (parameters given without a fit): no prediction band; pass scatter (m) for one.");
  if (uncertainty === "linear") {
    const forecasts = points.map((pt, i) => {
      const J = sensitivities(where, model, scheme, resolved, pt, t);
      const sd = new Float64Array(t.length);
      for (let m = 0; m < t.length; m++) {
        let v = 0;
        for (let a = 0; a < J.length; a++) for (let b = 0; b < J.length; b++) v += J[a]![m]! * C[a]![b]! * J[b]![m]!;
        sd[m] = Math.sqrt(Math.max(v, 0));
      }
      const s = central[i]!;
      const predictionSd = scatter === null ? null : sd.map((v) => Math.sqrt(v * v + scatter * scatter));
      return {
        ...base(i),
        standardDeviation: sd,
        p05: s.map((v, m) => v - q95 * sd[m]!),
        p50: s.slice(),
        p95: s.map((v, m) => v + q95 * sd[m]!),
        prediction05: predictionSd ? s.map((v, m) => v - q95 * predictionSd[m]!) : null,
        prediction95: predictionSd ? s.map((v, m) => v + q95 * predictionSd[m]!) : null,
        mean: null,
      };
    });
    notes.push("Linear propagation: the band is symmetric and assumes drawdown is close to linear in the fitted parameters over their uncertainty; compare with Monte Carlo when the uncertainty is large.");
    return { method: "linear", points: forecasts, uncertainParameters: names, samples: null, seed: null, imagesUsed, stripRows, dof: nu, bands, notes };
  }
  const mc = (uncertainty as { monteCarlo?: { samples: number; seed: number } }).monteCarlo;
  if (!mc || !Number.isInteger(mc.samples) || mc.samples < 10 || mc.samples > 1e6 || !Number.isSafeInteger(mc.seed)) {
    throw new ForecastInputError(`${where}: uncertainty must be "none", "linear" or { monteCarlo: { samples (integer 10..1e6), seed (integer) } }.`);
  }
  const values = mc.samples * points.length * t.length;
  if (values > MAX_MONTE_CARLO_VALUES) {
    throw new ForecastInputError(
      `${where}: a Monte Carlo forecast of ${mc.samples} samples at ${points.length} points and ${t.length} times needs ${values} drawdown values; ` +
        `one call may compute at most ${MAX_MONTE_CARLO_VALUES}. Use fewer samples, points or times.`,
    );
  }
  const L = choleskyLower(C);
  if (!L) throw new ForecastInputError(`${where}: the covariance is not positive semi-definite; it cannot be sampled.`);
  const random = seededRandom(mc.seed);
  const N = mc.samples;
  const p = resolved.free.length;
  const draws = points.map(() => new Float64Array(N * t.length));
  const predictionDraws = scatter === null ? null : points.map(() => new Float64Array(N * t.length));
  const stretch = q95 / Z95;
  const z = new Float64Array(p);
  const theta = new Float64Array(p);
  const native = new Float64Array(resolved.values.length);
  for (let k = 0; k < N; k++) {
    options.checkpoint?.();
    for (let j = 0; j < p; j++) z[j] = random.nextNormal();
    for (let a = 0; a < p; a++) {
      let v = 0;
      for (let b = 0; b <= a; b++) v += L[a]![b]! * z[b]!;
      theta[a] = resolved.theta[a]! + stretch * v;
    }
    nativeFromTheta(resolved, theta, native);
    points.forEach((pt, i) => {
      const values = evaluate(native, pt);
      draws[i]!.set(values, k * t.length);
      if (predictionDraws) {
        const row = predictionDraws[i]!;
        for (let m = 0; m < t.length; m++) row[k * t.length + m] = values[m]! + stretch * scatter! * random.nextNormal();
      }
    });
  }
  const column = new Float64Array(N);
  const quantiles = (all: Float64Array, m: number): { mu: number; sd: number; p05: number; p50: number; p95: number } => {
    let sum = 0;
    for (let k = 0; k < N; k++) {
      column[k] = all[k * t.length + m]!;
      sum += column[k]!;
    }
    const mu = sum / N;
    let ss = 0;
    for (let k = 0; k < N; k++) ss += (column[k]! - mu) ** 2;
    column.sort();
    return { mu, sd: Math.sqrt(ss / (N - 1)), p05: sortedQuantile(column, 0.05), p50: sortedQuantile(column, 0.5), p95: sortedQuantile(column, 0.95) };
  };
  const forecasts = points.map((_, i) => {
    const sd = new Float64Array(t.length);
    const mean = new Float64Array(t.length);
    const p05 = new Float64Array(t.length);
    const p50 = new Float64Array(t.length);
    const p95 = new Float64Array(t.length);
    const prediction05 = predictionDraws ? new Float64Array(t.length) : null;
    const prediction95 = predictionDraws ? new Float64Array(t.length) : null;
    for (let m = 0; m < t.length; m++) {
      const q = quantiles(draws[i]!, m);
      mean[m] = q.mu;
      sd[m] = q.sd;
      p05[m] = q.p05;
      p50[m] = q.p50;
      p95[m] = q.p95;
      if (predictionDraws) {
        const r = quantiles(predictionDraws[i]!, m);
        prediction05![m] = r.p05;
        prediction95![m] = r.p95;
      }
    }
    return { ...base(i), standardDeviation: sd, p05, p50, p95, prediction05, prediction95, mean };
  });
  notes.push(
    `Monte Carlo with ${N} samples (seed ${mc.seed}${Number.isFinite(nu) ? `, normal draws scaled by ${stretch.toFixed(3)} to the Student t quantile for ${Number(nu.toPrecision(3))} degrees of freedom` : ", multivariate normal"}): ` +
      `sample sd carries a relative error of about ${(100 / Math.sqrt(2 * (N - 1))).toFixed(1)} %, the 5 and 95 % values about ${(2.11 / Math.sqrt(N)).toFixed(3)} sd.`,
  );
  return { method: "monte-carlo", points: forecasts, uncertainParameters: names, samples: N, seed: mc.seed, imagesUsed, stripRows, dof: nu, bands, notes };
}
