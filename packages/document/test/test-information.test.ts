import { describe, expect, it } from "vitest";
import { headerSchema, parseDocument, serializeDocument, validateJsonSchema } from "../src/index.js";
import { parse as parseYaml } from "yaml";

const HEADER = `---
conebook: 1
title: Constant-rate test at HM-PW2, Hollin Marsh (invented)
seed: 1
testInformation:
  site: Hollin Marsh (invented)
  started: 2026-05-04T09:30
  ended: 2026-05-05
  analyst: A. Analyst
  reviewer: R. Reviewer
  datum: ground level
  units: {length: m, time: min, rate: L/s}
  wells:
    - {name: HM-PW2, role: pumped, screen: [20, 35], radius: 0.1}
    - {name: HM-OB3, role: observation, distance: 40, screen: [22, 34]}
  rates:
    - {from: 0, to: 600, rate: 10}
    - {from: 600, rate: 12.5}
---
`;

describe("the header's testInformation", () => {
  it("reads every field, satisfies the header schema and survives a write unchanged", () => {
    const { document, diagnostics } = parseDocument(HEADER);
    expect(diagnostics).toEqual([]);
    expect(document.header.testInformation).toEqual({
      site: "Hollin Marsh (invented)",
      started: "2026-05-04T09:30",
      ended: "2026-05-05",
      analyst: "A. Analyst",
      reviewer: "R. Reviewer",
      datum: "ground level",
      units: { length: "m", time: "min", rate: "L/s" },
      wells: [
        { name: "HM-PW2", role: "pumped", screen: [20, 35], radius: 0.1 },
        { name: "HM-OB3", role: "observation", distance: 40, screen: [22, 34] },
      ],
      rates: [{ from: 0, to: 600, rate: 10 }, { from: 600, rate: 12.5 }],
    });
    expect(validateJsonSchema(headerSchema, parseYaml(HEADER.replace(/^---\n|---\n$/g, "")))).toEqual([]);
    expect(serializeDocument(document)).toBe(HEADER);
    expect(document.header.extra).toEqual({});
  });

  it("reports each wrong field at its line with what would fix it", () => {
    const bad = HEADER.replace("ended: 2026-05-05", "ended: 2026-05-01")
      .replace("rate: L/s", "rate: m")
      .replace("screen: [22, 34]", "screen: [34, 22]")
      .replace("role: pumped", "role: pumping")
      .replace("{from: 600, rate: 12.5}", "{from: 500, rate: 12.5}");
    const { diagnostics } = parseDocument(bad, { file: "t.cone.md" });
    const lines = diagnostics.map((d) => `${d.line}: ${d.message}`);
    expect(lines).toEqual([
      `8: header key "testInformation.ended" must be a date no earlier than started (2026-05-04T09:30); fix the value`,
      `12: header key "testInformation.units.rate" must be a unit of pumping rate (such as m3/d or L/s); fix the value`,
      `14: header key "testInformation.wells.0.role" must be pumped or observation; fix the value`,
      `15: header key "testInformation.wells.1.screen" must be [top, bottom]: two depths in units.length with top < bottom; fix the value`,
      `18: header key "testInformation.rates.1.from" must be a time no earlier than the end of the step before; fix the value`,
    ]);
    const noUnits = parseDocument(HEADER.replace("  units: {length: m, time: min, rate: L/s}\n", ""));
    expect(noUnits.diagnostics.map((d) => d.message)).toEqual([
      `header key "testInformation.units.length" must be given: the distances and screens need their unit (add units: {length: m}); fix the value`,
      `header key "testInformation.units.time" must be given: the times of the rate schedule need their unit (add units: {time: min}); fix the value`,
      `header key "testInformation.units.rate" must be given: the rates need their unit (add units: {rate: m3/d}); fix the value`,
    ]);
  });
});
