/**
 * The template form's model, DOM-free: a parameter must be changed or confirmed, a value typed in another unit is
 * converted as `--set` converts it, and a data file is pinned as chosen or mapped into the slot's columns and units.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { parseDocument, sha256Hex, utf8Bytes } from "@conebook/document";
import { blockingParameters, csvPreview, initialField, initialMapping, isTemplate, mappingProblems, prepareData, readField } from "../src/model/template-form.js";

const template = parseDocument(readFileSync(new URL("../../../notebooks/templates/constant-rate-test.cone.md", import.meta.url), "utf8")).document;
const demo = parseDocument(readFileSync(new URL("../../../notebooks/kestrel-moor-constant-rate.cone.md", import.meta.url), "utf8")).document;
const param = (name: string) => template.header.parameters.find((p) => p.name === name)!;
const slot = template.header.dataSlots![0]!;

describe("the template form's parameters", () => {
  it("counts a document with parameters or data slots as a template", () => {
    expect(isTemplate(template)).toBe(true);
    expect(isTemplate(demo)).toBe(false);
  });

  it("blocks every parameter left at the demonstration value until it is confirmed or changed", () => {
    const names = template.header.parameters.map((p) => p.name);
    expect(blockingParameters(template.header.parameters, {})).toEqual(names);
    const fields = Object.fromEntries(template.header.parameters.map((p) => [p.name, { ...initialField(p), confirmed: true }]));
    expect(blockingParameters(template.header.parameters, fields)).toEqual([]);
    expect(blockingParameters(template.header.parameters, { ...fields, rate: { text: "2000000", confirmed: true } })).toEqual(["rate"]);
  });

  it("converts a value typed in another unit of the same dimension and refuses one of another dimension", () => {
    // 165 US gpm = 165 x 3.785411784 L/min (NIST Handbook 44) = 899.41 m3/d.
    const r = readField(param("rate"), { text: "165 US gpm", confirmed: false });
    expect("value" in r && r.value).toBeCloseTo((165 * 3.785411784 * 1440) / 1000, 9);
    expect("shown" in r && r.shown).toMatch(/ m3\/d \(converted from 165 US gpm\)$/);
    const bad = readField(param("distance"), { text: "3 L/s", confirmed: false });
    expect("problem" in bad && bad.problem).toMatch(/parameter "distance" is in m, and "L\/s" cannot be converted to it/);
  });
});

describe("the template form's data", () => {
  const same = "elapsed_min,depth_to_water_m\n1,8.80\n10,9.12\n";
  it("pins a file whose columns are the slot's, in its units, as it is", () => {
    const bytes = utf8Bytes(same);
    const mapping = initialMapping(slot, csvPreview(same).columns);
    expect(mappingProblems(slot, mapping)).toEqual([]);
    expect(prepareData(slot, "C:\\logs\\tg ob2.csv", bytes, mapping)).toEqual({ path: "data/tg_ob2.csv", bytes, sha256: sha256Hex(bytes), asChosen: true });
  });

  it("writes the slot's columns, converted to the slot's units, for a file with other names and units", () => {
    const text = "depth_ft;time_h;logger\n28.9;0.1;A\n29.6;0.5;A\n";
    const mapping = { elapsed_min: { column: "time_h", unit: "h" }, depth_to_water_m: { column: "depth_ft", unit: "ft" } };
    const made = prepareData(slot, "tg.csv", utf8Bytes(text), mapping);
    // 0.1 h = 6 min; 28.9 ft x 0.3048 m/ft = 8.80872 m (NIST SP 811 B.8).
    expect(new TextDecoder().decode(made.bytes)).toBe("elapsed_min,depth_to_water_m\n6,8.80872\n30,9.02208\n");
    expect(made.path).toBe("data/tg.obs.csv");
    expect(mappingProblems(slot, { elapsed_min: { column: "", unit: "" }, depth_to_water_m: { column: "time_h", unit: "s" } })).toEqual([
      "choose the file's column for elapsed_min (min)",
      expect.stringMatching(/^depth_to_water_m: /),
    ]);
  });
});
