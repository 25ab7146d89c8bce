/** Sample quantiles. */

/**
 * Quantile q (0..1) of an ascending sorted sample by linear interpolation between order statistics
 * (definition 7 of Hyndman and Fan 1996, the default of R and numpy): h = (n - 1) q, x[floor h] + (h - floor h)
 * (x[floor h + 1] - x[floor h]). Source: Hyndman, R.J. and Fan, Y. (1996), The American Statistician 50(4), 361-365.
 */
export function sortedQuantile(sorted: ArrayLike<number>, q: number): number {
  const n = sorted.length;
  if (n === 0) return Number.NaN;
  const h = (n - 1) * q;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, n - 1);
  return sorted[lo]! + (h - lo) * (sorted[hi]! - sorted[lo]!);
}
