import { describe, it, expect } from "vitest";
import fc from "fast-check";
import { readIsoTimestamp, readUtcOffset } from "../src/data/index.js";
import { daysFromCivil, instantMs } from "../src/data/iso-timestamp.js";

/** Instant in ms of a timestamp that states its offset. */
function instantOf(text: string): number {
  const r = readIsoTimestamp(text);
  if (!r.ok) throw new Error(r.reason);
  return instantMs(r.value, Number.NaN);
}

describe("reading ISO 8601 timestamps", () => {
  it("honours a +01:00 offset: 08:00 at +01:00 is 07:00 UTC", () => {
    // Reference: ECMA-262 Date.UTC, which uses no time zone.
    expect(instantOf("2026-03-04T08:00:00+01:00")).toBe(Date.UTC(2026, 2, 4, 7, 0, 0));
  });

  it("agrees with the ECMAScript Date Time String Format for strings with Z or an offset", () => {
    // Reference: ECMA-262 section 21.4.1.32 (Date Time String Format): Date.parse of such strings is
    // defined without the host's time zone. Fractions beyond milliseconds are left out of the check
    // because Date.parse truncates them.
    for (const text of [
      "2026-03-04T08:00:00+01:00",
      "2026-03-04T02:10:00-05:00",
      "2026-03-04T07:01:00Z",
      "2026-03-04T13:45:30.250+05:45",
      "2024-02-29T23:59:59.999-09:30",
      "1999-12-31T23:30:00-01:00",
      "2026-10-25T02:30:00+02:00",
    ]) {
      expect(instantOf(text), text).toBe(Date.parse(text));
    }
  });

  it("reads a space in place of T, a comma as decimal sign of seconds, and an offset without colon", () => {
    expect(instantOf("2026-03-04 08:00:00,5+0100")).toBe(Date.UTC(2026, 2, 4, 7, 0, 0, 500));
    expect(instantOf("2026-03-04T08:00+01")).toBe(Date.UTC(2026, 2, 4, 7, 0, 0));
  });

  it("keeps fractions of a millisecond to the resolution of a double counting ms since 1970", () => {
    // A double near 1.77e12 ms has a spacing of 2^-12 ms (about 0.24 µs), so 0.4 µs comes back within that.
    expect(instantOf("2026-03-04T08:00:00.0004Z") - instantOf("2026-03-04T08:00:00Z")).toBeCloseTo(0.4, 3);
  });

  it("places readings either side of a change of clock offset by their instants (EU summer time, 2026-03-29)", () => {
    // Fact of the trade: Central European clocks go from +01:00 to +02:00 at 01:00 UTC on the last Sunday
    // of March; 2026-03-29 is that Sunday (checked with Python's zoneinfo for Europe/Berlin).
    expect(instantOf("2026-03-29T03:01:00+02:00") - instantOf("2026-03-29T01:59:00+01:00")).toBe(2 * 60000);
  });

  it("returns a clock reading without offset as such, for the caller to place with a stated offset", () => {
    const r = readIsoTimestamp("2026-03-04T08:00:00");
    expect(r).toEqual({ ok: true, value: { clockMs: Date.UTC(2026, 2, 4, 8), offsetMinutes: null } });
    if (r.ok) expect(instantMs(r.value, 60)).toBe(Date.UTC(2026, 2, 4, 7));
  });

  it("does not depend on the host's time zone", () => {
    const saved = process.env["TZ"];
    const readings: number[] = [];
    try {
      for (const zone of ["UTC", "America/St_Johns", "Asia/Kathmandu", "Pacific/Chatham"]) {
        process.env["TZ"] = zone;
        const r = readIsoTimestamp("2026-03-04T08:00:00");
        if (!r.ok) throw new Error(r.reason);
        readings.push(instantMs(r.value, 60), instantOf("2026-03-04T08:00:00-03:30"));
      }
    } finally {
      if (saved === undefined) delete process.env["TZ"];
      else process.env["TZ"] = saved;
    }
    expect(new Set(readings)).toEqual(new Set([Date.UTC(2026, 2, 4, 7), Date.UTC(2026, 2, 4, 11, 30)]));
  });

  it("reads 24:00:00 as the next midnight (ISO 8601 section 4.2.3)", () => {
    expect(instantOf("2026-03-04T24:00:00Z")).toBe(Date.UTC(2026, 2, 5));
  });

  it("accepts 29 February in leap years only (Gregorian calendar rule)", () => {
    expect(readIsoTimestamp("2024-02-29T00:00Z").ok).toBe(true);
    expect(readIsoTimestamp("2000-02-29T00:00Z").ok).toBe(true);
    expect(readIsoTimestamp("2026-02-29T00:00Z")).toEqual({ ok: false, reason: "'2026-02-29T00:00Z' has day 29, but 2026-02 has 28 days" });
    expect(readIsoTimestamp("1900-02-29T00:00Z").ok).toBe(false);
  });

  it("refuses out-of-range fields, leap seconds and text that is not a timestamp, saying why", () => {
    expect(readIsoTimestamp("2026-13-01T00:00Z")).toEqual({ ok: false, reason: "'2026-13-01T00:00Z' has month 13, outside 01..12" });
    expect(readIsoTimestamp("2026-03-04T08:60Z")).toEqual({ ok: false, reason: "'2026-03-04T08:60Z' has time of day 08:60, outside 00:00..23:59" });
    expect(readIsoTimestamp("2026-12-31T23:59:60Z")).toEqual({
      ok: false,
      reason: "'2026-12-31T23:59:60Z' has second 60; leap seconds cannot be placed on an elapsed-time axis",
    });
    expect(readIsoTimestamp("04.03.2026 08:00")).toEqual({
      ok: false,
      reason: "'04.03.2026 08:00' is not an ISO 8601 timestamp (YYYY-MM-DDThh:mm[:ss[.fff]] with an optional offset Z or ±hh:mm)",
    });
    expect(readIsoTimestamp("2026-03-04T08:00+24:00")).toEqual({
      ok: false,
      reason: "'2026-03-04T08:00+24:00': offset '+24:00' is out of range (at most ±23:59)",
    });
  });
});

describe("reading UTC offsets", () => {
  it("reads Z, ±hh:mm, ±hhmm and ±hh into minutes east of UTC", () => {
    expect(["Z", "+01:00", "-05:30", "+0545", "-03", "+00:00"].map((t) => readUtcOffset(t))).toEqual(
      [0, 60, -330, 345, -180, 0].map((value) => ({ ok: true, value })),
    );
  });

  it("refuses a zone name, which needs a time-zone database", () => {
    expect(readUtcOffset("CET")).toEqual({ ok: false, reason: "'CET' is not a UTC offset (write Z or ±hh:mm, e.g. +01:00)" });
  });
});

describe("counting days of the Gregorian calendar", () => {
  it("agrees with Date.UTC for any date from year 1 to 9999", () => {
    // Reference: ECMA-262 Date.UTC (MakeDay), proleptic Gregorian; years 0..99 are set with setUTCFullYear
    // because Date.UTC maps them to 1900..1999.
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 9999 }), fc.integer({ min: 1, max: 12 }), fc.integer({ min: 1, max: 28 }), (y, m, d) => {
        const date = new Date(0);
        date.setUTCFullYear(y, m - 1, d);
        expect(daysFromCivil(y, m, d) * 86400000).toBe(date.getTime());
      }),
      { numRuns: 500 },
    );
  });
});

describe("the fast reading of the common logger form YYYY-MM-DDThh:mm:ss[Z|±hh:mm]", () => {
  const pad = (n: number, w = 2) => String(n).padStart(w, "0");
  const stamp = fc
    .record({
      year: fc.integer({ min: 1900, max: 2199 }),
      month: fc.integer({ min: 0, max: 13 }),
      day: fc.integer({ min: 0, max: 32 }),
      hour: fc.integer({ min: 0, max: 25 }),
      minute: fc.integer({ min: 0, max: 60 }),
      second: fc.integer({ min: 0, max: 60 }),
      offset: fc.oneof(fc.constant(""), fc.constant("Z"), fc.tuple(fc.constantFrom("+", "-"), fc.integer({ min: 0, max: 24 }), fc.integer({ min: 0, max: 60 })).map(([s, h, m]) => `${s}${pad(h)}:${pad(m)}`)),
    })
    .map((p) => `${pad(p.year, 4)}-${pad(p.month)}-${pad(p.day)}T${pad(p.hour)}:${pad(p.minute)}:${pad(p.second)}${p.offset}`);

  it("reads every such text, valid or not, as the general reading does (which a trailing space forces)", () => {
    fc.assert(
      fc.property(stamp, (text) => {
        const fast = readIsoTimestamp(text);
        const general = readIsoTimestamp(`${text} `);
        expect(fast.ok).toBe(general.ok);
        if (fast.ok && general.ok) expect(fast.value).toEqual(general.value);
      }),
      { numRuns: 3000 },
    );
  });

  it("gives the instant Date.parse gives for valid texts with an offset", () => {
    // Reference: ECMA-262 section 21.4.1.32 (Date Time String Format), defined without the host's time zone.
    fc.assert(
      fc.property(stamp, (text) => {
        const r = readIsoTimestamp(text);
        if (!r.ok || r.value.offsetMinutes === null) return;
        expect(instantMs(r.value, Number.NaN)).toBe(Date.parse(text));
      }),
      { numRuns: 3000 },
    );
  });
});
