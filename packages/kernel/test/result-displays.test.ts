/**
 * show.stepTest, show.slugTest, show.recovery, show.forecast and show.comparison: each result shows as tables
 * with a unit per column (never raw JSON), its numbers those the host function returns. Invented records.
 */
import { describe, expect, it } from "vitest";
import {
  compareModels,
  fitModel,
  forecastAt,
  getModel,
  hvorslevSlugTest,
  jacobStepTest,
  theisDrawdown,
  theisRecoveryLine,
} from "@conebook/aquifer";
import type { CellOutput } from "@conebook/document";
import { createKernel } from "../src/index.js";
import { makeDoc } from "./helpers.js";

const kernel = createKernel();
type Table = Extract<CellOutput, { type: "table" }>;
const js = (v: unknown) => JSON.stringify(v);

async function outputsOf(source: string): Promise<CellOutput[]> {
  const r = await kernel.runDocument(makeDoc([source]));
  const outs = r.outputs.c1!;
  const error = outs.find((o) => o.type === "error");
  if (error) throw new Error(JSON.stringify(error));
  return outs;
}

function columnUnits(t: Table): Record<string, string | undefined> {
  return Object.fromEntries(t.columns.map((c) => [c.name, c.unit]));
}

describe("result displays with units", () => {
  it("shows a Jacob step test as a coefficient table and a step table with units", async () => {
    // Invented step test: s_w = B Q + C Q^2 with B = 2.5e-3 d/m2, C = 1.2e-6 d2/m5, a small ripple.
    const steps = [300, 550, 800, 1100].map((Q, i) => ({ rate: Q, drawdown: 2.5e-3 * Q + 1.2e-6 * Q * Q + 0.01 * Math.sin(i + 1) }));
    const input = { rateUnit: "m3/d", drawdownUnit: "m", steps };
    const host = jacobStepTest(input);
    const outs = await outputsOf(`show.stepTest(aq.jacobStepTest(${js(input)}))`);
    expect(outs.some((o) => o.type === "json")).toBe(false);
    const [coefficients, table] = outs as Table[];
    expect(coefficients!.title).toBe("Step test: Jacob (1947) s_w = B Q + C Q^2");
    expect(coefficients!.rows.map((r) => [r[1], r[5]])).toEqual(host.parameters.map((p) => [p.estimate, p.unit]));
    expect(columnUnits(table!)).toMatchObject({ rate: "m3/d", drawdown: "m", efficiency: "1", "specific capacity": "m2/d" });
    expect(table!.rows.map((r) => r[6])).toEqual(host.steps.map((s) => s.efficiency));
  });

  it("shows a Hvorslev slug test with K, its interval and unit", async () => {
    // Invented: H/H0 = exp(-b t), b = 20 1/d, readings every 30 s for 10 min.
    const times = Array.from({ length: 20 }, (_, i) => 30 * (i + 1));
    const record = { name: "PZ-1", times, timeUnit: "s", displacements: times.map((t) => 0.8 * Math.exp((-20 * t) / 86400) * (1 + 0.002 * Math.sin(t))), lengthUnit: "m", initialDisplacement: { value: 0.8, unit: "m" } };
    const geometry = { casingRadius: { value: 2.5, unit: "cm" }, intakeRadius: { value: 0.05, unit: "m" }, intakeLength: { value: 1.5, unit: "m" } };
    const host = hvorslevSlugTest(record, geometry);
    const [table] = (await outputsOf(`show.slugTest(aq.hvorslevSlugTest(${js(record)}, ${js(geometry)}))`)) as Table[];
    expect(table!.title).toBe("Slug test: Hvorslev (1951)");
    expect(table!.rows[0]).toEqual(["K (hydraulic conductivity)", host.K, host.standardError, host.ci95![0], host.ci95![1], "m/d"]);
  });

  it("shows the Theis recovery line with T in m2/d and the slope in m per log cycle", async () => {
    // Invented: 1200 m3/d for 2 d, T = 350 m2/d, S = 2e-4, r = 40 m (Theis).
    const dt = Array.from({ length: 15 }, (_, i) => 0.002 * Math.pow(10, (i * 3) / 14));
    const residual = dt.map((d) => theisDrawdown(350, 2e-4, 1200, 40, 2 + d) - theisDrawdown(350, 2e-4, 1200, 40, d));
    const input = { tp: 2, dt, residual, Q: 1200, screen: { r: 40, S: 2e-4 } };
    const host = theisRecoveryLine(input);
    const [table] = (await outputsOf(`show.recovery(aq.theisRecoveryLine(${js(input)}))`)) as Table[];
    expect(table!.rows[0]!.slice(0, 3)).toEqual(["T (transmissivity)", host.T, host.TStandardError]);
    expect(table!.rows[0]![5]).toBe("m2/d");
    expect(table!.rows[1]).toEqual(["residual drawdown per log cycle of t/t'", host.slopePerLogCycle, null, null, null, "m"]);
  });

  it("shows a forecast and a model comparison as tables with units and the comparison's caution", async () => {
    const t = Array.from({ length: 20 }, (_, i) => 0.001 * Math.pow(10, (3 * i) / 19));
    const s = getModel("theis").drawdown([250, 2e-4], { r: 30, Q: 900 }, t).map((v, i) => v * (1 + 0.003 * Math.sin(3 * i)));
    const wells = [{ name: "OB", geometry: { r: 30, Q: 900 }, t, s: Array.from(s) }];
    const fit = fitModel({ model: getModel("theis"), wells });
    const leaky = fitModel({ model: getModel("hantush-jacob"), wells });
    const forecastOptions = { points: [{ name: "farm well", distance: { value: 400, unit: "m" } }], times: { values: [1, 30], unit: "d" }, rate: { value: 1000, unit: "m3/d" }, uncertainty: "linear" as const, lengthUnit: "cm" };
    const hostForecast = forecastAt({ fit, ...forecastOptions });
    const hostComparison = compareModels([fit, leaky], { lengthUnit: "mm" });
    const outs = await outputsOf(
      `const wells = ${js(wells)};\nconst fit = aq.fitModel({ model: "theis", wells });\nconst leaky = aq.fitModel({ model: "hantush-jacob", wells });\n` +
        `show.forecast(aq.forecastAt({ fit, ...${js(forecastOptions)} }));\nshow.comparison(aq.compareModels([fit, leaky], { lengthUnit: "mm" }));`,
    );
    const forecast = outs[0] as Table;
    expect(columnUnits(forecast)).toMatchObject({ time: "d", drawdown: "cm", "95 %": "cm" });
    expect(forecast.rows.map((r) => r[3])).toEqual(Array.from(hostForecast.points[0]!.drawdown));
    expect(forecast.rows[0]!.slice(0, 3)).toEqual(["farm well", "400 m", 1]);
    const comparison = outs.find((o) => o.type === "table" && o.title?.startsWith("Model comparison")) as Table;
    expect(comparison.rows.map((r) => r[1])).toEqual(hostComparison.rows.map((r) => r.name));
    expect(columnUnits(comparison).RMSE).toBe("mm");
    expect(outs).toContainEqual({ type: "text", text: hostComparison.caution });
  });

  it("shows a fit's plausibility notes as text after its table", async () => {
    // Late data of a water-table aquifer (storage 0.05) fitted as confined: S is outside the confined range.
    const t = Array.from({ length: 20 }, (_, i) => 0.001 * Math.pow(10, (3 * i) / 19));
    const s = Array.from(getModel("theis").drawdown([250, 0.05], { r: 30, Q: 900 }, t));
    const outs = await outputsOf(`show.fit(aq.fitModel({ model: "theis", wells: [{ name: "OB", geometry: { r: 30, Q: 900 }, t: ${js(t)}, s: ${js(s)} }] }))`);
    expect(outs.map((o) => o.type)).toEqual(["table", "text"]);
    expect((outs[1] as { text: string }).text).toMatch(/^Plausibility: S = 0\.05 is outside the storativities of confined aquifers usually met/);
  });
});

describe("CSV problems in inline data", () => {
  it("are restated at the document line of the inline row", async () => {
    const doc = makeDoc([
      { kind: "data", name: "obs", source: "elapsed_min,depth_to_water_m\n1,8.80\n2,\n5,8.95" },
      `aq.parseObservationCsv(obs.csv, { timeColumn: "elapsed_min", valueColumn: "depth_to_water_m", timeUnit: "min", kind: "depth-to-water", staticLevel: 8.7, lengthUnit: "m", radius: { value: 15, unit: "m" }, pumpingRate: { value: 250, unit: "m3/d" } })`,
    ]);
    const r = await kernel.runDocument(doc);
    const error = r.outputs.c2![0] as { type: string; message: string };
    // Line 3 of the CSV text is the row with the missing reading; the data cell's source starts at file line 5.
    expect(error.message).toContain(`data cell c1, line ${doc.cells[0]!.sourceStart.line + 2} of the document: column 'depth_to_water_m' (2): the level is missing`);
  });
});
