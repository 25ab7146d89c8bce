/**
 * `conebook run FILE [--write] [--json] [--set name=value ...]`: runs every cell, prints a summary per cell
 * (or JSON), and with --write records the outputs and the values used into the file atomically. A run with a
 * failing cell exits 1 and, with --write, leaves the file as it was.
 */
import { DocumentError, serializeDocument, withOutputs } from "@conebook/document";
import type { ConebookDocument } from "@conebook/document";
import type { RunResult } from "@conebook/kernel";
import { onePositional, parseArgs, type OptionSpec } from "../args.js";
import { writeFileAtomic } from "../atomic-write.js";
import { EXIT, InputError, place } from "../errors.js";
import { cellLine, execute } from "../execute.js";
import { headlineLines, outputsDigest, tableLines } from "../format.js";
import type { Io } from "../io.js";
import { checkPins, loadDocument, pinChangedMessage, type LoadedDocument } from "../load.js";
import { applySettings, checkParameterUnits, checkPendingSettings, parseSettings, recordedControlValues, runOverrides } from "../settings.js";
import { AQUIFER_VERSION } from "../versions.js";

export const RUN_OPTIONS: readonly OptionSpec[] = [
  { name: "write", kind: "flag" },
  { name: "json", kind: "flag" },
  { name: "set", kind: "list" },
  { name: "fresh", kind: "flag" },
  { name: "show", kind: "flag" },
];

export const RUN_HELP = `Usage: conebook run FILE [--write] [--json] [--show] [--fresh] [--set name=value ...]

Runs every cell of the document FILE in order and prints, per cell, its id, kind, status, time and a one-line
digest of its outputs; errors are shown as file:line:column.

Options:
  --write             record the outputs (and the values used) into FILE; the file is replaced atomically and
                      only when every cell ran without error
  --json              print the result as JSON instead of the summary
  --show              print every table in full below its cell (the summary shows the estimates of fits and
                      tests, with their 95 % intervals, in any case)
  --set name=value    a new value for a template parameter or a control; a number may carry a unit, which is
                      converted (--set rate=8L/s); repeat for several values
  --fresh             ignore the control values recorded in FILE: every control takes its default in the code
                      (or --set); with --write the recorded values are replaced
  --help              show this help

Exit codes: 0 every cell ran; 1 a cell failed; 2 usage or input error (nothing written).`;

/** Runs the command; returns the exit code. */
export async function runCommand(argv: readonly string[], io: Io): Promise<number> {
  const args = parseArgs(argv, RUN_OPTIONS, "run");
  const file = onePositional(args, "a document FILE", "run");
  const settings = parseSettings(args.lists.get("set") ?? [], "run");
  const loaded = await loadDocument(file, io.cwd);
  for (const w of loaded.warnings) io.err(`${place(w.file ?? loaded.shown, w.line, w.column)}: warning: ${w.message}`);
  const { changed } = await checkPins(loaded);
  if (changed.length > 0) {
    for (const c of changed) io.err(pinChangedMessage(loaded.shown, c));
    io.err(`${loaded.shown} was not run: restore the file, or if the change is intended re-pin it with conebook pin ${loaded.shown}`);
    return EXIT.checkFailed;
  }
  checkParameterUnits(loaded.document, loaded.shown);
  const applied = applySettings(loaded.document, loaded.shown, settings, true);
  const overrides = runOverrides(applied.parameters, applied.controls);
  const result = await execute(loaded, overrides, io, args.flags.has("fresh") ? {} : recordedControlValues(loaded.document));
  const cellsById = new Map(loaded.document.cells.map((c) => [c.id, c]));
  for (const note of result.notes) {
    const cell = cellsById.get(note.cellId);
    io.err(`${cell ? place(loaded.shown, cellLine(cell)) : loaded.shown}: note: ${note.message}`);
  }
  checkPendingSettings(loaded.shown, applied.pending, result.unusedOverrides, result.outputs, result.controlsUsed.map((c) => c.output.name));
  unknownChartReference(loaded, result);
  const failed = Object.entries(result.status).filter(([, s]) => s === "error").map(([id]) => id);

  if (args.flags.has("json")) io.out(JSON.stringify(runJson(loaded, result), null, 2));
  else printSummary(loaded, result, io, args.flags.has("show"));

  if (args.flags.has("write")) {
    if (failed.length > 0) {
      io.err(`${loaded.shown} was not written: cell ${failed.join(", ")} failed; fix it and run again`);
      return EXIT.checkFailed;
    }
    const doc: ConebookDocument = { ...loaded.document, header: { ...loaded.document.header, parameters: applied.parameters } };
    let text: string;
    try {
      text = serializeDocument(withOutputs(doc, result.outputs, { libraryVersion: AQUIFER_VERSION }));
    } catch (e) {
      if (e instanceof DocumentError) throw new InputError(`${loaded.shown} was not written: ${e.message}`);
      throw e;
    }
    await writeFileAtomic(loaded.path, text);
    if (!args.flags.has("json")) io.out(`recorded the outputs in ${loaded.shown} (aquifer ${AQUIFER_VERSION})`);
  }
  return failed.length > 0 ? EXIT.checkFailed : EXIT.ok;
}

const UNKNOWN_NAME = /no value named ("[^"]*") exists yet/;

/** A chart cell that names data no earlier cell defines is an input error (exit 2) at the chart's line. */
function unknownChartReference(loaded: LoadedDocument, result: RunResult): void {
  for (const cell of loaded.document.cells) {
    if (cell.kind !== "chart" || result.status[cell.id] !== "error") continue;
    const error = result.outputs[cell.id]?.find((o) => o.type === "error");
    const m = error?.type === "error" ? UNKNOWN_NAME.exec(error.message) : null;
    if (m) {
      throw new InputError(`${place(loaded.shown, cellLine(cell))}: chart ${cell.id} draws the data ${m[1]}, which no earlier cell defines; name a data cell or a value an earlier code cell defines`);
    }
  }
}

function printSummary(loaded: LoadedDocument, result: RunResult, io: Io, full: boolean): void {
  const executable = loaded.document.cells.filter((c) => c.kind !== "narrative");
  const idWidth = Math.min(24, Math.max(4, ...executable.map((c) => c.id.length)));
  io.out(`${loaded.shown}: ${loaded.document.header.title}`);
  const errors: string[] = [];
  for (const cell of executable) {
    const status = result.status[cell.id] ?? "not-run";
    const ms = result.timings.cells[cell.id] ?? 0;
    const outputs = result.outputs[cell.id] ?? [];
    let digest = outputsDigest(outputs);
    if (cell.kind === "data") digest = cell.file ? `data "${cell.name}" from ${cell.file.path}` : `data "${cell.name}" (inline)`;
    io.out(`  ${status.padEnd(7)} ${cell.kind.padEnd(5)} ${cell.id.padEnd(idWidth)} ${`${ms.toFixed(0)} ms`.padStart(8)}  ${digest}`);
    for (const o of outputs) {
      if (full && o.type === "table") for (const line of tableLines(o)) io.out(line);
      else for (const line of headlineLines(o)) io.out(line);
    }
    for (const o of outputs) {
      if (o.type === "error") errors.push(`${place(loaded.shown, o.line ?? cellLine(cell), o.line === undefined ? undefined : o.column)}: error in cell ${cell.id}: ${o.message}`);
    }
  }
  const counts = { ok: 0, error: 0, "not-run": 0 };
  for (const s of Object.values(result.status)) counts[s]++;
  io.out(
    `${executable.length} cells: ${counts.ok} ok, ${counts.error} failed, ${counts["not-run"]} not run ` +
      `(${result.timings.totalMs.toFixed(0)} ms, sandbox start ${result.timings.sandboxStartMs.toFixed(0)} ms)`,
  );
  for (const e of errors) io.err(e);
}

/** The JSON form of a run: per cell id, kind, file line, status, time and outputs, plus the controls used. */
export function runJson(loaded: LoadedDocument, result: RunResult): unknown {
  return {
    file: loaded.shown,
    title: loaded.document.header.title,
    aquiferVersion: AQUIFER_VERSION,
    cells: loaded.document.cells
      .filter((c) => c.kind !== "narrative")
      .map((c) => ({
        id: c.id,
        kind: c.kind,
        line: cellLine(c),
        status: result.status[c.id] ?? "not-run",
        timeMs: result.timings.cells[c.id] ?? 0,
        outputs: result.outputs[c.id] ?? [],
      })),
    controlsUsed: result.controlsUsed.map((c) => ({ cellId: c.cellId, ...c.output })),
    unusedOverrides: result.unusedOverrides,
    notes: result.notes,
    timings: { totalMs: result.timings.totalMs, sandboxStartMs: result.timings.sandboxStartMs },
  };
}
