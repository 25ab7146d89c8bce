/**
 * The header's optional `testInformation`: the facts of the test a report states before any analysis (site,
 * dates, wells with distances and screens, the rate schedule, who analysed and who reviewed, the units used).
 * Reading it from the YAML-shaped header with a message for every problem, writing it back, and its JSON Schema.
 *
 * Numbers are in the units named under `units` (length for distances, screens and radii; time for the rate
 * schedule; rate for pumping rates), which must be units of the aquifer library of the right dimension.
 */
import { isDimension, parseUnit } from "@conebook/aquifer";
import type { JsonSchema } from "./json-schema.js";

/** A well of the test. */
export interface TestWell {
  name: string;
  role: "pumped" | "observation";
  /** Distance from the pumped well, in units.length. */
  distance?: number;
  /** Top and bottom of the screen, depths in units.length below `datum`. */
  screen?: [number, number];
  /** Radius of the well (screen or casing), in units.length. */
  radius?: number;
  notes?: string;
}

/** One step of the rate schedule: rate (units.rate) from `from` to `to` (units.time since pumping started). */
export interface RateStep {
  from: number;
  /** Absent for the last step when it ran to the end of the record. */
  to?: number;
  rate: number;
}

/** The test information of a document header. Every field is optional. */
export interface TestInformation {
  site?: string;
  location?: string;
  purpose?: string;
  /** Start and end of pumping, ISO 8601 date or date and time ("2026-11-03" or "2026-11-03T08:00"). */
  started?: string;
  ended?: string;
  analyst?: string;
  reviewer?: string;
  /** What the screen depths are measured from ("ground level", "top of casing"). */
  datum?: string;
  units?: { length?: string; time?: string; rate?: string };
  wells?: TestWell[];
  rates?: RateStep[];
  notes?: string;
}

type Raw = Record<string, unknown>;
const isObject = (v: unknown): v is Raw => typeof v === "object" && v !== null && !Array.isArray(v);
const finite = (v: unknown): v is number => typeof v === "number" && Number.isFinite(v);

const TEXT_KEYS = ["site", "location", "purpose", "analyst", "reviewer", "datum", "notes"] as const;
const DATE = /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2}):(\d{2})(?::(\d{2}))?)?$/;

/** Milliseconds since 1970 for a date as written here, or undefined when it is not a calendar date and time. */
export function testDateValue(text: string): number | undefined {
  const m = DATE.exec(text);
  if (!m) return undefined;
  const [y, mo, d, h = "0", mi = "0", s = "0"] = m.slice(1);
  const t = Date.UTC(Number(y), Number(mo) - 1, Number(d), Number(h), Number(mi), Number(s));
  const back = new Date(t);
  const ok =
    back.getUTCFullYear() === Number(y) && back.getUTCMonth() === Number(mo) - 1 && back.getUTCDate() === Number(d) &&
    back.getUTCHours() === Number(h) && back.getUTCMinutes() === Number(mi);
  return ok ? t : undefined;
}

/** A problem with a header path and what was expected. */
export type TestInformationProblem = (path: string, expected: string) => void;

/** Reads `testInformation` from the YAML-shaped value, reporting each wrong field and leaving it out. */
export function readTestInformation(raw: unknown, problem: TestInformationProblem, base = "testInformation"): TestInformation | undefined {
  if (!isObject(raw)) {
    problem(base, "a mapping with site, started, ended, analyst, reviewer, units, wells, rates (all optional)");
    return undefined;
  }
  const info: TestInformation = {};
  for (const key of TEXT_KEYS) {
    const v = raw[key];
    if (v === undefined) continue;
    if (typeof v === "string") info[key] = v;
    else problem(`${base}.${key}`, "text");
  }
  for (const key of ["started", "ended"] as const) {
    const v = raw[key];
    if (v === undefined) continue;
    if (typeof v === "string" && testDateValue(v) !== undefined) info[key] = v;
    else problem(`${base}.${key}`, "a date written YYYY-MM-DD or YYYY-MM-DDTHH:MM (for example 2026-11-03T08:00)");
  }
  if (info.started && info.ended && testDateValue(info.ended)! < testDateValue(info.started)!) {
    problem(`${base}.ended`, `a date no earlier than started (${info.started})`);
    delete info.ended;
  }
  const unitsNeeded = { length: false, time: false, rate: false };
  const unitsReported = new Set<string>();
  if (raw.units !== undefined) {
    if (!isObject(raw.units)) problem(`${base}.units`, "a mapping {length, time, rate} of unit names");
    else {
      const units: NonNullable<TestInformation["units"]> = {};
      const dims = { length: "length", time: "time", rate: "discharge" } as const;
      for (const [key, v] of Object.entries(raw.units)) {
        const path = `${base}.units.${key}`;
        if (!(key in dims)) {
          problem(path, "one of length, time, rate");
          continue;
        }
        const dim = dims[key as keyof typeof dims];
        let ok = false;
        if (typeof v === "string") {
          try {
            parseUnit(v);
            ok = isDimension(v, dim);
          } catch {
            ok = false;
          }
        }
        if (ok) units[key as keyof typeof dims] = v as string;
        else unitsReported.add(key), problem(path, `a unit of ${dim === "discharge" ? "pumping rate (such as m3/d or L/s)" : dim === "length" ? "length (such as m)" : "time (such as min)"}`);
      }
      info.units = units;
    }
  }
  if (raw.wells !== undefined) {
    if (!Array.isArray(raw.wells)) problem(`${base}.wells`, "a list of wells, each {name, role, distance, screen}");
    else {
      info.wells = [];
      raw.wells.forEach((w: unknown, i) => {
        const path = `${base}.wells.${i}`;
        if (!isObject(w) || typeof w.name !== "string" || w.name.trim() === "") return problem(`${path}.name`, "the well's name, as text");
        if (w.role !== "pumped" && w.role !== "observation") return problem(`${path}.role`, "pumped or observation");
        const well: TestWell = { name: w.name, role: w.role };
        for (const key of ["distance", "radius"] as const) {
          const v = w[key];
          if (v === undefined) continue;
          if (finite(v) && v >= 0) {
            well[key] = v;
            unitsNeeded.length = true;
          } else problem(`${path}.${key}`, "a number >= 0 in units.length");
        }
        if (w.screen !== undefined) {
          const s = w.screen;
          if (Array.isArray(s) && s.length === 2 && finite(s[0]) && finite(s[1]) && s[0] >= 0 && s[1] > s[0]) {
            well.screen = [s[0], s[1]];
            unitsNeeded.length = true;
          } else problem(`${path}.screen`, "[top, bottom]: two depths in units.length with top < bottom");
        }
        if (w.notes !== undefined) {
          if (typeof w.notes === "string") well.notes = w.notes;
          else problem(`${path}.notes`, "text");
        }
        for (const k of Object.keys(w)) if (!["name", "role", "distance", "screen", "radius", "notes"].includes(k)) problem(`${path}.${k}`, "one of name, role, distance, screen, radius, notes");
        info.wells!.push(well);
      });
    }
  }
  if (raw.rates !== undefined) {
    const steps = raw.rates;
    if (!Array.isArray(steps)) problem(`${base}.rates`, "a list of steps {from, to, rate}");
    else {
      info.rates = [];
      steps.forEach((r: unknown, i) => {
        const path = `${base}.rates.${i}`;
        if (!isObject(r) || !finite(r.from) || !finite(r.rate) || (r.to !== undefined && !finite(r.to))) {
          return problem(path, "a step {from, to, rate}: numbers, times in units.time and the rate in units.rate (to may be left out for the last step)");
        }
        if (r.to !== undefined && !((r.to as number) > r.from)) return problem(`${path}.to`, `a time after from (${r.from})`);
        const previous = info.rates![info.rates!.length - 1];
        if (previous && (previous.to === undefined || r.from < previous.to)) return problem(`${path}.from`, "a time no earlier than the end of the step before");
        if (r.to === undefined && i < steps.length - 1) return problem(`${path}.to`, "the end of the step (only the last step may leave it out)");
        info.rates!.push(r.to === undefined ? { from: r.from, rate: r.rate } : { from: r.from, to: r.to as number, rate: r.rate });
        unitsNeeded.time = true;
        unitsNeeded.rate = true;
      });
    }
  }
  for (const [key, needed] of Object.entries(unitsNeeded)) {
    if (needed && info.units?.[key as "length"] === undefined && !unitsReported.has(key)) {
      problem(`${base}.units.${key}`, `given: the ${key === "length" ? "distances and screens" : key === "time" ? "times of the rate schedule" : "rates"} need their unit (add units: {${key}: ${key === "length" ? "m" : key === "time" ? "min" : "m3/d"}})`);
    }
  }
  for (const k of Object.keys(raw)) {
    if (![...TEXT_KEYS, "started", "ended", "units", "wells", "rates"].includes(k)) problem(`${base}.${k}`, "a known key (site, location, purpose, started, ended, analyst, reviewer, datum, units, wells, rates, notes)");
  }
  return info;
}

/** The YAML-shaped form of test information, keys in a fixed order. */
export function testInformationToRaw(info: TestInformation): Raw {
  const raw: Raw = {};
  for (const key of ["site", "location", "purpose", "started", "ended", "analyst", "reviewer", "datum"] as const) if (info[key] !== undefined) raw[key] = info[key];
  if (info.units) raw.units = { ...info.units };
  if (info.wells) raw.wells = info.wells.map((w) => ({ ...w, ...(w.screen ? { screen: [...w.screen] } : {}) }));
  if (info.rates) raw.rates = info.rates.map((r) => ({ ...r }));
  if (info.notes !== undefined) raw.notes = info.notes;
  return raw;
}

const text: JsonSchema = { type: "string" };
const date: JsonSchema = { type: "string", pattern: "^\\d{4}-\\d{2}-\\d{2}([T ]\\d{2}:\\d{2}(:\\d{2})?)?$" };
const nonNegative: JsonSchema = { type: "number", minimum: 0 };

/** JSON Schema of `testInformation` (dimensions of units and the order of dates and steps are checked by the reader). */
export const testInformationSchema: JsonSchema = {
  type: "object",
  additionalProperties: false,
  description: "Facts of the test for the report: site, dates, wells, rate schedule, analyst and reviewer, units.",
  properties: {
    site: text,
    location: text,
    purpose: text,
    started: date,
    ended: date,
    analyst: text,
    reviewer: text,
    datum: { type: "string", description: "What screen depths are measured from, e.g. ground level." },
    units: {
      type: "object",
      additionalProperties: false,
      properties: { length: text, time: text, rate: text },
    },
    wells: {
      type: "array",
      items: {
        type: "object",
        required: ["name", "role"],
        additionalProperties: false,
        properties: {
          name: { type: "string", minLength: 1 },
          role: { type: "string", enum: ["pumped", "observation"] },
          distance: nonNegative,
          screen: { type: "array", items: nonNegative, minItems: 2, maxItems: 2, description: "[top, bottom] depths in units.length." },
          radius: nonNegative,
          notes: text,
        },
      },
    },
    rates: {
      type: "array",
      items: {
        type: "object",
        required: ["from", "rate"],
        additionalProperties: false,
        properties: { from: { type: "number" }, to: { type: "number" }, rate: { type: "number" } },
      },
    },
    notes: text,
  },
};
