/**
 * Step-drawdown data: rates and step-end drawdowns with their units, brought to base units (Q in m3/d,
 * s in m), and the extraction of step-end drawdowns from a full drawdown record of a stepped schedule.
 */

import { isRateSchedule, toBaseUnits } from "../data/index.js";
import type { ObservationSeries } from "../data/index.js";
import { UnitError, convert, requireDimension } from "../units/index.js";
import { StepTestInputError } from "./errors.js";

/** One step: the pumping rate and the drawdown in the pumped well at the end of the step. */
export interface StepReading {
  /** Pumping rate of the step, in `rateUnit`; positive for abstraction. */
  readonly rate: number;
  /** Drawdown in the pumped well at the end of the step, in `drawdownUnit`; positive when the level falls. */
  readonly drawdown: number;
}

/** Steps of a step-drawdown test with the units of their numbers. */
export interface StepDrawdownInput {
  /** Discharge unit of every rate, e.g. "m3/d", "L/s", "US gpm". */
  readonly rateUnit: string;
  /** Length unit of every drawdown, e.g. "m", "ft". */
  readonly drawdownUnit: string;
  /** Steps in the order they were pumped. */
  readonly steps: readonly StepReading[];
}

/** Steps in base units. */
export interface StepsInBaseUnits {
  /** Rates, m3/d. */
  readonly Q: Float64Array;
  /** Step-end drawdowns, m. */
  readonly s: Float64Array;
}

function unitOrThrow(unit: string, dimension: "discharge" | "length", what: string): void {
  try {
    requireDimension(unit, dimension, what);
  } catch (error) {
    if (error instanceof UnitError) throw new StepTestInputError(`Step test: ${error.message}.`);
    throw error;
  }
}

/**
 * The steps in base units (Q m3/d, s m), after checking units, that every rate and drawdown is positive and
 * finite, that the rates differ, and that there are at least `minimumSteps` steps.
 * @throws StepTestInputError naming the step and value that is wrong.
 */
export function stepsToBaseUnits(input: StepDrawdownInput, minimumSteps: number): StepsInBaseUnits {
  unitOrThrow(input.rateUnit, "discharge", "the step rates");
  unitOrThrow(input.drawdownUnit, "length", "the step drawdowns");
  const n = input.steps.length;
  if (n < minimumSteps) {
    throw new StepTestInputError(
      `Step test: ${n} step(s) given; this method needs at least ${minimumSteps} steps of different rates.`,
    );
  }
  const Q = new Float64Array(n);
  const s = new Float64Array(n);
  input.steps.forEach((step, i) => {
    if (!(Number.isFinite(step.rate) && step.rate > 0)) {
      throw new StepTestInputError(`Step ${i + 1}: rate = ${step.rate} ${input.rateUnit}; give a positive abstraction rate.`);
    }
    if (!(Number.isFinite(step.drawdown) && step.drawdown > 0)) {
      throw new StepTestInputError(
        `Step ${i + 1}: drawdown = ${step.drawdown} ${input.drawdownUnit}; give the positive drawdown at the end of the step.`,
      );
    }
    Q[i] = convert(step.rate, input.rateUnit, "m3/d");
    s[i] = convert(step.drawdown, input.drawdownUnit, "m");
  });
  const sorted = Array.from(Q).sort((a, b) => a - b);
  for (let i = 1; i < n; i++) {
    if (sorted[i] === sorted[i - 1]) {
      throw new StepTestInputError(
        `Step test: two steps have the same rate ${fromBaseText(sorted[i]!, input.rateUnit)}; each step needs its own rate.`,
      );
    }
  }
  return { Q, s };
}

function fromBaseText(valueM3d: number, unit: string): string {
  return `${Number(convert(valueM3d, "m3/d", unit).toPrecision(6))} ${unit}`;
}

/** One step of a stepped schedule as found in a drawdown record, base units. */
export interface StepInRecord {
  /** 1-based step number. */
  readonly step: number;
  /** Rate, m3/d. */
  readonly rate: number;
  /** Start of the step, d since pumping started. */
  readonly start: number;
  /** End of the step (start of the next one, or the last reading for the last step), d. */
  readonly end: number;
  /** Indices into the series' arrays of the readings that belong to the step: start < t <= end. */
  readonly indices: readonly number[];
}

/** Step-end drawdowns taken from a record, with where each came from. */
export interface StepEndDrawdowns {
  /** Ready for `jacobStepTest` or `rorabaughStepTest`: rates in m3/d, drawdowns in m. */
  readonly input: StepDrawdownInput;
  /** Per step: the reading used. */
  readonly readings: readonly {
    readonly step: number;
    /** Rate, m3/d. */
    readonly rate: number;
    /** Time of the reading used, d since pumping started. */
    readonly time: number;
    /** Time of the reading since the start of its step, d. */
    readonly elapsedInStep: number;
    /** Step duration, d. */
    readonly duration: number;
    /** Drawdown, m. */
    readonly drawdown: number;
    /** Index of the reading in the series' arrays. */
    readonly index: number;
  }[];
  /** How the drawdowns were taken, for the report. */
  readonly method: string;
  readonly warnings: string[];
}

/**
 * Splits a drawdown record into the steps of its rate schedule. A reading belongs to step k when
 * start_k < t <= start_(k+1): a reading taken at the moment the rate changes still shows the old rate.
 * The last step ends at the last reading. Steps with rate 0 (recovery) end the stepped part of the record.
 * @throws StepTestInputError when the series has a constant rate or a step holds no reading.
 */
export function splitRecordIntoSteps(series: ObservationSeries): StepInRecord[] {
  if (!isRateSchedule(series.pumpingRate)) {
    throw new StepTestInputError(
      `Series "${series.name}": the pumping rate is constant; a step test needs a rate schedule with one entry per step.`,
    );
  }
  const base = toBaseUnits(series);
  const starts = base.steps.start;
  const rates = base.steps.rate;
  const lastTime = base.t[base.t.length - 1]!;
  const steps: StepInRecord[] = [];
  for (let k = 0; k < starts.length; k++) {
    if (!(rates[k]! > 0)) break;
    const start = starts[k]!;
    const end = k + 1 < starts.length ? starts[k + 1]! : lastTime;
    const indices: number[] = [];
    for (let i = 0; i < base.t.length; i++) if (base.t[i]! > start && base.t[i]! <= end) indices.push(i);
    if (indices.length === 0) {
      throw new StepTestInputError(
        `Series "${series.name}", step ${k + 1} (from ${start} d to ${end} d): no reading falls inside the step; ` +
          `check the step start times against the record's time unit (${series.timeUnit}).`,
      );
    }
    steps.push({ step: k + 1, rate: rates[k]!, start, end, indices });
  }
  return steps;
}

/**
 * Drawdown at the end of every pumping step of a record: the last reading of the step (start < t <= end,
 * see `splitRecordIntoSteps`). Warns when a step's last reading is more than 5 % of the step duration before
 * its end, and when the step durations differ by more than 5 % (the Jacob and Rorabaugh fits treat the
 * formation loss coefficient B as one number, which holds for step-end drawdowns of equal-duration steps
 * only approximately and for unequal steps less so).
 */
export function stepEndDrawdowns(series: ObservationSeries): StepEndDrawdowns {
  const base = toBaseUnits(series);
  const steps = splitRecordIntoSteps(series);
  const warnings: string[] = [];
  const readings = steps.map((step) => {
    const index = step.indices[step.indices.length - 1]!;
    const time = base.t[index]!;
    const duration = step.end - step.start;
    if (step.end - time > 0.05 * duration) {
      warnings.push(
        `Step ${step.step}: the last reading is at ${fmt(time - step.start)} d into a step of ${fmt(duration)} d; ` +
          `its drawdown is not the step-end drawdown.`,
      );
    }
    return { step: step.step, rate: step.rate, time, elapsedInStep: time - step.start, duration, drawdown: base.s[index]!, index };
  });
  const durations = readings.map((r) => r.duration);
  const shortest = Math.min(...durations);
  const longest = Math.max(...durations);
  if (longest > 1.05 * shortest) {
    warnings.push(
      `Step durations range from ${fmt(shortest)} d to ${fmt(longest)} d; with unequal steps the step-end drawdowns ` +
        `carry formation losses of different durations, which biases B and C.`,
    );
  }
  return {
    input: {
      rateUnit: "m3/d",
      drawdownUnit: "m",
      steps: readings.map((r) => ({ rate: r.rate, drawdown: r.drawdown })),
    },
    readings,
    method:
      "Step-end drawdown = the last reading with step start < t <= next step start (the last step: the last reading); " +
      "no interpolation or smoothing.",
    warnings,
  };
}

function fmt(v: number): string {
  return Number(v.toPrecision(4)).toString();
}
