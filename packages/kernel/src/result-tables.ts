/**
 * Tables with units for the results that have no table of their own in the aquifer library: step tests, slug
 * tests, the Theis recovery line, drawdown forecasts and model comparisons (`show.stepTest`, `show.slugTest`,
 * `show.recovery`, `show.forecast`, `show.comparison`). Each reads the result as aq.* returns it (plain data
 * after the wire) and gives tables with a unit per column, plus the result's warnings (and for a comparison
 * its caution) as text, so a report never shows a result as raw JSON. Values are shown as the library gives
 * them; nothing is converted here.
 */
import type { CellOutput } from "@conebook/document";
import { DisplayError } from "./display-error.js";


type Cell = number | string | null;
type TableOutput = Extract<CellOutput, { type: "table" }>;

function isRecord(v: unknown): v is Record<string, unknown> {
  return v !== null && typeof v === "object" && !Array.isArray(v) && !(v instanceof Float64Array);
}

function num(v: unknown): number | null {
  return typeof v === "number" && Number.isFinite(v) ? v : null;
}

function list(v: unknown): unknown[] {
  if (Array.isArray(v)) return v;
  if (v instanceof Float64Array) return Array.from(v);
  return [];
}

function texts(prefix: string, v: unknown): CellOutput[] {
  return list(v).filter((w): w is string => typeof w === "string").map((w) => ({ type: "text", text: `${prefix}${w}` }));
}

function titleOf(options: unknown, fallback: string): string {
  return isRecord(options) && typeof options.title === "string" ? options.title : fallback;
}

const ESTIMATE_COLUMNS = [{ name: "quantity" }, { name: "estimate" }, { name: "standard error" }, { name: "95 % low" }, { name: "95 % high" }, { name: "unit" }];

function estimateRow(name: string, estimate: unknown, se: unknown, ci: unknown, unit: string): Cell[] {
  const interval = list(ci);
  return [name, num(estimate), num(se), num(interval[0]), num(interval[1]), unit];
}

const STEP_METHODS: Record<string, string> = {
  "jacob-1947": "Jacob (1947) s_w = B Q + C Q^2",
  "rorabaugh-1953": "Rorabaugh (1953) s_w = B Q + C Q^n",
  "hantush-bierschenk-1964": "Hantush-Bierschenk (1964) s_w = B(dt) Q + C Q^2",
};

/** A step test (aq.jacobStepTest, aq.rorabaughStepTest, aq.hantushBierschenkStepTest): coefficients, then steps. */
export function stepTestOutputs(result: unknown, options: unknown): CellOutput[] {
  if (!isRecord(result) || !Array.isArray(result.parameters) || !Array.isArray(result.steps) || typeof result.method !== "string") {
    throw new DisplayError("show.stepTest: pass the result of aq.jacobStepTest, aq.rorabaughStepTest or aq.hantushBierschenkStepTest");
  }
  const method = STEP_METHODS[result.method] ?? result.method;
  const coefficients: TableOutput = {
    type: "table",
    title: titleOf(options, `Step test: ${method}`),
    columns: ESTIMATE_COLUMNS,
    rows: result.parameters.filter(isRecord).map((p) => estimateRow(`${String(p.name)} (${String(p.label)})`, p.estimate, p.standardError, p.ci95, String(p.unit))),
  };
  const steps: TableOutput = {
    type: "table",
    title: "Step performance",
    columns: [
      { name: "step" }, { name: "rate", unit: "m3/d" }, { name: "drawdown", unit: "m" }, { name: "fitted drawdown", unit: "m" },
      { name: "formation loss", unit: "m" }, { name: "well loss", unit: "m" }, { name: "efficiency", unit: "1" }, { name: "specific capacity", unit: "m2/d" },
    ],
    rows: result.steps.filter(isRecord).map((s) => [num(s.step), num(s.rate), num(s.drawdown), num(s.fittedDrawdown), num(s.formationLoss), num(s.wellLoss), num(s.efficiency), num(s.specificCapacity)]),
  };
  const condition = isRecord(result.wellCondition) && typeof result.wellCondition.message === "string" ? [{ type: "text" as const, text: result.wellCondition.message }] : [];
  return [coefficients, steps, ...condition, ...texts("warning: ", result.warnings)];
}

/** A slug test: Hvorslev or Bouwer-Rice K, or the Cooper-Bredehoeft-Papadopulos T and S. */
export function slugTestOutputs(result: unknown, options: unknown): CellOutput[] {
  if (!isRecord(result) || typeof result.method !== "string") {
    throw new DisplayError("show.slugTest: pass the result of aq.hvorslevSlugTest, aq.bouwerRiceSlugTest or aq.cooperBredehoeftPapadopulosFit");
  }
  let title: string;
  const rows: Cell[][] = [];
  if (result.method === "cooper-bredehoeft-papadopulos-1967") {
    title = "Slug test: Cooper-Bredehoeft-Papadopulos (1967)";
    for (const p of list(result.parameters).filter(isRecord)) {
      const label = p.name === "T" ? "T (transmissivity)" : "S (storativity)";
      rows.push(estimateRow(p.fixed === true ? `${label} (fixed)` : label, p.estimate, p.standardError, p.ci95, String(p.unit)));
    }
    rows.push(["alpha = rw² S / rc²", num(result.alpha), null, null, null, "1"]);
    if (num(result.K) !== null) rows.push(["K = T / b (hydraulic conductivity)", num(result.K), null, null, null, "m/d"]);
    if (num(result.specificStorage) !== null) rows.push(["Ss = S / b (specific storage)", num(result.specificStorage), null, null, null, "1/m"]);
    rows.push(["residual standard error", num(result.residualStandardError), null, null, null, "1 (H/H0)"]);
  } else if (result.method === "hvorslev-1951" || result.method === "bouwer-rice-1976") {
    title = result.method === "hvorslev-1951" ? "Slug test: Hvorslev (1951)" : "Slug test: Bouwer-Rice (1976)";
    rows.push(estimateRow("K (hydraulic conductivity)", result.K, result.standardError, result.ci95, String(result.unit ?? "m/d")));
    const line = isRecord(result.line) ? result.line : {};
    if (num(line.decayRate) !== null) rows.push(estimateRow("decay rate b of ln(H/H0) = a - b t", line.decayRate, line.decayRateStandardError, null, "1/d"));
    if (num(line.basicTimeLag) !== null) rows.push(["basic time lag T0 = 1/b", num(line.basicTimeLag), null, null, null, "d"]);
    if (num(line.rSquared) !== null) rows.push(["r²", num(line.rSquared), null, null, null, "1"]);
    if (num(line.points) !== null) rows.push(["points fitted", num(line.points), null, null, null, ""]);
    if (num(result.lnReRw) !== null) rows.push(["ln(Re/rw)", num(result.lnReRw), null, null, null, "1"]);
  } else {
    throw new DisplayError(`show.slugTest: a result of method ${JSON.stringify(result.method)} is not a slug test`);
  }
  return [{ type: "table", title: titleOf(options, title), columns: ESTIMATE_COLUMNS, rows }, ...texts("warning: ", result.warnings)];
}

/** The Theis (1935) recovery line (aq.theisRecoveryLine). */
export function recoveryOutputs(result: unknown, options: unknown): CellOutput[] {
  if (!isRecord(result) || typeof result.T !== "number" || typeof result.slopePerLogCycle !== "number") {
    throw new DisplayError("show.recovery: pass the result of aq.theisRecoveryLine");
  }
  const rows: Cell[][] = [
    estimateRow("T (transmissivity)", result.T, result.TStandardError, null, "m2/d"),
    ["residual drawdown per log cycle of t/t'", num(result.slopePerLogCycle), null, null, null, "m"],
    ["intercept at t/t' = 1 (ideally 0)", num(result.interceptAtRatioOne), null, null, null, "m"],
    ["points used", list(result.used).length, null, null, null, ""],
    ["points left out", list(result.excluded).length, null, null, null, ""],
  ];
  return [{ type: "table", title: titleOf(options, "Recovery: Theis (1935) residual drawdown line"), columns: ESTIMATE_COLUMNS, rows }, ...texts("warning: ", result.warnings)];
}

/**
 * A drawdown forecast: aq.forecastAt (times and drawdowns in its timeUnit and lengthUnit) or aq.forecastDrawdown
 * (base units: d and m). One row per point and time, with the band when the forecast has one.
 */
export function forecastOutputs(result: unknown, options: unknown): CellOutput[] {
  if (!isRecord(result) || !Array.isArray(result.points) || typeof result.method !== "string") {
    throw new DisplayError("show.forecast: pass the result of aq.forecastAt or aq.forecastDrawdown");
  }
  const timeUnit = typeof result.timeUnit === "string" ? result.timeUnit : "d";
  const lengthUnit = typeof result.lengthUnit === "string" ? result.lengthUnit : "m";
  const banded = result.method !== "none";
  const rows: Cell[][] = [];
  for (const p of result.points.filter(isRecord)) {
    const times = list(p.times ?? p.t);
    const drawdown = list(p.drawdown);
    const sd = list(p.standardDeviation);
    const p05 = list(p.p05);
    const p50 = list(p.p50);
    const p95 = list(p.p95);
    const distance = isRecord(p.distance) ? `${String(p.distance.value)} ${String(p.distance.unit)}` : null;
    times.forEach((t, i) => {
      const row: Cell[] = [String(p.name), ...(distance === null ? [] : [distance]), num(t), num(drawdown[i])];
      if (banded) row.push(num(sd[i]), num(p05[i]), num(p50[i]), num(p95[i]));
      rows.push(row);
    });
  }
  const hasDistance = result.points.some((p) => isRecord(p) && isRecord(p.distance));
  const columns: TableOutput["columns"] = [
    { name: "point" },
    ...(hasDistance ? [{ name: "distance" }] : []),
    { name: "time", unit: timeUnit },
    { name: "drawdown", unit: lengthUnit },
    ...(banded ? [{ name: "standard deviation", unit: lengthUnit }, { name: "5 %", unit: lengthUnit }, { name: "50 %", unit: lengthUnit }, { name: "95 %", unit: lengthUnit }] : []),
  ];
  const how = result.method === "linear" ? "linear propagation" : result.method === "monte-carlo" ? `Monte Carlo, ${String(result.samples)} samples` : "at the estimates, no band";
  const model = typeof result.modelId === "string" ? ` (${result.modelId})` : "";
  return [{ type: "table", title: titleOf(options, `Drawdown forecast${model}: ${how}`), columns, rows }, ...texts("note: ", result.notes)];
}

/** A model comparison (aq.compareModels): the ranking with criteria and weights, its caution and notes. */
export function comparisonOutputs(result: unknown, options: unknown): CellOutput[] {
  if (!isRecord(result) || !Array.isArray(result.rows) || typeof result.caution !== "string") {
    throw new DisplayError("show.comparison: pass the result of aq.compareModels");
  }
  const lengthUnit = typeof result.lengthUnit === "string" ? result.lengthUnit : "m";
  const table: TableOutput = {
    type: "table",
    title: titleOf(options, "Model comparison by AIC (smallest first)"),
    columns: [
      { name: "rank" }, { name: "model" }, { name: "k", unit: "1" }, { name: "n", unit: "1" }, { name: "AIC" }, { name: "ΔAIC" }, { name: "Akaike weight", unit: "1" },
      { name: "BIC" }, { name: "ΔBIC" }, { name: "AICc" }, { name: "ΔAICc" }, { name: "RMSE", unit: lengthUnit }, { name: "converged" },
    ],
    rows: result.rows.filter(isRecord).map((r) => [
      num(r.rank), String(r.name), num(r.k), num(r.n), num(r.aic), num(r.deltaAic), num(r.akaikeWeight),
      num(r.bic), num(r.deltaBic), num(r.aicc), num(r.deltaAicc), num(r.rmse), r.converged === true ? "yes" : "no",
    ]),
  };
  return [table, { type: "text", text: result.caution }, ...texts("note: ", result.notes)];
}
