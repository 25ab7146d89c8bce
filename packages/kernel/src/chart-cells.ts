/**
 * Chart cells: a Vega-Lite spec whose `data: { name: "x" }` entries are filled with the guest value named x,
 * written inline as `data: { name: "x", values: [...] }`. The value may be an array of records, a data-cell
 * table (`{ rows }`), a series (`{ times, drawdowns }`, as records `{ t, s }`) or an object of equal-length
 * columns (as one record per index).
 */
import { DisplayError, toJsonData } from "./displays.js";

function isRecord(v: unknown): v is Record<string, unknown> {
  return v !== null && typeof v === "object" && !Array.isArray(v) && !(v instanceof Float64Array);
}
function isColumn(v: unknown): v is ArrayLike<unknown> {
  return Array.isArray(v) || v instanceof Float64Array;
}

/** The data names a spec asks for, in order of first appearance (layers and concatenations included). */
export function chartDataNames(spec: unknown): string[] {
  const names: string[] = [];
  const visit = (node: unknown): void => {
    if (Array.isArray(node)) node.forEach(visit);
    else if (isRecord(node)) {
      const data = node.data;
      if (isRecord(data) && typeof data.name === "string" && data.values === undefined && !names.includes(data.name)) names.push(data.name);
      for (const [k, v] of Object.entries(node)) if (k !== "data") visit(v);
    }
  };
  visit(spec);
  return names;
}

/** Records for a chart from a guest value (see the module comment for the shapes accepted). */
export function chartRecords(name: string, value: unknown): unknown[] {
  if (Array.isArray(value)) return toJsonData(value) as unknown[];
  if (isRecord(value) && Array.isArray(value.rows)) return toJsonData(value.rows) as unknown[];
  if (isRecord(value) && isColumn(value.times) && isColumn(value.drawdowns)) {
    const t = value.times;
    const s = value.drawdowns;
    return Array.from({ length: Math.min(t.length, s.length) }, (_, i) => toJsonData({ t: t[i], s: s[i] }));
  }
  if (isRecord(value) && Object.keys(value).length > 0 && Object.values(value).every(isColumn)) {
    const keys = Object.keys(value);
    const n = Math.min(...keys.map((k) => (value[k] as ArrayLike<unknown>).length));
    return Array.from({ length: n }, (_, i) => toJsonData(Object.fromEntries(keys.map((k) => [k, (value[k] as ArrayLike<unknown>)[i]]))));
  }
  throw new DisplayError(
    `chart data "${name}" is not chartable; give an array of records, a data table, a series with times and drawdowns, or an object of columns`,
  );
}

/** A copy of the spec with every named data entry given its values from `values`. */
export function fillChartData(spec: Record<string, unknown>, values: Map<string, unknown[]>): Record<string, unknown> {
  const visit = (node: unknown): unknown => {
    if (Array.isArray(node)) return node.map(visit);
    if (!isRecord(node)) return node;
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(node)) {
      if (k === "data" && isRecord(v) && typeof v.name === "string" && v.values === undefined && values.has(v.name)) {
        out[k] = { ...v, values: values.get(v.name) };
      } else out[k] = visit(v);
    }
    return out;
  };
  return visit(spec) as Record<string, unknown>;
}
