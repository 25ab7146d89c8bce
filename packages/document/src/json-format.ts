/**
 * JSON laid out for diffs: a value that fits on one line within `width` characters stays on one line;
 * otherwise each element or property goes on its own line. So a recorded table is one line per row.
 * The text is always valid JSON (RFC 8259) and parses back to the same value; non-finite numbers become null,
 * as with JSON.stringify.
 */
export function formatJson(value: unknown, width = 100, indent = ""): string {
  const flat = JSON.stringify(value);
  if (flat === undefined) return "null";
  if (indent.length + flat.length <= width || value === null || typeof value !== "object") return flat;
  const inner = indent + "  ";
  if (Array.isArray(value)) {
    if (value.length === 0) return "[]";
    return `[\n${value.map((v) => inner + formatJson(v === undefined ? null : v, width, inner)).join(",\n")}\n${indent}]`;
  }
  const entries = Object.entries(value as Record<string, unknown>).filter(([, v]) => v !== undefined && typeof v !== "function");
  if (entries.length === 0) return "{}";
  return `{\n${entries.map(([k, v]) => `${inner}${JSON.stringify(k)}: ${formatJson(v, width, inner)}`).join(",\n")}\n${indent}}`;
}
