/**
 * A validator for the subset of JSON Schema (draft 2020-12 keywords) that schema.ts uses: type, enum,
 * properties, required, additionalProperties, items, minItems, maxItems, minimum, maximum, exclusiveMinimum,
 * minLength, pattern, not/required. Unknown keywords are ignored, as the specification says annotations are.
 */

export type JsonType = "object" | "array" | "string" | "number" | "integer" | "boolean" | "null";

export interface JsonSchema {
  $schema?: string;
  $id?: string;
  title?: string;
  description?: string;
  type?: JsonType | JsonType[];
  enum?: readonly unknown[];
  properties?: Record<string, JsonSchema>;
  required?: readonly string[];
  additionalProperties?: boolean | JsonSchema;
  items?: JsonSchema;
  minItems?: number;
  maxItems?: number;
  minimum?: number;
  maximum?: number;
  exclusiveMinimum?: number;
  minLength?: number;
  pattern?: string;
  not?: { required: readonly string[] };
}

export interface SchemaProblem {
  /** Dotted path of the offending value (`parameters.0.range`), "" for the root. */
  path: string;
  message: string;
}

/** Appends `more` to `into` one by one (spreading a long list into push() overflows the stack). */
function append(into: SchemaProblem[], more: readonly SchemaProblem[]): void {
  for (const p of more) into.push(p);
}

function typeOf(v: unknown): JsonType | "undefined" {
  if (v === null) return "null";
  if (Array.isArray(v)) return "array";
  if (typeof v === "number") return Number.isInteger(v) ? "integer" : "number";
  return typeof v as JsonType;
}

function matchesType(v: unknown, t: JsonType): boolean {
  const actual = typeOf(v);
  return actual === t || (t === "number" && actual === "integer");
}

/** Every way `value` breaks `schema`; an empty list when it conforms. */
export function validateJsonSchema(schema: JsonSchema, value: unknown, path = ""): SchemaProblem[] {
  const problems: SchemaProblem[] = [];
  const add = (message: string, at = path): void => void problems.push({ path: at, message });
  const join = (k: string | number): string => (path === "" ? String(k) : `${path}.${k}`);
  if (schema.type !== undefined) {
    const types = Array.isArray(schema.type) ? schema.type : [schema.type];
    if (!types.some((t) => matchesType(value, t))) {
      add(`must be ${types.join(" or ")}, not ${typeOf(value)}`);
      return problems;
    }
  }
  if (schema.enum && !schema.enum.some((e) => JSON.stringify(e) === JSON.stringify(value))) {
    add(`must be one of ${schema.enum.map((e) => JSON.stringify(e)).join(", ")}`);
  }
  if (typeof value === "number") {
    if (schema.minimum !== undefined && value < schema.minimum) add(`must be at least ${schema.minimum}`);
    if (schema.maximum !== undefined && value > schema.maximum) add(`must be at most ${schema.maximum}`);
    if (schema.exclusiveMinimum !== undefined && !(value > schema.exclusiveMinimum)) add(`must be greater than ${schema.exclusiveMinimum}`);
  }
  if (typeof value === "string") {
    if (schema.minLength !== undefined && value.length < schema.minLength) add(`must have at least ${schema.minLength} characters`);
    if (schema.pattern !== undefined && !new RegExp(schema.pattern, "u").test(value)) add(`must match ${schema.pattern}`);
  }
  if (Array.isArray(value)) {
    if (schema.minItems !== undefined && value.length < schema.minItems) add(`must have at least ${schema.minItems} items`);
    if (schema.maxItems !== undefined && value.length > schema.maxItems) add(`must have at most ${schema.maxItems} items`);
    if (schema.items) value.forEach((v, i) => append(problems, validateJsonSchema(schema.items!, v, join(i))));
  }
  if (typeof value === "object" && value !== null && !Array.isArray(value)) {
    const o = value as Record<string, unknown>;
    for (const k of schema.required ?? []) if (!(k in o)) add(`must have property ${JSON.stringify(k)}`);
    if (schema.not?.required && schema.not.required.every((k) => k in o)) {
      add(`must not have ${schema.not.required.map((k) => JSON.stringify(k)).join(" and ")}`);
    }
    for (const [k, v] of Object.entries(o)) {
      const sub = schema.properties?.[k];
      if (sub) append(problems, validateJsonSchema(sub, v, join(k)));
      else if (schema.additionalProperties === false) add(`has unknown property ${JSON.stringify(k)}`, join(k));
      else if (typeof schema.additionalProperties === "object") append(problems, validateJsonSchema(schema.additionalProperties, v, join(k)));
    }
  }
  return problems;
}
