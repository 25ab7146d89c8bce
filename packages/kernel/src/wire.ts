/**
 * The wire format every value uses to cross between host and sandbox: JSON text plus a list of ArrayBuffers.
 *
 * Only this text and these byte buffers cross the boundary, so no host object, function or prototype can ever
 * reach a cell, and nothing of the guest reaches the host except data the host then validates.
 *
 * The text is `[value, patches]` or `[value, patches, recordTables]`. `value` is plain JSON in which every value JSON cannot carry is a `null`
 * placeholder; `patches` is a flat list `path1, code1, path2, code2, ...` saying what each placeholder stands for.
 * A path is the list of keys (strings) and array indices (numbers) from the value to the placeholder (`[]` is the
 * value itself); a code is
 * - a number i: a Float64Array whose bytes are buffers[i] (the fast path: a copy of bytes, about 1 ms for 1e6
 *   doubles, where JSON would take hundreds of milliseconds);
 * - "NaN", "Infinity", "-Infinity" or "-0": the number JSON cannot write;
 * - "undefined": undefined (so an omitted optional argument keeps its position);
 * - "text:i" (guest to host only): the CSV text of the sandbox's data table i, which the guest read from the host
 *   and now passes back; the host substitutes its own copy, so a large record crosses once, not three times.
 * - { r: j }: an array of records kept in column form, entry j of the text's third element (below).
 *
 * A long array of records that all have the same keys in the same order, each value a number or a string (the
 * `excluded` list of an import: thousands of { row, time, value, reason }), is written as a record table
 * `{ n, keys, columns }`, one column per key: `{ f: i }` numbers as the bytes of buffers[i], or `{ s: strings,
 * runs: i }` strings as runs (buffers[i] holds index into `strings`, run length, index, run length, ...). So the
 * text of the excluded readings is "rows 1 to 10,000: before pumping started" once, not 10,000 times. The guest
 * makes such an array only when a cell first reads it, and passes an unread one back in the same form.
 * Both sides read the text with a plain `JSON.parse` (no reviver, which in QuickJS costs a function call per
 * value) and then apply the few patches, so the cost of a crossing is the native JSON cost plus the bytes.
 * User data cannot forge a patch: patches live outside the value, and the decoder accepts only a patch that
 * replaces a `null` placeholder that exists in the value, with each buffer used once.
 * The guest side of the same format is in guest-prelude.ts.
 */

/** A value in wire form. */
export interface WireValue {
  json: string;
  buffers: ArrayBuffer[];
}

/** Thrown when a host value cannot be written in wire form (a bug in the host code calling it). */
export class WireEncodeError extends Error {
  override readonly name = "WireEncodeError";
}

type PathKey = string | number;

/** Left out of an object (and written as null in an array), as JSON.stringify does with functions and symbols. */
const OMIT = Symbol("omit");

/** True for numbers JSON writes as they are: finite and not -0. */
function isPlainNumber(v: number): boolean {
  return v - v === 0 && (v !== 0 || 1 / v > 0);
}

/** True for values copied as they are: strings, booleans, null and plain numbers. */
function isPlainLeaf(v: unknown): boolean {
  const t = typeof v;
  return t === "number" ? isPlainNumber(v as number) : t === "string" || t === "boolean" || v === null;
}

/** Options of encodeHostValue. */
export interface EncodeOptions {
  /**
   * Put a Float64Array's own ArrayBuffer in `buffers` (no copy) when the array spans all of it. Only for a caller
   * that copies the bytes before anything can change them, as the sandbox does when it moves them into QuickJS.
   */
  shareBuffers?: boolean;
}

/** Fewest records an array must hold to be written as a record table (below it the JSON form is as cheap). */
export const RECORD_TABLE_MIN_LENGTH = 64;

/** A record table in the wire text: see the module comment. */
export interface WireRecordTable {
  n: number;
  keys: string[];
  columns: ({ f: number } | { s: string[]; runs: number })[];
}

/** The keys of `array`'s records when it can be a record table (see the module comment), else undefined. */
function recordTableKeys(array: readonly unknown[]): string[] | undefined {
  if (array.length < RECORD_TABLE_MIN_LENGTH) return undefined;
  const first = array[0];
  if (first === null || typeof first !== "object" || Object.getPrototypeOf(first) !== Object.prototype) return undefined;
  const keys = Object.keys(first);
  if (keys.length === 0 || keys.includes("__proto__")) return undefined;
  const kinds = keys.map((k) => typeof (first as Record<string, unknown>)[k]);
  if (kinds.some((t) => t !== "number" && t !== "string")) return undefined;
  for (const e of array) {
    if (e === null || typeof e !== "object" || Object.getPrototypeOf(e) !== Object.prototype) return undefined;
    const record = e as Record<string, unknown>;
    let count = 0;
    for (const k in record) {
      if (k !== keys[count] || typeof record[k] !== kinds[count]) return undefined;
      count++;
    }
    if (count !== keys.length) return undefined;
  }
  return keys;
}

class HostEncoder {
  readonly buffers: ArrayBuffer[] = [];
  readonly patches: unknown[] = [];
  readonly recordTables: WireRecordTable[] = [];
  private readonly path: PathKey[] = [];
  private readonly containers: object[] = [];
  constructor(private readonly share: boolean) {}

  private patch(depth: number, code: string | number | { r: number }): null {
    this.patches.push(this.path.slice(0, depth), code);
    return null;
  }

  private buffer(v: Float64Array, depth: number): null {
    const whole = this.share && v.byteOffset === 0 && v.byteLength === v.buffer.byteLength && v.buffer instanceof ArrayBuffer;
    this.buffers.push(whole ? (v.buffer as ArrayBuffer) : (v.buffer.slice(v.byteOffset, v.byteOffset + v.byteLength) as ArrayBuffer));
    return this.patch(depth, this.buffers.length - 1);
  }

  /** Writes records (checked by recordTableKeys) as a record table and returns the placeholder. */
  private recordTable(records: readonly Record<string, number | string>[], keys: string[], depth: number): null {
    const n = records.length;
    const columns = keys.map((k): WireRecordTable["columns"][number] => {
      if (typeof records[0]![k] === "number") {
        const values = new Float64Array(n);
        for (let i = 0; i < n; i++) values[i] = records[i]![k] as number;
        this.buffers.push(values.buffer);
        return { f: this.buffers.length - 1 };
      }
      const strings: string[] = [];
      const index = new Map<string, number>();
      const runs: number[] = [];
      for (let i = 0; i < n; i++) {
        const text = records[i]![k] as string;
        let at = index.get(text);
        if (at === undefined) {
          at = strings.push(text) - 1;
          index.set(text, at);
        }
        if (runs.length > 0 && runs[runs.length - 2] === at) runs[runs.length - 1]!++;
        else runs.push(at, 1);
      }
      this.buffers.push(Float64Array.from(runs).buffer);
      return { s: strings, runs: this.buffers.length - 1 };
    });
    this.recordTables.push({ n, keys, columns });
    return this.patch(depth, { r: this.recordTables.length - 1 });
  }

  /** The JSON-ready copy of v, which sits at path[0 .. depth - 1] under `key`. */
  walk(value: unknown, key: string, depth: number): unknown {
    let v = value;
    if ((typeof v === "object" && v !== null) || typeof v === "bigint") {
      const toJSON = (v as { toJSON?: unknown }).toJSON;
      if (typeof toJSON === "function") v = toJSON.call(v, key) as unknown;
    }
    switch (typeof v) {
      case "number":
        return isPlainNumber(v) ? v : this.patch(depth, Object.is(v, -0) ? "-0" : String(v));
      case "string":
      case "boolean":
        return v;
      case "undefined":
        return this.patch(depth, "undefined");
      case "bigint":
        return this.walk(Number(v), key, depth);
      case "function":
      case "symbol":
        return OMIT;
    }
    if (v === null) return null;
    if (v instanceof Float64Array) return this.buffer(v, depth);
    if (ArrayBuffer.isView(v) && !(v instanceof DataView)) return this.buffer(Float64Array.from(v as unknown as ArrayLike<number>), depth);
    const object = v as object;
    if (Array.isArray(object)) {
      const keys = recordTableKeys(object);
      if (keys !== undefined) return this.recordTable(object as Record<string, number | string>[], keys, depth);
    }
    for (let j = 0; j < depth; j++) {
      if (this.containers[j] === object) throw new WireEncodeError("cannot encode a circular structure for the sandbox");
    }
    this.containers[depth] = object;
    const path = this.path;
    let out: unknown;
    if (Array.isArray(object)) {
      const list: unknown[] = new Array(object.length);
      for (let i = 0; i < object.length; i++) {
        const e: unknown = object[i];
        if (isPlainLeaf(e)) list[i] = e;
        else {
          path[depth] = i;
          const w = this.walk(e, String(i), depth + 1);
          list[i] = w === OMIT ? null : w;
        }
      }
      out = list;
    } else {
      const record: Record<string, unknown> = {};
      for (const k of Object.keys(object)) {
        const e = (object as Record<string, unknown>)[k];
        let w: unknown = e;
        if (!isPlainLeaf(e)) {
          path[depth] = k;
          w = this.walk(e, k, depth + 1);
          if (w === OMIT) continue;
        }
        if (k === "__proto__") Object.defineProperty(record, k, { value: w, writable: true, enumerable: true, configurable: true });
        else record[k] = w;
      }
      out = record;
    }
    this.containers.length = depth;
    return out;
  }
}

/**
 * Encodes a host value. Plain objects, arrays, numbers (including NaN, ±Infinity, -0), strings, booleans, null,
 * undefined and Float64Array are kept; functions and symbols in object properties are left out (a result's
 * methods never cross) and become null in arrays; other typed arrays are converted to Float64Array; bigints
 * become numbers; `toJSON` is honoured once per value (a Date becomes its ISO text); class instances are
 * written as their own enumerable properties, like JSON does. A circular structure is a WireEncodeError.
 * Cost: one walk over the value plus a native JSON.stringify; Float64Array bytes are copied once (not at all
 * with `shareBuffers`).
 */
export function encodeHostValue(value: unknown, options: EncodeOptions = {}): WireValue {
  const encoder = new HostEncoder(options.shareBuffers === true);
  const plain = encoder.walk(value, "", 0);
  if (plain === OMIT) throw new WireEncodeError(`cannot encode a ${typeof value} for the sandbox`);
  const parts = encoder.recordTables.length > 0 ? [plain, encoder.patches, encoder.recordTables] : [plain, encoder.patches];
  return { json: JSON.stringify(parts), buffers: encoder.buffers };
}

/** Thrown when wire text from the guest does not follow the format; the message says what was found. */
export class WireDecodeError extends Error {
  override readonly name = "WireDecodeError";
}

/** The texts a "text:i" patch may name (the sandbox's data-table texts), by index. */
export type WireTexts = (index: number) => string | undefined;

function patchValue(code: unknown, wire: WireValue, used: Uint8Array, texts: WireTexts | undefined): unknown {
  if (typeof code === "number") {
    const buffer = Number.isInteger(code) && code >= 0 ? wire.buffers[code] : undefined;
    if (buffer === undefined || buffer.byteLength % 8 !== 0) throw new WireDecodeError(`Float64Array patch ${String(code)} has no buffer`);
    if (used[code]) throw new WireDecodeError(`buffer ${code} is used by more than one Float64Array`);
    used[code] = 1;
    return new Float64Array(buffer);
  }
  switch (code) {
    case "NaN":
      return NaN;
    case "Infinity":
      return Infinity;
    case "-Infinity":
      return -Infinity;
    case "-0":
      return -0;
    case "undefined":
      return undefined;
  }
  if (typeof code === "string" && code.startsWith("text:") && texts !== undefined) {
    const index = Number(code.slice(5));
    const text = Number.isInteger(index) && index >= 0 ? texts(index) : undefined;
    if (text === undefined) throw new WireDecodeError(`text reference ${JSON.stringify(code)} names no data table`);
    return text;
  }
  throw new WireDecodeError(`patch code ${JSON.stringify(code)} is not a buffer index, NaN, Infinity, -Infinity, -0 or undefined`);
}

/** The records of record table `code` ({ r: j }), checked against the format; each buffer used once. */
function recordsOf(code: { r?: unknown }, tables: unknown[], wire: WireValue, used: Uint8Array): Record<string, number | string>[] {
  const j = code.r;
  const table = typeof j === "number" && Number.isInteger(j) && j >= 0 ? (tables[j] as Partial<WireRecordTable> | undefined) : undefined;
  const bad = (what: string) => new WireDecodeError(`record table ${JSON.stringify(j)}: ${what}`);
  if (table === null || typeof table !== "object") throw bad("is missing");
  const { n, keys, columns } = table;
  if (typeof n !== "number" || !Number.isInteger(n) || n < 0) throw bad("has no record count");
  if (!Array.isArray(keys) || !Array.isArray(columns) || keys.length !== columns.length || keys.some((k) => typeof k !== "string" || k === "__proto__")) {
    throw bad("needs one column per key");
  }
  const buffer = (i: unknown): Float64Array => {
    const b = typeof i === "number" && Number.isInteger(i) && i >= 0 ? wire.buffers[i] : undefined;
    if (b === undefined || b.byteLength % 8 !== 0) throw bad(`names no buffer ${String(i)}`);
    if (used[i as number]) throw bad(`buffer ${String(i)} is used twice`);
    used[i as number] = 1;
    return new Float64Array(b);
  };
  const values = columns.map((c: unknown): ArrayLike<number | string> => {
    if (c === null || typeof c !== "object") throw bad("has a column that is not an object");
    const column = c as { f?: unknown; s?: unknown; runs?: unknown };
    if (column.f !== undefined) {
      const f = buffer(column.f);
      if (f.length !== n) throw bad(`has a column of ${f.length} numbers for ${n} records`);
      return f;
    }
    const strings = column.s;
    if (!Array.isArray(strings) || strings.some((x) => typeof x !== "string")) throw bad("has a column without its strings");
    const runs = buffer(column.runs);
    const out: string[] = [];
    for (let r = 0; r + 1 < runs.length; r += 2) {
      const text = strings[runs[r]!] as string | undefined;
      const count = runs[r + 1]!;
      if (text === undefined || !Number.isInteger(count) || count < 1 || out.length + count > n) throw bad("has a run that does not fit");
      for (let k = 0; k < count; k++) out.push(text);
    }
    if (out.length !== n) throw bad(`has runs of ${out.length} strings for ${n} records`);
    return out;
  });
  const records: Record<string, number | string>[] = new Array(n);
  for (let i = 0; i < n; i++) {
    const record: Record<string, number | string> = {};
    for (let k = 0; k < keys.length; k++) record[keys[k] as string] = values[k]![i]!;
    records[i] = record;
  }
  return records;
}

/** Whether `node[key]` is an own property of a JSON array or object (never a Float64Array a patch put there). */
function hasSlot(node: unknown, key: unknown): node is Record<PathKey, unknown> {
  if (node === null || typeof node !== "object" || node instanceof Float64Array) return false;
  if (Array.isArray(node)) return typeof key === "number" && Number.isInteger(key) && key >= 0 && key < node.length;
  return typeof key === "string" && Object.hasOwn(node, key);
}

/**
 * Decodes wire text (usually written by the guest) into host data: objects are ordinary `{}` records, arrays are
 * arrays, Float64Array patches become Float64Array views of the given buffers (one buffer each). Text that is
 * not `[value, patches]`, or a patch that does not replace a null placeholder of the value, is a WireDecodeError.
 * `texts` resolves "text:i" references; without it they are refused.
 */
export function decodeWireValue(wire: WireValue, texts?: WireTexts): unknown {
  let parsed: unknown;
  try {
    parsed = JSON.parse(wire.json);
  } catch (e) {
    throw new WireDecodeError(`wire text is not JSON: ${e instanceof Error ? e.message : String(e)}`);
  }
  if (!Array.isArray(parsed) || (parsed.length !== 2 && parsed.length !== 3) || !Array.isArray(parsed[1]) || parsed[1].length % 2 !== 0) {
    throw new WireDecodeError("wire text is not [value, patches] with patches as path, code pairs");
  }
  const tables = parsed.length === 3 ? (parsed[2] as unknown) : [];
  if (!Array.isArray(tables)) throw new WireDecodeError("the record tables of the wire text are not a list");
  let root: unknown = parsed[0];
  const patches = parsed[1] as unknown[];
  const used = new Uint8Array(wire.buffers.length);
  for (let i = 0; i < patches.length; i += 2) {
    const path = patches[i];
    if (!Array.isArray(path)) throw new WireDecodeError(`patch ${i / 2} has no path`);
    const code = patches[i + 1];
    const value = code !== null && typeof code === "object" ? recordsOf(code as { r?: unknown }, tables, wire, used) : patchValue(code, wire, used, texts);
    if (path.length === 0) {
      if (root !== null) throw new WireDecodeError("a patch of the whole value needs a null placeholder");
      root = value;
      continue;
    }
    let node: unknown = root;
    for (let k = 0; k < path.length - 1; k++) {
      if (!hasSlot(node, path[k])) throw new WireDecodeError(`patch path ${JSON.stringify(path)} leaves the value`);
      node = node[path[k] as PathKey];
    }
    const last = path[path.length - 1] as unknown;
    if (!hasSlot(node, last) || node[last as PathKey] !== null) {
      throw new WireDecodeError(`patch path ${JSON.stringify(path)} does not name a null placeholder`);
    }
    node[last as PathKey] = value;
  }
  return root;
}
