/**
 * Writes the invented data sets of the worked examples of the essential methods (notebooks/*.cone.md other than the
 * Kestrel Moor demo). Every site, well, rate, reading and aquifer here is invented. Each record is the stated model
 * of the library (packages/aquifer) at the stated parameters plus seeded Gaussian noise (mulberry32 and Box-Muller,
 * one seed per record), rounded as a logger would export it. The data are for the demonstration only: a fit recovers
 * these parameters by construction, so they check nothing and serve as a reference in no test.
 *
 * Rerun with:  npx tsx notebooks/data/make_method_data.ts
 */
import { writeFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";
import { bouwerRiceLnReRw, getModel, type ModelSpec } from "@conebook/aquifer";

const HERE = dirname(fileURLToPath(import.meta.url));

/** Standard normal deviates from mulberry32 (uniform) by Box-Muller; deterministic for a seed. */
function normal(seed: number): () => number {
  let a = seed >>> 0;
  const uniform = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return () => Math.sqrt(-2 * Math.log(1 - uniform())) * Math.cos(2 * Math.PI * uniform());
}

/** Times from a to b, n per log cycle-ish: n points geometrically spaced, rounded to `digits` decimals. */
function geometric(a: number, b: number, n: number, digits: number): number[] {
  const out = Array.from({ length: n }, (_, i) => Number((a * Math.pow(b / a, i / (n - 1))).toFixed(digits)));
  return [...new Set(out)];
}

function write(name: string, header: string[], rows: (string | number)[][]): void {
  const path = join(HERE, name);
  writeFileSync(path, [header.join(","), ...rows.map((r) => r.join(","))].join("\n") + "\n");
  console.log(`wrote ${path}: ${rows.length} rows`);
}

/** Model values at times (d) for a record. */
function modelAt(spec: ModelSpec, p: Record<string, number>, geometry: { r: number; Q: number }, t: number[]): Float64Array {
  const model = getModel(spec);
  return model.drawdown(model.parameters.map((d) => p[d.name]!), geometry, t);
}

const MIN_PER_D = 1440;
const S_PER_D = 86400;

// ---- Scarrow Flats: water-table aquifer, partially penetrating pumped well (Moench 1997, gradual drainage) --------
{
  const truth = { T: 600, S: 8e-4, Sy: 0.18, alpha: 15 };
  const Q = 1800; // m3/d for 3 d
  const base = { saturatedThickness: 24, screenTop: 10, screenBottom: 22, wellRadius: 0.15, casingRadius: 0.1, anisotropy: 0.15, drainage: "gradual" };
  const minutes = geometric(0.5, 3 * MIN_PER_D, 34, 2);
  const records = [
    { name: "sf-p1", r: 12, depth: 4, staticDepth: 3.62, seed: 101 },
    { name: "sf-p2", r: 12, depth: 16, staticDepth: 3.58, seed: 102 },
    { name: "sf-p3", r: 40, depth: 16, staticDepth: 3.71, seed: 103 },
  ];
  for (const rec of records) {
    const s = modelAt({ id: "moench-water-table", ...base, piezometerDepth: rec.depth }, truth, { r: rec.r, Q }, minutes.map((m) => m / MIN_PER_D));
    const noise = normal(rec.seed);
    write(`scarrow-flats-${rec.name}.csv`, ["elapsed_min", "depth_to_water_m"], minutes.map((m, i) => [m.toFixed(2), (rec.staticDepth + s[i]! + 0.002 * noise()).toFixed(3)]));
  }
}

// ---- Pennock Mill: four-step test of a supply well (Theis with well loss C Q^n) --------------------------------------
{
  const truth = { T: 220, S: 1.5e-4, C: 5e-7, n: 2 };
  const steps = [600, 1000, 1400, 1800].map((rate, i) => ({ start: (i * 100) / MIN_PER_D, rate }));
  const minutes = Array.from({ length: 200 }, (_, i) => 2 * (i + 1));
  const s = modelAt({ id: "theis+well-loss", steps }, truth, { r: 0.1, Q: 600 }, minutes.map((m) => m / MIN_PER_D));
  const noise = normal(201);
  write("pennock-mill-pm-pw.csv", ["elapsed_min", "depth_to_water_m"], minutes.map((m, i) => [m, (21.35 + s[i]! + 0.005 * noise()).toFixed(3)]));
}

// ---- Greywether Levels: slug tests, KGS (overdamped, repeated) and underdamped -----------------------------------------
{
  const truth = { T: 8, S: 5e-5 };
  const spec = { id: "kgs-slug", aquiferThickness: 8, screenTop: 3, screenBottom: 4.5, casingRadius: 0.025, wellRadius: 0.06, anisotropy: 0.5 };
  const seconds = geometric(1, 1800, 40, 1);
  for (const [k, H0, seed] of [[1, 0.48, 301], [2, 0.93, 302]] as const) {
    const h = modelAt(spec, truth, { r: 0.06, Q: 1 }, seconds.map((x) => x / S_PER_D));
    const noise = normal(seed);
    write(`greywether-gw3-test${k}.csv`, ["elapsed_s", "displacement_m"], seconds.map((x, i) => [x.toFixed(1), (H0 * h[i]! + 0.002 * noise()).toFixed(4)]));
  }
  // Screen radius 0.05 m, screen length 2 m, its bottom 6 m below the water table in 20 m of gravel.
  const gravel = { id: "underdamped-slug", casingRadius: 0.025, screenLength: 2, lnReRw: bouwerRiceLnReRw(0.05, 2, 6, 20).lnReRw };
  const quarter = Array.from({ length: 160 }, (_, i) => 0.25 * (i + 1));
  const h = modelAt(gravel, { K: 250, Le: 9 }, { r: 1, Q: 1 }, quarter.map((x) => x / S_PER_D));
  const noise = normal(303);
  write("greywether-gw7.csv", ["elapsed_s", "displacement_m"], quarter.map((x, i) => [x.toFixed(2), (0.61 * h[i]! + 0.002 * noise()).toFixed(4)]));
}

// ---- Ketterby Heath: partially penetrating, finite-diameter well with skin (Dougherty-Babu 1984) ---------------------
{
  const truth = { T: 140, S: 3e-4, Sk: 3 };
  const spec = { id: "dougherty-babu", aquiferThickness: 30, screenTop: 6, screenBottom: 18, wellRadius: 0.125, casingRadius: 0.125, anisotropy: 0.2, skin: "fitted" };
  const Q = 450;
  const minutes = geometric(0.5, MIN_PER_D, 32, 2);
  for (const rec of [{ name: "kh-pw", r: 0.125, staticDepth: 17.04, sd: 0.01, seed: 401 }, { name: "kh-ob1", r: 15, staticDepth: 16.88, sd: 0.003, seed: 402 }]) {
    const s = modelAt(spec, truth, { r: rec.r, Q }, minutes.map((m) => m / MIN_PER_D));
    const noise = normal(rec.seed);
    write(`ketterby-heath-${rec.name}.csv`, ["elapsed_min", "depth_to_water_m"], minutes.map((m, i) => [m.toFixed(2), (rec.staticDepth + s[i]! + rec.sd * noise()).toFixed(3)]));
  }
}

// ---- Tollin Brook: steady dewatering of an unconfined gravel (Dupuit-Thiem) --------------------------------------------
{
  const H = 14;
  const truth = { K: 45, R: 600 };
  const Q = 1100;
  const wells = [{ name: "TB-A", r: 8, seed: 501 }, { name: "TB-B", r: 20, seed: 502 }, { name: "TB-C", r: 45, seed: 503 }, { name: "TB-D", r: 90, seed: 504 }];
  const days = [20, 21, 22, 23, 24];
  const rows: (string | number)[][] = [];
  for (const w of wells) {
    const s = modelAt({ id: "dupuit-thiem", saturatedThickness: H }, truth, { r: w.r, Q }, days);
    const noise = normal(w.seed);
    for (let i = 0; i < days.length; i++) rows.push([w.name, w.r, days[i]!, (H - s[i]! + 0.004 * noise()).toFixed(3)]);
  }
  write("tollin-brook-steady-heads.csv", ["well", "distance_m", "time_d", "head_above_base_m"], rows);
}
