/**
 * Checks on a document model, whether it was parsed or built in memory: ids, kinds, chart specifications,
 * data-file pins, header types and limits, template parameter ranges, recorded output shapes. Every finding is
 * a Diagnostic with a position: the cell's marker, or the header field when the document was parsed.
 */

import { diagnostic } from "./errors.js";
import { FORMAT_VERSION } from "./header.js";
import { MAX_CELL_TIME_LIMIT_MS, MAX_MEMORY_LIMIT_MB } from "./limits.js";
import { messages } from "./messages.js";
import { isReservedName } from "./names.js";
import { outputShapeProblem } from "./outputs.js";
import { chartSpecSchema } from "./schema.js";
import { validateJsonSchema } from "./json-schema.js";
import { readTestInformation, testInformationToRaw, type TestInformation } from "./test-information.js";
import type { Cell, ConebookDocument, Diagnostic, Position } from "./types.js";

/** Well-formed cell ids: a letter, then letters, digits, '-' or '_'; at most 64 characters. */
export const CELL_ID_PATTERN = /^[A-Za-z][A-Za-z0-9_-]{0,63}$/;
/** Well-formed data set names (usable as identifiers in code and as Vega-Lite data names). */
export const DATA_NAME_PATTERN = /^[A-Za-z_][A-Za-z0-9_]*$/;
/** A SHA-256 pin: 64 lowercase hexadecimal digits. */
export const SHA256_PATTERN = /^[0-9a-f]{64}$/;

export interface ValidateOptions {
  file?: string;
}

/** Returns every problem found in the document (an empty list when there is none). */
export function validateDocument(doc: ConebookDocument, options: ValidateOptions = {}): Diagnostic[] {
  const { file } = options;
  const out: Diagnostic[] = [];
  const positions = doc.layout?.headerPositions ?? {};
  const headerAt = (path: string): Position => positions[path] ?? (doc.layout ? { line: 2, column: 1 } : { line: 1, column: 1 });
  const err = (entry: { code: string; message: string }, at: Position, cellId?: string): void => {
    out.push(diagnostic("error", entry, at, file, cellId));
  };
  const warn = (entry: { code: string; message: string }, at: Position, cellId?: string): void => {
    out.push(diagnostic("warning", entry, at, file, cellId));
  };

  validateHeader(doc, headerAt, err);

  const ids = new Map<string, number>();
  const dataNames = new Map<string, number>();
  for (const cell of doc.cells) {
    const at = cellStart(cell);
    if (!CELL_ID_PATTERN.test(cell.id)) err(messages.idMalformed(cell.id), at, cell.id);
    const seen = ids.get(cell.id);
    if (seen !== undefined) err(messages.idDuplicate(cell.id, seen), at, cell.id);
    else ids.set(cell.id, at.line);
    validateCell(cell, at, err, warn, dataNames);
    if (cell.kind === "narrative" && cell.review && !doc.cells.some((c) => c.id === cell.review!.on)) warn(messages.reviewTargetMissing(cell.id, cell.review.on), at, cell.id);
    cell.outputs.forEach((o, i) => {
      const problem = outputShapeProblem(o);
      if (problem && !cell.origin?.outputsText) err(messages.outputsShape(`output ${i + 1}: ${problem}`), at, cell.id);
    });
  }
  return out;
}

function cellStart(cell: Cell): Position {
  return cell.origin?.start ?? cell.sourceStart;
}

type Report = (entry: { code: string; message: string }, at: Position, cellId?: string) => void;

function validateCell(cell: Cell, at: Position, err: Report, warn: Report, dataNames: Map<string, number>): void {
  switch (cell.kind) {
    case "narrative":
      if (cell.outputs.length > 0) warn(messages.outputsOnNarrative(cell.id), at, cell.id);
      return;
    case "code":
      if (cell.language !== "ts") err(messages.codeLanguageModel(cell.id, String(cell.language)), at, cell.id);
      return;
    case "data": {
      if (!DATA_NAME_PATTERN.test(cell.name)) err(messages.dataName(cell.name), at, cell.id);
      else if (isReservedName(cell.name)) err(messages.nameReserved("data set name", cell.name), at, cell.id);
      const seen = dataNames.get(cell.name);
      if (seen !== undefined) err(messages.dataNameDuplicate(cell.name, seen), at, cell.id);
      else dataNames.set(cell.name, at.line);
      if (cell.file) {
        const { path, sha256 } = cell.file;
        if (path === "" || sha256 === "") err(messages.dataFileIncomplete(), at, cell.id);
        if (sha256 !== "" && !SHA256_PATTERN.test(sha256)) err(messages.dataSha(sha256), at, cell.id);
        if (path !== "" && !isSafeRelativePath(path)) err(messages.dataPath(path), at, cell.id);
        if (cell.source.trim() !== "") warn(messages.dataFileAndInline(), cell.sourceStart, cell.id);
      }
      return;
    }
    case "chart": {
      const spec: unknown = cell.spec;
      if (typeof spec !== "object" || spec === null || Array.isArray(spec)) {
        err(messages.chartNotObject(), cell.sourceStart, cell.id);
        return;
      }
      for (const problem of validateJsonSchema(chartSpecSchema, spec)) {
        err(messages.chartSchema(`${problem.path === "" ? "" : `at ${problem.path} `}${problem.message}`), cell.sourceStart, cell.id);
      }
      return;
    }
  }
}

/** A path relative to the document that stays beside it: no leading '/', no '..' segment, no backslashes or drive letters. */
export function isSafeRelativePath(path: string): boolean {
  if (path.startsWith("/") || path.includes("\\") || /^[A-Za-z]:/.test(path) || /[\0\r\n]/.test(path)) return false;
  return path.split("/").every((seg) => seg !== "" && seg !== ".." && seg !== ".");
}

function validateHeader(doc: ConebookDocument, at: (path: string) => Position, err: Report): void {
  const h = doc.header as unknown as Record<string, unknown>;
  const typeError = (path: string, expected: string): void => err(messages.headerType(path, expected), at(path));
  if (typeof h.title !== "string") typeError("title", "a string");
  if (typeof h.formatVersion !== "number" || !Number.isInteger(h.formatVersion) || h.formatVersion < 1) {
    typeError("conebook", "a positive integer format version");
  } else if (h.formatVersion > FORMAT_VERSION) err(messages.formatTooNew(h.formatVersion, FORMAT_VERSION), at("conebook"));
  if (typeof h.seed !== "number" || !Number.isInteger(h.seed)) typeError("seed", "an integer");
  if (h.libraryVersion !== undefined && typeof h.libraryVersion !== "string") typeError("recordedWith", "a version string");
  if (h.timeLimitMs !== undefined) {
    if (typeof h.timeLimitMs !== "number" || !(h.timeLimitMs > 0)) typeError("limits.cellTimeMs", "a positive number of milliseconds");
    else if (h.timeLimitMs > MAX_CELL_TIME_LIMIT_MS)
      err(messages.limitTooLarge("limits.cellTimeMs", h.timeLimitMs, MAX_CELL_TIME_LIMIT_MS), at("limits.cellTimeMs"));
  }
  if (h.memoryLimitMb !== undefined) {
    if (typeof h.memoryLimitMb !== "number" || !(h.memoryLimitMb > 0)) typeError("limits.memoryMb", "a positive number of MiB");
    else if (h.memoryLimitMb > MAX_MEMORY_LIMIT_MB)
      err(messages.limitTooLarge("limits.memoryMb", h.memoryLimitMb, MAX_MEMORY_LIMIT_MB), at("limits.memoryMb"));
  }
  if (!Array.isArray(h.parameters)) typeError("parameters", "a list of parameters");
  else {
    const names = new Set<string>();
    h.parameters.forEach((p: unknown, i: number) => {
      const path = `parameters.${i}`;
      const param = p as Record<string, unknown>;
      if (typeof param !== "object" || param === null) return typeError(path, "a mapping with name and value");
      if (typeof param.name !== "string" || param.name === "") typeError(`${path}.name`, "a non-empty string");
      else if (isReservedName(param.name)) err(messages.nameReserved("template parameter name", param.name), at(`${path}.name`));
      else if (names.has(param.name)) err(messages.parameterDuplicate(param.name), at(`${path}.name`));
      else names.add(param.name);
      if (typeof param.value !== "number" && typeof param.value !== "string") typeError(`${path}.value`, "a number or a string");
      if (param.unit !== undefined && typeof param.unit !== "string") typeError(`${path}.unit`, "a string");
      if (param.description !== undefined && typeof param.description !== "string") typeError(`${path}.description`, "a string");
      const r = param.range;
      if (r === undefined) return;
      if (!Array.isArray(r) || r.length !== 2 || typeof r[0] !== "number" || typeof r[1] !== "number") {
        return typeError(`${path}.range`, "a list [min, max] of two numbers");
      }
      const [min, max] = r as [number, number];
      if (min > max) return err(messages.parameterRangeInverted(String(param.name)), at(`${path}.range`));
      if (typeof param.value === "string") return typeError(`${path}.value`, "a number, since the parameter has a range");
      if (typeof param.value === "number" && !(param.value >= min && param.value <= max)) {
        err(messages.parameterOutOfRange(String(param.name), param.value, min, max), at(`${path}.value`));
      }
    });
  }
  if (h.dataSlots !== undefined) {
    if (!Array.isArray(h.dataSlots)) typeError("dataSlots", "a list of data slots");
    else
      h.dataSlots.forEach((s: unknown, i: number) => {
        const slot = s as Record<string, unknown>;
        if (typeof slot !== "object" || slot === null || typeof slot.name !== "string" || slot.name === "") {
          typeError(`dataSlots.${i}.name`, "a non-empty string");
        } else if (isReservedName(slot.name)) err(messages.nameReserved("data slot name", slot.name), at(`dataSlots.${i}.name`));
      });
  }
  if (h.testInformation !== undefined && doc.layout === undefined) {
    // A parsed header holds only the fields that read cleanly (the reader reported the rest); this finds
    // problems in headers built in memory.
    const info = h.testInformation as TestInformation;
    readTestInformation(typeof info === "object" && info !== null ? testInformationToRaw(info) : info, typeError);
  }
  if (typeof h.extra !== "object" || h.extra === null) typeError("extra", "an object of unknown header keys");
}
