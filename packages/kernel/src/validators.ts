/**
 * Argument validators for the bridge: each checks one decoded guest value and returns it in the form the host
 * function expects, or throws an ArgumentError whose message names the function, the argument and what was
 * wrong ("aq.expint1: argument 1 (x) must be a number >= 0, got -1").
 */

/** A bad argument from a cell; the message is shown to the user as it is. */
export class ArgumentError extends Error {
  override readonly name = "ArgumentError";
}

/** Checks a value at `at` (e.g. `aq.expint1: argument 1 (x)`) and returns it converted. */
export interface Validator<T> {
  /** What the validator accepts, for messages and docs, e.g. "a number > 0". */
  readonly expects: string;
  check(value: unknown, at: string): T;
}

/** The host type a validator produces. */
export type Checked<V> = V extends Validator<infer T> ? T : never;

function show(value: unknown): string {
  if (value === undefined) return "nothing (undefined)";
  if (typeof value === "number") return String(value);
  if (typeof value === "string") return JSON.stringify(value.length > 40 ? `${value.slice(0, 40)}...` : value);
  if (value instanceof Float64Array) return `a Float64Array of length ${value.length}`;
  if (Array.isArray(value)) return `an array of length ${value.length}`;
  if (value === null) return "null";
  return typeof value === "object" ? "an object" : `a ${typeof value}`;
}

function fail(at: string, expects: string, value: unknown): never {
  throw new ArgumentError(`${at} must be ${expects}, got ${show(value)}`);
}

/** Range constraints of a number validator. */
export interface NumberRange {
  /** Smallest allowed value (inclusive unless `exclusiveMin`). */
  min?: number;
  max?: number;
  exclusiveMin?: boolean;
  integer?: boolean;
  /** Allow NaN and ±Infinity (by default only finite numbers pass). */
  allowNonFinite?: boolean;
}

function rangeText(r: NumberRange): string {
  const kind = r.integer ? "an integer" : r.allowNonFinite ? "a number" : "a finite number";
  const parts: string[] = [];
  if (r.min !== undefined) parts.push(`${r.exclusiveMin ? ">" : ">="} ${r.min}`);
  if (r.max !== undefined) parts.push(`<= ${r.max}`);
  return parts.length ? `${kind} ${parts.join(" and ")}` : kind;
}

function inRange(v: number, r: NumberRange): boolean {
  if (!r.allowNonFinite && !Number.isFinite(v)) return false;
  if (r.integer && !Number.isInteger(v)) return false;
  if (r.min !== undefined && (r.exclusiveMin ? !(v > r.min) : !(v >= r.min))) return false;
  if (r.max !== undefined && !(v <= r.max)) return false;
  return true;
}

/** A number, finite unless `allowNonFinite`, within the given range. */
export function numberArg(range: NumberRange = {}): Validator<number> {
  const expects = rangeText(range);
  return {
    expects,
    check(value, at) {
      if (typeof value !== "number" || !inRange(value, range)) fail(at, expects, value);
      return value;
    },
  };
}

/** A finite number > 0. */
export const positive = numberArg({ min: 0, exclusiveMin: true });
/** A finite number >= 0. */
export const nonNegative = numberArg({ min: 0 });
/** Any finite number. */
export const finite = numberArg();

/**
 * An array of numbers or a Float64Array, returned as a Float64Array. Every element is checked against `range`
 * and the first offending index is named.
 */
export function numbersArg(range: NumberRange = {}, minLength = 1): Validator<Float64Array> {
  const each = rangeText(range);
  const expects = `a Float64Array or an array of at least ${minLength} numbers, each ${each}`;
  const bounded = range.integer === true || range.min !== undefined || range.max !== undefined;
  const anyNumber = range.allowNonFinite === true && !bounded;
  const finiteOnly = !range.allowNonFinite && !bounded;
  return {
    expects,
    check(value, at) {
      let out: Float64Array;
      if (value instanceof Float64Array) out = value;
      else if (Array.isArray(value)) {
        out = new Float64Array(value.length);
        for (let i = 0; i < value.length; i++) {
          const v: unknown = value[i];
          if (typeof v !== "number") fail(`${at}, element ${i}`, each, v);
          out[i] = v;
        }
      } else return fail(at, expects, value);
      if (out.length < minLength) fail(at, expects, value);
      if (anyNumber) return out;
      if (finiteOnly) {
        // v - v is 0 for a finite v and NaN otherwise: one subtraction per element instead of a call.
        for (let i = 0; i < out.length; i++) if (out[i]! - out[i]! !== 0) fail(`${at}, element ${i}`, each, out[i]);
        return out;
      }
      for (let i = 0; i < out.length; i++) if (!inRange(out[i]!, range)) fail(`${at}, element ${i}`, each, out[i]);
      return out;
    },
  };
}

/** A string, optionally one of a fixed list. */
export function stringArg(oneOf?: readonly string[]): Validator<string> {
  const expects = oneOf ? `one of ${oneOf.map((s) => JSON.stringify(s)).join(", ")}` : "a string";
  return {
    expects,
    check(value, at) {
      if (typeof value !== "string" || (oneOf && !oneOf.includes(value))) fail(at, expects, value);
      return value;
    },
  };
}

/** true or false. */
export const booleanArg: Validator<boolean> = {
  expects: "true or false",
  check(value, at) {
    if (typeof value !== "boolean") fail(at, this.expects, value);
    return value;
  },
};

/** The value may be left out (undefined); otherwise it must pass `inner`. */
export function optional<T>(inner: Validator<T>): Validator<T | undefined> {
  return {
    expects: `${inner.expects} (optional)`,
    check(value, at) {
      return value === undefined ? undefined : inner.check(value, at);
    },
  };
}

type Shape = Record<string, Validator<unknown>>;
type RecordOf<S extends Shape> = { [K in keyof S]: Checked<S[K]> };

/**
 * A plain object with the given fields. Unknown fields are refused by name (a misspelt option should not be
 * silently ignored).
 */
export function recordArg<S extends Shape>(shape: S): Validator<RecordOf<S>> {
  const names = Object.keys(shape);
  const expects = `an object with fields ${names.join(", ")}`;
  return {
    expects,
    check(value, at) {
      if (value === null || typeof value !== "object" || Array.isArray(value) || value instanceof Float64Array) {
        fail(at, expects, value);
      }
      const input = value as Record<string, unknown>;
      for (const key of Object.keys(input)) {
        if (!(key in shape)) {
          throw new ArgumentError(`${at} has an unknown field ${JSON.stringify(key)}; known fields: ${names.join(", ")}`);
        }
      }
      const out: Record<string, unknown> = {};
      for (const key of names) {
        const checked = shape[key]!.check(input[key], `${at}, field "${key}"`);
        if (checked !== undefined) out[key] = checked;
      }
      return out as RecordOf<S>;
    },
  };
}

/** An array whose every element passes `inner`. */
export function arrayOf<T>(inner: Validator<T>, minLength = 0): Validator<T[]> {
  const expects = `an array of at least ${minLength} elements, each ${inner.expects}`;
  return {
    expects,
    check(value, at) {
      if (!Array.isArray(value) || value.length < minLength) fail(at, expects, value);
      return value.map((v: unknown, i) => inner.check(v, `${at}, element ${i}`));
    },
  };
}

/** A number with its unit, `{ value, unit }`. */
export const quantityArg = recordArg({ value: finite, unit: stringArg() });

/** Any plain data (already guaranteed plain by the wire format); used where the aquifer function validates itself. */
export const plainData: Validator<unknown> = {
  expects: "plain data",
  check(value) {
    return value;
  },
};

/** An array of true/false flags (e.g. a fit's inclusion mask), returned as a plain boolean array. */
export function booleansArg(minLength = 0): Validator<boolean[]> {
  const expects = `an array of at least ${minLength} true/false values`;
  return {
    expects,
    check(value, at) {
      if (!Array.isArray(value) || value.length < minLength) fail(at, expects, value);
      return value.map((v: unknown, i) => {
        if (typeof v !== "boolean") fail(`${at}, element ${i}`, "true or false", v);
        return v;
      });
    },
  };
}

/** An array of strings. */
export function stringsArg(minLength = 0): Validator<string[]> {
  const expects = `an array of at least ${minLength} strings`;
  return {
    expects,
    check(value, at) {
      if (!Array.isArray(value) || value.length < minLength) fail(at, expects, value);
      return value.map((v: unknown, i) => {
        if (typeof v !== "string") fail(`${at}, element ${i}`, "a string", v);
        return v;
      });
    },
  };
}

/**
 * A plain object whose keys are free (e.g. parameter names) and whose every value passes `inner`; the keys are
 * checked by whoever uses them (the aquifer function names unknown parameters itself).
 */
export function mapOf<T>(inner: Validator<T>): Validator<Record<string, T>> {
  const expects = `an object whose values are each ${inner.expects}`;
  return {
    expects,
    check(value, at) {
      if (value === null || typeof value !== "object" || Array.isArray(value) || value instanceof Float64Array) fail(at, expects, value);
      const out: Record<string, T> = {};
      for (const [key, v] of Object.entries(value as Record<string, unknown>)) out[key] = inner.check(v, `${at}, field "${key}"`);
      return out;
    },
  };
}

/** An interval [low, high] of finite numbers with low <= high. */
const RANGE_EXPECTS = "an array [low, high] of two finite numbers with low <= high";
export const rangeArg: Validator<[number, number]> = {
  expects: RANGE_EXPECTS,
  check(value, at) {
    const pair = Array.isArray(value) || value instanceof Float64Array ? Array.from(value as ArrayLike<unknown>) : undefined;
    if (!pair || pair.length !== 2 || typeof pair[0] !== "number" || typeof pair[1] !== "number") fail(at, RANGE_EXPECTS, value);
    const [lo, hi] = pair as [number, number];
    if (!Number.isFinite(lo) || !Number.isFinite(hi) || !(lo <= hi)) fail(at, RANGE_EXPECTS, value);
    return [lo, hi];
  },
};

/**
 * The first of several validators that accepts the value (tried in order); when none does, the message lists
 * what each would have accepted.
 */
export function oneOf<V extends readonly Validator<unknown>[]>(...options: V): Validator<Checked<V[number]>> {
  const expects = options.map((o) => o.expects).join(", or ");
  return {
    expects,
    check(value, at) {
      for (const o of options) {
        try {
          return o.check(value, at) as Checked<V[number]>;
        } catch (e) {
          if (!(e instanceof ArgumentError)) throw e;
        }
      }
      return fail(at, expects, value);
    },
  };
}

/** A validator whose check is `inner`'s followed by a conversion or further check `then` (which may throw ArgumentError). */
export function refine<T, U>(inner: Validator<T>, expects: string, then: (value: T, at: string) => U): Validator<U> {
  return {
    expects,
    check(value, at) {
      return then(inner.check(value, at), at);
    },
  };
}

type PickedOf<S extends Shape> = { [K in keyof S]: Checked<S[K]> };

/**
 * A plain object of which only the named fields are read (and checked); other fields are ignored. For results
 * of one bridge function passed to another (a derivative, an estimate), which carry fields the next one does
 * not need.
 */
export function pickArg<S extends Shape>(shape: S): Validator<PickedOf<S>> {
  const names = Object.keys(shape);
  const expects = `an object with fields ${names.join(", ")}`;
  return {
    expects,
    check(value, at) {
      if (value === null || typeof value !== "object" || Array.isArray(value) || value instanceof Float64Array) fail(at, expects, value);
      const input = value as Record<string, unknown>;
      const out: Record<string, unknown> = {};
      for (const key of names) {
        const checked = shape[key]!.check(input[key], `${at}, field "${key}"`);
        if (checked !== undefined) out[key] = checked;
      }
      return out as PickedOf<S>;
    },
  };
}

/** null, for fields a result may leave empty (a standard deviation of one reading). */
export const nullArg: Validator<null> = {
  expects: "null",
  check(value, at) {
    if (value !== null) fail(at, "null", value);
    return null;
  },
};
