import { describe, expect, it } from "vitest";
import type { CellOutput } from "../src/index.js";
import { computedNumbers, narrativeNumbers, numberIndex, unmatchedNumbers } from "../src/index.js";

describe("the hand-typed number checker", () => {
  const outputs: Record<string, CellOutput[]> = {
    fit: [{ type: "table", columns: [{ name: "estimate" }, { name: "95 % low" }], rows: [[379.92446852260673, 0.00034890896188238916]] }],
    hints: [{ type: "text", text: "flat from t = 1.99 to 110 min" }],
    slope: [{ type: "value", value: -0.7793144487158057 }],
  };
  const index = numberIndex(computedNumbers(outputs));

  it("reads numbers as written, with powers of ten shared by a range, and skips counts, years, code and references", () => {
    const found = narrativeNumbers("T ≈ 380 m2/d, S = 3.49 to 3.52 × 10⁻⁴ (Theis 1935; Bourdet et al. 1989), `0.5`, {=fit/T}, 3 wells, KM-OB1, 1,450 m3/d");
    expect(found.map((n) => [n.text, Number(n.value.toPrecision(12)), n.significant])).toEqual([
      ["380", 380, 2],
      ["3.49", 3.49e-4, 3],
      ["3.52 × 10⁻⁴", 3.52e-4, 3],
      ["1,450", 1450, 3],
    ]);
  });

  it("lists only the numbers that no computed value rounds to at the digits written", () => {
    const unmatched = unmatchedNumbers("T is about 380 m2/d (3.49 × 10⁻⁴), flat from 2 to 110 min with a slope of −0.78, and 886 by hand; 95 % low.", index);
    expect(unmatched.map((n) => n.text)).toEqual(["886"]);
  });
});
