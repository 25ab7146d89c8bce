/**
 * Models bound to geometry (Neuman, Papadopulos-Cooper, Hantush 1961 partial penetration) called from a cell by
 * id with options: the same numbers as the host, options checked like every argument, and the library's gap
 * (leaky partial penetration) named with the nearest models. Invented scenario values.
 */
import { describe, expect, it } from "vitest";
import { describeModel, fitSeries, getModel, parseObservationCsv } from "@conebook/aquifer";
import type { CellOutput } from "@conebook/document";
import { createKernel } from "../src/index.js";
import { toJsonData } from "../src/displays.js";
import { makeDoc } from "./helpers.js";

const kernel = createKernel();

async function outputOf(source: string): Promise<CellOutput> {
  const r = await kernel.runDocument(makeDoc([source]));
  return r.outputs.c1![0]!;
}

describe("models bound to geometry, from a cell", () => {
  it("describes the Neuman model and its saturatedThickness option", async () => {
    const out = await outputOf(`show.json(aq.describeModel("neuman"))`);
    expect(out).toEqual({ type: "json", value: toJsonData(describeModel("neuman")) });
    expect((out as { value: { options: { name: string }[] } }).value.options.map((o) => o.name)).toEqual(["saturatedThickness"]);
  });

  it("draws Papadopulos-Cooper drawdown bit for bit as the host, a casing radius given in inches", async () => {
    const spec = { id: "papadopulos-cooper", casingRadius: { value: 6, unit: "in" }, wellRadius: 0.1524 };
    const out = await outputOf(`show.json(aq.drawdown(${JSON.stringify(spec)}, { T: 150, S: 2e-4 }, { r: 0.1524, Q: 500 }, [0.001, 0.01, 0.1]))`);
    expect(out).toEqual({ type: "json", value: toJsonData(getModel(spec).drawdown([150, 2e-4], { r: 0.1524, Q: 500 }, [0.001, 0.01, 0.1])) });
  });

  it("refuses a geometry-bound model without its options, naming the option and the form to give", async () => {
    const out = await outputOf(`aq.drawdown("neuman", { T: 150, S: 1e-3, Sy: 0.1, KzKr: 0.1 }, { r: 10, Q: 500 }, 1)`);
    expect(out.type).toBe("error");
    expect((out as { message: string }).message).toBe(
      'TypeError: aq.drawdown: argument 1 (model): model "neuman" is bound to the geometry of its wells and needs saturatedThickness (m); ' +
        'give it as { id: "neuman", saturatedThickness: ... }. Its options are saturatedThickness (m, required).',
    );
  });

  it("points a request for leaky partial penetration by another name to the Hantush (1964) model", async () => {
    const out = await outputOf(`aq.fitModel({ model: "leaky-partial-penetration", wells: [{ name: "PZ", geometry: { r: 10, Q: 500 }, t: [1, 2, 3], s: [0.1, 0.2, 0.3] }] })`);
    expect((out as { message: string }).message).toMatch(
      /field "model": Unknown model "leaky-partial-penetration"; for a partially penetrating well in a leaky aquifer use "hantush-leaky-partial-penetration" \(Hantush 1964\)/,
    );
  });

  it("fits a Neuman record given in ft and min through aq.fitSeries with the thickness in ft, as the host does", async () => {
    const truth = [300, 2e-3, 0.15, 0.25];
    const spec = { id: "neuman", saturatedThickness: { value: 60, unit: "ft" } };
    const model = getModel(spec);
    const minutes = Array.from({ length: 30 }, (_, i) => Math.pow(10, (4.5 * i) / 29));
    const s = model.drawdown(truth, { r: 20 * 0.3048, Q: 1200 }, minutes.map((m) => m / 1440));
    const csv = ["t_min,s_ft", ...minutes.map((m, i) => `${m},${s[i]! / 0.3048}`)].join("\n");
    const options = { timeColumn: "t_min", valueColumn: "s_ft", timeUnit: "min", lengthUnit: "ft", radius: { value: 20, unit: "ft" }, pumpingRate: { value: 1200, unit: "m3/d" } };
    const series = parseObservationCsv(csv, options).series;
    const host = fitSeries({ model: spec, series: [series], reportUnits: { T: "ft2/d" } });
    const out = await outputOf(
      `const series = aq.parseObservationCsv(${JSON.stringify(csv)}, ${JSON.stringify(options)}).series;\n` +
        `show.json(aq.fitSeries({ model: ${JSON.stringify(spec)}, series: [series], reportUnits: { T: "ft2/d" } }).table)`,
    );
    expect(out).toEqual({ type: "json", value: toJsonData(host.table) });
    expect(Math.abs(host.parameters[0]!.estimate / 300 - 1)).toBeLessThan(1e-4);
    expect(host.modelSpec).toEqual({ id: "neuman", saturatedThickness: 60 * 0.3048 });
  });
});
