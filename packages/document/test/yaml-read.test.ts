/**
 * YAML in headers and chart specifications: duplicate keys are found in linear time (the `yaml` package's own
 * check compares each key with every earlier one), the first error is the one the package's check reports, and
 * what the reader passes over (an unresolved tag, a list or mapping used as a key) becomes a warning at
 * file:line:column instead of a line the package prints to stderr.
 */
import { afterEach, describe, expect, it, vi } from "vitest";
import { parseDocument as parseYamlWithPackageCheck } from "yaml";
import { DocumentError, messages, parseDocument, serializeDocument } from "../src/index.js";
import { RECHECK_COMPARISONS, parseYamlDocument, readYamlValue } from "../src/yaml-read.js";
import { lines } from "./helpers.js";

const header = (...yaml: string[]) => lines("---", "conebook: 1", "title: t", "seed: 1", ...yaml, "---");
const withChart = (...yaml: string[]) => header() + lines("", "```yaml chart:c", ...yaml, "```");

function refusal(text: string): DocumentError {
  try {
    parseDocument(text, { file: "y.cone.md" });
  } catch (e) {
    if (e instanceof DocumentError) return e;
    throw e;
  }
  throw new Error("expected a DocumentError, got a parsed document");
}

/** CPU-independent enough for a ratio: the best of three wall-clock times of `f`, ms. */
function bestTime(f: () => unknown): number {
  let best = Infinity;
  for (let i = 0; i < 3; i++) {
    const t0 = performance.now();
    f();
    best = Math.min(best, performance.now() - t0);
  }
  return best;
}

afterEach(() => vi.restoreAllMocks());

describe("duplicate keys", () => {
  it("refuses a duplicate header key at its line, with the package's message", () => {
    const e = refusal(header("site: Kestrel Moor", "site: Harrow Lea"));
    expect([e.code, e.line, e.column]).toEqual(["header-yaml", 6, 1]);
    expect(e.message).toBe(`y.cone.md:6:1: ${messages.headerYaml("Map keys must be unique").message}`);
  });

  it("reports the same first error as the package's own check when a duplicate comes with other errors", () => {
    const texts = [
      "a: 1\na: 2\nb: [unclosed\n",
      "b: [unclosed\na: 1\na: 2\n",
      "m: {x: 1, y: [1, {z: 1, z: 2}], x: 3}\n",
      "? [p]\n: 1\n? [p]\n: 2\n1: x\n1.0: y\n",
      ".nan: 1\n.NaN: 2\n~: a\nnull: b\n",
    ];
    for (const text of texts) {
      const ours = parseYamlDocument(text).errors.map((e) => [e.code, e.pos[0]]);
      const theirs = parseYamlWithPackageCheck(text, { uniqueKeys: true, logLevel: "error" }).errors.map((e) => [e.code, e.pos[0]]);
      expect(ours, text).toEqual(theirs);
    }
  });

  it("places a duplicate in a mapping too large to check twice at its key", () => {
    const keys = Math.ceil(Math.sqrt(2 * RECHECK_COMPARISONS)) + 10;
    const yaml = Array.from({ length: keys }, (_, i) => `k${i}: ${i}`);
    yaml.splice(1000, 0, "k7: again");
    const e = refusal(header("notes:", ...yaml.map((l) => `  ${l}`)));
    expect([e.code, e.line, e.column]).toEqual(["header-yaml", 6 + 1000, 3]);
  });

  it("reads a header mapping of four times the keys in less than eight times the time (the package's check: sixteen)", () => {
    const make = (n: number) => header("notes:", ...Array.from({ length: n }, (_, i) => `  k${i}: the level fell at the invented well`));
    const small = make(5000);
    const large = make(20000);
    const tSmall = bestTime(() => parseDocument(small));
    const tLarge = bestTime(() => parseDocument(large));
    expect(parseDocument(large).document.header.extra.notes).toMatchObject({ k19999: "the level fell at the invented well" });
    expect(tLarge / tSmall).toBeLessThan(8);
  });

  it("reads a chart mapping of 20,000 keys and refuses a duplicate one at the chart's source", () => {
    const keys = Array.from({ length: 20000 }, (_, i) => `  f${i}: ${i}`);
    const parsed = parseDocument(withChart("mark: point", "usermeta:", ...keys));
    const chart = parsed.document.cells[0]!;
    expect(chart.kind === "chart" && (chart.spec.usermeta as Record<string, number>).f19999).toBe(19999);
    const dup = parseDocument(withChart("mark: point", "mark: line"), { file: "y.cone.md" });
    expect(dup.diagnostics.map((d) => [d.code, d.line, d.message])).toEqual([["chart-syntax", 8, messages.chartSyntax("YAML", "Map keys must be unique").message]]);
  });
});

describe("what the YAML reader passes over", () => {
  it("becomes a warning at file:line:column and nothing is printed", () => {
    const emitted = vi.spyOn(process, "emitWarning");
    const warned = vi.spyOn(console, "warn");
    const text = header("? [a, b]", ": 1", "site: !custom Kestrel Moor") + lines("", "```yaml chart:c", "mark: !shape point", "? {x: 1}", ": 2", "```");
    const { document, diagnostics } = parseDocument(text, { file: "y.cone.md" });
    expect(diagnostics.map((d) => [d.severity, d.code, d.line, d.column])).toEqual([
      ["warning", "yaml-passed-over", 5, 3],
      ["warning", "yaml-passed-over", 7, 7],
      ["warning", "yaml-passed-over", 11, 7],
      ["warning", "yaml-passed-over", 12, 3],
    ]);
    expect(diagnostics[0]!.message).toBe(messages.yamlPassedOver("header", 'a list used as a key ("[a, b]"), which is read as its text').message);
    expect(diagnostics[1]!.message).toBe(messages.yamlPassedOver("header", "Unresolved tag: !custom").message);
    expect(diagnostics[3]!.message).toContain('a mapping used as a key ("{x: 1}")');
    // The values are what the package makes of them; the text is written back as it was.
    expect(document.header.extra).toMatchObject({ "[ a, b ]": 1, site: "Kestrel Moor" });
    expect(serializeDocument(document, { writeAssignedIds: false })).toBe(text);
    expect(emitted).not.toHaveBeenCalled();
    expect(warned).not.toHaveBeenCalled();
  });

  it("is returned with the value of a chart's YAML, which equals the package's parse", () => {
    const text = "mark: !shape point\n? [a]\n: 1\nencoding: {x: {field: t}}\n";
    const emitted = vi.spyOn(process, "emitWarning").mockImplementation(() => undefined);
    const reading = readYamlValue(text);
    expect(emitted).not.toHaveBeenCalled();
    expect(reading.value).toEqual(parseYamlWithPackageCheck(text).toJS());
    expect(reading.notes.map((n) => n.offset)).toEqual([6, 21]);
  });
});
