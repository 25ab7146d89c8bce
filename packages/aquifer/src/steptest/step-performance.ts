/**
 * Per-step performance of a pumped well from fitted step-test coefficients: formation and well losses,
 * efficiency, well-loss fraction and specific capacity. Base units: Q m3/d, s m.
 */

/** What one step says about the well, base units. */
export interface StepPerformance {
  /** 1-based step number. */
  readonly step: number;
  /** Rate, m3/d. */
  readonly rate: number;
  /** Observed step drawdown used in the fit, m. */
  readonly drawdown: number;
  /** B Q + C Q^n, m. */
  readonly fittedDrawdown: number;
  /** Formation (aquifer) loss B Q, m. */
  readonly formationLoss: number;
  /** Well loss C Q^n, m. */
  readonly wellLoss: number;
  /** Well efficiency B Q / (B Q + C Q^n), dimensionless (fraction, not percent). */
  readonly efficiency: number;
  /** C Q^n / (B Q + C Q^n) = 1 - efficiency. */
  readonly wellLossFraction: number;
  /** Observed specific capacity Q / s_w, m2/d (m3/d per m of drawdown). */
  readonly specificCapacity: number;
  /** Fitted specific capacity Q / (B Q + C Q^n), m2/d. */
  readonly fittedSpecificCapacity: number;
}

/**
 * Per-step losses and efficiency for s_w = B Q + C Q^n (Jacob 1947 with n = 2; Rorabaugh 1953 in general):
 * efficiency = B Q / (B Q + C Q^n), well-loss fraction = C Q^n / (B Q + C Q^n), specific capacity Q / s_w.
 * B in d/m2, C in d^n/m^(3n-1), Q in m3/d, s in m.
 */
export function stepPerformance(
  Q: ArrayLike<number>,
  s: ArrayLike<number>,
  B: number,
  C: number,
  n: number,
): StepPerformance[] {
  const out: StepPerformance[] = [];
  for (let i = 0; i < Q.length; i++) {
    const q = Q[i]!;
    const formationLoss = B * q;
    const wellLoss = C * Math.pow(q, n);
    const fitted = formationLoss + wellLoss;
    out.push({
      step: i + 1,
      rate: q,
      drawdown: s[i]!,
      fittedDrawdown: fitted,
      formationLoss,
      wellLoss,
      efficiency: formationLoss / fitted,
      wellLossFraction: wellLoss / fitted,
      specificCapacity: q / s[i]!,
      fittedSpecificCapacity: q / fitted,
    });
  }
  return out;
}

/** Unit text of C in s = B Q + C Q^n with base units: "d2/m5" for n = 2, "d^n/m^(3n-1)" written out otherwise. */
export function wellLossCoefficientUnit(n: number): string {
  if (n === 2) return "d2/m5";
  const p = (v: number) => Number(v.toPrecision(4)).toString();
  return `d^${p(n)}/m^${p(3 * n - 1)}`;
}
