/**
 * Largest and smallest of many numbers without spreading them into Math.max or Math.min, whose argument list
 * overflows the engine's stack from about 10^5 values (a logger record of 200,000 readings did).
 */

/** The largest of `values` as Math.max gives it (NaN if any is NaN, -Infinity when there are none, +0 over -0). */
export function largestOf(values: ArrayLike<number>): number {
  let m = -Infinity;
  for (let i = 0; i < values.length; i++) {
    const v = values[i]!;
    if (v !== v) return NaN;
    if (v > m || (v === 0 && m === 0 && 1 / m < 0)) m = v;
  }
  return m;
}

/** The smallest of `values` as Math.min gives it (NaN if any is NaN, +Infinity when there are none, -0 under +0). */
export function smallestOf(values: ArrayLike<number>): number {
  let m = Infinity;
  for (let i = 0; i < values.length; i++) {
    const v = values[i]!;
    if (v !== v) return NaN;
    if (v < m || (v === 0 && m === 0 && 1 / v < 0)) m = v;
  }
  return m;
}

/** The largest value over several arrays, as largestOf of their concatenation gives it (without concatenating). */
export function largestOfAll(arrays: readonly ArrayLike<number>[]): number {
  let m = -Infinity;
  for (const values of arrays) {
    const v = largestOf(values);
    if (v !== v) return NaN;
    if (v > m || (v === 0 && m === 0 && 1 / m < 0)) m = v;
  }
  return m;
}
