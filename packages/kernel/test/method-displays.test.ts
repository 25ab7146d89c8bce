/**
 * The screened-well, step, slug, anisotropy, diagnostic, match-point and barometric methods called from a cell: the
 * same numbers as the host call, and shown by their show.* display as tables with a unit per column. Invented records.
 */
import { describe, expect, it } from "vitest";
import {
  barometricResponse,
  earthTideCheck,
  fitAnisotropy,
  fitKgsSlugTest,
  fitStepDrawdown,
  fitUnderdampedSlugTest,
  getModel,
  hantushJacobMatchPoint,
  kgsSlugModel,
  papadopulosAnisotropyModel,
  slopeHints,
  stepDrawdownModel,
  theisModel,
  transmissivityFromSpecificCapacity,
  underdampedSlugModel,
} from "@conebook/aquifer";
import type { CellOutput } from "@conebook/document";
import { createKernel } from "../src/index.js";
import { makeDoc } from "./helpers.js";

const kernel = createKernel();
type Table = Extract<CellOutput, { type: "table" }>;
const js = (v: unknown) => JSON.stringify(v, (_k, v) => (v instanceof Float64Array ? Array.from(v) : v));

async function outputsOf(source: string): Promise<CellOutput[]> {
  const r = await kernel.runDocument(makeDoc([source]));
  const outs = r.outputs.c1!;
  const error = outs.find((o) => o.type === "error");
  if (error) throw new Error(JSON.stringify(error));
  return outs;
}

const units = (t: Table) => Object.fromEntries(t.columns.map((c) => [c.name, c.unit]));
const log = (a: number, b: number, n: number) => Array.from({ length: n }, (_, i) => a * Math.pow(b / a, i / (n - 1)));

describe("methods and their displays, from a cell", () => {
  it("fits a transient step test with well loss and shows the parameters with C in its unit and the losses per step", async () => {
    const steps = [{ start: 0, rate: 400 }, { start: 0.05, rate: 800 }, { start: 0.1, rate: 1200 }];
    const t = Array.from({ length: 60 }, (_, i) => 0.0025 * (i + 1));
    const s = Array.from(stepDrawdownModel(theisModel, steps).drawdown([150, 2e-4, 5e-8, 2.2], { r: 0.15, Q: 400 }, t));
    const input = { aquifer: "theis", steps, wellRadius: 0.15, t, s };
    const host = fitStepDrawdown({ ...input, aquifer: theisModel });
    const [parameters, losses] = (await outputsOf(`show.stepTest(aq.fitStepDrawdown(${js(input)}))`)) as Table[];
    expect(parameters!.title).toBe("Step test: transient fit of theis+well-loss (superposition in time, well loss C Q^n)");
    expect(parameters!.rows.slice(0, 4).map((r) => [r[1], r[5]])).toEqual(host.fit.parameters.map((p) => [p.estimate, p.name === "C" ? host.wellLossUnit : p.unit]));
    expect(Math.abs((parameters!.rows[3]![1] as number) / 2.2 - 1)).toBeLessThan(1e-6);
    expect(units(losses!)).toMatchObject({ rate: "m3/d", end: "d", "aquifer loss": "m", "well loss": "m", efficiency: "1" });
    expect(losses!.rows.map((r) => r[5])).toEqual(host.steps.map((x) => x.efficiency));
  });

  it("shows T from specific capacity with its notes, the numbers of the host", async () => {
    const host = transmissivityFromSpecificCapacity(250, 1, 0.1, 1e-4);
    const outs = await outputsOf("show.specificCapacity(aq.transmissivityFromSpecificCapacity(250, 1, 0.1, 1e-4))");
    expect((outs[0] as Table).rows[0]).toEqual(["T (transmissivity, a lower bound)", host.T, "m2/d"]);
    expect(outs.slice(1)).toEqual(host.notes.map((n) => ({ type: "text", text: `note: ${n}` })));
  });

  it("fits KGS and underdamped slug tests from a cell and shows Kr and C_D", async () => {
    const kgs = { thickness: 10, screenTop: 3, screenBottom: 6, rc: 0.05, rw: 0.1, anisotropy: 1 };
    const t = log(1e-5, 1e-2, 24);
    const h = Array.from(kgsSlugModel(kgs).drawdown([20, 2e-5], { r: 0.1, Q: 1 }, t));
    const hostKgs = fitKgsSlugTest(kgs, t, h);
    const [kTable] = (await outputsOf(`show.slugTest(aq.fitKgsSlugTest(${js(kgs)}, ${js(t)}, ${js(h)}))`)) as Table[];
    expect(kTable!.title).toBe("Slug test: KGS model (Hyder et al. 1994)");
    expect(kTable!.rows.find((r) => String(r[0]).startsWith("Kr"))!.slice(1, 2)).toEqual([hostKgs.Kr]);
    expect(Math.abs(hostKgs.Kr / 2 - 1)).toBeLessThan(1e-4);
    const ud = { rc: 0.05, screenLength: 3, lnReRw: 3 };
    const tu = log(1e-6, 4e-4, 40);
    const hu = Array.from(underdampedSlugModel(ud).drawdown([200, 8], { r: 1, Q: 1 }, tu));
    const hostUd = fitUnderdampedSlugTest(ud, tu, hu, { start: { K: 150, Le: 6 } });
    const [uTable] = (await outputsOf(`show.slugTest(aq.fitUnderdampedSlugTest(${js(ud)}, ${js(tu)}, ${js(hu)}, { start: { K: 150, Le: 6 } }))`)) as Table[];
    expect(uTable!.rows.find((r) => String(r[0]).startsWith("C_D"))![1]).toBe(hostUd.CD);
    expect(uTable!.rows[0]![1]).toBe(hostUd.fit.parameters[0]!.estimate);
  });

  it("runs the slug-test data checks from a cell and shows one row per check", async () => {
    const record = { name: "PZ-2", times: [5, 10, 20, 40, 80], timeUnit: "s", displacements: [0.5, 0.41, 0.3, 0.16, 0.05], lengthUnit: "m", initialDisplacement: { value: 0.5, unit: "m" } };
    const outs = await outputsOf(`const n = aq.normalizeSlugRecord(${js(record)}); show.slugChecks(aq.slugRecordChecks([{ name: "PZ-2", record: n, expectedH0: 0.62 }]))`);
    const table = outs[0] as Table;
    expect(table.columns.map((c) => c.name)).toEqual(["test", "check", "passed", "finding"]);
    expect(table.rows[0]!.slice(0, 3)).toEqual(["PZ-2", "initial displacement", "no"]);
    expect(String(table.rows[0]![3])).toMatch(/differs from the expected 0.620 m by -19 %/);
  });

  it("fits horizontal anisotropy from three wells with plan coordinates and shows the principal values and the wells", async () => {
    const truth = [400, 100, 0.5, 2e-4];
    const place = [[30, 0], [0, 40], [-25, 25]] as const;
    const t = log(1e-3, 2, 20);
    const wells = place.map(([x, y], k) => ({ name: `OB-${k + 1}`, geometry: { r: Math.hypot(x, y), Q: 900, x, y }, t, s: Array.from(papadopulosAnisotropyModel.drawdown(truth, { r: Math.hypot(x, y), Q: 900, x, y }, t)) }));
    const host = fitAnisotropy(wells);
    const [principal, table] = (await outputsOf(`show.anisotropy(aq.fitAnisotropy(${js(wells)}))`)) as Table[];
    expect(principal!.rows[0]!.slice(0, 2)).toEqual(["Tmax (major principal transmissivity)", host.Tmax.value]);
    expect(Math.abs(host.Tmax.value / 400 - 1)).toBeLessThan(1e-5);
    expect(principal!.rows[2]![5]).toBe("degree");
    expect(Math.abs(host.directionDegrees.value - (0.5 * 180) / Math.PI)).toBeLessThan(1e-4);
    expect(units(table!)).toMatchObject({ x: "m", y: "m", distance: "m" });
    const chart = await outputsOf(`const a = aq.fitAnisotropy(${js(wells)}); charts.anisotropyEllipse({ ellipse: a.ellipse, wells: a.wells })`);
    expect(chart[0]!.type).toBe("chart");
  });

  it("shows slope hints of a linear-flow record as hints, with the time unit asked for", async () => {
    const times = log(1e-3, 1, 30);
    const derivative = times.map((v) => 0.3 * Math.sqrt(v));
    const host = slopeHints({ times, derivative });
    const [table] = (await outputsOf(`show.slopeHints(aq.slopeHints(${js({ times, derivative })}), { timeUnit: "d" })`)) as Table[];
    expect(table!.title).toBe("Flow-regime hints from the log derivative (hints, not verdicts)");
    expect(table!.rows.map((r) => r[0])).toEqual(host.hints.map(() => "slope 1/2"));
    expect(units(table!)).toMatchObject({ from: "d", to: "d" });
  });

  it("shows a Hantush-Jacob match point with B and the leakance in their units", async () => {
    const input = { Q: 900, r: 30, W: 1, u: 0.1, rB: 0.2, s: 0.5, t: 0.05 };
    const host = hantushJacobMatchPoint(input);
    const [table] = (await outputsOf(`show.matchPoint(aq.hantushJacobMatchPoint(${js(input)}))`)) as Table[];
    expect(table!.rows).toContainEqual(["B (leakage factor)", host.B, "m"]);
    expect(table!.rows).toContainEqual(["leakance K'/b' = T / B²", host.leakance, "1/d"]);
  });

  it("computes the barometric response function and the earth-tide check from a cell, as the host does", async () => {
    const n = 240;
    const times = Array.from({ length: n }, (_, i) => i / 24);
    const pressures = times.map((v, i) => 1012 + 5 * Math.sin(i / 7) + 0.8 * Math.cos(2 * Math.PI * 2 * v));
    const levels = pressures.map((p, i) => 8 + 0.004 * (p - 1012) + 0.002 * Math.cos(2 * Math.PI * 1.9322736 * times[i]!) + 1e-4 * Math.sin(i * 1.7));
    const options = { times, timeUnit: "d", levels, levelKind: "depth-to-water", levelUnit: "m", pressures, pressureUnit: "hPa", lags: 4, earthTides: true };
    const host = barometricResponse(options as Parameters<typeof barometricResponse>[0]);
    const [lags, summary, hint] = await outputsOf(`show.barometricResponse(aq.barometricResponse(${js(options)}))`);
    expect((lags as Table).rows.map((r) => r[3])).toEqual(host.lags.map((l) => l.response));
    expect(units(lags as Table)).toMatchObject({ lag: "d", coefficient: "1", response: "1" });
    expect((summary as Table).rows[0]).toEqual(["reading interval", host.interval, "d"]);
    expect(hint).toEqual({ type: "text", text: host.hint });
    const tide = earthTideCheck({ times, timeUnit: "d", values: levels, valueUnit: "m" });
    const [tideTable] = (await outputsOf(`show.earthTide(aq.earthTideCheck(${js({ times, timeUnit: "d", values: levels, valueUnit: "m" })}))`)) as Table[];
    expect(tideTable!.rows.map((r) => r[2])).toEqual(tide.constituents.map((c) => c.amplitude));
    expect(units(tideTable!)).toMatchObject({ period: "h", amplitude: "m" });
  });

  it("draws a slug-test model given with geometry options as the host does", async () => {
    const spec = { id: "kgs-slug", aquiferThickness: 10, screenTop: 3, screenBottom: 6, casingRadius: 0.05, wellRadius: 0.1, anisotropy: 1 };
    const direct = getModel(spec).drawdown([20, 2e-5], { r: 0.1, Q: 1 }, [1e-3])[0]!;
    const outs = await outputsOf(`aq.drawdown(${js(spec)}, { T: 20, S: 2e-5 }, { r: 0.1, Q: 1 }, 1e-3)[0]`);
    expect(outs[0]).toEqual({ type: "value", value: direct });
  });
});
