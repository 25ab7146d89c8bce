/**
 * The exported report: one self-contained HTML page (no script, no external resource, a Content-Security-Policy
 * that forbids both) with the title, the caution, the narrative, each cell's code in a collapsible block, its
 * outputs, and the provenance of the run. A pure function of its input.
 */
import { renderNarrative } from "@conebook/document";
import type { Cell, CellOutput, ConebookDocument } from "@conebook/document";
import { CAUTION_TEXT } from "./caution.js";
import { escapeHtml } from "./escape.js";
import { outputHtml, type ChartPicture } from "./outputs-html.js";

/** The Content-Security-Policy of every report. */
export const REPORT_CSP = "default-src 'none'; img-src data:; style-src 'unsafe-inline'";

/** Where a report's facts came from. */
export interface Provenance {
  toolVersion: string;
  aquiferVersion: string;
  /** `recordedWith` of the document, when it has one. */
  recordedWith?: string;
  /** "recorded": outputs as recorded in the file; "rerun": outputs of a fresh run made for the report. */
  outputsFrom: "recorded" | "rerun";
  /** SHA-256 of the document file's bytes. */
  documentSha256: string;
  documentName: string;
  dataFiles: { name: string; path: string; sha256: string }[];
  /** The run date given on the command line (YYYY-MM-DD); absent unless given. */
  runDate?: string;
}

/** Everything the report shows. */
export interface ReportInput {
  document: ConebookDocument;
  /** Outputs by cell id. */
  outputs: Record<string, readonly CellOutput[]>;
  /** Chart drawings by `${cellId}/${outputIndex}`. */
  charts: Record<string, ChartPicture>;
  provenance: Provenance;
}

/** The key of a chart drawing in ReportInput.charts. */
export function chartKey(cellId: string, index: number): string {
  return `${cellId}/${index}`;
}

const STYLE = `
body { font: 15px/1.5 system-ui, sans-serif; max-width: 60rem; margin: 2rem auto; padding: 0 1rem; color: #1b1b1b; }
h1 { font-size: 1.7rem; margin-bottom: 0.5rem; }
.caution { border: 2px solid #a15c00; background: #fff6e5; padding: 0.75rem 1rem; margin: 1rem 0 2rem; }
.cell { margin: 1.5rem 0; }
details { margin: 0.5rem 0; }
summary { cursor: pointer; color: #444; font-size: 0.9rem; }
pre { background: #f5f5f5; padding: 0.5rem 0.75rem; overflow-x: auto; font-size: 0.85rem; }
pre.text { white-space: pre-wrap; overflow-wrap: anywhere; }
table { border-collapse: collapse; margin: 0.5rem 0; font-size: 0.9rem; }
caption { text-align: left; font-weight: 600; padding-bottom: 0.25rem; }
th, td { border: 1px solid #ccc; padding: 0.2rem 0.5rem; text-align: left; }
td.num { text-align: right; font-variant-numeric: tabular-nums; }
.value .number { font-weight: 600; font-variant-numeric: tabular-nums; }
.unit { color: #555; }
.error { color: #9b1c1c; font-weight: 600; }
.not-run, .problem { color: #666; font-style: italic; }
figure.chart { margin: 0.5rem 0; overflow-x: auto; }
footer { margin-top: 3rem; border-top: 1px solid #ccc; font-size: 0.85rem; }
dt { font-weight: 600; }
dd { margin: 0 0 0.4rem 0; font-family: ui-monospace, monospace; word-break: break-all; }
`;

function cellBody(cell: Cell, input: ReportInput): string {
  const file = input.provenance.documentName;
  const id = escapeHtml(cell.id);
  if (cell.kind === "narrative") return `<section class="cell narrative">${renderNarrative(cell.source)}</section>`;
  const outputs = input.outputs[cell.id] ?? [];
  const shown = outputs.map((o, i) => outputHtml(o, file, o.type === "chart" ? input.charts[chartKey(cell.id, i)] : undefined)).join("\n");
  let source: string;
  if (cell.kind === "code") source = `<details><summary>Code (cell ${id})</summary><pre><code>${escapeHtml(cell.source)}</code></pre></details>`;
  else if (cell.kind === "data") {
    source = cell.file
      ? `<details><summary>Data "${escapeHtml(cell.name)}" (cell ${id}): file ${escapeHtml(cell.file.path)}</summary><p>SHA-256 ${escapeHtml(cell.file.sha256)}</p></details>`
      : `<details><summary>Data "${escapeHtml(cell.name)}" (cell ${id})</summary><pre>${escapeHtml(cell.source)}</pre></details>`;
  } else source = `<details><summary>Chart specification (cell ${id})</summary><pre>${escapeHtml(JSON.stringify(cell.spec, null, 2))}</pre></details>`;
  return `<section class="cell ${cell.kind}">\n${source}\n${shown}\n</section>`;
}

function provenanceHtml(p: Provenance): string {
  const item = (term: string, value: string) => `<dt>${escapeHtml(term)}</dt><dd>${escapeHtml(value)}</dd>`;
  const items = [
    item("Tool", `conebook ${p.toolVersion}`),
    item("Aquifer library", `aquifer ${p.aquiferVersion}`),
    item(
      "Outputs",
      p.outputsFrom === "recorded"
        ? `as recorded in the document${p.recordedWith ? ` (recorded with aquifer ${p.recordedWith})` : ""}`
        : `from a fresh run made for this report with aquifer ${p.aquiferVersion}`,
    ),
    item(`Document ${p.documentName} (SHA-256)`, p.documentSha256),
    ...p.dataFiles.map((d) => item(`Data "${d.name}": ${d.path} (SHA-256)`, d.sha256)),
  ];
  if (p.runDate !== undefined) items.push(item("Run date", p.runDate));
  return `<footer><h2>Provenance</h2><dl>\n${items.join("\n")}\n</dl></footer>`;
}

/** The report's HTML text. Cost: linear in the size of the document, outputs and drawings. */
export function buildReport(input: ReportInput): string {
  const title = escapeHtml(input.document.header.title);
  const cells = input.document.cells.map((c) => cellBody(c, input)).join("\n");
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="${REPORT_CSP}">
<meta name="viewport" content="width=device-width, initial-scale=1">
<link rel="icon" href="data:,">
<title>${title}</title>
<style>${STYLE}</style>
</head>
<body>
<header>
<h1>${title}</h1>
<div class="caution" role="note"><strong>Caution.</strong> ${escapeHtml(CAUTION_TEXT)}</div>
</header>
<main>
${cells}
</main>
${provenanceHtml(input.provenance)}
</body>
</html>
`;
}
