/** Cholesky factor of a small symmetric positive semi-definite matrix. */

/**
 * Lower-triangular L with L L^T = A for a symmetric matrix A (row arrays). Pivots below 1e-14 times the largest
 * diagonal entry are set to 0 (a semi-definite direction: perfectly correlated parameters), so L may be singular.
 * Returns null when A is not symmetric positive semi-definite within that tolerance. Source: Golub and Van Loan
 * (2013), Matrix Computations, 4th ed., algorithm 4.2.1.
 */
export function choleskyLower(A: readonly (readonly number[])[]): number[][] | null {
  const n = A.length;
  const L: number[][] = A.map(() => new Array<number>(n).fill(0));
  let largest = 0;
  for (let i = 0; i < n; i++) largest = Math.max(largest, Math.abs(A[i]![i]!));
  const floor = 1e-14 * largest;
  for (let j = 0; j < n; j++) {
    let d = A[j]![j]!;
    for (let k = 0; k < j; k++) d -= L[j]![k]! * L[j]![k]!;
    if (!(d > -floor)) return null;
    const pivot = d > floor ? Math.sqrt(d) : 0;
    L[j]![j] = pivot;
    for (let i = j + 1; i < n; i++) {
      let v = A[i]![j]!;
      for (let k = 0; k < j; k++) v -= L[i]![k]! * L[j]![k]!;
      if (pivot === 0) {
        if (Math.abs(v) > 1e-7 * Math.sqrt(Math.abs(A[i]![i]!) * Math.abs(A[j]![j]!)) + floor) return null;
        L[i]![j] = 0;
      } else L[i]![j] = v / pivot;
    }
  }
  return L;
}
