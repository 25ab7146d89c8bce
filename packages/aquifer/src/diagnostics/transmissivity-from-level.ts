/**
 * Transmissivity from the level of a flat log derivative: in infinite-acting radial flow the Theis
 * solution gives ds/d ln t = Q/(4 pi T) e^(-u) -> Q/(4 pi T) once u is small, so T = Q / (4 pi level).
 * Source: Theis (1935) differentiated; the Cooper-Jacob (1946) straight line has the same slope per ln t.
 */
import { convert, requireDimension } from "../units/index.js";
import { DiagnosticError } from "./errors.js";

/**
 * T in m2/d from the pumping rate Q (any discharge unit) and the flat derivative level ds/d ln t (any length
 * unit): T = Q / (4 pi level).
 * @throws DiagnosticError when Q or the level is not finite and > 0; UnitError for a unit of the wrong dimension.
 */
export function transmissivityFromDerivativeLevel(
  pumpingRate: { readonly value: number; readonly unit: string },
  level: { readonly value: number; readonly unit: string },
): number {
  requireDimension(pumpingRate.unit, "discharge", "the pumping rate");
  requireDimension(level.unit, "length", "the derivative level");
  const Q = convert(pumpingRate.value, pumpingRate.unit, "m3/d");
  const m = convert(level.value, level.unit, "m");
  if (!(Q > 0) || !Number.isFinite(Q)) throw new DiagnosticError(`pumping rate is ${pumpingRate.value} ${pumpingRate.unit}; give the abstraction rate, > 0`);
  if (!(m > 0) || !Number.isFinite(m)) {
    throw new DiagnosticError(`derivative level is ${level.value} ${level.unit}; T = Q/(4 pi level) needs a level > 0 (a flat, positive derivative)`);
  }
  return Q / (4 * Math.PI * m);
}
