/**
 * A seeded coverage study of the 95 % intervals of fitModel: many synthetic records of an invented test (an
 * observation well 30 m from a well pumping 864 m3/d, 30 readings log-spaced from 1 min to 2 d, noise of 1 cm
 * standard deviation, independent or AR(1) in reading order), each fitted, counting how often each interval
 * covers the value the record was made with. Shared by the coverage test and `npm run bench`.
 */
import { fitModel, hantushJacobModel, theisModel, type DrawdownModel, type FitOptions } from "@conebook/aquifer";
import { normalGenerator } from "./seeded-noise.js";

/** One case of the study. */
export interface CoverageCase {
  readonly model: "theis" | "hantush-jacob";
  /** AR(1) coefficient of the noise in reading order; 0 for independent noise. */
  readonly phi: number;
  readonly records: number;
  readonly seed: number;
  /** The fit's correlation option; default "auto". */
  readonly correlation?: FitOptions["correlation"];
}

/** Coverage (fractions) per parameter of the interval shown and of the linearised one, and how often AR(1) was chosen. */
export interface CoverageResult {
  readonly parameters: string[];
  readonly shown: number[];
  readonly linearised: number[];
  /** Fraction of fits whose intervals were AR(1)-corrected. */
  readonly ar1Chosen: number;
  /** Fraction of fits with errors. */
  readonly withErrors: number;
  readonly milliseconds: number;
}

const TRUE_VALUES: Record<CoverageCase["model"], number[]> = { theis: [250, 2e-4], "hantush-jacob": [250, 2e-4, 150] };
const MODELS: Record<CoverageCase["model"], DrawdownModel> = { theis: theisModel, "hantush-jacob": hantushJacobModel };
const GEOMETRY = { r: 30, Q: 864 };
const READINGS = 30;
const NOISE = 0.01;

/** Runs one case: `records` seeded records fitted from a start 30 % above the true values. */
export function coverageStudy(c: CoverageCase): CoverageResult {
  const model = MODELS[c.model];
  const truth = TRUE_VALUES[c.model];
  const t = Float64Array.from({ length: READINGS }, (_, i) => Math.pow(10, Math.log10(1 / 1440) + (i * (Math.log10(2) - Math.log10(1 / 1440))) / (READINGS - 1)));
  const exact = model.drawdown(truth, GEOMETRY, t);
  const z = normalGenerator(c.seed);
  const shown = truth.map(() => 0);
  const linearised = truth.map(() => 0);
  let ar1 = 0;
  let errors = 0;
  const start = Object.fromEntries(model.parameters.map((d, j) => [d.name, truth[j]! * 1.3]));
  const began = performance.now();
  for (let k = 0; k < c.records; k++) {
    const s = new Float64Array(READINGS);
    let e = z() * NOISE;
    for (let i = 0; i < READINGS; i++) {
      if (i > 0) e = c.phi * e + Math.sqrt(1 - c.phi * c.phi) * NOISE * z();
      s[i] = exact[i]! + e;
    }
    const fit = fitModel({ model, wells: [{ name: "OB", geometry: GEOMETRY, t, s }], start, correlation: c.correlation ?? "auto" });
    if (fit.uncertainty.residuals === "ar1") ar1++;
    if (fit.errors.length > 0) errors++;
    fit.parameters.forEach((p, j) => {
      const v = truth[j]!;
      if (p.ci95 && p.ci95[0] <= v && v <= p.ci95[1]) shown[j]!++;
      const l = p.intervals.linearised;
      if (l && l[0] <= v && v <= l[1]) linearised[j]!++;
    });
  }
  return {
    parameters: model.parameters.map((d) => d.name),
    shown: shown.map((x) => x / c.records),
    linearised: linearised.map((x) => x / c.records),
    ar1Chosen: ar1 / c.records,
    withErrors: errors / c.records,
    milliseconds: performance.now() - began,
  };
}
