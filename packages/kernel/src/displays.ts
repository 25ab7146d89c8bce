/**
 * Display records from a cell (each `show.*` or `charts.*` call where it is made, `show(...)`, the last expression) turned into the
 * document's CellOutput values. Input is decoded wire data from the guest and is checked here; a display that
 * cannot be shown throws DisplayError with a message for the user.
 */
import { describeModel, isModelId } from "@conebook/aquifer";
import type { CellOutput } from "@conebook/document";

import { DisplayError } from "./display-error.js";
import { comparisonOutputs, forecastOutputs, recoveryOutputs, slugTestOutputs, stepTestOutputs } from "./result-tables.js";
import {
  anisotropyOutputs,
  barometricResponseOutputs,
  earthTideOutputs,
  matchPointOutputs,
  slopeHintOutputs,
  slugChecksOutputs,
  specificCapacityOutputs,
} from "./result-tables.js";

export { DisplayError };

type Cell = number | string | null;
type TableOutput = Extract<CellOutput, { type: "table" }>;
type ChartOutput = Extract<CellOutput, { type: "chart" }>;

function isRecord(v: unknown): v is Record<string, unknown> {
  return v !== null && typeof v === "object" && !Array.isArray(v) && !(v instanceof Float64Array);
}

function isColumn(v: unknown): v is ArrayLike<unknown> {
  return Array.isArray(v) || v instanceof Float64Array;
}

/** Plain JSON data: Float64Array becomes an array of numbers, non-finite numbers become null. */
export function toJsonData(v: unknown): unknown {
  if (typeof v === "number") return Number.isFinite(v) ? v : null;
  if (v instanceof Float64Array) return Array.from(v, (x) => (Number.isFinite(x) ? x : null));
  if (Array.isArray(v)) return v.map(toJsonData);
  if (isRecord(v)) {
    const out: Record<string, unknown> = {};
    for (const [k, x] of Object.entries(v)) if (x !== undefined) out[k] = toJsonData(x);
    return out;
  }
  return v === undefined ? null : v;
}

function cell(v: unknown): Cell {
  if (typeof v === "number") return Number.isFinite(v) ? v : null;
  if (typeof v === "string") return v;
  if (v === null || v === undefined) return null;
  if (typeof v === "boolean") return String(v);
  return JSON.stringify(toJsonData(v));
}

/** Options of a table display. */
interface TableOptions {
  title?: unknown;
  units?: unknown;
}

/**
 * A table from an array of records, an object of equal-length columns, or `{ columns, rows }`.
 * `options.units` maps column names to unit strings; `options.title` titles the table.
 */
export function tableOutput(data: unknown, options: unknown = {}): TableOutput {
  const opts = (isRecord(options) ? options : {}) as TableOptions;
  const units = isRecord(opts.units) ? opts.units : {};
  let names: string[];
  let rows: Cell[][];
  if (Array.isArray(data)) {
    names = [];
    for (const r of data) {
      if (!isRecord(r)) throw new DisplayError("show.table: an array must hold records (objects such as { t: 1, s: 0.2 }), one per row");
      for (const k of Object.keys(r)) if (!names.includes(k)) names.push(k);
    }
    rows = data.map((r: Record<string, unknown>) => names.map((n) => cell(r[n])));
  } else if (isRecord(data) && Array.isArray(data.columns) && Array.isArray(data.rows)) {
    names = data.columns.map((c: unknown) => (isRecord(c) ? String(c.name) : String(c)));
    rows = data.rows.map((r: unknown) => (Array.isArray(r) ? r.map(cell) : [cell(r)]));
  } else if (isRecord(data) && Object.values(data).every(isColumn) && Object.keys(data).length > 0) {
    names = Object.keys(data);
    const cols = names.map((n) => data[n] as ArrayLike<unknown>);
    const length = cols[0]!.length;
    cols.forEach((c, i) => {
      if (c.length !== length) {
        throw new DisplayError(`show.table: column "${names[i]}" has ${c.length} values but "${names[0]}" has ${length}; give columns of equal length`);
      }
    });
    rows = Array.from({ length }, (_, r) => cols.map((c) => cell(c[r])));
  } else {
    throw new DisplayError("show.table: give an array of records, an object of equal-length columns, or { columns, rows }");
  }
  const columns = names.map((name) => (typeof units[name] === "string" ? { name, unit: units[name] as string } : { name }));
  const out: TableOutput = { type: "table", columns, rows };
  if (typeof opts.title === "string") out.title = opts.title;
  return out;
}

function pick(r: Record<string, unknown>, ...keys: string[]): unknown {
  for (const k of keys) if (r[k] !== undefined) return r[k];
  return undefined;
}

function interval(v: unknown): [Cell, Cell] {
  if (isColumn(v) && v.length === 2) return [cell(v[0]), cell(v[1])];
  if (isRecord(v)) return [cell(pick(v, "lower", "low", "min")), cell(pick(v, "upper", "high", "max"))];
  return [null, null];
}

/** A number, or null when it is not a finite number (a missing statistic). */
function statistic(v: unknown): number | null {
  return typeof v === "number" && Number.isFinite(v) ? v : null;
}

/** The title of a fit table: the model's display name when the result names a registered model. */
function fitTitle(result: Record<string, unknown>): string {
  const id = pick(result, "modelId");
  if (typeof id === "string" && isModelId(id)) return `Fitted parameters: ${describeModel(id).name}`;
  const model = pick(result, "modelName", "model");
  return typeof model === "string" ? `Fitted parameters: ${model}` : "Fitted parameters";
}

/**
 * The parameter table of a fit: one row per parameter with estimate, standard error, 95 % interval (base
 * units, as aq.fitModel returns them) and which interval it is, then one row each for RMSE (m), AIC and BIC when
 * the result has them, the residual checks (Durbin-Watson d and its p-value, lag-1 autocorrelation) and the statement of which
 * intervals are shown. A result with errors gets "NOT RELIABLE" in its title and one row per error first.
 * Reads `result.parameters`: the FitResult shape `[{ name, label?, unit, estimate, standardError, ci95: [low,
 * high] | null, fixed? }]`, or the older spellings `value`, `se`, `interval95`, or a record keyed by name.
 * A fixed parameter is named "NAME (fixed)" and has no standard error or interval. When a parameter ran to a
 * bound, is not identifiable or has a standard error as large as its estimate, a last column "note" says so in
 * words (see parameterNote).
 */
export function fitTableOutput(result: unknown, options: unknown = {}): TableOutput {
  const params = isRecord(result) ? result.parameters : undefined;
  const list: Record<string, unknown>[] = Array.isArray(params)
    ? params.filter(isRecord)
    : isRecord(params)
      ? Object.entries(params).map(([name, p]) => ({ name, ...(isRecord(p) ? p : { estimate: p }) }))
      : [];
  if (list.length === 0) {
    throw new DisplayError("show.fit: the value has no parameters; pass the result of aq.fitModel (an object with a `parameters` list)");
  }
  const modelId = isRecord(result) && typeof result.modelId === "string" && isModelId(result.modelId) ? result.modelId : undefined;
  const notes = list.map((p) => parameterNote(p, modelId));
  const rows: Cell[][] = list.map((p) => {
    const [lo, hi] = interval(pick(p, "ci95", "interval95", "confidenceInterval", "interval"));
    const name = String(cell(pick(p, "name", "id")));
    const label = typeof p.label === "string" && p.label !== "" ? ` (${p.label})` : "";
    return [
      p.fixed === true ? `${name}${label} (fixed)` : `${name}${label}`,
      cell(pick(p, "estimate", "value")),
      cell(pick(p, "standardError", "stdError", "se")),
      lo,
      hi,
      cell(pick(p, "unit") ?? ""),
      typeof p.ci95Method === "string" ? p.ci95Method : null,
    ];
  });
  const r = result as Record<string, unknown>;
  const summary: [string, unknown, string][] = [
    ["RMSE", r.rmse, "m"],
    ["AIC", r.aic, ""],
    ["BIC", r.bic, ""],
  ];
  for (const [name, value, unit] of summary) {
    if (value !== undefined) rows.push([name, statistic(value), null, null, null, unit, null]);
  }
  const diagnostics = isRecord(r.diagnostics) ? r.diagnostics : undefined;
  if (diagnostics && isRecord(diagnostics.durbinWatson)) {
    const dw = diagnostics.durbinWatson;
    rows.push(["Durbin-Watson d", statistic(dw.statistic), null, null, null, "", null]);
    rows.push(["Durbin-Watson p-value", statistic(dw.pValue), null, null, null, "", null]);
    rows.push(["lag-1 autocorrelation", statistic(diagnostics.lag1Autocorrelation), null, null, null, "", diagnostics.independent === false ? "not independent" : null]);
  }
  const uncertainty = isRecord(r.uncertainty) ? r.uncertainty : undefined;
  if (uncertainty && typeof uncertainty.statement === "string") rows.push(["intervals", uncertainty.statement, null, null, null, "", null]);
  const columns = [
    { name: "parameter" },
    { name: "estimate" },
    { name: "standard error" },
    { name: "95 % low" },
    { name: "95 % high" },
    { name: "unit" },
    { name: "interval" },
  ];
  // A note column only when some parameter needs one, so that tables of well-determined fits keep their shape.
  if (notes.some((n) => n !== null)) {
    columns.push({ name: "note" });
    rows.forEach((row, i) => row.push(notes[i] ?? null));
  }
  const errors = Array.isArray(r.errors) ? r.errors.filter((e): e is string => typeof e === "string") : [];
  rows.unshift(...errors.map((e): Cell[] => ["ERROR", e, null, null, null, "", null, ...(columns.length > 7 ? [null] : [])]));
  const opts = isRecord(options) ? options : {};
  const title = typeof opts.title === "string" ? opts.title : fitTitle(r);
  return {
    type: "table",
    title: errors.length > 0 ? `NOT RELIABLE (${errors.length} error${errors.length === 1 ? "" : "s"}): ${title}` : title,
    columns,
    rows,
  };
}

/**
 * A parameter's state in words when the data do not determine it: at a bound of its fitting range (with what
 * that means for the aquifer, from the model's descriptor), without a standard error (not identifiable), or
 * with a standard error as large as the estimate. Null for a well-determined or fixed parameter.
 */
function parameterNote(p: Record<string, unknown>, modelId: string | undefined): string | null {
  if (p.fixed === true) return null;
  const name = String(cell(pick(p, "name", "id")));
  const estimate = pick(p, "estimate", "value");
  const se = pick(p, "standardError", "stdError", "se");
  if (p.atBound === "lower" || p.atBound === "upper") {
    const descriptor = modelId === undefined || !isModelId(modelId) ? undefined : describeModel(modelId).parameters.find((d) => d.name === name);
    const meaning = descriptor?.atBound?.[p.atBound];
    return `at the ${p.atBound} bound of its fitting range: the data do not constrain ${name}${meaning ? `; ${meaning}` : ""}`;
  }
  if (se === null || (typeof se === "number" && !Number.isFinite(se))) {
    return typeof estimate === "number" ? `not identifiable from these data: no standard error` : null;
  }
  if (typeof se === "number" && typeof estimate === "number" && estimate !== 0 && se >= Math.abs(estimate)) {
    return `poorly constrained: the standard error is as large as the estimate`;
  }
  return null;
}

/** A preview table of a series: the first and last `rows` points (default 5) of times and drawdowns. */
export function seriesPreviewOutput(series: unknown, options: unknown = {}): TableOutput {
  if (!isRecord(series) || !isColumn(series.times) || !isColumn(series.drawdowns)) {
    throw new DisplayError("show.series: pass an observation series (an object with times and drawdowns arrays)");
  }
  const times = series.times;
  const drawdowns = series.drawdowns;
  const n = Math.min(times.length, drawdowns.length);
  const opts = isRecord(options) ? options : {};
  const head = typeof opts.rows === "number" && opts.rows >= 1 ? Math.floor(opts.rows) : 5;
  const indices = n <= 2 * head ? [...Array(n).keys()] : [...Array(head).keys(), ...Array.from({ length: head }, (_, i) => n - head + i)];
  const timeUnit = typeof series.timeUnit === "string" ? series.timeUnit : undefined;
  const lengthUnit = typeof series.lengthUnit === "string" ? series.lengthUnit : undefined;
  const name = typeof series.name === "string" ? series.name : "series";
  return {
    type: "table",
    title: n <= 2 * head ? `${name}: ${n} points` : `${name}: ${n} points (first ${head} and last ${head})`,
    columns: [
      { name: "time", ...(timeUnit ? { unit: timeUnit } : {}) },
      { name: "drawdown", ...(lengthUnit ? { unit: lengthUnit } : {}) },
    ],
    rows: indices.map((i) => [cell(times[i]), cell(drawdowns[i])]),
  };
}

/** The first and last column names of a readings table (readingsOutput), by which a report recognises one. */
export const READINGS_COLUMNS = { first: "reading", last: "use" } as const;

/**
 * Every reading of an observation series with whether the analysis used it: the series' points (used unless
 * `options.used[i]` is false, with `options.reason` (one text, or one per point) saying why not) and the
 * readings the import left out (`series.excluded`, with their reasons), in time order. Columns: reading (the
 * file row for excluded readings, else the point's number), time (series time unit), drawdown (series length
 * unit), use ("used" or "left out: REASON"). A report lists these tables in its data appendix.
 */
export function readingsOutput(series: unknown, options: unknown = {}): TableOutput {
  if (!isRecord(series) || !isColumn(series.times) || !isColumn(series.drawdowns)) {
    throw new DisplayError("show.readings: pass an observation series (an object with times and drawdowns arrays), as aq.parseObservationCsv returns in .series");
  }
  const opts = isRecord(options) ? options : {};
  const times = series.times;
  const drawdowns = series.drawdowns;
  const n = Math.min(times.length, drawdowns.length);
  const used = opts.used;
  if (used !== undefined && (!isColumn(used) || used.length !== n)) {
    throw new DisplayError(`show.readings: options.used must hold one true or false per point (${n}), got ${isColumn(used) ? used.length : typeof used}`);
  }
  const reasonOf = (i: number): string => {
    const r = Array.isArray(opts.reason) ? opts.reason[i] : opts.reason;
    return typeof r === "string" && r.trim() !== "" ? r : "left out by the analysis";
  };
  const rows: { t: number; row: Cell[] }[] = [];
  for (let i = 0; i < n; i++) {
    const keep = used === undefined || Boolean((used as ArrayLike<unknown>)[i]);
    rows.push({ t: Number(times[i]), row: [i + 1, cell(times[i]), cell(drawdowns[i]), keep ? "used" : `left out: ${reasonOf(i)}`] });
  }
  const excluded = Array.isArray(series.excluded) ? series.excluded.filter(isRecord) : [];
  for (const e of excluded) {
    rows.push({ t: typeof e.time === "number" && Number.isFinite(e.time) ? e.time : Infinity, row: [`file row ${cell(e.row)}`, cell(e.time), cell(e.value), `left out at import: ${String(e.reason ?? "")}`] });
  }
  rows.sort((a, b) => a.t - b.t);
  const timeUnit = typeof series.timeUnit === "string" ? series.timeUnit : undefined;
  const lengthUnit = typeof series.lengthUnit === "string" ? series.lengthUnit : undefined;
  const name = typeof opts.title === "string" ? opts.title : typeof series.name === "string" ? series.name : "series";
  const leftOut = rows.filter((r) => r.row[3] !== "used").length;
  return {
    type: "table",
    title: `Readings of ${name}: ${rows.length - leftOut} used, ${leftOut} left out`,
    columns: [
      { name: READINGS_COLUMNS.first },
      { name: "time", ...(timeUnit ? { unit: timeUnit } : {}) },
      { name: "drawdown", ...(lengthUnit ? { unit: lengthUnit } : {}) },
      { name: READINGS_COLUMNS.last },
    ],
    rows: rows.map((r) => r.row),
  };
}

/** Name, row count and numeric extent of every inline data set in a Vega-Lite spec (layers included). */
export function chartSummary(spec: Record<string, unknown>): ChartOutput["summary"] {
  const datasets: ChartOutput["summary"]["datasets"] = [];
  const visit = (node: unknown, path: string): void => {
    if (Array.isArray(node)) {
      node.forEach((n, i) => visit(n, `${path}[${i}]`));
      return;
    }
    if (!isRecord(node)) return;
    const data = node.data;
    if (isRecord(data) && Array.isArray(data.values)) {
      const fields = new Map<string, { name: string; min?: number; max?: number }>();
      for (const r of data.values) {
        if (!isRecord(r)) continue;
        for (const [k, v] of Object.entries(r)) {
          const f = fields.get(k) ?? { name: k };
          if (typeof v === "number" && Number.isFinite(v)) {
            f.min = f.min === undefined ? v : Math.min(f.min, v);
            f.max = f.max === undefined ? v : Math.max(f.max, v);
          }
          fields.set(k, f);
        }
      }
      datasets.push({ name: typeof data.name === "string" ? data.name : path || "data", rows: data.values.length, fields: [...fields.values()] });
    }
    for (const key of ["layer", "concat", "hconcat", "vconcat", "spec"]) if (key in node) visit(node[key], path ? `${path}.${key}` : key);
  };
  visit(spec, "");
  return { datasets };
}

/** A chart output: the spec as JSON data and its summary. */
export function chartOutput(spec: unknown): ChartOutput {
  if (!isRecord(spec)) throw new DisplayError("show.chart: pass a Vega-Lite specification (an object)");
  const clean = toJsonData(spec) as Record<string, unknown>;
  return { type: "chart", spec: clean, summary: chartSummary(clean) };
}

/** The value output of `show.value(number, unit?, label?)`. */
function valueOutput(payload: Record<string, unknown>): CellOutput {
  if (typeof payload.value !== "number") throw new DisplayError("show.value: the first argument must be a number");
  const out: CellOutput = { type: "value", value: payload.value };
  if (typeof payload.unit === "string") out.unit = payload.unit;
  if (typeof payload.label === "string") out.label = payload.label;
  return out;
}

/**
 * The output for one display record `{ kind, payload }` from the guest, or undefined when there is nothing
 * to show (an undefined completion value).
 */
export function displayToOutput(display: unknown): CellOutput | undefined {
  return displayToOutputs(display)[0];
}

/** Results shown as several outputs (tables, then warnings as text), by display kind. */
const RESULT_DISPLAYS: Readonly<Record<string, (result: unknown, options: unknown) => CellOutput[]>> = {
  stepTest: stepTestOutputs,
  slugTest: slugTestOutputs,
  recovery: recoveryOutputs,
  forecast: forecastOutputs,
  comparison: comparisonOutputs,
  slugChecks: slugChecksOutputs,
  specificCapacity: specificCapacityOutputs,
  anisotropy: anisotropyOutputs,
  slopeHints: slopeHintOutputs,
  matchPoint: matchPointOutputs,
  barometricResponse: barometricResponseOutputs,
  earthTide: earthTideOutputs,
};

/** Every output of one display record `{ kind, payload }`: none for an undefined completion value. */
export function displayToOutputs(display: unknown): CellOutput[] {
  if (isRecord(display) && typeof display.kind === "string" && Object.hasOwn(RESULT_DISPLAYS, display.kind)) {
    const p = isRecord(display.payload) ? display.payload : {};
    return RESULT_DISPLAYS[display.kind]!(p.result, p.options);
  }
  const out = singleOutput(display);
  if (out === undefined) return [];
  if (isRecord(display) && display.kind === "fit" && isRecord(display.payload) && isRecord(display.payload.result)) {
    const notes = display.payload.result.plausibility;
    if (Array.isArray(notes)) return [out, ...notes.filter((n): n is string => typeof n === "string").map((text) => ({ type: "text" as const, text }))];
  }
  return [out];
}

function singleOutput(display: unknown): CellOutput | undefined {
  if (!isRecord(display) || typeof display.kind !== "string") throw new DisplayError("internal: a display record has no kind");
  const payload = display.payload;
  const p = isRecord(payload) ? payload : {};
  switch (display.kind) {
    case "auto":
      if (payload === undefined) return undefined;
      if (typeof payload === "number") return { type: "value", value: payload };
      if (typeof payload === "string") return { type: "text", text: payload };
      return { type: "json", value: toJsonData(payload) };
    case "value":
      return valueOutput(p);
    case "table":
      return tableOutput(p.data, p.options);
    case "fit":
      return fitTableOutput(p.result, p.options);
    case "series":
      return seriesPreviewOutput(p.series, p.options);
    case "readings":
      return readingsOutput(p.series, p.options);
    case "chart":
      return chartOutput(p.spec);
    case "json":
      return { type: "json", value: toJsonData(p.value) };
    default:
      throw new DisplayError(`internal: unknown display kind ${JSON.stringify(display.kind)}`);
  }
}
