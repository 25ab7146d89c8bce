import { describe, expect, it } from "vitest";
import { theisMatchPoint } from "../src/models/match-point.js";
import { theisDrawdown } from "../src/models/theis.js";

describe("Theis match-point arithmetic", () => {
  it("gives T and S from a match point as worked by hand", () => {
    // Invented match point: Q = 1200 m3/d, r = 40 m; on the type curve W = 1 at 1/u = 10 (u = 0.1);
    // on the data plot s = 0.35 m at t = 0.02 d.
    // T = Q W / (4 pi s) = 1200 x 1 / (12.566371 x 0.35) = 1200 / 4.398230 = 272.837 m2/d
    // S = 4 T t u / r^2 = 4 x 272.837 x 0.02 x 0.1 / 1600 = 2.182696 / 1600 = 1.36419e-3
    const { T, S } = theisMatchPoint({ Q: 1200, r: 40, W: 1, u: 0.1, s: 0.35, t: 0.02 });
    expect(T).toBeCloseTo(272.837, 3);
    expect(S).toBeCloseTo(1.36419e-3, 8);
  });

  it("returns the T and S that reproduce the matched drawdown through the Theis solution", () => {
    // Any point on the curve is a valid match point: pick W(u) at u = 0.1 (W = 1.8229, mpmath e1(0.1)).
    const W = 1.8229239584193906;
    const { T, S } = theisMatchPoint({ Q: 1200, r: 40, W, u: 0.1, s: 0.35, t: 0.02 });
    expect(theisDrawdown(T, S, 1200, 40, 0.02)).toBeCloseTo(0.35, 12);
  });

  it("refuses a zero drawdown at the match point", () => {
    expect(() => theisMatchPoint({ Q: 1200, r: 40, W: 1, u: 0.1, s: 0, t: 0.02 })).toThrow(/drawdown s is 0 m/);
  });
});
