import { describe, it, expect } from "vitest";
import { CsvError, parseObservationCsv } from "../src/data/index.js";
import type { CsvProblem, ObservationCsvOptions } from "../src/data/index.js";

/**
 * Invented example throughout: the Hollow Creek wellfield, pumping well PW-1 at 12 L/s, observation wells
 * OB-2 (25 m away) and OB-3 (80 m away). Values are made up for the checks, not measured.
 */
const ob2: ObservationCsvOptions = {
  name: "OB-2",
  timeColumn: "t_min",
  valueColumn: "s_m",
  timeUnit: "min",
  lengthUnit: "m",
  radius: { value: 25, unit: "m" },
  pumpingRate: { value: 12, unit: "L/s" },
};

function problemsOf(text: string, options: ObservationCsvOptions): readonly CsvProblem[] {
  try {
    parseObservationCsv(text, options);
  } catch (error) {
    if (error instanceof CsvError) return error.problems;
    throw error;
  }
  throw new Error("expected a CsvError");
}

describe("importing drawdown with elapsed times", () => {
  it("reads the chosen columns into a series with units, geometry and provenance", () => {
    const { series, notes } = parseObservationCsv("t_min,s_m,logger\r\n1,0.052,A7\r\n2,0.110,A7\r\n5,0.205,A7\r\n", ob2);
    expect(Array.from(series.times)).toEqual([1, 2, 5]);
    expect(Array.from(series.drawdowns)).toEqual([0.052, 0.11, 0.205]);
    expect(series).toMatchObject({
      name: "OB-2",
      timeUnit: "min",
      lengthUnit: "m",
      radius: { value: 25, unit: "m" },
      pumpingRate: { value: 12, unit: "L/s" },
      excluded: [],
      metadata: { "source.format": "csv", "source.timeColumn": "t_min", "source.valueColumn": "s_m", "source.kind": "drawdown" },
    });
    expect(notes).toEqual([]);
  });

  it("keeps elapsed times in the unit of the column (seconds, hours, days)", () => {
    for (const timeUnit of ["s", "h", "d"]) {
      const { series } = parseObservationCsv("t,s\n30,0.01\n90,0.02\n", { ...ob2, timeColumn: "t", valueColumn: "s", timeUnit });
      expect(series.timeUnit).toBe(timeUnit);
      expect(Array.from(series.times)).toEqual([30, 90]);
    }
  });

  it("finds columns by header ignoring surrounding spaces and, failing an exact match, case", () => {
    const { series } = parseObservationCsv(" T_MIN , s_m \n1,0.1\n2,0.2\n", ob2);
    expect(Array.from(series.drawdowns)).toEqual([0.1, 0.2]);
    expect(series.metadata["source.timeColumn"]).toBe("T_MIN");
  });

  it("names the series after the value column when no name is given", () => {
    expect(parseObservationCsv("t_min,OB-3\n1,0.01\n2,0.02\n", { ...ob2, name: undefined, valueColumn: "OB-3" }).series.name).toBe("OB-3");
  });

  it("skips a logger preamble above the header line", () => {
    const text = 'Logger "HC-07";serial 4411\nsite;Hollow Creek\nt_min;s_m\n1;0,05\n2;0,11\n';
    const { series } = parseObservationCsv(text, { ...ob2, headerLine: 3 });
    expect(Array.from(series.drawdowns)).toEqual([0.05, 0.11]);
  });

  it("reads quoted fields with embedded separators and line breaks (RFC 4180 section 2.6) and keeps row numbers as file lines", () => {
    const text = 't_min,s_m,note\n1,0.05,"pump restarted,\nflow steady"\n2,0.11,ok\n3,x,ok\n';
    expect(problemsOf(text, ob2).map((p) => p.message)).toEqual(["row 5, column 's_m' (2): 'x' is not a number"]);
  });
});

describe("decimal commas", () => {
  it("reads decimal commas by default in a semicolon-separated file, and says so", () => {
    const { series, notes } = parseObservationCsv("t_min;s_m\n0,5;0,031\n1,5;0,082\n", ob2);
    expect(Array.from(series.times)).toEqual([0.5, 1.5]);
    expect(Array.from(series.drawdowns)).toEqual([0.031, 0.082]);
    expect(notes).toEqual([
      "field separator detected: semicolon",
      "semicolon-separated file: numbers read with a decimal comma (set decimalComma to choose)",
    ]);
  });

  it("reads decimal points in a semicolon-separated file whose numbers show only points", () => {
    const { series, notes } = parseObservationCsv("t_min;s_m\n0.5;0.031\n2;1e-1\n", ob2);
    expect(Array.from(series.drawdowns)).toEqual([0.031, 0.1]);
    expect(notes).toContain("semicolon-separated file with decimal points only: numbers read with a decimal point");
  });

  it("reads quoted decimal commas in a comma-separated file when decimalComma is set", () => {
    const { series } = parseObservationCsv('t_min,s_m\n"0,5","0,031"\n"1,5","0,082"\n', { ...ob2, decimalComma: true });
    expect(Array.from(series.drawdowns)).toEqual([0.031, 0.082]);
  });

  it("reads decimal commas in a tab-separated file when decimalComma is set", () => {
    const { series } = parseObservationCsv("t_min\ts_m\n0,5\t0,031\n1,5\t0,082\n", { ...ob2, decimalComma: true });
    expect(Array.from(series.times)).toEqual([0.5, 1.5]);
  });

  it("refuses a decimal comma where points are expected, and says which option to set", () => {
    expect(problemsOf('t_min,s_m\n1,"0,031"\n', ob2)).toEqual([
      {
        code: "non-numeric",
        row: 2,
        column: { name: "s_m", index: 2 },
        message: "row 2, column 's_m' (2): '0,031' uses a decimal comma, but decimal points were expected",
        fix: "set decimalComma: true if the file uses decimal commas",
      },
    ]);
  });

  it("refuses a record split by an unquoted decimal comma, suggesting quotes or another separator", () => {
    const [problem] = problemsOf("t_min,s_m\n1,0,031\n", ob2);
    expect(problem).toEqual({
      code: "ragged-row",
      row: 2,
      message: "row 2: the record has 3 fields but the header has 2",
      fix: "give every record 2 fields (RFC 4180 section 2.4); a decimal comma in an unquoted field splits it in two: quote such numbers or use ';' as separator",
    });
  });
});

describe("timestamps", () => {
  const stamped: ObservationCsvOptions = {
    ...ob2,
    timeColumn: "time",
    valueColumn: "s_m",
    timeFormat: "timestamp",
    timeUnit: undefined,
    pumpingStart: "2026-03-04T08:00:00+01:00",
  };

  it("turns timestamps with offsets into elapsed minutes since the pumping start", () => {
    // 08:00 at +01:00 is 07:00 UTC; 02:10 at -05:00 is 07:10 UTC (offsets per ISO 8601 / RFC 3339 section 5.6).
    const text = [
      "time,s_m",
      "2026-03-04T07:01:00Z,0.05",
      "2026-03-04T08:02:30+01:00,0.12",
      "2026-03-04T02:10:00-05:00,0.24",
      "2026-03-04T09:00:00.000+01:00,0.55",
    ].join("\n");
    const { series } = parseObservationCsv(text, stamped);
    expect(series.timeUnit).toBe("min");
    expect(Array.from(series.times)).toEqual([1, 2.5, 10, 60].map((t) => expect.closeTo(t, 12)));
    expect(series.metadata["source.pumpingStart"]).toBe("2026-03-04T08:00:00+01:00");
  });

  it("gives elapsed time in the unit asked for", () => {
    const { series } = parseObservationCsv("time,s_m\n2026-03-04T09:30:00+01:00,0.3\n2026-03-05T08:00:00+01:00,0.9\n", { ...stamped, timeUnit: "h" });
    expect(Array.from(series.times)).toEqual([1.5, 24].map((t) => expect.closeTo(t, 12)));
  });

  it("places timestamps without an offset with the offset stated for the logger clock", () => {
    const { series } = parseObservationCsv("time,s_m\n2026-03-04 08:01:00,0.05\n2026-03-04 08:03:00,0.1\n", {
      ...stamped,
      pumpingStart: "2026-03-04T08:00:00",
      assumedUtcOffset: "+01:00",
    });
    expect(Array.from(series.times)).toEqual([1, 3].map((t) => expect.closeTo(t, 12)));
  });

  it("refuses timestamps without an offset when none is stated, naming the first row and the count", () => {
    const problems = problemsOf("time,s_m\n2026-03-04T07:01:00Z,0.05\n2026-03-04T08:02:00,0.1\n2026-03-04T08:03:00,0.2\n", stamped);
    expect(problems.map((p) => `${p.message} | ${p.fix}`)).toEqual([
      "row 3, column 'time' (1): the timestamp has no UTC offset (and 1 more row), so its instant depends on a clock setting the file does not state | add offsets to the timestamps (e.g. '2026-03-04T08:00:00+01:00'), or set assumedUtcOffset to the offset the logger clock kept (e.g. '+01:00' or 'Z')",
    ]);
  });

  it("refuses a pumping start without an offset when none is stated", () => {
    expect(problemsOf("time,s_m\n2026-03-04T07:01:00Z,0.05\n", { ...stamped, pumpingStart: "2026-03-04T08:00" })).toEqual([
      {
        code: "invalid-option",
        message: "pumpingStart '2026-03-04T08:00' has no UTC offset, so its instant is unknown",
        fix: "add the offset to it (e.g. '+01:00'), or set assumedUtcOffset to the offset of the clock that wrote it",
      },
    ]);
  });

  it("refuses a field that is not a timestamp, with the form expected", () => {
    expect(problemsOf("time,s_m\n2026-03-04T07:01:00Z,0.05\n04.03.2026 08:02,0.1\n", stamped)).toEqual([
      {
        code: "bad-timestamp",
        row: 3,
        column: { name: "time", index: 1 },
        message:
          "row 3, column 'time' (1): '04.03.2026 08:02' is not an ISO 8601 timestamp (YYYY-MM-DDThh:mm[:ss[.fff]] with an optional offset Z or ±hh:mm)",
        fix: "write the time as YYYY-MM-DDThh:mm[:ss[.fff]] with an optional offset Z or ±hh:mm",
      },
    ]);
  });

  it("refuses readings before the pumping start, or excludes them when asked", () => {
    const text = "time,s_m\n2026-03-04T06:55:00Z,0.002\n2026-03-04T07:01:00Z,0.05\n2026-03-04T07:02:00Z,0.09\n";
    expect(problemsOf(text, stamped).map((p) => p.message)).toEqual(["row 2, column 'time' (1): the reading is 5 min before pumpingStart"]);
    const { series, notes } = parseObservationCsv(text, { ...stamped, beforeStart: "exclude" });
    expect(Array.from(series.times)).toEqual([1, 2].map((t) => expect.closeTo(t, 12)));
    expect(series.excluded).toEqual([
      { row: 2, time: expect.closeTo(-5, 12), value: 0.002, reason: "reading before pumping started (negative elapsed time)" },
    ]);
    expect(notes).toContain("1 reading before pumping started excluded (listed in excluded)");
  });
});

describe("errors name the row, the column and a fix", () => {
  it("reports a non-numeric value", () => {
    expect(problemsOf("t_min,s_m\n1,0.05\n2,O.11\n", ob2)).toEqual([
      {
        code: "non-numeric",
        row: 3,
        column: { name: "s_m", index: 2 },
        message: "row 3, column 's_m' (2): 'O.11' is not a number",
        fix: "correct the value; if it marks a missing reading, list it in missingMarkers and set missing: 'exclude'",
      },
    ]);
  });

  it("reports a negative elapsed time", () => {
    expect(problemsOf("t_min,s_m\n-0.5,0.0\n1,0.05\n", ob2)).toEqual([
      {
        code: "negative-time",
        row: 2,
        column: { name: "t_min", index: 1 },
        message: "row 2, column 't_min' (1): time -0.5 min is negative (before pumping started)",
        fix: "check the time column, or set beforeStart: 'exclude' to leave pre-pumping readings out (they are listed in excluded)",
      },
    ]);
  });

  it("reports a duplicate time with the row it repeats", () => {
    expect(problemsOf("t_min,s_m\n1,0.05\n2,0.11\n2,0.12\n3,0.16\n", ob2)).toEqual([
      {
        code: "duplicate-time",
        row: 4,
        column: { name: "t_min", index: 1 },
        message: "row 4, column 't_min' (1): time 2 min repeats the time of row 3",
        fix: "remove one of the two readings or correct its time",
      },
    ]);
  });

  it("refuses times out of order by default, naming the row before", () => {
    expect(problemsOf("t_min,s_m\n1,0.05\n3,0.16\n2,0.11\n4,0.19\n", ob2)).toEqual([
      {
        code: "out-of-order",
        row: 4,
        column: { name: "t_min", index: 1 },
        message: "row 4, column 't_min' (1): time 2 min comes after 3 min on row 3; times must increase down the file",
        fix: "put the rows in time order, or set outOfOrder: 'sort' to have them sorted",
      },
    ]);
  });

  it("sorts times out of order when asked, and reports that it did", () => {
    const { series, notes } = parseObservationCsv("t_min,s_m\n1,0.05\n3,0.16\n2,0.11\n4,0.19\n", { ...ob2, outOfOrder: "sort" });
    expect(Array.from(series.times)).toEqual([1, 2, 3, 4]);
    expect(Array.from(series.drawdowns)).toEqual([0.05, 0.11, 0.16, 0.19]);
    expect(notes).toEqual(["sorted by time: 1 row came earlier than a row above them (first: row 4); the series follows time order"]);
  });

  it("still refuses duplicate times when sorting", () => {
    expect(problemsOf("t_min,s_m\n3,0.16\n1,0.05\n3,0.17\n", { ...ob2, outOfOrder: "sort" }).map((p) => p.code)).toEqual(["duplicate-time"]);
  });

  it("refuses missing values by default", () => {
    expect(problemsOf("t_min,s_m\n1,0.05\n2,\n3,NA\n,0.2\n", ob2).map((p) => p.message)).toEqual([
      "row 3, column 's_m' (2): the level is missing",
      "row 4, column 's_m' (2): the level is missing",
      "row 5, column 't_min' (1): the time is missing",
    ]);
  });

  it("excludes rows with missing values when asked, listing each with its reason", () => {
    const { series, notes } = parseObservationCsv("t_min,s_m\n1,0.05\n2,\n3,NA\n,0.2\n5,0.24\n", { ...ob2, missing: "exclude" });
    expect(Array.from(series.times)).toEqual([1, 5]);
    expect(series.excluded).toEqual([
      { row: 3, time: 2, value: Number.NaN, reason: "level missing in column 's_m'" },
      { row: 4, time: 3, value: Number.NaN, reason: "level missing in column 's_m'" },
      { row: 5, time: Number.NaN, value: 0.2, reason: "time missing in column 't_min'" },
    ]);
    expect(notes).toEqual(["3 rows with a missing reading excluded (listed in excluded)"]);
  });

  it("treats the markers given as missing readings", () => {
    const { series } = parseObservationCsv("t_min,s_m\n1,0.05\n2,dry\n3,0.16\n", { ...ob2, missing: "exclude", missingMarkers: ["DRY"] });
    expect(series.excluded.map((e) => e.row)).toEqual([3]);
  });

  it("reports a missing column with the headers that exist", () => {
    expect(problemsOf("time,drawdown\n1,0.05\n", ob2).map((p) => `${p.message} | ${p.fix}`)).toEqual([
      "row 1: no column is headed 't_min' (the time column); the header has 'time' (1), 'drawdown' (2) | set timeColumn to one of these names",
      "row 1: no column is headed 's_m' (the value column); the header has 'time' (1), 'drawdown' (2) | set valueColumn to one of these names",
    ]);
  });

  it("reports a quoted field that is never closed, on the line where it opens", () => {
    expect(problemsOf('t_min,s_m\n1,0.05\n2,"0.11\n3,0.16\n', ob2).map((p) => p.message)).toContain(
      "row 3: field 2: the quoted field that opens on line 3 is never closed",
    );
  });

  it("lists every problem of a file, not only the first, in the error message", () => {
    let error: CsvError | undefined;
    try {
      parseObservationCsv("t_min,s_m\n1,x\n-2,0.1\n3,0.2\n3,0.3\n", ob2);
    } catch (e) {
      error = e as CsvError;
    }
    expect(error?.problems.map((p) => p.code)).toEqual(["non-numeric", "negative-time", "duplicate-time"]);
    expect(error?.message).toBe(
      [
        "The observation CSV could not be imported (3 problems):",
        "- row 2, column 's_m' (2): 'x' is not a number. Fix: correct the value; if it marks a missing reading, list it in missingMarkers and set missing: 'exclude'.",
        "- row 3, column 't_min' (1): time -2 min is negative (before pumping started). Fix: check the time column, or set beforeStart: 'exclude' to leave pre-pumping readings out (they are listed in excluded).",
        "- row 5, column 't_min' (1): time 3 min repeats the time of row 4. Fix: remove one of the two readings or correct its time.",
      ].join("\n"),
    );
  });

  it("refuses options that leave units or levels undefined", () => {
    expect(problemsOf("t,s\n1,2\n", { ...ob2, timeUnit: "m", kind: "head" }).map((p) => p.message)).toEqual([
      "kind 'head' needs the static level, but staticLevel is not given",
      "timeUnit: expected a time, in a unit such as 'd', got 'm' (a length)",
    ]);
    expect(problemsOf("t,s\n1,2\n", { ...ob2, timeUnit: undefined }).map((p) => p.message)).toEqual([
      "timeUnit is not given, so the elapsed times have no unit",
    ]);
  });

  it("asks for a separator when the header shows none", () => {
    expect(problemsOf("t_min s_m\n1 0.05\n", ob2).map((p) => p.message)).toEqual([
      "row 1: the header row shows no single field separator (no comma, semicolon or tab, or a tie between them)",
    ]);
  });
});

describe("spotting a level column read as the wrong kind", () => {
  const ob3: ObservationCsvOptions = { ...ob2, name: "OB-3", timeColumn: "t_min", valueColumn: "level", radius: { value: 80, unit: "m" } };
  const depths = "t_min,level\n1,12.31\n2,12.36\n5,12.52\n10,12.66\n30,12.88\n";
  const heads = "t_min,level\n1,102.69\n2,102.64\n5,102.48\n10,102.34\n30,102.12\n";

  it("says a 'drawdown' column that rises but stays far from zero looks like depth to water", () => {
    expect(problemsOf(depths, ob3)).toEqual([
      {
        code: "looks-like-depth-to-water",
        column: { name: "level", index: 2 },
        message:
          "column 'level' (2) looks like depth to water, not drawdown: values rise as pumping goes on but never come near zero (12.31 to 12.88 m), while drawdown starts near zero",
        fix: "set kind: 'depth-to-water' and give the static level (staticLevel, the depth to water before pumping); or set checkLevelKind: false if the column is right",
      },
    ]);
  });

  it("says a 'drawdown' column that falls and stays far from zero looks like heads", () => {
    expect(problemsOf(heads, ob3).map((p) => [p.code, p.message])).toEqual([
      [
        "looks-like-head",
        "column 'level' (2) looks like water levels (heads), not drawdown: values fall as pumping goes on and never come near zero (102.12 to 102.69 m), while drawdown starts near zero and grows",
      ],
    ]);
  });

  it("says a mostly negative, falling 'drawdown' column looks like heads below a datum", () => {
    const text = "t_min,level\n1,-4.31\n2,-4.36\n5,-4.52\n10,-4.66\n";
    expect(problemsOf(text, ob3).map((p) => p.code)).toEqual(["looks-like-head"]);
  });

  it("says a mostly negative 'drawdown' column that does not fall may have the opposite sign", () => {
    const text = "t_min,level\n1,-0.05\n2,-0.11\n5,-0.2\n10,-0.27\n30,-0.2\n60,-0.05\n90,-0.01\n";
    const [problem] = problemsOf(text, { ...ob3, checkLevelKind: true });
    expect(problem?.message).toBe(
      "column 'level' (2) is mostly negative (7 of 7 values below 0, -0.27 to -0.01 m), but drawdown is positive when the water level falls",
    );
  });

  it("reads the same columns once the kind and static level are given", () => {
    const fromDepth = parseObservationCsv(depths, { ...ob3, kind: "depth-to-water", staticLevel: 12.25 }).series;
    expect(Array.from(fromDepth.drawdowns)).toEqual([0.06, 0.11, 0.27, 0.41, 0.63].map((s) => expect.closeTo(s, 12)));
    const fromHead = parseObservationCsv(heads, { ...ob3, kind: "head", staticLevel: 102.75 }).series;
    expect(Array.from(fromHead.drawdowns)).toEqual([0.06, 0.11, 0.27, 0.41, 0.63].map((s) => expect.closeTo(s, 12)));
    expect(fromHead.metadata["source.staticLevel"]).toBe("102.75 m");
  });

  it("says heads read as depths give negative drawdowns", () => {
    expect(problemsOf(heads, { ...ob3, kind: "depth-to-water", staticLevel: 102.75 }).map((p) => `${p.message} | ${p.fix}`)).toEqual([
      "column 'level' (2) gives mostly negative drawdowns with staticLevel 102.75 m (5 of 5 below 0; values 102.12 to 102.69 m): the levels sit shallower than the static level | check staticLevel; if the column holds heads (water-level elevations), set kind: 'head'; or set checkLevelKind: false if the column is right",
    ]);
  });

  it("lets a recovery record (drawdown falling towards zero) through", () => {
    const { series } = parseObservationCsv("t_min,s_m\n1,0.62\n2,0.55\n5,0.31\n10,0.12\n30,0.03\n", ob2);
    expect(series.drawdowns.length).toBe(5);
  });

  it("accepts the column as it is when the check is turned off", () => {
    expect(parseObservationCsv(depths, { ...ob3, checkLevelKind: false }).series.drawdowns[0]).toBe(12.31);
  });
});

describe("readings at the start of pumping", () => {
  it("keeps a reading at t = 0 with zero drawdown out of the series, listed as excluded", () => {
    const { series, notes } = parseObservationCsv("t_min,s_m\n0,0\n1,0.05\n2,0.11\n", ob2);
    expect(Array.from(series.times)).toEqual([1, 2]);
    const reason = "reading at t = 0 (start of pumping, drawdown 0 by definition): kept out because a log time axis cannot place t = 0";
    expect(series.excluded).toEqual([{ row: 2, time: 0, value: 0, reason }]);
    expect(notes).toEqual([`row 2: ${reason}`]);
  });

  it("flags a non-zero drawdown at t = 0 as a sign that the static level or start is off", () => {
    const { series } = parseObservationCsv("t_min,s_m\n0,0.04\n1,0.05\n2,0.11\n", ob2);
    expect(series.excluded[0]?.reason).toBe(
      "reading at t = 0 with drawdown 0.04 m, not 0: kept out because a log time axis cannot place t = 0; a non-zero drawdown at the start suggests the static level or the pumping start is off",
    );
  });
});

describe("a long logger record", () => {
  it("imports 100,000 semicolon-separated rows within seconds (no quadratic step)", () => {
    const lines = ["t_min;s_m"];
    for (let i = 1; i <= 100000; i++) lines.push(`${(i / 60).toFixed(6).replace(".", ",")};${(0.1 * Math.log10(i)).toFixed(4).replace(".", ",")}`);
    const started = performance.now();
    const { series } = parseObservationCsv(lines.join("\r\n"), ob2);
    const elapsed = performance.now() - started;
    expect(series.times.length).toBe(100000);
    expect(series.times[59]).toBeCloseTo(1, 12);
    // About 0.3 to 0.9 s seen on the development machine; a quadratic step would take minutes.
    expect(elapsed).toBeLessThan(5000);
  });
});

describe("files without a usable header", () => {
  it("reports an empty file, a blank header line and a header without data", () => {
    expect(problemsOf(" \n\n", ob2).map((p) => p.message)).toEqual(["the file is empty"]);
    expect(problemsOf("t_min,s_m\n1,0.1\n\n", { ...ob2, headerLine: 3, separator: "," }).map((p) => p.message)).toEqual(["row 3: the header line is blank"]);
    expect(problemsOf("t_min,s_m\r\n", ob2).map((p) => p.message)).toEqual(["row 1: the header is not followed by any data rows"]);
  });
});

describe("pumping schedules", () => {
  it("carries a schedule of steps, with starts in the series' time unit, into the series", () => {
    const schedule = { unit: "L/s", steps: [{ start: 0, rate: 8 }, { start: 60, rate: 12 }] };
    const { series } = parseObservationCsv("t_min,s_m\n30,0.11\n90,0.31\n", { ...ob2, pumpingRate: schedule });
    expect(series.pumpingRate).toEqual(schedule);
  });

  it("turns a schedule that does not start at 0 into an option problem", () => {
    const schedule = { unit: "L/s", steps: [{ start: 5, rate: 8 }] };
    expect(problemsOf("t_min,s_m\n30,0.11\n90,0.31\n", { ...ob2, pumpingRate: schedule }).map((p) => [p.code, p.message])).toEqual([
      ["invalid-option", "pumpingRate.steps[0].start is 5 min; the first step starts when pumping starts, at 0"],
    ]);
  });
});
