/**
 * The data and fitting functions of the bridge, called from a cell, against the same calls made directly on the
 * host: the bridge copies plain data across and must not change a single bit of any number. Both sides are
 * brought to the plain JSON form of a cell output (wire encoding, then toJsonData); toEqual compares numbers
 * with Object.is, so a change in the last bit (or -0 against 0) fails.
 *
 * Data: the invented Kestrel Moor record (notebooks/data, written by notebooks/data/make_demo_data.py).
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import {
  bourdetDerivative,
  cooperJacobLine,
  cooperJacobValidity,
  describeUnit,
  estimateStaticLevel,
  fitModel,
  getModel,
  logResample,
  parseObservationCsv,
  parseUnit,
  regimeHints,
  removeStaticLevel,
  startingValues,
  toBaseUnits,
  transmissivityFromDerivativeLevel,
  type ObservationCsvOptions,
} from "@conebook/aquifer";
import type { CellOutput } from "@conebook/document";
import { createKernel } from "../src/index.js";
import { toJsonData } from "../src/displays.js";
import { decodeWireValue, encodeHostValue } from "../src/wire.js";
import { makeDoc } from "./helpers.js";

const kernel = createKernel();
const dataDir = new URL("../../../notebooks/data/", import.meta.url);
const ob1Csv = readFileSync(new URL("kestrel-moor-km-ob1.csv", dataDir), "utf8");
const ob2Csv = readFileSync(new URL("kestrel-moor-km-ob2.csv", dataDir), "utf8");

const ob1Options: ObservationCsvOptions = {
  name: "KM-OB1",
  timeColumn: "elapsed_min",
  valueColumn: "depth_to_water_m",
  timeUnit: "min",
  kind: "depth-to-water",
  lengthUnit: "m",
  staticLevel: 12.43,
  radius: { value: 28, unit: "m" },
  pumpingRate: { value: 1450, unit: "m3/d" },
};
const ob2Options: ObservationCsvOptions = { ...ob1Options, name: "KM-OB2", staticLevel: 13.07, radius: { value: 85, unit: "m" } };

/** A host value in the form a cell's show.json output has: wire round trip, then JSON data. */
function plain(value: unknown): unknown {
  return toJsonData(decodeWireValue(encodeHostValue(value)));
}

/** Data cells for both records, then the import and base-unit conversion every test below starts from. */
const setup = [
  { kind: "data" as const, name: "ob1", source: ob1Csv },
  { kind: "data" as const, name: "ob2", source: ob2Csv },
  `const imp1 = aq.parseObservationCsv(ob1.csv, ${JSON.stringify(ob1Options)});
const imp2 = aq.parseObservationCsv(ob2.csv, ${JSON.stringify(ob2Options)});
const base1 = aq.toBaseUnits(imp1.series);
const base2 = aq.toBaseUnits(imp2.series);`,
];

/** Runs the setup cells and then one cell per expression, each shown as JSON; returns the shown values. */
async function fromCells(...expressions: string[]): Promise<unknown[]> {
  const r = await kernel.runDocument(makeDoc([...setup, ...expressions.map((e) => `show.json(${e})`)]));
  return expressions.map((_, i) => {
    const id = `c${setup.length + i + 1}`;
    const out = r.outputs[id]?.[0];
    if (!out || out.type !== "json") throw new Error(`cell ${id} (${expressions[i]}) gave ${JSON.stringify(r.outputs[id])}`);
    return out.value;
  });
}

async function errorOf(source: string): Promise<string> {
  const r = await kernel.runDocument(makeDoc([...setup, source]));
  const out = r.outputs[`c${setup.length + 1}`]?.[0] as CellOutput | undefined;
  if (!out || out.type !== "error") throw new Error(`expected an error, got ${JSON.stringify(out)}`);
  return out.message;
}

const imp1 = parseObservationCsv(ob1Csv, ob1Options);
const imp2 = parseObservationCsv(ob2Csv, ob2Options);
const base1 = toBaseUnits(imp1.series);
const base2 = toBaseUnits(imp2.series);
const wells = [base1, base2].map((b) => ({ name: b.name, geometry: { r: b.r, Q: b.Q! }, t: b.t, s: b.s }));

describe("data functions called from a cell", () => {
  it("imports a depth-to-water CSV, converts it to base units and thins it exactly as the host does", async () => {
    const [imported, base, thinned] = await fromCells("imp1", "base2", "aq.logResample(imp1.series, { pointsPerDecade: 5, method: 'median' })");
    expect(imported).toEqual(plain(imp1));
    expect(base).toEqual(plain(base2));
    expect(thinned).toEqual(plain(logResample(imp1.series, { pointsPerDecade: 5, method: "median" })));
    // 70 readings at t > 0 (make_demo_data.py writes 70 log-spaced times); drawdown = depth - static depth.
    expect(imp1.series.times.length).toBe(70);
    expect(imp1.series.drawdowns[0]).toBeCloseTo(12.592 - 12.43, 12);
  });

  it("refuses a series whose times were edited out of order, naming the rule broken", async () => {
    const message = await errorOf("const bad = { ...imp1.series, times: Float64Array.from(imp1.series.times).reverse() }; aq.toBaseUnits(bad)");
    expect(message).toContain("aq.toBaseUnits: argument 1 (series)");
    expect(message).toContain("does not follow");
  });

  it("reports CSV problems from the importer with the guest function's name", async () => {
    const message = await errorOf(`aq.parseObservationCsv("elapsed_min,depth_to_water_m\\n1,abc\\n", ${JSON.stringify(ob1Options)})`);
    expect(message).toMatch(/^CsvError: aq\.parseObservationCsv: The observation CSV could not be imported/);
  });

  it("parses units to plain data and converts them", async () => {
    const [unit, value] = await fromCells("aq.parseUnit('L/s')", "aq.convert(1450, 'm3/d', 'L/s')");
    const u = parseUnit("L/s");
    expect(unit).toEqual(plain({ symbol: u.symbol, dimension: { ...u.dimension }, dimensionName: "discharge", factor: u.factor, description: describeUnit(u) }));
    // 1450 m3/d = 1450 * 1000 L / 86400 s (exact definitions of the litre and the day, NIST SP 811).
    expect(value).toBeCloseTo((1450 * 1000) / 86400, 12);
  });
});

describe("models and fitting called from a cell", () => {
  it("gives model descriptors as plain data without the host's functions", async () => {
    const [descriptor] = await fromCells("aq.getModel('hantush-jacob')");
    const { drawdown: _d, jacobian: _j, ...expected } = getModel("hantush-jacob");
    expect(descriptor).toEqual(plain(expected));
    expect(Object.keys(descriptor as object)).not.toContain("drawdown");
  });

  it("evaluates drawdown by model id from a record or a vector of parameters, bit for bit", async () => {
    const t = [0.01, 0.1, 1, 30];
    const [theis, leakyRecord, leakyVector] = await fromCells(
      `aq.drawdown('theis', { T: 380, S: 3.5e-4 }, { r: 400, Q: 1450 }, ${JSON.stringify(t)})`,
      `aq.drawdown('hantush-jacob', { S: 3.5e-4, B: 900, T: 380 }, { r: 28, Q: 1450 }, base1.t)`,
      `aq.drawdown('hantush-jacob', [380, 3.5e-4, 900], { r: 28, Q: 1450 }, base1.t)`,
    );
    expect(theis).toEqual(plain(getModel("theis").drawdown([380, 3.5e-4], { r: 400, Q: 1450 }, t)));
    const leaky = plain(getModel("hantush-jacob").drawdown([380, 3.5e-4, 900], { r: 28, Q: 1450 }, base1.t));
    expect(leakyRecord).toEqual(leaky);
    expect(leakyVector).toEqual(leaky);
  });

  it("names the missing parameter and the model's parameters when a record is incomplete", async () => {
    const message = await errorOf("aq.drawdown('hantush-jacob', { T: 380, S: 3.5e-4 }, { r: 28, Q: 1450 }, [1])");
    expect(message).toBe(
      'TypeError: aq.drawdown: parameter B of model "hantush-jacob" is missing; its parameters are T (transmissivity, m2/d), S (storativity, 1), B (leakage factor, m)',
    );
  });

  it("draws the Cooper-Jacob line, checks its validity and finds starting values as the host does", async () => {
    const [line, validity, startTheis, startLeaky] = await fromCells(
      "aq.cooperJacobLine(base1.t, base1.s, { r: base1.r, Q: base1.Q })",
      "aq.cooperJacobValidity(400, 3e-4, base2.r, base2.t)",
      "aq.startingValues('theis', { r: base1.r, Q: base1.Q }, base1.t, base1.s)",
      "aq.startingValues('hantush-jacob', { r: base2.r, Q: base2.Q }, base2.t, base2.s, { uMax: 0.05 })",
    );
    expect(line).toEqual(plain(cooperJacobLine(base1.t, base1.s, { r: base1.r, Q: base1.Q! })));
    expect(validity).toEqual(plain(cooperJacobValidity(400, 3e-4, base2.r, base2.t)));
    expect(startTheis).toEqual(plain(startingValues("theis", { r: base1.r, Q: base1.Q! }, base1.t, base1.s)));
    expect(startLeaky).toEqual(plain(startingValues("hantush-jacob", { r: base2.r, Q: base2.Q! }, base2.t, base2.s, { uMax: 0.05 })));
  });

  it("fits Theis and Hantush-Jacob to both wells with the same numbers as a direct fit", async () => {
    const [theis, leaky, fixedB] = await fromCells(
      "aq.fitModel({ model: 'theis', wells: [base1, base2] })",
      "aq.fitModel({ model: 'hantush-jacob', wells: [{ name: base1.name, geometry: { r: base1.r, Q: base1.Q }, t: base1.t, s: base1.s }, base2] })",
      "aq.fitModel({ model: 'hantush-jacob', wells: [base1, base2], fixed: { B: 900 }, start: { T: 300 } })",
    );
    expect(theis).toEqual(plain(fitModel({ model: getModel("theis"), wells })));
    const direct = fitModel({ model: getModel("hantush-jacob"), wells });
    expect(leaky).toEqual(plain(direct));
    expect(fixedB).toEqual(plain(fitModel({ model: getModel("hantush-jacob"), wells, fixed: { B: 900 }, start: { T: 300 } })));
    // The generating script used T = 380 m2/d, S = 3.5e-4, B = 900 m (make_demo_data.py); the fit recovers them
    // within its 95 % intervals.
    const [T, S, B] = direct.parameters;
    expect(T!.ci95![0]).toBeLessThan(380);
    expect(T!.ci95![1]).toBeGreaterThan(380);
    expect(S!.ci95![0]).toBeLessThan(3.5e-4);
    expect(S!.ci95![1]).toBeGreaterThan(3.5e-4);
    expect(B!.ci95![0]).toBeLessThan(900);
    expect(B!.ci95![1]).toBeGreaterThan(900);
  });

  it("refuses an unknown model id and a well without distance and rate, saying what to give", async () => {
    expect(await errorOf("aq.fitModel({ model: 'theiss', wells: [base1] })")).toBe(
      'TypeError: aq.fitModel: argument 1 (options), field "model": Unknown model "theiss". Known models: theis, cooper-jacob, hantush-jacob, hantush-aquitard-storage, thiem, boulton, papadopulos-anisotropy, theis-barrier-image, neuman, papadopulos-cooper, ' +
        "hantush-partial-penetration, hantush-leaky-partial-penetration, dougherty-babu, moench-water-table, neuman-partial-penetration, moench-double-porosity, " +
        "dupuit-thiem, gringarten-fracture, jacob-lohman, kgs-slug, underdamped-slug, theis+well-loss, papadopulos-cooper+well-loss.",
    );
    expect(await errorOf("aq.fitModel({ model: 'theis', wells: [{ name: 'x', t: base1.t, s: base1.s }] })")).toBe(
      'TypeError: aq.fitModel: argument 1 (options), field "wells", element 0 has no distance and rate; give geometry: { r, Q } (m, m3/d) or r and Q',
    );
  });
});

describe("diagnostics and corrections called from a cell", () => {
  it("forms the Bourdet derivative and reads regime hints from it as the host does", async () => {
    const options = { lengthUnit: "m", pumpingRate: { value: 1450, unit: "m3/d" } };
    const [derivative, hints, T] = await fromCells(
      "aq.bourdetDerivative(imp1.series.times, imp1.series.drawdowns, { smoothingLog10: 0.2 })",
      `aq.regimeHints(aq.bourdetDerivative(imp1.series.times, imp1.series.drawdowns), ${JSON.stringify(options)})`,
      "aq.transmissivityFromDerivativeLevel({ value: 1450, unit: 'm3/d' }, { value: 0.3, unit: 'm' })",
    );
    const direct = bourdetDerivative(imp1.series.times, imp1.series.drawdowns, { smoothingLog10: 0.2 });
    expect(derivative).toEqual(plain(direct));
    expect(hints).toEqual(plain(regimeHints(bourdetDerivative(imp1.series.times, imp1.series.drawdowns), options)));
    // T = Q / (4 pi level) (Theis 1935 differentiated): 1450 / (4 pi 0.3) m2/d.
    expect(T).toBe(transmissivityFromDerivativeLevel({ value: 1450, unit: "m3/d" }, { value: 0.3, unit: "m" }));
    expect(T).toBeCloseTo(1450 / (4 * Math.PI * 0.3), 10);
  });

  it("estimates a static level from pre-test readings and removes it, passing the estimate back in", async () => {
    const times = [-30, -20, -10, 0, 10, 20];
    const levels = [12.41, 12.45, 12.43, 12.43, 12.9, 13.1];
    const estimateOptions = { times, levels, pumpingStart: 0, count: 3, timeUnit: "min", lengthUnit: "m" };
    const [estimate, removed] = await fromCells(
      `aq.estimateStaticLevel(${JSON.stringify(estimateOptions)})`,
      `aq.removeStaticLevel({ levels: ${JSON.stringify(levels)}, levelKind: "depth-to-water", lengthUnit: "m", staticLevel: aq.estimateStaticLevel(${JSON.stringify(estimateOptions)}) })`,
    );
    const direct = estimateStaticLevel(estimateOptions);
    expect(estimate).toEqual(plain(direct));
    expect(removed).toEqual(plain(removeStaticLevel({ levels, levelKind: "depth-to-water", lengthUnit: "m", staticLevel: direct })));
    // The mean of the three readings before t = 0 (12.41, 12.45, 12.43) is 12.43 m.
    expect(direct.level).toBeCloseTo(12.43, 12);
  });
});

describe("show.fit on a real fit result", () => {
  it("tabulates estimate, standard error, 95 % interval and its kind per parameter, then RMSE, AIC, BIC, the residual checks and the interval statement", async () => {
    const r = await kernel.runDocument(makeDoc([...setup, "show.fit(aq.fitModel({ model: 'theis', wells: [base1, base2] }))"]));
    const fit = fitModel({ model: getModel("theis"), wells });
    const [T, S] = fit.parameters;
    const dw = fit.diagnostics.durbinWatson!;
    expect(r.outputs.c4).toEqual([
      {
        type: "table",
        title: fit.errors.length === 0 ? "Fitted parameters: Theis (1935) confined aquifer" : expect.stringMatching(/^NOT RELIABLE/),
        columns: [
          { name: "parameter" },
          { name: "estimate" },
          { name: "standard error" },
          { name: "95 % low" },
          { name: "95 % high" },
          { name: "unit" },
          { name: "interval" },
        ],
        rows: [
          ...fit.errors.map((e) => ["ERROR", e, null, null, null, "", null]),
          ["T (transmissivity)", T!.estimate, T!.standardError, T!.ci95![0], T!.ci95![1], "m2/d", T!.ci95Method],
          ["S (storativity)", S!.estimate, S!.standardError, S!.ci95![0], S!.ci95![1], "1", S!.ci95Method],
          ["RMSE", fit.rmse, null, null, null, "m", null],
          ["AIC", fit.aic, null, null, null, "", null],
          ["BIC", fit.bic, null, null, null, "", null],
          ["Durbin-Watson d", dw.statistic, null, null, null, "", null],
          ["Durbin-Watson p-value", dw.pValue, null, null, null, "", null],
          ["lag-1 autocorrelation", fit.diagnostics.lag1Autocorrelation, null, null, null, "", fit.diagnostics.independent ? null : "not independent"],
          ["intervals", fit.uncertainty.statement, null, null, null, "", null],
        ],
      },
    ]);
  });

  it("puts NOT RELIABLE in the title and each error in its own first row when the fit has errors", async () => {
    const r = await kernel.runDocument(makeDoc(["show.fit(aq.fitModel({ model: 'theis', wells: [{ name: 'Z', r: 30, Q: 500, t: [0.01, 0.02, 0.05, 0.1, 0.2, 0.5, 1, 2, 5, 10], s: [0, 0, 0, 0, 0, 0, 0, 0, 0, 0] }] }))"]));
    const table = r.outputs.c1![0] as { title: string; rows: unknown[][] };
    expect(table.title).toMatch(/^NOT RELIABLE \(\d+ errors?\): Fitted parameters: Theis/);
    expect(table.rows[0]![0]).toBe("ERROR");
    expect(String(table.rows[0]![1])).toContain('Well "Z": all 10 drawdowns are 0');
  });
});
