import { describe, expect, it } from "vitest";
import { dupuitThiemModel, dupuitThiemTwoWells } from "../src/models/dupuit-thiem.js";
import { thiemModel } from "../src/models/thiem.js";
import { centralDifferences } from "./models-fixture.js";

describe("Dupuit-Thiem steady unconfined flow", () => {
  it("satisfies H^2 - h^2 = Q ln(R/r) / (pi K) at every distance (the defining equation)", () => {
    const H = 18;
    const model = dupuitThiemModel(H);
    for (const r of [0.5, 3, 40, 299]) {
      const s = model.drawdown([12, 300], { r, Q: 900 }, [1])[0]!;
      const h = H - s;
      expect(Math.abs(H * H - h * h - (900 * Math.log(300 / r)) / (Math.PI * 12)) / (H * H)).toBeLessThan(1e-14);
    }
  });

  it("approaches Thiem with T = K H when the drawdown is small (relative gap s / (2H))", () => {
    const H = 50;
    const s = dupuitThiemModel(H).drawdown([20, 500], { r: 30, Q: 10 }, [0])[0]!;
    const thiem = thiemModel.drawdown([20 * H, 500], { r: 30, Q: 10 }, [0])[0]!;
    // Expansion: s = s_T (1 + s_T / (2H) + ...), from the exact form a / (H + sqrt(H^2 - a)).
    expect(Math.abs(s / thiem - 1 - thiem / (2 * H))).toBeLessThan(1e-6);
  });

  it("recovers K from two water levels and is consistent with the model (round trip)", () => {
    const H = 18;
    const model = dupuitThiemModel(H);
    const h1 = H - model.drawdown([7.5, 400], { r: 5, Q: 600 }, [0])[0]!;
    const h2 = H - model.drawdown([7.5, 400], { r: 60, Q: 600 }, [0])[0]!;
    expect(Math.abs(dupuitThiemTwoWells(600, 5, h1, 60, h2) / 7.5 - 1)).toBeLessThan(1e-12);
    expect(() => dupuitThiemTwoWells(600, 5, h2, 60, h1)).toThrow(/do not rise away from the well/);
  });

  it("has a Jacobian matching central differences and gives NaN where the well would be dewatered", () => {
    const model = dupuitThiemModel(10);
    const p = [3, 250];
    const J = model.jacobian!(p, { r: 4, Q: 200 }, [0, 1]);
    const fd = centralDifferences((q) => model.drawdown(q, { r: 4, Q: 200 }, [0, 1]), p);
    for (let k = 0; k < 2; k++) expect(Math.abs(J[k]![0]! / fd[k]![0]! - 1)).toBeLessThan(1e-7);
    expect(model.drawdown([0.01, 1e5], { r: 0.1, Q: 5000 }, [0])[0]).toBeNaN();
  });
});
