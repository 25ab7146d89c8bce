/**
 * Data of the specialised plots that confirm a flow regime: s against sqrt(t) (linear flow: a straight line
 * through the origin, s = m sqrt(t)), s against t^(1/4) (bilinear flow), the Horner-type recovery plot
 * (residual drawdown against log10((tp + dt)/dt), Theis 1935 recovery), and the composite plot of several
 * observation wells (s against t/r^2, on which wells of one homogeneous aquifer fall on one Theis curve,
 * since u = r^2 S / (4 T t) depends on t/r^2 only). Sources: Theis (1935), Trans. AGU 16(2), 519-524; the
 * plots themselves are common practice, no source.
 */
import { DiagnosticError } from "./errors.js";

/** Points of a specialised plot with the least squares line y = intercept + slope x over the chosen range. */
export interface SpecialisedPlot {
  readonly x: Float64Array;
  readonly y: Float64Array;
  /** Line over the points with x in [fitFrom, fitTo] (all points by default); NaN with fewer than two. */
  readonly slope: number;
  readonly intercept: number;
}

function line(x: Float64Array, y: Float64Array, from: number, to: number): { slope: number; intercept: number } {
  let n = 0;
  let sx = 0;
  let sy = 0;
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < x.length; i++) {
    if (!(x[i]! >= from && x[i]! <= to) || !Number.isFinite(y[i]!)) continue;
    n++;
    sx += x[i]!;
    sy += y[i]!;
    sxx += x[i]! * x[i]!;
    sxy += x[i]! * y[i]!;
  }
  const d = n * sxx - sx * sx;
  if (n < 2 || !(d > 0)) return { slope: Number.NaN, intercept: Number.NaN };
  const slope = (n * sxy - sx * sy) / d;
  return { slope, intercept: (sy - slope * sx) / n };
}

function checkPairs(where: string, t: ArrayLike<number>, s: ArrayLike<number>): void {
  if (t.length !== s.length) throw new DiagnosticError(`${where}: ${t.length} times but ${s.length} drawdowns; give one drawdown per time.`);
  for (let i = 0; i < t.length; i++) {
    if (!(t[i]! > 0)) throw new DiagnosticError(`${where}: time ${t[i]} at index ${i} must be > 0.`);
  }
}

/**
 * s against t^power (power 1/2 for linear flow, 1/4 for bilinear), with the line fitted over x = t^power in
 * [fitFrom, fitTo]. Units: x in (time unit)^power, y as s.
 */
export function powerTimePlot(
  t: ArrayLike<number>,
  s: ArrayLike<number>,
  power: number,
  fit: { fitFrom?: number; fitTo?: number } = {},
): SpecialisedPlot {
  checkPairs("powerTimePlot", t, s);
  const x = Float64Array.from(t, (v) => Math.pow(v, power));
  const y = Float64Array.from(s);
  return { x, y, ...line(x, y, fit.fitFrom ?? -Infinity, fit.fitTo ?? Infinity) };
}

/**
 * Horner-type recovery plot: x = log10((tp + dt)/dt), y = residual drawdown s' (as given), for pumping time tp
 * and times dt since the stop (same time unit), with the line fitted for x in [fitFrom, fitTo]. For Theis
 * recovery the line passes near the origin with slope 2.303 Q / (4 pi T) per unit x.
 */
export function hornerPlot(
  tp: number,
  dt: ArrayLike<number>,
  residual: ArrayLike<number>,
  fit: { fitFrom?: number; fitTo?: number } = {},
): SpecialisedPlot {
  if (!(tp > 0)) throw new DiagnosticError(`hornerPlot: pumping time tp = ${tp}; it must be > 0.`);
  checkPairs("hornerPlot", dt, residual);
  const x = Float64Array.from(dt, (v) => Math.log10((tp + v) / v));
  const y = Float64Array.from(residual);
  return { x, y, ...line(x, y, fit.fitFrom ?? -Infinity, fit.fitTo ?? Infinity) };
}

/** One series of the composite plot. */
export interface CompositeSeries {
  readonly name: string;
  /** t / r^2, in (time unit)/m^2. */
  readonly x: Float64Array;
  readonly s: Float64Array;
}

/**
 * Composite plot data: for each well (name, distance r in m, times, drawdowns) the points (t / r^2, s).
 * @throws DiagnosticError for r <= 0 or mismatched lengths.
 */
export function compositePlot(
  wells: readonly { name: string; r: number; t: ArrayLike<number>; s: ArrayLike<number> }[],
): CompositeSeries[] {
  return wells.map((w) => {
    if (!(w.r > 0)) throw new DiagnosticError(`compositePlot: well "${w.name}" has r = ${w.r} m; the distance must be > 0.`);
    checkPairs(`compositePlot (well "${w.name}")`, w.t, w.s);
    return { name: w.name, x: Float64Array.from(w.t, (v) => v / (w.r * w.r)), s: Float64Array.from(w.s) };
  });
}
