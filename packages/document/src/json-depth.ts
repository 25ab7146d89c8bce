/**
 * A guard on values read from a document's JSON and YAML (recorded outputs, chart specifications): JSON.parse
 * reads any nesting, but everything after it (shape checks, fingerprints, schema checks, the report) walks values
 * recursively, and 100,000 nested arrays overflow the stack. A document nests a few levels; the guard allows
 * MAX_JSON_DEPTH.
 */

/** The deepest nesting of arrays and objects accepted in a document's JSON and YAML values. */
export const MAX_JSON_DEPTH = 256;

/** True when the value nests arrays and objects deeper than `max` (a scalar has depth 0). Iterative. */
export function nestedTooDeep(value: unknown, max = MAX_JSON_DEPTH): boolean {
  const stack: [unknown, number][] = [[value, 0]];
  while (stack.length > 0) {
    const [v, depth] = stack.pop()!;
    if (typeof v !== "object" || v === null) continue;
    if (depth + 1 > max) return true;
    for (const item of Array.isArray(v) ? v : Object.values(v as object)) if (typeof item === "object" && item !== null) stack.push([item, depth + 1]);
  }
  return false;
}
