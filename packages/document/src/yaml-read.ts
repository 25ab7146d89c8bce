/**
 * Reading YAML (headers and chart specifications) in time linear in the text, and without the `yaml` package
 * printing anything. Two things in yaml 2.9.1 stand in the way:
 *  - its check for duplicate keys (`uniqueKeys`) compares each key with every earlier key of its mapping, so a
 *    mapping of n keys takes n^2/2 comparisons (80,000 keys: about a minute). The text is read without that check
 *    and the keys are then looked up in one hash set per mapping. Only when a duplicate exists is the text read
 *    again with the package's own check, so that the error reported first is exactly the one it reports; above
 *    RECHECK_COMPARISONS comparisons the duplicate is placed among the other errors by its offset instead.
 *  - warnings (an unresolved tag, a list or mapping used as a key) go to `process.emitWarning`, which prints them
 *    to stderr. They are read with `logLevel: "error"` and returned as values for the caller to report at a place.
 */
import { YAMLParseError, isAlias, isCollection, isMap, isPair, isScalar, parseDocument } from "yaml";
import type { Document, DocumentOptions, Node as YamlNode, ParseOptions, SchemaOptions } from "yaml";

type Options = ParseOptions & DocumentOptions & SchemaOptions;

/** Key comparisons (n(n-1)/2 summed over the mappings) up to which a duplicate is checked again by the package. */
export const RECHECK_COMPARISONS = 4_000_000;

/** Something the YAML reader passed over: the offset in the YAML text and a description. */
export interface YamlNote {
  offset: number;
  message: string;
}

/**
 * Parses YAML as `parseDocument(text, { ...options, uniqueKeys: true })` does (the same nodes and, with a
 * duplicate key, the same first error), in linear time and silently. Do not pass a lineCounter here when a
 * second reading is possible: the first reading fills it, and a second one would add every line again.
 */
export function parseYamlDocument(text: string, options: Options = {}): Document.Parsed {
  const doc = parseDocument(text, { ...options, uniqueKeys: false, logLevel: "error" });
  const duplicate = firstDuplicateKey(doc);
  if (duplicate === undefined) return doc;
  if (duplicate.comparisons <= RECHECK_COMPARISONS) {
    const { lineCounter: _ignored, ...rest } = options;
    return parseDocument(text, { ...rest, uniqueKeys: true, logLevel: "error" });
  }
  const error = new YAMLParseError([duplicate.offset, duplicate.offset + 1], "DUPLICATE_KEY", "Map keys must be unique");
  const at = doc.errors.findIndex((e) => e.pos[0] > duplicate.offset);
  doc.errors.splice(at < 0 ? doc.errors.length : at, 0, error);
  return doc;
}

/** The earliest key (by offset) equal to an earlier key of its mapping, with the comparisons yaml's check would make. */
function firstDuplicateKey(doc: Document): { offset: number; comparisons: number } | undefined {
  let comparisons = 0;
  let first: number | undefined;
  const stack: unknown[] = [doc.contents];
  while (stack.length > 0) {
    const node = stack.pop();
    if (isPair(node)) {
      stack.push(node.key, node.value);
      continue;
    }
    if (!isCollection(node)) continue;
    const items = node.items as unknown[];
    if (isMap(node)) {
      comparisons += (items.length * (items.length - 1)) / 2;
      // yaml's test: the same node, or two scalars whose values are === (so NaN never equals NaN).
      const seen = new Set<unknown>();
      for (const pair of node.items) {
        const key = pair.key;
        const value: unknown = isScalar(key) ? key.value : key;
        if (value !== value) continue;
        if (seen.has(value)) {
          const offset = (key as YamlNode | null)?.range?.[0] ?? node.range?.[0] ?? 0;
          if (first === undefined || offset < first) first = offset;
        } else seen.add(value);
      }
    }
    for (let i = items.length - 1; i >= 0; i--) stack.push(items[i]);
  }
  return first === undefined ? undefined : { offset: first, comparisons };
}

/**
 * What the reader passed over in a parsed document: its warnings, and every mapping key that is a list or a
 * mapping (read as its YAML text, which the package would announce on stderr while building values).
 */
export function yamlNotes(doc: Document, text: string): YamlNote[] {
  const notes: YamlNote[] = doc.warnings.map((w) => ({ offset: w.pos[0], message: w.message.split("\n")[0]! }));
  const stack: unknown[] = [doc.contents];
  while (stack.length > 0) {
    const node = stack.pop();
    if (isPair(node)) {
      const key = node.key;
      const target = isAlias(key) ? key.resolve(doc) : key;
      if (isCollection(target)) {
        const range = (key as YamlNode).range ?? [0, 0];
        const written = text.slice(range[0], range[1]).trim();
        const shown = JSON.stringify(written.length > 40 ? `${written.slice(0, 36)}...` : written);
        notes.push({ offset: range[0], message: `a ${isMap(target) ? "mapping" : "list"} used as a key (${shown}), which is read as its text` });
      }
      stack.push(node.key, node.value);
    } else if (isCollection(node)) {
      for (let i = node.items.length - 1; i >= 0; i--) stack.push(node.items[i]);
    }
  }
  return notes.sort((a, b) => a.offset - b.offset);
}

/**
 * The value of a YAML text, as `parse(text, { prettyErrors: false })` of the `yaml` package gives it, with what
 * the reader passed over returned instead of printed. Throws the first error, as `parse` does.
 */
export function readYamlValue(text: string): { value: unknown; notes: YamlNote[] } {
  const doc = parseYamlDocument(text, { prettyErrors: false });
  if (doc.errors.length > 0) throw doc.errors[0]!;
  return { value: doc.toJS(), notes: yamlNotes(doc, text) };
}
