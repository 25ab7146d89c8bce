import { describe, expect, it } from "vitest";
import { createObservationSeries } from "../src/data/index.js";
import { expint1 } from "../src/special/index.js";
import { hantushBierschenkStepTest, jacobStepTest, stepEndDrawdowns, StepTestInputError } from "../src/steptest/index.js";

// Invented well: confined aquifer T = 400 m2/d, S = 2e-4, well radius 0.1 m, well loss C = 3e-7 d2/m5,
// four steps of 0.125 d (3 h) at 600, 1200, 1800, 2400 m3/d, readings log-spaced in each step (times in min).
const T = 400;
const S = 2e-4;
const RW = 0.1;
const C = 3e-7;
const DT = 0.125;
const RATES = [600, 1200, 1800, 2400];

/** Theis drawdown at the well by superposition of the rate increments plus the instantaneous well loss C Q(t)^2. */
function drawdown(t: number): number {
  let s = 0;
  let q = 0;
  RATES.forEach((rate, i) => {
    const start = i * DT;
    if (t <= start) return;
    s += ((rate - (i > 0 ? RATES[i - 1]! : 0)) / (4 * Math.PI * T)) * expint1((RW * RW * S) / (4 * T * (t - start)));
    q = rate;
  });
  return s + C * q * q;
}

function record() {
  const times: number[] = [];
  RATES.forEach((_, i) => {
    for (let j = 0; j <= 30; j++) times.push((i * DT + DT * Math.pow(10, -3 + (3 * j) / 30)) * 1440);
  });
  return createObservationSeries({
    name: "PW-1",
    times,
    drawdowns: times.map((t) => drawdown(t / 1440)),
    timeUnit: "min",
    lengthUnit: "m",
    radius: { value: RW, unit: "m" },
    pumpingRate: { unit: "m3/d", steps: RATES.map((rate, i) => ({ start: i * DT * 1440, rate })) },
  });
}

describe("Hantush-Bierschenk (1964) on Theis superposition plus well loss", () => {
  it("recovers C and the formation loss coefficient B(dt) = W(u(dt)) / (4 pi T) within 1e-6 relative", () => {
    // Expected B: Theis formation loss per unit rate dt after a rate change, W(u)/(4 pi T) with u = rw^2 S/(4 T dt)
    // (= 1e-8 here, so Cooper-Jacob, on which the method rests, is exact to about u relative).
    const expectedB = expint1((RW * RW * S) / (4 * T * DT)) / (4 * Math.PI * T);
    const r = hantushBierschenkStepTest(record());
    expect(r.elapsed).toBeCloseTo(DT, 12);
    expect(Math.abs(r.B / expectedB - 1)).toBeLessThan(1e-6);
    expect(Math.abs(r.C / C - 1)).toBeLessThan(1e-6);
    // By-product: the extrapolation slope gives T = 1/(4 pi b) for each step after the first.
    for (const inc of r.increments.slice(1)) expect(Math.abs(inc.transmissivityFromSlope! / T - 1)).toBeLessThan(1e-6);
    expect(r.increments[0]!.increment).toBeCloseTo(drawdown(DT), 12);
    expect(r.wellCondition!.condition).toBe("mild deterioration or clogging"); // 3e-7 d2/m5 = 5.9 s2/ft5
  });

  it("differs from Jacob's fit on the same step-end drawdowns, which mixes formation losses of different durations", () => {
    const ends = stepEndDrawdowns(record());
    const j = jacobStepTest(ends.input);
    const hb = hantushBierschenkStepTest(record());
    expect(ends.readings.map((x) => x.elapsedInStep)).toEqual(RATES.map(() => expect.closeTo(DT, 12)));
    // Jacob's C absorbs the growth of earlier steps' formation loss: biased upward by more than 10 % here.
    expect(j.C / hb.C).toBeGreaterThan(1.1);
  });

  it("refuses an elapsed time longer than the shortest step", () => {
    expect(() => hantushBierschenkStepTest(record(), { elapsed: 0.2 })).toThrow(StepTestInputError);
  });
});

describe("step-end drawdowns from a record", () => {
  it("takes the last reading of each step and says which", () => {
    const series = createObservationSeries({
      name: "PW-2",
      times: [10, 30, 60, 70, 90, 120, 130, 150, 170],
      drawdowns: [0.5, 0.6, 0.65, 1.2, 1.3, 1.35, 2.0, 2.1, 2.12],
      timeUnit: "min",
      lengthUnit: "m",
      radius: { value: 0.1, unit: "m" },
      pumpingRate: { unit: "L/s", steps: [{ start: 0, rate: 5 }, { start: 60, rate: 10 }, { start: 120, rate: 15 }] },
    });
    const e = stepEndDrawdowns(series);
    expect(e.readings.map((r) => r.index)).toEqual([2, 5, 8]);
    expect(e.input.steps.map((s) => s.drawdown)).toEqual([0.65, 1.35, 2.12]);
    expect(e.input.steps[1]!.rate).toBeCloseTo(10 * 86.4, 12); // 1 L/s = 86.4 m3/d
    // The last step ends at its last reading (170 min): 50 min against 60 min for the others.
    expect(e.warnings.join(" ")).toMatch(/durations range/);
  });
});
