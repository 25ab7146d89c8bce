/**
 * `control(name, { value, min, max, unit?, description? })`: a number a reader may change before a rerun.
 * The cell gets, first that applies: the override given to the run for that name (a --set value or a template
 * parameter, checked against the range); the value recorded in the document for it, while the default in the
 * code is still the default recorded beside it (a changed default means the record belongs to older code, and
 * the new default wins, with a note); the default value.
 */
import { isReservedName, reservedNameReason, type CellOutput, type ConebookDocument } from "@conebook/document";
import { ArgumentError, finite, optional, recordArg, stringArg } from "./validators.js";

type ControlOutput = Extract<CellOutput, { type: "control" }>;

/** A control value recorded in a document, with the default the code had when it was recorded. */
export interface RecordedControl {
  readonly value: number;
  readonly default: number;
}

/** One control met during a run. */
export interface ControlRecord {
  cellId: string;
  output: ControlOutput;
}

/** The control values recorded in `doc`'s outputs (the first record of each name) with the default beside each. */
export function recordedControlValues(doc: ConebookDocument): Record<string, RecordedControl> {
  const out: Record<string, RecordedControl> = {};
  for (const cell of doc.cells) {
    for (const o of cell.outputs) {
      if (o.type === "control" && !Object.hasOwn(out, o.name)) out[o.name] = { value: o.value, default: o.default };
    }
  }
  return out;
}

/**
 * What a rerun of `doc` as it stands gets, the same for `conebook run`/`verify`/`export` and the page: every
 * numeric header parameter as an override under its own name, and the recorded control values (used by a
 * control only while its default in the code is the one recorded beside it).
 */
export function recordedRunSettings(doc: ConebookDocument): { overrides: Record<string, number>; recordedControls: Record<string, RecordedControl> } {
  const overrides: Record<string, number> = {};
  for (const p of doc.header.parameters) if (typeof p.value === "number") overrides[p.name] = p.value;
  return { overrides, recordedControls: recordedControlValues(doc) };
}

const NAME = /^[A-Za-z_][A-Za-z0-9_ .-]*$/;
const optionsArg = recordArg({ value: finite, min: finite, max: finite, unit: optional(stringArg()), description: optional(stringArg()) });

/** Checks a control call and returns the record of it, with the value the cell gets. Throws ArgumentError. */
export function controlValue(
  name: unknown,
  options: unknown,
  overrides: Record<string, number>,
  earlier: readonly ControlRecord[],
  cellId: string,
  recorded: Readonly<Record<string, RecordedControl>> = {},
  notes: string[] = [],
): ControlRecord {
  if (typeof name !== "string" || !NAME.test(name)) {
    throw new ArgumentError(`control: argument 1 (name) must be a name such as "Q" or "pumping_rate", got ${JSON.stringify(name) ?? "nothing"}`);
  }
  if (isReservedName(name)) throw new ArgumentError(`control: argument 1 (name) ${reservedNameReason(name)}`);
  const o = optionsArg.check(options, `control "${name}": argument 2 (options)`);
  const unit = o.unit ? ` ${o.unit}` : "";
  if (!(o.min <= o.max)) throw new ArgumentError(`control "${name}": min ${o.min} is greater than max ${o.max}; swap them`);
  if (o.value < o.min || o.value > o.max) {
    throw new ArgumentError(`control "${name}": the value ${o.value}${unit} lies outside its range ${o.min}..${o.max}${unit}; widen the range or change the value`);
  }
  const previous = earlier.find((c) => c.output.name === name);
  if (previous) throw new ArgumentError(`control "${name}" is already defined in cell ${previous.cellId}; give each control its own name`);
  let value = o.value;
  if (Object.hasOwn(overrides, name)) {
    const v = overrides[name];
    if (typeof v !== "number" || !Number.isFinite(v)) {
      throw new ArgumentError(`control "${name}": the override ${String(v)} is not a finite number`);
    }
    if (v < o.min || v > o.max) {
      throw new ArgumentError(`control "${name}": the override ${v}${unit} lies outside the allowed range ${o.min}..${o.max}${unit}; choose a value in the range`);
    }
    value = v;
  } else if (Object.hasOwn(recorded, name)) {
    const r = recorded[name]!;
    if (r.default === o.value) {
      if (r.value >= o.min && r.value <= o.max) value = r.value;
      else notes.push(`control "${name}": the recorded value ${r.value}${unit} lies outside the range ${o.min}..${o.max}${unit} now in the code; the default ${o.value}${unit} is used`);
    } else if (r.value !== r.default) {
      notes.push(
        `control "${name}": the default in the code changed from ${r.default}${unit} to ${o.value}${unit} since the value ${r.value}${unit} was recorded, ` +
          `so the new default ${o.value}${unit} is used; give --set ${name}=${r.value} to use the recorded value again`,
      );
    }
  }
  const output: ControlOutput = { type: "control", name, value, default: o.value, min: o.min, max: o.max };
  if (o.unit !== undefined) output.unit = o.unit;
  if (o.description !== undefined) output.description = o.description;
  return { cellId, output };
}
