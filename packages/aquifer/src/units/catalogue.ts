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
 * - Imperial (UK, Canadian) gallon = 4.54609 L exactly (NIST SP 811 B.8 lists "gallon [Canadian and U.K.
 *   (Imperial)]" as 4.546 09 E-03 m³; the UK Weights and Measures Act 1985 defines it, from memory).
 * - megalitre ML = 1e6 L = 1000 m³ (SI prefix, NIST SP 811 sec. 4.3); million gallons per day (MGD) = 1e6 US
 *   gal/d (trade usage in the US, common practice, no source).
 * - darcy = 9.869233e-13 m² (NIST SP 811 B.8: darcy 9.869 233 E-13 m²), millidarcy mD = 1e-3 darcy: the
 *   intrinsic permeability k of the petroleum trade (an area, not a conductivity: K = k rho g / mu).
 *
 * Gallons must say which: 'gal', 'gallon', 'gpm', 'gpd' and 'MGD' alone are refused as ambiguous (US or
 * imperial), with the spellings to write instead ('US gpm', 'imp gpm', 'US gal/min', 'imp gal/d', ...).
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
const IMPERIAL_GALLON = 4.54609e-3;
const DARCY = 9.869233e-13;
const STANDARD_GRAVITY = 9.80665;
const KILOGRAM = 1 / (86400 * 86400);
const POUND_FORCE = 0.45359237 * STANDARD_GRAVITY;
const METRE_OF_WATER = 1000 * STANDARD_GRAVITY;

const { length, time, area, volume, discharge, pressure } = DIMENSIONS;
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
  entry(["ML"], "megalitre (1000 m³)", volume, 1000),
  entry(["US gal"], "US liquid gallon (231 in³; NIST Handbook 44)", volume, US_GALLON),
  entry(["imp gal", "UK gal"], "imperial gallon (4.54609 L; NIST SP 811 B.8)", volume, IMPERIAL_GALLON),

  entry(["US gpm"], "US gallon per minute", discharge, US_GALLON / MINUTE),
  entry(["US gpd"], "US gallon per day", discharge, US_GALLON),
  entry(["US MGD"], "US million gallons per day", discharge, 1e6 * US_GALLON),
  entry(["imp gpm", "UK gpm"], "imperial gallon per minute", discharge, IMPERIAL_GALLON / MINUTE),
  entry(["imp gpd", "UK gpd"], "imperial gallon per day", discharge, IMPERIAL_GALLON),
  entry(["cfs"], "cubic foot per second", discharge, FOOT * FOOT * FOOT * 86400),

  entry(["darcy"], "darcy (intrinsic permeability; NIST SP 811 B.8)", area, DARCY),
  entry(["mD"], "millidarcy", area, 1e-3 * DARCY),

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
export const AMBIGUOUS: Readonly<Record<string, { readonly advice: string; readonly instead: readonly string[] }>> = Object.freeze({
  gal: { advice: "'gal' is ambiguous (US or imperial gallon): write 'US gal' (231 in³ = 3.785411784 L) or 'imp gal' (4.54609 L)", instead: ["US gal", "imp gal"] },
  gallon: { advice: "'gallon' is ambiguous (US or imperial gallon): write 'US gal' (231 in³ = 3.785411784 L) or 'imp gal' (4.54609 L)", instead: ["US gal", "imp gal"] },
  gpm: { advice: "'gpm' is ambiguous (US or imperial gallons per minute): write 'US gpm' (3.785411784 L/min) or 'imp gpm' (4.54609 L/min)", instead: ["US gpm", "imp gpm"] },
  gpd: { advice: "'gpd' is ambiguous (US or imperial gallons per day): write 'US gpd' or 'imp gpd' (and 'US gpd/ft' for transmissivity)", instead: ["US gpd", "imp gpd"] },
  MGD: { advice: "'MGD' is ambiguous (US or imperial million gallons per day): write 'US MGD' (1e6 US gal/d)", instead: ["US MGD"] },
  mgd: { advice: "'mgd' is ambiguous (US or imperial million gallons per day): write 'US MGD' (1e6 US gal/d)", instead: ["US MGD"] },
  Mgal: { advice: "'Mgal' (million gallons) is ambiguous (US or imperial): write 'US MGD' for US million gallons per day, or 'ML/d' for megalitres per day", instead: ["US MGD", "ML/d"] },
});
