/**
 * Tables with units for the results that have no table of their own in the aquifer library: step tests, slug
 * tests, the Theis recovery line, drawdown forecasts and model comparisons (`show.stepTest`, `show.slugTest`,
 * `show.recovery`, `show.forecast`, `show.comparison`), slug-test data checks, T from specific capacity, horizontal
 * anisotropy, slope hints, match points, the barometric response function and the earth-tide check
 * (`show.slugChecks`, `show.specificCapacity`, `show.anisotropy`, `show.slopeHints`, `show.matchPoint`,
 * `show.barometricResponse`, `show.earthTide`). Each reads the result as aq.* returns it (plain data
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

/** Rows of the parameters of a fit result (aq.fitModel), the unit of each from `units` when given there. */
function fitRows(fit: Record<string, unknown>, units: Record<string, string> = {}): Cell[][] {
  return list(fit.parameters).filter(isRecord).map((p) => {
    const label = `${String(p.name)} (${String(p.label)})${p.fixed === true ? " (fixed)" : ""}`;
    return estimateRow(label, p.estimate, p.standardError, p.ci95, units[String(p.name)] ?? String(p.unit));
  });
}

/** The transient step test of aq.fitStepDrawdown: the fitted parameters with intervals, then the losses per step. */
function transientStepOutputs(result: Record<string, unknown>, options: unknown): CellOutput[] {
  const fit = result.fit as Record<string, unknown>;
  const rows = fitRows(fit, { C: String(result.wellLossUnit) });
  rows.push(["RMSE of the fit", num(fit.rmse), null, null, null, "m"]);
  const coefficients: TableOutput = {
    type: "table",
    title: titleOf(options, `Step test: transient fit of ${String(fit.modelId)} (superposition in time, well loss C Q^n)`),
    columns: ESTIMATE_COLUMNS,
    rows,
  };
  const steps: TableOutput = {
    type: "table",
    title: "Losses at the end of each step",
    columns: [
      { name: "step" }, { name: "rate", unit: "m3/d" }, { name: "end", unit: "d" }, { name: "aquifer loss", unit: "m" },
      { name: "well loss", unit: "m" }, { name: "efficiency", unit: "1" },
    ],
    rows: list(result.steps).filter(isRecord).map((st, i) => [i + 1, num(st.rate), num(st.end), num(st.aquiferLoss), num(st.wellLoss), num(st.efficiency)]),
  };
  return [coefficients, steps, ...texts("warning: ", fit.warnings)];
}

/**
 * A step test (aq.jacobStepTest, aq.rorabaughStepTest, aq.hantushBierschenkStepTest): coefficients, then steps; or
 * the transient fit of aq.fitStepDrawdown: parameters with intervals, then the losses at the end of each step.
 */
export function stepTestOutputs(result: unknown, options: unknown): CellOutput[] {
  if (isRecord(result) && isRecord(result.fit) && typeof result.wellLossUnit === "string") return transientStepOutputs(result, options);
  if (!isRecord(result) || !Array.isArray(result.parameters) || !Array.isArray(result.steps) || typeof result.method !== "string") {
    throw new DisplayError("show.stepTest: pass the result of aq.jacobStepTest, aq.rorabaughStepTest, aq.hantushBierschenkStepTest or aq.fitStepDrawdown");
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

/** The fitted slug models: KGS (aq.fitKgsSlugTest) or underdamped (aq.fitUnderdampedSlugTest). */
function fittedSlugOutputs(result: Record<string, unknown>, options: unknown): CellOutput[] {
  const fit = result.fit as Record<string, unknown>;
  const rows = fitRows(fit);
  let title: string;
  if (typeof result.Kr === "number") {
    title = "Slug test: KGS model (Hyder et al. 1994)";
    rows.push(estimateRow("Kr (horizontal hydraulic conductivity, T / b)", result.Kr, null, result.KrCi95, "m/d"));
  } else {
    title = "Slug test: underdamped (van der Kamp 1976)";
    rows.push(["C_D (damping; below 2 the head oscillates)", num(result.CD), null, null, null, "1"]);
  }
  rows.push(["RMSE of the fit", num(fit.rmse), null, null, null, "1 (H/H0)"]);
  return [{ type: "table", title: titleOf(options, title), columns: ESTIMATE_COLUMNS, rows }, ...texts("warning: ", fit.warnings)];
}

/**
 * A slug test: Hvorslev or Bouwer-Rice K, the Cooper-Bredehoeft-Papadopulos T and S, or the fitted KGS or
 * underdamped model.
 */
export function slugTestOutputs(result: unknown, options: unknown): CellOutput[] {
  if (isRecord(result) && isRecord(result.fit) && (typeof result.Kr === "number" || typeof result.CD === "number")) return fittedSlugOutputs(result, options);
  if (!isRecord(result) || typeof result.method !== "string") {
    throw new DisplayError("show.slugTest: pass the result of aq.hvorslevSlugTest, aq.bouwerRiceSlugTest, aq.cooperBredehoeftPapadopulosFit, aq.fitKgsSlugTest or aq.fitUnderdampedSlugTest");
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

/** The checks of aq.slugRecordChecks, one row each. */
export function slugChecksOutputs(result: unknown, options: unknown): CellOutput[] {
  if (!Array.isArray(result) || !result.every((c) => isRecord(c) && typeof c.kind === "string" && typeof c.message === "string")) {
    throw new DisplayError("show.slugChecks: pass the result of aq.slugRecordChecks");
  }
  const kinds: Record<string, string> = { "initial-displacement": "initial displacement", "first-reading": "first reading", "repeat-agreement": "repeat tests agree" };
  return [{
    type: "table",
    title: titleOf(options, "Slug-test data checks (thresholds: common practice, no source)"),
    columns: [{ name: "test" }, { name: "check" }, { name: "passed" }, { name: "finding" }],
    rows: result.filter(isRecord).map((c) => [String(c.test), kinds[String(c.kind)] ?? String(c.kind), c.ok === true ? "yes" : "no", String(c.message)]),
  }];
}

/** T from specific capacity (aq.transmissivityFromSpecificCapacity) with its limits. */
export function specificCapacityOutputs(result: unknown, options: unknown): CellOutput[] {
  if (!isRecord(result) || typeof result.T !== "number" || typeof result.u !== "number") {
    throw new DisplayError("show.specificCapacity: pass the result of aq.transmissivityFromSpecificCapacity");
  }
  return [{
    type: "table",
    title: titleOf(options, "Transmissivity from specific capacity (Theis solution at the well radius)"),
    columns: [{ name: "quantity" }, { name: "value" }, { name: "unit" }],
    rows: [["T (transmissivity, a lower bound)", num(result.T), "m2/d"], ["u = rw² S / (4 T t) at the well", num(result.u), "1"]],
  }, ...texts("note: ", result.notes)];
}

/** A horizontal-anisotropy fit (aq.fitAnisotropy): principal values and direction, then the wells. */
export function anisotropyOutputs(result: unknown, options: unknown): CellOutput[] {
  if (!isRecord(result) || !isRecord(result.Tmax) || !isRecord(result.Tmin) || !isRecord(result.directionDegrees) || !isRecord(result.fit)) {
    throw new DisplayError("show.anisotropy: pass the result of aq.fitAnisotropy");
  }
  const tmax = result.Tmax;
  const tmin = result.Tmin;
  const ratio = num(tmax.value) !== null && num(tmin.value) !== null ? (tmax.value as number) / (tmin.value as number) : null;
  const principal: TableOutput = {
    type: "table",
    title: titleOf(options, "Horizontal anisotropy: Papadopulos (1965)"),
    columns: ESTIMATE_COLUMNS,
    rows: [
      estimateRow("Tmax (major principal transmissivity)", tmax.value, null, tmax.ci95, "m2/d"),
      estimateRow("Tmin (minor principal transmissivity)", tmin.value, null, tmin.ci95, "m2/d"),
      estimateRow("direction of Tmax (counter-clockwise from x)", result.directionDegrees.value, null, result.directionDegrees.ci95, "degree"),
      ["Tmax / Tmin", ratio, null, null, null, "1"],
      ["S (storativity)", num(result.S), null, null, null, "1"],
      ["RMSE of the fit", num(result.fit.rmse), null, null, null, "m"],
    ],
  };
  const wells: TableOutput = {
    type: "table",
    title: "Observation wells",
    columns: [{ name: "well" }, { name: "x", unit: "m" }, { name: "y", unit: "m" }, { name: "distance", unit: "m" }],
    rows: list(result.wells).filter(isRecord).map((w) => [String(w.name), num(w.x), num(w.y), num(w.x) !== null && num(w.y) !== null ? Math.hypot(w.x as number, w.y as number) : null]),
  };
  return [principal, wells, ...texts("warning: ", result.fit.warnings)];
}

/** Slope hints (aq.slopeHints): one row per run, each a hint rather than a verdict. */
export function slopeHintOutputs(result: unknown, options: unknown): CellOutput[] {
  if (!isRecord(result) || !Array.isArray(result.hints)) throw new DisplayError("show.slopeHints: pass the result of aq.slopeHints");
  const names: Record<string, string> = { "half-slope": "slope 1/2", "quarter-slope": "slope 1/4", "negative-half-slope": "slope -1/2", trough: "trough" };
  const timeUnit = isRecord(options) && typeof options.timeUnit === "string" ? options.timeUnit : "d";
  const table: TableOutput = {
    type: "table",
    title: titleOf(options, "Flow-regime hints from the log derivative (hints, not verdicts)"),
    columns: [{ name: "pattern" }, { name: "from", unit: timeUnit }, { name: "to", unit: timeUnit }, { name: "points" }, { name: "value" }, { name: "reading" }],
    rows: result.hints.filter(isRecord).map((h) => [names[String(h.kind)] ?? String(h.kind), num(h.timeStart), num(h.timeEnd), num(h.pointCount), num(h.value), String(h.message)]),
  };
  return result.hints.length === 0 ? [table, { type: "text", text: "No slope of 1/2, 1/4 or -1/2 and no trough over the span asked for." }] : [table];
}

/** A type-curve match point (aq.theisMatchPoint, aq.hantushJacobMatchPoint, aq.neumanMatchPoint). */
export function matchPointOutputs(result: unknown, options: unknown): CellOutput[] {
  if (!isRecord(result) || typeof result.T !== "number") {
    throw new DisplayError("show.matchPoint: pass the result of aq.theisMatchPoint, aq.hantushJacobMatchPoint or aq.neumanMatchPoint");
  }
  const rows: Cell[][] = [["T (transmissivity)", num(result.T), "m2/d"]];
  if (typeof result.S === "number") rows.push(["S (storativity)", num(result.S), "1"]);
  if (isRecord(result.storage)) rows.push([`${String(result.storage.name)} (${result.storage.name === "Sy" ? "specific yield" : "storativity"})`, num(result.storage.value), "1"]);
  if (typeof result.B === "number") rows.push(["B (leakage factor)", num(result.B), "m"], ["leakance K'/b' = T / B²", num(result.leakance), "1/d"]);
  if (typeof result.KzKr === "number") rows.push(["Kz/Kr (anisotropy)", num(result.KzKr), "1"]);
  if (typeof result.readingError === "number") rows.push(["reading error of the type-curve ordinate", num(result.readingError), "1"]);
  return [{ type: "table", title: titleOf(options, "Type-curve match point"), columns: [{ name: "quantity" }, { name: "value" }, { name: "unit" }], rows }];
}

/** The barometric response function (aq.barometricResponse): per lag, then the summary and the hint. */
export function barometricResponseOutputs(result: unknown, options: unknown): CellOutput[] {
  if (!isRecord(result) || result.method !== "barometric-response-function" || !Array.isArray(result.lags)) {
    throw new DisplayError("show.barometricResponse: pass the result of aq.barometricResponse");
  }
  const timeUnit = String(result.timeUnit);
  const lags: TableOutput = {
    type: "table",
    title: titleOf(options, "Barometric response function (lagged regression, Rasmussen and Crawford 1997)"),
    columns: [
      { name: "lag", unit: timeUnit }, { name: "coefficient", unit: "1" }, { name: "standard error", unit: "1" },
      { name: "response", unit: "1" }, { name: "standard error", unit: "1" }, { name: "95 % low", unit: "1" }, { name: "95 % high", unit: "1" },
    ],
    rows: result.lags.filter(isRecord).map((l) => {
      const ci = list(l.response95);
      return [num(l.lag), num(l.coefficient), num(l.coefficientStandardError), num(l.response), num(l.responseStandardError), num(ci[0]), num(ci[1])];
    }),
  };
  const levelUnit = String(result.levelUnit);
  const summary: TableOutput = {
    type: "table",
    title: "Regression",
    columns: [{ name: "quantity" }, { name: "value" }, { name: "unit" }],
    rows: [
      ["reading interval", num(result.interval), timeUnit],
      ["trend per interval (positive: falling level)", num(result.trendPerInterval), levelUnit],
      ["r²", num(result.rSquared), "1"],
      ["residual standard deviation of the level changes", num(result.residualStandardDeviation), levelUnit],
      ["equations", num(result.n), ""],
      ...list(result.earthTideTerms).filter(isRecord).map((e): Cell[] => [`earth-tide term ${String(e.name)} (amplitude per interval)`, num(e.amplitude), levelUnit]),
    ],
  };
  return [lags, summary, ...(typeof result.hint === "string" ? [{ type: "text" as const, text: result.hint }] : []), ...texts("warning: ", result.warnings)];
}

/** The earth-tide check (aq.earthTideCheck): one row per constituent, then its notes. */
export function earthTideOutputs(result: unknown, options: unknown): CellOutput[] {
  if (!isRecord(result) || result.method !== "earth-tide-check" || !Array.isArray(result.constituents)) {
    throw new DisplayError("show.earthTide: pass the result of aq.earthTideCheck");
  }
  const unit = String(result.valueUnit);
  return [{
    type: "table",
    title: titleOf(options, "Earth-tide check (harmonic regression)"),
    columns: [
      { name: "constituent" }, { name: "period", unit: "h" }, { name: "amplitude", unit }, { name: "standard error", unit },
      { name: "present (> 3 standard errors)" }, { name: "also atmospheric" },
    ],
    rows: result.constituents.filter(isRecord).map((c) => [String(c.name), num(c.periodHours), num(c.amplitude), num(c.amplitudeStandardError), c.present === true ? "yes" : "no", c.atmospheric === true ? "yes" : "no"]),
  }, ...texts("", result.notes)];
}
