/**
 * `--set name=value`: new values for template parameters (header `parameters`) and controls (`control(name, ...)`
 * in a cell). A value is a number, optionally followed by a unit (`--set rate=8L/s`), which is converted to the
 * parameter's or control's unit with the aquifer unit tables; a string parameter takes the text as given.
 *
 * Template parameters reach the cells through controls: a numeric parameter gives its value to the control of
 * the same name (see `runOverrides`). A name that is neither a parameter nor a control recorded in the file is
 * checked after the run, when the kernel reports which controls it met.
 */
import {
  TemplateInputError,
  checkTemplateUnits,
  isReservedName,
  readTemplateSetting,
  reservedNameReason,
  settingNumber,
  withParameterValue,
  type CellOutput,
  type ConebookDocument,
  type Position,
  type TemplateParameter,
  type TemplateSetting,
} from "@conebook/document";
import { recordedControlValues } from "@conebook/kernel";
import { InputError, UsageError, place } from "./errors.js";

/** One `--set` as typed (the document package's TemplateSetting: the text, and its number and unit). */
export type Setting = TemplateSetting;

/** Reads `name=value` words; throws UsageError for a word without `=` or with an empty name. */
export function parseSettings(words: readonly string[], command: string): Setting[] {
  const seen = new Set<string>();
  return words.map((word) => {
    const eq = word.indexOf("=");
    const name = eq < 0 ? "" : word.slice(0, eq).trim();
    if (eq < 0 || name === "") throw new UsageError(`--set needs name=value (for example --set rate=0.008), got ${JSON.stringify(word)}`, command);
    if (isReservedName(name)) throw new UsageError(`--set ${name}: the name ${reservedNameReason(name)}`, command);
    if (seen.has(name)) throw new UsageError(`--set ${name} is given twice; give each name once`, command);
    seen.add(name);
    return readTemplateSetting(name, word.slice(eq + 1));
  });
}

/** A control output recorded in the document, with the place of its cell. */
interface ControlInFile {
  output: Extract<CellOutput, { type: "control" }>;
  line: number;
}

function recordedControls(doc: ConebookDocument): Map<string, ControlInFile> {
  const out = new Map<string, ControlInFile>();
  for (const cell of doc.cells) {
    for (const o of cell.outputs) {
      if (o.type === "control" && !out.has(o.name)) out.set(o.name, { output: o, line: (cell.origin?.start ?? cell.sourceStart).line });
    }
  }
  return out;
}

/** The number of a setting in `unit`, converting from the unit typed. Throws InputError at `where`. */
function numberIn(s: Setting, unit: string | undefined, what: string, where: string): number {
  try {
    return settingNumber(s, unit, what, where);
  } catch (e) {
    if (e instanceof TemplateInputError) throw new InputError(e.message);
    throw e;
  }
}

function formatRange(min: number, max: number, unit: string | undefined): string {
  return `[${min}, ${max}]${unit ? ` ${unit}` : ""}`;
}

/** The result of applying settings to a document before a run. */
export interface AppliedSettings {
  /** The header parameters with new values. */
  parameters: TemplateParameter[];
  /** Values for controls recorded in the document, in the control's unit. */
  controls: Record<string, number>;
  /** Settings naming neither a parameter nor a recorded control; checked after the run. */
  pending: Setting[];
}

/**
 * Applies settings: each is matched with a header parameter first, then with a control recorded in the file;
 * values are converted to the parameter's or control's unit and checked against its range. `allowControls`
 * false (for templates) makes an unknown parameter name an error at once. Throws InputError with the
 * `file:line:column` of the parameter (header) or the control's cell.
 */
export function applySettings(doc: ConebookDocument, shown: string, settings: readonly Setting[], allowControls: boolean): AppliedSettings {
  const parameters = doc.header.parameters.map((p) => ({ ...p }));
  const positions = doc.layout?.headerPositions ?? {};
  const at = (key: string): Position => positions[key] ?? { line: 1, column: 1 };
  const controls = recordedControls(doc);
  const out: AppliedSettings = { parameters, controls: {}, pending: [] };
  for (const s of settings) {
    const index = parameters.findIndex((p) => p.name === s.name);
    if (index >= 0) {
      const pos = at(`parameters.${index}.value`);
      try {
        parameters[index] = withParameterValue(parameters[index]!, s, place(shown, pos.line, pos.column));
      } catch (e) {
        if (e instanceof TemplateInputError) throw new InputError(e.message);
        throw e;
      }
      continue;
    }
    const control = allowControls ? controls.get(s.name) : undefined;
    if (control) {
      const c = control.output;
      const where = place(shown, control.line);
      const v = numberIn(s, c.unit, `control "${c.name}"`, where);
      if (c.min !== undefined && c.max !== undefined && !(v >= c.min && v <= c.max)) {
        throw new InputError(`${where}: --set ${s.name}=${s.raw}: control "${c.name}" must lie in ${formatRange(c.min, c.max, c.unit)}, got ${v}${c.unit ? ` ${c.unit}` : ""}; choose a value in the range`);
      }
      out.controls[s.name] = v;
      continue;
    }
    if (!allowControls) {
      const known = parameters.map((p) => p.name);
      throw new InputError(
        `${place(shown, at("parameters").line)}: --set ${s.name}: the template has no parameter named "${s.name}"; ${known.length ? `its parameters are ${known.join(", ")}` : "it declares no parameters"}`,
      );
    }
    if (s.number === undefined || s.unit !== undefined) {
      throw new InputError(
        `${shown}: --set ${s.name}=${s.raw}: "${s.name}" is not a template parameter and no control of that name is recorded in the file, so the value must be a plain number in the control's own unit`,
      );
    }
    out.controls[s.name] = s.number;
    out.pending.push(s);
  }
  return out;
}

/**
 * The overrides a run gets, later sources winning: every numeric template parameter under its own name (so that a
 * control of that name takes the parameter's value), then the control values given with --set. Control values
 * recorded in the file are not overrides: the kernel uses them only while the control's default in the code is
 * the one recorded beside them (`recordedControlValues`).
 */
export function runOverrides(parameters: readonly TemplateParameter[], controls: Record<string, number>): Record<string, number> {
  const fromParameters: Record<string, number> = {};
  for (const p of parameters) if (typeof p.value === "number") fromParameters[p.name] = p.value;
  return { ...fromParameters, ...controls };
}

export { recordedControlValues };

const OVERRIDE_REFUSED = /control "([^"]+)": the override/;

/**
 * After a run: a pending setting no control asked for, or an override a control refused (out of its range),
 * becomes an InputError naming the setting. `outputs` are the run's outputs by cell id.
 */
export function checkPendingSettings(
  shown: string,
  pending: readonly Setting[],
  unusedOverrides: readonly string[],
  outputs: Record<string, CellOutput[]>,
  controlNames: readonly string[],
): void {
  for (const s of pending) {
    if (unusedOverrides.includes(s.name)) {
      throw new InputError(
        `${shown}: --set ${s.name}: there is no template parameter or control named "${s.name}"; ${controlNames.length ? `the controls are ${controlNames.join(", ")}` : "the document has no controls"}`,
      );
    }
  }
  for (const list of Object.values(outputs)) {
    for (const o of list) {
      if (o.type !== "error") continue;
      const m = OVERRIDE_REFUSED.exec(o.message);
      if (m && pending.some((s) => s.name === m[1])) {
        throw new InputError(`${o.line === undefined ? shown : place(shown, o.line, o.column)}: --set ${m[1]}: ${o.message}`);
      }
    }
  }
}

/**
 * Checks that every template parameter's unit is one the aquifer unit tables know, so that values given with
 * --set can be converted to it. Throws InputError at the unit's `file:line:column`, with close known symbols.
 */
export function checkParameterUnits(doc: ConebookDocument, shown: string): void {
  try {
    checkTemplateUnits(doc, shown);
  } catch (e) {
    if (e instanceof TemplateInputError) throw new InputError(e.message);
    throw e;
  }
}
