import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { TemplateInputError, documentFromTemplate, parseDocument, readTemplateSetting, sha256Hex, utf8Bytes } from "../src/index.js";

const TEMPLATE_TEXT = readFileSync(new URL("../../../notebooks/templates/constant-rate-test.cone.md", import.meta.url), "utf8");
const template = parseDocument(TEMPLATE_TEXT, { file: "constant-rate-test.cone.md" }).document;
const CSV = "elapsed_min,depth_to_water_m\n1,8.80\n10,9.10\n100,9.42\n";
const settings = [
  readTemplateSetting("rate", "12 L/s"),
  readTemplateSetting("distance", "40"),
  readTemplateSetting("static_depth", "8.72"),
  readTemplateSetting("site", "Tern Gap (invented)"),
  readTemplateSetting("pumped_well", "TG-PW1"),
  readTemplateSetting("observation_well", "TG-OB2"),
  readTemplateSetting("duration", "1440"),
];
const base = { template, templateShown: "constant-rate-test.cone.md", outShown: "tg.cone.md", settings, data: [{ slot: "obs", path: "data/readings.csv", bytes: utf8Bytes(CSV) }] };

describe("documentFromTemplate (shared by conebook new and the template form)", () => {
  it("fills parameters with converted values, pins the data file and sets the test information given", () => {
    const made = documentFromTemplate({ ...base, title: "Test at Tern Gap", info: { analyst: "P. Q. Hydro (invented)", "wells.0.notes": "screen 40-60 m (invented)" } });
    const back = parseDocument(made.text).document;
    const rate = back.header.parameters.find((p) => p.name === "rate")!;
    // 12 L/s = 12 * 86.4 m3/d = 1036.8 m3/d (1 L = 1e-3 m3, 1 d = 86400 s).
    expect(rate.value).toBeCloseTo(1036.8, 9);
    expect(rate.given).toBe("12 L/s");
    expect(back.header.title).toBe("Test at Tern Gap");
    expect(back.header.testInformation?.analyst).toBe("P. Q. Hydro (invented)");
    expect(back.header.testInformation?.wells?.map((w) => w.name)).toEqual(["TG-PW1", "TG-OB2"]);
    const data = back.cells.find((c) => c.kind === "data");
    expect(data?.kind === "data" && data.file).toEqual({ path: "data/readings.csv", sha256: sha256Hex(utf8Bytes(CSV)) });
    expect(made.text).toContain("and analyst, wells.0.notes given; replace it with this test's");
    expect(made.warnings).toEqual(['constant-rate-test.cone.md:48: warning: the test information in the header is the template\'s; replace it with this test\'s']);
  });

  it("refuses a required parameter left out, an unknown test information field, and a file without the slot's columns", () => {
    expect(() => documentFromTemplate({ ...base, settings: settings.slice(1) })).toThrow(/constant-rate-test\.cone\.md:9:12: parameter "rate" \(m3\/d\) must be given/);
    expect(() => documentFromTemplate({ ...base, info: { geologist: "x" } })).toThrow(TemplateInputError);
    expect(() => documentFromTemplate({ ...base, info: { "wells.5.name": "x" } })).toThrow(/has 2 wells \(wells\.0 to wells\.1\)/);
    expect(() => documentFromTemplate({ ...base, data: [{ slot: "obs", path: "d.csv", bytes: utf8Bytes("t,s\n1,2\n") }] })).toThrow(
      /data slot "obs" needs the columns elapsed_min \(min\), depth_to_water_m \(m\), but the file's header line has t, s/,
    );
  });
});
