import { describe, it, expect } from "vitest";
import fc from "fast-check";
import {
  DIMENSIONS,
  UnitError,
  baseUnitOf,
  convert,
  convertArray,
  fromBase,
  isDimension,
  parseUnit,
  requireDimension,
  sameDimension,
  toBase,
} from "../src/units/index.js";
import type { Dimension } from "../src/units/index.js";

/** Relative agreement to `rel` (default 1e-15, i.e. a few units in the last place of a double). */
function expectRelative(actual: number, expected: number, rel = 1e-15): void {
  const error = Math.abs(actual - expected) / Math.abs(expected);
  expect(error, `${actual} vs ${expected}: relative error ${error}`).toBeLessThanOrEqual(rel);
}

// "Exact arithmetic" below means the value follows from the defining values (ft = 0.3048 m, in = 0.0254 m,
// US gal = 231 in³, d = 86400 s, lbf = 0.45359237 kg × 9.80665 m/s²); each was recomputed with Python's
// fractions.Fraction (/usr/bin/python3) before being written here.

describe("length factors", () => {
  it("converts feet and inches to metres with the exact international definitions", () => {
    expect(convert(1, "ft", "m")).toBe(0.3048); // NIST SP 811 (2008) B.8: 1 ft = 0.3048 m exactly
    expect(convert(1, "in", "m")).toBe(0.0254); // NIST SP 811 (2008) B.8: 1 in = 0.0254 m exactly
    expectRelative(convert(1, "ft", "in"), 12); // NIST Handbook 44 App. C (from memory): 1 ft = 12 in
  });

  it("applies SI prefixes to the metre", () => {
    // NIST SP 811 (2008) Table 5 (table number from memory), SI prefixes: c = 1e-2, m = 1e-3, k = 1e3
    expect(convert(1, "cm", "m")).toBe(0.01);
    expect(convert(1, "mm", "m")).toBe(0.001);
    expect(convert(1, "km", "m")).toBe(1000);
  });
});

describe("time factors", () => {
  it("uses the day as the base unit of time", () => {
    // NIST SP 811 (2008) B.8: day = 8.64 E+04 s, hour = 3.6 E+03 s, minute = 6.0 E+01 s, all exact
    expect(convert(1, "d", "s")).toBe(86400);
    expectRelative(convert(1, "h", "s"), 3600);
    expectRelative(convert(1, "min", "s"), 60);
    expect(toBase(1, "s")).toBe(1 / 86400);
    expect(toBase(6, "h")).toBe(0.25);
  });

  it("accepts day, days and hr as spellings of d and h", () => {
    expect(convert(3, "days", "d")).toBe(3);
    expect(convert(3, "day", "d")).toBe(3);
    expect(convert(2, "hr", "h")).toBe(2);
  });
});

describe("volume and discharge factors", () => {
  it("defines the US gallon as 231 cubic inches, 3.785411784 L", () => {
    // NIST Handbook 44 App. C (from memory): 1 US gallon = 231 in³ exactly
    expectRelative(convert(1, "US gal", "in3"), 231);
    // Exact arithmetic: 231 × 0.0254³ m³ = 3.785411784e-3 m³
    expect(convert(1, "US gal", "L")).toBe(3.785411784);
    // NIST SP 811 (2008) B.8: gallon (U.S.) = 3.785 412 E-03 m³ (rounded to 7 digits)
    expect(Math.abs(convert(1, "US gal", "m3") - 3.785412e-3)).toBeLessThan(0.5e-9);
    // NIST SP 811 (2008) B.8: liter = 1.0 E-03 m³ exactly
    expect(convert(1, "L", "m3")).toBe(0.001);
  });

  it("converts gallons per minute and per day to cubic metres per day", () => {
    // Exact arithmetic: 3.785411784e-3 m³ × 1440 min/d = 5.45099296896 m³/d
    expectRelative(convert(1, "US gpm", "m3/d"), 5.45099296896);
    expectRelative(convert(1, "US gal/min", "m3/d"), 5.45099296896);
    // NIST SP 811 (2008) B.8 (from memory): gallon (U.S.) per minute = 6.309 020 E-05 m³/s
    expect(Math.abs(convert(1, "US gpm", "m3/s") - 6.30902e-5)).toBeLessThan(0.5e-11);
    expectRelative(convert(1, "US gpd", "m3/d"), 3.785411784e-3);
    expectRelative(convert(1, "US gal/d", "m3/d"), 3.785411784e-3);
  });

  it("converts cubic feet per second to cubic metres per day", () => {
    // Exact arithmetic: 0.3048³ m³ × 86400 s/d = 2446.5755455488 m³/d
    expectRelative(convert(1, "cfs", "m3/d"), 2446.5755455488);
    expectRelative(convert(1, "ft3/s", "m3/d"), 2446.5755455488);
  });

  it("converts cubic metres per day to litres per second and per minute", () => {
    // Exact arithmetic: 1 m³/d = 1000 L / 86400 s = 1/86.4 L/s = 1000/1440 L/min
    expectRelative(convert(1, "m3/d", "L/s"), 1 / 86.4);
    expectRelative(convert(1, "m3/d", "L/min"), 1000 / 1440);
    expectRelative(convert(10, "L/s", "m3/d"), 864);
    expectRelative(convert(1, "m3/h", "m3/d"), 24);
    expectRelative(convert(1, "m3/s", "m3/d"), 86400);
  });
});

describe("transmissivity and hydraulic conductivity factors", () => {
  it("converts US gallons per day per foot to square metres per day", () => {
    // Exact arithmetic: 3.785411784e-3 m³ / 0.3048 m per day = 0.01241933 m²/d exactly
    expectRelative(convert(1, "US gpd/ft", "m2/d"), 0.01241933);
    expectRelative(convert(1, "US gal/d/ft", "m2/d"), 0.01241933);
    // Common practice, no source: 1 m²/d is about 80.5 gpd/ft
    expect(convert(1, "m2/d", "US gpd/ft")).toBeCloseTo(80.52, 2);
  });

  it("converts square feet per day and square metres per second to square metres per day", () => {
    // Exact arithmetic: 0.3048² = 0.09290304 m²
    expectRelative(convert(1, "ft2/d", "m2/d"), 0.09290304);
    expect(convert(1, "m2/s", "m2/d")).toBe(86400);
  });

  it("converts conductivity in m/s, cm/s, ft/d and gpd/ft2 to metres per day", () => {
    expect(convert(1, "m/s", "m/d")).toBe(86400); // NIST SP 811 B.8: 1 d = 86400 s exactly
    expectRelative(convert(1, "cm/s", "m/d"), 864); // Exact arithmetic: 0.01 m × 86400
    expectRelative(convert(1, "ft/d", "m/d"), 0.3048); // NIST SP 811 B.8: 1 ft = 0.3048 m exactly
    // Exact arithmetic: 3.785411784e-3 / 0.3048² = 0.0407458333... m/d
    expectRelative(convert(1, "US gpd/ft2", "m/d"), 0.040745833333333335);
  });

  it("converts leakance from per second to per day", () => {
    expect(convert(1, "1/s", "1/d")).toBe(86400); // NIST SP 811 B.8: 1 d = 86400 s exactly
    expect(convert(2, "d^-1", "1/d")).toBe(2);
  });
});

describe("pressure factors", () => {
  it("derives psi from the pound-force on a square inch", () => {
    // NIST SP 811 (2008) B.8: pound-force = 4.448 222 E+00 N; by definition lbf = 0.45359237 kg × 9.80665 m/s²,
    // which is 4.4482216152605 N exactly
    expectRelative(convert(1, "lbf", "N"), 4.4482216152605);
    // Exact arithmetic: 4.4482216152605 N / 0.0254² m² = 6894.757293168361... Pa
    expectRelative(convert(1, "psi", "Pa"), 6894.757293168362);
    expectRelative(convert(1, "psi", "Pa"), convert(1, "lbf/in2", "Pa"));
    // NIST SP 811 (2008) B.8: psi = 6.894 757 E+03 Pa (rounded to 7 digits)
    expect(Math.abs(convert(1, "psi", "Pa") - 6894.757)).toBeLessThan(0.0005);
  });

  it("uses the conventional water column: 1000 kg/m3 under standard gravity", () => {
    // NIST SP 811 (2008) B.8: millimeter of water, conventional (mmH2O) = 9.806 65 E+00 Pa,
    // so 1 mH2O = 9806.65 Pa exactly
    expect(convert(1, "mH2O", "Pa")).toBe(9806.65);
    expect(convert(1, "m of water", "Pa")).toBe(9806.65);
    expect(convert(1, "m H2O", "Pa")).toBe(9806.65);
    // NIST SP 811 (2008) B.8: centimeter of water, conventional (cmH2O) = 9.806 65 E+01 Pa
    expectRelative(convert(1, "cmH2O", "Pa"), 98.0665);
    // Exact arithmetic: 0.3048 × 9806.65 = 2989.06692 Pa
    expectRelative(convert(1, "ftH2O", "Pa"), 2989.06692);
    expectRelative(convert(1, "ft of water", "Pa"), 2989.06692);
    // NIST SP 811 (2008) B.8: foot of water, conventional (ftH2O) = 2.989 067 E+03 Pa
    expect(Math.abs(convert(1, "ftH2O", "Pa") - 2989.067)).toBeLessThan(0.0005);
    // NIST SP 811 (2008) B.8: inch of water, conventional (inH2O) = 2.490 889 E+02 Pa
    expect(Math.abs(convert(1, "inH2O", "Pa") - 249.0889)).toBeLessThan(0.00005);
  });

  it("converts psi to feet and metres of water", () => {
    // Exact arithmetic: 6894.757293168362 / 2989.06692 and / 9806.65
    expectRelative(convert(1, "psi", "ftH2O"), 2.30665872585026, 2e-15);
    expectRelative(convert(1, "psi", "mH2O"), 0.7030695796391593, 2e-15);
    // Common practice, no source: "2.31 feet of water per psi"
    expect(convert(1, "psi", "ft of water")).toBeCloseTo(2.31, 2);
  });

  it("applies prefixes to the pascal and knows the bar", () => {
    // NIST SP 811 (2008) Table 5 (SI prefixes; table number from memory) and B.8: bar = 1.0 E+05 Pa exactly
    expect(convert(1, "kPa", "Pa")).toBe(1000);
    expect(convert(1, "hPa", "Pa")).toBe(100);
    expect(convert(1, "MPa", "kPa")).toBe(1000);
    expect(convert(1, "bar", "kPa")).toBe(100);
    expect(convert(1, "mbar", "hPa")).toBe(1);
  });

  it("keeps mass, force and pressure coherent with the base units", () => {
    // SI coherence (NIST SP 811 Table 3, table number from memory): N = kg·m/s², Pa = N/m²
    expectRelative(toBase(1, "kg m/s2"), toBase(1, "N"));
    expectRelative(toBase(1, "N/m2"), toBase(1, "Pa"));
    expect(toBase(1, "Pa")).toBe(1);
  });
});

describe("convert", () => {
  it("refuses to convert between different dimensions, naming both", () => {
    expect(() => convert(1, "m", "min")).toThrow(new UnitError("cannot convert a length (m) to a time (min)"));
    expect(() => convert(1, "L/s", "m2/d")).toThrow("cannot convert a discharge (L/s) to a transmissivity (m2/d)");
    expect(() => convert(1, "m2", "m3")).toThrow("cannot convert an area (m2) to a volume (m3)");
    expect(() => convert(1, "1", "m")).toThrow("cannot convert a dimensionless number (1) to a length (m)");
    expect(() => convert(1, "m2/s2", "m")).toThrow(
      "cannot convert a quantity of dimension L^2·T^-2 (m2/s2) to a length (m)",
    );
  });

  it("throws UnitError, an Error subclass, for a dimension mismatch", () => {
    let caught: unknown;
    try {
      convert(1, "kPa", "m");
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(UnitError);
    expect(caught).toBeInstanceOf(Error);
    expect((caught as Error).name).toBe("UnitError");
  });

  it("accepts parsed units as well as text", () => {
    expect(convert(2, parseUnit("ft"), parseUnit("in"))).toBeCloseTo(24, 12);
  });

  it("returns the value unchanged between spellings of the same unit", () => {
    expect(convert(0.1 + 0.2, "d", "days")).toBe(0.1 + 0.2);
  });

  it("round-trips values through pairs of units within a few ulp", () => {
    const pairs: [string, string][] = [
      ["m", "ft"],
      ["d", "s"],
      ["m3/d", "L/s"],
      ["m3/d", "US gpm"],
      ["m2/d", "US gpd/ft"],
      ["m/d", "cm/s"],
      ["1/d", "1/min"],
      ["Pa", "psi"],
      ["kPa", "ftH2O"],
      ["cfs", "L/min"],
    ];
    fc.assert(
      fc.property(
        fc.double({ min: -1e12, max: 1e12, noNaN: true }).filter((x) => Math.abs(x) > 1e-12),
        fc.constantFrom(...pairs),
        (value, [a, b]) => {
          const back = convert(convert(value, a, b), b, a);
          return Math.abs(back - value) <= 4 * Number.EPSILON * Math.abs(value);
        },
      ),
    );
  });
});

describe("convertArray", () => {
  it("converts every element into a new Float64Array and leaves the input alone", () => {
    const input = [1, 2, 10];
    const out = convertArray(input, "ft", "m");
    expect(out).toBeInstanceOf(Float64Array);
    expect(Array.from(out)).toEqual([0.3048, 0.6096, 3.048]);
    expect(input).toEqual([1, 2, 10]);
  });

  it("copies the values when both units have the same factor", () => {
    const input = new Float64Array([0.1, 0.2]);
    const out = convertArray(input, "d", "day");
    expect(out).not.toBe(input);
    expect(Array.from(out)).toEqual([0.1, 0.2]);
  });

  it("refuses arrays between different dimensions", () => {
    expect(() => convertArray([1], "m", "min")).toThrow("cannot convert a length (m) to a time (min)");
  });
});

describe("toBase and fromBase", () => {
  it("take values to and from the library's base units", () => {
    expect(toBase(1, "ft")).toBe(0.3048);
    expectRelative(toBase(1, "L/s"), 86.4); // Exact arithmetic: 1e-3 m³ × 86400 s/d
    expectRelative(fromBase(86.4, "L/s"), 1);
    expectRelative(fromBase(1, "m2/s"), 1 / 86400);
  });
});

describe("baseUnitOf", () => {
  it("names the base unit of each dimension, which parses back with factor 1", () => {
    const expected: Record<Dimension, string> = {
      length: "m",
      time: "d",
      discharge: "m3/d",
      area: "m2",
      volume: "m3",
      transmissivity: "m2/d",
      velocity: "m/d",
      leakance: "1/d",
      dimensionless: "1",
      pressure: "Pa",
    };
    for (const name of Object.keys(expected) as Dimension[]) {
      const symbol = baseUnitOf(name);
      expect(symbol).toBe(expected[name]);
      const unit = parseUnit(symbol);
      expect(unit.factor).toBe(1);
      expect(sameDimension(unit.dimension, DIMENSIONS[name])).toBe(true);
    }
  });

  it("builds a symbol from m, d and Pa for a dimension without a name", () => {
    expect(baseUnitOf({ L: 2, T: -2, M: 0 })).toBe("m2/d2");
    const density = { L: -3, T: 0, M: 1 };
    expect(baseUnitOf(density)).toBe("Pa·d2/m2");
    const unit = parseUnit(baseUnitOf(density));
    expect(unit.factor).toBeCloseTo(1, 15);
    expect(sameDimension(unit.dimension, density)).toBe(true);
  });

  it("refuses a dimension name it does not know", () => {
    expect(() => baseUnitOf("speed" as Dimension)).toThrow("unknown dimension 'speed'");
  });
});

describe("isDimension and requireDimension", () => {
  it("tell whether a unit has a named dimension", () => {
    expect(isDimension("US gpm", "discharge")).toBe(true);
    expect(isDimension("US gpd/ft", "transmissivity")).toBe(true);
    expect(isDimension("ft/d", "velocity")).toBe(true);
    expect(isDimension("psi", "pressure")).toBe(true);
    expect(isDimension("US gpm", "transmissivity")).toBe(false);
  });

  it("return the unit or explain what was expected", () => {
    expect(requireDimension("ft", "length").factor).toBe(0.3048);
    expect(() => requireDimension("L/s", "length", "the drawdown column")).toThrow(
      "expected a length for the drawdown column, in a unit such as 'm', got 'L/s' (a discharge)",
    );
    expect(() => requireDimension("m", "area")).toThrow("expected an area, in a unit such as 'm2', got 'm' (a length)");
  });
});
