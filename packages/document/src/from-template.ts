/**
 * A new document from a template: what `conebook new` writes and the workbench's template form makes, one
 * function for both so that the same inputs give the same bytes. The template's header parameters take the
 * values given (type, unit and range checked, a value typed in another unit converted), each data slot is
 * bound to a data file pinned by its SHA-256, `{{name}}` placeholders in the title, the narrative and the
 * test information become the parameters' values, narrative cells whose id starts with `template-` are left
 * out, every recorded output is cleared, and a note at the top lists what was kept from the template.
 *
 * Pure: no file access. The caller reads the data files, decides the path by which the new document refers to
 * each (docs/cli.md: in place when inside the new document's folder, else `data/NAME`), and writes the text.
 * Problems are `TemplateInputError`s whose message has one line per problem, `FILE:line:column: what and how to
 * fix it`, at the place in the template.
 */
import { convert, parseUnit } from "@conebook/aquifer";
import { isReservedName, reservedNameReason } from "./names.js";
import { serializeDocument } from "./serialize.js";
import { sha256Hex } from "./sha256.js";
import type { TestInformation } from "./test-information.js";
import type { Cell, ConebookDocument, DataCell, DataSlot, Position, TemplateParameter } from "./types.js";
import { validateDocument } from "./validate.js";
import { DocumentError } from "./errors.js";

/** A value given for a parameter, as typed: `raw`, and its number and unit when it reads as one. */
export interface TemplateSetting {
  name: string;
  raw: string;
  number?: number;
  unit?: string;
}

/** A data file for a slot: the path the new document refers to it by (relative, `/`) and its bytes. */
export interface TemplateData {
  slot: string;
  path: string;
  bytes: Uint8Array;
}

/** Text fields of the test information the new document sets (dotted keys, see `TEMPLATE_INFO_KEYS`). */
export type TemplateInfo = Readonly<Record<string, string>>;

/** What a new document is made from. */
export interface TemplateInput {
  template: ConebookDocument;
  /** The template's name in messages (its path as the user gave it). */
  templateShown: string;
  /** The new document's name in messages. */
  outShown: string;
  settings: readonly TemplateSetting[];
  /** The title; by default the template's, placeholders filled. */
  title?: string;
  /** Test information text fields to set, e.g. `{ analyst: "A. B.", "wells.0.name": "PW-7" }`. */
  info?: TemplateInfo;
  data: readonly TemplateData[];
}

/** The new document and what the author should hear about it. */
export interface TemplateOutcome {
  text: string;
  document: ConebookDocument;
  /** The parameters as written. */
  parameters: TemplateParameter[];
  /** Warnings for the author, each `TEMPLATE:line[:column]: warning: ...`. */
  warnings: string[];
  /** One entry per data slot bound: `slot -> path (sha256 abc…)`. */
  bound: string[];
}

/** A problem with the inputs: nothing can be written. The message has one line per problem. */
export class TemplateInputError extends Error {
  override readonly name = "TemplateInputError";
}

/** The text fields of the test information a new document may set, besides `wells.N.name` and `wells.N.notes`. */
export const TEMPLATE_INFO_KEYS = ["site", "location", "purpose", "analyst", "reviewer", "datum", "notes", "started", "ended"] as const;

const NUMBER_WITH_UNIT = /^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*?)\s*$/;

/** `file:line:column` (column left out when unknown). */
function place(file: string, line: number, column?: number): string {
  return column === undefined ? `${file}:${line}` : `${file}:${line}:${column}`;
}

/** A setting from its name and the text typed for it: the number and unit when the text reads as a number. */
export function readTemplateSetting(name: string, raw: string): TemplateSetting {
  const m = NUMBER_WITH_UNIT.exec(raw);
  const s: TemplateSetting = { name, raw };
  if (m) {
    s.number = Number(m[1]);
    if (m[2] !== "") s.unit = m[2]!;
  }
  return s;
}

/**
 * The number of a setting in `unit`, converting from the unit typed (aquifer unit tables). Throws
 * TemplateInputError at `where` when the text is not a number or its unit cannot be converted.
 */
export function settingNumber(s: TemplateSetting, unit: string | undefined, what: string, where: string): number {
  if (s.number === undefined || !Number.isFinite(s.number)) {
    throw new TemplateInputError(`${where}: --set ${s.name}=${s.raw}: ${what} takes a number${unit ? ` in ${unit}` : ""}, for example --set ${s.name}=1.5${unit ? unit : ""}`);
  }
  if (s.unit === undefined || s.unit === unit) return s.number;
  if (unit === undefined) throw new TemplateInputError(`${where}: --set ${s.name}=${s.raw}: ${what} has no unit; give a plain number`);
  try {
    return convert(s.number, s.unit, unit);
  } catch (e) {
    throw new TemplateInputError(`${where}: --set ${s.name}=${s.raw}: ${what} is in ${unit}, and ${JSON.stringify(s.unit)} cannot be converted to it: ${(e as Error).message}`);
  }
}

/**
 * A template parameter with the value of setting `s`: a string parameter takes the text as typed; a number is
 * converted to the parameter's unit and must lie in its range, and `given` records the text when it was
 * converted. Throws TemplateInputError at `where`.
 */
export function withParameterValue(p: TemplateParameter, s: TemplateSetting, where: string): TemplateParameter {
  const next = { ...p };
  if (typeof p.value === "string") {
    next.value = s.raw;
    return next;
  }
  const v = settingNumber(s, p.unit, `parameter "${p.name}"`, where);
  if (p.range && !(v >= p.range[0] && v <= p.range[1])) {
    throw new TemplateInputError(
      `${where}: --set ${s.name}=${s.raw}: parameter "${p.name}" must lie in [${p.range[0]}, ${p.range[1]}]${p.unit ? ` ${p.unit}` : ""}, got ${v}${p.unit ? ` ${p.unit}` : ""}; choose a value in the range`,
    );
  }
  next.value = v;
  if (s.unit !== undefined && s.unit !== p.unit) next.given = `${s.number} ${s.unit}`;
  else delete next.given;
  return next;
}

/**
 * Checks that every template parameter's unit is one the aquifer unit tables know, so that values typed in other
 * units can be converted to it. Throws TemplateInputError at the unit's `file:line:column`.
 */
export function checkTemplateUnits(doc: ConebookDocument, shown: string): void {
  const positions = doc.layout?.headerPositions ?? {};
  doc.header.parameters.forEach((p, i) => {
    if (p.unit === undefined || p.unit === "") return;
    try {
      parseUnit(p.unit);
    } catch (e) {
      const at = positions[`parameters.${i}.unit`] ?? { line: 1, column: 1 };
      throw new TemplateInputError(`${place(shown, at.line, at.column)}: template parameter "${p.name}" has the unit ${JSON.stringify(p.unit)}, which is not known: ${(e as Error).message}`);
    }
  });
}

/** The first line of a CSV file, split at its separator (the most frequent of , ; tab). */
export function csvHeaderColumns(text: string): string[] {
  const first = text.slice(0, text.search(/\r|\n|$/)).replace(/^\uFEFF/, "");
  const sepChar = [",", ";", "\t"].reduce((best, c) => (first.split(c).length > first.split(best).length ? c : best), ",");
  return first.split(sepChar).map((c) => c.trim().replace(/^"(.*)"$/, "$1"));
}

/** The template's data slot `name`; throws TemplateInputError naming the slots it has. */
export function templateSlot(template: ConebookDocument, shown: string, name: string): DataSlot {
  const slots = template.header.dataSlots ?? [];
  const slot = slots.find((s) => s.name === name);
  if (slot) return slot;
  const at = template.layout?.headerPositions["dataSlots"] ?? { line: 1, column: 1 };
  throw new TemplateInputError(
    `${place(shown, at.line, at.column)}: --data ${name}: the template has no data slot named "${name}"; ${slots.length ? `its slots are ${slots.map((s) => s.name).join(", ")}` : "it declares no data slots"}`,
  );
}

/** `value` with `fill` applied to every string in it (objects and arrays copied, other values kept). */
function fillStrings<T>(value: T, fill: (text: string) => string): T {
  if (typeof value === "string") return fill(value) as T;
  if (Array.isArray(value)) return value.map((v) => fillStrings(v, fill)) as T;
  if (value !== null && typeof value === "object") {
    return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, fillStrings(v, fill)])) as T;
  }
  return value;
}

/** `base`, or `base-2`, `base-3`, ... when a cell already has that id. */
function uniqueId(cells: readonly Cell[], base: string): string {
  const ids = new Set(cells.map((c) => c.id));
  if (!ids.has(base)) return base;
  let k = 2;
  while (ids.has(`${base}-${k}`)) k++;
  return `${base}-${k}`;
}

const WELL_KEY = /^wells\.(\d+)\.(name|notes)$/;

/** The test information with the given text fields set; throws TemplateInputError for an unknown key. */
function withInfo(info: TestInformation | undefined, given: TemplateInfo, shown: string): TestInformation | undefined {
  const keys = Object.keys(given);
  if (keys.length === 0) return info;
  const next: TestInformation = { ...(info ?? {}), ...(info?.wells ? { wells: info.wells.map((w) => ({ ...w })) } : {}) };
  for (const key of keys) {
    const value = given[key]!;
    const well = WELL_KEY.exec(key);
    if (well) {
      const i = Number(well[1]);
      const w = next.wells?.[i];
      if (!w) throw new TemplateInputError(`${shown}: --info ${key}: the template's test information has ${next.wells?.length ?? 0} wells (wells.0 to wells.${(next.wells?.length ?? 1) - 1}); give the name of one of those`);
      w[well[2] as "name" | "notes"] = value;
      continue;
    }
    if (!(TEMPLATE_INFO_KEYS as readonly string[]).includes(key)) {
      throw new TemplateInputError(`${shown}: --info ${key}: not a text field of the test information; the fields are ${TEMPLATE_INFO_KEYS.join(", ")}, wells.N.name and wells.N.notes`);
    }
    (next as Record<string, unknown>)[key] = value;
  }
  return next;
}

/**
 * The new document made from `input` (see the module comment). Throws TemplateInputError for a parameter or data
 * slot the template does not have, a value of the wrong type, unit or range, a required parameter not given, a
 * data file without the slot's columns, a slot without a file whose data cell has none, or a new document that
 * would not be valid; nothing is returned then.
 */
export function documentFromTemplate(input: TemplateInput): TemplateOutcome {
  const { template, templateShown: shown, outShown } = input;
  const doc = template;
  const pos = doc.layout?.headerPositions ?? {};
  const at = (key: string): Position => pos[key] ?? { line: 1, column: 1 };
  checkTemplateUnits(doc, shown);

  const seen = new Set<string>();
  const parameters = doc.header.parameters.map((p) => ({ ...p }));
  for (const s of input.settings) {
    if (isReservedName(s.name)) throw new TemplateInputError(`--set ${s.name}: the name ${reservedNameReason(s.name)}`);
    if (seen.has(s.name)) throw new TemplateInputError(`--set ${s.name} is given twice; give each name once`);
    seen.add(s.name);
    const index = parameters.findIndex((p) => p.name === s.name);
    if (index < 0) {
      const known = parameters.map((p) => p.name);
      throw new TemplateInputError(
        `${place(shown, at("parameters").line)}: --set ${s.name}: the template has no parameter named "${s.name}"; ${known.length ? `its parameters are ${known.join(", ")}` : "it declares no parameters"}`,
      );
    }
    const p = at(`parameters.${index}.value`);
    parameters[index] = withParameterValue(parameters[index]!, s, place(shown, p.line, p.column));
  }

  const slots = doc.header.dataSlots ?? [];
  const bindings = input.data.map((d) => ({ slot: templateSlot(doc, shown, d.slot), data: d }));
  const slotAt = (slot: DataSlot): Position => pos[`dataSlots.${slots.indexOf(slot)}.name`] ?? pos["dataSlots"] ?? { line: 1, column: 1 };

  const given = new Set(input.settings.map((s) => s.name));
  const paramAt = (i: number): Position => pos[`parameters.${i}.value`] ?? pos["parameters"] ?? { line: 1, column: 1 };
  const missing = doc.header.parameters.map((p, i) => ({ p, i })).filter(({ p }) => p.required === true && !given.has(p.name));
  if (missing.length > 0) {
    throw new TemplateInputError(
      missing
        .map(({ p, i }) => {
          const a = paramAt(i);
          return `${place(shown, a.line, a.column)}: parameter "${p.name}"${p.unit ? ` (${p.unit})` : ""} must be given: the template's ${JSON.stringify(p.value)} is its demonstration value; add --set ${p.name}=VALUE`;
        })
        .join("\n"),
    );
  }
  const warnings: string[] = [];
  const kept: string[] = [];
  parameters.forEach((p, i) => {
    if (given.has(p.name)) return;
    const a = paramAt(i);
    const value = `${p.value}${p.unit ? ` ${p.unit}` : ""}`;
    warnings.push(`${place(shown, a.line, a.column)}: warning: parameter "${p.name}" keeps the template's value ${value}; give --set ${p.name}=VALUE if that is not your test's`);
    kept.push(`parameter \`${p.name}\` keeps the template's value ${value}`);
  });
  const values = new Map(parameters.map((p) => [p.name, `${p.value}${typeof p.value === "number" && p.unit ? ` ${p.unit}` : ""}`]));
  const fill = (text: string): string => text.replace(/\{\{\s*([A-Za-z_][A-Za-z0-9_]*)\s*\}\}/g, (whole, name: string) => values.get(name) ?? whole);
  const title = input.title ?? fill(doc.header.title);
  if (input.title === undefined) kept.push(`the title is the template's (${JSON.stringify(title)}); change it in the header or give --title`);

  const cells: Cell[] = doc.cells
    .filter((c) => !(c.kind === "narrative" && c.id.startsWith("template-")))
    .map((c) => (c.kind === "narrative" ? { ...c, source: fill(c.source), outputs: [] } : { ...c, outputs: [] }));
  const bound: string[] = [];
  for (const { slot, data } of bindings) {
    const a = slotAt(slot);
    const where = place(shown, a.line, a.column);
    const index = cells.findIndex((c) => c.kind === "data" && c.name === slot.name);
    if (index < 0) throw new TemplateInputError(`${where}: data slot "${slot.name}" has no data cell named "${slot.name}" in the template; add one (\`\`\`csv data:ID name=${slot.name})`);
    const columns = csvHeaderColumns(new TextDecoder("utf-8").decode(data.bytes));
    const absent = (slot.columns ?? []).filter((c) => !columns.includes(c.name));
    if (absent.length > 0) {
      throw new TemplateInputError(
        `${where}: --data ${slot.name}=${data.path}: data slot "${slot.name}" needs the column${absent.length === 1 ? "" : "s"} ` +
          `${absent.map((c) => `${c.name}${c.unit ? ` (${c.unit})` : ""}`).join(", ")}, but the file's header line has ${columns.join(", ")}`,
      );
    }
    const sha256 = sha256Hex(data.bytes);
    const cell = cells[index] as DataCell;
    cells[index] = { ...cell, source: "", file: { path: data.path, sha256 } };
    bound.push(`${slot.name} -> ${data.path} (sha256 ${sha256.slice(0, 12)}…)`);
  }
  for (const slot of slots) {
    if (bindings.some((b) => b.slot === slot)) continue;
    const cell = cells.find((c): c is DataCell => c.kind === "data" && c.name === slot.name);
    const a = slotAt(slot);
    if (!cell || cell.file) throw new TemplateInputError(`${place(shown, a.line, a.column)}: data slot "${slot.name}" needs a file; add --data ${slot.name}=PATH`);
    warnings.push(`${place(shown, (cell.origin?.start ?? cell.sourceStart).line)}: warning: data slot "${slot.name}" keeps the template's inline rows (its demonstration data); give --data ${slot.name}=PATH to use your own`);
    kept.push(`data slot \`${slot.name}\` keeps the template's inline rows (its demonstration data)`);
  }
  const { libraryVersion: _recorded, ...header } = doc.header;
  const info = input.info ?? {};
  const filled = header.testInformation === undefined ? undefined : fillStrings(header.testInformation, fill);
  const testInformation = withInfo(filled, info, shown);
  if (testInformation !== undefined) {
    const set = Object.keys(info);
    kept.push(
      `the test information in the header (dates, wells with distances and screens, rates, analyst, reviewer) is the template's, with its placeholders filled${set.length ? ` and ${set.join(", ")} given` : ""}; replace it with this test's`,
    );
    warnings.push(`${place(shown, at("testInformation").line)}: warning: the test information in the header is the template's; replace it with this test's`);
  }
  if (kept.length > 0) {
    const note: Cell = {
      kind: "narrative",
      id: uniqueId(cells, "author-notes"),
      source: [`> **For the author** (from \`conebook new\` with the template ${shown}): check these, then delete this note.`, ">", ...kept.map((k) => `> - ${k}`)].join("\n"),
      sourceStart: { line: 1, column: 1 },
      outputs: [],
    };
    cells.unshift(note);
  }

  const document: ConebookDocument = {
    ...doc,
    header: { ...header, title, parameters, ...(testInformation === undefined ? {} : { testInformation }) },
    cells,
  };
  const problems = validateDocument(document, { file: outShown }).filter((d) => d.severity === "error");
  if (problems.length > 0) throw new TemplateInputError(problems.map((d) => `${place(outShown, d.line, d.column)}: ${d.message}`).join("\n"));
  let text: string;
  try {
    text = serializeDocument(document);
  } catch (e) {
    if (e instanceof DocumentError) throw new TemplateInputError(`${outShown} was not written: ${e.message}`);
    throw e;
  }
  return { text, document, parameters, warnings, bound };
}
