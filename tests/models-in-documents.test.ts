/**
 * Every drawdown model documented in docs/methods.md is usable from a document: the test reads the model table
 * of that page, and for each id builds a document whose data cell holds synthetic drawdowns of that model
 * (computed on the host from known parameters; invented scenario), fits them with aq.fitModel, draws them
 * with aq.drawdown, forecasts with aq.forecastAt and ranks with aq.compareModels, and checks the fitted
 * parameters against the parameters the data were made with. The same table must list every registered id.
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
    const m = /^\| `([a-z-]+)` \|/.exec(row);
    if (!m) break;
    ids.push(m[1]!);
  }
  return ids;
}

interface Case {
  spec: ModelSpec;
  truth: Record<string, number>;
  wells: { name: string; r: number }[];
  Q: number;
  times: number[];
  start?: Record<string, number>;
  /** Steady data have no straight line for aq.startingValues to use: the document does not call it. */
  steady?: true;
  /** Largest relative error accepted for the fitted parameters (noise-free data). */
  tolerance: number;
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
};

const kernel = createKernel();

function csv(t: readonly number[], s: ArrayLike<number>): string {
  return ["t_d,s_m", ...t.map((ti, i) => `${ti},${s[i]}`)].join("\n");
}

/** A document that fits, draws, forecasts and ranks model `c` on its synthetic data. */
function documentFor(id: string, c: Case): string {
  const model = getModel(c.spec);
  const p = model.parameters.map((d) => c.truth[d.name]!);
  const dataCells = c.wells.map((w, k) => {
    const s = model.drawdown(p, { r: w.r, Q: c.Q }, c.times);
    return `\`\`\`csv data:well${k} name=well${k}\n${csv(c.times, s)}\n\`\`\``;
  });
  const wells = c.wells.map((w, k) => `{ name: ${JSON.stringify(w.name)}, geometry: { r: ${w.r}, Q: ${c.Q} }, t: well${k}.byColumn.t_d, s: well${k}.byColumn.s_m }`);
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
`}const drawn = aq.drawdown(spec, fit.parameters.map((q) => q.estimate), { r: ${r0}, Q: ${c.Q} }, ${last});
show(show.value(drawn[0], "m", "drawdown at the last time"));
const forecast = aq.forecastAt({ fit, points: [{ name: "P", distance: { value: ${r0}, unit: "m" } }], times: { values: [${last}], unit: "d" }, rate: { value: ${c.Q}, unit: "m3/d" }, lengthUnit: "m" });
show(show.value(forecast.points[0].drawdown[0], "m", "forecast at the last time"));
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
    if (!c!.steady) expect(outputs[1]).toEqual({ type: "json", value: model.parameters.length });
    const last = c!.times[c!.times.length - 1]!;
    const expected = model.drawdown(model.parameters.map((d) => c!.truth[d.name]!), { r: c!.wells[0]!.r, Q: c!.Q }, [last])[0]!;
    for (const k of [2, 3]) {
      const v = rest[k] as Extract<CellOutput, { type: "value" }>;
      expect(Math.abs(v.value / expected - 1), `${id} output ${k}`).toBeLessThan(c!.tolerance);
    }
    expect(rest[4]).toEqual({ type: "text", text: id });
  });
});
