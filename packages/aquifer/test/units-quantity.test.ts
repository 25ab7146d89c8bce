import { describe, it, expect } from "vitest";
import { Quantity, UnitError, dimensionLabel, parseUnit, quantity } from "../src/units/index.js";

describe("Quantity conversion", () => {
  it("converts to another unit of the same dimension", () => {
    const depth = quantity(100, "ft").to("m");
    expect(depth.value).toBe(30.48); // NIST SP 811 (2008) B.8: 1 ft = 0.3048 m exactly
    expect(depth.unit.symbol).toBe("m");
    expect(quantity(1, "US gpd/ft").to("m2/d").value).toBeCloseTo(0.01241933, 15); // 3.785411784e-3 / 0.3048
  });

  it("refuses to convert to another dimension", () => {
    expect(() => quantity(1, "m").to("min")).toThrow("cannot convert a length (m) to a time (min)");
  });
});

describe("Quantity addition and subtraction", () => {
  it("answers in the unit of the left operand", () => {
    const sum = quantity(1, "m").add(quantity(50, "cm"));
    expect(sum.value).toBe(1.5);
    expect(sum.unit.symbol).toBe("m");
    const difference = quantity(2, "h").sub(quantity(30, "min"));
    expect(difference.value).toBeCloseTo(1.5, 14);
    expect(difference.unit.symbol).toBe("h");
  });

  it("refuses to add or subtract different dimensions, naming both", () => {
    const length = quantity(1, "m");
    const time = quantity(1, "min");
    expect(() => length.add(time)).toThrow("cannot add a length (m) to a time (min)");
    expect(() => length.sub(time)).toThrow("cannot subtract a time (min) from a length (m)");
    expect(() => length.add(time)).toThrow(UnitError);
  });
});

describe("Quantity multiplication and division", () => {
  it("combines dimensions: conductivity times thickness is transmissivity", () => {
    // Common practice, no source: T = K·b
    const transmissivity = quantity(2, "m/d").mul(quantity(30, "m"));
    expect(transmissivity.value).toBe(60);
    expect(dimensionLabel(transmissivity.unit.dimension)).toBe("transmissivity");
    expect(transmissivity.to("m2/d").value).toBe(60);
  });

  it("keeps factors: 10 ft/d times 100 ft is 1000 ft2/d, 92.90304 m2/d", () => {
    const transmissivity = quantity(10, "ft/d").mul(quantity(100, "ft"));
    expect(transmissivity.value).toBe(1000);
    expect(transmissivity.to("m2/d").value).toBeCloseTo(92.90304, 12); // 1000 × 0.3048², exact arithmetic
  });

  it("divides discharge by drawdown into a transmissivity-dimensioned ratio", () => {
    const ratio = quantity(500, "m3/d").div(quantity(2, "m"));
    expect(ratio.value).toBe(250);
    expect(dimensionLabel(ratio.unit.dimension)).toBe("transmissivity");
  });

  it("writes composed units that parse back to the same unit", () => {
    const cases = [
      quantity(5, "m3/d").div(quantity(2, "m2/d")),
      quantity(1, "US gal").div(quantity(1, "m2/d")),
      quantity(3, "m3").div(quantity(1, "US gal")),
      quantity(2, "m2/d").mul(quantity(3, "m")).div(quantity(4, "m3/d")),
      quantity(1, "US gpm").mul(quantity(2, "min")),
    ];
    for (const q of cases) {
      const reparsed = parseUnit(q.unit.symbol);
      expect(reparsed.dimension, q.unit.symbol).toEqual(q.unit.dimension);
      expect(reparsed.factor / q.unit.factor, q.unit.symbol).toBeCloseTo(1, 14);
    }
    expect(cases[0].unit.symbol).toBe("m3/d/(m2/d)");
    expect(cases[2].unit.symbol).toBe("m3/(US gal)");
  });

  it("lets a gallon count per minute times minutes come out in gallons", () => {
    expect(quantity(1, "US gpm").mul(quantity(2, "min")).to("US gal").value).toBeCloseTo(2, 14);
  });

  it("scales by a plain number and keeps the unit", () => {
    const q = quantity(3, "L/s").mul(2).div(4);
    expect(q.value).toBe(1.5);
    expect(q.unit.symbol).toBe("L/s");
  });

  it("drops a dimensionless factor from the written unit", () => {
    expect(quantity(2, "m").mul(quantity(3, "1")).unit.symbol).toBe("m");
    expect(quantity(2, "m").div(quantity(4, "-")).unit.symbol).toBe("m");
  });
});

describe("Quantity immutability and printing", () => {
  it("cannot be changed after construction", () => {
    const q = new Quantity(1, "m");
    expect(Object.isFrozen(q)).toBe(true);
    expect(() => {
      (q as { value: number }).value = 2;
    }).toThrow(TypeError);
    expect(q.value).toBe(1);
  });

  it("prints the value with its unit, or alone when dimensionless", () => {
    expect(quantity(12.5, "m3/d").toString()).toBe("12.5 m3/d");
    expect(quantity(1 / 3, "m").toString(3)).toBe("0.333 m");
    expect(quantity(2e-4, "-").toString()).toBe("0.0002");
    expect(`${quantity(3, "US gpm")}`).toBe("3 US gpm");
  });

  it("refuses an unknown unit at construction", () => {
    expect(() => quantity(1, "gmp")).toThrow("unknown unit 'gmp' — did you mean 'US gpm' or 'imp gpm'?");
  });
});
