/**
 * The template form, DOM-free: what the page asks before it makes a document from a template, and how the
 * answers become the inputs of `documentFromTemplate` (the document package's function behind `conebook new`),
 * so that the form and the command give the same bytes for the same inputs. Every parameter must be changed or
 * confirmed (a template's values describe its demonstration, and none may be kept without a word); a value typed
 * in another unit of the same dimension is converted as `--set` converts it; a data file's columns are mapped to
 * the slot's declared columns and units, and a file that needs no mapping is pinned as it is.
 */
import { convert } from "@conebook/aquifer";
import {
  TemplateInputError,
  csvHeaderColumns,
  readTemplateSetting,
  sha256Hex,
  utf8Bytes,
  withParameterValue,
  type ConebookDocument,
  type DataSlot,
  type TemplateInfo,
  type TemplateParameter,
  type TemplateSetting,
} from "@conebook/document";

/** True when the document is a template: it declares parameters or data slots. */
export function isTemplate(doc: ConebookDocument): boolean {
  return doc.header.parameters.length > 0 || (doc.header.dataSlots?.length ?? 0) > 0;
}

/** A parameter as the form holds it: the text typed and whether the template's value was confirmed. */
export interface ParameterField {
  text: string;
  confirmed: boolean;
}

/** The first field of a parameter: the template's value, not yet confirmed. */
export function initialField(p: TemplateParameter): ParameterField {
  return { text: String(p.value), confirmed: false };
}

/** True when the field still holds the template's value and was not confirmed. */
export function needsConfirmation(p: TemplateParameter, field: ParameterField): boolean {
  return !field.confirmed && field.text.trim() === String(p.value);
}

/** What a typed value becomes: the parameter's value (converted to its unit), or the problem with it. */
export type FieldReading = { value: number | string; shown: string } | { problem: string };

/** Reads a parameter's field as `--set NAME=TEXT` would (unit conversion, range check). */
export function readField(p: TemplateParameter, field: ParameterField): FieldReading {
  try {
    const next = withParameterValue(p, readTemplateSetting(p.name, field.text), "");
    const shown = typeof next.value === "number" ? `${next.value}${p.unit ? ` ${p.unit}` : ""}${next.given ? ` (converted from ${next.given})` : ""}` : next.value;
    return { value: next.value, shown };
  } catch (e) {
    if (e instanceof TemplateInputError) return { problem: e.message.replace(/^: /, "") };
    throw e;
  }
}

/** The settings the form gives: every parameter, with the text as typed (so each counts as given). */
export function formSettings(parameters: readonly TemplateParameter[], fields: Readonly<Record<string, ParameterField>>): TemplateSetting[] {
  return parameters.map((p) => readTemplateSetting(p.name, (fields[p.name] ?? initialField(p)).text.trim()));
}

/** The parameters that keep the demonstration value without confirmation, or whose value does not read. */
export function blockingParameters(parameters: readonly TemplateParameter[], fields: Readonly<Record<string, ParameterField>>): string[] {
  return parameters.filter((p) => {
    const f = fields[p.name] ?? initialField(p);
    return needsConfirmation(p, f) || "problem" in readField(p, f);
  }).map((p) => p.name);
}

/** The separator of a CSV text: the most frequent of , ; tab in its first line. */
export function csvSeparator(text: string): string {
  const first = text.slice(0, text.search(/\r|\n|$/));
  return [",", ";", "\t"].reduce((best, c) => (first.split(c).length > first.split(best).length ? c : best), ",");
}

/** The first rows of a CSV text for a preview: the header's columns and up to `n` rows of fields. */
export function csvPreview(text: string, n = 5): { columns: string[]; rows: string[][]; lines: number } {
  const sep = csvSeparator(text);
  const lines = text.replace(/^\uFEFF/, "").split(/\r\n|\n|\r/).filter((l) => l.trim() !== "");
  return { columns: csvHeaderColumns(text), rows: lines.slice(1, n + 1).map((l) => l.split(sep).map((f) => f.trim().replace(/^"(.*)"$/, "$1"))), lines: Math.max(0, lines.length - 1) };
}

/** Where a slot column comes from: a column of the file and the unit its numbers are in. */
export interface ColumnSource {
  column: string;
  unit: string;
}

/** The mapping a file gets first: each slot column from the file column of the same name, in the slot's unit. */
export function initialMapping(slot: DataSlot, fileColumns: readonly string[]): Record<string, ColumnSource> {
  const out: Record<string, ColumnSource> = {};
  for (const c of slot.columns ?? []) out[c.name] = { column: fileColumns.includes(c.name) ? c.name : "", unit: c.unit ?? "" };
  return out;
}

/** A data file ready for the new document: the path it will have, its bytes, their SHA-256, and how it was made. */
export interface PreparedData {
  path: string;
  bytes: Uint8Array;
  sha256: string;
  /** True when the file is used as chosen; false when its columns were mapped and converted into a new file. */
  asChosen: boolean;
}

/** Problems of a mapping: a slot column without a file column, or a unit that cannot be converted. */
export function mappingProblems(slot: DataSlot, mapping: Readonly<Record<string, ColumnSource>>): string[] {
  const problems: string[] = [];
  for (const c of slot.columns ?? []) {
    const m = mapping[c.name];
    if (!m || m.column === "") {
      problems.push(`choose the file's column for ${c.name}${c.unit ? ` (${c.unit})` : ""}`);
      continue;
    }
    if (c.unit && m.unit && m.unit !== c.unit) {
      try {
        convert(1, m.unit, c.unit);
      } catch (e) {
        problems.push(`${c.name}: ${(e as Error).message}`);
      }
    }
  }
  return problems;
}

/**
 * The data file for `slot` from a chosen file. When every slot column comes from the file column of its name in
 * the slot's unit, the file is used byte for byte (`data/NAME`, as `conebook new` copies a file from outside the
 * document's folder). Otherwise a new CSV is written with the slot's columns in the slot's order, numbers
 * converted to the slot's units (aquifer unit tables) and written at 12 significant digits, other fields as they
 * were (`data/STEM.SLOT.csv`).
 */
export function prepareData(slot: DataSlot, fileName: string, bytes: Uint8Array, mapping: Readonly<Record<string, ColumnSource>>): PreparedData {
  const base = fileName.replace(/^.*[\\/]/, "").replace(/[^A-Za-z0-9._-]/g, "_") || "data.csv";
  const text = new TextDecoder("utf-8").decode(bytes);
  const columns = slot.columns ?? [];
  const identity = columns.every((c) => mapping[c.name]?.column === c.name && (mapping[c.name]!.unit === (c.unit ?? "") || mapping[c.name]!.unit === ""));
  if (identity) return { path: `data/${base}`, bytes, sha256: sha256Hex(bytes), asChosen: true };
  const sep = csvSeparator(text);
  const lines = text.replace(/^\uFEFF/, "").split(/\r\n|\n|\r/).filter((l) => l.trim() !== "");
  const header = csvHeaderColumns(text);
  const index = columns.map((c) => header.indexOf(mapping[c.name]?.column ?? ""));
  const factors = columns.map((c) => {
    const from = mapping[c.name]?.unit ?? "";
    return c.unit && from && from !== c.unit ? (v: number) => convert(v, from, c.unit!) : (v: number) => v;
  });
  const out = [columns.map((c) => c.name).join(",")];
  for (const line of lines.slice(1)) {
    const fields = line.split(sep).map((f) => f.trim().replace(/^"(.*)"$/, "$1"));
    out.push(
      index
        .map((k, j) => {
          const field = k >= 0 ? (fields[k] ?? "") : "";
          const v = Number(field);
          // Converted numbers at 12 significant digits: the conversion's last-bit noise (30 min read back as
          // 29.999999999999996) is not written; no reading carries 12 digits.
          return field !== "" && Number.isFinite(v) ? String(Number(factors[j]!(v).toPrecision(12))) : field;
        })
        .join(","),
    );
  }
  const mapped = utf8Bytes(`${out.join("\n")}\n`);
  return { path: `data/${base.replace(/\.[^.]*$/, "")}.${slot.name}.csv`, bytes: mapped, sha256: sha256Hex(mapped), asChosen: false };
}

/** The test information fields the form offers, with the template's value of each as a hint. */
export function infoFields(doc: ConebookDocument): { key: string; label: string; hint: string }[] {
  const info = doc.header.testInformation;
  const out = [
    { key: "analyst", label: "analyst", hint: info?.analyst ?? "" },
    { key: "reviewer", label: "reviewer", hint: info?.reviewer ?? "" },
    { key: "started", label: "pumping started (YYYY-MM-DDTHH:MM)", hint: info?.started ?? "" },
    { key: "ended", label: "pumping ended", hint: info?.ended ?? "" },
  ];
  (info?.wells ?? []).forEach((w, i) => out.push({ key: `wells.${i}.name`, label: `name of the ${w.role} well ${i + 1}`, hint: w.name }));
  return out;
}

/** The info the form gives: the fields filled in, trimmed. */
export function formInfo(values: Readonly<Record<string, string>>): TemplateInfo {
  const out: Record<string, string> = {};
  for (const [k, v] of Object.entries(values)) if (v.trim() !== "") out[k] = v.trim();
  return out;
}
