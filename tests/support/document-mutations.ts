/**
 * Seeded mutations of Conebook documents for the parser's fuzz tests (tests/parser-fuzz.test.ts, fast) and
 * tests/soak/parser-fuzz.ts (long): what a careless edit, a bad merge, a wrong editor setting or a hostile author
 * does to a file. Deterministic for a seed (mulberry32), so a failure is reproduced by its run number.
 */
import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { DocumentError, parseDocument, serializeDocument } from "@conebook/document";

/** A small, fast 32-bit generator (mulberry32, public domain); uniform in [0, 1). */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Every notebook and template of the repository, by file name. */
export function corpus(root: string): { name: string; text: string }[] {
  const out: { name: string; text: string }[] = [];
  for (const folder of ["notebooks", "notebooks/templates"]) {
    for (const f of readdirSync(join(root, folder)).sort()) {
      if (f.endsWith(".cone.md")) out.push({ name: `${folder}/${f}`, text: readFileSync(join(root, folder, f), "utf8") });
    }
  }
  return out;
}

/** Text a mutation inserts: fences, markers, header and YAML fragments, control characters, odd line ends. */
const SNIPPETS = [
  "```",
  "\n```\n",
  "\n```ts code:intruder\n",
  "\n```json outputs:intruder\n{\"broken\": [\n",
  "\n```csv data:intruder\nt,s\n1,\n",
  "\n```yaml chart:intruder\nmark: [\n",
  "\n---\n",
  "\n...\n",
  "\n[narrative:intruder]: #\n",
  "\nanchor: &a [1, 2]\nalias: *a\n",
  "\n" + "- ".repeat(200) + "x\n",
  "\n" + "[".repeat(300) + "\n",
  "\u0000",
  "\u001b[31m",
  "\u0007\u0008\u007f",
  "\r",
  "\r\n",
  "\uFEFF",
  "\u2028\u2029",
  "\uD800",
  "{{site}}",
  "\t",
  "}",
  "{",
  ": ",
  "#",
  "<script>alert(1)</script>",
];

/** One mutation of the text, chosen and placed by the generator. */
export function mutate(text: string, random: () => number): string {
  const at = (n: number): number => Math.floor(random() * n);
  const lines = text.split("\n");
  const pos = at(text.length + 1);
  switch (at(10)) {
    case 0:
    case 1:
      return text.slice(0, pos) + SNIPPETS[at(SNIPPETS.length)]! + text.slice(pos);
    case 2: {
      const length = 1 + at(Math.min(400, text.length - pos + 1));
      return text.slice(0, pos) + text.slice(pos + length);
    }
    case 3: {
      const fences = lines.map((l, i) => (l.startsWith("```") ? i : -1)).filter((i) => i >= 0);
      if (fences.length === 0) return text;
      const i = fences[at(fences.length)]!;
      return [...lines.slice(0, i + 1), lines[i]!, ...lines.slice(i + 1)].join("\n");
    }
    case 4: {
      const closers = lines.map((l, i) => (l === "```" ? i : -1)).filter((i) => i >= 0);
      if (closers.length === 0) return text;
      const i = closers[at(closers.length)]!;
      return [...lines.slice(0, i), ...lines.slice(i + 1)].join("\n");
    }
    case 5: {
      const i = at(lines.length);
      const j = at(lines.length);
      const copy = lines.slice();
      [copy[i], copy[j]] = [copy[j]!, copy[i]!];
      return copy.join("\n");
    }
    case 6:
      return text.slice(0, pos) + "x".repeat(50_000 + at(100_000)) + text.slice(pos);
    case 7:
      return random() < 0.5 ? text.replace(/\n/g, "\r\n") : "\uFEFF" + text;
    case 8: {
      // A header line of the YAML turned into something else.
      const end = lines.indexOf("---", 1);
      if (end < 2) return text;
      const i = 1 + at(end - 1);
      const copy = lines.slice();
      copy[i] = random() < 0.5 ? `${copy[i]}: [unclosed` : `  ${copy[i]}`;
      return copy.join("\n");
    }
    default: {
      let out = text;
      for (let k = 0; k < 3; k++) {
        const p = at(out.length + 1);
        out = out.slice(0, p) + String.fromCharCode(at(0x80)) + out.slice(p);
      }
      return out;
    }
  }
}

/** What a fuzz run saw. */
export interface FuzzResult {
  runs: number;
  sources: number;
  parsed: number;
  refused: number;
  /** Run number, source and the exception of every parse or serialize that threw something else. */
  crashes: string[];
  /** Run number and source of every parsed document that did not write back byte for byte (or not stably with ids). */
  lossy: string[];
}

/** Mutates the sources `runs` times (one to three mutations each) and parses and serializes every result. */
export function fuzzDocuments(sources: { name: string; text: string }[], runs: number, seed: number): FuzzResult {
  const random = mulberry32(seed);
  const result: FuzzResult = { runs, sources: sources.length, parsed: 0, refused: 0, crashes: [], lossy: [] };
  for (let run = 0; run < runs; run++) {
    const source = sources[run % sources.length]!;
    let text = source.text;
    const count = 1 + Math.floor(random() * 3);
    for (let k = 0; k < count; k++) text = mutate(text, random);
    try {
      const { document } = parseDocument(text, { file: source.name });
      result.parsed++;
      // Without the ids the reader assigned, the text comes back as read; with them (the default, docs/format.md),
      // the written text is a fixed point: read and written again, it stays as it is.
      if (serializeDocument(document, { writeAssignedIds: false }) !== text) result.lossy.push(`run ${run} of ${source.name}: not byte for byte`);
      else {
        const written = serializeDocument(document);
        if (serializeDocument(parseDocument(written).document) !== written) result.lossy.push(`run ${run} of ${source.name}: ids written not stable`);
      }
    } catch (e) {
      if (e instanceof DocumentError && e.line >= 1) result.refused++;
      else result.crashes.push(`run ${run} of ${source.name}: ${e instanceof Error ? `${e.name}: ${e.message}` : String(e)}`);
    }
  }
  return result;
}

/** A valid document of about `bytes` characters: an invented header, then narrative, code and data cells in turn. */
export function largeDocument(bytes: number): string {
  const head = "---\nconebook: 1\ntitle: Large document at Fenwick Reach (invented)\nseed: 1\n---\n\n";
  const parts: string[] = [head];
  let size = head.length;
  for (let i = 0; size < bytes; i++) {
    const block =
      `[narrative:n${i}]: #\n\nReading ${i} of the invented record at FR-OB${i % 9}: the level fell as expected.\n\n` +
      "```ts code:c" + i + "\nconst s" + i + " = aq.drawdown(\"theis\", { T: 300, S: 2e-4 }, { r: 30, Q: 1000 }, [1, 10, 100]);\n```\n\n" +
      "```csv data:d" + i + "\nt_min,s_m\n1,0.12\n10,0.31\n100,0.52\n```\n\n";
    parts.push(block);
    size += block.length;
  }
  return parts.join("");
}
