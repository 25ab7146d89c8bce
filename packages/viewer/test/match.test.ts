/**
 * Curve matching and data windows, DOM-free, against the kernel in Node: the records the probe finds in the
 * demo, a drag as an exact translation of the curve in log-log for the models whose dimensionless form allows
 * it, the match point computed back by the library, and the cells "Keep" and the data windows write, run as
 * part of the demo, giving the numbers the page shows.
 */
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { describeModel, getModel, modelIds, theisDrawdown, type ModelSpec } from "@conebook/aquifer";
import { parseDocument, type CellOutput, type ConebookDocument } from "@conebook/document";
import { createKernel, recordedRunSettings } from "@conebook/kernel";
import { fileReaderFor } from "@conebook/kernel/node";
import {
  curveAt,
  errorFigures,
  globalName,
  keptMatchSource,
  keptValues,
  matchPointOf,
  parameterRoles,
  refine,
  shiftParameters,
  startingPosition,
  type ModelChoice,
  type ObservationRecord,
} from "../src/model/match.js";
import { PROBE_CELL_ID, readProbe, withProbe } from "../src/model/records.js";
import { emptyWindows, readWindows, windowEnd, windowMask, windowsCell, withWindow } from "../src/model/windows.js";

const NOTEBOOKS = fileURLToPath(new URL("../../../notebooks/", import.meta.url));
const DEMO_TEXT = readFileSync(new URL("kestrel-moor-constant-rate.cone.md", `file://${NOTEBOOKS}`), "utf8");
const demo = parseDocument(DEMO_TEXT).document;
const kernel = createKernel();

async function run(doc: ConebookDocument): Promise<Record<string, CellOutput[]>> {
  const result = await kernel.runDocument(doc, { ...recordedRunSettings(doc), readFile: fileReaderFor(NOTEBOOKS) });
  return result.outputs;
}

let recordsOnce: Promise<ObservationRecord[]> | undefined;
const records = () => (recordsOnce ??= run(withProbe(demo)).then((o) => readProbe(demo, o[PROBE_CELL_ID])));

const valueOf = (outputs: CellOutput[] | undefined, label: string): number => {
  const o = outputs?.find((x) => x.type === "value" && x.label === label);
  if (!o || o.type !== "value") throw new Error(`no value ${label}`);
  return o.value;
};

describe("the records the probe finds", () => {
  it("finds both observation records of the demo with the expression and cell that define them", async () => {
    const found = await records();
    expect(found.map((r) => [r.name, r.expression, r.cellId, r.r, r.Q, r.t.length])).toEqual([
      ["KM-OB1", "records[0]", "load", 28, 1450, 70],
      ["KM-OB2", "records[1]", "load", 85, 1450, 70],
    ]);
    // The first reading of KM-OB1 at 0.5 min (data/kestrel-moor-km-ob1.csv), in d; drawdown 12.592 - 12.43 m.
    expect(found[0]!.t[0]).toBeCloseTo(0.5 / 1440, 15);
    expect(found[0]!.s[0]).toBeCloseTo(0.162, 12);
  });
});

/** The model `id` bound to a plausible geometry: each required option from its descriptor gets a value. */
function withGeometry(id: string): ModelSpec {
  const required = describeModel(id).options.filter((o) => o.required);
  if (required.length === 0) return id;
  const lengths: Record<string, number> = { aquiferThickness: 20, screenTop: 0, screenBottom: 10, saturatedThickness: 10, casingRadius: 0.1, wellRadius: 0.1, screenLength: 5, halfLength: 20, wellDrawdown: 5 };
  const spec: Record<string, unknown> = { id };
  for (const o of required) spec[o.name] = o.kind === "schedule" ? [{ start: 0, rate: 800 }, { start: 0.1, rate: 1600 }] : o.name === "lnReRw" ? 3 : (lengths[o.name] ?? 5);
  // Partial-penetration models also need the observation depth, which is optional only in the descriptor.
  if (describeModel(id).options.some((o) => o.name === "piezometerDepth")) spec.piezometerDepth = 5;
  return spec as ModelSpec;
}

describe("a drag in log time and log drawdown", () => {
  const record = { r: 28, Q: 1450 };
  const t = Float64Array.from({ length: 40 }, (_, k) => 1e-4 * 10 ** (k / 10));
  const cases: [string, ModelChoice, number[]][] = [
    ["theis", { id: "theis", options: {} }, [400, 1e-4]],
    ["hantush-jacob", { id: "hantush-jacob", options: {} }, [400, 1e-4, 2000]],
    ["hantush-aquitard-storage", { id: "hantush-aquitard-storage", options: {} }, [400, 1e-4, 2000, 1e-4]],
    ["neuman", { id: "neuman", options: { saturatedThickness: 12 } }, [400, 1e-3, 0.1, 0.2]],
    ["boulton", { id: "boulton", options: {} }, [400, 1e-4, 0.1, 0.5]],
    ["hantush-partial-penetration", { id: "hantush-partial-penetration", options: { aquiferThickness: 20, screenTop: 0, screenBottom: 10, piezometerDepth: 5 } }, [400, 1e-4, 0.1]],
  ];
  for (const [name, choice, values] of cases) {
    it(`moves the ${name} curve by the drag in both directions without changing its shape`, () => {
      const model = getModel(choice.id === "theis" || choice.id.startsWith("hantush-j") || choice.id === "hantush-aquitard-storage" ? choice.id : { id: choice.id, ...choice.options });
      const dLogT = 0.37;
      const dLogS = -0.21;
      const moved = shiftParameters(model, values, dLogT, dLogS);
      const before = curveAt(model, values, record, t);
      const after = curveAt(model, moved, record, t.map((x) => x * 10 ** dLogT));
      // s_after(t b) = a s_before(t): identity of the dimensionless forms (module comment of match.ts).
      for (let i = 0; i < t.length; i++) expect(after[i]! / (before[i]! * 10 ** dLogS)).toBeCloseTo(1, 6);
    });
  }

  it("classes every registered model's parameters, with the transmissivities the only ones scaled by 1/a", () => {
    for (const id of modelIds) {
      const roles = parameterRoles(getModel(withGeometry(id)));
      // Papadopulos (1965) has two principal transmissivities; scaling both by 1/a keeps sqrt(Tmax Tmin) and their ratio.
      expect(roles.filter((r) => r === "transmissivity").length, id).toBe(id === "papadopulos-anisotropy" ? 2 : 1);
    }
  });
});

describe("the match point of the current position", () => {
  it("gives for Theis the s and t at W(u) = 1, 1/u = 10, and theisMatchPoint gives T and S back", () => {
    const m = matchPointOf({ id: "theis", options: {} }, [412, 1.3e-4], { r: 28, Q: 1450 })!;
    // s = Q / (4 pi T) at W = 1; t = r^2 S / (4 T u) at u = 0.1 (Theis 1935, rearranged).
    expect(m.s).toBeCloseTo(1450 / (4 * Math.PI * 412), 12);
    expect(m.t).toBeCloseTo((28 * 28 * 1.3e-4) / (4 * 412 * 0.1), 15);
    // The drawdown the Theis solution gives at that time: W(0.1) = 1.8229 (E1(0.1), A&S table 5.1, from memory).
    expect(theisDrawdown(412, 1.3e-4, 1450, 28, m.t) / m.s).toBeCloseTo(1.8229, 3);
    expect(m.gives.map((g) => [g.name, Number(g.value.toPrecision(10))])).toEqual([["T", 412], ["S", 1.3e-4]]);
  });

  it("computes the Hantush-Jacob and Neuman readings back to the parameters and has none for other models", () => {
    const h = matchPointOf({ id: "hantush-jacob", options: {} }, [400, 1e-4, 2000], { r: 28, Q: 1450 })!;
    expect(h.gives.map((g) => Number(g.value.toPrecision(8)))).toEqual([400, 1e-4, 2000, 400 / 2000 ** 2]);
    const n = matchPointOf({ id: "neuman", options: { saturatedThickness: 12 } }, [400, 1e-3, 0.1, 0.2], { r: 28, Q: 1450 })!;
    expect(n.gives.map((g) => [g.name, Number(g.value.toPrecision(8))])).toEqual([["T", 400], ["S", 1e-3], ["Kz/Kr", 0.2]]);
    expect(matchPointOf({ id: "thiem", options: {} }, [400, 1000], { r: 28, Q: 1450 })).toBeUndefined();
  });
});

describe("what Keep and the data windows write", () => {
  it("writes a windows cell and a kept match that the demo runs to the figures and the fit the page shows", async () => {
    const [ob1] = await records();
    let set = emptyWindows("min");
    set = withWindow(set, "KM-OB1", { from: windowEnd(set, ob1!.t[0]!), to: windowEnd(set, ob1!.t[4]!), reason: "well-bore storage" });
    set = withWindow(set, "KM-OB1", { from: windowEnd(set, ob1!.t[69]!), to: windowEnd(set, ob1!.t[69]!), reason: "logger reset" });
    const used = windowMask(set, "KM-OB1", ob1!.t);
    expect(used.filter((u) => !u).length).toBe(6);
    expect(used[5]).toBe(true);
    const model = getModel("hantush-jacob");
    const choice: ModelChoice = { id: "hantush-jacob", options: {} };
    const start = startingPosition(model, ob1!).values;
    const values = keptValues(shiftParameters(model, start, 0.05, -0.02));
    const page = errorFigures(ob1!, curveAt(model, values, ob1!, ob1!.t), used);
    const fit = refine(model, ob1!, values, used);

    const loadIndex = demo.cells.findIndex((c) => c.id === "load");
    const windows = windowsCell(set, undefined);
    const kept = (refined: boolean, id: string) => ({
      kind: "code" as const,
      language: "ts" as const,
      id,
      source: keptMatchSource({ choice, record: ob1!, values, refined, windowed: true, name: globalName(id) }),
      sourceStart: { line: 1, column: 1 },
      outputs: [],
    });
    const doc: ConebookDocument = { ...demo, cells: [...demo.cells.slice(0, loadIndex + 1), windows, kept(false, "match-a"), kept(true, "match-b"), ...demo.cells.slice(loadIndex + 1)] };
    expect(readWindows(doc)).toEqual({ set, cell: windows });
    const outputs = await run(doc);
    expect(outputs["data-windows"]![0]).toMatchObject({ type: "table", rows: [["KM-OB1", 0.5, 0.83, "well-bore storage"], ["KM-OB1", 2880, 2880, "logger reset"]] });
    expect(valueOf(outputs["match-a"], "RMSE of the readings used")).toBeCloseTo(page.rmse, 12);
    expect(valueOf(outputs["match-a"], "largest residual")).toBeCloseTo(page.largest!.residual, 12);
    expect(valueOf(outputs["match-a"], "readings used")).toBe(64);
    const table = outputs["match-b"]!.find((o) => o.type === "table");
    expect(table?.type === "table" && table.rows.slice(0, 3).map((r) => r[1])).toEqual(fit.parameters.map((p) => p.estimate));
    expect(fit.n).toBe(64);
  });
});
