/**
 * Distance-drawdown analysis: drawdown at one time in several observation wells, against distance.
 *
 * Cooper and Jacob (1946), distance form: for small u, s = 2.303 Q/(4 pi T) log10(2.25 T t/(r^2 S)), a straight
 * line on s against log10 r with slope -2.303 Q/(2 pi T) per log cycle of r, so T = 2.303 Q/(2 pi ds) with ds the
 * drawdown difference per log cycle, and the line meets s = 0 at r0 with S = 2.25 T t/r0^2.
 *
 * Thiem (1906) steady state: s = Q/(2 pi T) ln(R/r) for two or more wells, by least squares of s on ln r:
 * slope -Q/(2 pi T), and R = exp(intercept/(-slope)) where the line meets s = 0.
 *
 * Sources: Cooper, H.H. and Jacob, C.E. (1946), Trans. Am. Geophys. Union 27(4), 526-534; Thiem, G. (1906),
 * Hydrologische Methoden, Gebhardt, Leipzig.
 */
import { SuperpositionInputError } from "./errors.js";
import { fitStraightLine } from "./line-fit.js";

const LN10 = Math.log(10);
const TWO_PI = 2 * Math.PI;

function checkData(where: string, r: ArrayLike<number>, s: ArrayLike<number>, Q: number): void {
  if (!r || !s || r.length !== s.length) {
    throw new SuperpositionInputError(`${where}: ${r?.length ?? 0} distances but ${s?.length ?? 0} drawdowns; pass one drawdown per well.`);
  }
  if (r.length < 2) throw new SuperpositionInputError(`${where}: ${r.length} well${r.length === 1 ? "" : "s"}; distance-drawdown needs at least 2.`);
  if (!(Number.isFinite(Q) && Q !== 0)) throw new SuperpositionInputError(`${where}: rate Q is ${Q} m3/d; give the non-zero pumping rate.`);
  for (let i = 0; i < r.length; i++) {
    if (!(Number.isFinite(r[i]!) && r[i]! > 0)) throw new SuperpositionInputError(`${where}: distance ${i} is ${r[i]} m; give a finite distance > 0.`);
    if (!Number.isFinite(s[i]!)) throw new SuperpositionInputError(`${where}: drawdown ${i} is ${s[i]} m; give a finite drawdown.`);
  }
  const first = r[0]!;
  let distinct = false;
  for (let i = 1; i < r.length; i++) if (r[i] !== first) distinct = true;
  if (!distinct) throw new SuperpositionInputError(`${where}: all wells are at ${first} m; distance-drawdown needs at least two distances.`);
}

/** Result of {@link cooperJacobDistance}. */
export interface CooperJacobDistanceResult {
  /** Transmissivity 2.303 Q/(2 pi ds), m2/d. */
  readonly T: number;
  /** Storativity 2.25 T t/r0^2. */
  readonly S: number;
  /** ds: drawdown decrease per log10 cycle of distance, m. */
  readonly slopePerLogCycle: number;
  /** Distance where the line meets s = 0, m. */
  readonly r0: number;
  /** Standard error of T from the slope's, m2/d (NaN with 2 wells). */
  readonly TStandardError: number;
  /** u = r^2 S/(4 T t) at each well with the fitted T and S. */
  readonly u: Float64Array;
  readonly warnings: string[];
}

/**
 * Cooper-Jacob distance-drawdown straight line: least squares of s (m) on log10 r (r in m) at time t (d since
 * pumping started, rate Q m3/d); T = 2.303 Q/(2 pi ds) (m2/d), S = 2.25 T t/r0^2. Valid where u <= 0.01 at every
 * well (common practice, no source; warned otherwise). Source: Cooper and Jacob (1946).
 */
export function cooperJacobDistance(input: { readonly r: ArrayLike<number>; readonly s: ArrayLike<number>; readonly Q: number; readonly t: number; readonly uMax?: number }): CooperJacobDistanceResult {
  const where = "cooperJacobDistance";
  checkData(where, input.r, input.s, input.Q);
  if (!(Number.isFinite(input.t) && input.t > 0)) throw new SuperpositionInputError(`${where}: time t is ${input.t} d; give the time of the readings, > 0.`);
  const x = Array.from(input.r, (r) => Math.log10(r));
  const line = fitStraightLine(x, Array.from(input.s));
  const ds = -line.slope;
  if (!(ds > 0)) {
    throw new SuperpositionInputError(
      `${where}: drawdown does not decrease with distance (slope ${line.slope.toPrecision(3)} m per log cycle); check the pairing of distances and drawdowns.`,
    );
  }
  const T = (LN10 * input.Q) / (TWO_PI * ds);
  const r0 = Math.pow(10, line.intercept / ds);
  const S = (2.25 * T * input.t) / (r0 * r0);
  const uMax = input.uMax ?? 0.01;
  const u = Float64Array.from(input.r, (r) => (r * r * S) / (4 * T * input.t));
  const warnings: string[] = [];
  const far = Array.from(u).map((v, i) => ({ v, i })).filter(({ v }) => v > uMax);
  if (far.length > 0) {
    warnings.push(
      `u exceeds ${uMax} at well${far.length === 1 ? "" : "s"} ${far.map(({ i }) => i).join(", ")} (largest ${Math.max(...far.map(({ v }) => v)).toPrecision(3)}): ` +
        "the straight line does not hold there, so T and S are biased; use a later time or leave those wells out.",
    );
  }
  if (input.r.length === 2) warnings.push("Two wells define the line exactly: no check of straightness and no standard error.");
  return { T, S, slopePerLogCycle: ds, r0, TStandardError: (T * line.slopeStandardError) / ds, u, warnings };
}

/** Result of {@link thiemDistance}. */
export interface ThiemDistanceResult {
  /** Transmissivity Q/(2 pi b), m2/d, b = -slope of s on ln r. */
  readonly T: number;
  /** Radius of influence where the line meets s = 0, m. */
  readonly R: number;
  /** Standard error of T, m2/d (NaN with 2 wells). */
  readonly TStandardError: number;
  /** Residual standard error of the line, m (NaN with 2 wells). */
  readonly residualStandardError: number;
  readonly warnings: string[];
}

/**
 * Thiem steady-state distance-drawdown: least squares of s (m) on ln r (r in m) over two or more wells around a
 * well pumping Q (m3/d): T = Q/(2 pi b) (m2/d) with b the decrease of s per unit ln r, R = r where the line gives
 * s = 0 (m). With two wells this is thiemTwoWells. Source: Thiem (1906).
 */
export function thiemDistance(input: { readonly r: ArrayLike<number>; readonly s: ArrayLike<number>; readonly Q: number }): ThiemDistanceResult {
  const where = "thiemDistance";
  checkData(where, input.r, input.s, input.Q);
  const line = fitStraightLine(Array.from(input.r, (r) => Math.log(r)), Array.from(input.s));
  const b = -line.slope;
  if (!(b > 0)) {
    throw new SuperpositionInputError(
      `${where}: drawdown does not decrease with distance (slope ${line.slope.toPrecision(3)} m per unit ln r); check the pairing of distances and drawdowns.`,
    );
  }
  const T = input.Q / (TWO_PI * b);
  const warnings: string[] = [];
  if (input.r.length === 2) warnings.push("Two wells define the line exactly: no check of straightness and no standard error.");
  warnings.push("Thiem needs steady flow: check that drawdown had stopped changing in every well, or use drawdown differences at late time (u <= 0.01).");
  return { T, R: Math.exp(line.intercept / b), TStandardError: (T * line.slopeStandardError) / b, residualStandardError: line.residualStandardError, warnings };
}
