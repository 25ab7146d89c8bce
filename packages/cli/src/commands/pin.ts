/**
 * `conebook pin FILE [--data NAME ...]`: re-pins data files after an intended change. For each data cell that
 * refers to a file whose bytes no longer match its SHA-256 (or each one named with --data), the new digest is
 * written into the cell's fence line and both digests are printed. The document is replaced atomically; its
 * recorded outputs are kept, so `verify` then shows what the new data change.
 */
import { serializeDocument } from "@conebook/document";
import type { Cell, ConebookDocument } from "@conebook/document";
import { onePositional, parseArgs, type OptionSpec } from "../args.js";
import { writeFileAtomic } from "../atomic-write.js";
import { EXIT, InputError, place } from "../errors.js";
import type { Io } from "../io.js";
import { checkPins, loadDocument } from "../load.js";

export const PIN_OPTIONS: readonly OptionSpec[] = [{ name: "data", kind: "list" }];

export const PIN_HELP = `Usage: conebook pin FILE [--data NAME ...]

Re-pins the data files of the document FILE after an intended change: each data cell whose file no longer
matches its SHA-256 (or each data set named with --data) gets the file's new SHA-256, and both digests are
printed. The recorded outputs are kept: run conebook verify to see what the new data change, and conebook run
--write to record new outputs.

Options:
  --data NAME   re-pin only this data set (repeat for several); a file that did not change is reported as such
  --help        show this help

Exit codes: 0 re-pinned (or nothing to do); 2 usage or input error (a file that cannot be read, an unknown name).`;

/** Runs the command; returns the exit code. */
export async function pinCommand(argv: readonly string[], io: Io): Promise<number> {
  const args = parseArgs(argv, PIN_OPTIONS, "pin");
  const file = onePositional(args, "a document FILE", "pin");
  const loaded = await loadDocument(file, io.cwd);
  const { checks } = await checkPins(loaded);
  const names = args.lists.get("data") ?? [];
  for (const name of names) {
    if (!checks.some((c) => c.name === name)) {
      const known = checks.map((c) => c.name);
      throw new InputError(`${loaded.shown}: --data ${name}: no data cell named "${name}" refers to a file; ${known.length ? `those that do are ${known.join(", ")}` : "no data cell refers to a file"}`);
    }
  }
  const chosen = checks.filter((c) => (names.length === 0 ? c.status === "changed" : names.includes(c.name)));
  const changed = chosen.filter((c) => c.status === "changed");
  for (const c of chosen.filter((c) => c.status === "ok")) io.out(`${place(loaded.shown, c.line)}: data "${c.name}" (${c.path}) is unchanged: SHA-256 ${c.pinned}`);
  if (changed.length === 0) {
    if (names.length === 0) io.out(`${loaded.shown}: every pinned data file matches its SHA-256; nothing to re-pin`);
    return EXIT.ok;
  }
  const digests = new Map(changed.map((c) => [c.cellId, c.actual!]));
  const cells: Cell[] = loaded.document.cells.map((cell) =>
    cell.kind === "data" && cell.file && digests.has(cell.id) ? { ...cell, file: { ...cell.file, sha256: digests.get(cell.id)! } } : cell,
  );
  const doc: ConebookDocument = { ...loaded.document, cells };
  await writeFileAtomic(loaded.path, serializeDocument(doc));
  for (const c of changed) {
    io.out(`${place(loaded.shown, c.line)}: re-pinned data "${c.name}" (${c.path}): SHA-256 was ${c.pinned}, now ${c.actual}`);
  }
  io.out(`${loaded.shown}: the recorded outputs describe the old data; run conebook verify to see what changed, conebook run --write to record new outputs`);
  return EXIT.ok;
}
