/**
 * compareModels: a ranking of fits of different models to the same data by Akaike's information criterion, with
 * ΔAIC and Akaike weights, BIC and AICc beside it, and RMSE in a chosen length unit.
 *
 * Akaike weights (Burnham, K.P. and Anderson, D.R. (2002), Model Selection and Multimodel Inference, 2nd ed.,
 * Springer, section 2.9): with Δ_i = AIC_i − min_j AIC_j, w_i = exp(−Δ_i/2) / Σ_j exp(−Δ_j/2), the weight of
 * evidence for model i among the models compared. The same formula on BIC or AICc values gives their weights.
 * Each fit's AIC = n ln(SSR/n) + 2k, k = p + 1 (fit/statistics.ts), so fits are comparable only on the same data.
 */
import type { FitResult } from "../fit/index.js";
import { convert } from "../units/index.js";
import { AnalysisInputError } from "./errors.js";
import { convertAt } from "./unit-values.js";
import { largestOf } from "../numerics/extremes.js";

/** The parts of a fit result a comparison reads (a FitResult has them all). */
export type ComparableFit = Pick<FitResult, "modelId" | "n" | "p" | "aic" | "bic" | "aicc" | "rmse" | "converged"> & {
  readonly residuals: readonly { readonly name: string; readonly observed: ArrayLike<number> }[];
  /** The fit's residual checks; when a fit's residuals are not independent the ranking is flagged as unreliable. */
  readonly diagnostics?: { readonly independent: boolean; readonly lag1Autocorrelation: number | null };
};

/** Options of {@link compareModels}. */
export interface CompareModelsOptions {
  /** A label per fit (default its modelId). */
  readonly names?: readonly string[];
  /** Length unit of the RMSE column; default "m". */
  readonly lengthUnit?: string;
}

/** One row of the ranking, best (smallest AIC) first. */
export interface ModelRankingRow {
  readonly rank: number;
  readonly name: string;
  readonly modelId: string;
  /** Free parameters p, and k = p + 1 counted by the criteria (the error variance counts). */
  readonly freeParameters: number;
  readonly k: number;
  readonly n: number;
  readonly aic: number;
  readonly deltaAic: number;
  readonly akaikeWeight: number;
  readonly bic: number;
  readonly deltaBic: number;
  readonly bicWeight: number;
  /** Null when any fit has no AICc (n <= k + 1). */
  readonly aicc: number | null;
  readonly deltaAicc: number | null;
  readonly aiccWeight: number | null;
  /** sqrt(SSR / n) in the comparison's lengthUnit. */
  readonly rmse: number;
  readonly converged: boolean;
}

/** Result of {@link compareModels}. */
export interface ModelComparison {
  readonly criterion: "AIC";
  readonly rows: ModelRankingRow[];
  readonly lengthUnit: string;
  /** What the ranking does and does not say. */
  readonly caution: string;
  /**
   * False when the residuals of any fit are serially correlated (its Durbin-Watson test rejects independence):
   * the criteria assume independent errors and then overstate the evidence, so ΔAIC and the weights are too large.
   */
  readonly rankingReliable: boolean;
  readonly notes: string[];
}

/**
 * Differences Δ_i = v_i − min v and weights w_i = exp(−Δ_i/2) / Σ_j exp(−Δ_j/2) of information-criterion values
 * (Burnham and Anderson 2002, section 2.9). The weights sum to 1. Values must be finite.
 */
export function akaikeWeights(values: ArrayLike<number>): { delta: Float64Array; weight: Float64Array } {
  if (values.length === 0) throw new AnalysisInputError("akaikeWeights: no values given.");
  let best = Infinity;
  for (let i = 0; i < values.length; i++) {
    const v = values[i]!;
    if (!Number.isFinite(v)) throw new AnalysisInputError(`akaikeWeights: value ${i} is ${v}; information criteria must be finite.`);
    best = Math.min(best, v);
  }
  const delta = Float64Array.from(values, (v) => v - best);
  const relative = delta.map((d) => Math.exp(-d / 2));
  const sum = relative.reduce((a, b) => a + b, 0);
  return { delta, weight: relative.map((r) => r / sum) };
}

/** Relative agreement two fits' observations need to count as the same data (units converted separately). */
const SAME_DATA = 1e-9;

function checkSameData(fits: readonly ComparableFit[], names: readonly string[]): void {
  const first = fits[0]!;
  const flat = (f: ComparableFit) => f.residuals.flatMap((w) => Array.from(w.observed));
  const reference = flat(first);
  const scale = Math.max(largestOf(reference.map(Math.abs)), 1e-300);
  fits.forEach((f, i) => {
    if (f.n !== first.n) {
      throw new AnalysisInputError(
        `compareModels: fit "${names[i]}" used ${f.n} points but fit "${names[0]}" used ${first.n}; information criteria compare fits to the same data only. ` +
          "Fit every model to the same series with the same mask.",
      );
    }
    const observed = flat(f);
    const differs = observed.length !== reference.length || observed.some((v, j) => Math.abs(v - reference[j]!) > SAME_DATA * scale);
    if (differs) {
      throw new AnalysisInputError(
        `compareModels: fit "${names[i]}" was fitted to other observations than fit "${names[0]}"; information criteria compare fits to the same data only.`,
      );
    }
  });
}

/**
 * Ranks fits of different models to the same data by AIC (smallest first) with ΔAIC and Akaike weights
 * w_i = exp(−Δ_i/2)/Σ exp(−Δ_j/2) (Burnham and Anderson 2002), the same for BIC and, when every fit has one, AICc,
 * and the RMSE in `lengthUnit`. The ranking is statistical evidence on these data, not a verdict on the conceptual
 * model (stated in `caution`). When a fit's residual diagnostics show serial correlation, `rankingReliable` is false
 * and a note says why the criteria then overstate the evidence.
 * @throws AnalysisInputError for no fits, fits to different data, or non-finite criteria; UnitError for a
 *   lengthUnit that is not a length.
 */
export function compareModels(fits: readonly ComparableFit[], options: CompareModelsOptions = {}): ModelComparison {
  if (!Array.isArray(fits) || fits.length === 0) throw new AnalysisInputError("compareModels: no fits given; pass [fit1, fit2, ...] from fitModel or fitSeries.");
  const names = fits.map((f, i) => options.names?.[i] ?? f.modelId);
  if (options.names !== undefined && options.names.length !== fits.length) {
    throw new AnalysisInputError(`compareModels: ${options.names.length} names for ${fits.length} fits; give one name per fit.`);
  }
  const lengthUnit = options.lengthUnit ?? "m";
  convertAt("compareModels", "lengthUnit", 1, "m", lengthUnit);
  checkSameData(fits, names);
  const aic = akaikeWeights(fits.map((f) => f.aic));
  const bic = akaikeWeights(fits.map((f) => f.bic));
  const allAicc = fits.every((f) => f.aicc !== null);
  const aicc = allAicc ? akaikeWeights(fits.map((f) => f.aicc!)) : null;
  const order = fits.map((_, i) => i).sort((a, b) => fits[a]!.aic - fits[b]!.aic || a - b);
  const rows: ModelRankingRow[] = order.map((i, rank) => {
    const f = fits[i]!;
    return {
      rank: rank + 1,
      name: names[i]!,
      modelId: f.modelId,
      freeParameters: f.p,
      k: f.p + 1,
      n: f.n,
      aic: f.aic,
      deltaAic: aic.delta[i]!,
      akaikeWeight: aic.weight[i]!,
      bic: f.bic,
      deltaBic: bic.delta[i]!,
      bicWeight: bic.weight[i]!,
      aicc: f.aicc,
      deltaAicc: aicc ? aicc.delta[i]! : null,
      aiccWeight: aicc ? aicc.weight[i]! : null,
      rmse: convert(f.rmse, "m", lengthUnit),
      converged: f.converged,
    };
  });
  const notes: string[] = [];
  const close = rows.filter((r) => r.rank > 1 && r.deltaAic <= 2).map((r) => r.name);
  if (close.length > 0) {
    notes.push(
      `${close.join(", ")} ${close.length === 1 ? "is" : "are"} within ΔAIC ≤ 2 of the best: the data give such models substantial support as well ` +
        "(a rule of thumb, common practice); the ranking alone does not separate them.",
    );
  }
  if (!allAicc) notes.push("AICc is left out: at least one fit has n ≤ k + 1, where AICc is undefined.");
  const n0 = fits[0]!.n;
  if (allAicc && fits.some((f) => n0 / (f.p + 1) < 40)) {
    notes.push("n/k < 40 for at least one model: AICc is the better-behaved criterion for such small samples (a rule of thumb, common practice).");
  }
  const correlated = fits
    .map((f, i) => ({ f, name: names[i]! }))
    .filter(({ f }) => f.diagnostics && !f.diagnostics.independent)
    .map(({ f, name }) => `${name} (lag-1 autocorrelation ${f.diagnostics!.lag1Autocorrelation === null ? "n/a" : f.diagnostics!.lag1Autocorrelation.toFixed(2)})`);
  if (correlated.length > 0) {
    notes.push(
      `The ranking is unreliable: the residuals of ${correlated.join(", ")} are serially correlated, while AIC, BIC and their weights assume ` +
        "independent errors. With correlated errors the effective number of readings is smaller than n, so the criteria overstate the " +
        "evidence: differences in AIC are too large and the weights too close to 0 and 1. Treat the ranking as a hint, and choose with the " +
        "residual plots, the diagnostic plots and the site's geology.",
    );
  }
  const unconverged = rows.filter((r) => !r.converged).map((r) => r.name);
  if (unconverged.length > 0) notes.push(`Not converged: ${unconverged.join(", ")}; their criteria may be too high, so their rank may be too low.`);
  return {
    criterion: "AIC",
    rows,
    lengthUnit,
    rankingReliable: correlated.length === 0,
    caution:
      "This ranking is statistical evidence about how well each model fits these data for its number of parameters; it is not a verdict on the " +
      "conceptual model. Check each model's assumptions against the site's geology, the test's duration and the diagnostic plots before choosing one.",
    notes,
  };
}
