import { describe, expect, it } from "vitest";
import { UnitError, convert, parseUnit, requireDimension } from "../src/units/index.js";

function relative(a: number, b: number): number {
  return Math.abs(a - b) / Math.abs(b);
}

function messageOf(action: () => unknown): string {
  try {
    action();
  } catch (e) {
    if (e instanceof UnitError) return e.message;
    throw e;
  }
  throw new Error("expected a UnitError");
}

describe("units of the trade, with their published factors", () => {
  it("reads imperial gallons as 4.54609 L (NIST SP 811 B.8: 4.546 09 E-03 m3)", () => {
    expect(relative(convert(1, "imp gal", "m3"), 4.54609e-3)).toBeLessThan(1e-15);
    // 1 imp gpm = 4.54609e-3 m3 x 1440 min/d = 6.5463696 m3/d (by hand).
    expect(relative(convert(1, "imp gpm", "m3/d"), 6.5463696)).toBeLessThan(1e-15);
    expect(relative(convert(1, "imp gpd", "L/d"), 4.54609)).toBeLessThan(1e-15);
    expect(relative(convert(1, "UK gpm", "imp gal/min"), 1)).toBeLessThan(1e-15);
  });

  it("reads US gallons as 231 in3 (NIST Handbook 44; SP 811 B.8: 3.785 412 E-03 m3) in gpm, gpd and MGD", () => {
    expect(Math.abs(convert(1, "US gpm", "m3/s") - 6.30902e-5)).toBeLessThan(0.5e-11); // SP 811 B.8: 6.309 020 E-05 m3/s
    expect(relative(convert(1, "US MGD", "m3/d"), 3785.411784)).toBeLessThan(1e-15);
    expect(relative(convert(1, "US MGD", "US gpd"), 1e6)).toBeLessThan(1e-15);
  });

  it("reads megalitres per day and litres per second (SI prefixes, NIST SP 811 sec. 4.3)", () => {
    expect(convert(1, "ML/d", "m3/d")).toBe(1000);
    expect(relative(convert(1, "ML/d", "L/s"), 1e6 / 86400)).toBeLessThan(1e-15);
  });

  it("converts the customary transmissivity units: US gpd/ft, ft2/d and m2/s", () => {
    expect(relative(convert(1, "US gpd/ft", "m2/d"), 3.785411784e-3 / 0.3048)).toBeLessThan(1e-15);
    expect(relative(convert(1, "ft2/d", "m2/d"), 0.09290304)).toBeLessThan(1e-15); // SP 811 B.8: ft2 = 9.290 304 E-02 m2
    expect(convert(1, "m2/s", "m2/d")).toBe(86400);
  });

  it("reads darcy and millidarcy as areas (NIST SP 811 B.8: darcy 9.869 233 E-13 m2)", () => {
    expect(convert(1, "darcy", "m2")).toBe(9.869233e-13);
    expect(relative(convert(250, "mD", "darcy"), 0.25)).toBeLessThan(1e-15);
    expect(() => convert(1, "darcy", "m/d")).toThrow("cannot convert an area (darcy) to a velocity (m/d)");
  });
});

describe("suggestions for an unknown unit, of the dimension expected", () => {
  it("suggests rates for a rate and never a pressure for 'Mgal/d'", () => {
    const message = messageOf(() => convert(3, "Mgal/d", "m3/d"));
    expect(message).toContain("for a discharge try 'US MGD', 'ML/d'");
    expect(message).not.toContain("MPa");
  });

  it("suggests a length unit for a length and a transmissivity unit for a transmissivity", () => {
    expect(messageOf(() => requireDimension("fet", "length"))).toMatch(/for a length try 'ft'/);
    expect(messageOf(() => convert(1, "ft2/dy", "m2/d"))).toMatch(/for a transmissivity try 'ft2\/d'/);
  });

  it("no longer takes 'darcy' for 'day'", () => {
    expect(parseUnit("darcy").dimension).toEqual({ L: 2, T: 0, M: 0 });
  });
});
