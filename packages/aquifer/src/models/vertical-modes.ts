/**
 * The Laplace-domain drawdown of a partially penetrating, finite-diameter well with well-bore storage and skin
 * in an aquifer of thickness b, as a series over vertical modes. One engine serves the confined or leaky
 * aquifer (Dougherty and Babu 1984; line-source limit Hantush 1961) and the water-table aquifer with
 * instantaneous or gradual drainage (Neuman 1974; Moench 1997).
 *
 * Coordinates: zeta is the height above the aquifer base (0..b); the pumping screen spans zeta_a..zeta_b
 * (length L), an observation screen zeta_1..zeta_2 (length L_o) or a piezometer sits at zeta_o.
 * With p the Laplace variable (1/d) and the drawdown s(r, zeta, t), each vertical mode cos(eps_n zeta / b)
 * meets no flow at the base and, at the top,
 *   confined:     no flow, eps_n = n pi;
 *   water table:  Kz ds/dzeta = -Sy p alpha / (alpha + p) s (Boulton-type gradual drainage with drainage
 *                 constant alpha, 1/d; alpha -> infinity is Neuman's instantaneous drainage), so that
 *                 eps_n tan eps_n = gamma,  gamma = Sy b p alpha / (Kz (alpha + p)),  n pi < eps_n < n pi + pi/2.
 * In mode n the radial equation Kr (a'' + a'/r) = (Ss p + lambda / b + Kz eps_n^2 / b^2) a gives
 *   a_n = A_n K0(q_n r),  q_n^2 = (S p + lambda) / T + kappa eps_n^2 / b^2,   kappa = Kz / Kr,
 * with lambda the leakance K'/b' of an aquitard without storage (Hantush-Jacob leakage, 1/d; 0 for none).
 * A uniform flux Q_a / L over the screen expands into the modes with coefficients
 *   c_n = 4 [sin(eps_n zeta_b / b) - sin(eps_n zeta_a / b)] / (L (2 eps_n + sin 2 eps_n))    (1/m; c_0 = 1/b
 *   in the confined case), and the flux condition at r = rw gives A_n = Q_a c_n / (2 pi Kr rw q_n K1(q_n rw)).
 * Averaging over the observation interval (or taking the value at the piezometer) with
 *   o_n = b [sin(eps_n zeta_2 / b) - sin(eps_n zeta_1 / b)] / (L_o eps_n)   or   o_n = cos(eps_n zeta_o / b),
 *   s(r, p) = Q_a / (2 pi Kr) sum_n c_n o_n G_n(r),   G_n(r) = K0(q_n r) / (rw q_n K1(q_n rw))
 * (G_n = K0(q_n r) for a line source, rw -> 0). In the pumped well the drawdown is the screen average of the
 * aquifer drawdown at r = rw plus the skin loss Q_a Sk / (2 pi Kr L) of a thin skin (Agarwal et al. 1970):
 *   s_w = Q_a Phi,   Phi = (b / (2 pi T)) [sum_n c_n o_n^screen G_n(rw) + Sk / L],
 * and the well-bore balance Q / p = Q_a + pi rc^2 p s_w gives Q_a = (Q / p) / (1 + pi rc^2 p Phi).
 * The uniform-flux screen with an averaged well drawdown is the approximation of Dougherty and Babu (1984)
 * and Moench (1997); for a full screen and confined modes only n = 0 remains and the transform is that of
 * Papadopulos and Cooper (1967) with skin; with water-table modes, full penetration and a line source it is
 * Neuman's (1974) in the form of neuman-laplace.ts.
 *
 * Summation. Away from the pumped well G_n decays like exp(-q_n (r - rw)) and the series is summed until the
 * bound of its tail, envelope(eps_n) G_n rho / (1 - rho) with rho the last ratio G_n / G_(n-1), is below
 * SERIES_TOLERANCE of the sum. In the pumped well G_n(rw) decreases only like 1/n; there the terms after
 * N = max(40, 3 m / k, 16 gamma / pi) (m^2 = (S p + lambda) / T, k = pi sqrt(kappa) / b; at most DIRECT_CAP)
 * are taken from the confined modes at p = 0 with first- and second-order corrections in m^2,
 *   sum_{n > N} c_n o_n [g(k n rw) + d dg/dy(k^2 n^2) + (d^2 / 2) d2g/dy2(k^2 n^2)],  d = m^2 + 2 kappa gamma / b^2,
 *   g(x) = K0(x) / (x K1(x)),  y = q^2,
 * (an inversion uses the N of its largest p for all of its p, so that the small error of the tail changes
 * smoothly with p and is not amplified by the alternating Stehfest weights), with the tail
 * precomputed once per kappa as suffix sums out to the index where k n rw = 40 (and at least 20000 terms);
 * there the water-table eigenvalues are n pi + gamma / (n pi) + ..., which shifts q^2 by 2 kappa gamma / b^2
 * (taken into the first-order term) and changes the coefficients by O(gamma / n^2); the neglected second
 * order is O((m / (k n))^6). Accuracy: see docs/methods.md.
 */
import { besselK0, besselK0e, besselK1e } from "../special/index.js";
import { firstRootGuess, neumanNextRoot, neumanRoot } from "./neuman-laplace.js";
import { portableCos, portableSin } from "../numerics/portable-math.js";

/** Relative truncation tolerance of the directly summed series. */
export const SERIES_TOLERANCE = 1e-11;
/** Most terms summed directly before the precomputed tail takes over (pumped well) or the sum stops. */
export const DIRECT_CAP = 4000;
/** Most terms of any series away from the pumped well. */
const OBSERVATION_CAP = 200000;

/** Vertical geometry in heights above the aquifer base, m. */
export interface VerticalGeometry {
  /** Saturated thickness b, m. */
  readonly b: number;
  /** Pumping screen from zetaA (lower) to zetaB (upper), m above the base. */
  readonly zetaA: number;
  readonly zetaB: number;
  /** Observation: a piezometer at zeta or a screen from zeta1 (lower) to zeta2 (upper), m above the base. */
  readonly observation: { readonly zeta: number } | { readonly zeta1: number; readonly zeta2: number };
}

/** The aquifer in the units of the library (T m2/d, S 1, kappa 1, lambda 1/d, Sy 1, alpha 1/d). */
export interface ModeAquifer {
  readonly T: number;
  readonly S: number;
  /** Kz/Kr. */
  readonly kappa: number;
  /** Leakance K'/b' of an aquitard without storage, 1/d (0: none). */
  readonly lambda: number;
  /** Specific yield; 0 selects the confined modes. */
  readonly Sy: number;
  /** Drainage constant, 1/d; Infinity for instantaneous drainage. */
  readonly alpha: number;
  /** Matrix blocks of a double-porosity aquifer (none when omitted); see blockStorageTerm. */
  readonly blocks?: MatrixBlocks;
}

/** Matrix blocks feeding the fractures (Moench 1984): storativity, diffusion rate, fracture skin and shape. */
export interface MatrixBlocks {
  /** Storativity of the blocks over the aquifer thickness, Sm (1). */
  readonly Sm: number;
  /** Block diffusion rate Km / (Ssm a^2), 1/d (a the half-thickness of a slab or the radius of a sphere). */
  readonly rate: number;
  /** Fracture skin sf = Km bs / (Ks a) (1, >= 0). */
  readonly skin: number;
  readonly shape: "slab" | "sphere";
}

/**
 * Laplace-domain storage term of the matrix blocks, Sm p F(p) (1/d), added to S p: with eta = sqrt(p / rate),
 *   slab:    F = tanh(eta) / (eta (1 + sf eta tanh eta)),
 *   sphere:  F = 3 (eta coth eta - 1) / (eta^2 (1 + sf (eta coth eta - 1))),
 * from transient diffusion into blocks whose faces see the fracture head through a thin skin (Moench 1984,
 * WRR 20(7), 831-846; re-derived: block head A cosh(omega x) or A sinh(omega x)/x, flux balance at the face).
 * F -> 1 as p -> 0 (blocks in equilibrium: total storativity S + Sm); F -> 0 as p -> infinity.
 */
export function blockStorageTerm(p: number, blocks: MatrixBlocks): number {
  const eta = Math.sqrt(p / blocks.rate);
  let F: number;
  if (blocks.shape === "slab") {
    const th = Math.tanh(eta);
    F = eta < 1e-4 ? 1 - (eta * eta) / 3 : th / (eta * (1 + blocks.skin * eta * th));
  } else {
    // eta coth eta - 1 = eta^2 / 3 - eta^4 / 45 + ... for small eta.
    const g = eta < 1e-3 ? (eta * eta) / 3 - (eta * eta * eta * eta) / 45 : eta / Math.tanh(eta) - 1;
    F = (3 * g) / (eta * eta * (1 + blocks.skin * g));
  }
  return blocks.Sm * p * F;
}

/** The well: radius rw (m; 0 for a line source), casing radius rc (m) and skin Sk (1). */
export interface ModeWell {
  readonly rw: number;
  readonly rc: number;
  readonly skin: number;
}

/** Difference sin(e u) - sin(e v) as 2 cos(e (u + v) / 2) sin(e (u - v) / 2), accurate for small e. */
function sinDifference(e: number, u: number, v: number): number {
  return 2 * portableCos(0.5 * e * (u + v)) * portableSin(0.5 * e * (u - v));
}

/** c_n of the module comment for eigenvalue e (> 0), screen zetaA..zetaB, thickness b; 1/m. */
function screenCoefficient(e: number, g: VerticalGeometry): number {
  const L = g.zetaB - g.zetaA;
  return (4 * sinDifference(e, g.zetaB / g.b, g.zetaA / g.b)) / (L * (2 * e + portableSin(2 * e)));
}

/** o_n of the module comment for eigenvalue e (> 0): observation average or piezometer value; dimensionless. */
function observationCoefficient(e: number, g: VerticalGeometry, screen: boolean): number {
  const o = g.observation;
  if (screen) return (g.b * sinDifference(e, g.zetaB / g.b, g.zetaA / g.b)) / ((g.zetaB - g.zetaA) * e);
  if ("zeta" in o) return portableCos((e * o.zeta) / g.b);
  return (g.b * sinDifference(e, o.zeta2 / g.b, o.zeta1 / g.b)) / ((o.zeta2 - o.zeta1) * e);
}

/**
 * c_n o_n (1/m) of a water-table mode n >= 1 (e >= pi, e tan e = gamma), with sin 2e = 2 gamma e / (e^2 +
 * gamma^2) from tan e = gamma / e and the sine differences taken directly (no cancellation for e >= pi):
 * two or four sines per term instead of six trigonometric calls.
 */
function waterTableCoefficient(e: number, gamma: number, g: VerticalGeometry, screen: boolean): number {
  const b = g.b;
  const L = g.zetaB - g.zetaA;
  const d = portableSin((e * g.zetaB) / b) - portableSin((e * g.zetaA) / b);
  const c = (4 * d) / (L * (2 * e + (2 * gamma * e) / (e * e + gamma * gamma)));
  if (screen) return (c * b * d) / (L * e);
  const o = g.observation;
  if ("zeta" in o) return c * portableCos((e * o.zeta) / b);
  return (c * b * (portableSin((e * o.zeta2) / b) - portableSin((e * o.zeta1) / b))) / ((o.zeta2 - o.zeta1) * e);
}

/** Upper bound of |c_n o_n| for eigenvalue e >= pi (used in the tail bound); 1/m. */
function coefficientEnvelope(e: number, g: VerticalGeometry, screen: boolean): number {
  const L = g.zetaB - g.zetaA;
  const cBound = 8 / (L * (2 * e - 1));
  const o = g.observation;
  const lo = screen ? L : "zeta" in o ? 0 : o.zeta2 - o.zeta1;
  const oBound = lo > 0 ? Math.min(1, (2 * g.b) / (lo * e)) : 1;
  return cBound * oBound;
}

/** K0(x) / (x K1(x)) for x > 0, with scaled Bessel functions. */
function wellFaceRatio(x: number): number {
  return besselK0e(x) / (x * besselK1e(x));
}

/** G_n(r) of the module comment for radial wavenumber q (1/m). */
function radialFactor(q: number, r: number, rw: number): number {
  if (rw === 0) return besselK0(q * r);
  const x = q * rw;
  if (r === rw) return wellFaceRatio(x);
  return (besselK0e(q * r) * Math.exp(-q * (r - rw))) / (x * besselK1e(x));
}

/**
 * Precomputed tail of the pumped-well series on confined modes at p = 0 for one kappa: suffix[N] is
 * sum_{n > N} c_n o_n g(k n rw), suffixSlope[N] the same with dg/dy at y = k^2 n^2 (m^2), N = 0..DIRECT_CAP.
 */
interface PumpedTail {
  readonly kappa: number;
  readonly suffix: Float64Array;
  readonly suffixSlope: Float64Array;
  /** Same with d2g/dy2 / 2 (m^4): the second order in m^2. */
  readonly suffixCurvature: Float64Array;
  /** Same with (d(c_n o_n)/d eps at eps = n pi) / (n pi) in place of c_n o_n: the first order in gamma. */
  readonly suffixDelta: Float64Array;
  /** Bound of the neglected terms beyond the precomputed range, 1/m. */
  readonly neglected: number;
}

/**
 * First and second derivatives of g in y = q^2 at x = q rw, written to out[0], out[1]: with R = K0/K1,
 * g' = (R^2 - 1) / x, R' = R^2 + R / x - 1, g'' = 2 R R' / x - (R^2 - 1) / x^2, and
 * dg/dy = g' x / (2 y), d2g/dy2 = (g'' x^2 - g' x) / (4 y^2).
 */
function wellFaceSlopes(q: number, rw: number, out: Float64Array): void {
  const x = q * rw;
  const R = besselK0e(x) / besselK1e(x);
  const g1 = (R * R - 1) / x;
  const dR = R * R + R / x - 1;
  const g2 = (2 * R * dR) / x - (R * R - 1) / (x * x);
  const y = q * q;
  out[0] = (g1 * x) / (2 * y);
  out[1] = (g2 * x * x - g1 * x) / (4 * y * y);
}

function buildPumpedTail(kappa: number, g: VerticalGeometry, rw: number): PumpedTail {
  const k = (Math.PI * Math.sqrt(kappa)) / g.b;
  const last = Math.max(20000, Math.ceil(40 / (k * rw)), DIRECT_CAP + 1);
  const suffix = new Float64Array(DIRECT_CAP + 1);
  const suffixSlope = new Float64Array(DIRECT_CAP + 1);
  const suffixDelta = new Float64Array(DIRECT_CAP + 1);
  const suffixCurvature = new Float64Array(DIRECT_CAP + 1);
  const slopes = new Float64Array(2);
  let s3 = 0;
  const L = g.zetaB - g.zetaA;
  const ua = g.zetaA / g.b;
  const ub = g.zetaB / g.b;
  let s0 = 0;
  let s1 = 0;
  let s2 = 0;
  for (let n = last; n >= 1; n--) {
    const e = n * Math.PI;
    // c_n o_n = 4 b D^2 / (L^2 e (2 e + sin 2e)) with D = sin(e u_b) - sin(e u_a); at e = n pi its derivative
    // is (4 b / L^2) (D D' / e^2 - 3 D^2 / (2 e^3)), D' = u_b cos(e u_b) - u_a cos(e u_a).
    const D = portableSin(e * ub) - portableSin(e * ua);
    const dD = ub * portableCos(e * ub) - ua * portableCos(e * ua);
    const a = (2 * g.b * D * D) / (L * L * e * e);
    const da = ((4 * g.b) / (L * L)) * ((D * dD) / (e * e) - (1.5 * D * D) / (e * e * e));
    const q = k * n;
    const ratio = wellFaceRatio(q * rw);
    s0 += a * ratio;
    wellFaceSlopes(q, rw, slopes);
    s1 += a * slopes[0]!;
    s3 += 0.5 * a * slopes[1]!;
    s2 += (da / e) * ratio;
    if (n - 1 <= DIRECT_CAP) {
      suffix[n - 1] = s0;
      suffixSlope[n - 1] = s1;
      suffixDelta[n - 1] = s2;
      suffixCurvature[n - 1] = s3;
    }
  }
  // Terms beyond `last`: |c_n o_n| <= envelope(n pi), which falls like 1/n^2, and g(x) < 1/x, so their sum is
  // below envelope(last pi) last^2 / (k rw) sum_{n > last} 1/n^3 < envelope(last pi) / (2 k rw).
  const neglected = coefficientEnvelope(last * Math.PI, g, true) / (2 * k * rw);
  return { kappa, suffix, suffixSlope, suffixCurvature, suffixDelta, neglected };
}

/** Evaluates the mode sums of one configuration; one instance per bound model (caches the pumped tail). */
export class VerticalModeSeries {
  private tail: PumpedTail | null = null;
  /** c_n o_n of the confined modes (eps_n = n pi), index n, grown on demand: observation and screen average. */
  private confinedObservation = new Float64Array(0);
  private confinedScreen = new Float64Array(0);

  constructor(readonly geometry: VerticalGeometry, readonly well: ModeWell) {}

  /** c_n o_n of confined mode n >= 1 (1/m), from the cache. */
  private confinedCoefficient(n: number, screen: boolean): number {
    let table = screen ? this.confinedScreen : this.confinedObservation;
    if (n >= table.length) {
      const grown = new Float64Array(Math.max(64, 2 * n + 1));
      grown.set(table);
      for (let j = Math.max(1, table.length); j < grown.length; j++) {
        const e = j * Math.PI;
        grown[j] = screenCoefficient(e, this.geometry) * observationCoefficient(e, this.geometry, screen);
      }
      table = grown;
      if (screen) this.confinedScreen = grown;
      else this.confinedObservation = grown;
    }
    return table[n]!;
  }

  /** True when pumping screen and observation span the full thickness (only mode 0 of a confined aquifer). */
  get fullScreens(): boolean {
    const g = this.geometry;
    const o = g.observation;
    return g.zetaA === 0 && g.zetaB === g.b && !("zeta" in o) && o.zeta1 === 0 && o.zeta2 === g.b;
  }

  /**
   * sum_n c_n o_n G_n(r) (1/m) at real p > 0 (1/d): with `pumped` the screen average at the well face
   * (r = rw), else the observation of the geometry at r (m).
   */
  modeSum(p: number, aq: ModeAquifer, r: number, pumped: boolean, direct?: number): number {
    const g = this.geometry;
    const { rw } = this.well;
    const b = g.b;
    const m2 = (aq.S * p + aq.lambda + (aq.blocks ? blockStorageTerm(p, aq.blocks) : 0)) / aq.T;
    const kz = aq.kappa / (b * b);
    const waterTable = aq.Sy > 0;
    const gamma = waterTable
      ? ((aq.Sy * b * b * p) / (aq.kappa * aq.T)) * (aq.alpha === Infinity ? 1 : aq.alpha / (aq.alpha + p))
      : 0;
    const confinedFull = !waterTable && (pumped ? g.zetaA === 0 && g.zetaB === b : this.fullScreens);
    // Mode 0.
    let sum: number;
    let e = 0;
    if (waterTable) {
      e = neumanRoot(0, gamma, firstRootGuess(gamma));
      const q = Math.sqrt(m2 + kz * e * e);
      sum = screenCoefficient(e, g) * observationCoefficient(e, g, pumped) * radialFactor(q, r, rw);
    } else {
      sum = radialFactor(Math.sqrt(m2), r, rw) / b;
    }
    if (confinedFull) return sum;
    const rEff = pumped ? rw : r;
    if (pumped && rw > 0) return sum + this.pumpedModes(m2, kz, gamma, waterTable, e, aq.kappa, direct ?? this.directTerms(p, aq));
    // Away from the pumped well: direct sum with the geometric tail bound.
    let previous = Number.NaN;
    for (let n = 1; n <= OBSERVATION_CAP; n++) {
      e = waterTable ? neumanNextRoot(n, gamma, e) : n * Math.PI;
      const q = Math.sqrt(m2 + kz * e * e);
      const G = radialFactor(q, rEff, rw);
      const a = waterTable ? waterTableCoefficient(e, gamma, g, false) : this.confinedCoefficient(n, false);
      sum += a * G;
      if (G === 0) return sum;
      if (n > 1) {
        const rho = G / previous;
        if (rho < 1 && (coefficientEnvelope(e, g, false) * G * rho) / (1 - rho) <= SERIES_TOLERANCE * Math.abs(sum)) return sum;
      }
      previous = G;
    }
    return sum;
  }

  /**
   * Terms summed directly in the pumped-well series at Laplace variable p (1/d): N of the module comment.
   * An inversion should take the N of its largest p for all its p: the tail approximation then changes
   * smoothly with p, whereas a jump in N between neighbouring p is a jump of its (tiny) error, which
   * Stehfest's alternating weights would amplify by about 1e5.
   */
  directTerms(p: number, aq: ModeAquifer): number {
    const b = this.geometry.b;
    const m = Math.sqrt((aq.S * p + aq.lambda + (aq.blocks ? blockStorageTerm(p, aq.blocks) : 0)) / aq.T);
    const k = (Math.PI * Math.sqrt(aq.kappa)) / b;
    const gamma =
      aq.Sy > 0 ? ((aq.Sy * b * b * p) / (aq.kappa * aq.T)) * (aq.alpha === Infinity ? 1 : aq.alpha / (aq.alpha + p)) : 0;
    return Math.min(DIRECT_CAP, Math.max(40, Math.ceil((3 * m) / k), Math.ceil((16 * gamma) / Math.PI)));
  }

  /** Modes n >= 1 of the pumped-well screen average: `direct` terms, then the precomputed confined tail. */
  private pumpedModes(m2: number, kz: number, gamma: number, waterTable: boolean, e0: number, kappa: number, direct: number): number {
    const g = this.geometry;
    const { rw } = this.well;
    let e = e0;
    let sum = 0;
    for (let n = 1; n <= direct; n++) {
      e = waterTable ? neumanNextRoot(n, gamma, e) : n * Math.PI;
      const q = Math.sqrt(m2 + kz * e * e);
      const a = waterTable ? waterTableCoefficient(e, gamma, g, true) : this.confinedCoefficient(n, true);
      sum += a * wellFaceRatio(q * rw);
    }
    if (this.tail === null || this.tail.kappa !== kappa) this.tail = buildPumpedTail(kappa, g, rw);
    // Water-table modes: eps_n = n pi + delta_n with eps_n delta_n -> gamma, so kappa eps_n^2 / b^2 exceeds the
    // confined value by 2 kappa gamma / b^2 (to O(1/n^2)): a shift of q^2 taken with the first-order term.
    // The coefficients change to first order by delta_n d(c_n o_n)/d eps with delta_n ~ gamma / (n pi).
    const tail = this.tail;
    if (!waterTable) return sum + tail.suffix[direct]! + m2 * tail.suffixSlope[direct]! + m2 * m2 * tail.suffixCurvature[direct]!;
    const shift = m2 + 2 * kz * gamma;
    return (
      sum + tail.suffix[direct]! + shift * tail.suffixSlope[direct]! + shift * shift * tail.suffixCurvature[direct]! +
      gamma * tail.suffixDelta[direct]!
    );
  }

  /** Bound of the pumped-well terms neglected beyond the precomputed tail for this kappa, 1/m. */
  neglectedTail(kappa: number): number {
    if (this.tail === null || this.tail.kappa !== kappa) this.tail = buildPumpedTail(kappa, this.geometry, this.well.rw);
    return this.tail.neglected;
  }
}

/**
 * Laplace transform of the drawdown (m d) at real p > 0 (1/d) for discharge Q (m3/d): in the pumped well when
 * `pumped`, else at distance r (m) for the observation of the series' geometry; see the module comment.
 * `direct` fixes the number of directly summed pumped-well terms (see VerticalModeSeries.directTerms).
 */
export function modeDrawdownTransform(
  series: VerticalModeSeries,
  aq: ModeAquifer,
  Q: number,
  r: number,
  pumped: boolean,
  p: number,
  direct?: number,
): number {
  const { rc, skin, rw } = series.well;
  const g = series.geometry;
  const L = g.zetaB - g.zetaA;
  const scale = g.b / (2 * Math.PI * aq.T);
  const needPhi = pumped || rc > 0;
  const phi = needPhi ? scale * (series.modeSum(p, aq, rw, true, direct) + skin / L) : 0;
  const qa = Q / p / (1 + Math.PI * rc * rc * p * phi);
  if (pumped) return qa * phi;
  return qa * scale * series.modeSum(p, aq, r, false);
}
