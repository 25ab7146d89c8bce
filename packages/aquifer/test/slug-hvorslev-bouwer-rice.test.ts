import { describe, expect, it } from "vitest";
import { convert } from "../src/units/index.js";
import {
  bouwerRiceCoefficients,
  bouwerRiceLnReRw,
  bouwerRiceSlugTest,
  hvorslevSlugTest,
  SlugTestInputError,
} from "../src/slug/index.js";
import { normalGenerator } from "../../../tests/support/seeded-noise.js";

/** An invented record H = H0 exp(-t/T0) (t in min, H in m) at log-spaced times. */
function exponentialRecord(H0: number, T0min: number, count = 25, noise?: () => number) {
  const times = Array.from({ length: count }, (_, i) => 0.1 * Math.pow(10, (2.5 * i) / (count - 1)));
  return {
    name: "MW-7",
    times,
    timeUnit: "min",
    displacements: times.map((t) => H0 * Math.exp(-t / T0min) * (noise ? Math.exp(noise()) : 1)),
    lengthUnit: "m",
    initialDisplacement: { value: H0, unit: "m" },
  };
}

describe("Hvorslev (1951) slug-test analysis", () => {
  it("gives K = rc^2 ln[x + sqrt(1 + x^2)] / (2 Le T0), x = Le/(2R), for numbers worked by hand", () => {
    // By hand: rc = 0.025 m, R = 0.05 m, Le = 1.5 m, T0 = 14.4 min = 0.01 d: x = 15,
    // ln(15 + sqrt(226)) = ln(30.033296) = 3.402307, K = 0.000625 * 3.402307 / (2 * 1.5 * 0.01) = 0.0708814 m/d
    // (the long-intake form rc^2 ln(Le/R)/(2 Le T0) gives 0.0708583, 0.03 % less).
    const r = hvorslevSlugTest(exponentialRecord(0.8, 14.4), {
      casingRadius: { value: 2.5, unit: "cm" },
      intakeRadius: { value: 0.05, unit: "m" },
      intakeLength: { value: 1.5, unit: "m" },
    });
    expect(r.K).toBeCloseTo(0.0708814, 6);
    expect(Math.abs(r.line.basicTimeLag / 0.01 - 1)).toBeLessThan(1e-12);
    expect(r.line.timeAt037).toBeCloseTo(0.01 * -Math.log(0.37), 12);
    expect(r.lengthToRadius).toBeCloseTo(30, 12);
    expect(r.warnings).toEqual([]);
  });

  it("treats a rising head after a removed slug like a falling one", () => {
    const falling = hvorslevSlugTest(exponentialRecord(0.8, 14.4), {
      casingRadius: { value: 0.025, unit: "m" },
      intakeRadius: { value: 0.05, unit: "m" },
      intakeLength: { value: 1.5, unit: "m" },
    });
    const rec = exponentialRecord(-0.8, 14.4);
    const rising = hvorslevSlugTest(rec, {
      casingRadius: { value: 0.025, unit: "m" },
      intakeRadius: { value: 0.05, unit: "m" },
      intakeLength: { value: 1.5, unit: "m" },
    });
    expect(rising.K).toBeCloseTo(falling.K, 14);
  });

  it("covers the true K with its 95 % interval in about 95 % of seeded noisy records", () => {
    // Multiplicative noise (sd 0.02 in ln H) keeps the straight line's assumptions; 300 replicates, binomial
    // 99.9 % range for p = 0.95 about 274..295.
    const normal = normalGenerator(5);
    const trueK = 0.0708814;
    let cover = 0;
    for (let k = 0; k < 300; k++) {
      const r = hvorslevSlugTest(exponentialRecord(0.8, 14.4, 20, () => 0.02 * normal()), {
        casingRadius: { value: 0.025, unit: "m" },
        intakeRadius: { value: 0.05, unit: "m" },
        intakeLength: { value: 1.5, unit: "m" },
      });
      if (r.ci95![0] <= trueK && trueK <= r.ci95![1]) cover++;
    }
    expect(cover).toBeGreaterThanOrEqual(274);
    expect(cover).toBeLessThanOrEqual(295);
  });

  it("warns for a line that does not start at H/H0 = 1", () => {
    const rec = exponentialRecord(0.8, 14.4);
    const shifted = { ...rec, initialDisplacement: { value: 1.2, unit: "m" } };
    const r = hvorslevSlugTest(shifted, {
      casingRadius: { value: 0.025, unit: "m" },
      intakeRadius: { value: 0.05, unit: "m" },
      intakeLength: { value: 0.3, unit: "m" },
    });
    expect(r.warnings.join(" ")).toMatch(/starts at H\/H0 = 0\.667/);
  });

  it("refuses intakes shorter than two radii, where the shape factor does not apply, and returns a positive K with an ordered interval from Le/R = 2", () => {
    const geometry = (Le: number) => ({ casingRadius: { value: 0.025, unit: "m" }, intakeRadius: { value: 0.05, unit: "m" }, intakeLength: { value: Le, unit: "m" } });
    expect(() => hvorslevSlugTest(exponentialRecord(0.8, 14.4), geometry(0.025))).toThrow(/0\.5 radii long/);
    expect(() => hvorslevSlugTest(exponentialRecord(0.8, 14.4), geometry(0.05))).toThrow(/applies from Le\/R = 2/);
    const normal = normalGenerator(9);
    const r = hvorslevSlugTest(exponentialRecord(0.8, 14.4, 20, () => 0.05 * normal()), geometry(0.1));
    expect(r.K).toBeGreaterThan(0);
    expect(r.ci95![0]).toBeGreaterThanOrEqual(0);
    expect(r.ci95![0]).toBeLessThan(r.ci95![1]);
  });

  it("fits only the chosen range of H/H0", () => {
    const rec = exponentialRecord(0.8, 14.4, 60);
    const r = hvorslevSlugTest(
      rec,
      { casingRadius: { value: 0.025, unit: "m" }, intakeRadius: { value: 0.05, unit: "m" }, intakeLength: { value: 1.5, unit: "m" } },
      { range: { minNormalizedHead: 0.15, maxNormalizedHead: 0.25 } },
    );
    for (const h of r.line.h) {
      expect(h).toBeGreaterThanOrEqual(0.15);
      expect(h).toBeLessThanOrEqual(0.25);
    }
    expect(r.line.points).toBeGreaterThanOrEqual(2);
  });

  it("refuses a geometry length given in a time unit", () => {
    expect(() =>
      hvorslevSlugTest(exponentialRecord(0.8, 14.4), {
        casingRadius: { value: 0.025, unit: "min" },
        intakeRadius: { value: 0.05, unit: "m" },
        intakeLength: { value: 1.5, unit: "m" },
      }),
    ).toThrow(SlugTestInputError);
  });
});

describe("Bouwer & Rice (1976) slug-test analysis", () => {
  it("evaluates Van Rooy's A, B, C and ln(Re/rw) as worked by hand", () => {
    // By hand for Le/rw = 20 (coefficients from memory, see bouwer-rice.ts):
    // A = 1.4720 + 0.7074 - 0.032592 + 0.0008224 - 0.0000103744 + 0.0000000503 = 2.147620
    // B = 0.2372 + 0.10302 - 0.0010728 - 0.0000027928 + 0.0000000758 = 0.339144
    // C = 0.7920 + 0.7986 - 0.022972 + 0.00030864 - 0.0000015454 = 1.567935
    const c = bouwerRiceCoefficients(20);
    expect(c.A).toBeCloseTo(2.14762, 5);
    expect(c.B).toBeCloseTo(0.339144, 6);
    expect(c.C).toBeCloseTo(1.567935, 6);
    // rw = 0.1, Le = 2, Lw = 5, D = 20: 1.1/ln 50 = 0.281184; ln 150 = 5.010635;
    // (A + B ln 150)/20 = 0.192347; ln(Re/rw) = 1/(0.281184 + 0.192347) = 2.111790.
    const partial = bouwerRiceLnReRw(0.1, 2, 5, 20);
    expect(partial.lnReRw).toBeCloseTo(2.11179, 5);
    expect(partial.fullyPenetrating).toBe(false);
    // Fully penetrating, D = Lw = 5: 1/(0.281184 + 1.567935/20) = 1/0.359581 = 2.781013.
    const full = bouwerRiceLnReRw(0.1, 2, 5, 5);
    expect(full.lnReRw).toBeCloseTo(2.781013, 5);
    expect(full.fullyPenetrating).toBe(true);
  });

  it("caps ln((D - Lw)/rw) at 6", () => {
    // (D - Lw)/rw = 9995 gives ln = 9.21 > 6: the same ln(Re/rw) as (D - Lw)/rw = e^6.
    const capped = bouwerRiceLnReRw(0.1, 2, 5, 1004.5);
    const atSix = bouwerRiceLnReRw(0.1, 2, 5, 5 + 0.1 * Math.exp(6));
    expect(capped.cappedLog).toBe(true);
    expect(capped.lnReRw).toBeCloseTo(atSix.lnReRw, 12);
  });

  it("returns K = rc^2 ln(Re/rw) b / (2 Le) from a record in feet and seconds", () => {
    // By hand: rc = 0.05 m, Le = 2 m, ln(Re/rw) = 2.111790, b = 1/T0 = 50 per day (T0 = 28.8 min):
    // K = 0.0025 * 2.111790 * 50 / 4 = 0.0659934 m/d.
    const base = exponentialRecord(0.8, 28.8);
    const record = {
      ...base,
      times: base.times.map((t) => t * 60),
      timeUnit: "s",
      displacements: base.displacements.map((h) => convert(h, "m", "ft")),
      lengthUnit: "ft",
      initialDisplacement: { value: convert(0.8, "m", "ft"), unit: "ft" },
    };
    const r = bouwerRiceSlugTest(record, {
      casingRadius: { value: 0.05, unit: "m" },
      wellRadius: { value: 0.1, unit: "m" },
      screenLength: { value: 2, unit: "m" },
      screenBottomDepth: { value: 5, unit: "m" },
      saturatedThickness: { value: 20, unit: "m" },
    });
    expect(r.K).toBeCloseTo(0.0659934, 6);
    expect(r.lnReRw).toBeCloseTo(2.11179, 5);
    expect(r.unit).toBe("m/d");
  });

  it("refuses Le/rw outside 4 to 1000, where the polynomial fits leave the published curves", () => {
    // A (Van Rooy's fit) falls after Le/rw = 1011 and jumps from 9.3 at 1500 to 34.6 at 2000.
    expect(bouwerRiceCoefficients(1500).A).toBeCloseTo(9.344, 2);
    expect(bouwerRiceCoefficients(2000).A).toBeCloseTo(34.61, 1);
    expect(() => bouwerRiceLnReRw(0.1, 150, 300, 600)).toThrow(/Le\/rw = 1500 lies outside 4 to 1000/);
    expect(() => bouwerRiceLnReRw(0.1, 0.3, 5, 20)).toThrow(/Le\/rw = 3 lies outside/);
    expect(bouwerRiceLnReRw(0.1, 100, 150, 600).lnReRw).toBeGreaterThan(0);
  });

  it("refuses a screen longer than its depth below the water table", () => {
    expect(() => bouwerRiceLnReRw(0.1, 6, 5, 20)).toThrow(/exceeds Lw/);
  });
});
