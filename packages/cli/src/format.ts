/** Number and output formatting shared by the terminal summary and the report. */
import { isDimensionless, type CellOutput } from "@conebook/document";

/**
 * A number for reading: 6 significant digits, trailing zeros dropped, exponent form below 1e-4 and from 1e6 in
 * magnitude. For exact values (as in verify messages) use String(value) instead.
 */
export function formatNumber(v: number | null): string {
  if (v === null) return "null";
  if (!Number.isFinite(v)) return String(v);
  if (v === 0) return "0";
  const a = Math.abs(v);
  if (a < 1e-4 || a >= 1e6) return v.toExponential(5).replace(/\.?0+e/, "e");
  return String(Number(v.toPrecision(6)));
}

function clip(s: string, max: number): string {
  const one = s.replace(/\s+/g, " ").trim();
  return one.length <= max ? one : `${one.slice(0, max - 1)}…`;
}

/** One short phrase for an output, for the run summary. */
export function outputDigest(o: CellOutput): string {
  switch (o.type) {
    case "value":
      return `${o.label ? `${o.label} = ` : ""}${formatNumber(o.value)}${isDimensionless(o.unit) ? "" : ` ${o.unit}`}`;
    case "text":
      return JSON.stringify(clip(o.text, 40));
    case "table":
      return `table${o.title ? ` "${clip(o.title, 60)}"` : ""} ${o.rows.length}×${o.columns.length}`;
    case "chart": {
      const d = o.summary.datasets;
      return `chart (${d.length ? d.map((x) => `${x.name}: ${x.rows} rows`).join(", ") : "no data"})`;
    }
    case "json":
      return `json ${clip(JSON.stringify(o.value) ?? "null", 40)}`;
    case "control":
      return `control ${o.name} = ${formatNumber(o.value)}${o.unit ? ` ${o.unit}` : ""}${o.value !== o.default ? ` (default ${formatNumber(o.default)})` : ""}`;
    case "error":
      return `error: ${clip(o.message, 60)}`;
    case "not-run":
      return `not run: ${o.reason}`;
  }
}

/** The digests of a cell's outputs on one line, at most `max` characters. */
export function outputsDigest(outputs: readonly CellOutput[], max = 100): string {
  if (outputs.length === 0) return "";
  return clip(outputs.map(outputDigest).join("; "), max);
}

type TableOutput = Extract<CellOutput, { type: "table" }>;

function cellText(v: number | string | null): string {
  return typeof v === "number" ? formatNumber(v) : v === null ? "" : v;
}

/**
 * The headline of a table of estimates (a fit, a step or slug test, a recovery line: columns "estimate", "95 %
 * low", "95 % high", "unit"): its full title, then one line per row, "T (transmissivity) = 250.3 m2/d (95 %:
 * 240.1 to 261)". Empty for any other output.
 */
export function headlineLines(o: CellOutput, indent = "      "): string[] {
  if (o.type !== "table") return [];
  const at = (name: string) => o.columns.findIndex((c) => c.name === name);
  const [estimate, low, high, unit] = [at("estimate"), at("95 % low"), at("95 % high"), at("unit")];
  if (estimate < 0 || low < 0 || high < 0) return [];
  const lines = o.title ? [`${indent.slice(2)}${o.title}`] : [];
  for (const row of o.rows) {
    const value = row[estimate];
    if (typeof value !== "number") continue;
    const u = unit >= 0 && typeof row[unit] === "string" && row[unit] !== "" && row[unit] !== "1" ? ` ${row[unit]}` : "";
    const interval = typeof row[low] === "number" && typeof row[high] === "number" ? ` (95 %: ${formatNumber(row[low] as number)} to ${formatNumber(row[high] as number)})` : "";
    lines.push(`${indent}${cellText(row[0] ?? "")} = ${formatNumber(value)}${u}${interval}`);
  }
  return lines;
}

/** A table laid out in columns for a terminal: title, header with units, rows; numbers as formatNumber gives them. */
export function tableLines(o: TableOutput, indent = "    "): string[] {
  const header = o.columns.map((c) => (c.unit ? `${c.name} (${c.unit})` : c.name));
  const body = o.rows.map((r) => o.columns.map((_, i) => cellText(r[i] ?? null)));
  const widths = header.map((h, i) => Math.max(h.length, ...body.map((r) => r[i]!.length)));
  const line = (cells: string[]) => `${indent}${cells.map((c, i) => c.padEnd(widths[i]!)).join("  ")}`.trimEnd();
  return [...(o.title ? [`${indent}${o.title}`] : []), line(header), ...body.map(line)];
}
