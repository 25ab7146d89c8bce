/**
 * HTML for recorded or fresh cell outputs: values with units, tables, text, JSON, controls, errors, and charts
 * (as SVG rendered beforehand). Every piece of text from the document or the outputs is escaped.
 */
import type { CellOutput } from "@conebook/document";
import { formatNumber } from "../format.js";
import { escapeHtml } from "./escape.js";

/** A chart drawn beforehand: its SVG markup, or the reason it could not be drawn. */
export type ChartPicture = { svg: string } | { problem: string };

function cellText(v: number | string | null): string {
  return typeof v === "number" ? formatNumber(v) : v === null ? "" : v;
}

/** HTML for one output. `chart` is the drawing of a chart output (ignored for other types). */
export function outputHtml(o: CellOutput, file: string, chart?: ChartPicture): string {
  switch (o.type) {
    case "value":
      return (
        `<p class="value">${o.label ? `<span class="label">${escapeHtml(o.label)}</span> = ` : ""}` +
        `<span class="number" title="${escapeHtml(String(o.value))}">${escapeHtml(formatNumber(o.value))}</span>` +
        `${o.unit ? ` <span class="unit">${escapeHtml(o.unit)}</span>` : ""}</p>`
      );
    case "text":
      return `<pre class="text">${escapeHtml(o.text)}</pre>`;
    case "table": {
      const head = o.columns.map((c) => `<th>${escapeHtml(c.name)}${c.unit ? ` <span class="unit">(${escapeHtml(c.unit)})</span>` : ""}</th>`).join("");
      const rows = o.rows
        .map((r) => `<tr>${r.map((v) => `<td${typeof v === "number" ? ' class="num"' : ""}>${escapeHtml(cellText(v))}</td>`).join("")}</tr>`)
        .join("\n");
      return `<table>${o.title ? `<caption>${escapeHtml(o.title)}</caption>` : ""}<thead><tr>${head}</tr></thead><tbody>\n${rows}\n</tbody></table>`;
    }
    case "chart":
      if (chart && "svg" in chart) return `<figure class="chart">${chart.svg}</figure>`;
      return `<p class="problem">The chart could not be drawn: ${escapeHtml(chart?.problem ?? "no drawing was made")}</p>`;
    case "json":
      return `<pre class="json">${escapeHtml(JSON.stringify(o.value, null, 2) ?? "null")}</pre>`;
    case "control": {
      const unit = o.unit ? ` ${o.unit}` : "";
      const range = o.min !== undefined && o.max !== undefined ? `, range ${formatNumber(o.min)} to ${formatNumber(o.max)}${unit}` : "";
      return (
        `<p class="control">Adjustable value <span class="label">${escapeHtml(o.name)}</span> = ${escapeHtml(formatNumber(o.value) + unit)}` +
        ` (default ${escapeHtml(formatNumber(o.default) + unit + range)})${o.description ? `: ${escapeHtml(o.description)}` : ""}</p>`
      );
    }
    case "error": {
      const where = o.line === undefined ? "" : `${file}:${o.line}${o.column === undefined ? "" : `:${o.column}`}: `;
      return `<p class="error">Error: ${escapeHtml(where + o.message)}</p>`;
    }
    case "not-run":
      return `<p class="not-run">Not run: ${escapeHtml(o.reason)}</p>`;
  }
}
