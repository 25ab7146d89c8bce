/**
 * Transmissivity from the specific capacity of a pumped well, by the Theis (1935) solution evaluated at the
 * well radius: Q / s = 4 pi T / W(u),  u = rw^2 S / (4 T t), solved for T by Newton's method in ln T on the
 * branch u < 0.5 (Q/s rises with T only while u is below about 0.6; above, the pumping time is too short for
 * the relation to say anything about T). The Cooper-Jacob form of the same relation is the one usually tabulated
 * (Theis 1963, USGS Water-Supply Paper 1536-I, 332-336).
 */
import { expint1 } from "../special/index.js";
import { StepTestInputError } from "./errors.js";

/** Result of transmissivityFromSpecificCapacity. */
export interface SpecificCapacityEstimate {
  /** Transmissivity, m2/d. */
  readonly T: number;
  /** u = rw^2 S / (4 T t) at the solution (dimensionless). */
  readonly u: number;
  /** Limits of the estimate, for the report. */
  readonly notes: string[];
}

/**
 * Transmissivity (m2/d) from specific capacity Q/s (m2/d, i.e. m3/d per m of drawdown) after pumping time t (d),
 * well radius rw (m) and an assumed storativity S (1), by the Theis solution at r = rw (module comment).
 * The result is a lower bound of the aquifer T when the drawdown includes well losses, partial penetration
 * or skin (these all lower Q/s); S enters only logarithmically, so an order-of-magnitude S is enough.
 * @throws StepTestInputError for non-positive or non-finite inputs.
 */
export function transmissivityFromSpecificCapacity(
  specificCapacity: number,
  t: number,
  rw: number,
  S: number,
): SpecificCapacityEstimate {
  const check = (name: string, v: number, unit: string): void => {
    if (!(v > 0 && Number.isFinite(v))) throw new StepTestInputError(`Specific capacity: ${name} is ${v} ${unit}; it must be a finite number > 0.`);
  };
  check("specific capacity Q/s", specificCapacity, "m2/d");
  check("pumping time t", t, "d");
  check("well radius rw", rw, "m");
  check("storativity S", S, "");
  // f(ln T) = ln(4 pi T / W(u)) - ln(Q/s); df/dlnT = 1 - (dW/dlnT)/W = 1 - e^-u / W (since dW/du = -e^-u/u, du/dlnT = -u).
  let lnT = Math.log(specificCapacity);
  let u = 0;
  for (let i = 0; i < 100; i++) {
    const T = Math.exp(lnT);
    u = (rw * rw * S) / (4 * T * t);
    const W = expint1(u);
    const f = Math.log((4 * Math.PI * T) / W) - Math.log(specificCapacity);
    const step = f / (1 - Math.exp(-u) / W);
    lnT -= step;
    // Stay on the physical branch u < 0.5: T >= rw^2 S / (2 t).
    lnT = Math.max(lnT, Math.log((rw * rw * S) / (2 * t)));
    if (Math.abs(step) < 1e-14) break;
  }
  const T = Math.exp(lnT);
  u = (rw * rw * S) / (4 * T * t);
  const notes = [
    "Theis solution at the well radius: no well loss, skin or partial penetration; each of these lowers Q/s, so T is underestimated.",
    "S was assumed; T changes little with S (a factor 10 in S changes T by roughly 10-20 % here).",
  ];
  if (u >= 0.5 * (1 - 1e-12)) {
    throw new StepTestInputError(
      `Specific capacity: Q/s = ${specificCapacity} m2/d after ${t} d cannot be matched with u < 0.5 at rw = ${rw} m and S = ${S}; ` +
        "the pumping time is too short or the values are inconsistent.",
    );
  }
  if (u > 0.01) notes.push(`u = ${u.toPrecision(2)} > 0.01 at the well: the pumping time is short for the estimate.`);
  return { T, u, notes };
}
