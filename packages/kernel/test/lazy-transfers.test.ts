import { describe, expect, it } from "vitest";
import { logResample, parseObservationCsv } from "@conebook/aquifer";
import { createKernel } from "../src/index.js";
import { decodeWireValue, encodeHostValue, RECORD_TABLE_MIN_LENGTH, WireDecodeError } from "../src/wire.js";
import { makeDoc } from "./helpers.js";

const kernel = createKernel();

/** A record of 300 readings, the first 120 before pumping started (elapsed time < 0), one missing level. */
function recordCsv(): string {
  const lines = ["t_min,s_m"];
  for (let i = -120; i < 180; i++) lines.push(`${i},${i === 150 ? "" : (i > 0 ? 0.1 * Math.log(i) + 0.2 : 0.001 * i).toFixed(4)}`);
  return lines.join("\n");
}
const OPTIONS = {
  name: "OB-T",
  timeColumn: "t_min",
  valueColumn: "s_m",
  timeUnit: "min",
  lengthUnit: "m",
  beforeStart: "exclude",
  missing: "exclude",
  radius: { value: 20, unit: "m" },
  pumpingRate: { value: 500, unit: "m3/d" },
} as const;

/** The value and json outputs of a run, in order. */
async function shown(cells: Parameters<typeof makeDoc>[0]): Promise<unknown[]> {
  const r = await kernel.runDocument(makeDoc(cells));
  const failed = Object.entries(r.status).find(([, s]) => s !== "ok");
  if (failed) throw new Error(JSON.stringify(r.outputs[failed[0]]));
  return Object.values(r.outputs).flatMap((outs) => outs.map((o) => (o.type === "json" || o.type === "value" ? o.value : o)));
}

describe("record tables on the wire", () => {
  const records = Array.from({ length: 1000 }, (_, i) => ({
    row: i + 2,
    time: i < 990 ? -(1000 - i) : NaN,
    value: i === 3 ? -0 : 0.5 * i,
    reason: i < 990 ? "reading before pumping started (negative elapsed time)" : "level missing in column 's'",
  }));

  it("writes a long array of like records as columns, each repeated text once, and reads back the same records", () => {
    const wire = encodeHostValue({ excluded: records });
    expect(wire.json.split("reading before pumping started").length - 1).toBe(1);
    expect(wire.json.length).toBeLessThan(400);
    expect(wire.buffers.length).toBe(4);
    const back = decodeWireValue(wire) as { excluded: typeof records };
    expect(back.excluded).toEqual(records);
    expect(Object.is(back.excluded[3]!.value, -0)).toBe(true);
    expect(Number.isNaN(back.excluded[995]!.time)).toBe(true);
  });

  it("keeps short arrays, mixed records and records with other values in the JSON form", () => {
    const short = records.slice(0, RECORD_TABLE_MIN_LENGTH - 1);
    const mixed = [...records.slice(0, 100), { row: 1, time: 2, value: 3 }];
    const withBoolean = records.slice(0, 100).map((r) => ({ ...r, used: false }));
    for (const value of [short, mixed, withBoolean]) {
      const wire = encodeHostValue(value);
      expect(JSON.parse(wire.json).length).toBe(2);
      expect(decodeWireValue(wire)).toEqual(value);
    }
  });

  it("refuses a record table whose runs do not add up to its record count or whose key is __proto__", () => {
    const wire = encodeHostValue(records);
    const parts = JSON.parse(wire.json) as [unknown, unknown[], { n: number; keys: string[] }[]];
    const tooMany = JSON.stringify([parts[0], parts[1], [{ ...parts[2][0]!, n: 1001 }]]);
    expect(() => decodeWireValue({ json: tooMany, buffers: wire.buffers })).toThrow(WireDecodeError);
    const proto = JSON.stringify([parts[0], parts[1], [{ ...parts[2][0]!, keys: ["__proto__", "time", "value", "reason"] }]]);
    expect(() => decodeWireValue({ json: proto, buffers: wire.buffers })).toThrow(/one column per key/);
  });
});

describe("parts of results and tables that cross only when a cell reads them", () => {
  const csv = recordCsv();
  const host = parseObservationCsv(csv, OPTIONS);

  it("gives a cell an import's excluded readings as the host's records, built on first read", async () => {
    const [lazyBefore, excluded, lazyAfter] = await shown([
      { kind: "data", name: "rec", source: csv },
      `const imp = aq.parseObservationCsv(rec.csv, ${JSON.stringify(OPTIONS)});\n` +
        'show.json(typeof Object.getOwnPropertyDescriptor(imp.series, "excluded").get);\n' +
        "show.json(imp.series.excluded);\n" +
        'show.json(typeof Object.getOwnPropertyDescriptor(imp.series, "excluded").get)',
    ]);
    expect(lazyBefore).toBe("function");
    expect(host.series.excluded.length).toBe(122);
    expect(excluded).toEqual(JSON.parse(JSON.stringify(host.series.excluded)));
    expect(lazyAfter).toBe("undefined");
  });

  it("passes an unread excluded list back to the host unchanged, and a list the cell changed as changed", async () => {
    const thinned = logResample(host.series, { pointsPerDecade: 10 });
    const [unread, edited] = await shown([
      { kind: "data", name: "rec", source: csv },
      `const imp = aq.parseObservationCsv(rec.csv, ${JSON.stringify(OPTIONS)});\n` +
        "show.json(aq.logResample(imp.series, { pointsPerDecade: 10 }).series.excluded);\n" +
        "imp.series.excluded.length = 2;\n" +
        "show.json(aq.logResample(imp.series, { pointsPerDecade: 10 }).series.excluded)",
    ]);
    expect(unread).toEqual(JSON.parse(JSON.stringify(thinned.series.excluded)));
    expect(edited).toEqual(JSON.parse(JSON.stringify(thinned.series.excluded.slice(0, 2))));
  });

  it("passes a read excluded list back as read, also through a spread copy, and keeps a cell's edit of one record", async () => {
    const thinned = logResample(host.series, { pointsPerDecade: 10 });
    const [copied, edited] = await shown([
      { kind: "data", name: "rec", source: csv },
      `const imp = aq.parseObservationCsv(rec.csv, ${JSON.stringify(OPTIONS)});\n` +
        "const copy = { ...imp.series, name: 'OB-T copy' };\n" +
        "show.json(aq.logResample(copy, { pointsPerDecade: 10 }).series.excluded);\n" +
        "copy.excluded[5].reason = 'checked by hand';\n" +
        "show.json(aq.logResample(copy, { pointsPerDecade: 10 }).series.excluded[5])",
    ]);
    expect(copied).toEqual(JSON.parse(JSON.stringify(thinned.series.excluded)));
    expect(edited).toEqual({ ...JSON.parse(JSON.stringify(thinned.series.excluded[5])), reason: "checked by hand" });
  });

  it("gives a cell a data table's text column and CSV text when read, as the host reads them", async () => {
    const text = "when,level,note\n2026-03-04T08:00:00Z,1.5,start\n2026-03-04T08:01:00Z,,gap\n";
    const [beforeRead, column, note, rows, same] = await shown([
      { kind: "data", name: "log", source: text },
      'show.json(["when", "level", "note"].map((k) => typeof Object.getOwnPropertyDescriptor(log.byColumn, k).get).concat(typeof Object.getOwnPropertyDescriptor(log, "csv").get));\n' +
        "show.json(log.byColumn.when);\n" +
        "log.byColumn.note[0] = 'edited';\n" +
        "show.json(log.byColumn.note);\n" +
        "show.json(log.rows);\n" +
        "show.json(log.csv === " + JSON.stringify(text) + ")",
    ]);
    expect(beforeRead).toEqual(["function", "undefined", "function", "function"]);
    expect(column).toEqual(["2026-03-04T08:00:00Z", "2026-03-04T08:01:00Z"]);
    expect(note).toEqual(["edited", "gap"]);
    expect(rows).toEqual([
      { when: "2026-03-04T08:00:00Z", level: 1.5, note: "start" },
      { when: "2026-03-04T08:01:00Z", level: null, note: "gap" },
    ]);
    expect(same).toBe(true);
  });
});
