/**
 * Matching a model curve to an observation record by hand, DOM-free: the curve of any registered drawdown model
 * for the current parameter values (computed by the aquifer library in the page, not by a document run, so a
 * drag redraws within a frame), what a drag in log time and log drawdown does to the parameters, the error
 * figures, the equivalent match point of the current position, the least-squares refinement from the matched
 * values, and the code cell "Keep" writes into the document.
 *
 * Units are the library's base units throughout: t in d, s and r in m, Q in m3/d, T in m2/d.
 */
import {
  bourdetDerivative,
  describeModel,
  fitModel,
  getModel,
  hantushJacobMatchPoint,
  hantushW,
  neumanDimensionless,
  neumanMatchPoint,
  startingValues,
  theisMatchPoint,
  type DrawdownModel,
  type FitResult,
  type ModelSpec,
} from "@conebook/aquifer";

/** An observation record as a document holds it (the result of `aq.toBaseUnits`), and how the document names it. */
export interface ObservationRecord {
  /** The record's name (the well), e.g. "KM-OB1". */
  name: string;
  /** The expression a cell uses for it, e.g. `records[0]`. */
  expression: string;
  /** Id of the code cell that defines the global the expression starts with. */
  cellId: string;
  /** Distance (m) and rate (m3/d). */
  r: number;
  Q: number;
  /** Times (d) and drawdowns (m). */
  t: Float64Array;
  s: Float64Array;
}

/** How a drag moves a parameter: by 1/a (transmissivity), by b/a (storage), by 1/b (rate), or not at all. */
export type ParameterRole = "transmissivity" | "storage" | "rate" | "shape";

/**
 * The role of each parameter of `model` in a drag. A drag that multiplies drawdown by a and time by b maps
 * s(t) to a s(t / b); for every model whose dimensionless drawdown depends on T and S only through
 * Q / (4 pi T) and T t / (r^2 S) (with other dimensionless groups such as r/B, S/Sy, Sa/S and Kz/Kr held),
 * that is T -> T / a and each storage parameter -> S b / a; a rate constant (1/d, Boulton's alpha, a block
 * exchange rate) keeps its product with time, -> alpha / b. Transmissivity is the parameter in m2/d (both
 * principal values of an anisotropic aquifer); a hydraulic conductivity in m/d stands in for it where a model
 * has no T (Dupuit-Thiem, where the drag is exact only while drawdown is small against the saturated
 * thickness). Storage parameters are the dimensionless ones labelled storativity, specific yield or storage.
 */
export function parameterRoles(model: DrawdownModel): ParameterRole[] {
  return model.parameters.map((p) =>
    p.unit === "m2/d" || p.unit === "m/d"
      ? "transmissivity"
      : p.unit === "1" && /storativ|yield|storage/i.test(p.label)
        ? "storage"
        : p.unit === "1/d"
          ? "rate"
          : "shape",
  );
}

/**
 * The parameters after a drag of `dLogT` decades in time and `dLogS` decades in drawdown (positive: later,
 * larger). Values are in descriptor order, base units; the result stays inside each parameter's bounds.
 */
export function shiftParameters(model: DrawdownModel, values: ArrayLike<number>, dLogT: number, dLogS: number): Float64Array {
  const a = 10 ** dLogS;
  const b = 10 ** dLogT;
  const roles = parameterRoles(model);
  return Float64Array.from(values, (v, i) => {
    const [lo, hi] = model.parameters[i]!.bounds;
    const next = roles[i] === "transmissivity" ? v / a : roles[i] === "storage" ? (v * b) / a : roles[i] === "rate" ? v / b : v;
    return Math.min(hi, Math.max(lo, next));
  });
}

/** Drawdown (m) of `model` at times `t` (d) for `values` (descriptor order). NaN where the model gives none. */
export function curveAt(model: DrawdownModel, values: ArrayLike<number>, record: Pick<ObservationRecord, "r" | "Q">, t: ArrayLike<number>): Float64Array {
  try {
    return model.drawdown(values, { r: record.r, Q: record.Q }, t);
  } catch {
    return new Float64Array(t.length).fill(Number.NaN);
  }
}

/** `n` times spaced evenly in log t from `t0` to `t1` (d). */
export function logTimes(t0: number, t1: number, n: number): Float64Array {
  return Float64Array.from({ length: n }, (_, k) => t0 * (t1 / t0) ** (k / (n - 1)));
}

/** The error figures of a curve against the readings used. */
export interface ErrorFigures {
  /** Root mean square of observed minus model drawdown over the readings used, m. */
  rmse: number;
  /** The residual (observed minus model, m) largest in size, and the time (d) of its reading. */
  largest: { residual: number; t: number } | undefined;
  used: number;
  total: number;
  /** Observed minus model at every reading, m (NaN where the model gives none). */
  residuals: Float64Array;
}

/** RMSE and the largest residual of `modelAtReadings` against the record, over the readings `used` keeps. */
export function errorFigures(record: ObservationRecord, modelAtReadings: ArrayLike<number>, used?: readonly boolean[]): ErrorFigures {
  const residuals = Float64Array.from(record.s, (s, i) => s - modelAtReadings[i]!);
  let sum = 0;
  let n = 0;
  let largest: ErrorFigures["largest"];
  residuals.forEach((r, i) => {
    if (used && !used[i]) return;
    n++;
    sum += r * r;
    if (largest === undefined || !(Math.abs(r) <= Math.abs(largest.residual))) largest = { residual: r, t: record.t[i]! };
  });
  return { rmse: n > 0 ? Math.sqrt(sum / n) : Number.NaN, largest, used: n, total: record.t.length, residuals };
}

/** A model chosen in the panel: its id and the geometry options it is bound to (base units). */
export interface ModelChoice {
  id: string;
  options: Record<string, number>;
}

/** The spec of a choice for `getModel`: the id alone, or the id with its options. */
export function specOf(choice: ModelChoice): ModelSpec {
  return Object.keys(choice.options).length === 0 ? choice.id : { id: choice.id, ...choice.options };
}

/** The model of a choice, or the reason it cannot be made (a missing geometry option, say). */
export function modelOf(choice: ModelChoice): { model: DrawdownModel } | { problem: string } {
  try {
    return { model: getModel(specOf(choice)) };
  } catch (e) {
    return { problem: (e as Error).message };
  }
}

/**
 * Where to start: the library's starting values for the model on this record (Cooper-Jacob line or a coarse
 * type-curve search), or the middle of each parameter's bounds (geometric mean) when it has no rule.
 */
export function startingPosition(model: DrawdownModel, record: ObservationRecord): { values: Float64Array; notes: string[] } {
  try {
    const positive = record.s.some((s) => s > 0);
    if (!positive) throw new Error("no positive drawdown");
    const start = startingValues(model, { r: record.r, Q: record.Q }, record.t, record.s);
    if (Array.from(start.values).every(Number.isFinite)) return { values: Float64Array.from(start.values), notes: start.notes };
  } catch {
    // Falls back to the bounds below.
  }
  return {
    values: Float64Array.from(model.parameters, (p) => (p.bounds[0] > 0 ? Math.sqrt(p.bounds[0] * p.bounds[1]) : (p.bounds[0] + p.bounds[1]) / 2)),
    notes: ["no starting-value rule applies: every parameter starts at the middle of its bounds"],
  };
}

/** The equivalent match point of the current position, for readers of older reports, with what it gives. */
export interface MatchPointReading {
  /** The type-curve reading, in words (e.g. "W(u) = 1 and 1/u = 10"). */
  reading: string;
  /** The data-axis point: drawdown (m) and time (d). */
  s: number;
  t: number;
  /** What the library's match-point function gives from the reading, by parameter name (base units). */
  gives: { name: string; value: number; unit: string }[];
  /** The library function used. */
  method: string;
}

/**
 * The match point of the current position: for Theis and Cooper-Jacob W(u) = 1 at 1/u = 10; for Hantush-Jacob
 * the point 1/u = 10 on the curve of the current r/B; for Neuman the type-A point t_s = 10 on the curve of the
 * current beta and sigma. The data-axis s and t follow from the current parameters; T, S (and B, Kz/Kr) are then
 * computed back from the reading by the library's match-point functions (theisMatchPoint, hantushJacobMatchPoint,
 * neumanMatchPoint), as a hand match on a type-curve sheet would give them. Undefined for other models.
 */
export function matchPointOf(choice: ModelChoice, values: ArrayLike<number>, record: Pick<ObservationRecord, "r" | "Q">): MatchPointReading | undefined {
  const { r, Q } = record;
  const T = values[0]!;
  const S = values[1]!;
  try {
    if (choice.id === "theis" || choice.id === "cooper-jacob") {
      const W = 1;
      const u = 0.1;
      const s = (Q * W) / (4 * Math.PI * T);
      const t = (r * r * S) / (4 * T * u);
      const m = theisMatchPoint({ Q, r, W, u, s, t });
      return { reading: "W(u) = 1 and 1/u = 10", s, t, method: "theisMatchPoint", gives: [{ name: "T", value: m.T, unit: "m2/d" }, { name: "S", value: m.S, unit: "1" }] };
    }
    if (choice.id === "hantush-jacob") {
      const B = values[2]!;
      const rB = r / B;
      const u = 0.1;
      const W = hantushW(u, rB);
      const s = (Q * W) / (4 * Math.PI * T);
      const t = (r * r * S) / (4 * T * u);
      const m = hantushJacobMatchPoint({ Q, r, W, u, rB, s, t });
      return {
        reading: `1/u = 10 on the curve r/B = ${rB.toPrecision(3)}, where W(u, r/B) = ${W.toPrecision(4)}`,
        s,
        t,
        method: "hantushJacobMatchPoint",
        gives: [
          { name: "T", value: m.T, unit: "m2/d" },
          { name: "S", value: m.S, unit: "1" },
          { name: "B", value: m.B, unit: "m" },
          { name: "K'/b'", value: m.leakance, unit: "1/d" },
        ],
      };
    }
    if (choice.id === "neuman") {
      const b = choice.options.saturatedThickness!;
      const Sy = values[2]!;
      const KzKr = values[3]!;
      const sigma = S / Sy;
      const beta = (KzKr * r * r) / (b * b);
      const ts = 10;
      const sD = neumanDimensionless(ts, sigma, beta);
      const s = (Q * sD) / (4 * Math.PI * T);
      const t = (ts * S * r * r) / T;
      const m = neumanMatchPoint({ Q, r, b, branch: "A", sD, tDimensionless: ts, beta, sigma, s, t });
      return {
        reading: `t_s = 10 on the type-A curve beta = ${beta.toPrecision(3)}, sigma = ${sigma.toPrecision(3)}, where s_D = ${sD.toPrecision(4)}`,
        s,
        t,
        method: "neumanMatchPoint",
        gives: [
          { name: "T", value: m.T, unit: "m2/d" },
          { name: m.storage.name, value: m.storage.value, unit: "1" },
          { name: "Kz/Kr", value: m.KzKr, unit: "1" },
        ],
      };
    }
  } catch {
    return undefined;
  }
  return undefined;
}

/** Rounds to `digits` significant digits (a hand match is not more precise than that). */
export function roundTo(value: number, digits = 4): number {
  return value === 0 || !Number.isFinite(value) ? value : Number(value.toPrecision(digits));
}

/** The values a kept match writes (and a refinement starts from): the current ones at 4 significant digits. */
export function keptValues(values: ArrayLike<number>): Float64Array {
  return Float64Array.from(values, (v) => roundTo(v));
}

/**
 * The least-squares fit (aq.fitModel's host function, the one a kept cell calls through the bridge) of the
 * model to the readings `used` keeps, from `start` (descriptor order).
 */
export function refine(model: DrawdownModel, record: ObservationRecord, start: ArrayLike<number>, used?: readonly boolean[]): FitResult {
  const startByName = Object.fromEntries(model.parameters.map((p, i) => [p.name, start[i]!]));
  return fitModel({
    model,
    wells: [{ name: record.name, geometry: { r: record.r, Q: record.Q }, t: record.t, s: record.s, ...(used ? { mask: used } : {}) }],
    start: startByName,
  });
}

/** The log derivative ds/d ln t (m) of the readings `used` keeps (Bourdet, smoothing 0.2 log cycles), at their times (d). */
export function dataDerivative(record: ObservationRecord, used?: readonly boolean[]): { t: Float64Array; ds: Float64Array } {
  const keep = Array.from(record.t.keys()).filter((i) => !used || used[i]);
  if (keep.length < 3) return { t: new Float64Array(0), ds: new Float64Array(0) };
  try {
    const d = bourdetDerivative(keep.map((i) => record.t[i]!), keep.map((i) => record.s[i]!), { smoothingLog10: 0.2 });
    return { t: d.times, ds: d.derivative };
  } catch {
    return { t: new Float64Array(0), ds: new Float64Array(0) };
  }
}

/** ds/d ln t (m) of a curve given at log-spaced times, by central differences in ln t (one-sided at the ends). */
export function curveDerivative(t: ArrayLike<number>, s: ArrayLike<number>): Float64Array {
  const n = t.length;
  return Float64Array.from({ length: n }, (_, i) => {
    const a = Math.max(0, i - 1);
    const b = Math.min(n - 1, i + 1);
    return (s[b]! - s[a]!) / (Math.log(t[b]!) - Math.log(t[a]!));
  });
}

/** A name usable as a global in cells: lower camel case of the words of `text`, e.g. "match KM-OB1 theis" -> "matchKmOb1Theis". */
export function globalName(text: string): string {
  const words = text.split(/[^A-Za-z0-9]+/).filter(Boolean);
  const name = words.map((w, i) => (i === 0 ? w.toLowerCase() : w[0]!.toUpperCase() + w.slice(1).toLowerCase())).join("");
  return /^[A-Za-z_]/.test(name) ? name : `m${name}`;
}

/** A number as a cell writes it (the shortest text that reads back as the same number). */
function num(v: number): string {
  return String(v);
}

/** A model spec as cell code: `"theis"` or `{ id: "neuman", saturatedThickness: 12 }`. */
export function specCode(choice: ModelChoice): string {
  const options = Object.entries(choice.options);
  return options.length === 0 ? JSON.stringify(choice.id) : `{ id: ${JSON.stringify(choice.id)}, ${options.map(([k, v]) => `${k}: ${num(v)}`).join(", ")} }`;
}

/** What "Keep" writes. */
export interface KeptMatch {
  choice: ModelChoice;
  record: ObservationRecord;
  /** The values kept (already rounded with keptValues), descriptor order. */
  values: ArrayLike<number>;
  /** True: the cell refines by least squares from the values; false: the cell shows the match as it is. */
  refined: boolean;
  /** True when a data-windows cell defines `windowMask` (the cell then fits the readings it keeps). */
  windowed: boolean;
  /** The name of the global the cell defines. */
  name: string;
}

/**
 * The source of the code cell "Keep" writes: the model, the record, the values as matched and the data windows
 * in use, so that `conebook verify` reruns exactly what was done by hand. A refined match calls aq.fitModel from
 * the matched values and shows the fit (estimates, 95 % intervals; correlations below); a match kept as it is
 * shows the values, the RMSE and the largest residual of the readings used.
 */
export function keptMatchSource(k: KeptMatch): string {
  const d = describeModel(k.choice.id);
  const rec = k.record.expression;
  const start = `{ ${d.parameters.map((p, i) => `${p.name}: ${num(k.values[i]!)}`).join(", ")} }`;
  const matched = d.parameters.map((p, i) => `${p.name} = ${num(k.values[i]!)}${p.unit === "1" ? "" : ` ${p.unit}`}`).join(", ");
  const well = k.windowed ? `{ ...${rec}, mask: windowMask(${rec}) }` : rec;
  const used = k.windowed ? "the readings the data windows keep" : "every reading";
  const title = `${k.record.name}, ${d.name}: matched by hand${k.refined ? ", refined by least squares" : ""}`;
  if (k.refined) {
    return [
      `// ${k.record.name} (${rec}) matched by hand to the ${d.name} curve in the workbench (${matched}),`,
      `// then refined by least squares from those values, on ${used}.`,
      `const ${k.name} = aq.fitModel({`,
      `  model: ${specCode(k.choice)},`,
      `  wells: [${well}],`,
      `  start: ${start},`,
      `});`,
      `show(show.fit(${k.name}, { title: ${JSON.stringify(title)} }));`,
      `show.value(${k.name}.n, "1", "readings used");`,
      `show.table(`,
      `  ${k.name}.freeParameters.map((name, i) => ({ parameter: name, ...Object.fromEntries(${k.name}.freeParameters.map((other, j) => [other, ${k.name}.correlation[i][j]])) })),`,
      `  { title: ${JSON.stringify(`Correlation of the estimates: ${k.record.name}, ${d.name}`)} },`,
      `);`,
    ].join("\n");
  }
  return [
    `// ${k.record.name} (${rec}) matched by hand to the ${d.name} curve in the workbench; the values as matched,`,
    `// with the fit they give on ${used} (residual = observed - model drawdown, m).`,
    `const ${k.name} = { model: ${specCode(k.choice)}, parameters: ${start} };`,
    `{`,
    `  const model = aq.drawdown(${k.name}.model, ${k.name}.parameters, { r: ${rec}.r, Q: ${rec}.Q }, ${rec}.t);`,
    `  const used = ${k.windowed ? `windowMask(${rec})` : `Array.from(${rec}.t, () => true)`};`,
    `  const residuals = Array.from(${rec}.s, (s, i) => s - model[i]).filter((_, i) => used[i]);`,
    `  show.table(`,
    `    [${d.parameters.map((p, i) => `{ parameter: ${JSON.stringify(`${p.name} (${p.label})`)}, value: ${num(k.values[i]!)}, unit: ${JSON.stringify(p.unit)} }`).join(", ")}],`,
    `    { title: ${JSON.stringify(title)} },`,
    `  );`,
    `  show.value(Math.sqrt(residuals.reduce((a, v) => a + v * v, 0) / residuals.length), "m", "RMSE of the readings used");`,
    `  show.value(residuals.reduce((a, v) => (Math.abs(v) > Math.abs(a) ? v : a), 0), "m", "largest residual");`,
    `  show.value(residuals.length, "1", "readings used");`,
    `}`,
  ].join("\n");
}
