/**
 * JSON Schemas for the parts of a Conebook file that are data: the YAML header (as the YAML parses, with the
 * file's key names) and the wrapper every chart cell's Vega-Lite specification must fit (named data only, so a
 * chart can draw values earlier cells produced and never fetches a URL). Kept in lockstep with types.ts and
 * header.ts by test/schema.test.ts, which checks the property names against HEADER_KEYS and validates
 * randomly generated headers written by writeHeaderYaml.
 */

import { MAX_CELL_TIME_LIMIT_MS, MAX_MEMORY_LIMIT_MB } from "./limits.js";
import type { JsonSchema } from "./json-schema.js";
import { testInformationSchema } from "./test-information.js";

const text: JsonSchema = { type: "string" };

/** Schema of the header mapping between the `---` lines. Unknown keys are allowed (they go to `extra`). */
export const headerSchema: JsonSchema = {
  $schema: "https://json-schema.org/draft/2020-12/schema",
  $id: "https://conebook.invalid/schema/header-1.json",
  title: "Conebook document header",
  type: "object",
  required: ["conebook", "title", "seed"],
  properties: {
    conebook: { type: "integer", minimum: 1, description: "Format version of the file." },
    title: { type: "string" },
    seed: { type: "integer", description: "Seed of the pseudo-random generator every run starts from." },
    recordedWith: { type: "string", description: "Library version the recorded outputs were produced with." },
    limits: {
      type: "object",
      additionalProperties: false,
      properties: {
        cellTimeMs: { type: "number", exclusiveMinimum: 0, maximum: MAX_CELL_TIME_LIMIT_MS, description: "Wall-clock limit per cell, ms." },
        memoryMb: { type: "number", exclusiveMinimum: 0, maximum: MAX_MEMORY_LIMIT_MB, description: "Sandbox memory limit, MiB." },
      },
    },
    parameters: {
      type: "array",
      items: {
        type: "object",
        required: ["name", "value"],
        additionalProperties: false,
        properties: {
          name: { type: "string", minLength: 1 },
          value: { type: ["number", "string"] },
          unit: text,
          range: { type: "array", items: { type: "number" }, minItems: 2, maxItems: 2, description: "[min, max], inclusive." },
          description: text,
          required: { type: "boolean", description: "The template's value is a demonstration only: `conebook new` needs a value for it." },
          given: { type: "string", description: "The value as typed with its unit, when it was converted to unit." },
        },
      },
    },
    dataSlots: {
      type: "array",
      items: {
        type: "object",
        required: ["name"],
        additionalProperties: false,
        properties: {
          name: { type: "string", minLength: 1 },
          description: text,
          columns: {
            type: "array",
            items: { type: "object", required: ["name"], additionalProperties: false, properties: { name: text, unit: text } },
          },
        },
      },
    },
    testInformation: testInformationSchema,
  },
};

/** Schema of a chart cell's specification: a Vega-Lite object whose top-level data, if any, is named. */
export const chartSpecSchema: JsonSchema = {
  $schema: "https://json-schema.org/draft/2020-12/schema",
  $id: "https://conebook.invalid/schema/chart-1.json",
  title: "Conebook chart cell specification",
  type: "object",
  properties: {
    data: {
      type: "object",
      required: ["name"],
      additionalProperties: false,
      properties: { name: { type: "string", pattern: "^[A-Za-z_][A-Za-z0-9_]*$" }, format: { type: "object" } },
      description: "Named data: the name of a data cell or of a value an earlier cell produced.",
    },
  },
  not: { required: ["usermeta"] },
  description: "usermeta is not allowed: a viewer would merge it over its own embedding options.",
};
