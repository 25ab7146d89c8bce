/**
 * Checks of the data before a fit is trusted: drawdowns that are all zero, drawdowns whose sign contradicts
 * the pumping rate, and records with no trend in time (for models whose drawdown changes with time). Each
 * finding is an error (the fit cannot mean anything) or a warning, with what to do about it.
 *
 * "No trend" is an F test of the fitted model against a constant drawdown: F = ((SSR0 - SSR)/(p - 1)) /
 * (SSR/(n - p)) with SSR0 the weighted sum of squares about the weighted mean; P(F_(p-1, n-p) > F) =
 * I_x((n - p)/2, (p - 1)/2), x = (n - p)/((n - p) + (p - 1) F) (A&S 26.6.2). When the model explains no more than
 * a constant would (p-value above 0.05) the data have no trend the model can use; that covers pumping and
 * recovery records alike, where a slope test in ln t would not.
 */

import type { DrawdownModel } from "../models/index.js";
import type { PackedWell } from "./observations.js";
import { regularizedIncompleteBeta } from "./student-t.js";

/** One finding of the data checks. */
export interface DataFinding {
  readonly severity: "error" | "warning";
  readonly message: string;
}

/** True when the model's drawdown at `values` differs between the earliest and latest time of the well. */
function changesWithTime(model: DrawdownModel, values: Float64Array, w: PackedWell): boolean {
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < w.t.length; i++) {
    lo = Math.min(lo, w.t[i]!);
    hi = Math.max(hi, w.t[i]!);
  }
  if (!(hi > lo)) return false;
  try {
    const s = model.drawdown(values, w.geometry, [lo, hi]);
    return Math.abs(s[1]! - s[0]!) > 1e-12 * Math.max(Math.abs(s[0]!), Math.abs(s[1]!));
  } catch {
    return true;
  }
}

const fmt = (v: number) => Number(v.toPrecision(3)).toString();

/**
 * Findings on the packed wells before the fit: per well, all drawdowns zero (error); most non-zero drawdowns of
 * the opposite sign to Q (error: s is positive downwards for abstraction, Q > 0).
 */
export function checkObservations(wells: readonly PackedWell[]): DataFinding[] {
  const findings: DataFinding[] = [];
  for (const w of wells) {
    const m = w.t.length;
    if (m === 0) continue;
    let nonZero = 0;
    let opposite = 0;
    for (let i = 0; i < m; i++) {
      const s = w.s[i]!;
      if (s === 0) continue;
      nonZero++;
      if (s * w.geometry.Q < 0) opposite++;
    }
    if (nonZero === 0) {
      findings.push({
        severity: "error",
        message:
          `Well "${w.name}": all ${m} drawdowns are 0, so the data carry no information on the aquifer; any fitted value is arbitrary. ` +
          "Check that the drawdown column was read, and that static level was subtracted from the readings rather than the readings from themselves.",
      });
    } else if (opposite > nonZero / 2) {
      findings.push({
        severity: "error",
        message:
          `Well "${w.name}": ${opposite} of ${nonZero} non-zero drawdowns have the opposite sign to the pumping rate Q = ${fmt(w.geometry.Q)} m3/d ` +
          "(drawdown is positive downwards when Q > 0 abstracts). The record may be water levels or heads rather than drawdowns: " +
          "convert with drawdown = static level - level (or level - static head for heads), or give Q < 0 for an injection test.",
      });
    }
  }
  return findings;
}

/**
 * The F test of the module comment after a fit with weighted SSR `ssr` and p free parameters, for models whose
 * drawdown changes with time at `values` (native): an error when the model explains no more than a constant
 * drawdown (p-value above 0.05); none for steady-state models, p < 2 or n - p < 2.
 */
export function checkTrend(model: DrawdownModel, wells: readonly PackedWell[], values: Float64Array, ssr: number, p: number): DataFinding[] {
  if (!wells.some((w) => w.t.length > 0 && changesWithTime(model, values, w))) return [];
  let n = 0;
  let sw = 0;
  let sws = 0;
  for (const w of wells) {
    for (let i = 0; i < w.t.length; i++) {
      const weight = w.sqrtWeights[i]! ** 2;
      n++;
      sw += weight;
      sws += weight * w.s[i]!;
    }
  }
  const dof = n - p;
  if (p < 2 || dof < 2 || !(sw > 0)) return [];
  const mean = sws / sw;
  let ssr0 = 0;
  for (const w of wells) for (let i = 0; i < w.t.length; i++) ssr0 += w.sqrtWeights[i]! ** 2 * (w.s[i]! - mean) ** 2;
  if (!(ssr0 > 0)) return [];
  const d1 = p - 1;
  const f = ssr > 0 ? (Math.max(ssr0 - ssr, 0) / d1) / (ssr / dof) : Infinity;
  const pValue = Number.isFinite(f) ? regularizedIncompleteBeta(dof / (dof + d1 * f), dof / 2, d1 / 2) : 0;
  if (!(pValue > 0.05)) return [];
  return [
    {
      severity: "error",
      message:
        `No trend in time: the fitted model explains no more of the drawdown than a constant would (F test p = ${fmt(pValue)}), so it cannot ` +
        "separate its parameters and the fitted values are arbitrary. The record may start after the drawdown stabilised, be too short or noisy, " +
        "or hold the wrong column; fit the early-time readings or a steady-state model instead.",
    },
  ];
}
