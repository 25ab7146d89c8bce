/**
 * Reading decimal numbers from CSV fields, with a decimal point or a decimal comma. Deliberately strict:
 * no thousands separators and no locale guessing, because "1.234" means 1.234 or 1234 depending on the
 * writer, and a wrong guess silently scales the data by 1000.
 */

/** Result of reading one field as a number. */
export type DecimalReading =
  | { readonly ok: true; readonly value: number }
  | { readonly ok: false; readonly reason: string };

const DECIMAL_POINT = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;
const DECIMAL_COMMA = /^[+-]?(?:\d+(?:,\d*)?|,\d+)(?:[eE][+-]?\d+)?$/;

/**
 * Reads a field as a finite decimal number. Surrounding spaces are ignored. With `decimalComma` the
 * fraction is separated by ',' ("0,45") and a '.' is refused; without it '.' is used and ',' is refused.
 * Exponents ("1.5e-3") are accepted in both modes.
 */
export function readDecimal(text: string, decimalComma: boolean): DecimalReading {
  const trimmed = text.trim();
  if (decimalComma) {
    if (DECIMAL_COMMA.test(trimmed)) return { ok: true, value: Number(trimmed.replace(",", ".")) };
    if (DECIMAL_POINT.test(trimmed)) {
      return { ok: false, reason: `'${text}' uses a decimal point, but decimal commas were expected` };
    }
  } else {
    if (DECIMAL_POINT.test(trimmed)) return { ok: true, value: Number(trimmed) };
    if (DECIMAL_COMMA.test(trimmed)) {
      return { ok: false, reason: `'${text}' uses a decimal comma, but decimal points were expected` };
    }
  }
  return { ok: false, reason: `'${text}' is not a number` };
}

/** What the decimal marks in a set of fields show: only commas, only points, both, or neither. */
export function decimalMarksIn(fields: Iterable<string>): "comma" | "point" | "both" | "none" {
  let comma = false;
  let point = false;
  for (const f of fields) {
    const t = f.trim();
    if (!comma && DECIMAL_COMMA.test(t) && t.includes(",")) comma = true;
    if (!point && DECIMAL_POINT.test(t) && t.includes(".")) point = true;
    if (comma && point) return "both";
  }
  return comma ? "comma" : point ? "point" : "none";
}
