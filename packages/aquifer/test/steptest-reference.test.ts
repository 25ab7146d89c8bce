import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { jacobStepTest, rorabaughStepTest } from "../src/steptest/index.js";

// Reference: tests/fixtures/steptest/steptest.json from generate_steptest.py: numpy.polyfit (Jacob's line) and
// scipy.optimize.curve_fit (MINPACK Levenberg-Marquardt, Rorabaugh's power law) on invented noisy steps: an
// implementation independent of the library's line fit and Levenberg-Marquardt.
interface StepFixture {
  rates: number[];
  rateUnit: string;
  drawdownUnit: string;
  jacob: { drawdowns: number[]; B: number; C: number; seB: number; seC: number };
  rorabaugh: { drawdowns: number[]; B: number; C: number; n: number; seB: number; seC: number; seN: number };
}
const fixture = JSON.parse(readFileSync(new URL("../../../tests/fixtures/steptest/steptest.json", import.meta.url), "utf8")) as StepFixture;
const relative = (a: number, b: number) => Math.abs(a / b - 1);

describe("step-drawdown fits against numpy and scipy on the same noisy steps", () => {
  it("Jacob: B, C and their standard errors as numpy.polyfit gives them, to 1e-10", () => {
    const r = jacobStepTest({ rateUnit: fixture.rateUnit, drawdownUnit: fixture.drawdownUnit, steps: fixture.rates.map((rate, i) => ({ rate, drawdown: fixture.jacob.drawdowns[i]! })) });
    expect(relative(r.B, fixture.jacob.B)).toBeLessThan(1e-10);
    expect(relative(r.C, fixture.jacob.C)).toBeLessThan(1e-10);
    expect(relative(r.parameters[0]!.standardError!, fixture.jacob.seB)).toBeLessThan(1e-9);
    expect(relative(r.parameters[1]!.standardError!, fixture.jacob.seC)).toBeLessThan(1e-9);
  });

  it("Rorabaugh: B, C, n and their standard errors as scipy's curve_fit gives them, to 1e-6", () => {
    const r = rorabaughStepTest({ rateUnit: fixture.rateUnit, drawdownUnit: fixture.drawdownUnit, steps: fixture.rates.map((rate, i) => ({ rate, drawdown: fixture.rorabaugh.drawdowns[i]! })) });
    expect(relative(r.B, fixture.rorabaugh.B)).toBeLessThan(1e-6);
    expect(relative(r.C, fixture.rorabaugh.C)).toBeLessThan(1e-5);
    expect(relative(r.n, fixture.rorabaugh.n)).toBeLessThan(1e-7);
    const [b, c, n] = r.parameters;
    expect(relative(b!.standardError!, fixture.rorabaugh.seB)).toBeLessThan(1e-5);
    expect(relative(c!.standardError!, fixture.rorabaugh.seC)).toBeLessThan(1e-5);
    expect(relative(n!.standardError!, fixture.rorabaugh.seN)).toBeLessThan(1e-5);
  });
});
