/** The parser's table of line offsets finds the lines splitLines finds (CommonMark: "\r\n", "\n" and "\r" end a line). */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { LineTable, splitLines } from "../src/text.js";

describe("LineTable", () => {
  it("holds the start, end and line-ending end of every line splitLines returns", () => {
    const text = fc.array(fc.constantFrom("a", "b c", "\n", "\r", "\r\n", "\n\n", "\u2028", ""), { maxLength: 40 }).map((parts) => parts.join(""));
    fc.assert(
      fc.property(text, (t) => {
        const table = new LineTable(t);
        const lines = splitLines(t);
        expect(table.length).toBe(lines.length);
        lines.forEach((l, i) => expect([table.start(i), table.end(i), table.eolEnd(i)]).toEqual([l.start, l.end, l.eolEnd]));
      }),
      { numRuns: 2000 },
    );
  });

  it("reads a text without line endings as one line", () => {
    const table = new LineTable("no line ending");
    expect([table.length, table.start(0), table.end(0), table.eolEnd(0)]).toEqual([1, 0, 14, 14]);
  });
});
