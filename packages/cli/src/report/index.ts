/** The report builder: pure functions from a document and its outputs to a self-contained HTML page. */
export { buildReport, chartKey, REPORT_CSP, type Provenance, type ReportInput } from "./build-report.js";
export { outputHtml, type ChartPicture } from "./outputs-html.js";
export { escapeHtml } from "./escape.js";
export { CAUTION_TEXT } from "./caution.js";
