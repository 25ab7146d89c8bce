/**
 * Numbers for reading, as the terminal summary and the exported report write them: 6 significant digits,
 * trailing zeros dropped, exponent form below 1e-4 and from 1e6 in magnitude (same rule as the CLI's format.ts).
 */
export function formatNumber(v: number | null): string {
  if (v === null) return "";
  if (!Number.isFinite(v)) return String(v);
  if (v === 0) return "0";
  const a = Math.abs(v);
  if (a < 1e-4 || a >= 1e6) return v.toExponential(5).replace(/\.?0+e/, "e");
  return String(Number(v.toPrecision(6)));
}

/** A duration in ms for a status line: "12 ms", "1.4 s". */
export function formatMs(ms: number): string {
  return ms < 1000 ? `${Math.round(ms)} ms` : `${(ms / 1000).toFixed(ms < 10_000 ? 1 : 0)} s`;
}
