/**
 * Golden tests: every Conebook document under notebooks/ (templates included) parses without problems, writes
 * back byte for byte, has a header that satisfies the header schema, runs headless through the kernel, and
 * reproduces the outputs recorded in it (compareOutputs, relative tolerance DEFAULT_RTOL = 1e-9). Templates run
 * with their header parameters as overrides, as `conebook run` does.
 *
 * The worked analysis is also checked against the library called directly (the fit the lead's
 * packages/aquifer/demo/fit-demo.ts prints) and against the values its data were generated with
 * (notebooks/data/make_demo_data.py: T = 380 m2/d, S = 3.5e-4, B = 900 m, scipy quadrature of the
 * Hantush-Jacob integral, 3 mm of seeded noise).
 */
import { readdirSync, readFileSync } from "node:fs";
import { dirname, join, relative } from "node:path";
import { fileURLToPath } from "node:url";
import { parse as parseYaml } from "yaml";
import { describe, expect, it } from "vitest";
import { fitModel, getModel, parseObservationCsv, toBaseUnits } from "@conebook/aquifer";
import { headerSchema, parseDocument, serializeDocument, validateJsonSchema, type CellOutput, type ConebookDocument } from "@conebook/document";
import { compareOutputs, createKernel, recordedOutputs, type RunResult } from "@conebook/kernel";
import { fileReaderFor } from "@conebook/kernel/node";
import aquiferPackage from "../packages/aquifer/package.json" with { type: "json" };

/**
 * K0(x) for 0 < x <= 2 from its ascending series (Abramowitz and Stegun 9.6.13):
 * K0(x) = -(ln(x/2) + gamma) I0(x) + sum_{k>=1} (x^2/4)^k / (k!)^2 H_k, H_k the harmonic numbers.
 * Terms fall below 1e-17 of the sum within 15 terms for x <= 2.
 */
function besselK0(x: number): number {
  const EULER_GAMMA = 0.5772156649015329;
  const q = (x * x) / 4;
  let term = 1;
  let i0 = 1;
  let sum = 0;
  let harmonic = 0;
  for (let k = 1; k <= 30; k++) {
    term *= q / (k * k);
    harmonic += 1 / k;
    i0 += term;
    sum += term * harmonic;
  }
  return -(Math.log(x / 2) + EULER_GAMMA) * i0 + sum;
}

const ROOT = fileURLToPath(new URL("..", import.meta.url));
const NOTEBOOKS = join(ROOT, "notebooks");

function documentsUnder(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const path = join(dir, e.name);
    if (e.isDirectory()) return documentsUnder(path);
    return e.name.endsWith(".cone.md") ? [path] : [];
  });
}

/** The YAML between the opening and closing `---` lines, as plain data. */
function rawHeader(text: string): unknown {
  const lines = text.split(/\r\n|\n|\r/);
  const close = lines.findIndex((l, i) => i > 0 && /^(---|\.\.\.)[ \t]*$/.test(l));
  return parseYaml(lines.slice(1, close).join("\n")) ?? {};
}

const kernel = createKernel();
const files = documentsUnder(NOTEBOOKS);
const runs = new Map<string, Promise<{ doc: ConebookDocument; run: RunResult }>>();

/** Parses and runs a document once per test file (the run is shared by the tests that read it). */
function runOf(path: string): Promise<{ doc: ConebookDocument; run: RunResult }> {
  let run = runs.get(path);
  if (!run) {
    run = (async () => {
      const { document } = parseDocument(readFileSync(path, "utf8"), { file: path });
      const overrides: Record<string, number> = {};
      for (const p of document.header.parameters) if (typeof p.value === "number") overrides[p.name] = p.value;
      return { doc: document, run: await kernel.runDocument(document, { readFile: fileReaderFor(dirname(path)), overrides }) };
    })();
    runs.set(path, run);
  }
  return run;
}

it("finds the worked analysis and the constant-rate template among the notebooks", () => {
  const names = files.map((f) => relative(NOTEBOOKS, f).split("\\").join("/"));
  expect(names).toContain("kestrel-moor-constant-rate.cone.md");
  expect(names).toContain("templates/constant-rate-test.cone.md");
});

describe.each(files.map((f) => [relative(ROOT, f), f] as const))("%s", (_name, path) => {
  const text = readFileSync(path, "utf8");

  it("parses without errors or warnings and writes back byte for byte", () => {
    const { document, diagnostics } = parseDocument(text, { file: path });
    expect(diagnostics).toEqual([]);
    expect(serializeDocument(document)).toBe(text);
  });

  it("has a header that satisfies the header schema and names the library version it was recorded with", () => {
    expect(validateJsonSchema(headerSchema, rawHeader(text))).toEqual([]);
    expect(parseDocument(text).document.header.libraryVersion).toBe(aquiferPackage.version);
  });

  it("runs headless without a failing cell and reproduces its recorded outputs", async () => {
    const { doc, run } = await runOf(path);
    const failing = Object.entries(run.status).filter(([, s]) => s !== "ok");
    expect(failing, JSON.stringify(failing.map(([id]) => run.outputs[id]))).toEqual([]);
    const recorded = recordedOutputs(doc);
    // Every cell that produced something has a recorded outputs block (the file is the record of its run).
    for (const [id, outputs] of Object.entries(run.outputs)) if (outputs.length > 0) expect(recorded[id], `cell ${id}`).not.toEqual([]);
    expect(compareOutputs(recorded, run.outputs)).toEqual([]);
    expect(run.unusedOverrides).toEqual([]);
  });
});

describe("the Kestrel Moor worked analysis", () => {
  const path = join(NOTEBOOKS, "kestrel-moor-constant-rate.cone.md");

  function table(outputs: CellOutput[] | undefined, index = 0): Extract<CellOutput, { type: "table" }> {
    const tables = (outputs ?? []).filter((o): o is Extract<CellOutput, { type: "table" }> => o.type === "table");
    const t = tables[index];
    if (!t) throw new Error(`expected a table output at index ${index}`);
    return t;
  }

  it("has at least 15 cells, 4 charts, a control and a caution", async () => {
    const { doc, run } = await runOf(path);
    expect(doc.cells.length).toBeGreaterThanOrEqual(15);
    const charts = Object.values(run.outputs).flat().filter((o) => o.type === "chart");
    expect(charts.length).toBeGreaterThanOrEqual(4);
    expect(run.controlsUsed.map((c) => c.output.name)).toEqual(["proposed_rate", "forecast_days", "farm_well_distance"]);
    const caution = doc.cells.find((c) => c.id === "caution")?.source.replace(/\s+/g, " ");
    expect(caution).toContain("qualified professionals");
    expect(caution).toContain("local regulations and licensed practice govern");
    expect(caution).toContain("extrapolates");
  });

  it("reports the same fits as the library called directly on the same files", async () => {
    const { run } = await runOf(path);
    const wells = [
      { file: "kestrel-moor-km-ob1.csv", name: "KM-OB1", radius: 28, staticDepth: 12.43 },
      { file: "kestrel-moor-km-ob2.csv", name: "KM-OB2", radius: 85, staticDepth: 13.07 },
    ].map((w) => {
      const { series } = parseObservationCsv(readFileSync(join(NOTEBOOKS, "data", w.file), "utf8"), {
        name: w.name,
        timeColumn: "elapsed_min",
        valueColumn: "depth_to_water_m",
        timeUnit: "min",
        kind: "depth-to-water",
        lengthUnit: "m",
        staticLevel: w.staticDepth,
        radius: { value: w.radius, unit: "m" },
        pumpingRate: { value: 1450, unit: "m3/d" },
      });
      const b = toBaseUnits(series);
      return { name: b.name, geometry: { r: b.r, Q: b.Q! }, t: b.t, s: b.s };
    });
    for (const [cell, id] of [["fit-theis", "theis"], ["fit-leaky", "hantush-jacob"]] as const) {
      const direct = fitModel({ model: getModel(id), wells });
      const rows = table(run.outputs[cell]).rows;
      direct.parameters.forEach((p, i) => {
        expect(rows[i]!.slice(1, 5)).toEqual([p.estimate, p.standardError, p.ci95![0], p.ci95![1]]);
      });
      const named = (name: string) => rows.find((r) => r[0] === name)?.[1];
      expect([named("RMSE"), named("AIC"), named("BIC")]).toEqual([direct.rmse, direct.aic, direct.bic]);
      expect(named("intervals")).toBe(direct.uncertainty.statement);
    }
  });

  it("recovers the values the demo data were generated with inside its 95 % intervals", async () => {
    const { run } = await runOf(path);
    const rows = table(run.outputs.result).rows;
    // make_demo_data.py: T = 380 m2/d, S = 3.5e-4, B = 900 m; leakance T / B^2 = 380 / 900^2 1/d.
    const truth = [380, 3.5e-4, 900, 380 / 900 ** 2];
    truth.forEach((v, i) => {
      const [, , low, high] = rows[i]! as [string, number, number, number];
      expect(low).toBeLessThan(v);
      expect(high).toBeGreaterThan(v);
    });
  });

  it("forecasts the steady leaky drawdown Q / (2 pi T) K0(r / B) at the farm well after 30 days", async () => {
    const { run } = await runOf(path);
    const leaky = table(run.outputs["fit-leaky"]).rows;
    const T = leaky[0]![1] as number;
    const S = leaky[1]![1] as number;
    const B = leaky[2]![1] as number;
    const forecast = table(run.outputs.forecast).rows[0]![1] as number;
    // Hantush and Jacob (1955): s = Q / (4 pi T) W(u, r/B), W(u, b) = integral from u to infinity of
    // exp(-y - b^2 / (4y)) / y dy, and the integral from 0 is 2 K0(b). The part from 0 to u is below
    // exp(-b^2 / (4u)) times a modest factor; at 30 d, b^2 / (4u) = T t / (S B^2) is about 40, so the forecast
    // equals the steady value to double precision. (mpmath.besselk with these T and B, run with /usr/bin/python3,
    // gives 0.6207556537864378 m.)
    const t = 30;
    expect((T * t) / (S * B * B)).toBeGreaterThan(35);
    const steady = (1450 / (2 * Math.PI * T)) * besselK0(400 / B);
    expect(Math.abs(forecast - steady) / steady).toBeLessThan(1e-9);
  });
});
