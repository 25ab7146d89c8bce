/**
 * Transient step-drawdown analysis: the whole drawdown record of the pumped well through every step is fitted
 * by superposition in time of an aquifer model plus a well loss that follows the current rate,
 *
 *   s_w(t) = sum_i (Q_i - Q_(i-1)) s1(rw, t - t_i) + C Q(t)^n,
 *
 * with s1 the aquifer model's drawdown for a unit rate (Theis 1935 or Papadopulos-Cooper 1967 with skin),
 * Q(t) the rate of the step running at t, C the well-loss coefficient and n its exponent (Jacob 1947: n = 2;
 * Rorabaugh 1953: n fitted). The fit (fitModel, Levenberg-Marquardt) gives T, S (or the skin), C and n with
 * intervals from every reading rather than from the step-end values only.
 * Sources: Jacob, C.E. (1947), Trans. ASCE 112, 1047-1070; Rorabaugh, M.I. (1953), Trans. ASCE 118, 907-938;
 * superposition in time as in Birsoy, Y.K. and Summers, W.K. (1980), Ground Water 18(2), 137-144.
 */
import { fitModel, type FitOptions, type FitResult } from "../fit/index.js";
import type { DrawdownModel, ObservationGeometry, ParameterDescriptor } from "../models/index.js";
import { withRateSchedule, type PumpingStep } from "../superposition/index.js";
import { StepTestInputError } from "./errors.js";
import { wellLossCoefficientUnit } from "./step-performance.js";
import { portablePow } from "../numerics/portable-math.js";
import { largestOf } from "../numerics/extremes.js";

/** Well-loss coefficient C of s = C Q^n, base units d^n / m^(3n - 1) (d2/m5 for n = 2). */
export const wellLossParameter: ParameterDescriptor = {
  name: "C",
  label: "well-loss coefficient",
  unit: "d^n/m^(3n-1)",
  positive: true,
  bounds: [1e-16, 1e3],
  description: "Coefficient of the non-linear (turbulent) well loss C Q^n; d2/m5 when n = 2.",
};

/** Exponent n of the well loss C Q^n (fitted on a linear scale). */
export const wellLossExponentParameter: ParameterDescriptor = {
  name: "n",
  label: "well-loss exponent",
  unit: "1",
  positive: false,
  bounds: [1, 3.5],
  description: "Exponent of the well loss: 2 after Jacob (1947); Rorabaugh (1953) found 1.5 to 3.5.",
};

/** The rate running at each time t (d) of a schedule, m3/d (0 before the first step). */
function rateAt(steps: readonly PumpingStep[], t: number): number {
  let q = 0;
  for (const step of steps) if (t >= step.start) q = step.rate;
  return q;
}

/** The pumped-well model of a step test, with its aquifer model and schedule. */
export interface StepDrawdownModel extends DrawdownModel {
  /** The aquifer model (linear in Q) under the well loss. */
  readonly aquifer: DrawdownModel;
  /** The schedule: start (d) and rate (m3/d) of each step. */
  readonly steps: readonly PumpingStep[];
}

/**
 * The pumped-well model of a stepped schedule: `aquifer` (a DrawdownModel linear in Q, evaluated at the
 * geometry's r, which should be the well radius) driven by `steps` (start d, rate m3/d) plus C Q(t)^n.
 * Parameters: the aquifer's, then C (d^n/m^(3n-1)) and n (1). Drawdown in m at times in d.
 * Source: as in the module comment.
 * @throws SuperpositionInputError for a bad schedule.
 */
export function stepDrawdownModel(aquifer: DrawdownModel, steps: readonly PumpingStep[]): StepDrawdownModel {
  const scheduled = withRateSchedule(aquifer, steps);
  const k = aquifer.parameters.length;
  const model: StepDrawdownModel = {
    id: `${aquifer.id}+well-loss`,
    name: `${aquifer.name}, stepped rates with well loss C Q^n`,
    source:
      `${scheduled.source} Well loss: Jacob, C.E. (1947), Drawdown test to determine effective radius of ` +
      "artesian well, Trans. ASCE 112, 1047-1070; Rorabaugh, M.I. (1953), Graphical and theoretical analysis of " +
      "step-drawdown test of artesian well, Trans. ASCE 118, 907-938.",
    assumptions: [
      ...scheduled.assumptions,
      "The drawdown in the pumped well adds a well loss C Q^n that follows the current rate at once.",
    ],
    validity: [
      ...scheduled.validity,
      "Each step should last long enough for its aquifer response to be seen (several log cycles of the " +
        "Theis curve are not needed; the superposition handles unfinished steps).",
    ],
    cautions: [
      ...scheduled.cautions,
      "C and n are strongly correlated; with three steps or fewer, or a narrow range of rates, fix n = 2.",
      "Skin (a linear loss) and S trade off in the pumped well; the fitted S from the pumped well alone is not a " +
        "reliable aquifer storativity.",
    ],
    parameters: [...aquifer.parameters, wellLossParameter, wellLossExponentParameter],
    aquifer,
    steps: steps.map((step) => ({ start: step.start, rate: step.rate })),
    notSuperposable:
      "its well loss C Q^n is not proportional to the rate, and its own rate schedule is already built in; " +
      "superpose the aquifer model and add C Q^n for the rate of the pumped well.",
    drawdown(p: ArrayLike<number>, geometry: ObservationGeometry, t: ArrayLike<number>, out?: Float64Array): Float64Array {
      const result = scheduled.drawdown(Array.prototype.slice.call(p, 0, k) as number[], geometry, t, out);
      const C = p[k]!;
      const n = p[k + 1]!;
      for (let i = 0; i < t.length; i++) {
        const q = rateAt(steps, t[i]!);
        if (q > 0) result[i]! += C * portablePow(q, n);
      }
      return result;
    },
  };
  if (typeof scheduled.jacobian === "function") {
    // d/dC of C Q^n is Q^n, d/dn is C Q^n ln Q; the aquifer columns are those of the schedule.
    const aquiferJacobian = scheduled.jacobian.bind(scheduled);
    (model as { jacobian?: DrawdownModel["jacobian"] }).jacobian = (p, geometry, t) => {
      const columns = aquiferJacobian(Array.prototype.slice.call(p, 0, k) as number[], geometry, t);
      const dC = new Float64Array(t.length);
      const dn = new Float64Array(t.length);
      const C = p[k]!;
      const n = p[k + 1]!;
      for (let i = 0; i < t.length; i++) {
        const q = rateAt(steps, t[i]!);
        if (q > 0) {
          dC[i] = portablePow(q, n);
          dn[i] = C * dC[i]! * Math.log(q);
        }
      }
      return [...columns, dC, dn];
    };
  }
  return model;
}

/** Input of fitStepDrawdown, base units. */
export interface StepDrawdownFitInput {
  /** Aquifer model linear in Q (e.g. theisModel, papadopulosCooperModel({ rc, rw, skin })). */
  readonly aquifer: DrawdownModel;
  /** The schedule: start (d) and rate (m3/d) of each step. */
  readonly steps: readonly PumpingStep[];
  /** Effective well radius rw, m (the distance at which the aquifer model is evaluated). */
  readonly wellRadius: number;
  /** Times (d since the first step) and drawdowns (m) in the pumped well. */
  readonly t: ArrayLike<number>;
  readonly s: ArrayLike<number>;
  /** Start values by parameter name (base units); C defaults to 1e-7 and n to 2. */
  readonly start?: Readonly<Record<string, number>>;
  /** Parameters held fixed, e.g. { n: 2 } (Jacob) or { S: 1e-4 }. */
  readonly fixed?: Readonly<Record<string, number>>;
  /** Convergence tolerances and the evaluation budget of the fit (fitModel's options of the same names). */
  readonly fit?: Pick<FitOptions, "ftol" | "xtol" | "gtol" | "maxEvaluations">;
}

/** Outcome of fitStepDrawdown: the fit and per-step losses at the fitted parameters. */
export interface StepDrawdownFit {
  readonly fit: FitResult;
  /** Unit of C for the fitted n. */
  readonly wellLossUnit: string;
  /** Per step: rate (m3/d), aquifer loss and well loss at the step's end (m), efficiency (fraction). */
  readonly steps: { rate: number; end: number; aquiferLoss: number; wellLoss: number; efficiency: number }[];
}

/**
 * Fits the stepped record of the pumped well with stepDrawdownModel (fitModel: Levenberg-Marquardt, 95 %
 * intervals from the Student t quantile) and reports per-step aquifer and well losses at each step's end.
 * Times in d, drawdown in m, rates in m3/d. Source: as in the module comment.
 * @throws StepTestInputError for fewer than two steps with pumping or a non-positive well radius.
 */
export function fitStepDrawdown(input: StepDrawdownFitInput): StepDrawdownFit {
  const pumping = input.steps.filter((s) => s.rate > 0);
  if (pumping.length < 2) {
    throw new StepTestInputError(
      `Step test: ${pumping.length} pumping step(s) given; a transient step test needs at least two steps of different rates.`,
    );
  }
  if (!(input.wellRadius > 0 && Number.isFinite(input.wellRadius))) {
    throw new StepTestInputError(`Step test: well radius is ${input.wellRadius} m; give the effective radius of the pumped well (> 0 m).`);
  }
  const model = stepDrawdownModel(input.aquifer, input.steps);
  const geometry = { r: input.wellRadius, Q: pumping[0]!.rate };
  const fit = fitModel({
    model,
    wells: [{ name: "pumped well", geometry, t: input.t, s: input.s }],
    start: { C: 1e-7, n: 2, ...(input.start ?? {}) },
    ...(input.fixed ? { fixed: input.fixed } : {}),
    ...(input.fit ?? {}),
  });
  const values = fit.parameters.map((q) => q.estimate);
  const k = input.aquifer.parameters.length;
  const aquiferOnly = withRateSchedule(input.aquifer, input.steps);
  const steps = input.steps.map((step, i) => {
    const end = i + 1 < input.steps.length ? input.steps[i + 1]!.start : largestOf(input.t);
    const aquiferLoss = aquiferOnly.drawdown(values.slice(0, k), geometry, [end])[0]!;
    const wellLoss = step.rate > 0 ? values[k]! * portablePow(step.rate, values[k + 1]!) : 0;
    return { rate: step.rate, end, aquiferLoss, wellLoss, efficiency: aquiferLoss / (aquiferLoss + wellLoss) };
  });
  return { fit, wellLossUnit: wellLossCoefficientUnit(values[k + 1]!), steps };
}
