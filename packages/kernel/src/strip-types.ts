/**
 * TypeScript to JavaScript for a cell, in-process, with sucrase (`transforms: ["typescript"]`,
 * `disableESTransforms: true`): types are removed and every line stays on its line, so an error's line in the
 * output is its line in the cell. Columns can move (a removed annotation shortens its line), so the token
 * source map sucrase writes is kept to map a column back to the cell's own column.
 */
import { transform } from "sucrase";

/** A cell's JavaScript and how to map its positions back to the TypeScript the user wrote. */
export interface StrippedCell {
  code: string;
  /** Maps a 1-based line and column of `code` to the 1-based column in the cell's source (same line). */
  sourceColumn(line: number, column: number): number;
}

/** A syntax error in a cell, at a 1-based line and column of the cell's source. */
export class CellSyntaxError extends Error {
  override readonly name = "SyntaxError";
  constructor(message: string, readonly line: number, readonly column: number) {
    super(message);
  }
}

const BASE64 = "ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/";

/** Decodes source-map "mappings" into, per generated line, pairs [generated column, source column] (0-based). */
function decodeMappings(mappings: string): [number, number][][] {
  const lines: [number, number][][] = [];
  let sourceColumn = 0;
  for (const lineText of mappings.split(";")) {
    const segments: [number, number][] = [];
    let generatedColumn = 0;
    for (const segment of lineText.split(",")) {
      if (!segment) continue;
      const fields: number[] = [];
      let value = 0;
      let shift = 0;
      for (const ch of segment) {
        const digit = BASE64.indexOf(ch);
        value += (digit & 31) << shift;
        if (digit & 32) shift += 5;
        else {
          fields.push(value & 1 ? -(value >>> 1) : value >>> 1);
          value = 0;
          shift = 0;
        }
      }
      generatedColumn += fields[0] ?? 0;
      if (fields.length >= 4) sourceColumn += fields[3]!;
      segments.push([generatedColumn, sourceColumn]);
    }
    lines.push(segments);
  }
  return lines;
}

/** A stripped cell as it can be kept between runs: the JavaScript and sucrase's source-map mappings. */
export interface StrippedForm {
  code: string;
  mappings: string;
}

/**
 * Stripped cells kept by their source (a host may keep them on disk, keyed by a hash of the source): a hit skips
 * sucrase, whose first transforms in a fresh process run unoptimized. A cache must return exactly what `set` got.
 */
export interface StripCache {
  get(source: string): StrippedForm | undefined;
  set(source: string, form: StrippedForm): void;
}

/** The StrippedCell of a kept form (the same as stripTypes gave when the form was made). */
export function strippedFrom(form: StrippedForm): StrippedCell {
  const lines = decodeMappings(form.mappings);
  return {
    code: form.code,
    sourceColumn(line, column) {
      const segments = lines[line - 1];
      if (!segments || segments.length === 0) return column;
      let best: [number, number] | undefined;
      for (const seg of segments) if (seg[0] <= column - 1) best = seg;
      if (!best) return column;
      return best[1] + (column - 1 - best[0]) + 1;
    },
  };
}

/** stripTypes through `cache`: a kept form when there is one, else sucrase, whose result is then kept. */
export function stripTypesCached(source: string, cache: StripCache | undefined): StrippedCell {
  const kept = cache?.get(source);
  if (kept !== undefined) return strippedFrom(kept);
  const form = stripTypesForm(source);
  cache?.set(source, form);
  return strippedFrom(form);
}

/**
 * Strips TypeScript from a cell's source. Throws CellSyntaxError (line and column in the cell) when the
 * source does not parse.
 */
export function stripTypes(source: string): StrippedCell {
  return strippedFrom(stripTypesForm(source));
}

function stripTypesForm(source: string): StrippedForm {
  let result;
  try {
    result = transform(source, {
      transforms: ["typescript"],
      disableESTransforms: true,
      sourceMapOptions: { compiledFilename: "cell.js" },
      filePath: "cell.ts",
    });
  } catch (e) {
    const err = e as Error & { loc?: { line: number; column: number } };
    const message = err.message.replace(/^Error transforming cell\.ts: /, "").replace(/ \(\d+:\d+\)$/, "");
    // sucrase reports the column 1-based (checked: ";" at index 10 of "const b = ;" is reported as column 11).
    throw new CellSyntaxError(message, err.loc?.line ?? 1, err.loc?.column ?? 1);
  }
  return { code: result.code, mappings: result.sourceMap?.mappings ?? "" };
}
