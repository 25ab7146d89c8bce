/**
 * Every drawdown model documented in docs/methods.md is usable from a document: the test reads the model table
 * of that page, and for each id builds a document whose data cell holds synthetic drawdowns of that model
 * (computed on the host from known parameters; invented scenario), fits them with aq.fitModel, draws them
 * with aq.drawdown, forecasts with aq.forecastAt and ranks with aq.compareModels, and checks the fitted
 * parameters against the parameters the data were made with. The same table must list every registered id.
 * Models whose output is not a drawdown proportional to a pumping rate (slug tests, a well at constant drawdown,
 * Dupuit-Thiem) are checked to refuse the forecast with a message that says why.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { getModel, modelIds, type ModelSpec } from "@conebook/aquifer";
import { parseDocument, type CellOutput } from "@conebook/document";
import { createKernel } from "@conebook/kernel";

const methods = readFileSync(new URL("../docs/methods.md", import.meta.url), "utf8");

/** Ids in the first column of the model table ("| id | name | parameters | geometry options |"). */
function documentedIds(): string[] {
  const start = methods.indexOf("| id | name | parameters |");
  expect(start, "docs/methods.md has the model table").toBeGreaterThan(0);
  const rows = methods.slice(start).split("\n").slice(2);
  const ids: string[] = [];
  for (const row of rows) {
    const m = /^\| `([a-z+-]+)` \|/.exec(row);
    if (!m) break;
    ids.push(m[1]!);
  }
  return ids;
}

interface Case {
  spec: ModelSpec;
  truth: Record<string, number>;
  /** Observation wells; x and y (m from the pumping well) for the models that depend on direction. */
  wells: { name: string; r: number; x?: number; y?: number }[];
  Q: number;
  times: number[];
  start?: Record<string, number>;
  /** Steady data have no straight line for aq.startingValues to use: the document does not call it. */
  steady?: true;
  /** Largest relative error accepted for the fitted parameters (noise-free data). */
  tolerance: number;
  /** False where a pumping-rate forecast does not apply: the document shows the refusal instead. */
  forecast?: false;
  /** The model the forecast uses when it is not the fitted one (the aquifer under a step test's well loss). */
  forecastSpec?: ModelSpec;
}

const log = (a: number, b: number, n: number) => Array.from({ length: n }, (_, i) => a * Math.pow(b / a, i / (n - 1)));

// Invented scenarios; parameter values chosen inside each model's bounds.
const cases: Record<string, Case> = {
  theis: { spec: "theis", truth: { T: 250, S: 2e-4 }, wells: [{ name: "OB-1", r: 30 }], Q: 900, times: log(1e-3, 2, 30), tolerance: 1e-6 },
  "cooper-jacob": { spec: "cooper-jacob", truth: { T: 250, S: 2e-4 }, wells: [{ name: "OB-1", r: 30 }], Q: 900, times: log(0.1, 2, 20), tolerance: 1e-6 },
  "hantush-jacob": { spec: "hantush-jacob", truth: { T: 250, S: 2e-4, B: 600 }, wells: [{ name: "OB-1", r: 30 }], Q: 900, times: log(1e-3, 3, 30), tolerance: 1e-4 },
  "hantush-aquitard-storage": {
    spec: "hantush-aquitard-storage", truth: { T: 250, S: 2e-4, B: 600, Sa: 1e-3 }, wells: [{ name: "OB-1", r: 30 }, { name: "OB-2", r: 90 }], Q: 900,
    times: log(1e-3, 3, 30), start: { T: 400, S: 1e-4, B: 1000, Sa: 3e-3 }, tolerance: 1e-3,
  },
  "theis-barrier-image": {
    spec: "theis-barrier-image", truth: { T: 520, S: 1.8e-4, ri: 504 }, wells: [{ name: "OB-1", r: 45 }], Q: 1600, times: log(1e-3, 3, 30),
    start: { T: 300, S: 4e-4, ri: 300 }, tolerance: 1e-5,
  },
  thiem: { spec: "thiem", truth: { T: 250, R: 800 }, wells: [{ name: "OB-1", r: 30 }, { name: "OB-2", r: 120 }], Q: 900, times: [1, 2, 3], steady: true, tolerance: 1e-6 },
  neuman: {
    spec: { id: "neuman", saturatedThickness: 20 }, truth: { T: 250, S: 1e-3, Sy: 0.12, KzKr: 0.3 }, wells: [{ name: "OB-1", r: 15 }], Q: 900,
    times: log(1e-4, 10, 40), tolerance: 1e-3,
  },
  "papadopulos-cooper": {
    spec: { id: "papadopulos-cooper", casingRadius: 0.3, wellRadius: 0.3 }, truth: { T: 120, S: 3e-4 }, wells: [{ name: "PW", r: 0.3 }, { name: "OB-1", r: 8 }], Q: 400,
    times: log(1e-4, 1, 30), tolerance: 1e-4,
  },
  "hantush-partial-penetration": {
    spec: { id: "hantush-partial-penetration", aquiferThickness: 25, screenTop: 0, screenBottom: 8, piezometerDepth: 20, anisotropy: 0.2 },
    truth: { T: 150, S: 2e-4 }, wells: [{ name: "PZ-1", r: 10 }], Q: 600, times: log(1e-3, 1, 16), tolerance: 1e-6,
  },
  boulton: { spec: "boulton", truth: { T: 250, S: 1e-3, Sy: 0.12, alpha: 2 }, wells: [{ name: "OB-1", r: 15 }], Q: 900, times: log(1e-4, 10, 40), tolerance: 1e-3 },
  "papadopulos-anisotropy": {
    spec: "papadopulos-anisotropy", truth: { Tmax: 400, Tmin: 100, theta: 0.5, S: 2e-4 },
    wells: [{ name: "OB-1", r: 30, x: 30, y: 0 }, { name: "OB-2", r: 40, x: 0, y: 40 }, { name: "OB-3", r: Math.hypot(25, 25), x: -25, y: 25 }], Q: 900,
    times: log(1e-3, 2, 20), start: { Tmax: 300, Tmin: 150, theta: 0.3, S: 3e-4 }, tolerance: 1e-4,
  },
  "hantush-leaky-partial-penetration": {
    spec: { id: "hantush-leaky-partial-penetration", aquiferThickness: 25, screenTop: 0, screenBottom: 8, piezometerDepth: 20, anisotropy: 0.2 },
    truth: { T: 150, S: 2e-4, B: 150 }, wells: [{ name: "PZ-1", r: 10 }], Q: 600, times: log(1e-3, 10, 24), tolerance: 1e-5,
  },
  "dougherty-babu": {
    spec: { id: "dougherty-babu", aquiferThickness: 30, screenTop: 0, screenBottom: 12, wellRadius: 0.15, casingRadius: 0.15, anisotropy: 0.2 },
    truth: { T: 150, S: 2e-4 }, wells: [{ name: "PW", r: 0.15 }, { name: "OB-1", r: 10 }], Q: 600, times: log(1e-4, 1, 24), tolerance: 1e-4,
  },
  "moench-water-table": {
    spec: { id: "moench-water-table", saturatedThickness: 20, screenTop: 5, screenBottom: 15, wellRadius: 0.1, casingRadius: 0.1, anisotropy: 0.3 },
    truth: { T: 250, S: 1e-3, Sy: 0.12, alpha: 20 }, wells: [{ name: "OB-1", r: 15 }], Q: 900, times: log(1e-3, 10, 20), tolerance: 1e-3,
  },
  "neuman-partial-penetration": {
    spec: { id: "neuman-partial-penetration", saturatedThickness: 20, screenTop: 10, screenBottom: 20, piezometerDepth: 5, anisotropy: 0.3 },
    truth: { T: 250, S: 1e-3, Sy: 0.12 }, wells: [{ name: "PZ-1", r: 15 }], Q: 900, times: log(1e-4, 10, 24), tolerance: 1e-3,
  },
  "moench-double-porosity": {
    spec: { id: "moench-double-porosity", aquiferThickness: 40, screenTop: 0, screenBottom: 40, wellRadius: 0.1, casingRadius: 0, anisotropy: 1 },
    truth: { T: 80, S: 1e-5, Sm: 5e-4, blockRate: 2 }, wells: [{ name: "OB-1", r: 20 }], Q: 300, times: log(1e-4, 10, 24),
    start: { T: 60, S: 2e-5, Sm: 3e-4, blockRate: 1 }, tolerance: 1e-3,
  },
  "dupuit-thiem": {
    spec: { id: "dupuit-thiem", saturatedThickness: 20 }, truth: { K: 12, R: 800 }, wells: [{ name: "OB-1", r: 30 }, { name: "OB-2", r: 120 }], Q: 900,
    times: [1, 2, 3], steady: true, tolerance: 1e-6, forecast: false,
  },
  "gringarten-fracture": {
    spec: { id: "gringarten-fracture", halfLength: 25 }, truth: { T: 120, S: 2e-4 }, wells: [{ name: "OB-1", r: 40, x: 40, y: 0 }, { name: "OB-2", r: 30, x: 0, y: 30 }],
    Q: 400, times: log(1e-3, 1, 20), tolerance: 1e-5,
  },
  "jacob-lohman": {
    spec: { id: "jacob-lohman", wellRadius: 0.1, wellDrawdown: 12 }, truth: { T: 80, S: 2e-4 }, wells: [{ name: "FW", r: 0.1 }], Q: 1, times: log(1e-3, 5, 24),
    tolerance: 1e-5, forecast: false,
  },
  "kgs-slug": {
    spec: { id: "kgs-slug", aquiferThickness: 10, screenTop: 3, screenBottom: 6, casingRadius: 0.05, wellRadius: 0.1, anisotropy: 1 },
    truth: { T: 20, S: 2e-5 }, wells: [{ name: "slug", r: 0.1 }], Q: 1, times: log(1e-5, 1e-2, 24), tolerance: 1e-3, forecast: false,
  },
  "underdamped-slug": {
    spec: { id: "underdamped-slug", casingRadius: 0.05, screenLength: 3, lnReRw: 3 }, truth: { K: 200, Le: 8 }, wells: [{ name: "slug", r: 0.1 }], Q: 1,
    times: log(1e-6, 4e-4, 40), tolerance: 1e-4, forecast: false,
  },
  "theis+well-loss": {
    spec: { id: "theis+well-loss", steps: [{ start: 0, rate: 400 }, { start: 0.05, rate: 800 }, { start: 0.1, rate: 1200 }] },
    truth: { T: 150, S: 2e-4, C: 5e-8, n: 2.2 }, wells: [{ name: "PW", r: 0.15 }], Q: 400, times: Array.from({ length: 60 }, (_, i) => 0.0025 * (i + 1)),
    tolerance: 1e-4, forecastSpec: "theis",
  },
  "papadopulos-cooper+well-loss": {
    spec: { id: "papadopulos-cooper+well-loss", casingRadius: 0.15, wellRadius: 0.15, skin: 2, steps: [{ start: 0, rate: 400 }, { start: 0.05, rate: 800 }, { start: 0.1, rate: 1200 }] },
    truth: { T: 150, S: 2e-4, C: 5e-8, n: 2.2 }, wells: [{ name: "PW", r: 0.15 }], Q: 400, times: Array.from({ length: 60 }, (_, i) => 0.0025 * (i + 1)),
    tolerance: 1e-3, forecastSpec: { id: "papadopulos-cooper", casingRadius: 0.15, wellRadius: 0.15, skin: 2 },
  },
};

const placed = (w: Case["wells"][number], Q: number) => `{ r: ${w.r}, Q: ${Q}${w.x === undefined ? "" : `, x: ${w.x}, y: ${w.y}`} }`;

const kernel = createKernel();

function csv(t: readonly number[], s: ArrayLike<number>): string {
  return ["t_d,s_m", ...t.map((ti, i) => `${ti},${s[i]}`)].join("\n");
}

/** A document that fits, draws, forecasts and ranks model `c` on its synthetic data. */
function documentFor(id: string, c: Case): string {
  const model = getModel(c.spec);
  const p = model.parameters.map((d) => c.truth[d.name]!);
  const dataCells = c.wells.map((w, k) => {
    const s = model.drawdown(p, { r: w.r, Q: c.Q, ...(w.x === undefined ? {} : { x: w.x, y: w.y }) }, c.times);
    return `\`\`\`csv data:well${k} name=well${k}\n${csv(c.times, s)}\n\`\`\``;
  });
  const wells = c.wells.map((w, k) => `{ name: ${JSON.stringify(w.name)}, geometry: ${placed(w, c.Q)}, t: well${k}.byColumn.t_d, s: well${k}.byColumn.s_m }`);
  const last = c.times[c.times.length - 1]!;
  const r0 = c.wells[0]!.r;
  return `---
conebook: 1
title: Synthetic ${id} record
seed: 1
limits:
  cellTimeMs: 120000
---

${dataCells.join("\n\n")}

\`\`\`ts code:fit
const spec = ${JSON.stringify(c.spec)};
const wells = [${wells.join(", ")}];
const fit = aq.fitModel({ model: spec, wells${c.start ? `, start: ${JSON.stringify(c.start)}` : ""}, ftol: 1e-14, xtol: 1e-14, gtol: 1e-14 });
show(show.fit(fit));
${c.steady ? "" : `const start = aq.startingValues(spec, { r: ${r0}, Q: ${c.Q} }, wells[0].t, wells[0].s);
show(show.json(start.values.length));
`}const drawn = aq.drawdown(spec, fit.parameters.map((q) => q.estimate), ${placed(c.wells[0]!, c.Q)}, ${last});
show(show.value(drawn[0], "m", "drawdown at the last time"));
${c.forecast === false
    ? `try {
  aq.forecastAt({ fit, points: [{ name: "P", distance: { value: ${r0}, unit: "m" } }], times: { values: [${last}], unit: "d" }, rate: { value: ${c.Q}, unit: "m3/d" }, lengthUnit: "m" });
  show("forecast made");
} catch (e) {
  show(String(e.message));
}`
    : `const forecast = aq.forecastAt({ fit, points: [{ name: "P", distance: { value: ${r0}, unit: "m" } }], times: { values: [${last}], unit: "d" }, rate: { value: ${c.Q}, unit: "m3/d" }, lengthUnit: "m" });
show(show.value(forecast.points[0].drawdown[0], "m", "forecast at the last time"));`}
aq.compareModels([fit]).rows[0].modelId
\`\`\`
`;
}

describe("every drawdown model documented in docs/methods.md, from a document", () => {
  it("lists every registered model in the model table of docs/methods.md", () => {
    expect(documentedIds().sort()).toEqual([...modelIds].sort());
  });

  it.each(documentedIds())("fits, draws, forecasts and ranks %s on its own synthetic data through a document", async (id) => {
    const c = cases[id];
    expect(c, `a synthetic case for ${id}`).toBeDefined();
    const { document, diagnostics } = parseDocument(documentFor(id, c!));
    expect(diagnostics.filter((d) => d.severity === "error")).toEqual([]);
    const run = await kernel.runDocument(document);
    const outputs = run.outputs.fit!;
    const error = outputs.find((o) => o.type === "error");
    expect(error, JSON.stringify(error)).toBeUndefined();
    const table = outputs[0] as Extract<CellOutput, { type: "table" }>;
    expect(table.type).toBe("table");
    const model = getModel(c!.spec);
    for (const d of model.parameters) {
      const row = table.rows.find((r) => String(r[0]).startsWith(`${d.name} (`))!;
      expect(Math.abs((row[1] as number) / c!.truth[d.name]! - 1), `${id}.${d.name}`).toBeLessThan(c!.tolerance);
    }
    const rest = c!.steady ? [outputs[0], undefined, ...outputs.slice(1)] : outputs;
    if (!c!.steady) expect(outputs[1], JSON.stringify(outputs[1])).toEqual({ type: "json", value: model.parameters.length });
    const last = c!.times[c!.times.length - 1]!;
    const first = c!.wells[0]!;
    const at = { r: first.r, Q: c!.Q, ...(first.x === undefined ? {} : { x: first.x, y: first.y }) };
    const expected = model.drawdown(model.parameters.map((d) => c!.truth[d.name]!), at, [last])[0]!;
    const drawn = rest[2] as Extract<CellOutput, { type: "value" }>;
    expect(Math.abs(drawn.value / expected - 1), `${id} drawn`).toBeLessThan(c!.tolerance);
    if (c!.forecast === false) {
      expect(rest[3]).toMatchObject({ type: "text", text: expect.stringMatching(/cannot be superposed over rate changes, wells or boundaries/) });
    } else {
      const base = getModel(c!.forecastSpec ?? c!.spec);
      const forecastExpected = base.drawdown(base.parameters.map((d) => c!.truth[d.name]!), at, [last])[0]!;
      const v = rest[3] as Extract<CellOutput, { type: "value" }>;
      expect(Math.abs(v.value / forecastExpected - 1), `${id} forecast`).toBeLessThan(c!.tolerance);
    }
    expect(rest[4]).toEqual({ type: "text", text: id });
  });
});
