/**
 * The registry of drawdown models by id. Docs, completion, the viewer, fitting and forecasting look models up
 * here, by id alone or, for a model bound to the geometry of its wells (Neuman, Papadopulos-Cooper, Hantush
 * 1961), by a model spec: the id with the geometry as options, `{ id: "neuman", saturatedThickness: 12 }`.
 * Options are checked like every argument: unknown names, missing required ones, wrong types and units are
 * refused with a message naming the model, the option and what would fix it.
 */
import { convert, UnitError } from "../units/index.js";
import { cooperJacobModel } from "./cooper-jacob.js";
import { ModelInputError, UnknownModelError } from "./errors.js";
import { hantushAquitardStorageModel } from "./hantush-aquitard-storage.js";
import { hantushJacobModel } from "./hantush-jacob.js";
import type { DrawdownModel, ModelDescriptor } from "./model.js";
import { neumanModel } from "./neuman.js";
import { papadopulosCooperModel } from "./papadopulos-cooper.js";
import { partialPenetrationModel, type PenetrationObservation } from "./partial-penetration.js";
import { theisModel } from "./theis.js";
import { thiemModel } from "./thiem.js";

/** Ids of the models whose geometry is fixed by { r, Q } alone. */
export type FixedModelId = "theis" | "cooper-jacob" | "hantush-jacob" | "hantush-aquitard-storage" | "thiem";
/** Ids of the models bound to well or aquifer geometry given as options. */
export type GeometryModelId = "neuman" | "papadopulos-cooper" | "hantush-partial-penetration";
/** Ids of the registered models. */
export type ModelId = FixedModelId | GeometryModelId;

/** A model named by its id, or by its id with the geometry options it is bound to. */
export type ModelSpec = string | { readonly id: string; readonly [option: string]: unknown };

/** A length or ratio option: a number in the option's unit, or { value, unit }. */
export type OptionValue = number | { readonly value: number; readonly unit: string };

/** One geometry option of a model. */
export interface ModelOptionDescriptor {
  readonly name: string;
  /** Base unit of the option ("m" or "1"); a length may be given as { value, unit } in any length unit. */
  readonly unit: string;
  readonly required: boolean;
  /** Value used when the option is left out (optional options only). */
  readonly default?: number;
  readonly description: string;
}

/** A model's descriptor with the geometry options it takes (none for the fixed-geometry models). */
export interface ModelDescription extends ModelDescriptor {
  readonly options: readonly ModelOptionDescriptor[];
}

/** A model made from a spec: the forward model, with the spec (options in base units) it was made from. */
export type SpecifiedModel = DrawdownModel & { readonly spec?: { readonly id: string; readonly [option: string]: number | string } };

/** Every fixed-geometry model, by id. */
export const models: Readonly<Record<FixedModelId, DrawdownModel>> = Object.freeze({
  theis: theisModel,
  "cooper-jacob": cooperJacobModel,
  "hantush-jacob": hantushJacobModel,
  "hantush-aquitard-storage": hantushAquitardStorageModel,
  thiem: thiemModel,
});

const length = (name: string, required: boolean, description: string, fallback?: number): ModelOptionDescriptor =>
  Object.freeze({ name, unit: "m", required, description, ...(fallback === undefined ? {} : { default: fallback }) });
const ratio = (name: string, required: boolean, description: string, fallback?: number): ModelOptionDescriptor =>
  Object.freeze({ name, unit: "1", required, description, ...(fallback === undefined ? {} : { default: fallback }) });

interface GeometryEntry {
  readonly options: readonly ModelOptionDescriptor[];
  /** Builds the model from options already checked and converted to base units. */
  readonly build: (o: Readonly<Record<string, number>>, where: string) => DrawdownModel;
  /** Options used to build the descriptor shown by describeModel (only the texts and parameters are read). */
  readonly example: Readonly<Record<string, number>>;
}

const GEOMETRY: Readonly<Record<GeometryModelId, GeometryEntry>> = Object.freeze({
  neuman: {
    options: [length("saturatedThickness", true, "Initial saturated thickness b of the unconfined aquifer, m (sets beta = (Kz/Kr) r^2/b^2).")],
    build: (o) => neumanModel(o.saturatedThickness!),
    example: { saturatedThickness: 10 },
  },
  "papadopulos-cooper": {
    options: [
      length("casingRadius", true, "Inside radius rc of the casing where the water level moves, m."),
      length("wellRadius", true, "Effective radius rw of the screen or open hole, m; an observation at r = rw is the pumped well."),
      ratio("skin", false, "Dimensionless skin factor Sk >= 0 (Agarwal et al. 1970).", 0),
      ratio("stehfestTerms", false, "Stehfest terms N of the inversion, even, 8 to 18.", 12),
    ],
    build: (o) => papadopulosCooperModel({ rc: o.casingRadius!, rw: o.wellRadius!, skin: o.skin, stehfestTerms: o.stehfestTerms }),
    example: { casingRadius: 0.1, wellRadius: 0.1 },
  },
  "hantush-partial-penetration": {
    options: [
      length("aquiferThickness", true, "Thickness b of the confined aquifer, m."),
      length("screenTop", true, "Top d of the pumping well's screen, m below the top of the aquifer."),
      length("screenBottom", true, "Bottom l of the pumping well's screen, m below the top of the aquifer."),
      length("piezometerDepth", false, "Depth z of a piezometer, m below the top of the aquifer (or give the observation screen)."),
      length("observationScreenTop", false, "Top z1 of the observation well's screen, m below the top of the aquifer."),
      length("observationScreenBottom", false, "Bottom z2 of the observation well's screen, m below the top of the aquifer."),
      ratio("anisotropy", false, "Kz/Kr when known; when left out it is fitted as the parameter KzKr."),
      ratio("tolerance", false, "Bound on the series truncation error relative to W(u).", 1e-10),
    ],
    build: (o, where) => partialPenetrationModel({
      thickness: o.aquiferThickness!,
      screenTop: o.screenTop!,
      screenBottom: o.screenBottom!,
      observation: penetrationObservation(o, where),
      ...(o.anisotropy === undefined ? {} : { anisotropy: o.anisotropy }),
      ...(o.tolerance === undefined ? {} : { tolerance: o.tolerance }),
    }),
    example: { aquiferThickness: 20, screenTop: 0, screenBottom: 10, piezometerDepth: 5 },
  },
});

function penetrationObservation(o: Readonly<Record<string, number>>, where: string): PenetrationObservation {
  const screen = o.observationScreenTop !== undefined || o.observationScreenBottom !== undefined;
  if (o.piezometerDepth !== undefined && screen) {
    throw new ModelInputError(`${where}: give either piezometerDepth or observationScreenTop and observationScreenBottom, not both.`);
  }
  if (o.piezometerDepth !== undefined) return { depth: o.piezometerDepth };
  if (o.observationScreenTop !== undefined && o.observationScreenBottom !== undefined) {
    return { screenTop: o.observationScreenTop, screenBottom: o.observationScreenBottom };
  }
  throw new ModelInputError(
    `${where}: say where the drawdown is observed: piezometerDepth (m below the top of the aquifer), or ` +
      "observationScreenTop and observationScreenBottom for a screened observation well.",
  );
}

/** Ids of the registered models, in registry order: the fixed-geometry ones, then those bound to geometry. */
export const modelIds: readonly ModelId[] = Object.freeze([
  ...(Object.keys(models) as FixedModelId[]),
  ...(Object.keys(GEOMETRY) as GeometryModelId[]),
]);

/** True when `id` names a registered model. */
export function isModelId(id: string): id is ModelId {
  return typeof id === "string" && (Object.hasOwn(models, id) || Object.hasOwn(GEOMETRY, id));
}

function isFixed(id: ModelId): id is FixedModelId {
  return Object.hasOwn(models, id);
}

/**
 * What the library cannot do that a user will ask for, with the nearest models it has. The message is used
 * for an unknown id that asks for it and for options that ask for it.
 */
const LEAKY_PARTIAL_PENETRATION =
  "partial penetration in a leaky aquifer (Hantush 1964) is not available: there was no independent reference to " +
  "validate it against. Nearest available models: \"hantush-partial-penetration\" (partial penetration, confined " +
  "aquifer: no leakage) and \"hantush-jacob\" (leaky aquifer, fully penetrating well). Beyond r = 1.5 b sqrt(Kr/Kz) " +
  "partial penetration matters little for late data (common practice, no source), so hantush-jacob fitted to those " +
  "data is the usual approach.";

const PENETRATION_OPTIONS = new Set(["aquiferThickness", "screenTop", "screenBottom", "piezometerDepth", "observationScreenTop", "observationScreenBottom", "anisotropy"]);
const LEAKAGE_OPTIONS = new Set(["B", "leakageFactor", "leakance", "aquitardStorativity"]);

function unknownModel(id: string): Error {
  const asked = id.toLowerCase();
  if (/leaky|hantush-?1964/.test(asked) && /partial|penetrat/.test(asked)) {
    return new UnknownModelError(id, modelIds, `Model "${id}": ${LEAKY_PARTIAL_PENETRATION}`);
  }
  return new UnknownModelError(id, modelIds);
}

function optionNumber(where: string, d: ModelOptionDescriptor, given: unknown): number {
  let value: number;
  if (typeof given === "number") value = given;
  else if (given !== null && typeof given === "object" && typeof (given as { value?: unknown }).value === "number" && typeof (given as { unit?: unknown }).unit === "string") {
    const q = given as { value: number; unit: string };
    try {
      value = convert(q.value, q.unit, d.unit);
    } catch (e) {
      if (e instanceof UnitError) throw new ModelInputError(`${where}: option ${d.name}: ${e.message}`);
      throw e;
    }
  } else {
    const form = d.unit === "m" ? "a number in m or { value, unit }" : "a number";
    throw new ModelInputError(`${where}: option ${d.name} must be ${form}, got ${JSON.stringify(given) ?? String(given)}.`);
  }
  if (!Number.isFinite(value)) throw new ModelInputError(`${where}: option ${d.name} is ${value}; it must be a finite number.`);
  return value;
}

/** The id and the options of a spec, checked for shape (not yet against the model). */
function splitSpec(spec: ModelSpec): { id: string; given: Record<string, unknown> } {
  if (typeof spec === "string") return { id: spec, given: {} };
  if (spec === null || typeof spec !== "object" || typeof spec.id !== "string") {
    throw new ModelInputError(
      `a model is given by its id ("theis") or by { id, ...options } for a model bound to geometry ({ id: "neuman", saturatedThickness: 12 }); got ${JSON.stringify(spec) ?? String(spec)}.`,
    );
  }
  const { id, ...given } = spec;
  return { id, given };
}

/**
 * The model named by `spec`: a registered id ("theis"), or for a model bound to geometry the id with its
 * options, e.g. { id: "neuman", saturatedThickness: 12 } or { id: "papadopulos-cooper", casingRadius: 0.1,
 * wellRadius: { value: 6, unit: "in" } }. Lengths are numbers in m or { value, unit } (converted with the units
 * module). See `describeModel(id).options` for each model's options.
 * @throws UnknownModelError naming the known ids (and, for leaky partial penetration, the nearest models);
 *   ModelInputError for a missing, unknown or malformed option.
 */
export function getModel(spec: ModelSpec): SpecifiedModel {
  const { id, given } = splitSpec(spec);
  if (!isModelId(id)) throw unknownModel(id);
  const where = `model "${id}"`;
  const names = Object.keys(given);
  if (isFixed(id)) {
    if (names.length === 0) return models[id];
    if (id === "hantush-jacob" && names.some((n) => PENETRATION_OPTIONS.has(n))) {
      throw new ModelInputError(`${where} takes no geometry options, and ${LEAKY_PARTIAL_PENETRATION}`);
    }
    throw new ModelInputError(`${where} takes no options (got ${names.join(", ")}); give it by its id alone, "${id}".`);
  }
  const entry = GEOMETRY[id];
  if (id === "hantush-partial-penetration" && names.some((n) => LEAKAGE_OPTIONS.has(n))) {
    throw new ModelInputError(`${where} is for a confined aquifer, and ${LEAKY_PARTIAL_PENETRATION}`);
  }
  const known = entry.options.map((o) => o.name);
  const unknown = names.filter((n) => !known.includes(n));
  if (unknown.length > 0) {
    throw new ModelInputError(`${where} has no option ${unknown.map((n) => JSON.stringify(n)).join(", ")}; its options are ${optionList(entry.options)}.`);
  }
  const missing = entry.options.filter((o) => o.required && given[o.name] === undefined);
  if (missing.length > 0) {
    throw new ModelInputError(
      `${where} is bound to the geometry of its wells and needs ${missing.map((o) => `${o.name} (${o.unit})`).join(", ")}; ` +
        `give it as { id: "${id}", ${missing.map((o) => `${o.name}: ...`).join(", ")} }. Its options are ${optionList(entry.options)}.`,
    );
  }
  const values: Record<string, number> = {};
  for (const o of entry.options) {
    if (given[o.name] !== undefined) values[o.name] = optionNumber(where, o, given[o.name]);
  }
  const model = entry.build(values, where);
  return Object.freeze({ ...model, spec: Object.freeze({ id, ...values }) }) as SpecifiedModel;
}

function optionList(options: readonly ModelOptionDescriptor[]): string {
  return options.map((o) => `${o.name} (${o.unit}${o.required ? ", required" : ""})`).join(", ");
}

function descriptorOf(model: DrawdownModel): ModelDescriptor {
  return {
    id: model.id,
    name: model.name,
    source: model.source,
    assumptions: model.assumptions,
    validity: model.validity,
    cautions: model.cautions,
    parameters: model.parameters,
  };
}

/**
 * A registered model's descriptor (name, source, assumptions, validity, cautions, parameters with units and
 * bounds) and the geometry options it takes. For hantush-partial-penetration the parameters listed include
 * KzKr, which is fitted only when the option anisotropy is left out.
 * @throws UnknownModelError as getModel.
 */
export function describeModel(id: string): ModelDescription {
  if (!isModelId(id)) throw unknownModel(id);
  if (isFixed(id)) return { ...descriptorOf(models[id]), options: [] };
  const entry = GEOMETRY[id];
  return { ...descriptorOf(entry.build(entry.example, id)), options: entry.options };
}

/** The spec a model was made from (its id for a fixed-geometry model), for fit results and forecasts. */
export function modelSpecOf(model: DrawdownModel): ModelSpec {
  const spec = (model as SpecifiedModel).spec;
  return spec ?? model.id;
}
