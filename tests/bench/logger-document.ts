/**
 * The logger document of the benchmarks: an invented constant-rate test at the invented Alder Reach site, a
 * pressure-transducer record of depth to water at observation well AR-OB3 every second with ISO 8601 timestamps,
 * and a barometric record at the same times, both written as CSV files beside the document and pinned by SHA-256.
 * The document imports the record, estimates the barometric efficiency from the readings before pumping, corrects
 * the drawdowns, thins them to 20 points per decade, fits Theis and charts the fit: what a user does with a logger.
 *
 * Data (invented, for the benchmark only): Theis drawdown for T = 250 m2/d, S = 2e-4, Q = 900 m3/d at r = 15 m
 * from pumping start (10 % into the record), static depth 6.40 m, a barometric record of 1013 hPa plus a daily
 * swing of 3 hPa and a seeded random walk, barometric efficiency 0.40 (a pressure rise deepens the water by
 * BE times the rise as water column, 1 hPa = 100 / 9806.65 m of water), and 3 mm of seeded Gaussian noise.
 */
import { createHash } from "node:crypto";
import { mkdirSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { theisDrawdown } from "@conebook/aquifer";
import { normalGenerator } from "../support/seeded-noise.js";

/** Values the data were generated with, which the fit must recover. */
export const LOGGER_TRUTH = { T: 250, S: 2e-4, Q: 900, r: 15, staticDepth: 6.4, efficiency: 0.4 } as const;

/** When the record starts (UTC+01:00, the logger's clock) and when pumping starts, as ISO 8601 text. */
const RECORD_START_MS = Date.parse("2026-03-04T06:00:00Z");
const OFFSET = "+01:00";
const M_WATER_PER_HPA = 100 / 9806.65;

function stamp(ms: number): string {
  // Local clock time at UTC+01:00, written with its offset: 2026-03-04T07:00:00+01:00.
  return new Date(ms + 3_600_000).toISOString().slice(0, 19) + OFFSET;
}

/** The document and its two files for a record of `rows` readings at 1 s, written into `folder`. */
export function writeLoggerDocument(folder: string, rows: number): { path: string; pumpingStart: string; readingsBefore: number } {
  mkdirSync(folder, { recursive: true });
  const before = Math.floor(rows / 10);
  const startMs = RECORD_START_MS + before * 1000;
  const noise = normalGenerator(11);
  const walk = normalGenerator(12);
  const level: string[] = ["time,depth_to_water_m"];
  const baro: string[] = ["time,pressure_hpa"];
  let drift = 0;
  let p0 = NaN;
  const { T, S, Q, r, staticDepth, efficiency } = LOGGER_TRUTH;
  for (let i = 0; i < rows; i++) {
    const ms = RECORD_START_MS + i * 1000;
    drift += 0.002 * walk();
    const p = 1013 + 3 * Math.sin((2 * Math.PI * (ms - RECORD_START_MS)) / 86_400_000) + drift;
    if (i === before) p0 = p;
    const tDays = (ms - startMs) / 86_400_000;
    const s = tDays > 0 ? theisDrawdown(T, S, Q, r, tDays) : 0;
    const text = stamp(ms);
    baro.push(`${text},${p.toFixed(2)}`);
    level.push(`${text},${(staticDepth + s + efficiency * M_WATER_PER_HPA * (p - 1013) + 0.003 * noise()).toFixed(4)}`);
  }
  if (!Number.isFinite(p0)) throw new Error("the logger record needs at least one reading after the start of pumping");
  const levelBytes = Buffer.from(level.join("\n") + "\n");
  const baroBytes = Buffer.from(baro.join("\n") + "\n");
  writeFileSync(join(folder, "ar-ob3-logger.csv"), levelBytes);
  writeFileSync(join(folder, "ar-baro.csv"), baroBytes);
  const sha = (b: Buffer) => createHash("sha256").update(b).digest("hex");
  const pumpingStart = stamp(startMs);
  const doc = [
    "---",
    "conebook: 1",
    `title: Alder Reach AR-OB3 logger record (${rows} readings)`,
    "seed: 1",
    "---",
    "",
    "Invented record for the benchmark: depth to water at AR-OB3, 15 m from the pumped well, every second, with the",
    "barometric pressure read beside it.",
    "",
    `\`\`\`csv data:logger name=logger file=ar-ob3-logger.csv sha256=${sha(levelBytes)}`,
    "```",
    "",
    `\`\`\`csv data:baro name=baro file=ar-baro.csv sha256=${sha(baroBytes)}`,
    "```",
    "",
    "```ts code:import",
    "const imported = aq.parseObservationCsv(logger.csv, {",
    `  name: "AR-OB3", timeFormat: "timestamp", pumpingStart: "${pumpingStart}", timeColumn: "time", valueColumn: "depth_to_water_m",`,
    `  timeUnit: "min", kind: "depth-to-water", lengthUnit: "m", staticLevel: ${staticDepth}, beforeStart: "exclude",`,
    `  radius: { value: ${r}, unit: "m" }, pumpingRate: { value: ${Q}, unit: "m3/d" },`,
    "});",
    "// Readings before the start of pumping, and the reading at the start itself, are not in the series.",
    "const first = logger.byColumn.depth_to_water_m.length - imported.series.times.length;",
    'show.value(imported.series.times.length, "1", "readings after the start of pumping")',
    "```",
    "",
    "```ts code:barometric",
    "const pressures = baro.byColumn.pressure_hpa;",
    "const efficiency = aq.estimateBarometricEfficiency({ levels: logger.byColumn.depth_to_water_m.subarray(0, first), levelKind: \"depth-to-water\",",
    '  levelUnit: "m", pressures: pressures.subarray(0, first), pressureUnit: "hPa", method: "levels" });',
    "const corrected = aq.correctBarometric({ levels: imported.series.drawdowns, levelKind: \"drawdown\", levelUnit: \"m\",",
    '  pressures: pressures.subarray(first), pressureUnit: "hPa", efficiency, referencePressure: pressures[first - 1] });',
    "const series = { ...imported.series, drawdowns: corrected.values };",
    'show.value(efficiency.efficiency, "1", "barometric efficiency")',
    "```",
    "",
    "```ts code:fit",
    "const thinned = aq.logResample(series, { pointsPerDecade: 20 });",
    "const base = aq.toBaseUnits(thinned.series);",
    'const fit = aq.fitModel({ model: "theis", wells: [base] });',
    'const curve = aq.drawdown("theis", { T: fit.parameters[0].estimate, S: fit.parameters[1].estimate }, { r: base.r, Q: base.Q }, base.t);',
    'show(charts.logLogDrawdown({ t: base.t, s: base.s, model: { t: base.t, s: curve, label: "Theis" } }));',
    "show.fit(fit);",
    'show.value(thinned.kept, "1", "readings kept")',
    "```",
    "",
  ].join("\n");
  const path = join(folder, "alder-reach-logger.cone.md");
  writeFileSync(path, doc);
  return { path, pumpingStart, readingsBefore: before };
}
