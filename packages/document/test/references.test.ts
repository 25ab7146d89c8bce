import { describe, expect, it } from "vitest";
import type { CellOutput } from "../src/index.js";
import { findReferences, positionInSource, referenceText, renderNarrative, resolveReference, readReference } from "../src/index.js";

const FIT: CellOutput = {
  type: "table",
  title: "Fit",
  columns: [{ name: "parameter" }, { name: "estimate" }, { name: "standard error" }, { name: "95 % low" }, { name: "95 % high" }, { name: "unit" }],
  rows: [
    ["T (transmissivity)", 445.5791009018265, 5.543271233637446, 434.752083056691, 456.6757536032109, "m2/d"],
    ["S (storativity)", 0.0002785112299127019, 0.00001457914303342487, 0.0002511255646241797, 0.0003088833480715932, "1"],
  ],
};
const CORRELATION: CellOutput = { type: "table", columns: [{ name: "parameter" }, { name: "T" }, { name: "S" }], rows: [["T", 1, -0.85], ["S", -0.85, 1]] };
const OUTPUTS: Record<string, CellOutput[]> = {
  fit: [FIT, CORRELATION],
  result: [{ type: "value", value: 0.005157165519697066, unit: "m2/s", label: "T in SI/units" }],
  single: [{ type: "value", value: 15, unit: "1" }],
  rate: [{ type: "control", name: "proposed_rate", value: 1450, default: 1450, unit: "m3/d" }],
};

function text(ref: string): string {
  const found = readReference(ref, 0);
  if (!found || !("reference" in found)) throw new Error(`does not read: ${ref}`);
  const r = resolveReference(found.reference, OUTPUTS);
  if ("problem" in r) throw new Error(r.problem);
  return referenceText(r.resolved);
}

describe("narrative references", () => {
  it("quote an estimate with its standard error, one column of its row, a labelled value and a control", () => {
    expect(text("{=fit/T}")).toBe("446 ± 6 m²/d");
    expect(text("{=fit/T/95 % low}")).toBe("435 m²/d");
    expect(text("{=fit/S}")).toBe("(2.79 ± 0.15) × 10⁻⁴");
    expect(text("{=fit#2/T/S}")).toBe("−0.85");
    expect(text('{=result/"T in SI/units"}')).toBe("0.005157 m²/s");
    expect(text("{=single}")).toBe("15");
    expect(text("{=rate/proposed_rate}")).toBe("1450 m³/d");
  });

  it("say what is missing and how to fix it when they do not resolve", () => {
    const problem = (ref: string) => {
      const found = readReference(ref, 0)!;
      if (!("reference" in found)) return found.problem;
      const r = resolveReference(found.reference, OUTPUTS);
      return "problem" in r ? r.problem : "resolved";
    };
    expect(problem("{=nowhere/T}")).toBe('there is no cell "nowhere" with outputs');
    expect(problem("{=fit/K}")).toBe('cell fit has no value labelled "K" and no table row "K"');
    expect(problem("{=fit#1/T/median}")).toMatch(/has no column "median"; its columns are "parameter", "estimate"/);
    expect(problem("{=fit/T/median}")).toMatch(/"T" is a row in 2 tables of cell fit; pick one with {=fit#N\/...} \(outputs 1, 2\)/);
    expect(problem("{=fit#3/T}")).toBe("cell fit has 2 outputs, not 3");
    expect(problem("{=fit}")).toMatch(/has no value outputs; name one/);
    expect(problem("{=fit/T")).toMatch(/expected "\/" or "}"/);
    expect(problem("{=1abc}")).toMatch(/starts with the id of a cell/);
  });

  it("are found outside code spans and blocks, with their file position", () => {
    const source = "T = {=fit/T} but `{=fit/S}` is code\n\n```\n{=fit/S}\n```\nand {=fit/S}.";
    const found = findReferences(source);
    expect(found.map((f) => ("reference" in f ? f.reference.text : f.text))).toEqual(["{=fit/T}", "{=fit/S}"]);
    expect(positionInSource(source, { line: 10, column: 1 }, found[1]!.offset)).toEqual({ line: 15, column: 5 });
  });

  it("render through the caller's function, escaped, and stay as written in code", () => {
    const html = renderNarrative("T = {=fit/T}; `{=fit/T}`; {=x/\"<script>alert(1)</script>\"}", {
      reference: (f) => ({ text: "reference" in f ? `<b>${f.reference.path[0]}</b>` : "bad", title: '"><img src=x onerror=alert(1)>' }),
    });
    expect(html).toContain('<span class="reference" title="&quot;&gt;&lt;img src=x onerror=alert(1)&gt;">&lt;b&gt;T&lt;/b&gt;</span>');
    expect(html).toContain("<code>{=fit/T}</code>");
    expect(html).toContain("&lt;b&gt;&lt;script&gt;alert(1)&lt;/script&gt;&lt;/b&gt;");
    expect(html).not.toMatch(/<script|<img|<b>/);
  });
});
