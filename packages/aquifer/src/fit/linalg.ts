/**
 * Small dense linear algebra for least squares: Householder QR of a tall column-major matrix and a one-sided
 * Jacobi SVD for the small triangular factor. All loops run in a fixed order, so results are reproducible to
 * the last bit on the same platform.
 *
 * Storage: column-major, element (i, j) of an m-by-n matrix at a[j * m + i].
 */

/**
 * Householder QR factorisation in place (Golub & Van Loan, Matrix Computations, 4th ed., Alg. 5.2.1; the
 * reflector convention of LAPACK dgeqr2/dlarfg: H = I - tau v v^T with v[0] = 1).
 *
 * On return the upper triangle of the leading n-by-n block of `a` holds R, the entries below the diagonal hold
 * the reflector vectors, and `tau[j]` their scale factors. Requires m >= n.
 */
export function householderQr(a: Float64Array, m: number, n: number, tau: Float64Array): void {
  for (let j = 0; j < n; j++) {
    const cj = j * m;
    let sigma = 0;
    for (let i = j + 1; i < m; i++) sigma += a[cj + i]! * a[cj + i]!;
    const alpha = a[cj + j]!;
    if (sigma === 0) {
      tau[j] = 0;
      continue;
    }
    const norm = Math.sqrt(alpha * alpha + sigma);
    const beta = alpha >= 0 ? -norm : norm;
    tau[j] = (beta - alpha) / beta;
    const scale = 1 / (alpha - beta);
    for (let i = j + 1; i < m; i++) a[cj + i]! *= scale;
    a[cj + j] = beta;
    const tj = tau[j]!;
    for (let k = j + 1; k < n; k++) {
      const ck = k * m;
      let w = a[ck + j]!;
      for (let i = j + 1; i < m; i++) w += a[cj + i]! * a[ck + i]!;
      w *= tj;
      a[ck + j]! -= w;
      for (let i = j + 1; i < m; i++) a[ck + i]! -= w * a[cj + i]!;
    }
  }
}

/** Overwrites b (length m) with Q^T b, Q from {@link householderQr} of the same `a`, `tau`. */
export function applyQTranspose(a: Float64Array, m: number, n: number, tau: Float64Array, b: Float64Array): void {
  for (let j = 0; j < n; j++) {
    const tj = tau[j]!;
    if (tj === 0) continue;
    const cj = j * m;
    let w = b[j]!;
    for (let i = j + 1; i < m; i++) w += a[cj + i]! * b[i]!;
    w *= tj;
    b[j]! -= w;
    for (let i = j + 1; i < m; i++) b[i]! -= w * a[cj + i]!;
  }
}

/** Result of {@link jacobiSvd}: A V = W where the columns of W are sigma_j u_j. */
export interface SmallSvd {
  /** Singular values in descending order. */
  readonly sigma: Float64Array;
  /** Right singular vectors, column-major n-by-n; column j belongs to sigma[j]. */
  readonly v: Float64Array;
  /** A V, column-major m-by-n: column j equals sigma[j] times the left singular vector u_j. */
  readonly w: Float64Array;
}

/**
 * One-sided Jacobi SVD (Hestenes 1958; convergence test and rotation as in Demmel & Veselic 1992,
 * "Jacobi's method is more accurate than QR", SIAM J. Matrix Anal. Appl. 13(4)) of a small m-by-n column-major
 * matrix, m >= n. Accurate in the small singular values relative to column scaling, which is what the
 * covariance of badly scaled parameters needs. `a` is not modified.
 */
export function jacobiSvd(a: Float64Array, m: number, n: number): SmallSvd {
  const w = Float64Array.from(a.subarray(0, m * n));
  const v = new Float64Array(n * n);
  for (let j = 0; j < n; j++) v[j * n + j] = 1;
  const tol = 1e-15;
  for (let sweep = 0; sweep < 60; sweep++) {
    let rotated = false;
    for (let p = 0; p < n - 1; p++) {
      for (let q = p + 1; q < n; q++) {
        let alpha = 0;
        let beta = 0;
        let gamma = 0;
        for (let i = 0; i < m; i++) {
          const x = w[p * m + i]!;
          const y = w[q * m + i]!;
          alpha += x * x;
          beta += y * y;
          gamma += x * y;
        }
        if (gamma === 0 || Math.abs(gamma) <= tol * Math.sqrt(alpha * beta)) continue;
        rotated = true;
        const zeta = (beta - alpha) / (2 * gamma);
        const t = (zeta >= 0 ? 1 : -1) / (Math.abs(zeta) + Math.sqrt(1 + zeta * zeta));
        const c = 1 / Math.sqrt(1 + t * t);
        const s = c * t;
        for (let i = 0; i < m; i++) {
          const x = w[p * m + i]!;
          const y = w[q * m + i]!;
          w[p * m + i] = c * x - s * y;
          w[q * m + i] = s * x + c * y;
        }
        for (let i = 0; i < n; i++) {
          const x = v[p * n + i]!;
          const y = v[q * n + i]!;
          v[p * n + i] = c * x - s * y;
          v[q * n + i] = s * x + c * y;
        }
      }
    }
    if (!rotated) break;
  }
  const norms = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    let sum = 0;
    for (let i = 0; i < m; i++) sum += w[j * m + i]! * w[j * m + i]!;
    norms[j] = Math.sqrt(sum);
  }
  // Stable selection sort by descending singular value (ties keep column order): deterministic.
  const order: number[] = [];
  for (let j = 0; j < n; j++) order.push(j);
  for (let i = 0; i < n; i++) {
    let best = i;
    for (let j = i + 1; j < n; j++) if (norms[order[j]!]! > norms[order[best]!]!) best = j;
    if (best !== i) {
      const moved = order[best]!;
      for (let j = best; j > i; j--) order[j] = order[j - 1]!;
      order[i] = moved;
    }
  }
  const sigma = new Float64Array(n);
  const vs = new Float64Array(n * n);
  const ws = new Float64Array(m * n);
  for (let j = 0; j < n; j++) {
    const src = order[j]!;
    sigma[j] = norms[src]!;
    vs.set(v.subarray(src * n, src * n + n), j * n);
    ws.set(w.subarray(src * m, src * m + m), j * m);
  }
  return { sigma, v: vs, w: ws };
}

/**
 * Numerical rank of a matrix from its descending singular values: values below
 * max(m, n) * eps * sigma_max count as zero (the threshold of LAPACK's dgelss/numpy's matrix_rank).
 */
export function numericalRank(sigma: Float64Array, m: number, n: number): number {
  if (sigma.length === 0 || !(sigma[0]! > 0)) return 0;
  const threshold = Math.max(m, n) * Number.EPSILON * sigma[0]!;
  let rank = 0;
  for (let j = 0; j < sigma.length; j++) if (sigma[j]! > threshold) rank++;
  return rank;
}
