/**
 * The observation series: drawdown against elapsed time at one observation point, with the units, the
 * geometry and the pumping that produced it, and every point that was left out with the reason.
 *
 * Conventions (common practice, no source): drawdown is positive when the water level falls below its
 * static level; a pumping rate is positive for abstraction; time is elapsed time since pumping started.
 *
 * Invariant kept by `createObservationSeries`: times are finite, strictly increasing and greater than 0,
 * so every point can be placed on a log time axis. A reading at t = 0 (the start of pumping, where the
 * drawdown is 0 by definition) carries no information for a fit and cannot be drawn on a log axis; it is
 * kept in `excluded` with that reason rather than in the series.
 */

import { checkUnit } from "./unit-checks.js";

/** A number with its unit string (a unit understood by the units module), e.g. { value: 25, unit: "m" }. */
export interface ValueWithUnit {
  readonly value: number;
  readonly unit: string;
}

/** One step of a pumping schedule: from elapsed time `start` on, the well pumps at `rate`. */
export interface RateStep {
  /** Elapsed time when the step begins, in the series' timeUnit. */
  readonly start: number;
  /** Pumping rate during the step, in the schedule's unit; positive for abstraction, 0 when the pump is off. */
  readonly rate: number;
}

/** A pumping rate that changes in steps (step tests, recovery after shut-down). */
export interface RateSchedule {
  /** Unit of every step's rate, a discharge unit such as "m3/d" or "L/s". */
  readonly unit: string;
  /** Steps in order of start time; the first starts at 0. */
  readonly steps: readonly RateStep[];
}

/** A constant pumping rate or a schedule of steps. */
export type PumpingRate = ValueWithUnit | RateSchedule;

/** A reading that is not part of the series, and why. */
export interface ExcludedPoint {
  /** 1-based line of the source file where the reading's record starts (for series not read from a file: 1-based position in the input). */
  readonly row: number;
  /** Elapsed time in the series' timeUnit, NaN when the reading had none. */
  readonly time: number;
  /** Drawdown in the series' lengthUnit, NaN when the reading had none or it could not be computed. */
  readonly value: number;
  /** Why the reading was left out, in a sentence. */
  readonly reason: string;
}

/** Drawdown against elapsed time at one observation point. */
export interface ObservationSeries {
  /** Identifier of the observation point, e.g. a well id. */
  readonly name: string;
  /** Elapsed times since pumping started, in timeUnit; finite, > 0, strictly increasing. */
  readonly times: Float64Array;
  /** Drawdowns in lengthUnit, one per time; positive when the level falls. */
  readonly drawdowns: Float64Array;
  /** Unit of times and of schedule step starts, e.g. "min". */
  readonly timeUnit: string;
  /** Unit of drawdowns, e.g. "m". */
  readonly lengthUnit: string;
  /** Distance from the pumping well (the well's radius when the series is from the pumped well). */
  readonly radius: ValueWithUnit;
  /** Pumping rate of the pumping well. */
  readonly pumpingRate: PumpingRate;
  /** Free notes: site, instrument, provenance of the import and of any thinning. */
  readonly metadata: Readonly<Record<string, string>>;
  /** Readings left out of times/drawdowns, with reasons, in order of row. */
  readonly excluded: readonly ExcludedPoint[];
}

/** Fields for `createObservationSeries`; arrays may be any array-like of numbers. */
export interface ObservationSeriesInput {
  readonly name: string;
  readonly times: ArrayLike<number>;
  readonly drawdowns: ArrayLike<number>;
  readonly timeUnit: string;
  readonly lengthUnit: string;
  readonly radius: ValueWithUnit;
  readonly pumpingRate: PumpingRate;
  readonly metadata?: Readonly<Record<string, string>>;
  readonly excluded?: readonly ExcludedPoint[];
}

/** Thrown when the fields of a series break its rules; `problems` lists each, with what would fix it. */
export class SeriesError extends Error {
  override readonly name = "SeriesError";
  readonly problems: readonly string[];

  constructor(seriesName: string, problems: readonly string[]) {
    super(`Observation series '${seriesName}' is not valid:\n${problems.map((p) => `- ${p}`).join("\n")}`);
    this.problems = problems;
  }
}

/** True when the pumping rate is a schedule of steps rather than a constant. */
export function isRateSchedule(rate: PumpingRate): rate is RateSchedule {
  return (rate as RateSchedule).steps !== undefined;
}

/** How many problems of one kind to list before summarising. */
const LISTED_PER_KIND = 5;

function checkTimes(times: ArrayLike<number>, timeUnit: string, problems: string[]): void {
  let listed = 0;
  let unlisted = 0;
  const note = (text: string): void => {
    if (listed < LISTED_PER_KIND) {
      problems.push(text);
      listed++;
    } else unlisted++;
  };
  for (let i = 0; i < times.length; i++) {
    const t = times[i]!;
    if (!Number.isFinite(t)) note(`times[${i}] is ${t}; give a finite elapsed time in ${timeUnit}`);
    else if (t <= 0) {
      note(
        `times[${i}] is ${t} ${timeUnit}; a series holds only t > 0 (log time axis): move readings at or before the start of pumping to 'excluded'`,
      );
    } else if (i > 0 && !(t > times[i - 1]!)) {
      note(`times[${i}] = ${t} does not follow times[${i - 1}] = ${times[i - 1]}; sort the readings by time and merge duplicates`);
    }
  }
  if (unlisted > 0) problems.push(`and ${unlisted} more problems with times`);
}

function checkRate(rate: PumpingRate, timeUnit: string, problems: string[]): void {
  if (!isRateSchedule(rate)) {
    const unitProblem = checkUnit(rate.unit, "discharge", "pumpingRate.unit");
    if (unitProblem !== null) problems.push(unitProblem);
    if (!Number.isFinite(rate.value)) problems.push(`pumpingRate.value is ${rate.value}; give a finite rate`);
    return;
  }
  const unitProblem = checkUnit(rate.unit, "discharge", "pumpingRate.unit");
  if (unitProblem !== null) problems.push(unitProblem);
  if (rate.steps.length === 0) {
    problems.push("pumpingRate.steps is empty; give at least one step starting at 0");
    return;
  }
  if (rate.steps[0]!.start !== 0) {
    problems.push(
      `pumpingRate.steps[0].start is ${rate.steps[0]!.start} ${timeUnit}; the first step starts when pumping starts, at 0`,
    );
  }
  rate.steps.forEach((step, i) => {
    if (!Number.isFinite(step.rate)) problems.push(`pumpingRate.steps[${i}].rate is ${step.rate}; give a finite rate`);
    if (i > 0 && !(step.start > rate.steps[i - 1]!.start)) {
      problems.push(
        `pumpingRate.steps[${i}].start (${step.start}) is not after steps[${i - 1}].start (${rate.steps[i - 1]!.start}); list steps in time order`,
      );
    }
  });
}

/**
 * Builds an observation series after checking it: equal lengths, times finite, > 0 and strictly
 * increasing, drawdowns finite, units of the right dimension (time, length, discharge), radius > 0,
 * pumping schedule starting at 0 in time order. Copies the arrays into fresh Float64Arrays.
 * @throws SeriesError listing every problem found.
 */
export function createObservationSeries(input: ObservationSeriesInput): ObservationSeries {
  const problems: string[] = [];
  if (input.name.trim() === "") problems.push("name is empty; give the observation point's id, e.g. the well id");
  if (input.times.length !== input.drawdowns.length) {
    problems.push(
      `times has ${input.times.length} values but drawdowns has ${input.drawdowns.length}; give one drawdown per time`,
    );
  }
  for (const [unit, dimension, field] of [
    [input.timeUnit, "time", "timeUnit"],
    [input.lengthUnit, "length", "lengthUnit"],
    [input.radius.unit, "length", "radius.unit"],
  ] as const) {
    const unitProblem = checkUnit(unit, dimension, field);
    if (unitProblem !== null) problems.push(unitProblem);
  }
  checkTimes(input.times, input.timeUnit, problems);
  let badDrawdowns = 0;
  for (let i = 0; i < input.drawdowns.length; i++) {
    if (!Number.isFinite(input.drawdowns[i]!)) {
      if (badDrawdowns < LISTED_PER_KIND) {
        problems.push(`drawdowns[${i}] is ${input.drawdowns[i]}; give a finite drawdown or move the reading to 'excluded'`);
      }
      badDrawdowns++;
    }
  }
  if (badDrawdowns > LISTED_PER_KIND) problems.push(`and ${badDrawdowns - LISTED_PER_KIND} more non-finite drawdowns`);
  if (!(input.radius.value > 0) || !Number.isFinite(input.radius.value)) {
    problems.push(`radius.value is ${input.radius.value}; give the distance from the pumping well, > 0`);
  }
  checkRate(input.pumpingRate, input.timeUnit, problems);
  if (problems.length > 0) throw new SeriesError(input.name, problems);
  return {
    name: input.name,
    times: Float64Array.from(input.times),
    drawdowns: Float64Array.from(input.drawdowns),
    timeUnit: input.timeUnit,
    lengthUnit: input.lengthUnit,
    radius: { value: input.radius.value, unit: input.radius.unit },
    pumpingRate: isRateSchedule(input.pumpingRate)
      ? { unit: input.pumpingRate.unit, steps: input.pumpingRate.steps.map((s) => ({ start: s.start, rate: s.rate })) }
      : { value: input.pumpingRate.value, unit: input.pumpingRate.unit },
    metadata: { ...(input.metadata ?? {}) },
    excluded: [...(input.excluded ?? [])],
  };
}
