/** fast-check generators of random, valid Conebook documents, used by the property tests. */

import fc from "fast-check";
import { HEADER_KEYS, isReservedName } from "../src/index.js";
import type { Cell, CellOutput, ConebookDocument, DocumentHeader, TemplateParameter } from "../src/index.js";

const start = { line: 1, column: 1 };

/** Finite doubles without -0 (JSON cannot keep the sign of zero). */
const num = fc.double({ noNaN: true, noDefaultInfinity: true }).map((x) => (Object.is(x, -0) ? 0 : x));

/** Text pieces that stress the format: fences, markers-lookalikes, quotes, unicode, backslashes. */
const piece = fc.constantFrom(
  "a", "word", " ", "  ", "`", "``", "```", "~~~", "````", "#", "- ", "> ", "*", "_", "[", "]", "(", ")", ":", "=", '"', "'", "\\",
  "<b>", "&amp;", "é", "Δs", "井戸", "🌊", "\t", "0.001", "1e-7", "---", "...", "{", "}", "|", "!", "%",
);
const line = fc.array(piece, { maxLength: 8 }).map((ps) => ps.join(""));

/** Multi-line text with LF, CRLF or lone-CR line endings. */
export const anyText = fc
  .tuple(fc.array(line, { maxLength: 6 }), fc.array(fc.constantFrom("\n", "\r\n", "\r"), { minLength: 6, maxLength: 6 }))
  .map(([ls, eols]) => ls.map((l, i) => (i === 0 ? l : eols[i - 1] + l)).join(""));

const cellEol = fc.constantFrom("\n", "\r\n");

/** Narrative Markdown that closes everything it opens: paragraphs, headings, lists, fences, quotes. */
const word = fc.constantFrom("drawdown", "Theis", "`s = Q/4πT`", "**T**", "_S_", "a <b> c", "é", "🌊", "井戸", "x`y", "[link](https://example.invalid)", "1.5 m", "\\*");
const words = fc.array(word, { minLength: 1, maxLength: 6 }).map((w) => w.join(" "));
const block = fc.oneof(
  words,
  words.map((w) => `## ${w}`),
  fc.array(words, { minLength: 1, maxLength: 3 }).map((ws) => ws.map((w) => `- ${w}`).join("\n")),
  fc.tuple(fc.constantFrom("ts", "", "python", "json outputs:x"), anyText.filter((t) => !/(^|[\r\n]) {0,3}```/.test(t) && !t.includes("\r")))
    .map(([info, body]) => `\`\`\`${info}\n${body}\n\`\`\``),
  fc.constant("~~~\n```ts code:inside\n1\n```\n~~~"),
  fc.constant("> ```ts code:quoted\n> 1\n> ```"),
  words.map((w) => `    indented ${w}`),
);
export const narrativeSource = fc
  .tuple(fc.array(block, { minLength: 1, maxLength: 4 }), cellEol)
  .map(([bs, eol]) => bs.join("\n\n").replace(/\n/g, eol));

const idArb = fc.stringMatching(/^[a-z][a-z0-9_-]{0,10}$/);

const outputArb: fc.Arbitrary<CellOutput> = fc.oneof(
  fc.record({ type: fc.constant("value"), value: num, label: fc.option(fc.string(), { nil: undefined }), unit: fc.option(fc.constantFrom("m", "m2/s", "s"), { nil: undefined }) }, { requiredKeys: ["type", "value"] }) as fc.Arbitrary<CellOutput>,
  fc.record({ type: fc.constant("text" as const), text: fc.oneof(fc.string(), anyText) }),
  fc.record({
    type: fc.constant("table" as const),
    columns: fc.array(fc.record({ name: fc.string(), unit: fc.constantFrom("m", "s") }), { maxLength: 3 }),
    rows: fc.array(fc.array(fc.oneof(num, fc.string(), fc.constant(null)), { maxLength: 3 }), { maxLength: 30 }),
  }),
  fc.record({
    type: fc.constant("chart" as const),
    spec: fc.dictionary(fc.string(), fc.jsonValue()),
    summary: fc.record({ datasets: fc.array(fc.record({ name: fc.string(), rows: fc.nat(), fields: fc.array(fc.record({ name: fc.string(), min: num, max: num })) }), { maxLength: 2 }) }),
  }) as fc.Arbitrary<CellOutput>,
  fc.record({ type: fc.constant("json" as const), value: fc.jsonValue() }),
  fc.record({ type: fc.constant("control" as const), name: fc.string(), value: num, default: num, min: num, max: num }),
  fc.record({ type: fc.constant("error" as const), message: anyText, line: fc.nat(), column: fc.nat() }),
  fc.record({ type: fc.constant("not-run" as const), reason: fc.string() }),
);
export const outputsArb = fc.array(outputArb, { maxLength: 4 });

const chartSpec = fc.dictionary(fc.string().filter((k) => k !== "data" && k !== "usermeta" && k !== "__proto__"), fc.jsonValue(), { maxKeys: 4 });

type CellSeed = (id: string, index: number) => Cell;

const cellArb: fc.Arbitrary<CellSeed> = fc.oneof(
  narrativeSource.map((source): CellSeed => (id) => ({ id, kind: "narrative", source, sourceStart: start, outputs: [] })),
  fc.tuple(anyText, outputsArb).map(([source, outputs]): CellSeed => (id) => ({ id, kind: "code", language: "ts", source, sourceStart: start, outputs })),
  fc.tuple(anyText, outputsArb, fc.boolean(), fc.constantFrom("data/a b.csv", "rec.csv", "x/y`z.csv"), fc.stringMatching(/^[0-9a-f]{64}$/)).map(
    ([source, outputs, withFile, path, sha]): CellSeed =>
      (id, i) => ({
        id,
        kind: "data",
        name: `set_${i}`,
        format: "csv",
        source: withFile ? "" : source,
        ...(withFile ? { file: { path, sha256: sha } } : {}),
        sourceStart: start,
        outputs,
      }),
  ),
  fc.tuple(chartSpec, fc.constantFrom("json" as const, "yaml" as const), outputsArb).map(
    ([spec, specFormat, outputs]): CellSeed => (id) => ({ id, kind: "chart", spec, specFormat, source: "", sourceStart: start, outputs }),
  ),
);

const paramArb: fc.Arbitrary<TemplateParameter> = fc
  .tuple(fc.stringMatching(/^[a-z][a-z0-9]{0,5}$/).filter((n) => !isReservedName(n)), num, num, fc.double({ min: 0, max: 1, noNaN: true }), fc.option(fc.string(), { nil: undefined }), fc.option(fc.string(), { nil: undefined }))
  .map(([name, a, b, f, unit, description]) => {
    const [min, max] = a <= b ? [a, b] : [b, a];
    const value = Math.min(max, Math.max(min, min + f * (max - min)));
    const p: TemplateParameter = { name, value: Number.isFinite(value) ? value : min, range: [min, max] };
    if (unit !== undefined) p.unit = unit;
    if (description !== undefined) p.description = description;
    return p;
  });

export const headerArb: fc.Arbitrary<DocumentHeader> = fc
  .record({
    title: fc.oneof(fc.string(), anyText, fc.constantFrom("1e3", "true", "null", "a: b", "# x", "- y")),
    seed: fc.integer(),
    libraryVersion: fc.option(fc.constantFrom("0.1.0", "1.2.3-beta.1"), { nil: undefined }),
    timeLimitMs: fc.option(fc.integer({ min: 1, max: 600000 }), { nil: undefined }),
    memoryLimitMb: fc.option(fc.integer({ min: 1, max: 1024 }), { nil: undefined }),
    parameters: fc.uniqueArray(paramArb, { selector: (p) => p.name, maxLength: 3 }),
    dataSlots: fc.option(fc.array(fc.record({ name: fc.string({ minLength: 1 }).filter((n) => !isReservedName(n)), description: fc.string() }), { maxLength: 2 }), { nil: undefined }),
    extra: fc.dictionary(fc.stringMatching(/^[a-z][a-zA-Z0-9]{0,6}$/).filter((k) => !(HEADER_KEYS as readonly string[]).includes(k)), fc.jsonValue(), { maxKeys: 3 }),
  })
  .map((h) => {
    const header: DocumentHeader = { title: h.title, formatVersion: 1, seed: h.seed, parameters: h.parameters, extra: h.extra };
    if (h.libraryVersion !== undefined) header.libraryVersion = h.libraryVersion;
    if (h.timeLimitMs !== undefined) header.timeLimitMs = h.timeLimitMs;
    if (h.memoryLimitMb !== undefined) header.memoryLimitMb = h.memoryLimitMb;
    if (h.dataSlots !== undefined) header.dataSlots = h.dataSlots;
    return header;
  });

/** A random valid document built in memory (no layout, no origins). */
export const documentArb: fc.Arbitrary<ConebookDocument> = fc
  .tuple(headerArb, fc.array(cellArb, { maxLength: 7 }))
  .chain(([header, seeds]) =>
    fc.uniqueArray(idArb, { minLength: seeds.length, maxLength: seeds.length }).map((ids) => ({
      header,
      cells: seeds.map((seed, i) => seed(ids[i]!, i)),
    })),
  );

/** The meaning of a cell, without positions and the parser's bookkeeping, for comparing round trips. */
export function cellContent(cell: Cell): unknown {
  const { origin: _origin, sourceStart: _start, ...rest } = cell;
  if (rest.kind === "chart") {
    const { source: _source, ...chart } = rest;
    return JSON.parse(JSON.stringify(chart));
  }
  return JSON.parse(JSON.stringify(rest));
}
