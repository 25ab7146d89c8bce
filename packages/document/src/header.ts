/**
 * The YAML header: reading it into a DocumentHeader (YAML 1.2 core schema, via the `yaml` package), writing a
 * fresh one, and rewriting a parsed one so that only the values that changed are touched.
 *
 * YAML keys (see docs/format.md): conebook, title, seed, recordedWith, limits.cellTimeMs, limits.memoryMb,
 * parameters, dataSlots, testInformation (test-information.ts). Any other key is kept in `extra`.
 */

import { Document, LineCounter, isMap, isScalar, isSeq, stringify } from "yaml";
import type { Node as YamlNode } from "yaml";
import { DocumentError, diagnostic } from "./errors.js";
import { MAX_HEADER_DEPTH, headerNodeProblem, nestingTooDeep } from "./header-guard.js";
import { messages } from "./messages.js";
import { readTestInformation, testInformationToRaw } from "./test-information.js";
import { stableStringify } from "./text.js";
import { parseYamlDocument, yamlNotes } from "./yaml-read.js";
import type { DataSlot, Diagnostic, DocumentHeader, Position, TemplateParameter } from "./types.js";

/** The newest format version this package reads and writes. */
export const FORMAT_VERSION = 1;

/**
 * Options for every YAML text this package writes: no line folding, and double-quoted strings on one line
 * (yaml 2.9.1 writes some multi-line double-quoted strings with a whitespace-only line wrongly, turning " " into
 * "\\"; a single-line double-quoted string is exact and diffs better anyway).
 */
export const YAML_WRITE_OPTIONS = { lineWidth: 0, doubleQuotedMinMultiLineLength: Number.MAX_SAFE_INTEGER, flowCollectionPadding: false } as const;

/** The header keys this version understands; every other top-level key goes to `extra`. */
export const HEADER_KEYS = ["conebook", "title", "seed", "recordedWith", "limits", "parameters", "dataSlots", "testInformation"] as const;

export interface HeaderReading {
  header: DocumentHeader;
  positions: Record<string, Position>;
  diagnostics: Diagnostic[];
}

type Raw = Record<string, unknown>;

/**
 * Reads the YAML between the `---` lines. `firstLine` is the file line of the first YAML line, so positions
 * are file positions. Throws DocumentError when the YAML cannot be read or is not a mapping.
 */
export function readHeader(yamlText: string, firstLine: number, file?: string): HeaderReading {
  const tooDeep = nestingTooDeep(yamlText);
  if (tooDeep !== undefined) {
    const before = yamlText.slice(0, tooDeep);
    const lineStart = before.lastIndexOf("\n") + 1;
    const line = firstLine + (before.length - before.replace(/\n/g, "").length);
    throw new DocumentError(messages.headerTooDeep(MAX_HEADER_DEPTH), { line, column: tooDeep - lineStart + 1 }, file);
  }
  const lineCounter = new LineCounter();
  const doc = parseYamlDocument(yamlText, { lineCounter, prettyErrors: false });
  const toPos = (offset: number): Position => {
    const p = lineCounter.linePos(offset);
    return { line: p.line + firstLine - 1, column: p.col };
  };
  if (doc.errors.length > 0) {
    const e = doc.errors[0]!;
    throw new DocumentError(messages.headerYaml(e.message.split("\n")[0]!), toPos(e.pos[0]), file);
  }
  const problem = headerNodeProblem(doc);
  if (problem) {
    const entry = problem.kind === "alias" ? messages.headerAlias(problem.name) : messages.headerTooDeep(MAX_HEADER_DEPTH);
    throw new DocumentError(entry, toPos(problem.offset), file);
  }
  const positions: Record<string, Position> = {};
  const visit = (node: unknown, path: string): void => {
    if (!node || typeof node !== "object") return;
    const n = node as YamlNode;
    if (n.range) positions[path] = toPos(n.range[0]);
    if (isMap(n)) {
      for (const pair of n.items) {
        const childPath = (path === "" ? "" : `${path}.`) + (isScalar(pair.key) ? String(pair.key.value) : String(pair.key));
        visit(pair.value, childPath);
        // A key with no value (`title:`) has no node of its own: point at the key.
        if (positions[childPath] === undefined && isScalar(pair.key) && pair.key.range) positions[childPath] = toPos(pair.key.range[0]);
      }
    } else if (isSeq(n)) {
      n.items.forEach((item, i) => visit(item, `${path}.${i}`));
    }
  };
  visit(doc.contents, "");
  const parsed: unknown = doc.toJS();
  const raw: unknown = parsed === null || parsed === undefined ? {} : parsed;
  const headerStart: Position = { line: firstLine, column: 1 };
  if (typeof raw !== "object" || raw === null || Array.isArray(raw)) {
    throw new DocumentError(messages.headerNotMapping(), headerStart, file);
  }
  const diagnostics: Diagnostic[] = [];
  for (const note of yamlNotes(doc, yamlText)) diagnostics.push(diagnostic("warning", messages.yamlPassedOver("header", note.message), toPos(note.offset), file));
  const at = (path: string): Position => positions[path] ?? headerStart;
  const typeError = (path: string, expected: string): void => {
    diagnostics.push(diagnostic("error", messages.headerType(path, expected), at(path), file));
  };
  const header = headerFromRaw(raw as Raw, typeError, (key, example) =>
    diagnostics.push(diagnostic("error", messages.headerRequired(key, example), headerStart, file)),
  );
  if (header.formatVersion > FORMAT_VERSION) {
    throw new DocumentError(messages.formatTooNew(header.formatVersion, FORMAT_VERSION), at("conebook"), file);
  }
  return { header, positions, diagnostics };
}

const isObject = (v: unknown): v is Raw => typeof v === "object" && v !== null && !Array.isArray(v);
const isInteger = (v: unknown): v is number => typeof v === "number" && Number.isInteger(v);

/** Maps the YAML-shaped header object to the model, reporting wrongly typed values and using defaults for them. */
function headerFromRaw(
  raw: Raw,
  typeError: (path: string, expected: string) => void,
  missing: (key: string, example: string) => void,
): DocumentHeader {
  const header: DocumentHeader = { title: "", formatVersion: FORMAT_VERSION, seed: 0, parameters: [], extra: {} };
  if (raw.conebook === undefined) missing("conebook", "conebook: 1");
  else if (isInteger(raw.conebook) && raw.conebook >= 1) header.formatVersion = raw.conebook;
  else typeError("conebook", "a positive integer format version");

  if (raw.title === undefined) missing("title", "title: Constant-rate test at well PW-1");
  else if (typeof raw.title === "string") header.title = raw.title;
  else typeError("title", "a string");

  if (raw.seed === undefined) missing("seed", "seed: 1");
  else if (isInteger(raw.seed)) header.seed = raw.seed;
  else typeError("seed", "an integer");

  if (raw.recordedWith !== undefined) {
    if (typeof raw.recordedWith === "string") header.libraryVersion = raw.recordedWith;
    else typeError("recordedWith", "a version string in quotes or plain, such as 0.1.0");
  }

  if (raw.limits !== undefined) {
    if (!isObject(raw.limits)) typeError("limits", "a mapping with cellTimeMs and memoryMb");
    else {
      const { cellTimeMs, memoryMb } = raw.limits;
      if (cellTimeMs !== undefined) {
        if (typeof cellTimeMs === "number" && cellTimeMs > 0) header.timeLimitMs = cellTimeMs;
        else typeError("limits.cellTimeMs", "a positive number of milliseconds");
      }
      if (memoryMb !== undefined) {
        if (typeof memoryMb === "number" && memoryMb > 0) header.memoryLimitMb = memoryMb;
        else typeError("limits.memoryMb", "a positive number of MiB");
      }
    }
  }

  if (raw.parameters !== undefined) {
    if (!Array.isArray(raw.parameters)) typeError("parameters", "a list of parameters");
    else
      raw.parameters.forEach((p: unknown, i) => {
        const param = parameterFromRaw(p, `parameters.${i}`, typeError);
        if (param) header.parameters.push(param);
      });
  }

  if (raw.dataSlots !== undefined) {
    if (!Array.isArray(raw.dataSlots)) typeError("dataSlots", "a list of data slots");
    else {
      header.dataSlots = [];
      raw.dataSlots.forEach((s: unknown, i) => {
        const slot = slotFromRaw(s, `dataSlots.${i}`, typeError);
        if (slot) header.dataSlots!.push(slot);
      });
    }
  }

  if (raw.testInformation !== undefined) {
    const info = readTestInformation(raw.testInformation, typeError);
    if (info) header.testInformation = info;
  }

  for (const [k, v] of Object.entries(raw)) {
    if (!(HEADER_KEYS as readonly string[]).includes(k)) header.extra[k] = v;
  }
  return header;
}

function parameterFromRaw(p: unknown, path: string, typeError: (path: string, expected: string) => void): TemplateParameter | undefined {
  if (!isObject(p)) return typeError(path, "a mapping with name and value"), undefined;
  if (typeof p.name !== "string") return typeError(`${path}.name`, "a string"), undefined;
  if (typeof p.value !== "number" && typeof p.value !== "string") return typeError(`${path}.value`, "a number or a string"), undefined;
  const param: TemplateParameter = { name: p.name, value: p.value };
  if (p.unit !== undefined) {
    if (typeof p.unit === "string") param.unit = p.unit;
    else typeError(`${path}.unit`, "a string");
  }
  if (p.range !== undefined) {
    const r = p.range;
    if (Array.isArray(r) && r.length === 2 && typeof r[0] === "number" && typeof r[1] === "number") param.range = [r[0], r[1]];
    else typeError(`${path}.range`, "a list [min, max] of two numbers");
  }
  if (p.description !== undefined) {
    if (typeof p.description === "string") param.description = p.description;
    else typeError(`${path}.description`, "a string");
  }
  if (p.required !== undefined) {
    if (typeof p.required === "boolean") param.required = p.required;
    else typeError(`${path}.required`, "true or false");
  }
  if (p.given !== undefined) {
    if (typeof p.given === "string") param.given = p.given;
    else typeError(`${path}.given`, "a string");
  }
  return param;
}

function slotFromRaw(s: unknown, path: string, typeError: (path: string, expected: string) => void): DataSlot | undefined {
  if (!isObject(s)) return typeError(path, "a mapping with a name"), undefined;
  if (typeof s.name !== "string") return typeError(`${path}.name`, "a string"), undefined;
  const slot: DataSlot = { name: s.name };
  if (s.description !== undefined) {
    if (typeof s.description === "string") slot.description = s.description;
    else typeError(`${path}.description`, "a string");
  }
  if (s.columns !== undefined) {
    if (!Array.isArray(s.columns)) typeError(`${path}.columns`, "a list of {name, unit}");
    else {
      slot.columns = [];
      s.columns.forEach((c: unknown, i) => {
        if (isObject(c) && typeof c.name === "string" && (c.unit === undefined || typeof c.unit === "string")) {
          slot.columns!.push(c.unit === undefined ? { name: c.name } : { name: c.name, unit: c.unit });
        } else typeError(`${path}.columns.${i}`, "a mapping {name: string, unit?: string}");
      });
    }
  }
  return slot;
}

/** The header as the YAML-shaped object written to the file, keys in their canonical order. */
export function headerToRaw(h: DocumentHeader): Raw {
  const raw: Raw = { conebook: h.formatVersion, title: h.title, seed: h.seed };
  if (h.libraryVersion !== undefined) raw.recordedWith = h.libraryVersion;
  if (h.timeLimitMs !== undefined || h.memoryLimitMb !== undefined) {
    const limits: Raw = {};
    if (h.timeLimitMs !== undefined) limits.cellTimeMs = h.timeLimitMs;
    if (h.memoryLimitMb !== undefined) limits.memoryMb = h.memoryLimitMb;
    raw.limits = limits;
  }
  if (h.parameters.length > 0) {
    raw.parameters = h.parameters.map((p) => {
      const o: Raw = { name: p.name, value: p.value };
      if (p.unit !== undefined) o.unit = p.unit;
      if (p.range !== undefined) o.range = [...p.range];
      if (p.description !== undefined) o.description = p.description;
      if (p.required !== undefined) o.required = p.required;
      if (p.given !== undefined) o.given = p.given;
      return o;
    });
  }
  if (h.dataSlots !== undefined) {
    raw.dataSlots = h.dataSlots.map((s) => {
      const o: Raw = { name: s.name };
      if (s.description !== undefined) o.description = s.description;
      if (s.columns !== undefined) o.columns = s.columns.map((c) => (c.unit === undefined ? { name: c.name } : { ...c }));
      return o;
    });
  }
  if (h.testInformation !== undefined) raw.testInformation = testInformationToRaw(h.testInformation);
  for (const [k, v] of Object.entries(h.extra)) if (!(k in raw)) raw[k] = v;
  return raw;
}

/** Fingerprint of a header's meaning, for telling whether it changed since it was parsed. */
export function headerSnapshot(h: DocumentHeader): string {
  return stableStringify(h);
}

/** Writes the YAML of a header from scratch (lists of plain values in flow style, `[min, max]`). */
export function writeHeaderYaml(h: DocumentHeader): string {
  const doc = new Document(headerToRaw(h));
  flowScalarLists(doc.contents);
  return doc.toString(YAML_WRITE_OPTIONS);
}

function flowScalarLists(node: unknown): void {
  if (isSeq(node)) {
    if (node.items.length > 0 && node.items.every((i) => isScalar(i))) node.flow = true;
    else node.items.forEach(flowScalarLists);
  } else if (isMap(node)) node.items.forEach((p) => flowScalarLists(p.value));
}

/** One-line YAML for a scalar value, or undefined when it needs more than a line. */
function scalarYaml(value: unknown): string | undefined {
  if (value === undefined) return undefined;
  const s = stringify(value, YAML_WRITE_OPTIONS).replace(/\n$/, "");
  return s.includes("\n") ? undefined : s;
}

interface Change {
  path: (string | number)[];
  before: unknown;
  after: unknown;
}

function diffRaw(before: unknown, after: unknown, path: (string | number)[], out: Change[]): void {
  if (stableStringify(before) === stableStringify(after)) return;
  if (isObject(before) && isObject(after)) {
    for (const k of new Set([...Object.keys(before), ...Object.keys(after)])) diffRaw(before[k], after[k], [...path, k], out);
  } else if (Array.isArray(before) && Array.isArray(after) && before.length === after.length) {
    before.forEach((b, i) => diffRaw(b, after[i], [...path, i], out));
  } else out.push({ path, before, after });
}

/**
 * Rewrites header YAML text for a changed header. Scalars that changed are replaced in place and new top-level
 * keys are appended, so comments and layout elsewhere stay byte for byte; other changes (removed keys, changed
 * lists) re-emit the YAML through the `yaml` Document model, which keeps comments but may re-indent.
 */
export function rewriteHeaderYaml(yamlText: string, before: DocumentHeader, after: DocumentHeader, eol: string): string {
  const changes: Change[] = [];
  diffRaw(headerToRaw(before), headerToRaw(after), [], changes);
  const doc = parseYamlDocument(yamlText, { keepSourceTokens: true });
  const edits: { start: number; end: number; text: string }[] = [];
  const appended: string[] = [];
  let inPlace = isMap(doc.contents);
  for (const c of changes) {
    if (!inPlace) break;
    const node = doc.getIn(c.path, true) as unknown;
    const text = scalarYaml(c.after);
    if (isScalar(node) && node.range && c.after !== undefined && text !== undefined && !isObject(c.after) && !Array.isArray(c.after)) {
      const t = node.type;
      if (t === "BLOCK_FOLDED" || t === "BLOCK_LITERAL") inPlace = false;
      else edits.push({ start: node.range[0], end: node.range[1], text });
    } else if (c.path.length === 1 && !doc.has(c.path[0]) && c.after !== undefined) {
      const piece = new Document({ [String(c.path[0])]: c.after });
      flowScalarLists(piece.contents);
      appended.push(piece.toString(YAML_WRITE_OPTIONS).replace(/\n$/, ""));
    } else inPlace = false;
  }
  const readsAs = (text: string): boolean => {
    try {
      const d = parseYamlDocument(text);
      const raw: unknown = d.errors.length > 0 ? undefined : (d.toJS() ?? {});
      if (!isObject(raw)) return false;
      const noop = (): void => undefined;
      return headerSnapshot(headerFromRaw(raw, noop, noop)) === headerSnapshot(after);
    } catch {
      return false;
    }
  };
  if (inPlace) {
    let text = yamlText;
    for (const e of edits.sort((a, b) => b.start - a.start)) text = text.slice(0, e.start) + e.text + text.slice(e.end);
    if (appended.length > 0) {
      const body = appended.join("\n").split("\n").join(eol);
      text = text === "" || /(\r\n|\n|\r)$/.test(text) ? text + body + eol : text + eol + body + eol;
    }
    // A plain scalar can mean something else in its new place (a comma inside a flow mapping): check.
    if (readsAs(text)) return text;
  }
  for (const c of changes) {
    if (c.after === undefined) doc.deleteIn(c.path);
    else {
      const node = doc.createNode(c.after);
      flowScalarLists(node);
      doc.setIn(c.path, node);
    }
  }
  const remodelled = doc.toString(YAML_WRITE_OPTIONS).split("\n").join(eol);
  if (readsAs(remodelled)) return remodelled;
  return writeHeaderYaml(after).split("\n").join(eol);
}
