/**
 * Thinning large inline datasets of a chart for drawing only: the chart output in the document keeps every
 * row (computations never see thinned data). A dataset of n rows above `limit` is cut into blocks of
 * ceil(n / (limit / (2 f))) consecutive rows, f its numeric fields, and each block keeps, in order, the rows
 * holding the smallest and largest value of every numeric field; so peaks, troughs and the envelope of a noisy
 * record stay visible at any zoom a screen can show (common practice for plotting long series, no source).
 */

/**
 * Rows above which a dataset is thinned for drawing: a chart of 480 to 640 px shows at most a few points per
 * pixel column, and each block keeps its extremes, so 2000 rows lose nothing a screen can show.
 */
export const THIN_LIMIT = 2000;

/** What thinning did to one dataset. */
export interface ThinNote {
  name: string;
  rows: number;
  drawn: number;
}

type Row = Record<string, unknown>;

/** The rows to draw of `rows` (at most about `limit`), in their original order. */
export function thinRows(rows: readonly Row[], limit = THIN_LIMIT): readonly Row[] {
  if (rows.length <= limit) return rows;
  const first = rows[0] ?? {};
  const fields = Object.keys(first).filter((k) => typeof first[k] === "number");
  if (fields.length === 0) {
    const step = Math.ceil(rows.length / limit);
    return rows.filter((_, i) => i % step === 0);
  }
  const blocks = Math.max(1, Math.floor(limit / (2 * fields.length)));
  const size = Math.ceil(rows.length / blocks);
  const keep: Row[] = [];
  for (let start = 0; start < rows.length; start += size) {
    const end = Math.min(rows.length, start + size);
    const picked = new Set<number>();
    for (const f of fields) {
      let lo = -1;
      let hi = -1;
      for (let i = start; i < end; i++) {
        const v = rows[i]![f];
        if (typeof v !== "number" || !Number.isFinite(v)) continue;
        if (lo < 0 || v < (rows[lo]![f] as number)) lo = i;
        if (hi < 0 || v > (rows[hi]![f] as number)) hi = i;
      }
      if (lo >= 0) picked.add(lo);
      if (hi >= 0) picked.add(hi);
    }
    if (picked.size === 0) picked.add(start);
    for (const i of [...picked].sort((a, b) => a - b)) keep.push(rows[i]!);
  }
  return keep;
}

/**
 * A copy of a Vega-Lite spec whose inline `data.values` arrays (top level, and in layers, facets and
 * concatenations) are thinned, and a note per thinned dataset. The input is not changed.
 */
export function thinSpec(spec: Record<string, unknown>, limit = THIN_LIMIT): { spec: Record<string, unknown>; notes: ThinNote[] } {
  const notes: ThinNote[] = [];
  const visit = (node: unknown): unknown => {
    if (Array.isArray(node)) return node.map(visit);
    if (node === null || typeof node !== "object") return node;
    const obj = node as Record<string, unknown>;
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(obj)) {
      if (k === "data" && v !== null && typeof v === "object" && Array.isArray((v as Row).values)) {
        const data = v as Row;
        const values = data.values as Row[];
        const drawn = thinRows(values, limit);
        if (drawn !== values) notes.push({ name: typeof data.name === "string" ? data.name : "data", rows: values.length, drawn: drawn.length });
        out[k] = { ...data, values: drawn };
      } else if (k === "layer" || k === "spec" || k === "concat" || k === "hconcat" || k === "vconcat") out[k] = visit(v);
      else out[k] = v;
    }
    return out;
  };
  return { spec: visit(spec) as Record<string, unknown>, notes };
}
