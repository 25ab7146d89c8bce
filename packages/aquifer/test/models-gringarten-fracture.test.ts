import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { gringartenFractureModel, theisModel } from "../src/models/index.js";

const fixture = JSON.parse(readFileSync(new URL("../../../tests/fixtures/fracture/fracture.json", import.meta.url), "utf8")) as {
  T: number; S: number; Q: number; halfLength: number; cases: { x: number; y: number; t: number; s: number }[];
};

describe("Gringarten (1974) vertical fracture", () => {
  const model = gringartenFractureModel({ halfLength: fixture.halfLength });
  const p = [fixture.T, fixture.S];

  it("matches scipy quadrature of the line-sink superposition on and off the fracture (1e-10 relative)", () => {
    for (const c of fixture.cases) {
      const g = c.x === 0 && c.y === 0 ? { r: 0.1, Q: fixture.Q } : { r: Math.hypot(c.x, c.y), Q: fixture.Q, x: c.x, y: c.y };
      const s = model.drawdown(p, g, [c.t])[0]!;
      expect(Math.abs(s / c.s - 1), `x ${c.x}, y ${c.y}, t ${c.t}`).toBeLessThan(1e-10);
    }
  });

  it("shows linear flow at early time: s = (Q / (2 xf)) sqrt(t / (pi T S)) at the well", () => {
    const t = 1e-6;
    const s = model.drawdown(p, { r: 0.1, Q: fixture.Q }, [t])[0]!;
    const linear = (fixture.Q / (2 * fixture.halfLength)) * Math.sqrt(t / (Math.PI * fixture.T * fixture.S));
    expect(Math.abs(s / linear - 1)).toBeLessThan(1e-6);
  });

  it("turns radial at late time: ds/d ln t -> Q / (4 pi T)", () => {
    const [a, b] = model.drawdown(p, { r: 0.1, Q: fixture.Q }, [1000, 1000 * Math.E]);
    expect(Math.abs((b! - a!) / (fixture.Q / (4 * Math.PI * fixture.T)) - 1)).toBeLessThan(1e-3);
  });

  it("infinite conductivity acts at late time as a well of radius xf / 2 (Prats 1961; from memory)", () => {
    const infinite = gringartenFractureModel({ halfLength: 15, conductivity: "infinite-conductivity" });
    const s = infinite.drawdown(p, { r: 0.1, Q: 250 }, [100])[0]!;
    const theis = theisModel.drawdown(p, { r: 7.5, Q: 250 }, [100])[0]!;
    expect(Math.abs(s / theis - 1)).toBeLessThan(5e-3);
  });
});
