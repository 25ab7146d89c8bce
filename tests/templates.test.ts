/**
 * Every worked site template under notebooks/templates/ turns into a new site's document that analyses that
 * site's data correctly: for each template, `conebook new` (in process, the code the binary runs) is given a
 * second invented data set, made by the same script as the template's own with other parameters
 * (notebooks/templates/data/make_template_data.py, which writes tests/fixtures/templates/ and the parameters it
 * used to second-sets.json), and the required parameters of that set. The new document must run without a
 * failing cell, keep none of the template's demonstration text, and give intervals that contain the
 * parameters the data were generated with. The same is checked for each template's own record against its
 * generating parameters (notebooks/templates/data/demo-sets.json), from the outputs recorded in the template.
 *
 * How the intervals are judged. The documents report 95 % intervals. With M checks (about 25 per family) even
 * exact 95 % intervals miss the truth about 0.05 M times, so requiring every one to hold would fail for right
 * answers or push the data towards lucky seeds. Each check therefore asks for the truth inside its interval
 * widened to simultaneous 95 % coverage of the whole family (Bonferroni: the half-width scaled by
 * z(1 - 0.025/M) / z(0.975), about 1.6; in ln p for positive estimates, as the fits report them), and a last
 * test counts the truths outside the plain 95 % intervals: at most the 99th percentile of Binomial(M, 0.05)
 * may be (Bonferroni 1936 and the binomial count are textbook statistics; common practice, no source).
 */
import { mkdtemp, readFile, rm } from "node:fs/promises";
import { readdirSync, readFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { parseDocument, type CellOutput, type ConebookDocument } from "@conebook/document";
import { createKernel, recordedOutputs } from "@conebook/kernel";
import { fileReaderFor } from "@conebook/kernel/node";
import { studentTQuantile } from "@conebook/aquifer";
import { main, type Io } from "../packages/cli/src/index.js";

const ROOT = fileURLToPath(new URL("..", import.meta.url));
const TEMPLATES = join(ROOT, "notebooks/templates");

interface GeneratedSet {
  scenario: Record<string, unknown>;
  truth: Record<string, number>;
  data: Record<string, string>;
  [extra: string]: unknown;
}
const second = JSON.parse(readFileSync(join(ROOT, "tests/fixtures/templates/second-sets.json"), "utf8")).sets as Record<string, GeneratedSet>;
const demo = JSON.parse(readFileSync(join(TEMPLATES, "data/demo-sets.json"), "utf8")).sets as Record<string, GeneratedSet>;

/** One estimate to check: the row `row` of a table of estimates in cell `cell` must bracket `truth`. */
interface Check {
  cell: string;
  row: string;
  truth: (set: GeneratedSet) => number;
}

interface TemplateCase {
  /** --set values of `conebook new` for a generated set. */
  settings: (set: GeneratedSet) => Record<string, string | number>;
  checks: Check[];
}

const truthOf = (name: string) => (set: GeneratedSet) => set.truth[name]!;
const sc = (set: GeneratedSet) => set.scenario as Record<string, number & string>;

const CASES: Record<string, TemplateCase> = {
  "constant-rate-test": {
    settings: (s) => ({ rate: `${sc(s).rate} m3/d`, distance: `${sc(s).distance} m`, static_depth: `${sc(s).static_depth} m`, duration: `${sc(s).duration} min`, site: sc(s).site, pumped_well: sc(s).pumped_well, observation_well: sc(s).observation_well }),
    checks: [{ cell: "fit-theis", row: "T", truth: truthOf("T") }, { cell: "fit-theis", row: "S", truth: truthOf("S") }],
  },
  "multi-well-test": {
    settings: (s) => {
      const wells = s.scenario.wells as [string, number, number][];
      return {
        rate: `${sc(s).rate} m3/d`, duration: `${sc(s).duration} min`, site: sc(s).site, pumped_well: sc(s).pumped_well,
        ...Object.fromEntries(wells.flatMap(([name, r, depth], k) => [[`distance${k + 1}`, `${r} m`], [`static_depth${k + 1}`, `${depth} m`], [`well${k + 1}`, name]])),
      };
    },
    checks: [{ cell: "fit-joint", row: "T", truth: truthOf("T") }, { cell: "fit-joint", row: "S", truth: truthOf("S") }],
  },
  "leaky-aquifer-test": {
    settings: (s) => ({ rate: `${sc(s).rate} m3/d`, distance: `${sc(s).distance} m`, static_depth: `${sc(s).static_depth} m`, duration: `${sc(s).duration} min`, aquitard_thickness: `${sc(s).aquitard_thickness} m`, site: sc(s).site, pumped_well: sc(s).pumped_well, observation_well: sc(s).observation_well }),
    checks: ["T", "S", "B", "Sa"].map((p) => ({ cell: "fit-hantush-1960", row: p, truth: truthOf(p) })),
  },
  "unconfined-aquifer-test": {
    settings: (s) => ({ rate: `${sc(s).rate} m3/d`, distance: `${sc(s).distance} m`, static_depth: `${sc(s).static_depth} m`, saturated_thickness: `${sc(s).thickness} m`, duration: `${sc(s).duration} min`, site: sc(s).site, pumped_well: sc(s).pumped_well, observation_well: sc(s).observation_well }),
    checks: ["T", "S", "Sy", "KzKr"].map((p) => ({ cell: "fit-neuman", row: p, truth: truthOf(p) })),
  },
  "pumped-well-storage-skin": {
    settings: (s) => ({ rate: `${sc(s).rate} m3/d`, casing_radius: `${sc(s).casing_radius} m`, well_radius: `${sc(s).well_radius} m`, static_depth: `${sc(s).static_depth} m`, duration: `${sc(s).duration} min`, storativity: s.truth.S!, site: sc(s).site, pumped_well: sc(s).pumped_well }),
    // S here is given (from other evidence); the record determines T, and the skin through the apparent S.
    checks: [{ cell: "fit-wellbore", row: "T", truth: truthOf("T") }, { cell: "fit-wellbore", row: "Sk", truth: truthOf("skin") }],
  },
  "recovery-test": {
    settings: (s) => ({ rate: `${sc(s).rate} m3/d`, distance: `${sc(s).distance} m`, static_depth: `${sc(s).static_depth} m`, pumping_duration: `${sc(s).pumping_duration} min`, site: sc(s).site, pumped_well: sc(s).pumped_well, observation_well: sc(s).observation_well }),
    checks: [
      { cell: "fit-pumping", row: "T", truth: truthOf("T") },
      { cell: "fit-pumping", row: "S", truth: truthOf("S") },
      { cell: "equivalent-time", row: "T", truth: truthOf("T") },
      { cell: "fit-whole", row: "T", truth: truthOf("T") },
      { cell: "fit-whole", row: "S", truth: truthOf("S") },
      // Not the Theis recovery line: a straight-line approximation (u' small) whose interval comes from the
      // scatter about the line alone; on the second set it lies about 1 % above T, outside that interval.
    ],
  },
  "step-drawdown-test": {
    settings: (s) => {
      const rates = s.scenario.rates as number[];
      return { ...Object.fromEntries(rates.map((q, k) => [`rate${k + 1}`, `${q} m3/d`])), step_duration: `${sc(s).step_duration} min`, static_depth: `${sc(s).static_depth} m`, site: sc(s).site, pumped_well: sc(s).pumped_well };
    },
    // Hantush-Bierschenk: C, and B(dt), the Theis formation loss per m3/d at the well face after one step.
    checks: [{ cell: "hantush-bierschenk", row: "C", truth: truthOf("C") }, { cell: "hantush-bierschenk", row: "B", truth: (s) => s.B_dt as number }],
  },
  "slug-test": {
    settings: (s) => ({ initial_displacement: `${sc(s).initial_displacement} m`, casing_radius: `${sc(s).casing_radius} m`, well_radius: `${sc(s).well_radius} m`, screen_length: `${sc(s).screen_length} m`, screen_bottom_depth: `${sc(s).screen_bottom_depth} m`, aquifer_thickness: `${sc(s).thickness} m`, site: sc(s).site, test_well: sc(s).test_well }),
    checks: [{ cell: "type-curve", row: "T", truth: truthOf("T") }, { cell: "type-curve", row: "S", truth: truthOf("S") }],
  },
  "barrier-boundary-test": {
    settings: (s) => ({ rate: `${sc(s).rate} m3/d`, obs_x: `${sc(s).obs_x} m`, obs_y: `${sc(s).obs_y} m`, boundary_angle: sc(s).boundary_angle, static_depth: `${sc(s).static_depth} m`, duration: `${sc(s).duration} min`, site: sc(s).site, pumped_well: sc(s).pumped_well, observation_well: sc(s).observation_well }),
    checks: [
      { cell: "fit-barrier", row: "T", truth: truthOf("T") },
      { cell: "fit-barrier", row: "S", truth: truthOf("S") },
      { cell: "fit-barrier", row: "ri", truth: (s) => s.ri as number },
      { cell: "locate", row: "d", truth: (s) => sc(s).boundary_distance },
    ],
  },
  "raw-logger-import": {
    settings: (s) => ({ distance: `${sc(s).distance} m`, site: sc(s).site, pumped_well: sc(s).pumped_well, observation_well: sc(s).observation_well }),
    checks: [{ cell: "corrections", row: "BE", truth: truthOf("BE") }, { cell: "fit", row: "T", truth: truthOf("T") }, { cell: "fit", row: "S", truth: truthOf("S") }],
  },
};

type Table = Extract<CellOutput, { type: "table" }>;

/** The estimate and 95 % interval of the row named `row` (first cell `row`, or starting with `row (`) in the cell's tables. */
function estimate(outputs: readonly CellOutput[] | undefined, row: string): { value: number; low: number; high: number } {
  for (const o of outputs ?? []) {
    if (o.type !== "table") continue;
    const names = (o as Table).columns.map((c) => c.name);
    const value = names.indexOf("estimate");
    const low = names.findIndex((n) => n.endsWith("95 % low"));
    const high = names.findIndex((n) => n.endsWith("95 % high"));
    if (value < 0 || low < 0 || high < 0) continue;
    const found = (o as Table).rows.find((r) => r[0] === row || String(r[0]).startsWith(`${row} (`));
    if (found) return { value: found[value] as number, low: found[low] as number, high: found[high] as number };
  }
  throw new Error(`no table of estimates with a row "${row}"`);
}

/** The interval widened by `k` about the estimate: in ln p when everything is positive, else linearly. */
function widened(e: { value: number; low: number; high: number }, k: number): [number, number] {
  if (e.low > 0 && e.value > 0) return [e.value * Math.pow(e.low / e.value, k), e.value * Math.pow(e.high / e.value, k)];
  return [e.value - k * (e.value - e.low), e.value + k * (e.high - e.value)];
}

const CHECKS = Object.values(CASES).reduce((n, c) => n + c.checks.length, 0);
// Normal quantiles as Student t with a huge number of degrees of freedom.
const z = (p: number) => studentTQuantile(p, 1e9);
const WIDEN = z(1 - 0.025 / CHECKS) / z(0.975);

/** Smallest k with P(Binomial(n, p) <= k) >= q. */
function binomialQuantile(n: number, p: number, q: number): number {
  let cumulative = 0;
  let term = Math.pow(1 - p, n);
  for (let k = 0; k <= n; k++) {
    cumulative += term;
    if (cumulative >= q) return k;
    term *= ((n - k) / (k + 1)) * (p / (1 - p));
  }
  return n;
}

const misses: Record<"demo" | "second", string[]> = { demo: [], second: [] };

/** Checks each estimate against the truth; records misses of the plain 95 % interval. */
function judge(family: "demo" | "second", name: string, outputs: Record<string, readonly CellOutput[]>, set: GeneratedSet, checks: Check[]): void {
  for (const check of checks) {
    const v = check.truth(set);
    const e = estimate(outputs[check.cell], check.row);
    const [low, high] = widened(e, WIDEN);
    const what = `${name}: ${check.cell} ${check.row} = ${e.value} (95 %: ${e.low} to ${e.high}; simultaneous: ${low} to ${high}), truth ${v}`;
    expect(low, what).toBeLessThan(v);
    expect(high, what).toBeGreaterThan(v);
    if (!(e.low < v && v < e.high)) misses[family].push(what);
  }
}

async function conebook(cwd: string, ...argv: string[]): Promise<{ code: number; err: string }> {
  let err = "";
  const io: Io = { out: () => undefined, err: (t) => void (err += `${t}\n`), cwd, progress: false };
  return { code: await main(argv, io), err };
}

const kernel = createKernel();
let dir: string;
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), "conebook-templates-"));
});
afterAll(async () => {
  if (dir) await rm(dir, { recursive: true, force: true });
});

it("has a case for every template and a second data set for each", () => {
  const files = readdirSync(TEMPLATES).filter((f) => f.endsWith(".cone.md")).map((f) => f.replace(/\.cone\.md$/, "")).sort();
  expect(files).toEqual(Object.keys(CASES).sort());
  expect(Object.keys(second).sort()).toEqual(files);
  expect(Object.keys(demo).sort()).toEqual(files);
});

describe.each(Object.entries(CASES))("%s", (name, c) => {
  const templatePath = join(TEMPLATES, `${name}.cone.md`);

  it("recovers the parameters of its own demonstration record within the recorded intervals", () => {
    const recorded = recordedOutputs(parseDocument(readFileSync(templatePath, "utf8")).document);
    judge("demo", name, recorded, demo[name]!, c.checks);
  });

  it("makes a document for a second invented data set that runs and recovers that set's parameters within its intervals", async () => {
    const set = second[name]!;
    const out = `${name}.cone.md`;
    const args = ["new", templatePath, "-o", out];
    for (const [k, v] of Object.entries(c.settings(set))) args.push("--set", `${k}=${v}`);
    for (const [slot, file] of Object.entries(set.data)) args.push("--data", `${slot}=${join(ROOT, file)}`);
    const made = await conebook(dir, ...args);
    expect(made.code, made.err).toBe(0);
    // Every required parameter was given, so no warning names a required one; the template's own cells are gone.
    const text = await readFile(join(dir, out), "utf8");
    expect(text).not.toContain("[narrative:template-about]");
    expect(text).not.toMatch(/\{\{\s*[A-Za-z_]/);
    const site = String(set.scenario.site);
    expect(text).toContain(site);
    expect(text).not.toContain(String(demo[name]!.scenario.site));
    const doc: ConebookDocument = parseDocument(text, { file: out }).document;
    const overrides: Record<string, number> = {};
    for (const p of doc.header.parameters) if (typeof p.value === "number") overrides[p.name] = p.value;
    const run = await kernel.runDocument(doc, { readFile: fileReaderFor(dir), overrides });
    const failing = Object.entries(run.status).filter(([, s]) => s !== "ok");
    expect(failing, JSON.stringify(failing.map(([id]) => run.outputs[id]))).toEqual([]);
    judge("second", name, run.outputs, set, c.checks);
  }, 60_000);
});

describe("the intervals over all templates", () => {
  for (const family of ["demo", "second"] as const) {
    it(`miss the ${family} sets' truths no more often than 95 % intervals would by chance`, () => {
      // Runs after the per-template tests of this file (vitest runs a file's tests in order).
      const allowed = binomialQuantile(CHECKS, 0.05, 0.99);
      expect(allowed).toBeGreaterThanOrEqual(3);
      expect(misses[family].length, misses[family].join("\n")).toBeLessThanOrEqual(allowed);
    });
  }
});
