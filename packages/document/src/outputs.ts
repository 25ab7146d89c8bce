/**
 * Recorded outputs: the JSON array in an `outputs:<id>` block after a cell. Reading checks each output's shape
 * against the CellOutput union so a hand-edited or truncated record is reported, not silently trusted.
 */

import { MAX_JSON_DEPTH, nestedTooDeep } from "./json-depth.js";
import { formatJson } from "./json-format.js";
import type { CellOutput } from "./types.js";

type Raw = Record<string, unknown>;
const isObject = (v: unknown): v is Raw => typeof v === "object" && v !== null && !Array.isArray(v);
const optString = (o: Raw, k: string): boolean => o[k] === undefined || typeof o[k] === "string";
const optNumber = (o: Raw, k: string): boolean => o[k] === undefined || typeof o[k] === "number";

/** The problem with one output, or undefined when its shape matches its `type`. */
export function outputShapeProblem(o: unknown): string | undefined {
  if (!isObject(o) || typeof o.type !== "string") return "an output must be an object with a string \"type\"";
  const t = o.type;
  switch (t) {
    case "value":
      return typeof o.value === "number" && optString(o, "label") && optString(o, "unit")
        ? undefined
        : "a value output needs a number \"value\" and optional strings \"label\", \"unit\"";
    case "text":
      return typeof o.text === "string" ? undefined : "a text output needs a string \"text\"";
    case "table": {
      const colsOk =
        Array.isArray(o.columns) && o.columns.every((c: unknown) => isObject(c) && typeof c.name === "string" && optString(c, "unit"));
      const rowsOk =
        Array.isArray(o.rows) &&
        o.rows.every((r: unknown) => Array.isArray(r) && r.every((x: unknown) => x === null || typeof x === "number" || typeof x === "string"));
      return colsOk && rowsOk && optString(o, "title")
        ? undefined
        : "a table output needs \"columns\" [{name, unit?}] and \"rows\" of numbers, strings or null";
    }
    case "chart": {
      const s = o.summary;
      const ok =
        isObject(o.spec) &&
        isObject(s) &&
        Array.isArray(s.datasets) &&
        s.datasets.every(
          (d: unknown) =>
            isObject(d) &&
            typeof d.name === "string" &&
            typeof d.rows === "number" &&
            Array.isArray(d.fields) &&
            d.fields.every((f: unknown) => isObject(f) && typeof f.name === "string" && optNumber(f, "min") && optNumber(f, "max")),
        );
      return ok ? undefined : "a chart output needs an object \"spec\" and a \"summary\" {datasets: [{name, rows, fields}]}";
    }
    case "json":
      return "value" in o ? undefined : "a json output needs a \"value\"";
    case "control":
      return typeof o.name === "string" &&
        typeof o.value === "number" &&
        typeof o.default === "number" &&
        optString(o, "unit") &&
        optNumber(o, "min") &&
        optNumber(o, "max") &&
        optString(o, "description")
        ? undefined
        : "a control output needs a string \"name\" and numbers \"value\", \"default\"";
    case "error":
      return typeof o.message === "string" && optNumber(o, "line") && optNumber(o, "column")
        ? undefined
        : "an error output needs a string \"message\" and optional numbers \"line\", \"column\"";
    case "not-run":
      return typeof o.reason === "string" ? undefined : "a not-run output needs a string \"reason\"";
    default:
      return `unknown output type ${JSON.stringify(t)}`;
  }
}

export interface OutputsReading {
  outputs: CellOutput[];
  problems: string[];
}

/**
 * Reads the JSON text of an outputs block. Throws a SyntaxError when the text is not JSON or nests deeper than
 * MAX_JSON_DEPTH arrays and objects.
 */
export function readOutputs(json: string): OutputsReading {
  const value: unknown = JSON.parse(json);
  if (nestedTooDeep(value)) throw new SyntaxError(`the JSON nests more than ${MAX_JSON_DEPTH} arrays and objects deep`);
  if (!Array.isArray(value)) return { outputs: [], problems: ["the recorded outputs must be a JSON array"] };
  const problems: string[] = [];
  value.forEach((o, i) => {
    const p = outputShapeProblem(o);
    if (p) problems.push(`output ${i + 1}: ${p}`);
  });
  return { outputs: value as CellOutput[], problems };
}

/** Writes outputs as the JSON text of an outputs block (one line per output or table row when long). */
export function writeOutputs(outputs: readonly CellOutput[]): string {
  return formatJson(outputs);
}
