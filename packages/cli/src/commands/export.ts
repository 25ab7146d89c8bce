/**
 * `conebook export FILE -o report.html [--pdf report.pdf] [--paper A4|Letter] [--run-date YYYY-MM-DD] [--rerun]
 * [--no-verify]`: one self-contained offline HTML report, and optionally the same report printed to PDF.
 * By default the report shows the outputs recorded in the file, and export first reruns the document and
 * compares (as verify does, narrative references included), stating the outcome at the top of the report;
 * --no-verify skips the rerun and the report says so. --rerun shows the fresh outputs instead of the recorded
 * ones. Data files are checked against their pins either way.
 */
import type { CellOutput, ConebookDocument } from "@conebook/document";
import { DEFAULT_RTOL, compareOutputs, parseDataTable, recordedOutputs } from "@conebook/kernel";
import { onePositional, parseArgs, type OptionSpec } from "../args.js";
import { writeFileAtomic } from "../atomic-write.js";
import { EXIT, InputError, UsageError, place } from "../errors.js";
import { cellLine, execute } from "../execute.js";
import type { Io } from "../io.js";
import { checkPins, documentSha256, loadDocument, pinChangedMessage, shownPath, type LoadedDocument } from "../load.js";
import { referenceProblemLine, referenceProblems } from "../references-check.js";
import { buildReport, chartKey, type ChartPicture, type Verification } from "../report/index.js";
import { recordedControlValues, runOverrides } from "../settings.js";
import { AQUIFER_VERSION, TOOL_VERSION } from "../versions.js";
import { differenceLine } from "./verify.js";
import { fileReaderFor } from "@conebook/kernel/node";
import { resolve } from "node:path";

export const EXPORT_OPTIONS: readonly OptionSpec[] = [
  { name: "output", alias: "o", kind: "value" },
  { name: "pdf", kind: "value" },
  { name: "paper", kind: "value" },
  { name: "run-date", kind: "value" },
  { name: "rerun", kind: "flag" },
  { name: "no-verify", kind: "flag" },
];

export const EXPORT_HELP = `Usage: conebook export FILE -o report.html [--pdf report.pdf] [--paper A4|Letter]
                      [--run-date YYYY-MM-DD] [--rerun] [--no-verify]

Writes one self-contained HTML report of the document FILE, readable offline and ready to print: on the first
page the title, a caution and whether the document verified at export, then the test information (from the
header), how numbers are shown, a table of contents; the narrative with numbered sections, each cell's code
(collapsible) and its outputs: estimates rounded to their standard error, typeset units, numbered tables and
figures with captions; appendices with the data (every reading, used or left out, with the file digests), the
hand-typed narrative numbers that match no computed value, and the methods with their sources; the provenance.
The page has no script and a Content-Security-Policy that forbids loading anything.

By default the report shows the outputs recorded in FILE (record them with \`conebook run FILE --write\`), and
export reruns the document first and compares the fresh outputs with the recorded ones, as verify does.

Options:
  -o, --output FILE        the HTML report to write (replaced if it exists)
  --pdf FILE               also print the report to this PDF (headless Chromium from the npm package
                           @sparticuz/chromium, or the one CONEBOOK_CHROMIUM names)
  --paper A4|Letter        paper of the PDF (default A4)
  --run-date YYYY-MM-DD    the date to state as the date of the run (default: today, when export runs the
                           document; not stated with --no-verify)
  --rerun                  report the fresh outputs of the run instead of the recorded ones
  --no-verify              do not rerun the document; the report states that it was not verified
  --help                   show this help

Exit codes: 0 written (and verified unless --no-verify); 1 written but the rerun differs from the record, or a
data file changed since it was pinned (nothing written); 2 usage or input error.`;

function checkDate(raw: string): string {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(raw);
  const ok = m !== null && (() => {
    const d = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])));
    return d.getUTCFullYear() === Number(m[1]) && d.getUTCMonth() === Number(m[2]) - 1 && d.getUTCDate() === Number(m[3]);
  })();
  if (!ok) throw new UsageError(`--run-date must be a calendar date written YYYY-MM-DD (for example 2026-03-14), got ${JSON.stringify(raw)}`, "export");
  return raw;
}

function checkPaper(raw: string | undefined): "A4" | "Letter" {
  if (raw === undefined) return "A4";
  const p = raw.toLowerCase();
  if (p === "a4") return "A4";
  if (p === "letter") return "Letter";
  throw new UsageError(`--paper must be A4 or Letter, got ${JSON.stringify(raw)}`, "export");
}

/**
 * The rows of every data cell as written in its CSV (pins were checked before), for the report's data
 * appendix: fields as text, so a reviewer sees the readings exactly as recorded.
 */
async function dataRows(loaded: LoadedDocument): Promise<Record<string, { columns: string[]; rows: string[][] }>> {
  const out: Record<string, { columns: string[]; rows: string[][] }> = {};
  const read = fileReaderFor(loaded.folder);
  for (const cell of loaded.document.cells) {
    if (cell.kind !== "data") continue;
    const text = cell.file ? new TextDecoder("utf-8").decode(await read(cell.file.path)) : cell.source;
    const table = parseDataTable(cell.name, text);
    const lines = text.split(/\r\n|\n|\r/).filter((l) => l.trim() !== "");
    const rows = lines.slice(1).map((l) => l.split(",").map((f) => f.trim().replace(/^"(.*)"$/, "$1")));
    out[cell.id] = { columns: table.columns, rows };
  }
  return out;
}

const MAX_DETAILS = 30;

/** Runs the document and compares with the record: the verification block of the report, and the fresh outputs. */
async function verifyForReport(loaded: LoadedDocument, io: Io): Promise<{ verification: Verification; fresh: Record<string, CellOutput[]> }> {
  const doc: ConebookDocument = loaded.document;
  const result = await execute(loaded, runOverrides(doc.header.parameters, {}), io, recordedControlValues(doc));
  const fresh = result.outputs;
  if (doc.header.libraryVersion === undefined) {
    return { verification: { state: "skipped", summary: "the document has no recorded outputs to compare the run with (no recordedWith in its header)." }, fresh };
  }
  const recorded = recordedOutputs(doc);
  const tolerance = { rtol: DEFAULT_RTOL, atol: 0 };
  const diffs = compareOutputs(recorded, fresh, tolerance);
  const refs = referenceProblems(doc, fresh, recorded, tolerance);
  const lineOf = new Map(doc.cells.map((c) => [c.id, cellLine(c)]));
  const outputCount = Object.values(recorded).reduce((n, list: CellOutput[]) => n + list.length, 0);
  const cells = Object.keys(fresh).length;
  const version = doc.header.libraryVersion === AQUIFER_VERSION ? `aquifer ${AQUIFER_VERSION}` : `recorded with aquifer ${doc.header.libraryVersion}, rerun with ${AQUIFER_VERSION}`;
  if (diffs.length === 0 && refs.length === 0) {
    return {
      verification: {
        state: "verified",
        summary: `export reran the document: all ${outputCount} recorded outputs of ${cells} cells and every narrative reference were reproduced (relative tolerance ${DEFAULT_RTOL}; ${version}).`,
      },
      fresh,
    };
  }
  const details = [
    ...diffs.map((d) => differenceLine(loaded.shown, lineOf.get(d.cellId) ?? 1, d)),
    ...refs.map((p) => referenceProblemLine(loaded.shown, p)),
  ];
  return {
    verification: {
      state: "differences",
      summary: `export reran the document and ${diffs.length} output difference${diffs.length === 1 ? "" : "s"} and ${refs.length} failing narrative reference${refs.length === 1 ? "" : "s"} were found (relative tolerance ${DEFAULT_RTOL}; ${version}); the figures below are ${"the recorded ones"} unless the report was made with --rerun.`,
      details: details.length > MAX_DETAILS ? [...details.slice(0, MAX_DETAILS), `… and ${details.length - MAX_DETAILS} more`] : details,
    },
    fresh,
  };
}

function today(): string {
  return new Date().toISOString().slice(0, 10);
}

/** Runs the command; returns the exit code. */
export async function exportCommand(argv: readonly string[], io: Io): Promise<number> {
  const args = parseArgs(argv, EXPORT_OPTIONS, "export");
  const file = onePositional(args, "a document FILE", "export");
  const outFile = args.values.get("output");
  if (!outFile) throw new UsageError("`conebook export` needs -o FILE, the report to write", "export");
  const runDateRaw = args.values.get("run-date");
  const givenDate = runDateRaw === undefined ? undefined : checkDate(runDateRaw);
  const paper = checkPaper(args.values.get("paper"));
  const pdfFile = args.values.get("pdf");
  const rerun = args.flags.has("rerun");
  const noVerify = args.flags.has("no-verify");
  if (rerun && noVerify) throw new UsageError("--rerun runs the document and --no-verify does not; give one of them", "export");
  const loaded = await loadDocument(file, io.cwd);
  const doc = loaded.document;
  const outPath = resolve(io.cwd, outFile);
  const pdfPath = pdfFile === undefined ? undefined : resolve(io.cwd, pdfFile);
  if (outPath === loaded.path || pdfPath === loaded.path) throw new InputError(`the report would replace the document itself; give another file for the report`);

  const { checks, changed } = await checkPins(loaded);
  if (changed.length > 0) {
    for (const c of changed) io.err(pinChangedMessage(loaded.shown, c));
    io.err(`${loaded.shown}: no report written: the data changed since the outputs were made; restore the file, or pin it and rerun with --write`);
    return EXIT.checkFailed;
  }
  if (!rerun && doc.header.libraryVersion === undefined) {
    throw new InputError(
      `${place(loaded.shown, 1)}: the document has no recorded outputs (no recordedWith in its header); record them with \`conebook run ${loaded.shown} --write\`, or export with --rerun`,
    );
  }

  let verification: Verification;
  let outputs: Record<string, CellOutput[]>;
  if (noVerify) {
    verification = { state: "skipped", summary: "the report was made with --no-verify: the document was not rerun, and its recorded outputs were not checked against a fresh run." };
    outputs = recordedOutputs(doc);
  } else {
    const run = await verifyForReport(loaded, io);
    verification = run.verification;
    outputs = rerun ? run.fresh : recordedOutputs(doc);
    if (rerun) for (const [id, list] of Object.entries(run.fresh)) if (list.some((o) => o.type === "error")) io.err(`${loaded.shown}: note: cell ${id} failed; the report shows its error`);
  }
  const runDate = givenDate ?? (noVerify ? undefined : today());

  const { drawChart, layersWithoutLegend, reportChartSpec } = await import("../report/chart-svg.js");
  const charts: Record<string, ChartPicture> = {};
  for (const [cellId, list] of Object.entries(outputs)) {
    for (const [i, o] of list.entries()) {
      if (o.type !== "chart") continue;
      const prepared = reportChartSpec(o.spec);
      const picture = await drawChart(prepared.spec);
      charts[chartKey(cellId, i)] = "svg" in picture && prepared.caption !== undefined ? { ...picture, caption: prepared.caption } : picture;
      const bare = layersWithoutLegend(o.spec);
      if (bare.length > 0) io.err(`${loaded.shown}: note: chart ${chartKey(cellId, i)}: layer${bare.length === 1 ? "" : "s"} ${bare.join(", ")} ha${bare.length === 1 ? "s" : "ve"} no legend entry (encode color, shape or strokeDash with a field or a datum)`);
    }
  }
  const html = buildReport({
    document: doc,
    outputs,
    charts,
    verification,
    dataRows: await dataRows(loaded),
    provenance: {
      toolVersion: TOOL_VERSION,
      aquiferVersion: AQUIFER_VERSION,
      ...(doc.header.libraryVersion === undefined ? {} : { recordedWith: doc.header.libraryVersion }),
      outputsFrom: rerun ? "rerun" : "recorded",
      documentSha256: documentSha256(loaded),
      documentName: loaded.shown,
      dataFiles: checks.map((c) => ({ name: c.name, path: c.path, sha256: c.actual ?? c.pinned })),
      ...(runDate === undefined ? {} : { runDate }),
    },
  });
  await writeFileAtomic(outPath, html);
  const drawn = Object.values(charts).filter((c) => "svg" in c).length;
  io.out(`wrote ${shownPath(outPath, io.cwd)}: report of ${loaded.shown} (${drawn} chart${drawn === 1 ? "" : "s"} drawn; ${verification.state === "verified" ? "verified" : verification.state === "differences" ? "NOT verified: the rerun differs" : "not verified"})`);
  for (const [key, c] of Object.entries(charts)) if ("problem" in c) io.err(`${loaded.shown}: chart ${key} could not be drawn: ${c.problem}`);
  if (pdfPath !== undefined) {
    const { printToPdf } = await import("../report/pdf.js");
    const pdf = await printToPdf(html, paper);
    await writeFileAtomic(pdfPath, pdf);
    io.out(`wrote ${shownPath(pdfPath, io.cwd)}: the same report as PDF (${paper})`);
  }
  if (verification.state === "differences") {
    for (const d of verification.details ?? []) io.err(d);
    return EXIT.checkFailed;
  }
  return EXIT.ok;
}
