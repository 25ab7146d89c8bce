/**
 * Large documents made from the repository's notebooks and templates, for the parser's linearity test
 * (parse-time.test.ts) and its benchmark (tests/bench/sections/document-parse.ts). Deterministic: the same size
 * always gives the same text.
 */
import { readdirSync, readFileSync } from "node:fs";

const ROOT = new URL("../../../", import.meta.url);

/** Every notebook and template of the repository (notebooks/, notebooks/templates/), sorted by path. */
export function notebookTexts(): string[] {
  const out: string[] = [];
  for (const folder of ["notebooks/", "notebooks/templates/"]) {
    const dir = new URL(folder, ROOT);
    for (const f of readdirSync(dir).sort()) if (f.endsWith(".cone.md")) out.push(readFileSync(new URL(f, dir), "utf8"));
  }
  return out;
}

/** The text after a document's header (from the line ending of its closing "---"). */
function bodyOf(text: string): string {
  const close = /\n(?:---|\.\.\.)[ \t]*\n/.exec(text.slice(3))!;
  return text.slice(3 + close.index + close[0].length - 1);
}

/** The header of the demo notebook (Kestrel Moor), through its closing "---". */
function demoHeader(texts: string[]): string {
  const demo = texts.find((t) => t.includes("Kestrel Moor")) ?? texts[0]!;
  return demo.slice(0, demo.length - bodyOf(demo).length);
}

/** A body whose cell ids, data names and review marks carry the suffix, so copies do not collide. */
function renamed(body: string, suffix: string): string {
  return body
    .replace(/\b(code|data|chart|outputs|narrative|review):([A-Za-z][A-Za-z0-9_-]*)/g, (_m, kind: string, id: string) => `${kind}:${id.slice(0, 50)}-${suffix}`)
    .replace(/"on ([A-Za-z][A-Za-z0-9_-]*), (open|resolved)"/g, (_m, id: string, status: string) => `"on ${id.slice(0, 50)}-${suffix}, ${status}"`)
    .replace(/\bname=([A-Za-z_][A-Za-z0-9_]*)/g, (_m, name: string) => `name=${name}_${suffix.replace(/-/g, "_")}`);
}

/**
 * A document of at least `bytes` characters: the demo's header; a long narrative cell (a tenth of the size, in
 * paragraphs of invented prose); an inline data cell of invented readings (a fifth of the size); then the bodies
 * of every notebook and template in turn, with renamed ids, until the size is reached.
 */
export function documentFromNotebooks(bytes: number, texts: string[] = notebookTexts()): string {
  const parts: string[] = [demoHeader(texts), "\n\n[narrative:long-note]: #\n\n"];
  let size = parts[0]!.length + parts[1]!.length;
  const push = (s: string): void => {
    parts.push(s);
    size += s.length;
  };
  for (let i = 0; size < bytes / 10; i++) {
    push(`Reading round ${i} at the invented observation well KM-OB${1 + (i % 2)}: the logger was read, its clock checked and the depth to water noted. `.repeat(4) + "\n\n");
  }
  push("```csv data:long-record name=long_record\nt_min,s_m\n");
  const dataEnd = size + bytes / 5;
  for (let i = 0; size < dataEnd; i++) push(`${(0.5 * (i + 1)).toFixed(1)},${(0.31 * Math.log(1 + 0.5 * (i + 1))).toFixed(4)}\n`);
  push("```\n");
  for (let copy = 0; size < bytes; copy++) {
    texts.forEach((text, n) => {
      if (size < bytes) push(renamed(bodyOf(text), `r${copy}n${n}`));
    });
  }
  return parts.join("");
}
