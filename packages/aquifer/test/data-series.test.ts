import { describe, it, expect } from "vitest";
import {
  SeriesError,
  createObservationSeries,
  drawdownFromDepthToWater,
  drawdownFromHead,
  toBaseUnits,
} from "../src/data/index.js";
import type { ObservationSeriesInput } from "../src/data/index.js";

/** Invented example: observation well OB-2 of the Hollow Creek wellfield, 25 m from pumping well PW-1. */
const ob2: ObservationSeriesInput = {
  name: "OB-2",
  times: [1, 2, 5, 10, 30],
  drawdowns: [0.05, 0.11, 0.2, 0.27, 0.38],
  timeUnit: "min",
  lengthUnit: "m",
  radius: { value: 25, unit: "m" },
  pumpingRate: { value: 12, unit: "L/s" },
  metadata: { site: "Hollow Creek wellfield" },
};

describe("building an observation series", () => {
  it("copies the readings into Float64Arrays and keeps units, geometry and notes", () => {
    const series = createObservationSeries(ob2);
    expect(series.times).toEqual(Float64Array.from([1, 2, 5, 10, 30]));
    expect(series.drawdowns).toEqual(Float64Array.from([0.05, 0.11, 0.2, 0.27, 0.38]));
    expect(series).toMatchObject({ name: "OB-2", timeUnit: "min", lengthUnit: "m", metadata: { site: "Hollow Creek wellfield" }, excluded: [] });
  });

  it("refuses times at or before the start of pumping, out of order, or of unequal length, listing each", () => {
    let error: unknown;
    try {
      createObservationSeries({ ...ob2, times: [0, 2, 2, 1], drawdowns: [0, 0.1, 0.2] });
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(SeriesError);
    expect((error as SeriesError).problems).toEqual([
      "times has 4 values but drawdowns has 3; give one drawdown per time",
      "times[0] is 0 min; a series holds only t > 0 (log time axis): move readings at or before the start of pumping to 'excluded'",
      "times[2] = 2 does not follow times[1] = 2; sort the readings by time and merge duplicates",
      "times[3] = 1 does not follow times[2] = 2; sort the readings by time and merge duplicates",
    ]);
    expect((error as SeriesError).message).toContain("Observation series 'OB-2' is not valid:\n- times has 4 values");
  });

  it("refuses units of the wrong dimension and unknown units, naming the field", () => {
    expect(() => createObservationSeries({ ...ob2, timeUnit: "m", radius: { value: 25, unit: "mins" } })).toThrow(
      /timeUnit: expected a time, in a unit such as 'd', got 'm' \(a length\)\n- radius.unit: unknown unit 'mins'; for a length try 'in', 'm', 'mm'/,
    );
    expect(() => createObservationSeries({ ...ob2, pumpingRate: { value: 12, unit: "L" } })).toThrow(
      "pumpingRate.unit: expected a discharge, in a unit such as 'm3/d', got 'L' (a volume)",
    );
  });

  it("refuses a pumping schedule that does not start at 0 or is out of order", () => {
    expect(() =>
      createObservationSeries({
        ...ob2,
        pumpingRate: { unit: "L/s", steps: [{ start: 5, rate: 8 }, { start: 5, rate: 12 }] },
      }),
    ).toThrow(
      "- pumpingRate.steps[0].start is 5 min; the first step starts when pumping starts, at 0\n- pumpingRate.steps[1].start (5) is not after steps[0].start (5); list steps in time order",
    );
  });

  it("refuses a radius that is not positive and drawdowns that are not finite", () => {
    expect(() => createObservationSeries({ ...ob2, radius: { value: 0, unit: "m" }, drawdowns: [0.05, Number.NaN, 0.2, 0.27, 0.38] })).toThrow(
      "- drawdowns[1] is NaN; give a finite drawdown or move the reading to 'excluded'\n- radius.value is 0; give the distance from the pumping well, > 0",
    );
  });
});

describe("expressing a series in base units (m, d, m3/d)", () => {
  it("converts minutes to days, feet to metres and litres per second to m3/d with the exact defining factors", () => {
    // Factors: 1 min = 1/1440 d, 1 ft = 0.3048 m exactly, 1 L/s = 86.4 m3/d (NIST SP 811 (2008) App. B.8).
    const base = toBaseUnits(createObservationSeries({ ...ob2, lengthUnit: "ft", radius: { value: 82, unit: "ft" } }));
    expect(Array.from(base.t)).toEqual([1, 2, 5, 10, 30].map((t) => expect.closeTo(t / 1440, 15)));
    expect(base.t[4]! / (30 / 1440)).toBeCloseTo(1, 14);
    expect(base.s[4]! / (0.38 * 0.3048)).toBeCloseTo(1, 14);
    expect(base.r / (82 * 0.3048)).toBeCloseTo(1, 14);
    expect(base.Q! / (12 * 86.4)).toBeCloseTo(1, 14);
    expect(Array.from(base.steps.start)).toEqual([0]);
  });

  it("gives a schedule's step starts in days and rates in m3/d, with no single constant Q", () => {
    const base = toBaseUnits(
      createObservationSeries({
        ...ob2,
        timeUnit: "h",
        pumpingRate: { unit: "m3/h", steps: [{ start: 0, rate: 30 }, { start: 2, rate: 45 }, { start: 4, rate: 0 }] },
      }),
    );
    expect(base.Q).toBeNull();
    expect(Array.from(base.steps.start)).toEqual([0, 2 / 24, 4 / 24].map((x) => expect.closeTo(x, 15)));
    expect(Array.from(base.steps.rate)).toEqual([720, 1080, 0].map((x) => expect.closeTo(x, 10)));
  });
});

describe("drawdown from water levels", () => {
  it("is the static head minus the head, positive when the level falls (definition of drawdown)", () => {
    expect(Array.from(drawdownFromHead([101.5, 101.25, 100.75], 102))).toEqual([0.5, 0.75, 1.25]);
  });

  it("is the depth to water minus the static depth (definition of drawdown)", () => {
    expect(Array.from(drawdownFromDepthToWater([12.5, 12.75, 13.5], 12.25))).toEqual([0.25, 0.5, 1.25]);
  });
});
