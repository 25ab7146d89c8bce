/**
 * The unit symbols the parser knows, each with its dimension and its factor to the library's base units.
 *
 * Base units: metre (m) and day (d); the mass unit is 86400² kg, chosen so that the base unit of pressure,
 * M L^-1 T^-2, is exactly 1 Pa (kg·m^-1·s^-2 = 86400² kg · m^-1 · d^-2) and the base unit of force is exactly
 * 1 N. So discharge is in m3/d, transmissivity m2/d, hydraulic conductivity m/d, leakance 1/d, pressure Pa.
 *
 * Defining values (all exact by definition):
 * - foot = 0.3048 m, inch = 0.0254 m (international foot and inch; NIST SP 811 (2008) App. B.8).
 * - US liquid gallon = 231 in³ = 3.785411784 L (NIST Handbook 44 App. C, from memory; consistent with
 *   NIST SP 811 B.8, which lists 3.785 412 E-03 m³).
 * - litre = 1e-3 m³ (NIST SP 811 B.8); day = 86400 s, hour = 3600 s, minute = 60 s (SP 811 B.8).
 * - pound (avoirdupois) = 0.45359237 kg; pound-force = 1 lb × g_n with g_n = 9.80665 m/s², which gives
 *   4.4482216152605 N; psi = lbf/in² = 6894.75729316836134 Pa (SP 811 B.8 lists 6.894 757 E+03 Pa).
 * - bar = 1e5 Pa (SP 811 B.8).
 * - Water-column units are the conventional ones of SP 811 B.8 ("..., conventional (mmH2O)" etc.):
 *   height × 1000 kg/m³ × g_n, so 1 mH2O = 9806.65 Pa and 1 ftH2O = 0.3048 × 9806.65 = 2989.06692 Pa.
 *   They are exact and temperature-free. SP 811 also lists water at 4 °C (1 cmH2O = 98.0638 Pa, 0.003 % less)
 *   and, for inches, at 60 °F (1 inH2O = 248.84 Pa, 0.1 % less). The conventional value is chosen because it is
 *   exact and is the one SP 811 attaches the symbols ftH2O, inH2O, cmH2O and mmH2O to; readings from an
 *   instrument calibrated to another water temperature differ by the fraction above and should be rescaled by
 *   the instrument's own factor.
 */
import { DIMENSIONS } from "./dimension.js";
import type { DimensionVector } from "./dimension.js";

/** One entry of the catalogue: a named unit, every spelling it is accepted under, and its factor. */
export interface CatalogueEntry {
  /** Spellings accepted by the parser; the first is the preferred one. */
  readonly symbols: readonly string[];
  /** What the unit is, in words, for listings and help. */
  readonly name: string;
  readonly dimension: DimensionVector;
  /** Value of one of this unit in the library's base units. */
  readonly factor: number;
}

const FOOT = 0.3048;
const INCH = 0.0254;
const SECOND = 1 / 86400;
const MINUTE = 1 / 1440;
const US_GALLON = 3.785411784e-3;
const STANDARD_GRAVITY = 9.80665;
const KILOGRAM = 1 / (86400 * 86400);
const POUND_FORCE = 0.45359237 * STANDARD_GRAVITY;
const METRE_OF_WATER = 1000 * STANDARD_GRAVITY;

const { length, time, volume, discharge, pressure } = DIMENSIONS;
const mass: DimensionVector = Object.freeze({ L: 0, T: 0, M: 1 });
const force: DimensionVector = Object.freeze({ L: 1, T: -2, M: 1 });

function entry(symbols: string[], name: string, dimension: DimensionVector, factor: number): CatalogueEntry {
  return Object.freeze({ symbols: Object.freeze(symbols), name, dimension, factor });
}

/** Every atomic unit the parser accepts. Compound units (m3/d, ft2/d, gpd/ft) are built from these. */
export const CATALOGUE: readonly CatalogueEntry[] = Object.freeze([
  entry(["m"], "metre", length, 1),
  entry(["cm"], "centimetre", length, 0.01),
  entry(["mm"], "millimetre", length, 0.001),
  entry(["km"], "kilometre", length, 1000),
  entry(["ft"], "foot", length, FOOT),
  entry(["in"], "inch", length, INCH),

  entry(["s"], "second", time, SECOND),
  entry(["min"], "minute", time, MINUTE),
  entry(["h", "hr"], "hour", time, 1 / 24),
  entry(["d", "day", "days"], "day", time, 1),

  entry(["L", "l"], "litre", volume, 1e-3),
  entry(["US gal"], "US liquid gallon (231 in³)", volume, US_GALLON),

  entry(["gpm"], "US gallon per minute", discharge, US_GALLON / MINUTE),
  entry(["gpd"], "US gallon per day", discharge, US_GALLON),
  entry(["cfs"], "cubic foot per second", discharge, FOOT * FOOT * FOOT * 86400),

  entry(["kg"], "kilogram", mass, KILOGRAM),
  entry(["N"], "newton", force, 1),
  entry(["lbf"], "pound-force", force, POUND_FORCE),

  entry(["Pa"], "pascal", pressure, 1),
  entry(["hPa"], "hectopascal", pressure, 100),
  entry(["kPa"], "kilopascal", pressure, 1000),
  entry(["MPa"], "megapascal", pressure, 1e6),
  entry(["bar"], "bar", pressure, 1e5),
  entry(["mbar"], "millibar", pressure, 100),
  entry(["psi"], "pound-force per square inch", pressure, POUND_FORCE / (INCH * INCH)),
  entry(["mH2O", "m H2O", "m of water"], "metre of water, conventional", pressure, METRE_OF_WATER),
  entry(["cmH2O", "cm H2O", "cm of water"], "centimetre of water, conventional", pressure, 0.01 * METRE_OF_WATER),
  entry(["ftH2O", "ft H2O", "ft of water"], "foot of water, conventional", pressure, FOOT * METRE_OF_WATER),
  entry(["inH2O", "in H2O", "in of water"], "inch of water, conventional", pressure, INCH * METRE_OF_WATER),
]);

/**
 * Spellings that are refused on purpose because they are ambiguous, with the advice shown to the user.
 */
export const AMBIGUOUS: Readonly<Record<string, string>> = Object.freeze({
  gal: "'gal' is ambiguous (US or imperial gallon): write 'US gal' for the US gallon of 231 in³",
  gallon: "'gallon' is ambiguous (US or imperial gallon): write 'US gal' for the US gallon of 231 in³",
});
