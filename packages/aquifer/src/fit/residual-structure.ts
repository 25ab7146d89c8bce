/**
 * The structure the residual checks work on: the points of each well in time order (one block per well), an
 * orthonormal basis Q of the weighted Jacobian's columns, and fast products with the matrices that describe
 * serial correlation inside a block:
 *   Sigma(rho): the AR(1) correlation matrix, Sigma_ij = rho^|i - j| within a well, 0 between wells;
 *   C: the lag-one matrix, C_ij = 1/2 for |i - j| = 1 within a well, so e'Ce = sum_i e_i e_(i+1);
 *   A: the first-difference matrix of Durbin and Watson, e'Ae = sum_i (e_(i+1) - e_i)^2.
 * Every product costs O(n); the projection M = I - Q Q' of least squares is never formed.
 */

import type { PackedWell } from "./observations.js";

/** Packed point indices in time order, with the start of each well's block. */
export interface TimeOrder {
  /** seq[k]: packed index of the k-th point in time order (wells one after another). */
  readonly seq: Int32Array;
  /** Start of each block in seq, plus seq.length at the end. */
  readonly blocks: Int32Array;
}

/** The points of every well sorted by time (stable for equal times). */
export function timeOrder(wells: readonly PackedWell[]): TimeOrder {
  const total = wells.reduce((sum, w) => sum + w.t.length, 0);
  const seq = new Int32Array(total);
  const blocks = new Int32Array(wells.length + 1);
  let k = 0;
  wells.forEach((w, b) => {
    blocks[b] = k;
    let sorted = true;
    for (let i = 1; i < w.t.length && sorted; i++) sorted = w.t[i - 1]! <= w.t[i]!;
    if (sorted) {
      for (let i = 0; i < w.t.length; i++) seq[k++] = w.offset + i;
      return;
    }
    const local = Array.from({ length: w.t.length }, (_, i) => i).sort((i, j) => w.t[i]! - w.t[j]! || i - j);
    for (const i of local) seq[k++] = w.offset + i;
  });
  blocks[wells.length] = k;
  return { seq, blocks };
}

/** v (packed order) rearranged into time order. */
export function inTimeOrder(order: TimeOrder, v: ArrayLike<number>, offset = 0): Float64Array {
  const out = new Float64Array(order.seq.length);
  for (let k = 0; k < out.length; k++) out[k] = v[offset + order.seq[k]!]!;
  return out;
}

/** out = Sigma(rho) v for v in time order (two recursive passes per block). */
export function ar1Product(order: TimeOrder, rho: number, v: Float64Array, out: Float64Array): Float64Array {
  const b = order.blocks;
  for (let w = 0; w + 1 < b.length; w++) {
    const lo = b[w]!;
    const hi = b[w + 1]!;
    let forward = 0;
    for (let k = lo; k < hi; k++) {
      forward = v[k]! + rho * forward;
      out[k] = forward;
    }
    let backward = 0;
    for (let k = hi - 1; k >= lo; k--) {
      backward = v[k]! + rho * backward;
      out[k]! += backward - v[k]!;
    }
  }
  return out;
}

/** out = C v (lag-one matrix) for v in time order. */
export function lagProduct(order: TimeOrder, v: Float64Array, out: Float64Array): Float64Array {
  const b = order.blocks;
  for (let w = 0; w + 1 < b.length; w++) {
    const lo = b[w]!;
    const hi = b[w + 1]!;
    for (let k = lo; k < hi; k++) out[k] = 0.5 * ((k > lo ? v[k - 1]! : 0) + (k + 1 < hi ? v[k + 1]! : 0));
  }
  return out;
}

/** out = A v (Durbin-Watson first-difference matrix) for v in time order. */
export function differenceProduct(order: TimeOrder, v: Float64Array, out: Float64Array): Float64Array {
  const b = order.blocks;
  for (let w = 0; w + 1 < b.length; w++) {
    const lo = b[w]!;
    const hi = b[w + 1]!;
    for (let k = lo; k < hi; k++) {
      let value = 0;
      if (k > lo) value += v[k]! - v[k - 1]!;
      if (k + 1 < hi) value += v[k]! - v[k + 1]!;
      out[k] = value;
    }
  }
  return out;
}

/** Dot product of two vectors of equal length. */
export function dot(a: Float64Array, b: Float64Array): number {
  let sum = 0;
  for (let i = 0; i < a.length; i++) sum += a[i]! * b[i]!;
  return sum;
}

/**
 * Orthonormal basis of the column space of the column-major n-by-p matrix J (time order applied), by modified
 * Gram-Schmidt with one reorthogonalisation; columns whose remaining norm is below 1e-10 of their original norm
 * (dependent directions) are dropped. Returns the basis vectors in time order.
 */
export function orthonormalBasis(order: TimeOrder, jacobian: Float64Array, p: number): Float64Array[] {
  const n = order.seq.length;
  const basis: Float64Array[] = [];
  for (let j = 0; j < p; j++) {
    const v = inTimeOrder(order, jacobian, j * n);
    const original = Math.sqrt(dot(v, v));
    if (!(original > 0) || !Number.isFinite(original)) continue;
    for (let pass = 0; pass < 2; pass++) {
      for (const q of basis) {
        const c = dot(q, v);
        for (let i = 0; i < n; i++) v[i]! -= c * q[i]!;
      }
    }
    const norm = Math.sqrt(dot(v, v));
    if (!(norm > 1e-10 * original)) continue;
    for (let i = 0; i < n; i++) v[i]! /= norm;
    basis.push(v);
  }
  return basis;
}

/** Number of adjacent pairs (points with a predecessor in the same well). */
export function adjacentPairs(order: TimeOrder): number {
  let pairs = 0;
  for (let w = 0; w + 1 < order.blocks.length; w++) pairs += Math.max(0, order.blocks[w + 1]! - order.blocks[w]! - 1);
  return pairs;
}

/**
 * Traces of M Sigma(rho) and M C M Sigma(rho) with M = I - Q Q' (Q the basis), in O(n q^2):
 *   tr(M S) = tr(S) - sum_k q_k' S q_k,
 *   tr(M C M S) = tr(C S) - 2 sum_k q_k' C S q_k + tr((Q' C Q)(Q' S Q)),
 * using the symmetry of C and S; tr(S) = n and tr(C S) = rho (number of adjacent pairs).
 */
export function projectedTraces(order: TimeOrder, basis: readonly Float64Array[], rho: number): { mSigma: number; mcmSigma: number } {
  return projectedTracesOf(order, basis)(rho);
}

/**
 * The traces of {@link projectedTraces} as a function of rho for one basis: the lag products C q_k and the
 * matrix Q' C Q, which do not depend on rho, are formed once, and the products Sigma(rho) q_k reuse their
 * buffers, so a root search over rho costs q AR(1) products and O(n q^2) dot products per step. Same
 * arithmetic, in the same order, as a fresh evaluation: the values are identical.
 */
export function projectedTracesOf(order: TimeOrder, basis: readonly Float64Array[]): (rho: number) => { mSigma: number; mcmSigma: number } {
  const n = order.seq.length;
  const q = basis.length;
  const lagQ = basis.map((v) => lagProduct(order, v, new Float64Array(n)));
  const qLagQ = new Float64Array(q * q);
  for (let a = 0; a < q; a++) for (let b = 0; b < q; b++) qLagQ[a * q + b] = dot(basis[a]!, lagQ[b]!);
  const pairs = adjacentPairs(order);
  const sigmaQ = basis.map(() => new Float64Array(n));
  // qSigmaQ[b * q + a] = q_b' Sigma q_a and lagSigma[k] = (C q_k)' Sigma q_k, each summed in ascending index
  // order in one pass over the vectors (as dot() sums them).
  const qSigmaQ = new Float64Array(q * q);
  const lagSigma = new Float64Array(q);
  return (rho) => {
    for (let k = 0; k < q; k++) ar1Product(order, rho, basis[k]!, sigmaQ[k]!);
    qSigmaQ.fill(0);
    lagSigma.fill(0);
    for (let a = 0; a < q; a++) {
      const sa = sigmaQ[a]!;
      const la = lagQ[a]!;
      for (let b = 0; b < q; b++) {
        const qb = basis[b]!;
        let sum = 0;
        for (let i = 0; i < n; i++) sum += qb[i]! * sa[i]!;
        qSigmaQ[b * q + a] = sum;
      }
      let lag = 0;
      for (let i = 0; i < n; i++) lag += la[i]! * sa[i]!;
      lagSigma[a] = lag;
    }
    let mSigma = n;
    let cross = 0;
    for (let k = 0; k < q; k++) {
      mSigma -= qSigmaQ[k * q + k]!;
      cross += lagSigma[k]!;
    }
    let product = 0;
    for (let a = 0; a < q; a++) {
      for (let b = 0; b < q; b++) product += qLagQ[a * q + b]! * qSigmaQ[b * q + a]!;
    }
    return { mSigma, mcmSigma: rho * pairs - 2 * cross + product };
  };
}

/**
 * tr((M Sigma)^2) with M = I - Q Q': tr(S^2) - 2 sum_k (S q_k)'(S q_k) + sum_ab (q_a' S q_b)^2, where
 * tr(S^2) = sum over blocks of m + 2 sum_(k=1)^(m-1) (m - k) rho^(2k).
 */
export function projectedSquareTrace(order: TimeOrder, basis: readonly Float64Array[], rho: number): number {
  const n = order.seq.length;
  let traceS2 = 0;
  for (let w = 0; w + 1 < order.blocks.length; w++) {
    const m = order.blocks[w + 1]! - order.blocks[w]!;
    traceS2 += m;
    let power = 1;
    for (let k = 1; k < m; k++) {
      power *= rho * rho;
      if (power < 1e-300) break;
      traceS2 += 2 * (m - k) * power;
    }
  }
  const sigmaQ = basis.map((v) => ar1Product(order, rho, v, new Float64Array(n)));
  let result = traceS2;
  for (let k = 0; k < basis.length; k++) result -= 2 * dot(sigmaQ[k]!, sigmaQ[k]!);
  for (let a = 0; a < basis.length; a++) for (let b = 0; b < basis.length; b++) result += dot(basis[a]!, sigmaQ[b]!) ** 2;
  return result;
}

/**
 * out = Sigma(rho)^-1 v for v in time order: per block (1/(1 - rho^2)) times the tridiagonal matrix with
 * diagonal 1, 1 + rho^2, ..., 1 + rho^2, 1 and off-diagonal -rho (the inverse of the AR(1) correlation matrix).
 */
export function ar1InverseProduct(order: TimeOrder, rho: number, v: Float64Array, out: Float64Array): Float64Array {
  const b = order.blocks;
  const scale = 1 / (1 - rho * rho);
  for (let w = 0; w + 1 < b.length; w++) {
    const lo = b[w]!;
    const hi = b[w + 1]!;
    for (let k = lo; k < hi; k++) {
      const ends = (k === lo ? 0 : 1) + (k + 1 === hi ? 0 : 1);
      let value = (ends === 2 ? 1 + rho * rho : ends === 1 ? 1 : 1 - rho * rho) * v[k]!;
      if (k > lo) value -= rho * v[k - 1]!;
      if (k + 1 < hi) value -= rho * v[k + 1]!;
      out[k] = scale * value;
    }
  }
  return out;
}
