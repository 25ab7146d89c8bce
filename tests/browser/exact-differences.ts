/**
 * Where two plain-data values differ, with numbers compared bit for bit (Object.is: 0 and -0 differ, NaN equals
 * NaN). Used to compare a run in the browser with the same run in Node.
 */

/** One place where the values differ; for two finite numbers also their relative difference. */
export interface ExactDifference {
  /** Path from the root, e.g. `outputs["fit-theis"][0].rows[1][2]`. */
  path: string;
  expected: unknown;
  actual: unknown;
  /** |actual - expected| / max(|expected|, |actual|) when both are finite numbers (0 for 0 and -0). */
  relative?: number;
}

function kindOf(v: unknown): string {
  if (v === null) return "null";
  if (Array.isArray(v)) return "array";
  if (ArrayBuffer.isView(v)) return Object.prototype.toString.call(v);
  return typeof v;
}

function key(k: string): string {
  return /^[A-Za-z_$][\w$]*$/.test(k) ? `.${k}` : `[${JSON.stringify(k)}]`;
}

/** Every place where `actual` differs from `expected` (arrays, typed arrays, plain objects, primitives). */
export function exactDifferences(expected: unknown, actual: unknown, path = ""): ExactDifference[] {
  if (typeof expected === "number" && typeof actual === "number") {
    if (Object.is(expected, actual)) return [];
    const diff: ExactDifference = { path, expected, actual };
    if (Number.isFinite(expected) && Number.isFinite(actual)) {
      const scale = Math.max(Math.abs(expected), Math.abs(actual));
      diff.relative = scale === 0 ? 0 : Math.abs(actual - expected) / scale;
    }
    return [diff];
  }
  const kind = kindOf(expected);
  if (kind !== kindOf(actual)) return [{ path, expected, actual }];
  if (kind === "array" || ArrayBuffer.isView(expected)) {
    const a = expected as ArrayLike<unknown>;
    const b = actual as ArrayLike<unknown>;
    if (a.length !== b.length) return [{ path: `${path}.length`, expected: a.length, actual: b.length }];
    return Array.from({ length: a.length }, (_, i) => exactDifferences(a[i], b[i], `${path}[${i}]`)).flat();
  }
  if (kind === "object") {
    const a = expected as Record<string, unknown>;
    const b = actual as Record<string, unknown>;
    const keys = [...new Set([...Object.keys(a), ...Object.keys(b)])];
    return keys.flatMap((k) =>
      Object.hasOwn(a, k) && Object.hasOwn(b, k)
        ? exactDifferences(a[k], b[k], `${path}${key(k)}`)
        : [{ path: `${path}${key(k)}`, expected: a[k], actual: b[k] }],
    );
  }
  return Object.is(expected, actual) ? [] : [{ path, expected, actual }];
}
