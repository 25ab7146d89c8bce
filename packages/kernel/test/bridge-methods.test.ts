/**
 * The corrections, step, slug, recovery, distance-drawdown, forecasting, comparison and series-fitting functions of
 * the bridge, called from a cell, against the same calls made directly on the host: the bridge copies plain data
 * and must not change one bit of any number. Both sides are brought to the plain JSON form of a cell output (wire
 * encoding, then toJsonData); toEqual compares numbers with Object.is, so a change in the last bit fails.
 *
 * All data are invented here from formulas (an invented site: wells PW-1, OB-A, PZ-2), not taken from any record.
 */
import { describe, expect, it } from "vitest";
import {
  agarwalEquivalentTime,
  boundaryFromWell,
  bouwerRiceSlugTest,
  cbpNormalizedHead,
  compareModels,
  cooperBredehoeftPapadopulosFit,
  cooperJacobDistance,
  correctBarometric,
  correctJacobUnconfined,
  createObservationSeries,
  distanceToThreshold,
  estimateBarometricEfficiency,
  fitSeries,
  forecastAt,
  forecastDrawdown,
  getModel,
  hantushBierschenkStepTest,
  hvorslevSlugTest,
  jacobStepTest,
  recoveryAsDrawdown,
  removeLinearTrend,
  rorabaughStepTest,
  schemeDrawdown,
  stepEndDrawdowns,
  theisDrawdown,
  theisRecoveryLine,
  thiemDistance,
  withRateSchedule,
} from "@conebook/aquifer";
import type { CellOutput } from "@conebook/document";
import { createKernel } from "../src/index.js";
import { toJsonData } from "../src/displays.js";
import { decodeWireValue, encodeHostValue } from "../src/wire.js";
import { makeDoc } from "./helpers.js";

const kernel = createKernel();

/** A host value in the form a cell's show.json output has: wire round trip, then JSON data. */
function plain(value: unknown): unknown {
  return toJsonData(decodeWireValue(encodeHostValue(value)));
}

/** JSON text of host data for a cell's source (Float64Array written as a plain array: the same numbers). */
function js(value: unknown): string {
  return JSON.stringify(value, (_k, v: unknown) => (v instanceof Float64Array ? Array.from(v) : v));
}

/** Runs `setup` and then one cell per expression, each shown as JSON; returns the shown values. */
async function fromCells(setup: string, ...expressions: string[]): Promise<unknown[]> {
  const r = await kernel.runDocument(makeDoc([setup, ...expressions.map((e) => `show.json(${e})`)]));
  return expressions.map((_, i) => {
    const id = `c${i + 2}`;
    const out = r.outputs[id]?.[0];
    if (!out || out.type !== "json") throw new Error(`cell ${id} (${expressions[i]}) gave ${JSON.stringify(r.outputs[id])}`);
    return out.value;
  });
}

/** The error message each source shows when run as the only cell of a document (a failed cell stops a run). */
async function errorsOf(...sources: string[]): Promise<string[]> {
  const messages: string[] = [];
  for (const source of sources) {
    const r = await kernel.runDocument(makeDoc([source]));
    const out = r.outputs.c1?.[0] as CellOutput | undefined;
    if (!out || out.type !== "error") throw new Error(`expected an error from ${source}, got ${JSON.stringify(out)}`);
    messages.push(out.message);
  }
  return messages;
}

describe("corrections called from a cell", () => {
  // Invented pre-test record at OB-A: 24 hourly readings, pressure swinging 6 hPa, BE = 0.45, a slight rise.
  const pressures = Array.from({ length: 24 }, (_, i) => 1012 + 6 * Math.sin(i / 3) + 0.4 * Math.cos(1.9 * i));
  const levels = pressures.map((p, i) => 8.2 + 0.45 * (p - 1012) * (100 / 9806.65) + 0.0004 * i + 0.001 * Math.sin(2.7 * i));
  const baro = { levels, levelKind: "depth-to-water" as const, levelUnit: "m", pressures, pressureUnit: "hPa" };
  const times = Array.from({ length: 30 }, (_, i) => -90 + 10 * i);
  const trendValues = times.map((t) => 5.1 + 0.0002 * t + (t > 0 ? 0.3 * Math.log1p(t / 10) : 0) + 0.0005 * Math.sin(t));
  const drawdowns = [0.2, 0.8, 1.5, 2.4, 3.1];

  it("estimates barometric efficiency, corrects with it, removes a trend and applies Jacob's correction as the host does", async () => {
    const setup = `const baro = ${js(baro)}; const be = aq.estimateBarometricEfficiency({ ...baro, method: "levels" });`;
    const [estimate, corrected, byNumber, trend, jacob] = await fromCells(
      setup,
      "be",
      "aq.correctBarometric({ ...baro, efficiency: be, referencePressure: 1012 })",
      "aq.correctBarometric({ ...baro, efficiency: 0.45 })",
      `aq.removeLinearTrend({ times: ${js(times)}, values: ${js(trendValues)}, pumpingStart: 0, timeUnit: "min", valueUnit: "m" })`,
      `aq.correctJacobUnconfined({ drawdowns: ${js(drawdowns)}, lengthUnit: "m", saturatedThickness: { value: 40, unit: "ft" } })`,
    );
    const hostEstimate = estimateBarometricEfficiency({ ...baro, method: "levels" });
    expect(estimate).toEqual(plain(hostEstimate));
    expect(corrected).toEqual(plain(correctBarometric({ ...baro, efficiency: hostEstimate, referencePressure: 1012 })));
    expect(byNumber).toEqual(plain(correctBarometric({ ...baro, efficiency: 0.45 })));
    expect(trend).toEqual(plain(removeLinearTrend({ times, values: trendValues, pumpingStart: 0, timeUnit: "min", valueUnit: "m" })));
    expect(jacob).toEqual(plain(correctJacobUnconfined({ drawdowns, lengthUnit: "m", saturatedThickness: { value: 40, unit: "ft" } })));
    // The regression recovers the BE the invented record was made with, within its interval.
    expect(hostEstimate.interval95[0]).toBeLessThan(0.45);
    expect(hostEstimate.interval95[1]).toBeGreaterThan(0.45);
  });
});

describe("step tests called from a cell", () => {
  // Invented step test at PW-1: four steps of 100 min, s_w = B Q + C Q^2 with B = 2.5e-3 d/m2, C = 1.2e-6 d2/m5.
  const steps = [300, 550, 800, 1100].map((Q, i) => ({ rate: Q, drawdown: 2.5e-3 * Q + 1.2e-6 * Q * Q + 0.01 * Math.sin(i + 1) }));
  const input = { rateUnit: "m3/d", drawdownUnit: "m", steps };
  // A stepped record: Theis by superposition in time (T = 400 m2/d, S = 1e-3, r = 0.15 m) plus C Q(t)^2.
  const schedule = [0, 100, 200, 300].map((start, i) => ({ start, rate: [300, 550, 800, 1100][i]! }));
  const t = Array.from({ length: 40 }, (_, i) => 10 * (i + 1));
  const stepped = withRateSchedule(getModel("theis"), schedule.map((s) => ({ start: s.start / 1440, rate: s.rate })));
  const s = stepped.drawdown([400, 1e-3], { r: 0.15, Q: 1 }, t.map((v) => v / 1440));
  const rateAt = (time: number) => schedule.filter((q) => q.start < time).at(-1)!.rate;
  const series = createObservationSeries({
    name: "PW-1",
    times: t,
    drawdowns: Array.from(s, (v, i) => v + 1.2e-6 * rateAt(t[i]!) ** 2),
    timeUnit: "min",
    lengthUnit: "m",
    radius: { value: 0.15, unit: "m" },
    pumpingRate: { unit: "m3/d", steps: schedule },
  });

  it("gives Jacob, Rorabaugh, step-end drawdowns and Hantush-Bierschenk exactly as the host does", async () => {
    const setup = `const input = ${js(input)}; const series = ${js(series)};`;
    const [jacob, rorabaugh, ends, jacobOfEnds, hb] = await fromCells(
      setup,
      "aq.jacobStepTest(input)",
      "aq.rorabaughStepTest(input, { exponentBounds: [1.2, 4] })",
      "aq.stepEndDrawdowns(series)",
      "aq.jacobStepTest(aq.stepEndDrawdowns(series).input)",
      "aq.hantushBierschenkStepTest(series, { tailFraction: 0.6 })",
    );
    expect(jacob).toEqual(plain(jacobStepTest(input)));
    expect(rorabaugh).toEqual(plain(rorabaughStepTest(input, { exponentBounds: [1.2, 4] })));
    expect(ends).toEqual(plain(stepEndDrawdowns(series)));
    expect(jacobOfEnds).toEqual(plain(jacobStepTest(stepEndDrawdowns(series).input)));
    expect(hb).toEqual(plain(hantushBierschenkStepTest(series, { tailFraction: 0.6 })));
  });
});

describe("slug tests called from a cell", () => {
  // Invented slug test at PZ-2: H/H0 = exp(-t / 90 s), H0 = 0.6 m, 20 readings over 5 min.
  const times = Array.from({ length: 20 }, (_, i) => 15 * (i + 1));
  const record = {
    name: "PZ-2",
    times,
    timeUnit: "s",
    displacements: times.map((t, i) => 0.6 * Math.exp(-t / 90) * (1 + 0.002 * Math.sin(i))),
    lengthUnit: "m",
    initialDisplacement: { value: 0.6, unit: "m" },
  };
  const hvorslev = { casingRadius: { value: 2.5, unit: "cm" }, intakeRadius: { value: 0.05, unit: "m" }, intakeLength: { value: 1.5, unit: "m" } };
  const bouwerRice = {
    casingRadius: { value: 0.025, unit: "m" },
    wellRadius: { value: 0.06, unit: "m" },
    screenLength: { value: 2, unit: "m" },
    screenBottomDepth: { value: 6, unit: "m" },
    saturatedThickness: { value: 10, unit: "m" },
  };
  // CBP record: T = 5 m2/d, S = 1e-4, rc = rw = 5 cm (alpha = S), 12 readings log-spaced over 2 s .. 1 h.
  const cbpTimes = Array.from({ length: 12 }, (_, i) => 2 * Math.pow(1800, i / 11));
  const cbpRecord = {
    name: "PZ-2",
    times: cbpTimes,
    timeUnit: "s",
    displacements: cbpTimes.map((t) => 0.5 * cbpNormalizedHead(1e-4, (5 * (t / 86400)) / 0.0025)),
    lengthUnit: "m",
    initialDisplacement: { value: 0.5, unit: "m" },
  };
  const cbpGeometry = { casingRadius: { value: 5, unit: "cm" }, wellRadius: { value: 0.05, unit: "m" } };

  it("gives Hvorslev, Bouwer-Rice, the CBP curve and fit exactly as the host does", async () => {
    const setup = `const record = ${js(record)}; const cbpRecord = ${js(cbpRecord)};`;
    const [hv, br, curve, cbp] = await fromCells(
      setup,
      `aq.hvorslevSlugTest(record, ${js(hvorslev)}, { range: { maxNormalizedHead: 0.9 } })`,
      `aq.bouwerRiceSlugTest(record, ${js(bouwerRice)})`,
      "aq.cbpNormalizedHead(1e-4, 0.8)",
      `aq.cooperBredehoeftPapadopulosFit(cbpRecord, ${js(cbpGeometry)}, { fixedS: 1e-4 })`,
    );
    expect(hv).toEqual(plain(hvorslevSlugTest(record, hvorslev, { range: { maxNormalizedHead: 0.9 } })));
    expect(br).toEqual(plain(bouwerRiceSlugTest(record, bouwerRice)));
    expect(curve).toBe(cbpNormalizedHead(1e-4, 0.8));
    const host = cooperBredehoeftPapadopulosFit(cbpRecord, cbpGeometry, { fixedS: 1e-4 });
    expect(cbp).toEqual(plain(host));
    expect(Math.abs(host.T / 5 - 1)).toBeLessThan(1e-6);
  });
});

describe("recovery and distance-drawdown called from a cell", () => {
  // Invented: OB-A 40 m from PW-1, 1200 m3/d for 2 d, then recovery; T = 350 m2/d, S = 2e-4 (Theis).
  const dt = Array.from({ length: 15 }, (_, i) => 0.002 * Math.pow(10, (i * 3) / 14));
  const residual = dt.map((d) => theisDrawdown(350, 2e-4, 1200, 40, 2 + d) - theisDrawdown(350, 2e-4, 1200, 40, d));
  const sAtStop = theisDrawdown(350, 2e-4, 1200, 40, 2);
  const r = [10, 30, 90, 250];
  const sr = r.map((x) => theisDrawdown(350, 2e-4, 1200, x, 1));

  it("gives the Theis recovery line, Agarwal time, recovery as drawdown and both distance lines as the host does", async () => {
    const setup = `const dt = ${js(dt)}; const residual = ${js(residual)}; const r = ${js(r)}; const sr = ${js(sr)};`;
    const [line, te, asDrawdown, cj, thiem] = await fromCells(
      setup,
      "aq.theisRecoveryLine({ tp: 2, dt, residual, Q: 1200, screen: { r: 40, S: 2e-4 } })",
      "aq.agarwalEquivalentTime(2, 0.5)",
      `aq.recoveryAsDrawdown(2, ${sAtStop}, dt, residual)`,
      "aq.cooperJacobDistance({ r, s: sr, Q: 1200, t: 1 })",
      "aq.thiemDistance({ r, s: sr, Q: 1200 })",
    );
    expect(line).toEqual(plain(theisRecoveryLine({ tp: 2, dt, residual, Q: 1200, screen: { r: 40, S: 2e-4 } })));
    expect(te).toBe(agarwalEquivalentTime(2, 0.5));
    expect(asDrawdown).toEqual(plain(recoveryAsDrawdown(2, sAtStop, dt, residual)));
    expect(cj).toEqual(plain(cooperJacobDistance({ r, s: sr, Q: 1200, t: 1 })));
    expect(thiem).toEqual(plain(thiemDistance({ r, s: sr, Q: 1200 })));
    // te = tp dt/(tp + dt) = 2 * 0.5 / 2.5 = 0.4 d (Agarwal 1980), by hand.
    expect(te).toBeCloseTo(0.4, 15);
  });
});

describe("series fits, comparison and forecasts called from a cell", () => {
  // Invented record at OB-A in ft, min and US gal/min: Hantush-Jacob drawdown with T = 300 m2/d, S = 2e-4,
  // B = 500 m, r = 45 m, Q = 150 US gal/min, and a ripple of 5 mm.
  const tMin = Array.from({ length: 24 }, (_, i) => Math.pow(10, (i * 3.5) / 23));
  const Q = 150 * 3.785411784e-3 * 1440;
  const leaky = getModel("hantush-jacob").drawdown([300, 2e-4, 500], { r: 45, Q }, tMin.map((t) => t / 1440));
  const series = createObservationSeries({
    name: "OB-A",
    times: tMin,
    drawdowns: Array.from(leaky, (s, i) => (s + 0.005 * Math.sin(1.3 * i)) / 0.3048),
    timeUnit: "min",
    lengthUnit: "ft",
    radius: { value: 45 / 0.3048, unit: "ft" },
    pumpingRate: { value: 150, unit: "US gal/min" },
  });
  const reportUnits = { T: "ft2/d", B: "ft" };
  // Theis on leaky data leaves serially correlated residuals; with the AR(1) correction its S is not identified
  // and a Monte Carlo forecast through a strip would draw S down to 1e-7, where the image series is long. The
  // bridge is what this test checks, so the Theis fit treats the errors as independent.
  const theis = fitSeries({ model: "theis", series: [series], reportUnits, correlation: "independent" });
  const hj = fitSeries({ model: "hantush-jacob", series: [series], reportUnits });
  const setup = `const series = ${js(series)};
const theis = aq.fitSeries({ model: "theis", series: [series], reportUnits: ${js(reportUnits)}, correlation: "independent" });
const hj = aq.fitSeries({ model: "hantush-jacob", series: [series], reportUnits: ${js(reportUnits)} });`;
  const wells = [{ name: "PW-1", x: 0, y: 0, steps: [{ start: 0, rate: 1000 }, { start: 5, rate: 0 }] }, { name: "PW-2", x: 120, y: 60, steps: [{ start: 1, rate: 600 }] }];
  const barrier = [{ kind: "no-flow" as const, distance: 200, angle: 90 }];
  const strip = [{ kind: "constant-head" as const, distance: 150, angle: 0 }, { kind: "no-flow" as const, distance: 400, angle: 180 }];
  const toLines = (records: typeof strip) => records.map((b) => boundaryFromWell(b.kind, wells[0]!, b.distance, (b.angle * Math.PI) / 180));

  it("fits series in their own units and ranks the fits exactly as the host does", async () => {
    const [t1, t2, ranking] = await fromCells(setup, "theis", "hj", "aq.compareModels([theis, hj], { lengthUnit: 'ft', names: ['Theis', 'Hantush-Jacob'] })");
    expect(t1).toEqual(plain(theis));
    expect(t2).toEqual(plain(hj));
    expect(ranking).toEqual(plain(compareModels([theis, hj], { lengthUnit: "ft", names: ["Theis", "Hantush-Jacob"] })));
    expect((ranking as { rows: { modelId: string }[] }).rows[0]!.modelId).toBe("hantush-jacob");
  });

  it("forecasts from a fit passed as plain data, around one well and for a scheme with boundaries, exactly as the host does", async () => {
    const at = {
      points: [{ name: "house well", distance: { value: 800, unit: "ft" } }],
      times: { values: [60, 1440, 14400], unit: "min" },
      rate: { value: 150, unit: "US gal/min" },
      lengthUnit: "ft",
    };
    const scheme = { wells, points: [{ name: "OB-A", x: 45, y: 0 }, { name: "spring", x: -80, y: 150 }], times: [0.5, 2, 8] };
    const [near, linear, mc, given, threshold] = await fromCells(
      setup,
      `aq.forecastAt({ fit: hj, ...${js(at)}, uncertainty: "linear" })`,
      `aq.forecastDrawdown({ model: "hantush-jacob", fit: hj, ...${js(scheme)}, boundaries: ${js(barrier)}, uncertainty: "linear" })`,
      `aq.forecastDrawdown({ model: "theis", fit: theis, ...${js(scheme)}, boundaries: ${js(strip)}, uncertainty: { monteCarlo: { samples: 50, seed: 11 } } })`,
      `aq.forecastDrawdown({ model: "theis", parameters: { T: 300, S: 2e-4 }, ...${js(scheme)} })`,
      "aq.distanceToThreshold('theis', { T: 300, S: 2e-4 }, 1000, 30, 0.25, { rMax: 1e5 })",
    );
    expect(near).toEqual(plain(forecastAt({ fit: hj, ...at, uncertainty: "linear" })));
    const common = { schedule: wells, points: scheme.points, times: scheme.times };
    expect(linear).toEqual(plain(forecastDrawdown({ model: getModel("hantush-jacob"), fit: hj, ...common, boundaries: toLines(barrier), uncertainty: "linear" })));
    expect(mc).toEqual(plain(forecastDrawdown({ model: getModel("theis"), fit: theis, ...common, boundaries: toLines(strip), uncertainty: { monteCarlo: { samples: 50, seed: 11 } } })));
    expect(given).toEqual(plain(forecastDrawdown({ model: getModel("theis"), parameters: { T: 300, S: 2e-4 }, ...common })));
    expect(threshold).toEqual(plain(distanceToThreshold(getModel("theis"), { T: 300, S: 2e-4 }, 1000, 30, 0.25, { rMax: 1e5 })));
  });

  it("evaluates a scheme of wells with rate steps and boundary records exactly as the host does", async () => {
    const [withStrip, withJacobian] = await fromCells(
      "",
      `aq.schemeDrawdown({ model: "theis", parameters: { T: 300, S: 2e-4 }, wells: ${js(wells)}, boundaries: ${js(strip)}, point: { x: 30, y: 20 }, t: [0.5, 2, 8] })`,
      `aq.schemeDrawdown({ model: "theis", parameters: [300, 2e-4], wells: ${js(wells)}, boundaries: ${js(barrier)}, point: { x: 30, y: 20 }, t: [0.5, 2, 8], jacobian: true })`,
    );
    const theisModel = getModel("theis");
    expect(withStrip).toEqual(plain(schemeDrawdown(theisModel, [300, 2e-4], { wells, boundaries: toLines(strip) }, { x: 30, y: 20 }, [0.5, 2, 8])));
    expect(withJacobian).toEqual(plain(schemeDrawdown(theisModel, [300, 2e-4], { wells, boundaries: toLines(barrier), jacobian: true }, { x: 30, y: 20 }, [0.5, 2, 8])));
  });
});

describe("bad arguments to the new bridge functions", () => {
  it("name the function and the argument, and say what was expected", async () => {
    const messages = await errorsOf(
      "aq.cbpNormalizedHead(-1, 2)",
      "aq.jacobStepTest({ rateUnit: 'm3/d', drawdownUnit: 'm', steps: [] })",
      "aq.correctBarometric({ levels: [1, 2, 3], levelKind: 'depth', levelUnit: 'm', pressures: [1, 2, 3], pressureUnit: 'hPa', efficiency: 0.4 })",
      "aq.hvorslevSlugTest({ name: 'PZ', times: [1, 2], timeUnit: 's', displacements: [0.5, 0.2], lengthUnit: 'm', initialDisplacement: 0.6 }, {})",
      "aq.forecastDrawdown({ model: 'theis', wells: [{ name: 'PW', x: 0, y: 0, steps: [{ start: 0, rate: 100 }] }], points: [{ name: 'OB', r: 10 }], times: [1] })",
      "aq.schemeDrawdown({ model: 'theis', parameters: { T: 300 }, wells: [{ name: 'PW', x: 0, y: 0, steps: [{ start: 0, rate: 100 }] }], point: { x: 5, y: 0 }, t: [1] })",
      "aq.forecastDrawdown({ model: 'theis', parameters: { T: 300, S: 1e-4 }, wells: [{ name: 'PW', x: 0, y: 0, steps: [{ start: 0, rate: 100 }] }], points: [{ name: 'OB', x: 5, y: 0 }], times: [1], boundaries: [{ kind: 'river', distance: 50, angle: 0 }] })",
      "aq.compareModels([{ modelId: 'theis' }])",
      "aq.agarwalEquivalentTime(2, 0)",
    );
    expect(messages[0]).toBe("TypeError: aq.cbpNormalizedHead: argument 1 (alpha) must be a finite number > 0, got -1");
    expect(messages[1]).toMatch(/^TypeError: aq\.jacobStepTest: argument 1 \(input\), field "steps" must be an array of at least 1 elements/);
    expect(messages[2]).toBe(
      'TypeError: aq.correctBarometric: argument 1 (options), field "levelKind" must be one of "depth-to-water", "drawdown", "head", got "depth"',
    );
    expect(messages[3]).toMatch(/^TypeError: aq\.hvorslevSlugTest: argument 1 \(record\), field "initialDisplacement" must be an object with fields value, unit, got 0\.6/);
    expect(messages[4]).toBe("TypeError: aq.forecastDrawdown: argument 1 (options) needs exactly one of fit (a fit result) or parameters (values by name, base units)");
    expect(messages[5]).toMatch(/^TypeError: aq\.schemeDrawdown: parameter S of model "theis" is missing/);
    expect(messages[6]).toMatch(/^TypeError: aq\.forecastDrawdown: argument 1 \(options\), field "boundaries", element 0, field "kind" must be one of "constant-head", "no-flow", got "river"/);
    expect(messages[7]).toMatch(/^TypeError: aq\.compareModels: argument 1 \(fits\), element 0, field "n" must be an integer >= 1, got nothing/);
    expect(messages[8]).toBe("TypeError: aq.agarwalEquivalentTime: argument 2 (dt) must be a finite number > 0, got 0");
  });

  it("pass errors of the host function on with the guest function's name", async () => {
    const series = `{ name: "OB", times: [1, 2, 4], drawdowns: [0.1, 0.2, 0.3], timeUnit: "min", lengthUnit: "ft", radius: { value: 30, unit: "ft" }, pumpingRate: { value: 100, unit: "US gpm" } }`;
    const [unit, stepped] = await errorsOf(
      `aq.fitSeries({ model: "theis", series: [${series}], reportUnits: { T: "ft" } })`,
      `aq.stepEndDrawdowns(${series})`,
    );
    expect(unit).toBe("UnitError: aq.fitSeries: reportUnits.T (transmissivity): cannot convert a transmissivity (m2/d) to a length (ft)");
    expect(stepped).toMatch(/^StepTestInputError: aq\.stepEndDrawdowns: Series "OB": the pumping rate is constant/);
  });
});
