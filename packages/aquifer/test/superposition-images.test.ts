import { describe, it, expect } from "vitest";
import { readFileSync } from "node:fs";
import { theisModel, theisDrawdown } from "../src/models/index.js";
import { fitModel } from "../src/fit/index.js";
import {
  boundaryFromWell,
  imageLayout,
  reflect,
  schemeDrawdown,
  withBoundaries,
  SuperpositionInputError,
  type StraightBoundary,
  type Point,
} from "../src/superposition/index.js";

interface Obs { name?: string; x: number; y: number; s: number[] }
// Reference: tests/fixtures/superposition/superposition.json, written by generate_superposition.py: images built
// there by an explicit mirror formula (one line), the dihedral construction about the apex (wedges) and the 1-D
// construction across the strip with 8001 image pairs (strips), products of the 1-D image sets of two perpendicular
// directions (a strip closed at one end, a rectangle); Theis drawdown from scipy.special.exp1.
const fixture = JSON.parse(
  readFileSync(new URL("../../../tests/fixtures/superposition/superposition.json", import.meta.url), "utf8"),
) as {
  cases: {
    singleBoundary: {
      T: number; S: number; Q: number; well: Point; distance: number; normalAngle: number; t: number[]; image: Point;
      cases: { boundary: StraightBoundary; observations: Obs[] }[];
    };
    wedges: { n: number; angleDegrees: number; well: Point; boundaries: StraightBoundary[]; images: number; t: number[]; observations: Obs[] }[];
    strips: { width: number; well: Point; boundaries: StraightBoundary[]; t: number[]; observations: Obs[] }[];
    rectangles: { name: string; well: Point; boundaries: StraightBoundary[]; t: number[]; observations: Obs[] }[];
  };
};
const T = fixture.cases.singleBoundary.T;
const S = fixture.cases.singleBoundary.S;
const Q = fixture.cases.singleBoundary.Q;

function maxRelative(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let worst = 0;
  for (let i = 0; i < b.length; i++) worst = Math.max(worst, Math.abs(a[i]! - b[i]!) / Math.max(Math.abs(b[i]!), 1e-300));
  return worst;
}

function constantWell(p: Point, rate = Q) {
  return { name: "PW", x: p.x, y: p.y, steps: [{ start: 0, rate }] };
}

describe("one straight boundary", () => {
  const c = fixture.cases.singleBoundary;

  it("places the image at the mirror point computed independently", () => {
    const b = boundaryFromWell("no-flow", c.well, c.distance, c.normalAngle);
    const image = reflect(b, c.well);
    expect(image.x).toBeCloseTo(c.image.x, 10);
    expect(image.y).toBeCloseTo(c.image.y, 10);
    expect(b.offset).toBeCloseTo(c.cases[0]!.boundary.offset, 10);
  });

  for (const kind of ["no-flow", "constant-head"] as const) {
    it(`matches s_theis(r) ${kind === "no-flow" ? "+" : "-"} s_theis(r_image) from scipy to 1e-12 for a ${kind} line`, () => {
      const entry = c.cases.find((x) => x.boundary.kind === kind)!;
      const b = boundaryFromWell(kind, c.well, c.distance, c.normalAngle);
      for (const o of entry.observations) {
        const e = schemeDrawdown(theisModel, [T, S], { wells: [constantWell(c.well)], boundaries: [b] }, o, c.t);
        expect(e.imagesUsed).toBe(1);
        expect(maxRelative(e.drawdown, o.s)).toBeLessThan(1e-12);
      }
    });
  }

  it("gives zero drawdown at every time on a constant-head line", () => {
    const well = { x: 0, y: 0 };
    const b = boundaryFromWell("constant-head", well, 100, 0);
    const onLine = [{ x: 100, y: 0 }, { x: 100, y: 250 }, { x: 100, y: -40 }];
    for (const p of onLine) {
      const e = schemeDrawdown(theisModel, [T, S], { wells: [constantWell(well)] , boundaries: [b] }, p, [0.01, 1, 100]);
      const scale = theisDrawdown(T, S, Q, Math.hypot(p.x, p.y), 100);
      for (const v of e.drawdown) expect(Math.abs(v)).toBeLessThan(1e-13 * scale);
    }
  });

  it("gives equal drawdown at points mirror-symmetric about the line through the well normal to the boundary", () => {
    const well = { x: 10, y: 20 };
    for (const kind of ["no-flow", "constant-head"] as const) {
      const b = boundaryFromWell(kind, well, 80, Math.PI / 3);
      // Mirror about the axis through the well along the normal direction (cos 60, sin 60).
      const n = { x: Math.cos(Math.PI / 3), y: Math.sin(Math.PI / 3) };
      const p = { x: 50, y: 5 };
      const d = { x: p.x - well.x, y: p.y - well.y };
      const along = d.x * n.x + d.y * n.y;
      const mirror = { x: well.x + 2 * along * n.x - d.x, y: well.y + 2 * along * n.y - d.y };
      const t = [0.01, 0.3, 10];
      const a = schemeDrawdown(theisModel, [T, S], { wells: [constantWell(well)], boundaries: [b] }, p, t).drawdown;
      const m = schemeDrawdown(theisModel, [T, S], { wells: [constantWell(well)], boundaries: [b] }, mirror, t).drawdown;
      expect(maxRelative(m, a)).toBeLessThan(1e-12);
    }
  });

  it("doubles the late-time Cooper-Jacob slope for a barrier and flattens drawdown to steady for a recharge line", () => {
    const well = { x: 0, y: 0 };
    const p = { x: 30, y: 0 };
    const tA = 1000;
    const tB = 10000;
    const slopeFree = (Q / (4 * Math.PI * T)) * Math.LN10; // Cooper and Jacob (1946): 2.303 Q/(4 pi T) per log cycle.
    const barrier = boundaryFromWell("no-flow", well, 60, Math.PI / 2);
    const sb = schemeDrawdown(theisModel, [T, S], { wells: [constantWell(well)], boundaries: [barrier] }, p, [tA, tB]).drawdown;
    // At u_image = r_i^2 S/(4 T t) ~ 1e-8 both wells are on their straight lines: slope 2 x 2.303 Q/(4 pi T).
    expect((sb[1]! - sb[0]!) / slopeFree).toBeCloseTo(2, 5);
    const recharge = boundaryFromWell("constant-head", well, 60, Math.PI / 2);
    const sr = schemeDrawdown(theisModel, [T, S], { wells: [constantWell(well)], boundaries: [recharge] }, p, [tA, tB]).drawdown;
    // Steady state of a well near a recharge line: s = Q/(2 pi T) ln(r_i/r) (image method, Ferris et al. 1962).
    const steady = (Q / (2 * Math.PI * T)) * Math.log(Math.hypot(30, 120) / 30);
    expect(Math.abs(sr[1]! / steady - 1)).toBeLessThan(1e-6);
    expect(Math.abs(sr[1]! - sr[0]!)).toBeLessThan(1e-5 * steady);
  });

  it("refuses a pumping well outside the aquifer and an observation point beyond the boundary", () => {
    const b = boundaryFromWell("no-flow", { x: 0, y: 0 }, 50, 0);
    expect(() => schemeDrawdown(theisModel, [T, S], { wells: [constantWell({ x: 60, y: 0 })], boundaries: [b] }, { x: 10, y: 0 }, [1])).toThrow(/outside boundary 0/);
    expect(() => schemeDrawdown(theisModel, [T, S], { wells: [constantWell({ x: 0, y: 0 })], boundaries: [b] }, { x: 70, y: 0 }, [1])).toThrow(/observation point "observation" is 20.00 m outside/);
  });
});

describe("two boundaries meeting at 180/n degrees (wedge)", () => {
  for (const w of fixture.cases.wedges) {
    it(`uses ${2 * w.n - 1} images and matches the dihedral construction to 1e-11 for ${w.angleDegrees} degrees, ${w.boundaries[0]!.kind} and ${w.boundaries[1]!.kind}`, () => {
      const layout = imageLayout("test", w.well, w.boundaries);
      expect(layout.kind).toBe("finite");
      if (layout.kind === "finite") expect(layout.images.length).toBe(w.images);
      expect(w.images).toBe(2 * w.n - 1);
      for (const o of w.observations) {
        const e = schemeDrawdown(theisModel, [T, S], { wells: [constantWell(w.well)], boundaries: w.boundaries }, o, w.t);
        expect(e.imagesUsed).toBe(2 * w.n - 1);
        expect(maxRelative(e.drawdown, o.s)).toBeLessThan(1e-11);
      }
    });
  }

  it("refuses an angle that is not 180/n degrees, naming the angle", () => {
    const well = { x: 30, y: 20 };
    const b1: StraightBoundary = { kind: "no-flow", normalAngle: -Math.PI / 2, offset: 0 };
    const alpha = (50 * Math.PI) / 180;
    const b2: StraightBoundary = { kind: "no-flow", normalAngle: alpha + Math.PI / 2, offset: 0 };
    expect(() => imageLayout("test", well, [b1, b2])).toThrow(/meet at 50.0000 degrees/);
  });

  it("refuses mixed boundary kinds at 60 degrees (180/n with n odd), where the image signs conflict", () => {
    const well = { x: 30, y: 10 };
    const b1: StraightBoundary = { kind: "no-flow", normalAngle: -Math.PI / 2, offset: 0 };
    const b2: StraightBoundary = { kind: "constant-head", normalAngle: Math.PI / 3 + Math.PI / 2, offset: 0 };
    expect(() => imageLayout("test", well, [b1, b2])).toThrow(SuperpositionInputError);
    expect(() => imageLayout("test", well, [b1, b2])).toThrow(/n even/);
  });

  it("gives zero drawdown on the constant-head side of a right-angle wedge and symmetric drawdown about the bisector of a barrier wedge", () => {
    const b1: StraightBoundary = { kind: "no-flow", normalAngle: -Math.PI / 2, offset: 0 };
    const b2: StraightBoundary = { kind: "constant-head", normalAngle: Math.PI, offset: 0 };
    const wells = [constantWell({ x: 40, y: 25 })];
    const e = schemeDrawdown(theisModel, [T, S], { wells, boundaries: [b1, b2] }, { x: 0, y: 70 }, [0.1, 10]);
    const scale = theisDrawdown(T, S, Q, 50, 10);
    for (const v of e.drawdown) expect(Math.abs(v)).toBeLessThan(1e-13 * scale);
    // Two barriers at 90 degrees, well on the bisector: points mirrored in the bisector see the same drawdown.
    const c2: StraightBoundary = { kind: "no-flow", normalAngle: Math.PI, offset: 0 };
    const w2 = [constantWell({ x: 30, y: 30 })];
    const a = schemeDrawdown(theisModel, [T, S], { wells: w2, boundaries: [b1, c2] }, { x: 70, y: 15 }, [0.05, 5]).drawdown;
    const b = schemeDrawdown(theisModel, [T, S], { wells: w2, boundaries: [b1, c2] }, { x: 15, y: 70 }, [0.05, 5]).drawdown;
    expect(maxRelative(b, a)).toBeLessThan(1e-12);
  });
});

describe("two parallel boundaries (strip)", () => {
  for (const strip of fixture.cases.strips) {
    it(`converges to the 8001-pair reference within 1e-9 for a ${strip.width} m strip between ${strip.boundaries[0]!.kind} and ${strip.boundaries[1]!.kind} lines, reporting the images used`, () => {
      for (const o of strip.observations) {
        const e = schemeDrawdown(theisModel, [T, S], { wells: [constantWell(strip.well)], boundaries: strip.boundaries, tolerance: 1e-10 }, o, strip.t);
        expect(e.rows).toBeGreaterThan(2);
        expect(e.imagesUsed).toBe(2 * e.rows);
        expect(e.lastRowRelative).toBeLessThanOrEqual(1e-10);
        expect(maxRelative(e.drawdown, o.s)).toBeLessThan(1e-9);
      }
    });
  }

  it("uses more image rows for a tighter tolerance and for later times", () => {
    const strip = fixture.cases.strips[1]!;
    const o = strip.observations[0]!;
    const run = (tolerance: number, t: number[]) =>
      schemeDrawdown(theisModel, [T, S], { wells: [constantWell(strip.well)], boundaries: strip.boundaries, tolerance }, o, t).rows;
    expect(run(1e-12, [1])).toBeGreaterThan(run(1e-4, [1]));
    expect(run(1e-9, [30])).toBeGreaterThan(run(1e-9, [0.1]));
  });

  it("refuses two parallel boundaries facing the same way", () => {
    const b1 = boundaryFromWell("no-flow", { x: 0, y: 0 }, 50, 0);
    const b2 = boundaryFromWell("no-flow", { x: 0, y: 0 }, 90, 0);
    expect(() => imageLayout("test", { x: 0, y: 0 }, [b1, b2])).toThrow(/nearer one hides the farther/);
  });
});

describe("withBoundaries as a fit-ready model", () => {
  it("picks the observation point by geometry.r and lets fitModel recover T and S next to a barrier", () => {
    const c = fixture.cases.singleBoundary;
    const entry = c.cases.find((x) => x.boundary.kind === "no-flow")!;
    const b = boundaryFromWell("no-flow", c.well, c.distance, c.normalAngle);
    const observations = entry.observations.map((o) => ({ name: o.name!, x: o.x, y: o.y }));
    const model = withBoundaries(theisModel, { well: c.well, boundaries: [b], observations });
    const wells = entry.observations.map((o) => ({
      name: o.name!,
      geometry: { r: Math.hypot(o.x - c.well.x, o.y - c.well.y), Q: c.Q },
      t: c.t,
      s: o.s,
    }));
    const result = fitModel({ model, wells, start: { T: 80, S: 1e-3 } });
    expect(result.jacobianMethod).toBe("analytic");
    expect(Math.abs(result.parameters[0]!.estimate / T - 1)).toBeLessThan(1e-6);
    expect(Math.abs(result.parameters[1]!.estimate / S - 1)).toBeLessThan(1e-6);
  });

  it("says which distances are known when geometry.r matches no observation point", () => {
    const model = withBoundaries(theisModel, {
      well: { x: 0, y: 0 },
      boundaries: [boundaryFromWell("no-flow", { x: 0, y: 0 }, 100, 0)],
      observations: [{ name: "OB-1", x: 30, y: 40 }],
    });
    expect(() => model.drawdown([T, S], { r: 20, Q }, [1])).toThrow(/"OB-1" at 50 m/);
  });
});

describe("three or four boundaries at right angles", () => {
  for (const rect of fixture.cases.rectangles) {
    it(`matches the product of 1-D image sets within 1e-9 for a ${rect.name}`, () => {
      for (const o of rect.observations) {
        const e = schemeDrawdown(theisModel, [T, S], { wells: [constantWell(rect.well)], boundaries: rect.boundaries, tolerance: 1e-11 }, o, rect.t);
        expect(e.rows).toBeGreaterThan(2);
        expect(maxRelative(e.drawdown, o.s)).toBeLessThan(1e-9);
      }
    });
  }

  it("gives the mass-balance rate of drawdown Q/(S A) at late time in a closed rectangle", () => {
    // Four no-flow lines around 300 m x 250 m: once the whole area drains, every point falls at dQ/(S A)
    // (volume balance, common practice, no source).
    const well = { x: 100, y: 80 };
    const boundaries: StraightBoundary[] = [
      { kind: "no-flow", normalAngle: Math.PI, offset: 0 },
      { kind: "no-flow", normalAngle: 0, offset: 300 },
      { kind: "no-flow", normalAngle: -Math.PI / 2, offset: 0 },
      { kind: "no-flow", normalAngle: Math.PI / 2, offset: 250 },
    ];
    const e = schemeDrawdown(theisModel, [T, S], { wells: [constantWell(well)], boundaries, tolerance: 1e-12 }, { x: 250, y: 200 }, [2, 3]);
    const rate = (e.drawdown[1]! - e.drawdown[0]!) / 1;
    expect(Math.abs(rate / (Q / (S * 300 * 250)) - 1)).toBeLessThan(1e-6);
  });

  it("refuses three boundaries that are not at right angles, and more than four", () => {
    const b = (kind: "no-flow" | "constant-head", angle: number, offset: number): StraightBoundary => ({ kind, normalAngle: angle, offset });
    const well = { x: 10, y: 10 };
    expect(() => imageLayout("test", well, [b("no-flow", Math.PI, 0), b("no-flow", 0, 100), b("no-flow", Math.PI / 3, 200)])).toThrow(/meet at 60.0000 degrees, not 90/);
    const five = [b("no-flow", Math.PI, 0), b("no-flow", 0, 100), b("no-flow", -Math.PI / 2, 0), b("no-flow", Math.PI / 2, 100), b("no-flow", Math.PI / 4, 500)];
    expect(() => schemeDrawdown(theisModel, [T, S], { wells: [constantWell(well)], boundaries: five }, { x: 20, y: 20 }, [1])).toThrow(/5 boundaries given/);
  });
});
