import { describe, it, expect } from "vitest";
import fc from "fast-check";
import { readCsvRecords } from "../src/data/index.js";
import { detectSeparator, offsetOfLine } from "../src/data/csv-records.js";
import type { CsvSeparator } from "../src/data/index.js";

const fieldsOf = (text: string, separator: CsvSeparator = ",") => readCsvRecords(text, separator).records.map((r) => r.fields);

describe("reading CSV records per RFC 4180 section 2", () => {
  it("splits records at CRLF line breaks (RFC 4180 section 2.1)", () => {
    expect(fieldsOf("aaa,bbb,ccc\r\nzzz,yyy,xxx\r\n")).toEqual([
      ["aaa", "bbb", "ccc"],
      ["zzz", "yyy", "xxx"],
    ]);
  });

  it("reads a last record that has no line break (RFC 4180 section 2.2)", () => {
    expect(fieldsOf("aaa,bbb,ccc\r\nzzz,yyy,xxx")).toEqual([
      ["aaa", "bbb", "ccc"],
      ["zzz", "yyy", "xxx"],
    ]);
  });

  it("accepts LF and lone CR line breaks as well as CRLF (beyond RFC 4180 section 2.1)", () => {
    expect(fieldsOf("a,b\nc,d\re,f\r\ng,h")).toEqual([
      ["a", "b"],
      ["c", "d"],
      ["e", "f"],
      ["g", "h"],
    ]);
  });

  it("reads the header line like any record (RFC 4180 section 2.3)", () => {
    expect(fieldsOf("field_name,field_name,field_name\r\naaa,bbb,ccc\r\n")[0]).toEqual(["field_name", "field_name", "field_name"]);
  });

  it("keeps spaces as part of a field and reads empty fields, also a trailing one (RFC 4180 section 2.4)", () => {
    expect(fieldsOf(" aaa , b b,\r\n,,")).toEqual([
      [" aaa ", " b b", ""],
      ["", "", ""],
    ]);
  });

  it("removes the enclosing quotes of quoted fields (RFC 4180 section 2.5)", () => {
    expect(fieldsOf('"aaa","bbb","ccc"\r\nzzz,yyy,xxx')).toEqual([
      ["aaa", "bbb", "ccc"],
      ["zzz", "yyy", "xxx"],
    ]);
  });

  it("keeps line breaks and separators inside quoted fields (RFC 4180 section 2.6)", () => {
    expect(fieldsOf('"aaa","b\r\nbb","ccc"\r\nzzz,"y,y\ny",xxx')).toEqual([
      ["aaa", "b\r\nbb", "ccc"],
      ["zzz", "y,y\ny", "xxx"],
    ]);
  });

  it("turns a doubled quote inside a quoted field into one quote (RFC 4180 section 2.7)", () => {
    expect(fieldsOf('"aaa","b""bb","ccc"')).toEqual([["aaa", 'b"bb', "ccc"]]);
    expect(fieldsOf('"""",""""""')).toEqual([['"', '""']]);
  });

  it("reads an empty quoted field as an empty field, not as a blank line (RFC 4180 sections 2.5 and 2.7)", () => {
    expect(fieldsOf('""\r\n\r\nx')).toEqual([[""], ["x"]]);
  });

  it("numbers each record by the physical line where it starts, counting breaks inside quotes", () => {
    const { records } = readCsvRecords('t,s,note\r\n1,0.1,"pump\r\nrestarted"\r\n2,0.2,ok\n\n3,0.3,""', ",");
    expect(records.map((r) => r.line)).toEqual([1, 2, 4, 6]);
  });

  it("starts line numbers at the given first line for text cut from a longer file", () => {
    expect(readCsvRecords("a;b\n1;2", ";", 7).records.map((r) => r.line)).toEqual([7, 8]);
  });

  it("skips a leading byte order mark", () => {
    expect(fieldsOf("\uFEFFt,s\n1,2")).toEqual([
      ["t", "s"],
      ["1", "2"],
    ]);
  });

  it("reads semicolon- and tab-separated text, where commas are plain characters", () => {
    expect(fieldsOf("t;s\n1,5;0,25", ";")).toEqual([
      ["t", "s"],
      ["1,5", "0,25"],
    ]);
    expect(fieldsOf("t\ts\n1,5\t0,25", "\t")).toEqual([
      ["t", "s"],
      ["1,5", "0,25"],
    ]);
  });
});

describe("reporting breaches of RFC 4180 syntax", () => {
  it("reports a quoted field that is never closed, on the line where it opens", () => {
    const { problems } = readCsvRecords('t,s\n1,0.1\n2,"0.2\n3,0.3\n', ",");
    expect(problems).toHaveLength(1);
    expect(problems[0]).toMatchObject({ line: 3, field: 2, kind: "unterminated-quote" });
    expect(problems[0]!.message).toBe("the quoted field that opens on line 3 is never closed");
  });

  it("reports a double quote inside an unquoted field (RFC 4180 section 2.5)", () => {
    const { problems } = readCsvRecords('t,s\n1,0.1"\n', ",");
    expect(problems).toEqual([
      expect.objectContaining({ line: 2, field: 2, kind: "stray-quote", message: 'field 2 is not quoted but contains a double quote: "0.1\\""' }),
    ]);
  });

  it("reports text after a closing quote and keeps reading the next records", () => {
    const { records, problems } = readCsvRecords('t,s\n"1"x,0.1\n2,0.2', ",");
    expect(problems).toEqual([expect.objectContaining({ line: 2, field: 1, kind: "text-after-quote" })]);
    expect(records.map((r) => r.fields)).toEqual([
      ["t", "s"],
      ["1x", "0.1"],
      ["2", "0.2"],
    ]);
  });
});

describe("detecting the separator from the header row", () => {
  it("picks the separator that occurs most often outside quotes", () => {
    expect(detectSeparator("time;drawdown;note\n1,2,3,4,5,6")).toBe(";");
    expect(detectSeparator('"time, min",drawdown\n')).toBe(",");
    expect(detectSeparator('"a;b;c"\t"d;e"\tf')).toBe("\t");
  });

  it("gives no answer when no candidate occurs or two tie", () => {
    expect(detectSeparator("drawdown\n1")).toBeNull();
    expect(detectSeparator("a,b;c")).toBeNull();
  });
});

describe("finding the offset of a line", () => {
  it("counts CRLF, LF and CR as one line break each", () => {
    const text = "x\r\ny\nz\rw";
    expect([1, 2, 3, 4].map((n) => text.slice(offsetOfLine(text, n))[0])).toEqual(["x", "y", "z", "w"]);
    expect(offsetOfLine(text, 5)).toBe(-1);
  });
});

/** Writes records as RFC 4180 text: a field is quoted when it is empty or holds a quote, separator or line break (section 2.6). */
function writeCsv(rows: string[][], separator: CsvSeparator, lineBreak: string, finalBreak: boolean): string {
  const quote = (f: string) => (f === "" || /["\r\n,;\t]/.test(f) ? `"${f.replaceAll('"', '""')}"` : f);
  return rows.map((r) => r.map(quote).join(separator)).join(lineBreak) + (finalBreak ? lineBreak : "");
}

describe("round trip through RFC 4180 text", () => {
  it("reads back any records written per sections 2.5 to 2.7, with the line where each starts", () => {
    const field = fc.string({ unit: fc.constantFrom("a", "7", " ", ".", ",", ";", "\t", '"', "\r", "\n", "\r\n", "é") });
    const table = fc.integer({ min: 1, max: 4 }).chain((width) => fc.array(fc.array(field, { minLength: width, maxLength: width }), { minLength: 1, maxLength: 8 }));
    fc.assert(
      fc.property(table, fc.constantFrom<CsvSeparator>(",", ";", "\t"), fc.constantFrom("\r\n", "\n"), fc.boolean(), (rows, separator, lineBreak, finalBreak) => {
        const text = writeCsv(rows, separator, lineBreak, finalBreak);
        const { records, problems } = readCsvRecords(text, separator);
        expect(problems).toEqual([]);
        expect(records.map((r) => r.fields)).toEqual(rows);
        let line = 1;
        rows.forEach((row, k) => {
          expect(records[k]!.line).toBe(line);
          const written = writeCsv([row], separator, lineBreak, false);
          line += (written.match(/\r\n|\r|\n/g) ?? []).length + 1;
        });
      }),
      { numRuns: 300 },
    );
  });
});
