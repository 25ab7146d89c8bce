import { describe, it, expect } from "vitest";
import { readFileSync } from "node:fs";
import { thiemTwoWells } from "../src/models/index.js";
import { cooperJacobDistance, thiemDistance, SuperpositionInputError } from "../src/superposition/index.js";

// Reference: tests/fixtures/superposition/superposition.json (generate_superposition.py): Theis drawdowns at five
// distances at one time (scipy.special.exp1), Thiem drawdowns with small invented offsets, and numpy.polyfit lines.
const fixture = JSON.parse(
  readFileSync(new URL("../../../tests/fixtures/superposition/superposition.json", import.meta.url), "utf8"),
) as {
  cases: {
    distanceDrawdown: { T: number; S: number; Q: number; t: number; r: number[]; s: number[]; polyfitLog10: { slope: number; T: number; r0: number; S: number } };
    thiem: { Q: number; r: number[]; s: number[]; trueT: number; trueR: number; polyfitLn: { T: number; R: number } };
  };
};

describe("Cooper-Jacob distance-drawdown", () => {
  const d = fixture.cases.distanceDrawdown;

  it("matches numpy.polyfit's line to 1e-10 and recovers the Theis T within 0.1 % and S within 1 %", () => {
    const result = cooperJacobDistance({ r: d.r, s: d.s, Q: d.Q, t: d.t });
    expect(Math.abs(result.slopePerLogCycle / -d.polyfitLog10.slope - 1)).toBeLessThan(1e-10);
    expect(Math.abs(result.T / d.polyfitLog10.T - 1)).toBeLessThan(1e-10);
    expect(Math.abs(result.r0 / d.polyfitLog10.r0 - 1)).toBeLessThan(1e-9);
    // All u <= 6e-4 here, where the straight line is within 0.1 % of Theis (Cooper and Jacob 1946).
    expect(Math.abs(result.T / d.T - 1)).toBeLessThan(1e-3);
    expect(Math.abs(result.S / d.S - 1)).toBeLessThan(1e-2);
    expect(result.warnings).toEqual([]);
  });

  it("warns when u is large at some wells", () => {
    const result = cooperJacobDistance({ r: d.r, s: d.s, Q: d.Q, t: d.t, uMax: 1e-4 });
    expect(result.warnings[0]).toMatch(/u exceeds 0.0001 at wells/);
  });

  it("refuses drawdowns that grow with distance", () => {
    expect(() => cooperJacobDistance({ r: [10, 20], s: [0.1, 0.2], Q: 100, t: 1 })).toThrow(SuperpositionInputError);
  });
});

describe("Thiem distance-drawdown", () => {
  const th = fixture.cases.thiem;

  it("matches numpy.polyfit on ln r to 1e-10 over four wells", () => {
    const result = thiemDistance({ r: th.r, s: th.s, Q: th.Q });
    expect(Math.abs(result.T / th.polyfitLn.T - 1)).toBeLessThan(1e-10);
    expect(Math.abs(result.R / th.polyfitLn.R - 1)).toBeLessThan(1e-9);
    expect(Math.abs(result.T / th.trueT - 1)).toBeLessThan(0.01);
    expect(result.TStandardError).toBeGreaterThan(0);
  });

  it("agrees with the two-well Thiem formula for two wells", () => {
    const result = thiemDistance({ r: [th.r[0]!, th.r[2]!], s: [th.s[0]!, th.s[2]!], Q: th.Q });
    expect(result.T).toBeCloseTo(thiemTwoWells(th.Q, th.r[0]!, th.s[0]!, th.r[2]!, th.s[2]!), 9);
    expect(Number.isNaN(result.TStandardError)).toBe(true);
  });
});
