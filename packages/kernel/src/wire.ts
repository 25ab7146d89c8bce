/**
 * The wire format every value uses to cross between host and sandbox: JSON text plus a list of ArrayBuffers.
 *
 * Only this text and these byte buffers cross the boundary, so no host object, function or prototype can ever
 * reach a cell, and nothing of the guest reaches the host except data the host then validates.
 *
 * JSON cannot carry everything plain numeric data needs, so four tagged one-key objects stand in for it:
 * - `{"\u0000f64": i}`: a Float64Array whose bytes are buffers[i] (the fast path: about 1 ms for 1e6 doubles,
 *   where JSON would take hundreds of milliseconds);
 * - `{"\u0000num": "NaN" | "Infinity" | "-Infinity" | "-0"}`: numbers JSON cannot write;
 * - `{"\u0000undef": 0}`: undefined (so an omitted optional argument keeps its position).
 * Object keys beginning with "\u0000" are refused, so a tag can never be forged by user data.
 * The guest side of the same format is in guest-prelude.ts.
 */

/** The tag prefix; no key of user data may start with it. */
export const TAG = "\u0000";
const F64 = `${TAG}f64`;
const NUM = `${TAG}num`;
const UNDEF = `${TAG}undef`;

/** A value in wire form. */
export interface WireValue {
  json: string;
  buffers: ArrayBuffer[];
}

/** Thrown when a host value cannot be written in wire form (a bug in the host code calling it). */
export class WireEncodeError extends Error {
  override readonly name = "WireEncodeError";
}

/**
 * Encodes a host value. Plain objects, arrays, numbers (including NaN, ±Infinity, -0), strings, booleans, null,
 * undefined and Float64Array are kept; functions and symbols in object properties are left out (a result's
 * methods never cross); other typed arrays are converted to Float64Array; class instances are written as
 * their own enumerable properties, like JSON does.
 */
export function encodeHostValue(value: unknown): WireValue {
  const buffers: ArrayBuffer[] = [];
  const json = JSON.stringify(value, function (this: unknown, _key: string, v: unknown): unknown {
    if (typeof v === "number") {
      if (Number.isFinite(v)) return Object.is(v, -0) ? { [NUM]: "-0" } : v;
      return { [NUM]: String(v) };
    }
    if (v === undefined) return { [UNDEF]: 0 };
    if (typeof v === "function" || typeof v === "symbol") return undefined;
    if (typeof v === "bigint") return Number(v);
    if (v instanceof Float64Array) {
      buffers.push(v.buffer.slice(v.byteOffset, v.byteOffset + v.byteLength) as ArrayBuffer);
      return { [F64]: buffers.length - 1 };
    }
    if (ArrayBuffer.isView(v) && !(v instanceof DataView)) {
      const copy = Float64Array.from(v as unknown as ArrayLike<number>);
      buffers.push(copy.buffer);
      return { [F64]: buffers.length - 1 };
    }
    return v;
  });
  if (json === undefined) throw new WireEncodeError(`cannot encode a ${typeof value} for the sandbox`);
  return { json, buffers };
}

/** Thrown when wire text from the guest does not follow the format; the message says what was found. */
export class WireDecodeError extends Error {
  override readonly name = "WireDecodeError";
}

/**
 * Decodes wire text (usually written by the guest) into host data: plain objects with a null prototype are not
 * used, objects are ordinary `{}` records, arrays are arrays, Float64Array tags become Float64Array views of
 * copies of the buffers. A tag naming a missing buffer, or an unknown tag, is a WireDecodeError.
 */
export function decodeWireValue(wire: WireValue): unknown {
  return JSON.parse(wire.json, (_key, v: unknown) => {
    if (v === null || typeof v !== "object" || Array.isArray(v)) return v;
    const keys = Object.keys(v);
    if (keys.length !== 1 || !keys[0]!.startsWith(TAG)) {
      for (const k of keys) if (k.startsWith(TAG)) throw new WireDecodeError(`object key ${JSON.stringify(k)} is reserved`);
      return v;
    }
    const tag = keys[0]!;
    const payload = (v as Record<string, unknown>)[tag];
    if (tag === F64) {
      const buffer = typeof payload === "number" ? wire.buffers[payload] : undefined;
      if (buffer === undefined || buffer.byteLength % 8 !== 0) throw new WireDecodeError(`Float64Array tag ${String(payload)} has no buffer`);
      return new Float64Array(buffer);
    }
    if (tag === NUM) {
      if (payload === "NaN") return NaN;
      if (payload === "Infinity") return Infinity;
      if (payload === "-Infinity") return -Infinity;
      if (payload === "-0") return -0;
      throw new WireDecodeError(`number tag ${JSON.stringify(payload)} is not NaN, Infinity, -Infinity or -0`);
    }
    if (tag === UNDEF) return undefined;
    throw new WireDecodeError(`unknown tag ${JSON.stringify(tag)}`);
  });
}
