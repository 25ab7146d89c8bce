/**
 * Guards on the header YAML before its values are built: no aliases (a chain of them makes a few lines expand
 * to billions of values, and an alias repeats a value under another key, which the in-place header rewriter
 * cannot keep), and no nesting deeper than MAX_HEADER_DEPTH collections (deep nesting exhausts the stack of
 * every recursive reader). Both answer with the offset of the place in the YAML text.
 *
 * The text scan runs before the YAML parser sees the text, so the parser never meets absurd nesting; it
 * estimates depth from indentation, block indicators ("- ", "? ", ": ") and flow brackets outside quotes and
 * comments. The node walk after parsing measures the exact depth and finds the aliases. Both are iterative.
 */
import { isAlias, isCollection, isPair, isScalar } from "yaml";
import type { Document } from "yaml";

/** The deepest nesting of collections a header may have (the top-level mapping counts as 1). */
export const MAX_HEADER_DEPTH = 64;

/** A problem found in the header YAML: where (offset into the YAML text) and what. */
export type HeaderGuardProblem = { kind: "too-deep"; offset: number } | { kind: "alias"; offset: number; name: string };

const BLOCK_SCALAR = /(?:^|[\s:-])[|>][0-9+-]*\s*$/;

/** Scans the YAML text for nesting deeper than `max`; returns the offset where it first gets too deep. */
export function nestingTooDeep(text: string, max = MAX_HEADER_DEPTH): number | undefined {
  const columns: number[] = [];
  let flow = 0;
  let quote: '"' | "'" | undefined;
  let scalarIndent = -1;
  let lineStart = 0;
  while (lineStart <= text.length) {
    let lineEnd = text.indexOf("\n", lineStart);
    if (lineEnd < 0) lineEnd = text.length;
    let pos = lineStart;
    while (pos < lineEnd && text[pos] === " ") pos++;
    const indent = pos - lineStart;
    const blank = pos >= lineEnd || text[pos] === "\r" || text[pos] === "#";
    let depth = columns.length;
    if (quote === undefined && flow === 0 && !blank) {
      if (scalarIndent >= 0 && indent > scalarIndent) {
        lineStart = lineEnd + 1;
        continue;
      }
      scalarIndent = -1;
      while (columns.length > 0 && columns[columns.length - 1]! > indent) columns.pop();
      if (columns.length === 0 || columns[columns.length - 1]! < indent) columns.push(indent);
      depth = columns.length;
      if (depth > max) return pos;
      // Compact nesting on one line: "- - - x", "? - x".
      let first = true;
      while (pos < lineEnd && "-?:".includes(text[pos]!) && (pos + 1 === lineEnd || text[pos + 1] === " " || text[pos + 1] === "\r")) {
        if (!first && ++depth > max) return pos;
        first = false;
        pos++;
        while (pos < lineEnd && text[pos] === " ") pos++;
      }
    }
    if (blank && quote === undefined) {
      lineStart = lineEnd + 1;
      continue;
    }
    let contentEnd = lineEnd;
    for (; pos < lineEnd; pos++) {
      const c = text[pos]!;
      if (quote === '"') {
        if (c === "\\") pos++;
        else if (c === '"') quote = undefined;
        continue;
      }
      if (quote === "'") {
        if (c === "'" && text[pos + 1] === "'") pos++;
        else if (c === "'") quote = undefined;
        continue;
      }
      const before = pos === lineStart ? " " : text[pos - 1]!;
      const scalarStart = " \t[{,:".includes(before);
      if (c === "#" && (before === " " || before === "\t")) {
        contentEnd = pos;
        break;
      }
      if ((c === '"' || c === "'") && scalarStart) quote = c;
      else if (c === "[" || c === "{") {
        flow++;
        if (depth + flow > max) return pos;
      } else if ((c === "]" || c === "}") && flow > 0) flow--;
    }
    if (quote === undefined && flow === 0 && BLOCK_SCALAR.test(text.slice(lineStart, contentEnd))) scalarIndent = indent;
    lineStart = lineEnd + 1;
  }
  return undefined;
}

/** Walks the parsed header: the first alias, or the first collection nested deeper than `max`. */
export function headerNodeProblem(doc: Document, max = MAX_HEADER_DEPTH): HeaderGuardProblem | undefined {
  const stack: [unknown, number][] = [[doc.contents, 1]];
  while (stack.length > 0) {
    const [node, depth] = stack.pop()!;
    if (node === null || node === undefined || isScalar(node)) continue;
    if (isAlias(node)) return { kind: "alias", offset: node.range?.[0] ?? 0, name: node.source };
    if (isPair(node)) {
      stack.push([node.value, depth], [node.key, depth]);
      continue;
    }
    if (isCollection(node)) {
      if (depth > max) return { kind: "too-deep", offset: node.range?.[0] ?? 0 };
      for (let i = node.items.length - 1; i >= 0; i--) stack.push([node.items[i], depth + 1]);
    }
  }
  return undefined;
}
