/**
 * Hantush-Bierschenk (1964) analysis of a step-drawdown test with steps of equal duration.
 * Source: Hantush, M.S. (1964). Hydraulics of wells. In: Chow, V.T. (ed.), Advances in Hydroscience 1,
 * 281-432 (the method is also credited to Bierschenk, W.H. (1963/1964), Determining well efficiency by
 * multiple step-drawdown tests, IASH publication 64).
 *
 * What is computed, for steps k = 1..N starting at t_k with rates Q_k (dQ_k = Q_k - Q_(k-1), Q_0 = 0) and a
 * fixed elapsed time dt within every step (default: the shortest step duration):
 * 1. The drawdown reached dt after the start of step k, s(t_k + dt), by linear interpolation in time between
 *    the readings of step k that bracket it (exactly the reading when one falls there).
 * 2. The drawdown step k-1 would have reached at the same moment without the rate change: the last part of
 *    step k-1 (readings with t - t_(k-1) >= (1 - tailFraction) times its duration) is fitted by least squares
 *    with s = a + b Phi_(k-1)(t), Phi_(k-1)(t) = sum_(i<k) dQ_i ln(t - t_i), the Cooper-Jacob superposition of
 *    the rates so far with unknown a and b, and extrapolated to t_k + dt. (The source extrapolates by eye on a
 *    semi-log plot; this is a reproducible form of the same step, exact when Cooper-Jacob holds.)
 * 3. The increment ds_k = s(t_k + dt) - extrapolation (ds_1 = s(t_1 + dt)).
 * 4. s_w(k) = sum_(i<=k) ds_i. Under Cooper-Jacob superposition with an instantaneous well loss C Q^2,
 *    s_w(k) = B(dt) Q_k + C Q_k^2 exactly, B(dt) = [ln(2.25 T dt / (r_w^2 S))] / (4 pi T) the formation loss
 *    coefficient at elapsed time dt; B and C follow from the least-squares line s_w(k)/Q_k = B + C Q_k.
 * The fitted b of step 2 estimates 1/(4 pi T); T = 1/(4 pi b) is reported per step as a by-product.
 */

import type { ObservationSeries } from "../data/index.js";
import { toBaseUnits } from "../data/index.js";
import { StepTestInputError } from "./errors.js";
import { quadraticLossResult } from "./jacob.js";
import { fitStraightLine } from "./line-fit.js";
import { splitRecordIntoSteps } from "./step-data.js";
import type { StepTestResult } from "./step-result.js";

/**
 * Settings of hantushBierschenkStepTest: the elapsed time dt (d) and the fraction of each step, at its end, fitted
 * for the extrapolation (dimensionless).
 */
export interface HantushBierschenkOptions {
  /** Elapsed time within each step at which increments are taken, d; default the shortest step duration. */
  readonly elapsed?: number;
  /** Fraction of each step, at its end, fitted for the extrapolation; default 0.5. */
  readonly tailFraction?: number;
}

/** The increment of one step and where it came from, base units. */
export interface DrawdownIncrement {
  readonly step: number;
  /** Rate, m3/d. */
  readonly rate: number;
  /** t_k + dt, d since pumping started. */
  readonly time: number;
  /** Drawdown reached at `time`, m. */
  readonly drawdown: number;
  /** Extrapolated drawdown of the previous step at `time`, m (0 for the first step). */
  readonly extrapolated: number;
  /** ds_k = drawdown - extrapolated, m. */
  readonly increment: number;
  /** s_w(k) = sum of increments up to this step, m. */
  readonly cumulative: number;
  /** Readings of the previous step used for the extrapolation (0 for the first step). */
  readonly extrapolationPoints: number;
  /** T = 1/(4 pi b) from the extrapolation slope of the previous step, m2/d; null for the first step. */
  readonly transmissivityFromSlope: number | null;
}

/**
 * Outcome of hantushBierschenkStepTest: the shared step-test result (B d/m2, C d2/m5, n = 2), the elapsed time
 * dt used (d), and the drawdown increment of each step (rates m3/d, drawdowns m).
 */
export interface HantushBierschenkResult extends StepTestResult {
  /** The elapsed time dt used, d. */
  readonly elapsed: number;
  readonly increments: DrawdownIncrement[];
}

/**
 * Hantush-Bierschenk (1964): B(dt) (d/m2) and C (d2/m5) of s_w = B Q + C Q^2 from a drawdown record of a
 * stepped schedule with steps of equal duration (see the module note for exactly what is computed), with
 * standard errors, per-step efficiency, well-loss fraction, specific capacity and Walton's hint from C.
 * The series needs a rate schedule (`pumpingRate` with steps), readings in every step and at least 2 steps
 * (3 for standard errors); steps of rate 0 end the analysed part.
 * @throws StepTestInputError when dt exceeds a step, a step has too few readings to extrapolate, or the rates
 *   do not change.
 */
export function hantushBierschenkStepTest(
  series: ObservationSeries,
  options: HantushBierschenkOptions = {},
): HantushBierschenkResult {
  const base = toBaseUnits(series);
  const steps = splitRecordIntoSteps(series);
  if (steps.length < 2) {
    throw new StepTestInputError(`Series "${series.name}": ${steps.length} pumping step(s); Hantush-Bierschenk needs at least 2.`);
  }
  const durations = steps.map((s) => s.end - s.start);
  const shortest = Math.min(...durations);
  const dt = options.elapsed ?? shortest;
  const tailFraction = options.tailFraction ?? 0.5;
  if (!(tailFraction > 0 && tailFraction <= 1)) {
    throw new StepTestInputError(`tailFraction = ${tailFraction}; give a fraction of the step in (0, 1].`);
  }
  if (!(dt > 0) || dt > shortest * (1 + 1e-9)) {
    throw new StepTestInputError(
      `Elapsed time dt = ${dt} d; it must be > 0 and at most the shortest step duration, ${shortest} d.`,
    );
  }
  const warnings: string[] = [];
  if (Math.max(...durations) > 1.05 * shortest && options.elapsed === undefined) {
    warnings.push(
      `Step durations range from ${fmt(shortest)} d to ${fmt(Math.max(...durations))} d; the method assumes equal ` +
        `durations. Increments are taken ${fmt(dt)} d into each step.`,
    );
  }
  const increments: DrawdownIncrement[] = [];
  let cumulative = 0;
  for (let k = 0; k < steps.length; k++) {
    const step = steps[k]!;
    const time = step.start + dt;
    const drawdown = interpolateInStep(base.t, base.s, step.indices, time, step.step);
    let extrapolated = 0;
    let points = 0;
    let transmissivity: number | null = null;
    if (k > 0) {
      const previous = steps[k - 1]!;
      const from = previous.end - tailFraction * (previous.end - previous.start);
      const used = previous.indices.filter((i) => base.t[i]! >= from);
      if (used.length < 2) {
        throw new StepTestInputError(
          `Step ${previous.step}: ${used.length} reading(s) in its last ${fmt(tailFraction * 100)} %; the extrapolation ` +
            `needs at least 2 (3 or more for a check of the fit). Increase tailFraction or add readings.`,
        );
      }
      const phi = (t: number) => {
        let sum = 0;
        for (let i = 0; i < k; i++) sum += (steps[i]!.rate - (i > 0 ? steps[i - 1]!.rate : 0)) * Math.log(t - steps[i]!.start);
        return sum;
      };
      const line = fitStraightLine(
        used.map((i) => phi(base.t[i]!)),
        used.map((i) => base.s[i]!),
      );
      extrapolated = line.intercept + line.slope * phi(time);
      points = used.length;
      transmissivity = line.slope > 0 ? 1 / (4 * Math.PI * line.slope) : null;
      if (line.slope <= 0) {
        warnings.push(`Step ${previous.step}: drawdown does not rise in its last part; the extrapolation is flat or falling.`);
      }
    }
    const increment = drawdown - extrapolated;
    cumulative += increment;
    increments.push({
      step: step.step,
      rate: step.rate,
      time,
      drawdown,
      extrapolated,
      increment,
      cumulative,
      extrapolationPoints: points,
      transmissivityFromSlope: transmissivity,
    });
  }
  const Q = new Float64Array(increments.map((i) => i.rate));
  const s = new Float64Array(increments.map((i) => i.cumulative));
  const result = quadraticLossResult(
    "hantush-bierschenk-1964",
    Q,
    s,
    [
      `Hantush-Bierschenk (1964): increments ds_k taken ${fmt(dt)} d into each step; previous step extrapolated ` +
        `along the Cooper-Jacob superposition s = a + b sum dQ_i ln(t - t_i) fitted to its last ` +
        `${fmt(tailFraction * 100)} %; s_w(k) = sum ds_i; B(dt) and C from the line s_w(k)/Q_k = B + C Q_k. ` +
        `B is the formation loss coefficient at ${fmt(dt)} d of pumping.`,
    ],
    warnings,
  );
  return { ...result, elapsed: dt, increments };
}

/** Drawdown at time t inside a step by linear interpolation between the step's bracketing readings. */
function interpolateInStep(t: Float64Array, s: Float64Array, indices: readonly number[], time: number, step: number): number {
  const last = indices[indices.length - 1]!;
  const tolerance = 1e-9 * Math.max(1, Math.abs(time));
  if (Math.abs(t[last]! - time) <= tolerance) return s[last]!;
  if (t[last]! < time) {
    throw new StepTestInputError(
      `Step ${step}: the last reading is at ${fmt(t[last]!)} d, before the increment time ${fmt(time)} d; ` +
        `choose a smaller elapsed time or add the step-end reading.`,
    );
  }
  for (let j = 0; j < indices.length; j++) {
    const i = indices[j]!;
    if (Math.abs(t[i]! - time) <= tolerance) return s[i]!;
    if (t[i]! > time) {
      if (j === 0) {
        throw new StepTestInputError(`Step ${step}: no reading before ${fmt(time)} d inside the step to interpolate from.`);
      }
      const p = indices[j - 1]!;
      const w = (time - t[p]!) / (t[i]! - t[p]!);
      return s[p]! + w * (s[i]! - s[p]!);
    }
  }
  return s[last]!;
}

function fmt(v: number): string {
  return Number(v.toPrecision(4)).toString();
}
