/**
 * Numbers and units as a practitioner writes them, shared by the exported report and any viewer (pure text, no
 * DOM): an estimate rounded to the precision its uncertainty supports, other numbers to four significant
 * digits, a true minus sign, powers of ten as "× 10⁻⁴", and typeset units ("m2/d" as "m²/d", a dimensionless
 * "1" as nothing). The recorded outputs keep full precision; only what is shown is rounded.
 *
 * The rounding rule for an estimate with a standard uncertainty u is the Particle Data Group's (Review of
 * Particle Physics, Phys. Rev. D 98 (2018) 030001, Introduction, section 5.3): if the three highest-order
 * digits of u lie between 100 and 354, u keeps two significant digits; between 355 and 949, one; between
 * 950 and 999, u is rounded up to 1000 and keeps two. The estimate is given to the same decimal place.
 */

/** Significant digits of a number shown without an uncertainty. */
export const DEFAULT_SIGNIFICANT_DIGITS = 4;

/** The rounding rule as one sentence, for a report to state once. */
export const ROUNDING_RULE_TEXT =
  "An estimate with a standard error is rounded to the decimal place of its standard error, which keeps two " +
  "significant digits when its three leading digits are 100 to 354 and one digit otherwise (a leading 950 to 999 " +
  "rounds up to two digits); the 95 % interval is given to the same place (Particle Data Group rule, Review of " +
  "Particle Physics, Phys. Rev. D 98 (2018) 030001, Introduction, section 5.3). A row that gives only a 95 % " +
  "interval is rounded as if its standard error were a quarter of the interval's width. Other numbers are shown " +
  `to ${DEFAULT_SIGNIFICANT_DIGITS} significant digits; whole numbers below one million in full. The document ` +
  "records every number to full double precision, and verification compares full precision.";

const SUPERSCRIPT: Record<string, string> = {
  "0": "⁰", "1": "¹", "2": "²", "3": "³", "4": "⁴", "5": "⁵", "6": "⁶", "7": "⁷", "8": "⁸", "9": "⁹", "-": "⁻",
};

/** The minus sign used in shown numbers (U+2212). */
export const MINUS = "\u2212";

function superscript(text: string): string {
  return [...text].map((c) => SUPERSCRIPT[c] ?? c).join("");
}

/**
 * The decimal place (as a power of ten, 10^k) to which a number with standard uncertainty `u` is given, and
 * `u` rounded there, by the Particle Data Group rule. Undefined when u is not a positive finite number.
 */
export function uncertaintyPlace(u: number): { exponent: number; rounded: number } | undefined {
  if (!(u > 0) || !Number.isFinite(u)) return undefined;
  let e = Math.floor(Math.log10(u));
  let three = Math.round(u / 10 ** (e - 2));
  if (three >= 1000) {
    e += 1;
    three = Math.round(u / 10 ** (e - 2));
  } else if (three < 100) {
    e -= 1;
    three = Math.round(u / 10 ** (e - 2));
  }
  const exponent = three <= 354 ? e - 1 : e;
  return { exponent, rounded: Math.round(u / 10 ** exponent) * 10 ** exponent };
}

/** Digits of |x| rounded to a multiple of 10^k, as an integer string, and the power k. */
function scaledDigits(x: number, k: number): string {
  const a = Math.abs(x);
  const n = k < 0 ? Math.round(a * 10 ** -k) : Math.round(a / 10 ** k);
  return n.toLocaleString("en-US", { useGrouping: false, maximumFractionDigits: 0 });
}

/**
 * `x` written with its last digit at 10^k: "446", "0.0123", "3.503 × 10⁻⁴" (a power of ten below 10⁻³ and from
 * 10⁶ in magnitude, and with `forceExponent` whenever the last digit is left of the units place). `trim` drops
 * trailing zeros after the decimal point. A true minus sign.
 */
export function formatAtPlace(x: number, k: number, trim = false, forceExponent = false): string {
  if (!Number.isFinite(x)) return Number.isNaN(x) ? "not a number" : x > 0 ? "∞" : `${MINUS}∞`;
  const digits = scaledDigits(x, k);
  if (/^0+$/.test(digits)) return "0";
  const sign = x < 0 ? MINUS : "";
  const magnitude = digits.length - 1 + k;
  const exponential = magnitude < -3 || magnitude >= 6 || (forceExponent && k > 0);
  if (exponential) {
    let mantissa = digits.length > 1 ? `${digits[0]}.${digits.slice(1)}` : digits;
    if (trim && mantissa.includes(".")) mantissa = mantissa.replace(/0+$/, "").replace(/\.$/, "");
    return `${sign}${mantissa} × 10${superscript(String(magnitude))}`;
  }
  let plain: string;
  if (k >= 0) plain = digits + "0".repeat(k);
  else {
    const padded = digits.padStart(-k + 1, "0");
    plain = `${padded.slice(0, padded.length + k)}.${padded.slice(padded.length + k)}`;
    if (trim) plain = plain.replace(/0+$/, "").replace(/\.$/, "");
  }
  return sign + plain;
}

/**
 * A number without an uncertainty: whole numbers below a million in full, others to `digits` significant
 * digits (default 4) with trailing zeros dropped.
 */
export function formatPlain(x: number, digits = DEFAULT_SIGNIFICANT_DIGITS): string {
  if (!Number.isFinite(x)) return formatAtPlace(x, 0);
  if (x === 0) return "0";
  if (Number.isInteger(x) && Math.abs(x) < 1e6) return formatAtPlace(x, 0);
  const k = Math.floor(Math.log10(Math.abs(x))) - (digits - 1);
  // Rounding can carry into a new leading digit (9.9996 -> 10.00): take the place from the rounded value.
  const rounded = Math.round(Math.abs(x) / 10 ** k) * 10 ** k;
  const k2 = Math.floor(Math.log10(rounded)) - (digits - 1);
  const place = Math.max(k, k2);
  return formatAtPlace(x, place, true, place > 0);
}

/** An estimate and its standard uncertainty, both rounded by the Particle Data Group rule. */
export interface RoundedEstimate {
  /** The estimate at the uncertainty's decimal place. */
  value: string;
  /** The rounded uncertainty. */
  uncertainty: string;
  /** The decimal place, as the power k of 10^k. */
  exponent: number;
}

/** An estimate with its standard uncertainty; undefined when the uncertainty is not a positive finite number. */
export function formatWithUncertainty(x: number, u: number): RoundedEstimate | undefined {
  const place = uncertaintyPlace(u);
  if (place === undefined || !Number.isFinite(x)) return undefined;
  return { value: formatAtPlace(x, place.exponent), uncertainty: formatAtPlace(place.rounded, place.exponent), exponent: place.exponent };
}

/** True for a unit string that names a dimensionless quantity: empty, "1", "-" or "–". */
export function isDimensionless(unit: string | undefined | null): boolean {
  return unit === undefined || unit === null || /^\s*(1|-|–|—)?\s*$/.test(unit);
}

/**
 * A unit string typeset: a power after a symbol as a superscript ("m2/d" or "m^2/d" as "m²/d", "s^-1" as
 * "s⁻¹"), "*" between symbols as "·"; a dimensionless unit as "" (never "1").
 */
export function typesetUnit(unit: string | undefined | null): string {
  if (isDimensionless(unit)) return "";
  return unit!
    .trim()
    .replace(/([A-Za-zµμΩ°'])\^?\(?(-?\d+)\)?/g, (_, symbol: string, power: string) => symbol + superscript(power))
    .replace(/\s*\*\s*/g, "·");
}

/** "446 ± 6", or with a shared power of ten "(3.503 ± 0.007) × 10⁻⁴". */
function pairText(x: number, u: number, rounded: RoundedEstimate): string {
  if (!rounded.value.includes("×")) return `${rounded.value} ± ${rounded.uncertainty}`;
  const e = Number((/10([⁻⁰¹²³⁴⁵⁶⁷⁸⁹]+)$/.exec(rounded.value)?.[1] ?? "").replace(/./g, (c) => Object.keys(SUPERSCRIPT).find((k) => SUPERSCRIPT[k] === c) ?? c));
  const place = rounded.exponent - e;
  const uRounded = uncertaintyPlace(u)!.rounded;
  return `(${formatAtPlace(x / 10 ** e, place)} ± ${formatAtPlace(uRounded / 10 ** e, place)}) × 10${superscript(String(e))}`;
}

/**
 * A number with its unit for running text: "446 m²/d", "3.503 × 10⁻⁴" (no unit when dimensionless), with
 * "± u" when an uncertainty is given.
 */
export function formatQuantity(x: number, unit?: string | null, uncertainty?: number | null): string {
  const u = typesetUnit(unit);
  const rounded = uncertainty === undefined || uncertainty === null ? undefined : formatWithUncertainty(x, uncertainty);
  const number = rounded ? pairText(x, uncertainty!, rounded) : formatPlain(x);
  return u === "" ? number : `${number} ${u}`;
}
