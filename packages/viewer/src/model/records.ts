/**
 * Finding the observation records of a document, DOM-free: the globals its code cells declare at the top level
 * (`const records = ...`) are looked at by one extra cell appended to the document for a run in the worker (never
 * saved), which reports every value shaped like the result of `aq.toBaseUnits` (name, t and s of equal length,
 * numeric r and Q), or an array of them, with the expression a cell uses for it (`records[0]`). The page then
 * matches curves to those numbers with the aquifer library directly.
 */
import type { CellOutput, ConebookDocument } from "@conebook/document";
import type { ObservationRecord } from "./match.js";

/** Id of the cell the probe appends (not a cell of the document). */
export const PROBE_CELL_ID = "workbench-record-probe";

const TOP_LEVEL = /^(?:const|let|var)\s+([A-Za-z_$][\w$]*)\s*=/gm;

/** The top-level names each code cell declares, in document order, with the cell that declares each first. */
export function declaredNames(doc: ConebookDocument): { name: string; cellId: string }[] {
  const seen = new Set<string>();
  const out: { name: string; cellId: string }[] = [];
  for (const cell of doc.cells) {
    if (cell.kind !== "code") continue;
    for (const m of cell.source.matchAll(TOP_LEVEL)) {
      const name = m[1]!;
      if (seen.has(name) || name.startsWith("__")) continue;
      seen.add(name);
      out.push({ name, cellId: cell.id });
    }
  }
  return out;
}

/** The source of the probe cell for `doc`. */
export function probeSource(doc: ConebookDocument): string {
  const names = declaredNames(doc).map((d) => d.name);
  return [
    "const __found = [];",
    "const __one = (x, expr) => {",
    "  if (x === null || typeof x !== \"object\" || typeof x.name !== \"string\" || typeof x.r !== \"number\" || typeof x.Q !== \"number\") return;",
    "  if (!x.t || !x.s || typeof x.t.length !== \"number\" || x.t.length !== x.s.length || x.t.length < 3) return;",
    "  __found.push({ expr, name: x.name, r: x.r, Q: x.Q, t: Array.from(x.t), s: Array.from(x.s) });",
    "};",
    `for (const [name, get] of [${names.map((n) => `[${JSON.stringify(n)}, () => ${n}]`).join(", ")}]) {`,
    "  let v;",
    "  try { v = get(); } catch { continue; }",
    "  if (Array.isArray(v)) v.forEach((x, i) => __one(x, `${name}[${i}]`));",
    "  else __one(v, name);",
    "}",
    "show.json(__found);",
  ].join("\n");
}

/** The document with the probe cell appended (for one run in the worker; never saved). */
export function withProbe(doc: ConebookDocument): ConebookDocument {
  return { ...doc, cells: [...doc.cells, { kind: "code", language: "ts", id: PROBE_CELL_ID, source: probeSource(doc), sourceStart: { line: 1, column: 1 }, outputs: [] }] };
}

/** The records the probe found, from its outputs; a record whose numbers are not all finite is left out. */
export function readProbe(doc: ConebookDocument, outputs: readonly CellOutput[] | undefined): ObservationRecord[] {
  const json = outputs?.find((o) => o.type === "json");
  if (!json || json.type !== "json" || !Array.isArray(json.value)) return [];
  const cellOf = new Map(declaredNames(doc).map((d) => [d.name, d.cellId]));
  const out: ObservationRecord[] = [];
  for (const raw of json.value as { expr: string; name: string; r: number; Q: number; t: (number | null)[]; s: (number | null)[] }[]) {
    const t = Float64Array.from(raw.t, (v) => (v === null ? Number.NaN : v));
    const s = Float64Array.from(raw.s, (v) => (v === null ? Number.NaN : v));
    if (![...t, ...s, raw.r, raw.Q].every(Number.isFinite)) continue;
    const base = raw.expr.replace(/\[.*$/, "");
    out.push({ name: raw.name, expression: raw.expr, cellId: cellOf.get(base) ?? "", r: raw.r, Q: raw.Q, t, s });
  }
  return out;
}
