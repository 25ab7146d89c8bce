/**
 * When well-bore storage stops mattering in the pumped well, checked against the Papadopulos-Cooper (1967)
 * solution itself rather than a rule of thumb.
 *
 * The rule usually quoted, t > 25 rc^2 / T (Papadopulos and Cooper 1967, from memory), is not the time at which
 * the pumped-well drawdown meets the Theis curve: by mpmath inversion of the Papadopulos-Cooper transform
 * (tests/fixtures/wellbore/generate_storage_time.py, Talbot at 30 digits, checked against de Hoog) the drawdown at
 * 25 rc^2/T is still 1.9 % (alpha = rw^2 S/rc^2 = 0.1) to 3.2 % (alpha = 1e-7) below Theis at r = rw; at
 * 60 rc^2/T it is 0.8 to 1.0 % below; it comes within 1 % at 46 (alpha = 0.1) to 58 (alpha = 1e-7) rc^2/T, and
 * the gap falls roughly as 0.5 rc^2/(T t) (gap times T t/rc^2: 0.46 to 0.58 at 60 rc^2/T, 0.45 to 0.50 at
 * 1000 rc^2/T). `wellboreStorageTime` (tested against those times within 1 % in
 * packages/aquifer/test/wellbore-storage-time.test.ts) finds, for the actual T, S, rc, rw and skin, the
 * earliest time after which the gap stays below a tolerance (default 1 %), by bisection in ln t on the
 * library's Papadopulos-Cooper model against Theis at rw plus the skin drawdown Q Sk/(2 pi T).
 */
import { expint1 } from "../special/index.js";
import { checkScalar } from "./checks.js";
import { papadopulosCooperModel, type WellboreGeometry } from "./papadopulos-cooper.js";

/** Result of {@link wellboreStorageTime}. */
export interface WellboreStorageTime {
  /** Earliest time (d) from which the pumped-well drawdown is within `tolerance` of Theis at rw (plus skin). */
  readonly time: number;
  /** The same time as a multiple of rc^2/T. */
  readonly multipleOfRc2OverT: number;
  /** Relative gap 1 - s_PC/s_Theis at 25 rc^2/T (the rule of thumb), for these parameters. */
  readonly gapAtRuleOfThumb: number;
  readonly tolerance: number;
}

/**
 * Earliest time t (d) after which the Papadopulos-Cooper pumped-well drawdown for T (m2/d), S (1) and the well
 * (rc, rw in m, skin) lies within `tolerance` (relative, default 0.01) of the Theis drawdown at r = rw plus
 * Q Sk/(2 pi T), found by bisection in ln t between 1e-3 and 1e6 rc^2/T (to 0.1 % in t). Also the gap at the
 * rule-of-thumb time 25 rc^2/T. Source: see the module comment.
 */
export function wellboreStorageTime(T: number, S: number, well: WellboreGeometry, tolerance = 0.01): WellboreStorageTime {
  const where = "wellboreStorageTime";
  checkScalar(where, "transmissivity T", T, "m2/d", true);
  checkScalar(where, "storativity S", S, "1", true);
  checkScalar(where, "tolerance", tolerance, "1", true);
  const model = papadopulosCooperModel(well);
  const { rc, rw, skin } = model.well;
  const scale = rc > 0 ? (rc * rc) / T : (rw * rw) / T;
  const gap = (t: number): number => {
    const pc = model.drawdown([T, S], { r: rw, Q: 1 }, [t])[0]!;
    const theis = expint1((rw * rw * S) / (4 * T * t)) / (4 * Math.PI * T) + skin / (2 * Math.PI * T);
    return 1 - pc / theis;
  };
  let lo = Math.log(1e-3 * scale);
  let hi = Math.log(1e6 * scale);
  if (Math.abs(gap(Math.exp(lo))) <= tolerance) hi = lo;
  while (hi - lo > 1e-3) {
    const mid = 0.5 * (lo + hi);
    if (Math.abs(gap(Math.exp(mid))) <= tolerance) hi = mid;
    else lo = mid;
  }
  const time = Math.exp(hi);
  return { time, multipleOfRc2OverT: time / scale, gapAtRuleOfThumb: gap(25 * scale), tolerance };
}
