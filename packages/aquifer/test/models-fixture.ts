/**
 * Typed access to tests/fixtures/models/models.json, written by tests/fixtures/models/generate_models.py
 * (mpmath, 30 significant digits).
 */
import { readFileSync } from "node:fs";

export interface TheisCase {
  T: number; S: number; Q: number; r: number; t: number; u: number; W: number; s: number; dsdT: number; dsdS: number;
}
export interface HantushCase {
  T: number; S: number; B: number; Q: number; r: number; t: number; u: number; rB: number; W: number; s: number;
  dsdT: number; dsdS: number; dsdB: number;
}
export interface ModelsFixture {
  reference: string;
  theis: TheisCase[];
  theisTypeCurve: { uInverse: number; W: number }[];
  smallU: { u: number; W: number }[];
  hantushJacob: HantushCase[];
  hantushSteady: { T: number; Q: number; rB: number; K0: number; s: number }[];
}

export const fixture: ModelsFixture = JSON.parse(
  readFileSync(new URL("../../../tests/fixtures/models/models.json", import.meta.url), "utf8"),
) as ModelsFixture;

/** Relative difference |a - b| / |b|. */
export function relDiff(a: number, b: number): number {
  return Math.abs(a - b) / Math.abs(b);
}

/**
 * Central finite-difference Jacobian of `f` at p with relative step h: column k is
 * (f(p + h p_k e_k) - f(p - h p_k e_k)) / (2 h p_k). Truncation error is O(h^2), rounding O(eps / h).
 */
export function centralDifferences(
  f: (p: number[]) => Float64Array,
  p: readonly number[],
  h = 1e-5,
): Float64Array[] {
  return p.map((pk, k) => {
    const step = h * pk;
    const up = p.slice();
    const down = p.slice();
    up[k] = pk + step;
    down[k] = pk - step;
    const fu = f(up);
    const fd = f(down);
    return fu.map((v, i) => (v - fd[i]!) / (2 * step));
  });
}
