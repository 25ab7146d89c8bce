/** The report builder: pure functions from a document and its outputs to a self-contained HTML page. */
export { buildReport, chartKey, isReadingsTable, REPORT_CSP, type Provenance, type ReportInput, type Verification } from "./build-report.js";
export { outputHtml, tableHtml, Numbering, type ChartPicture } from "./outputs-html.js";
export { escapeHtml } from "./escape.js";
export { CAUTION_TEXT } from "./caution.js";
export { methodSources, type MethodSource } from "./sources.js";
