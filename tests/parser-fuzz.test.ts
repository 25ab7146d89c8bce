/**
 * The parser never crashes: seeded mutations of every notebook and template (tests/support/document-mutations.ts:
 * insertions of fences, header lines, YAML aliases, control characters, NUL, a byte order mark, CRLF, huge lines;
 * deletions, duplicated and unclosed fences, swapped lines) go through parseDocument and serializeDocument. Each
 * either is refused with a DocumentError at a line (a header the format cannot read) or parses, and then writes
 * back byte for byte without the ids the reader assigned, and stably with them (docs/format.md: the file survives a
 * read-write cycle byte for byte; text the parser does not understand stays as it was). Parse time grows
 * linearly: twice the text in under three times the time. The command answers mutated files with exit 0, 1 or 2
 * and a file:line message, never a stack trace. The long version is tests/soak/parser-fuzz.ts (npm run soak).
 */
import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { DocumentError, parseDocument, serializeDocument } from "@conebook/document";
import { corpus, fuzzDocuments, largeDocument, mutate, mulberry32 } from "./support/document-mutations.js";

const ROOT = fileURLToPath(new URL("..", import.meta.url));
const CLI = join(ROOT, "packages/cli/dist/conebook.js");

describe("the parser under mutated documents", () => {
  it("throws nothing but a located DocumentError on 2,000 mutated documents and round-trips every parsed one byte for byte", () => {
    const result = fuzzDocuments(corpus(ROOT), 2000, 20261204);
    expect(result.crashes).toEqual([]);
    expect(result.lossy).toEqual([]);
    expect(result.parsed + result.refused).toBe(2000);
    // Most mutations leave a readable header: the parse path, not only the refusal, is exercised.
    expect(result.parsed).toBeGreaterThan(1000);
    console.log(
      `parser: ${result.runs} mutated documents of ${result.sources} notebooks and templates, 0 uncaught exceptions, ` +
        `${result.parsed} parsed and written back byte for byte, ${result.refused} refused at a line`,
    );
  }, 60_000);

  it("parses in time linear in the text: twice the text in under three times the time", () => {
    const small = largeDocument(2 * 2 ** 20);
    const large = largeDocument(4 * 2 ** 20);
    const time = (text: string): number => {
      let best = Infinity;
      for (let i = 0; i < 3; i++) {
        const t0 = performance.now();
        const { document, diagnostics } = parseDocument(text);
        best = Math.min(best, performance.now() - t0);
        expect(document.cells.length).toBeGreaterThan(10_000);
        expect(diagnostics).toEqual([]);
      }
      return best;
    };
    const tSmall = time(small);
    const tLarge = time(large);
    expect(serializeDocument(parseDocument(large).document)).toBe(large);
    console.log(`parser: 2 MB in ${tSmall.toFixed(0)} ms, 4 MB in ${tLarge.toFixed(0)} ms (${((large.length / 2 ** 20 / tLarge) * 1000).toFixed(1)} MB/s)`);
    expect(tLarge / tSmall).toBeLessThan(3);
  }, 60_000);

  it("refuses a document without its header at line 1 with a DocumentError, not another exception", () => {
    try {
      parseDocument("no header here\n");
      expect.unreachable("a document without a header parsed");
    } catch (e) {
      expect(e).toBeInstanceOf(DocumentError);
      expect((e as DocumentError).line).toBe(1);
    }
  });

  it("answers mutated files through the command with exit 0, 1 or 2 and a file:line message, never a stack trace", () => {
    const dir = mkdtempSync(join(tmpdir(), "conebook-fuzz-"));
    const sources = corpus(ROOT).filter((s) => s.name.includes("tollin-brook") || s.name.includes("constant-rate-test"));
    const random = mulberry32(7);
    const codes: number[] = [];
    for (let i = 0; i < 8; i++) {
      const source = sources[i % sources.length]!;
      const file = `mutant-${i}.cone.md`;
      writeFileSync(join(dir, file), mutate(source.text, random));
      const r = spawnSync(process.execPath, [CLI, "verify", file], { cwd: dir, encoding: "utf8", timeout: 60_000 });
      expect(r.status, r.stderr).not.toBeNull();
      codes.push(r.status!);
      expect([0, 1, 2]).toContain(r.status);
      const all = `${r.stdout}\n${r.stderr}`;
      expect(all).not.toMatch(/^\s+at .+:\d+:\d+\)?$/m);
      expect(all).not.toContain("internal error");
      if (r.status === 2) expect(r.stderr).toMatch(new RegExp(`${file.replace(/\./g, "\\.")}(:\\d+)+`));
    }
    expect(codes.length).toBe(8);
    expect(readFileSync(join(dir, "mutant-0.cone.md")).length).toBeGreaterThan(0);
  }, 120_000);
});
