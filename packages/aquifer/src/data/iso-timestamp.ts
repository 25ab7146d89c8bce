/**
 * ISO 8601 date-times (the extended profile of RFC 3339 section 5.6, with a space allowed in place of 'T'),
 * read by plain arithmetic on the text: the host's time zone never enters. A timestamp without an offset
 * is a local clock reading; it gets an absolute instant only from an offset the caller states.
 */

/** A date-time read from text. */
export interface IsoTimestamp {
  /** Milliseconds since 1970-01-01T00:00:00 of the clock reading, as if the clock kept UTC (a double: about 0.24 µs resolution for dates near 2026). */
  readonly clockMs: number;
  /** Offset from UTC in minutes stated in the text (+60 for "+01:00"), or null when the text gives none. */
  readonly offsetMinutes: number | null;
}

/** Result of reading a timestamp or an offset. */
export type Reading<T> = { readonly ok: true; readonly value: T } | { readonly ok: false; readonly reason: string };

const TIMESTAMP =
  /^(\d{4})-(\d{2})-(\d{2})[Tt ](\d{2}):(\d{2})(?::(\d{2})(?:[.,](\d+))?)?\s*([Zz]|[+-]\d{2}(?::?\d{2})?)?$/;
const OFFSET = /^(?:([Zz])|([+-])(\d{2})(?::?(\d{2}))?)$/;

/** The format the reader accepts, for messages. */
export const TIMESTAMP_FORM = "YYYY-MM-DDThh:mm[:ss[.fff]] with an optional offset Z or ±hh:mm";

/**
 * Days from 1970-01-01 to the given date of the proleptic Gregorian calendar (month 1..12). Algorithm
 * "days_from_civil" of H. Hinnant, "chrono-Compatible Low-Level Date Algorithms" (2013).
 */
export function daysFromCivil(year: number, month: number, day: number): number {
  const y = month <= 2 ? year - 1 : year;
  const era = Math.floor(y / 400);
  const yearOfEra = y - era * 400;
  const shiftedMonth = (month + 9) % 12;
  const dayOfYear = Math.floor((153 * shiftedMonth + 2) / 5) + day - 1;
  const dayOfEra = yearOfEra * 365 + Math.floor(yearOfEra / 4) - Math.floor(yearOfEra / 100) + dayOfYear;
  return era * 146097 + dayOfEra - 719468;
}

function daysInMonth(year: number, month: number): number {
  if (month === 2) return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0 ? 29 : 28;
  return month === 4 || month === 6 || month === 9 || month === 11 ? 30 : 31;
}

/** Reads a UTC offset "Z", "+01:00", "-0530" or "+02" into minutes east of UTC. */
export function readUtcOffset(text: string): Reading<number> {
  const m = OFFSET.exec(text.trim());
  if (m === null) return { ok: false, reason: `'${text}' is not a UTC offset (write Z or ±hh:mm, e.g. +01:00)` };
  if (m[1] !== undefined) return { ok: true, value: 0 };
  const hours = Number(m[3]);
  const minutes = m[4] === undefined ? 0 : Number(m[4]);
  if (hours > 23 || minutes > 59) return { ok: false, reason: `offset '${text}' is out of range (at most ±23:59)` };
  return { ok: true, value: (m[2] === "-" ? -1 : 1) * (hours * 60 + minutes) };
}

/** Value of the two decimal digits at text[i], text[i + 1], or -1 when either is not a digit. */
function twoDigits(text: string, i: number): number {
  const a = text.charCodeAt(i) - 48;
  const b = text.charCodeAt(i + 1) - 48;
  return a >= 0 && a <= 9 && b >= 0 && b <= 9 ? a * 10 + b : -1;
}

/**
 * The common logger form YYYY-MM-DDThh:mm:ss with Z, ±hh:mm or no offset, read from character codes without a
 * regular expression; undefined for any other text or any field out of range (readIsoTimestamp's general path
 * then reads it, and words its reason). Gives the same value as the general path for every text it accepts.
 */
function readCommonTimestamp(text: string): IsoTimestamp | undefined {
  const n = text.length;
  if ((n !== 19 && n !== 20 && n !== 25) || text.charCodeAt(4) !== 45 || text.charCodeAt(7) !== 45 || text.charCodeAt(10) !== 84) return undefined;
  if (text.charCodeAt(13) !== 58 || text.charCodeAt(16) !== 58) return undefined;
  const century = twoDigits(text, 0);
  const yy = twoDigits(text, 2);
  const month = twoDigits(text, 5);
  const day = twoDigits(text, 8);
  const hour = twoDigits(text, 11);
  const minute = twoDigits(text, 14);
  const second = twoDigits(text, 17);
  if (century < 0 || yy < 0 || month < 1 || month > 12 || day < 1 || hour < 0 || hour > 23 || minute < 0 || minute > 59 || second < 0 || second > 59) {
    return undefined;
  }
  const year = century * 100 + yy;
  if (day > daysInMonth(year, month)) return undefined;
  let offsetMinutes: number | null = null;
  if (n === 20) {
    if (text.charCodeAt(19) !== 90) return undefined;
    offsetMinutes = 0;
  } else if (n === 25) {
    const sign = text.charCodeAt(19);
    const oh = twoDigits(text, 20);
    const om = twoDigits(text, 23);
    if ((sign !== 43 && sign !== 45) || text.charCodeAt(22) !== 58 || oh < 0 || oh > 23 || om < 0 || om > 59) return undefined;
    offsetMinutes = (sign === 45 ? -1 : 1) * (oh * 60 + om);
  }
  const days = daysFromCivil(year, month, day);
  return { clockMs: ((days * 24 + hour) * 60 + minute) * 60000 + second * 1000, offsetMinutes };
}

/**
 * Reads an ISO 8601 extended date-time such as "2026-03-04T08:00:00+01:00" or "2026-03-04 08:00:00.5".
 * Validates calendar ranges (leap years included); 24:00:00 is read as the next midnight (ISO 8601
 * section 4.2.3); leap seconds (:60) are refused because elapsed-time arithmetic cannot place them.
 */
export function readIsoTimestamp(text: string): Reading<IsoTimestamp> {
  const common = readCommonTimestamp(text);
  if (common !== undefined) return { ok: true, value: common };
  const m = TIMESTAMP.exec(text.trim());
  if (m === null) return { ok: false, reason: `'${text}' is not an ISO 8601 timestamp (${TIMESTAMP_FORM})` };
  const [year, month, day, hour, minute] = [m[1], m[2], m[3], m[4], m[5]].map(Number) as [
    number,
    number,
    number,
    number,
    number,
  ];
  const second = m[6] === undefined ? 0 : Number(m[6]);
  const fraction = m[7] === undefined ? 0 : Number(`0.${m[7]}`);
  if (month < 1 || month > 12) return { ok: false, reason: `'${text}' has month ${month}, outside 01..12` };
  if (day < 1 || day > daysInMonth(year, month)) {
    return { ok: false, reason: `'${text}' has day ${day}, but ${m[1]}-${m[2]} has ${daysInMonth(year, month)} days` };
  }
  const endOfDay = hour === 24 && minute === 0 && second === 0 && fraction === 0;
  if ((hour > 23 && !endOfDay) || minute > 59) {
    return { ok: false, reason: `'${text}' has time of day ${m[4]}:${m[5]}, outside 00:00..23:59` };
  }
  if (second > 59) return { ok: false, reason: `'${text}' has second ${second}; leap seconds cannot be placed on an elapsed-time axis` };
  let offsetMinutes: number | null = null;
  if (m[8] !== undefined) {
    const offset = readUtcOffset(m[8]);
    if (!offset.ok) return { ok: false, reason: `'${text}': ${offset.reason}` };
    offsetMinutes = offset.value;
  }
  const days = daysFromCivil(year, month, day);
  const clockMs = ((days * 24 + hour) * 60 + minute) * 60000 + (second + fraction) * 1000;
  return { ok: true, value: { clockMs, offsetMinutes } };
}

/** Milliseconds since 1970-01-01T00:00:00Z of a timestamp, using `fallbackOffsetMinutes` when it states none. */
export function instantMs(timestamp: IsoTimestamp, fallbackOffsetMinutes: number): number {
  const offset = timestamp.offsetMinutes ?? fallbackOffsetMinutes;
  return timestamp.clockMs - offset * 60000;
}
