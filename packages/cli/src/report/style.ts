/**
 * The report's stylesheet, screen and print. Print: A4 or US Letter (the paper is the printer's or `--paper`'s
 * choice; margins fit both), page numbers in the bottom margin ("Page 3 of 12", CSS paged media margin boxes),
 * no figure or table split across pages (long data tables in the appendix may break, with their header row
 * repeated), the caution on the first page, code blocks closed.
 */
export const REPORT_STYLE = `
:root { --ink: #1b1b1b; --muted: #555; --rule: #bbb; --accent: #1f4e79; }
body { font: 15px/1.5 "DejaVu Sans", "Liberation Sans", Arial, system-ui, sans-serif; max-width: 48rem; margin: 2rem auto; padding: 0 1rem; color: var(--ink); }
h1 { font-size: 1.6rem; margin: 0.2rem 0 0.6rem; line-height: 1.25; }
h2 { font-size: 1.25rem; margin: 1.8rem 0 0.6rem; color: var(--accent); }
h3 { font-size: 1.05rem; margin: 1.3rem 0 0.4rem; }
.kind { text-transform: uppercase; letter-spacing: 0.08em; font-size: 0.8rem; color: var(--muted); margin: 0; }
.secno { color: var(--muted); margin-right: 0.4em; }
.caution { border: 2px solid #a15c00; background: #fff6e5; padding: 0.6rem 0.9rem; margin: 0.8rem 0 1rem; }
.status { border-left: 5px solid; padding: 0.5rem 0.9rem; margin: 0 0 1rem; }
.status-verified { border-color: #2e7d32; background: #eef7ee; }
.status-differences { border-color: #b71c1c; background: #fdeeee; }
.status-skipped { border-color: #777; background: #f3f3f3; }
.status ul { margin: 0.3rem 0 0; padding-left: 1.2rem; font-size: 0.85rem; }
.numbers-rule { font-size: 0.85rem; color: var(--muted); }
dl.facts { display: grid; grid-template-columns: max-content 1fr; gap: 0.15rem 1rem; margin: 0.5rem 0 1rem; }
dl.facts dt { font-weight: 600; }
dl.facts dd { margin: 0; }
nav.toc ol { list-style: none; padding-left: 0; margin: 0.3rem 0; }
nav.toc ol ol { padding-left: 1.4rem; }
nav.toc li { margin: 0.1rem 0; }
nav.toc a { color: var(--ink); text-decoration: none; }
nav.toc .lists { font-size: 0.85rem; color: var(--muted); }
.cell { margin: 1rem 0; }
details { margin: 0.4rem 0; }
summary { cursor: pointer; color: var(--muted); font-size: 0.85rem; }
pre { background: #f5f5f5; padding: 0.5rem 0.75rem; overflow-x: auto; font-size: 0.8rem; }
pre.text { white-space: pre-wrap; overflow-wrap: anywhere; background: #f7f7f2; }
table { border-collapse: collapse; margin: 0.8rem 0; font-size: 0.85rem; }
caption { caption-side: top; text-align: left; padding-bottom: 0.3rem; font-size: 0.9rem; }
caption .label, figcaption .label { font-weight: 700; }
th, td { border: 1px solid #ccc; padding: 0.2rem 0.45rem; text-align: left; vertical-align: top; }
th { background: #f2f4f7; font-weight: 600; }
td.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
td.words { font-style: italic; color: #6b3a00; }
tr.unconstrained td { background: #fffaf0; }
td.left-out { color: #8a1c1c; }
.value .number { font-weight: 600; font-variant-numeric: tabular-nums; }
.unit { color: var(--muted); }
.reference { font-variant-numeric: tabular-nums; }
.reference-problem { color: #b71c1c; font-weight: 600; }
.error { color: #9b1c1c; font-weight: 600; }
.not-run, .problem, .missing { color: #666; font-style: italic; }
figure.chart { margin: 1rem 0; }
figure.chart svg { display: block; width: 100%; height: auto; }
figcaption { font-size: 0.9rem; margin-top: 0.3rem; }
.appendix table.readings { font-size: 0.75rem; }
footer { margin-top: 2.5rem; border-top: 1px solid var(--rule); font-size: 0.85rem; }
footer dt { font-weight: 600; }
footer dd { margin: 0 0 0.4rem 0; overflow-wrap: anywhere; }
.digest, footer dd.digest { font-family: "DejaVu Sans Mono", ui-monospace, monospace; word-break: break-all; font-size: 0.8em; }
.sources li { margin: 0.25rem 0; }
.sources .kind-tag { font-size: 0.75rem; color: var(--muted); text-transform: uppercase; letter-spacing: 0.05em; }
@page { margin: 16mm 15mm 18mm 15mm;
  @bottom-center { content: "Page " counter(page) " of " counter(pages); font: 9pt "DejaVu Sans", Arial, sans-serif; color: #555; }
}
@media print {
  body { max-width: none; margin: 0; padding: 0; font-size: 10pt; }
  h2 { break-after: avoid; }
  h3 { break-after: avoid; }
  figure, table, .caution, .status, pre.text, .value { break-inside: avoid; }
  .appendix table.readings { break-inside: auto; }
  thead { display: table-header-group; }
  tr { break-inside: avoid; }
  details > :not(summary) { display: none; }
  summary { list-style: none; }
  a { color: inherit; text-decoration: none; }
  section.appendix { break-before: page; }
  footer { break-before: page; }
}
`;
