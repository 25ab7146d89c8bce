/**
 * `conebook verify FILE [--rtol 1e-9] [--atol 0]`: reruns the document with the values recorded in it and
 * compares the fresh outputs with the recorded ones (kernel `compareOutputs`). Exit 0 when everything matches,
 * 1 on any difference, a cell that now fails, or a data file whose bytes changed since they were pinned.
 */
import type { CellOutput } from "@conebook/document";
import { DEFAULT_RTOL, compareOutputs, recordedOutputs, type OutputDifference } from "@conebook/kernel";
import { onePositional, parseArgs, type OptionSpec } from "../args.js";
import { EXIT, UsageError, place } from "../errors.js";
import { cellLine, execute } from "../execute.js";
import type { Io } from "../io.js";
import { checkPins, loadDocument, pinChangedMessage } from "../load.js";
import { referenceProblemLine, referenceProblems } from "../references-check.js";
import { REVIEW_ENTRY_KINDS, findReferences, reviewNotes, type ConebookDocument } from "@conebook/document";
import { recordedControlValues, runOverrides } from "../settings.js";
import { AQUIFER_VERSION } from "../versions.js";

export const VERIFY_OPTIONS: readonly OptionSpec[] = [
  { name: "rtol", kind: "value" },
  { name: "atol", kind: "value" },
];

export const VERIFY_HELP = `Usage: conebook verify FILE [--rtol ${DEFAULT_RTOL}] [--atol 0]

Reruns the document FILE with the template parameters and control values recorded in it, and compares the
fresh outputs with the recorded ones: numbers within a relative tolerance, text exactly, tables cell by cell,
charts by their specification and inline data. Narrative references ({=CELL/ROW/COLUMN}) must resolve in the
fresh outputs to the number they resolve to in the recorded ones. Prints each difference with the cell id, its
line in FILE, the place inside the output, and the recorded and fresh values. Lists the document's review
notes, open and resolved, at their lines (notes do not change the exit code).

Options:
  --rtol R   relative tolerance for numbers, |a - b| <= R max(|a|, |b|) + A (default ${DEFAULT_RTOL}: runs are
             deterministic, so this only absorbs reordered floating-point work, far below any measurement)
  --atol A   absolute tolerance for numbers, in their own units (default 0)
  --help     show this help

Exit codes: 0 all outputs match; 1 a difference, a failing cell or a changed data file; 2 usage or input error.`;

const MAX_SHOWN_PER_CELL = 8;

function tolerance(args: Map<string, string>, name: string, fallback: number): number {
  const raw = args.get(name);
  if (raw === undefined) return fallback;
  const v = Number(raw);
  if (raw.trim() === "" || !Number.isFinite(v) || v < 0) {
    throw new UsageError(`--${name} must be a number >= 0 (for example --${name} 1e-9), got ${JSON.stringify(raw)}`, "verify");
  }
  return v;
}

function shownValue(v: unknown): string {
  if (v === undefined) return "nothing";
  if (typeof v === "number") return String(v);
  const s = JSON.stringify(v) ?? String(v);
  return s.length > 80 ? `${s.slice(0, 79)}…` : s;
}

/** One line for a difference: where, what was recorded, what is there now. */
export function differenceLine(shown: string, line: number, d: OutputDifference): string {
  const head = `${place(shown, line)}: cell ${d.cellId}: outputs${d.path}`;
  const note = d.note ? ` (${d.note})` : "";
  switch (d.kind) {
    case "missing":
      return `${head}: recorded ${shownValue(d.recorded)}, now missing`;
    case "extra":
      return `${head}: not recorded, now ${shownValue(d.fresh)}${note}`;
    case "error":
      return `${head}: recorded ${shownValue(d.recorded)}, now an error${note}`;
    default:
      return `${head}: recorded ${shownValue(d.recorded)}, now ${shownValue(d.fresh)}${note}`;
  }
}

const NOTE_TEXT_SHOWN = 80;

/**
 * The lines listing the document's review notes (docs/format.md, review notes), open and resolved, each at its
 * marker's line with its first entry; nothing when the document has none.
 */
export function reviewNoteLines(shown: string, doc: ConebookDocument): string[] {
  const notes = reviewNotes(doc);
  if (notes.length === 0) return [];
  const open = notes.filter((n) => n.status === "open").length;
  const out = [`${shown}: ${notes.length} review note${notes.length === 1 ? "" : "s"}, ${open} open, ${notes.length - open} resolved:`];
  for (const n of notes) {
    const first = n.entries[0];
    const word = first ? REVIEW_ENTRY_KINDS.find((k) => k.kind === first.kind)!.word : "(empty)";
    const line = first?.text.split("\n")[0] ?? "";
    const text = line.length > NOTE_TEXT_SHOWN ? `${line.slice(0, NOTE_TEXT_SHOWN - 1)}…` : line;
    const replies = n.entries.length - 1;
    out.push(
      `${place(shown, n.at.line)}: review note ${n.id} on cell ${n.on}: ${n.status}: ${word}${first?.who ? ` from ${first.who}` : ""}${text ? `: ${text}` : ""}` +
        `${replies > 0 ? ` (${replies} more entr${replies === 1 ? "y" : "ies"})` : ""}`,
    );
  }
  return out;
}

/** Runs the command; returns the exit code. */
export async function verifyCommand(argv: readonly string[], io: Io): Promise<number> {
  const args = parseArgs(argv, VERIFY_OPTIONS, "verify");
  const file = onePositional(args, "a document FILE", "verify");
  const rtol = tolerance(args.values, "rtol", DEFAULT_RTOL);
  const atol = tolerance(args.values, "atol", 0);
  const loaded = await loadDocument(file, io.cwd);
  for (const w of loaded.warnings) io.err(`${place(w.file ?? loaded.shown, w.line, w.column)}: warning: ${w.message}`);
  const doc = loaded.document;
  const recordedWith = doc.header.libraryVersion;

  const { changed } = await checkPins(loaded);
  if (changed.length > 0) {
    for (const c of changed) io.out(pinChangedMessage(loaded.shown, c));
    io.out(`${loaded.shown}: not verified: ${changed.length} data file${changed.length === 1 ? "" : "s"} changed, so the recorded outputs no longer describe the data; restore the file, or if the change is intended re-pin it with conebook pin ${loaded.shown} and rerun with --write`);
    return EXIT.checkFailed;
  }

  const recorded = recordedOutputs(doc);
  const result = await execute(loaded, runOverrides(doc.header.parameters, {}), io, recordedControlValues(doc));
  const diffs = compareOutputs(recorded, result.outputs, { rtol, atol });
  const refProblems = referenceProblems(doc, result.outputs, recorded, { rtol, atol });
  const refCount = doc.cells.reduce((n, c) => n + (c.kind === "narrative" ? findReferences(c.source).length : 0), 0);
  const refNote = refCount === 0 ? "" : ` and ${refCount} narrative reference${refCount === 1 ? "" : "s"}`;
  const cells = Object.keys(result.outputs).length;
  const outputCount = Object.values(recorded).reduce((n, list: CellOutput[]) => n + list.length, 0);
  const versionNote =
    recordedWith === AQUIFER_VERSION ? `aquifer ${AQUIFER_VERSION}` : `recorded with aquifer ${recordedWith ?? "(unknown version)"}, now ${AQUIFER_VERSION}`;

  for (const line of reviewNoteLines(loaded.shown, doc)) io.out(line);
  if (diffs.length === 0 && refProblems.length === 0) {
    io.out(`${loaded.shown}: verified: all ${outputCount} recorded outputs of ${cells} cells${refNote} match (rtol ${rtol}${atol ? `, atol ${atol}` : ""}; ${versionNote})`);
    return EXIT.ok;
  }
  for (const p of refProblems) io.out(referenceProblemLine(loaded.shown, p));

  const byCell = new Map<string, OutputDifference[]>();
  for (const d of diffs) byCell.set(d.cellId, [...(byCell.get(d.cellId) ?? []), d]);
  const lineOf = new Map(doc.cells.map((c) => [c.id, cellLine(c)]));
  for (const [cellId, list] of byCell) {
    for (const d of list.slice(0, MAX_SHOWN_PER_CELL)) io.out(differenceLine(loaded.shown, lineOf.get(cellId) ?? 1, d));
    if (list.length > MAX_SHOWN_PER_CELL) io.out(`  … and ${list.length - MAX_SHOWN_PER_CELL} more differences in cell ${cellId}`);
  }
  if (recordedWith === undefined) {
    io.out(`${loaded.shown} has no recorded outputs (no recordedWith in its header); record them with \`conebook run ${loaded.shown} --write\``);
  } else if (recordedWith !== AQUIFER_VERSION) {
    io.out(`${loaded.shown}: recorded with aquifer ${recordedWith}, now ${AQUIFER_VERSION}, and results differ`);
  }
  const refText = refProblems.length === 0 ? "" : `${diffs.length === 0 ? "" : "; "}${refProblems.length} narrative reference${refProblems.length === 1 ? "" : "s"} failing`;
  const diffText = diffs.length === 0 ? "" : `${diffs.length} difference${diffs.length === 1 ? "" : "s"} in ${byCell.size} of ${cells} cells`;
  io.out(`${loaded.shown}: not verified: ${diffText}${refText} (rtol ${rtol}${atol ? `, atol ${atol}` : ""})`);
  return EXIT.checkFailed;
}
