/**
 * HTML for recorded or fresh cell outputs as a practitioner writes them: values with typeset units and four
 * significant digits, estimate tables rounded row by row to their standard error (number-text.ts in
 * @conebook/document), a parameter the data do not constrain said in words, numbered and titled tables and
 * figures (charts drawn beforehand as SVG) with captions. Every piece of text from the document or the
 * outputs is escaped; each shown number carries its full-precision value in a tooltip.
 */
import {
  estimateColumns,
  formatAtPlace,
  formatPlain,
  typesetUnit,
  uncertaintyPlace,
  unconstrainedReason,
  rowUncertainty,
  isDimensionless,
} from "@conebook/document";
import type { CellOutput } from "@conebook/document";
import { escapeHtml } from "./escape.js";

/** A chart drawn beforehand: its SVG markup and caption, or the reason it could not be drawn. */
export type ChartPicture = { svg: string; caption?: string } | { problem: string };

type Table = Extract<CellOutput, { type: "table" }>;
type Value = number | string | null;

/** Numbering of figures and tables across one report. */
export class Numbering {
  figures: { n: number; caption: string; anchor: string }[] = [];
  tables: { n: number; caption: string; anchor: string }[] = [];

  figure(caption: string): { n: number; anchor: string } {
    const n = this.figures.length + 1;
    const anchor = `figure-${n}`;
    this.figures.push({ n, caption, anchor });
    return { n, anchor };
  }

  table(caption: string, prefix = ""): { n: number; label: string; anchor: string } {
    const n = this.tables.length + 1;
    const anchor = `table-${n}`;
    this.tables.push({ n, caption, anchor });
    return { n, label: `${prefix}${n}`, anchor };
  }
}

/** A number as shown, with its full value as a tooltip. */
export function numberHtml(shown: string, full: number): string {
  return `<span class="number" title="${escapeHtml(String(full))}">${escapeHtml(shown)}</span>`;
}

function plainCell(v: Value): string {
  if (typeof v === "number") return numberHtml(formatPlain(v), v);
  return v === null ? "" : escapeHtml(v);
}

function exactCell(v: Value): string {
  // 12 significant digits: every digit a logger records, without the last-bit noise of a computed difference.
  if (typeof v === "number") return numberHtml(String(Number(v.toPrecision(12))).replace("-", "−"), v);
  return v === null ? "" : escapeHtml(v);
}

/** The column heading with its unit in parentheses (no unit for a dimensionless quantity). */
function headingHtml(c: Table["columns"][number]): string {
  const unit = typesetUnit(c.unit);
  return `${escapeHtml(c.name)}${unit ? ` <span class="unit">(${escapeHtml(unit)})</span>` : ""}`;
}

/** Rows of an estimate table: each number rounded at the row's uncertainty; unconstrained rows said in words. */
function estimateRowsHtml(t: Table, roles: NonNullable<ReturnType<typeof estimateColumns>>, shown: number[]): string {
  const uncertaintyColumns = [roles.standardError, roles.low, roles.high].filter((c): c is number => c !== undefined);
  return t.rows
    .map((row) => {
      const reason = unconstrainedReason(row, roles);
      const u = rowUncertainty(row, roles);
      const place = reason === undefined && u !== undefined ? uncertaintyPlace(u) : undefined;
      const cells: string[] = [];
      let merged = false;
      for (const c of shown) {
        const v = row[c] ?? null;
        if (reason !== undefined && uncertaintyColumns.includes(c)) {
          if (!merged) {
            const span = shown.filter((x) => uncertaintyColumns.includes(x)).length;
            cells.push(`<td class="words" colspan="${span}">${escapeHtml(reason)}</td>`);
            merged = true;
          }
          continue;
        }
        if (c === roles.unit) {
          cells.push(`<td class="unit">${typeof v === "string" ? (isDimensionless(v) ? "–" : escapeHtml(typesetUnit(v))) : plainCell(v)}</td>`);
        } else if (typeof v === "number" && place !== undefined && (c === roles.estimate || uncertaintyColumns.includes(c))) {
          const shownValue = c === roles.standardError ? formatAtPlace(uncertaintyPlace(v)?.rounded ?? v, place.exponent) : formatAtPlace(v, place.exponent);
          cells.push(`<td class="num">${numberHtml(shownValue, v)}</td>`);
        } else cells.push(`<td${typeof v === "number" ? ' class="num"' : ""}>${plainCell(v)}</td>`);
      }
      return `<tr${reason !== undefined ? ' class="unconstrained"' : ""}>${cells.join("")}</tr>`;
    })
    .join("\n");
}

/**
 * A table with its number and caption. `label` is "3" or "A1". With `exact`, numbers are shown to 12
 * significant digits, trailing zeros dropped (every digit of a recorded reading), as a list of readings should be.
 */
export function tableHtml(t: Table, label: string, anchor: string, caption: string, exact = false): string {
  const roles = estimateColumns(t.columns);
  const shown = t.columns.map((_, i) => i).filter((i) => roles?.note === undefined || i !== roles.note);
  const head = shown.map((i) => `<th>${headingHtml(t.columns[i]!)}</th>`).join("");
  const body = roles
    ? estimateRowsHtml(t, roles, shown)
    : t.rows
        .map((r) => `<tr>${shown.map((i) => `<td${typeof r[i] === "number" ? ' class="num"' : ""}>${exact ? exactCell(r[i] ?? null) : plainCell(r[i] ?? null)}</td>`).join("")}</tr>`)
        .join("\n");
  return (
    `<table id="${anchor}"><caption><span class="label">Table ${escapeHtml(label)}.</span> ${escapeHtml(caption)}</caption>` +
    `<thead><tr>${head}</tr></thead><tbody>\n${body}\n</tbody></table>`
  );
}

/** HTML for one output; tables and charts take the next number from `numbering`. */
export function outputHtml(o: CellOutput, file: string, numbering: Numbering, cellId: string, chart?: ChartPicture): string {
  switch (o.type) {
    case "value": {
      const unit = typesetUnit(o.unit);
      return (
        `<p class="value">${o.label ? `<span class="label">${escapeHtml(o.label)}</span> = ` : ""}` +
        `${numberHtml(formatPlain(o.value), o.value)}${unit ? ` <span class="unit">${escapeHtml(unit)}</span>` : ""}</p>`
      );
    }
    case "text":
      return `<pre class="text">${escapeHtml(o.text)}</pre>`;
    case "table": {
      const caption = o.title ?? `Output of cell ${cellId}`;
      const { label, anchor } = numbering.table(caption);
      return tableHtml(o, label, anchor, caption);
    }
    case "chart": {
      if (chart && "svg" in chart) {
        const caption = chart.caption ?? `Chart of cell ${cellId}`;
        const { n, anchor } = numbering.figure(caption);
        return `<figure class="chart" id="${anchor}">${chart.svg}<figcaption><span class="label">Figure ${n}.</span> ${escapeHtml(caption)}</figcaption></figure>`;
      }
      return `<p class="problem">The chart could not be drawn: ${escapeHtml(chart && "problem" in chart ? chart.problem : "no drawing was made")}</p>`;
    }
    case "json":
      return `<pre class="json">${escapeHtml(JSON.stringify(o.value, null, 2) ?? "null")}</pre>`;
    case "control": {
      const unit = typesetUnit(o.unit);
      const u = unit ? ` ${unit}` : "";
      const range = o.min !== undefined && o.max !== undefined ? `, range ${formatPlain(o.min)} to ${formatPlain(o.max)}${u}` : "";
      return (
        `<p class="control">Adjustable value <span class="label">${escapeHtml(o.name)}</span> = ${numberHtml(formatPlain(o.value) + u, o.value)}` +
        ` (default ${escapeHtml(formatPlain(o.default) + u + range)})${o.description ? `: ${escapeHtml(o.description)}` : ""}</p>`
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
