import { describe, it, expect } from "vitest";
import {
  CATALOGUE,
  DIMENSIONS,
  UnitError,
  dimensionLabel,
  dimensionName,
  knownUnitSymbols,
  parseUnit,
} from "../src/units/index.js";
import type { Dimension } from "../src/units/index.js";
import { closeMatches, editDistance } from "../src/units/suggest.js";

function labelOf(text: string): Dimension | undefined {
  return dimensionLabel(parseUnit(text).dimension);
}

function errorOf(action: () => unknown): UnitError {
  try {
    action();
  } catch (error) {
    if (error instanceof UnitError) return error;
    throw error;
  }
  throw new Error("expected a UnitError, but nothing was thrown");
}

describe("parseUnit: the units the trade writes", () => {
  const cases: [string, Dimension][] = [
    ["m", "length"],
    ["cm", "length"],
    ["mm", "length"],
    ["km", "length"],
    ["ft", "length"],
    ["in", "length"],
    ["s", "time"],
    ["min", "time"],
    ["h", "time"],
    ["hr", "time"],
    ["d", "time"],
    ["day", "time"],
    ["days", "time"],
    ["m3/d", "discharge"],
    ["m3/h", "discharge"],
    ["m3/s", "discharge"],
    ["L/s", "discharge"],
    ["L/min", "discharge"],
    ["US gal/min", "discharge"],
    ["US gpm", "discharge"],
    ["US gal/d", "discharge"],
    ["US gpd", "discharge"],
    ["ft3/s", "discharge"],
    ["cfs", "discharge"],
    ["m2/d", "transmissivity"],
    ["m2/s", "transmissivity"],
    ["ft2/d", "transmissivity"],
    ["US gal/d/ft", "transmissivity"],
    ["US gpd/ft", "transmissivity"],
    ["m/d", "velocity"],
    ["m/s", "velocity"],
    ["cm/s", "velocity"],
    ["ft/d", "velocity"],
    ["1/d", "leakance"],
    ["kPa", "pressure"],
    ["Pa", "pressure"],
    ["mH2O", "pressure"],
    ["m of water", "pressure"],
    ["ftH2O", "pressure"],
    ["ft of water", "pressure"],
    ["psi", "pressure"],
    ["1", "dimensionless"],
    ["-", "dimensionless"],
    ["", "dimensionless"],
    ["m2", "area"],
    ["m3", "volume"],
  ];
  for (const [text, dimension] of cases) {
    it(`reads '${text}' as a ${dimension}`, () => {
      expect(labelOf(text)).toBe(dimension);
    });
  }
});

describe("parseUnit: compound expressions", () => {
  it("reads exponents written as digits, with a caret or as superscripts", () => {
    for (const text of ["m2", "m^2", "m²", "m^+2"]) expect(parseUnit(text).factor).toBe(1);
    for (const text of ["m2", "m^2", "m²"]) expect(labelOf(text)).toBe("area");
    expect(parseUnit("ft^3").factor).toBeCloseTo(0.028316846592, 15); // 0.3048³, exact arithmetic
    expect(labelOf("d^-1")).toBe("leakance");
    expect(labelOf("d⁻¹")).toBe("leakance");
    expect(labelOf("m ^2")).toBe("area");
  });

  it("divides by the next term only, so a/b/c is a/(b·c)", () => {
    const chained = parseUnit("US gal/d/ft");
    const grouped = parseUnit("US gal/(d·ft)");
    expect(chained.factor).toBe(grouped.factor);
    expect(chained.dimension).toEqual(grouped.dimension);
    expect(parseUnit("m3/d·m").dimension).toEqual({ L: 4, T: -1, M: 0 });
  });

  it("accepts products written with *, · or a space, and parentheses with exponents", () => {
    for (const text of ["N*m", "N·m", "N m"]) expect(parseUnit(text).dimension).toEqual({ L: 2, T: -2, M: 1 });
    expect(labelOf("m3/(d·m)")).toBe("transmissivity");
    expect(parseUnit("(ft/d)^2").factor).toBeCloseTo(0.3048 * 0.3048, 16);
  });

  it("tolerates whitespace and keeps the text as written, with runs of space collapsed", () => {
    const unit = parseUnit("  m3  /   d ");
    expect(unit.symbol).toBe("m3 / d");
    expect(unit.factor).toBe(1);
    expect(parseUnit("US  gal / min").factor).toBe(parseUnit("US gal/min").factor);
  });

  it("writes every dimensionless spelling as '1'", () => {
    for (const text of ["", "-", "1", "  "]) {
      const unit = parseUnit(text);
      expect(unit.symbol).toBe("1");
      expect(unit.factor).toBe(1);
    }
  });

  it("matches the longest symbol, so 'min' is a minute and 'm in' is metre times inch", () => {
    expect(parseUnit("min").factor).toBe(1 / 1440);
    expect(labelOf("m in")).toBe("area");
    expect(parseUnit("m in").factor).toBe(0.0254);
    expect(parseUnit("mm").factor).toBe(0.001);
  });

  it("returns frozen units", () => {
    const unit = parseUnit("US gpm");
    expect(Object.isFrozen(unit)).toBe(true);
    expect(Object.isFrozen(unit.dimension)).toBe(true);
  });
});

describe("parseUnit: errors a user can act on", () => {
  it("names an unknown unit and suggests the closest known one", () => {
    // 'gpm' is close but ambiguous, so its two readings are suggested.
    expect(() => parseUnit("gmp")).toThrow("unknown unit 'gmp' — did you mean 'US gpm' or 'imp gpm'?");
    const error = errorOf(() => parseUnit("gmp"));
    expect(error.suggestions).toEqual(["US gpm", "imp gpm"]);
    expect(error.name).toBe("UnitError");
  });

  it("names the whole text when the unknown part is inside a compound unit", () => {
    expect(() => parseUnit("gmp/d")).toThrow("unknown unit 'gmp' in 'gmp/d' — did you mean 'US gpm' or 'imp gpm'?");
    expect(() => parseUnit("m3/dy")).toThrow("unknown unit 'dy' in 'm3/dy' — did you mean 'd' or 'day'?");
  });

  it("is case-sensitive but points out a difference in case", () => {
    expect(() => parseUnit("M")).toThrow("unknown unit 'M' — did you mean 'm'?");
    expect(() => parseUnit("KPA")).toThrow("unknown unit 'KPA' — did you mean 'kPa'?");
  });

  it("suggests multi-word units", () => {
    expect(() => parseUnit("US gall/min")).toThrow("unknown unit 'US gall' in 'US gall/min' — did you mean 'US gal'?");
  });

  it("lists several suggestions when they are equally close", () => {
    expect(() => parseUnit("ms")).toThrow("unknown unit 'ms' — did you mean 'm', 'mD' or 'mm'?");
  });

  it("refuses the ambiguous 'gal' and 'gpm' alike and says what to write", () => {
    const error = errorOf(() => parseUnit("gal/min"));
    expect(error.message).toBe(
      "'gal' is ambiguous (US or imperial gallon): write 'US gal' (231 in³ = 3.785411784 L) or 'imp gal' (4.54609 L) (in 'gal/min')",
    );
    expect(error.suggestions).toEqual(["US gal", "imp gal"]);
    for (const text of ["gpm", "gpd", "gpd/ft", "MGD", "Mgal/d"]) expect(() => parseUnit(text), text).toThrow(/is ambiguous \(US or imperial/);
  });

  it("lists known units when nothing is close", () => {
    const error = errorOf(() => parseUnit("furlong"));
    expect(error.message).toMatch(/^unknown unit 'furlong'; known units include m, cm, ft/);
    expect(error.suggestions).toEqual([]);
  });

  it("explains malformed expressions", () => {
    expect(() => parseUnit("10 m")).toThrow("unexpected number '10' in '10 m'");
    expect(() => parseUnit("m3d")).toThrow("unexpected 'd' after 'm3' in 'm3d'");
    expect(() => parseUnit("m^")).toThrow("'^' must be followed by an integer exponent");
    expect(() => parseUnit("m3/")).toThrow("expected a unit at the end of 'm3/'");
    expect(() => parseUnit("(m/d")).toThrow("missing ')' at the end of '(m/d'");
    expect(() => parseUnit("m/d)")).toThrow("unexpected ')' after 'm/d' in 'm/d)'");
  });

  it("refuses text that is not a string", () => {
    expect(() => parseUnit(3 as unknown as string)).toThrow("a unit must be text such as 'm' or 'm3/d', got 3");
  });
});

describe("the catalogue", () => {
  it("gives every symbol exactly once", () => {
    const symbols = knownUnitSymbols();
    expect(new Set(symbols).size).toBe(symbols.length);
    expect(symbols.length).toBe(CATALOGUE.reduce((n, entry) => n + entry.symbols.length, 0));
  });

  it("parses every catalogue symbol back to its own factor and dimension", () => {
    for (const entry of CATALOGUE) {
      for (const symbol of entry.symbols) {
        const unit = parseUnit(symbol);
        expect(unit.factor, symbol).toBe(entry.factor);
        expect(unit.dimension, symbol).toEqual(entry.dimension);
      }
    }
  });
});

describe("dimension names", () => {
  it("names known vectors and spells out the others", () => {
    expect(dimensionName(DIMENSIONS.transmissivity)).toBe("transmissivity");
    expect(dimensionName({ L: -1, T: -2, M: 1 })).toBe("pressure");
    expect(dimensionName({ L: 2, T: -2, M: 0 })).toBe("L^2·T^-2");
    expect(dimensionName({ L: 1, T: -2, M: 1 })).toBe("L·T^-2·M");
  });
});

describe("edit distance for suggestions", () => {
  it("counts an adjacent swap as one edit", () => {
    expect(editDistance("gmp", "gpm")).toBe(1);
    expect(editDistance("kitten", "sitting")).toBe(3); // hand count: k→s, e→i, insert g
    expect(editDistance("", "abc")).toBe(3);
    expect(editDistance("psi", "psi")).toBe(0);
  });

  it("returns no suggestion when every candidate is too far", () => {
    expect(closeMatches("xyz", ["m", "ft", "gpm"])).toEqual([]);
  });
});
