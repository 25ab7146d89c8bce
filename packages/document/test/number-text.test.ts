import { describe, expect, it } from "vitest";
import { formatAtPlace, formatPlain, formatQuantity, formatWithUncertainty, typesetUnit, uncertaintyPlace } from "../src/index.js";

describe("formatWithUncertainty (Particle Data Group rounding rule)", () => {
  it("reproduces the worked examples published with the rule", () => {
    // Examples from the documentation of the pdground package, which quotes the rule of the Review of Particle
    // Physics, Phys. Rev. D 98 (2018) 030001, Introduction 5.3: 12.2135 ± 0.03215 -> 12.214 ± 0.032 and
    // 12.2135 ± 0.06515 -> 12.21 ± 0.07.
    expect(formatWithUncertainty(12.2135, 0.03215)).toMatchObject({ value: "12.214", uncertainty: "0.032" });
    expect(formatWithUncertainty(12.2135, 0.06515)).toMatchObject({ value: "12.21", uncertainty: "0.07" });
    // Example of the STAR collaboration's HepData guidance quoting the same rule: 0.279008 ± 0.0123261 -> 0.279 ± 0.012.
    expect(formatWithUncertainty(0.279008, 0.0123261)).toMatchObject({ value: "0.279", uncertainty: "0.012" });
  });

  it("keeps two digits for leading 100-354, one for 355-949, and rounds 950-999 up to two digits", () => {
    expect(uncertaintyPlace(0.354)!.exponent).toBe(-2);
    expect(uncertaintyPlace(0.354)!.rounded).toBeCloseTo(0.35, 15);
    expect(uncertaintyPlace(0.355)!.exponent).toBe(-1);
    expect(formatWithUncertainty(445.5791009018265, 5.543271233637446)).toMatchObject({ value: "446", uncertainty: "6" });
    expect(formatWithUncertainty(1.5, 0.0097)).toMatchObject({ value: "1.500", uncertainty: "0.010" });
    expect(formatWithUncertainty(1, 0)).toBeUndefined();
    expect(formatWithUncertainty(1, Number.NaN)).toBeUndefined();
  });

  it("writes small and large numbers with a power of ten and shares it in running text", () => {
    expect(formatWithUncertainty(3.5031564204119074e-4, 7.127995000170781e-7)).toMatchObject({ value: "3.503 × 10⁻⁴", uncertainty: "7 × 10⁻⁷" });
    expect(formatQuantity(3.5031564204119074e-4, "1", 7.127995000170781e-7)).toBe("(3.503 ± 0.007) × 10⁻⁴");
    expect(formatQuantity(379.92446852260673, "m2/d", 0.2945050125939056)).toBe("379.92 ± 0.29 m²/d");
  });
});

describe("formatPlain", () => {
  it("shows four significant digits, whole numbers below a million in full, and a true minus sign", () => {
    expect(formatPlain(2880)).toBe("2880");
    expect(formatPlain(0.5)).toBe("0.5");
    expect(formatPlain(1.501999999999999)).toBe("1.502");
    expect(formatPlain(-0.8524482042360472)).toBe("−0.8524");
    expect(formatPlain(1.3266785649646676e-4)).toBe("1.327 × 10⁻⁴");
    expect(formatPlain(12345678)).toBe("1.235 × 10⁷");
    expect(formatPlain(123456.7)).toBe("1.235 × 10⁵");
    expect(formatPlain(9.99996)).toBe("10");
    expect(formatPlain(0)).toBe("0");
    expect(formatPlain(Number.POSITIVE_INFINITY)).toBe("∞");
    expect(formatAtPlace(0.0004, -3)).toBe("0");
  });
});

describe("typesetUnit", () => {
  it("raises powers, keeps ratios, and writes nothing for a dimensionless quantity", () => {
    expect(typesetUnit("m2/d")).toBe("m²/d");
    expect(typesetUnit("m3/d")).toBe("m³/d");
    expect(typesetUnit("m^2/s")).toBe("m²/s");
    expect(typesetUnit("s^-1")).toBe("s⁻¹");
    expect(typesetUnit("1/d")).toBe("1/d");
    expect(typesetUnit("1")).toBe("");
    expect(typesetUnit("")).toBe("");
    expect(typesetUnit(undefined)).toBe("");
    expect(formatQuantity(15, "1")).toBe("15");
  });
});
