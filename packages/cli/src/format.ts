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
      return `table${o.title ? ` "${clip(o.title, 30)}"` : ""} ${o.rows.length}×${o.columns.length}`;
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
