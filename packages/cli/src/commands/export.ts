/**
 * `conebook export FILE -o report.html [--run-date YYYY-MM-DD] [--rerun]`: one self-contained offline HTML
 * report. By default it shows the outputs recorded in the file (chart outputs carry their data inline, so
 * nothing needs to run, and the report shows exactly what `verify` checks); --rerun runs the document first
 * and shows the fresh outputs instead. Data files are checked against their pins either way.
 */
import type { CellOutput } from "@conebook/document";
import { recordedOutputs } from "@conebook/kernel";
import { onePositional, parseArgs, type OptionSpec } from "../args.js";
import { writeFileAtomic } from "../atomic-write.js";
import { EXIT, InputError, UsageError, place } from "../errors.js";
import { execute } from "../execute.js";
import type { Io } from "../io.js";
import { checkPins, documentSha256, loadDocument, pinChangedMessage, shownPath } from "../load.js";
import { buildReport, chartKey, type ChartPicture } from "../report/index.js";
import { recordedControlValues, runOverrides } from "../settings.js";
import { AQUIFER_VERSION, TOOL_VERSION } from "../versions.js";
import { resolve } from "node:path";

export const EXPORT_OPTIONS: readonly OptionSpec[] = [
  { name: "output", alias: "o", kind: "value" },
  { name: "run-date", kind: "value" },
  { name: "rerun", kind: "flag" },
];

export const EXPORT_HELP = `Usage: conebook export FILE -o report.html [--run-date YYYY-MM-DD] [--rerun]

Writes one self-contained HTML report of the document FILE, readable offline: the title, a caution, the
narrative, each cell's code (collapsible), its outputs (values with units, tables, text, errors), charts drawn
as inline SVG, and the provenance (tool and aquifer versions, SHA-256 of the document and of each data file).
The page has no script and a Content-Security-Policy that forbids loading anything.

By default the report shows the outputs recorded in FILE (record them with \`conebook run FILE --write\`).

Options:
  -o, --output FILE        the report to write (replaced if it exists)
  --run-date YYYY-MM-DD    the date to state as the run date (no date is stated otherwise)
  --rerun                  run the document now and report the fresh outputs instead of the recorded ones
  --help                   show this help

Exit codes: 0 written; 1 a data file changed since it was pinned; 2 usage or input error.`;

function checkDate(raw: string): string {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(raw);
  const ok = m !== null && (() => {
    const d = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])));
    return d.getUTCFullYear() === Number(m[1]) && d.getUTCMonth() === Number(m[2]) - 1 && d.getUTCDate() === Number(m[3]);
  })();
  if (!ok) throw new UsageError(`--run-date must be a calendar date written YYYY-MM-DD (for example 2026-03-14), got ${JSON.stringify(raw)}`, "export");
  return raw;
}

/** Runs the command; returns the exit code. */
export async function exportCommand(argv: readonly string[], io: Io): Promise<number> {
  const args = parseArgs(argv, EXPORT_OPTIONS, "export");
  const file = onePositional(args, "a document FILE", "export");
  const outFile = args.values.get("output");
  if (!outFile) throw new UsageError("`conebook export` needs -o FILE, the report to write", "export");
  const runDateRaw = args.values.get("run-date");
  const runDate = runDateRaw === undefined ? undefined : checkDate(runDateRaw);
  const loaded = await loadDocument(file, io.cwd);
  const doc = loaded.document;
  const outPath = resolve(io.cwd, outFile);
  if (outPath === loaded.path) throw new InputError(`-o ${outFile} is the document itself; give another file for the report`);

  const { checks, changed } = await checkPins(loaded);
  if (changed.length > 0) {
    for (const c of changed) io.err(pinChangedMessage(loaded.shown, c));
    io.err(`${loaded.shown}: no report written: the data changed since the outputs were made; restore the file, or pin it and rerun with --write`);
    return EXIT.checkFailed;
  }

  let outputs: Record<string, CellOutput[]>;
  if (args.flags.has("rerun")) {
    const result = await execute(loaded, runOverrides(doc.header.parameters, {}), io, recordedControlValues(doc));
    outputs = result.outputs;
    for (const [id, s] of Object.entries(result.status)) if (s === "error") io.err(`${loaded.shown}: note: cell ${id} failed; the report shows its error`);
  } else {
    if (doc.header.libraryVersion === undefined) {
      throw new InputError(
        `${place(loaded.shown, 1)}: the document has no recorded outputs (no recordedWith in its header); record them with \`conebook run ${loaded.shown} --write\`, or export with --rerun`,
      );
    }
    outputs = recordedOutputs(doc);
  }

  const { drawChart } = await import("../report/chart-svg.js");
  const charts: Record<string, ChartPicture> = {};
  for (const [cellId, list] of Object.entries(outputs)) {
    for (const [i, o] of list.entries()) if (o.type === "chart") charts[chartKey(cellId, i)] = await drawChart(o.spec);
  }
  const html = buildReport({
    document: doc,
    outputs,
    charts,
    provenance: {
      toolVersion: TOOL_VERSION,
      aquiferVersion: AQUIFER_VERSION,
      ...(doc.header.libraryVersion === undefined ? {} : { recordedWith: doc.header.libraryVersion }),
      outputsFrom: args.flags.has("rerun") ? "rerun" : "recorded",
      documentSha256: documentSha256(loaded),
      documentName: loaded.shown,
      dataFiles: checks.map((c) => ({ name: c.name, path: c.path, sha256: c.actual ?? c.pinned })),
      ...(runDate === undefined ? {} : { runDate }),
    },
  });
  await writeFileAtomic(outPath, html);
  const drawn = Object.values(charts).filter((c) => "svg" in c).length;
  io.out(`wrote ${shownPath(outPath, io.cwd)}: report of ${loaded.shown} (${drawn} chart${drawn === 1 ? "" : "s"} drawn)`);
  for (const [key, c] of Object.entries(charts)) if ("problem" in c) io.err(`${loaded.shown}: chart ${key} could not be drawn: ${c.problem}`);
  return EXIT.ok;
}
