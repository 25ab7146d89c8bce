/**
 * The exported report: one self-contained HTML page (no script, no external resource, a Content-Security-Policy
 * that forbids both), laid out as a submission: the title, the caution and whether the document verified at
 * export on the first page, the test information, how numbers are shown, a table of contents; the narrative
 * with numbered sections and its references to computed results; each cell's code in a collapsible block and
 * its outputs as numbered tables and figures; then the appendices (data with the readings used and left out,
 * hand-typed narrative numbers that match no computed value, methods and sources) and the provenance.
 * A pure function of its input.
 */
import {
  ROUNDING_RULE_TEXT,
  computedNumbers,
  numberIndex,
  referenceText,
  renderNarrative,
  resolveReference,
  unmatchedNumbers,
  type FoundReference,
} from "@conebook/document";
import type { Cell, CellOutput, ConebookDocument } from "@conebook/document";
import { CAUTION_TEXT } from "./caution.js";
import { escapeHtml } from "./escape.js";
import { Numbering, outputHtml, tableHtml, type ChartPicture } from "./outputs-html.js";
import { methodSources } from "./sources.js";
import { REPORT_STYLE } from "./style.js";
import { testInformationHtml } from "./test-info-html.js";

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
  /** The date of the run behind the report (YYYY-MM-DD): given on the command line, or the day of the run at export. */
  runDate?: string;
}

/** Whether the document reproduced its recorded outputs when the report was made. */
export interface Verification {
  state: "verified" | "differences" | "skipped";
  /** One sentence: what was compared and the outcome. */
  summary: string;
  /** The differences, one line each (at most a few dozen). */
  details?: string[];
}

/** Everything the report shows. */
export interface ReportInput {
  document: ConebookDocument;
  /** Outputs by cell id. */
  outputs: Record<string, readonly CellOutput[]>;
  /** Chart drawings by `${cellId}/${outputIndex}`. */
  charts: Record<string, ChartPicture>;
  provenance: Provenance;
  verification: Verification;
  /** The rows of each data cell by cell id (header and values as text), for the appendix when no readings table lists them. */
  dataRows?: Record<string, { columns: string[]; rows: string[][] }>;
}

/** The key of a chart drawing in ReportInput.charts. */
export function chartKey(cellId: string, index: number): string {
  return `${cellId}/${index}`;
}

/** True for a readings table (show.readings): first column "reading", last column "use". */
export function isReadingsTable(o: CellOutput): o is Extract<CellOutput, { type: "table" }> {
  return o.type === "table" && o.columns.length >= 2 && o.columns[0]!.name === "reading" && o.columns[o.columns.length - 1]!.name === "use";
}

interface Heading {
  level: number;
  number: string;
  html: string;
  anchor: string;
}

/** Numbers the narrative's headings (h2 as 1, 2, ...; h3 as 1.1, ...) and gives each an anchor. */
class Sections {
  headings: Heading[] = [];
  private h2 = 0;
  private h3 = 0;

  number(html: string): string {
    return html.replace(/<h([1-4])>([\s\S]*?)<\/h\1>/g, (_, levelText: string, inner: string) => {
      const level = Number(levelText);
      let number = "";
      if (level === 2) {
        this.h2++;
        this.h3 = 0;
        number = String(this.h2);
      } else if (level === 3 && this.h2 > 0) {
        this.h3++;
        number = `${this.h2}.${this.h3}`;
      }
      const anchor = `section-${this.headings.length + 1}`;
      this.headings.push({ level, number, html: inner.replace(/<[^>]*>/g, ""), anchor });
      const prefix = number ? `<span class="secno">${number}</span>` : "";
      return `<h${level} id="${anchor}">${prefix}${inner}</h${level}>`;
    });
  }
}

function referenceRendering(outputs: ReportInput["outputs"]) {
  return (found: FoundReference) => {
    if (!("reference" in found)) return { text: found.text, title: `not a reference: ${found.problem}`, problem: true };
    const r = resolveReference(found.reference, outputs);
    if ("problem" in r) return { text: found.reference.text, title: `unresolved: ${r.problem}`, problem: true };
    return { text: referenceText(r.resolved), title: `${found.reference.text} = ${r.resolved.value}${r.resolved.unit ? ` ${r.resolved.unit}` : ""} (${r.resolved.where})` };
  };
}

interface Body {
  html: string;
  readings: { cellId: string; table: Extract<CellOutput, { type: "table" }> }[];
}

function cellsHtml(input: ReportInput, sections: Sections, numbering: Numbering, appendixTables: string[]): Body {
  const file = input.provenance.documentName;
  const readings: Body["readings"] = [];
  const reference = referenceRendering(input.outputs);
  const html = input.document.cells
    .map((cell: Cell) => {
      const id = escapeHtml(cell.id);
      if (cell.kind === "narrative") return `<section class="cell narrative">${sections.number(renderNarrative(cell.source, { reference }))}</section>`;
      const outputs = input.outputs[cell.id] ?? [];
      const shown = outputs
        .map((o, i) => {
          if (isReadingsTable(o)) {
            readings.push({ cellId: cell.id, table: o });
            const label = `A${appendixTables.length + 2}`;
            appendixTables.push(label);
            return `<p class="readings-note">${escapeHtml(o.title ?? "Readings")}: every reading is listed in Appendix A, Table ${label}.</p>`;
          }
          return outputHtml(o, file, numbering, cell.id, o.type === "chart" ? input.charts[chartKey(cell.id, i)] : undefined);
        })
        .join("\n");
      let source: string;
      if (cell.kind === "code") source = `<details class="code"><summary>Code (cell ${id})</summary><pre><code>${escapeHtml(cell.source)}</code></pre></details>`;
      else if (cell.kind === "data") {
        source = cell.file
          ? `<p class="data-note">Data set "${escapeHtml(cell.name)}" (cell ${id}): file ${escapeHtml(cell.file.path)}, listed in Appendix A.</p>`
          : `<details><summary>Data "${escapeHtml(cell.name)}" (cell ${id})</summary><pre>${escapeHtml(cell.source)}</pre></details>`;
      } else source = `<details><summary>Chart specification (cell ${id})</summary><pre>${escapeHtml(JSON.stringify(cell.spec, null, 2))}</pre></details>`;
      return `<section class="cell ${cell.kind}">\n${source}\n${shown}\n</section>`;
    })
    .join("\n");
  return { html, readings };
}

function verificationHtml(v: Verification): string {
  const title = v.state === "verified" ? "Verified at export." : v.state === "differences" ? "Not verified at export." : "Not verified at export (skipped).";
  const details = v.details && v.details.length > 0 ? `<ul>${v.details.map((d) => `<li>${escapeHtml(d)}</li>`).join("")}</ul>` : "";
  return `<div class="status status-${v.state}" role="status"><strong>${title}</strong> ${escapeHtml(v.summary)}${details}</div>`;
}

function appendixDataHtml(input: ReportInput, readings: Body["readings"], labels: string[]): string {
  const p = input.provenance;
  const parts = [`<section class="appendix" id="appendix-a"><h2>Appendix A. Data</h2>`];
  const dataCells = input.document.cells.filter((c) => c.kind === "data");
  const fileRows = dataCells.map((c) => {
    const pin = p.dataFiles.find((d) => d.name === c.name);
    const rows = input.dataRows?.[c.id]?.rows.length;
    return `<tr><td>${escapeHtml(c.name)}</td><td>${escapeHtml(c.file?.path ?? "inline in the document")}</td><td class="num">${rows === undefined ? "" : rows}</td><td class="digest">${escapeHtml(pin?.sha256 ?? c.file?.sha256 ?? "(inline: covered by the document's digest)")}</td></tr>`;
  });
  parts.push(
    `<table id="table-A1"><caption><span class="label">Table A1.</span> Data sets of the document and the SHA-256 of each file (checked against the document's pins before this report was made)</caption>` +
      `<thead><tr><th>data set</th><th>file</th><th>rows</th><th>SHA-256</th></tr></thead><tbody>\n${fileRows.join("\n")}\n</tbody></table>`,
  );
  if (readings.length > 0) {
    parts.push(`<p>The analysis listed every reading it read with whether it used it (<code>show.readings</code>); a reading left out says why.</p>`);
    readings.forEach((r, i) => {
      const label = labels[i]!;
      const html = tableHtml(r.table, label, `table-${label}`, `${r.table.title ?? "Readings"} (cell ${r.cellId}); times and drawdowns as the analysis read them`, true).replace("<table ", '<table class="readings" ');
      parts.push(html.replace(/<td>(left out[^<]*)<\/td>/g, '<td class="left-out">$1</td>'));
    });
  } else {
    parts.push(
      `<p>The analysis did not list which readings it used (<code>show.readings</code> in a code cell does); every row of each data set follows as read from its file.</p>`,
    );
    let n = 2;
    for (const c of dataCells) {
      const data = input.dataRows?.[c.id];
      if (!data) continue;
      const label = `A${n++}`;
      const head = data.columns.map((h) => `<th>${escapeHtml(h)}</th>`).join("");
      const body = data.rows.map((r) => `<tr>${r.map((v) => `<td class="num">${escapeHtml(v)}</td>`).join("")}</tr>`).join("\n");
      parts.push(`<table class="readings" id="table-${label}"><caption><span class="label">Table ${label}.</span> Data set "${escapeHtml(c.name)}" as recorded</caption><thead><tr>${head}</tr></thead><tbody>\n${body}\n</tbody></table>`);
    }
  }
  parts.push("</section>");
  return parts.join("\n");
}

function appendixNumbersHtml(input: ReportInput): { html: string; count: number } {
  const index = numberIndex(computedNumbers(input.outputs, input.document.header));
  const rows: string[] = [];
  for (const cell of input.document.cells) {
    if (cell.kind !== "narrative") continue;
    for (const n of unmatchedNumbers(cell.source, index)) {
      const from = Math.max(0, n.offset - 40);
      const to = Math.min(cell.source.length, n.offset + n.text.length + 30);
      const context = `${from > 0 ? "…" : ""}${cell.source.slice(from, n.offset)}[${n.text}]${cell.source.slice(n.offset + n.text.length, to)}${to < cell.source.length ? "…" : ""}`.replace(/\s+/g, " ");
      rows.push(`<tr><td>${escapeHtml(cell.id)}</td><td class="num">${escapeHtml(n.text)}</td><td>${escapeHtml(context)}</td></tr>`);
    }
  }
  const intro =
    `<p>A hint for the reviewer: numbers typed by hand in the narrative that match no value the analysis computed or the header declares, ` +
    `at the number of significant digits written (sign ignored). They may be constants of a formula, rules of thumb, or figures that drifted ` +
    `from the results. Not checked: code, narrative references (which are computed), whole numbers below 10 and years of citations.</p>`;
  const body =
    rows.length === 0
      ? `<p>Every number in the narrative matches a computed value.</p>`
      : `<table id="table-B1"><caption><span class="label">Table B1.</span> Narrative numbers that match no computed value</caption><thead><tr><th>narrative cell</th><th>number</th><th>where (the number in brackets)</th></tr></thead><tbody>\n${rows.join("\n")}\n</tbody></table>`;
  return { html: `<section class="appendix" id="appendix-b"><h2>Appendix B. Narrative numbers without a computed match</h2>${intro}${body}</section>`, count: rows.length };
}

function appendixSourcesHtml(doc: ConebookDocument): string {
  const items = methodSources(doc)
    .map((s) => `<li><strong>${escapeHtml(s.method)}.</strong> ${s.kind === "common practice" ? `<span class="kind-tag">common practice</span> ` : ""}${escapeHtml(s.citation.replace(/^common practice:?\s*/, ""))}</li>`)
    .join("\n");
  return `<section class="appendix" id="appendix-c"><h2>Appendix C. Methods and sources</h2><p>Each method the analysis uses, with its published source; a rule of thumb is labelled common practice, with the reason it is used.</p><ul class="sources">\n${items}\n</ul></section>`;
}

function provenanceHtml(p: Provenance, v: Verification): string {
  const item = (term: string, value: string, digest = false) => `<dt>${escapeHtml(term)}</dt><dd${digest ? ' class="digest"' : ""}>${escapeHtml(value)}</dd>`;
  const items = [
    item(`Document ${p.documentName} (SHA-256)`, p.documentSha256, true),
    ...p.dataFiles.map((d) => item(`Data "${d.name}": ${d.path} (SHA-256)`, d.sha256, true)),
    item("Tool", `conebook ${p.toolVersion}`),
    item("Aquifer library", `aquifer ${p.aquiferVersion}`),
    item(
      "Outputs shown",
      p.outputsFrom === "recorded"
        ? `as recorded in the document${p.recordedWith ? ` (recorded with aquifer ${p.recordedWith})` : ""}`
        : `from a fresh run made for this report with aquifer ${p.aquiferVersion}`,
    ),
    item("Verification at export", `${v.state === "verified" ? "verified" : v.state === "differences" ? "not verified: differences found" : "skipped (--no-verify)"}: ${v.summary}`),
    item("Date of the run", p.runDate ?? "not stated (the outputs were not rerun for this report and the document does not record when they were made)"),
  ];
  return `<footer id="provenance"><h2>Provenance</h2><dl>\n${items.join("\n")}\n</dl></footer>`;
}

function tocHtml(headings: Heading[], numbering: Numbering): string {
  const top = headings.filter((h) => h.level <= 3);
  const items: string[] = [];
  let open = false;
  for (const h of top) {
    const link = `<a href="#${h.anchor}">${h.number ? `<span class="secno">${h.number}</span>` : ""}${h.html}</a>`;
    if (h.level === 3) {
      if (!open) {
        items.push("<ol>");
        open = true;
      }
      items.push(`<li>${link}</li>`);
    } else {
      if (open) {
        items.push("</ol>");
        open = false;
      }
      items.push(`<li>${link}</li>`);
    }
  }
  if (open) items.push("</ol>");
  const appendices = [
    ["appendix-a", "Appendix A. Data"],
    ["appendix-b", "Appendix B. Narrative numbers without a computed match"],
    ["appendix-c", "Appendix C. Methods and sources"],
    ["provenance", "Provenance"],
  ].map(([a, t]) => `<li><a href="#${a}">${escapeHtml(t!)}</a></li>`);
  const lists = `<p class="lists">${numbering.figures.length} figure${numbering.figures.length === 1 ? "" : "s"}, ${numbering.tables.length} table${numbering.tables.length === 1 ? "" : "s"} in the body; figures and tables are numbered in order.</p>`;
  return `<nav class="toc" id="contents"><h2>Contents</h2><ol>\n<li><a href="#test-information">Test information</a></li>\n${items.join("\n")}\n${appendices.join("\n")}\n</ol>${lists}</nav>`;
}

/** The report's HTML text. Cost: linear in the size of the document, outputs and drawings. */
export function buildReport(input: ReportInput): string {
  const title = escapeHtml(input.document.header.title);
  const numbering = new Numbering();
  const sections = new Sections();
  const testInfo = testInformationHtml(input.document.header, numbering);
  const readingLabels: string[] = [];
  const body = cellsHtml(input, sections, numbering, readingLabels);
  const numbers = appendixNumbersHtml(input);
  const dataAppendix = appendixDataHtml(input, body.readings, readingLabels);
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="${REPORT_CSP}">
<meta name="viewport" content="width=device-width, initial-scale=1">
<link rel="icon" href="data:,">
<title>${title}</title>
<style>${REPORT_STYLE}</style>
</head>
<body>
<header class="front">
<p class="kind">Aquifer-test analysis report</p>
<h1>${title}</h1>
<div class="caution" role="note"><strong>Caution.</strong> ${escapeHtml(CAUTION_TEXT)}</div>
${verificationHtml(input.verification)}
${testInfo}
<p class="numbers-rule"><strong>How numbers are shown.</strong> ${escapeHtml(ROUNDING_RULE_TEXT)} Hover a number in the HTML report to see its full value.</p>
${tocHtml(sections.headings, numbering)}
</header>
<main>
${body.html}
</main>
${dataAppendix}
${numbers.html}
${appendixSourcesHtml(input.document)}
${provenanceHtml(input.provenance, input.verification)}
</body>
</html>
`;
}
