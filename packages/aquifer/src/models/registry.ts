/**
 * The registry of drawdown models by id. Docs, completion, the viewer, fitting and forecasting look models up
 * here, by id alone or, for a model bound to the geometry of its wells (Neuman, Papadopulos-Cooper, the screened
 * wells, the slug tests, the step test with well loss...), by a model spec: the id with the geometry as options,
 * `{ id: "neuman", saturatedThickness: 12 }`. Options are checked like every argument: unknown names, missing
 * required ones, wrong types, choices and units are refused with a message naming the model, the option and what
 * would fix it.
 */
import { kgsSlugModel } from "../slug/kgs.js";
import { underdampedSlugModel } from "../slug/underdamped.js";
import { stepDrawdownModel } from "../steptest/transient-step-fit.js";
import { convert, UnitError } from "../units/index.js";
import { boultonModel } from "./boulton.js";
import { cooperJacobModel } from "./cooper-jacob.js";
import { doughertyBabuModel } from "./dougherty-babu.js";
import { dupuitThiemModel } from "./dupuit-thiem.js";
import { ModelInputError, UnknownModelError } from "./errors.js";
import { gringartenFractureModel } from "./gringarten-fracture.js";
import { hantushAquitardStorageModel } from "./hantush-aquitard-storage.js";
import { hantushJacobModel } from "./hantush-jacob.js";
import { hantushLeakyPartialPenetrationModel } from "./hantush-leaky-penetration.js";
import { jacobLohmanModel } from "./jacob-lohman.js";
import type { DrawdownModel, ModelDescriptor } from "./model.js";
import { moenchDoublePorosityModel } from "./moench-double-porosity.js";
import { moenchWaterTableModel, neumanPartialPenetrationModel } from "./moench-water-table.js";
import { neumanModel } from "./neuman.js";
import { papadopulosAnisotropyModel } from "./papadopulos-anisotropy.js";
import { papadopulosCooperModel } from "./papadopulos-cooper.js";
import { partialPenetrationModel, type PenetrationObservation } from "./partial-penetration.js";
import { theisModel } from "./theis.js";
import { theisBarrierImageModel } from "./theis-barrier-image.js";
import { thiemModel } from "./thiem.js";

/** Ids of the models whose geometry is fixed by { r, Q } (and, for the directional ones, x and y) alone. */
export type FixedModelId =
  | "theis"
  | "cooper-jacob"
  | "hantush-jacob"
  | "hantush-aquitard-storage"
  | "thiem"
  | "boulton"
  | "papadopulos-anisotropy"
  | "theis-barrier-image";
/** Ids of the models bound to well or aquifer geometry given as options. */
export type GeometryModelId =
  | "neuman"
  | "papadopulos-cooper"
  | "hantush-partial-penetration"
  | "hantush-leaky-partial-penetration"
  | "dougherty-babu"
  | "moench-water-table"
  | "neuman-partial-penetration"
  | "moench-double-porosity"
  | "dupuit-thiem"
  | "gringarten-fracture"
  | "jacob-lohman"
  | "kgs-slug"
  | "underdamped-slug"
  | "theis+well-loss"
  | "papadopulos-cooper+well-loss";
/** Ids of the registered models. */
export type ModelId = FixedModelId | GeometryModelId;

/** A model named by its id, or by its id with the geometry options it is bound to. */
export type ModelSpec = string | { readonly id: string; readonly [option: string]: unknown };

/** A length or ratio option: a number in the option's unit, or { value, unit }. */
export type OptionValue = number | { readonly value: number; readonly unit: string };

/** One step of a rate schedule given as an option: from `start` (d) on the well pumps `rate` (m3/d). */
export interface ScheduleStep {
  readonly start: number;
  readonly rate: number;
}

/** The value of one option after checking, in base units. */
export type CheckedOption = number | string | boolean | readonly ScheduleStep[];

/**
 * What an option takes: a number (lengths may also be { value, unit }), one of `choices`, a number or the word
 * "fitted" (the quantity becomes a fitted parameter), true or false, or a rate schedule [{ start (d), rate (m3/d) }].
 */
export type ModelOptionKind = "number" | "choice" | "number-or-fitted" | "flag" | "schedule";

/** One geometry option of a model. */
export interface ModelOptionDescriptor {
  readonly name: string;
  /**
   * Base unit of a number ("m" or "1"; a length may be given as { value, unit } in any length unit); for the other
   * kinds a short description of what is accepted ("gradual" or "instantaneous", true or false, ...).
   */
  readonly unit: string;
  readonly required: boolean;
  /** Value used when the option is left out (optional options only). */
  readonly default?: number | string | boolean;
  readonly description: string;
  /** What the option takes; "number" when absent. */
  readonly kind?: ModelOptionKind;
  /** The accepted words of a "choice" option. */
  readonly choices?: readonly string[];
}

/** A model's descriptor with the geometry options it takes (none for the fixed-geometry models). */
export interface ModelDescription extends ModelDescriptor {
  readonly options: readonly ModelOptionDescriptor[];
}

/** A model made from a spec: the forward model, with the spec (options in base units) it was made from. */
export type SpecifiedModel = DrawdownModel & { readonly spec?: { readonly id: string; readonly [option: string]: CheckedOption } };

/** Every fixed-geometry model, by id. */
export const models: Readonly<Record<FixedModelId, DrawdownModel>> = Object.freeze({
  theis: theisModel,
  "cooper-jacob": cooperJacobModel,
  "hantush-jacob": hantushJacobModel,
  "hantush-aquitard-storage": hantushAquitardStorageModel,
  thiem: thiemModel,
  boulton: boultonModel,
  "papadopulos-anisotropy": papadopulosAnisotropyModel,
  "theis-barrier-image": theisBarrierImageModel,
});

type Described = Omit<ModelOptionDescriptor, "name" | "unit" | "required" | "description" | "default">;
const option = (
  name: string,
  unit: string,
  required: boolean,
  description: string,
  fallback?: number | string | boolean,
  more: Described = {},
): ModelOptionDescriptor => Object.freeze({ name, unit, required, description, ...(fallback === undefined ? {} : { default: fallback }), ...more });
const length = (name: string, required: boolean, description: string, fallback?: number): ModelOptionDescriptor =>
  option(name, "m", required, description, fallback);
const ratio = (name: string, required: boolean, description: string, fallback?: number): ModelOptionDescriptor =>
  option(name, "1", required, description, fallback);
const choice = (name: string, choices: readonly string[], description: string, fallback: string): ModelOptionDescriptor =>
  option(name, choices.map((c) => JSON.stringify(c)).join(" or "), false, description, fallback, { kind: "choice", choices: Object.freeze([...choices]) });
const fittable = (name: string, description: string, fallback: number): ModelOptionDescriptor =>
  option(name, '1, or "fitted"', false, description, fallback, { kind: "number-or-fitted" });
const flag = (name: string, description: string, fallback: boolean): ModelOptionDescriptor =>
  option(name, "true or false", false, description, fallback, { kind: "flag" });
const schedule = (name: string, description: string): ModelOptionDescriptor =>
  option(name, "[{ start (d), rate (m3/d) }]", true, description, undefined, { kind: "schedule" });

/** Options after checking, in base units. */
type Options = Readonly<Record<string, CheckedOption>>;
const num = (o: Options, name: string): number => o[name] as number;
const opt = (o: Options, name: string): number | undefined => (o[name] === undefined ? undefined : (o[name] as number));

interface GeometryEntry {
  readonly options: readonly ModelOptionDescriptor[];
  /** Builds the model from options already checked and converted to base units. */
  readonly build: (o: Options, where: string) => DrawdownModel;
  /** Options used to build the descriptor shown by describeModel (only the texts and parameters are read). */
  readonly example: Options;
}

/** Where the drawdown is observed in a layered model: a piezometer, or an observation screen. */
const OBSERVATION_OPTIONS = [
  length("piezometerDepth", false, "Depth z of a piezometer, m below the top of the aquifer (or give the observation screen)."),
  length("observationScreenTop", false, "Top z1 of the observation well's screen, m below the top of the aquifer."),
  length("observationScreenBottom", false, "Bottom z2 of the observation well's screen, m below the top of the aquifer."),
];

/** The screen options of the vertical-mode models; `thickness` names the aquifer's thickness option. */
function screenOptions(thickness: string, thicknessText: string, below: string, observation: "required" | "optional"): ModelOptionDescriptor[] {
  const obsNote = observation === "optional" ? " Leave the observation options out to observe over the pumping screen's interval." : "";
  return [
    length(thickness, true, thicknessText),
    length("screenTop", true, `Top d of the pumping well's screen, m below ${below}.`),
    length("screenBottom", true, `Bottom l of the pumping well's screen, m below ${below}.${obsNote}`),
    ...OBSERVATION_OPTIONS,
    ratio("anisotropy", false, "Kz/Kr when known; when left out it is fitted as the parameter KzKr."),
  ];
}

const FINITE_WELL_OPTIONS = [
  length("wellRadius", true, "Effective radius rw of the screen or open hole, m; an observation at r = rw is the pumped well."),
  length("casingRadius", true, "Inside radius rc of the casing where the water level moves, m (0: no well-bore storage)."),
  fittable("skin", 'Dimensionless skin Sk >= 0 of a thin zone at the screen (Agarwal et al. 1970), or "fitted" to fit it as Sk.', 0),
];
const STEHFEST_OPTION = ratio("stehfestTerms", false, "Stehfest terms N of the inversion, even, 8 to 18.", 12);
const CONFINED_THICKNESS = "Thickness b of the aquifer, m.";
const WATER_TABLE_THICKNESS = "Initial saturated thickness b of the water-table aquifer, m (depths below the initial water table).";

function penetrationObservation(o: Options, where: string): PenetrationObservation {
  const observation = optionalObservation(o, where);
  if (observation !== undefined) return observation;
  throw new ModelInputError(
    `${where}: say where the drawdown is observed: piezometerDepth (m below the top of the aquifer), or ` +
      "observationScreenTop and observationScreenBottom for a screened observation well.",
  );
}

function optionalObservation(o: Options, where: string): PenetrationObservation | undefined {
  const screen = o.observationScreenTop !== undefined || o.observationScreenBottom !== undefined;
  if (o.piezometerDepth !== undefined && screen) {
    throw new ModelInputError(`${where}: give either piezometerDepth or observationScreenTop and observationScreenBottom, not both.`);
  }
  if (o.piezometerDepth !== undefined) return { depth: num(o, "piezometerDepth") };
  if (o.observationScreenTop !== undefined && o.observationScreenBottom !== undefined) {
    return { screenTop: num(o, "observationScreenTop"), screenBottom: num(o, "observationScreenBottom") };
  }
  if (screen) {
    throw new ModelInputError(`${where}: give both observationScreenTop and observationScreenBottom (m below the top of the aquifer) for an observation screen.`);
  }
  return undefined;
}

/** The screened-well geometry of the vertical-mode factories from checked options. */
function screened(o: Options, where: string, thickness: string, observationRequired: boolean) {
  const observation = observationRequired ? penetrationObservation(o, where) : optionalObservation(o, where);
  return {
    thickness: num(o, thickness),
    screenTop: num(o, "screenTop"),
    screenBottom: num(o, "screenBottom"),
    ...(observation === undefined ? {} : { observation }),
    ...(o.anisotropy === undefined ? {} : { anisotropy: num(o, "anisotropy") }),
    ...(o.stehfestTerms === undefined ? {} : { stehfestTerms: num(o, "stehfestTerms") }),
  };
}

function finiteWell(o: Options) {
  return { rw: num(o, "wellRadius"), rc: num(o, "casingRadius"), skin: (o.skin ?? 0) as number | "fitted" };
}

const STEPS_TEXT = "The rate schedule of the test: [{ start (d since the first step), rate (m3/d) }], starts strictly increasing.";
const PAPADOPULOS_COOPER_OPTIONS = [
  length("casingRadius", true, "Inside radius rc of the casing where the water level moves, m."),
  length("wellRadius", true, "Effective radius rw of the screen or open hole, m; an observation at r = rw is the pumped well."),
  ratio("skin", false, "Dimensionless skin factor Sk >= 0 (Agarwal et al. 1970).", 0),
  STEHFEST_OPTION,
];
const papadopulosCooperFrom = (o: Options) =>
  papadopulosCooperModel({ rc: num(o, "casingRadius"), rw: num(o, "wellRadius"), skin: opt(o, "skin"), stehfestTerms: opt(o, "stehfestTerms") });
const PENETRATION_EXAMPLE = { aquiferThickness: 20, screenTop: 0, screenBottom: 10, piezometerDepth: 5 };
const EXAMPLE_STEPS: readonly ScheduleStep[] = [{ start: 0, rate: 500 }, { start: 0.1, rate: 1000 }];

const GEOMETRY: Readonly<Record<GeometryModelId, GeometryEntry>> = Object.freeze({
  neuman: {
    options: [length("saturatedThickness", true, "Initial saturated thickness b of the unconfined aquifer, m (sets beta = (Kz/Kr) r^2/b^2).")],
    build: (o) => neumanModel(num(o, "saturatedThickness")),
    example: { saturatedThickness: 10 },
  },
  "papadopulos-cooper": {
    options: PAPADOPULOS_COOPER_OPTIONS,
    build: papadopulosCooperFrom,
    example: { casingRadius: 0.1, wellRadius: 0.1 },
  },
  "hantush-partial-penetration": {
    options: [
      ...screenOptions("aquiferThickness", "Thickness b of the confined aquifer, m.", "the top of the aquifer", "required"),
      ratio("tolerance", false, "Bound on the series truncation error relative to W(u).", 1e-10),
    ],
    build: (o, where) => partialPenetrationModel({
      thickness: num(o, "aquiferThickness"),
      screenTop: num(o, "screenTop"),
      screenBottom: num(o, "screenBottom"),
      observation: penetrationObservation(o, where),
      ...(o.anisotropy === undefined ? {} : { anisotropy: num(o, "anisotropy") }),
      ...(o.tolerance === undefined ? {} : { tolerance: num(o, "tolerance") }),
    }),
    example: PENETRATION_EXAMPLE,
  },
  "hantush-leaky-partial-penetration": {
    options: [
      ...screenOptions("aquiferThickness", "Thickness b of the leaky aquifer, m.", "the top of the aquifer", "required"),
      ratio("tolerance", false, "Bound on the series truncation error relative to W(u, r/B).", 1e-10),
    ],
    build: (o, where) => hantushLeakyPartialPenetrationModel({
      thickness: num(o, "aquiferThickness"),
      screenTop: num(o, "screenTop"),
      screenBottom: num(o, "screenBottom"),
      observation: penetrationObservation(o, where),
      ...(o.anisotropy === undefined ? {} : { anisotropy: num(o, "anisotropy") }),
      ...(o.tolerance === undefined ? {} : { tolerance: num(o, "tolerance") }),
    }),
    example: PENETRATION_EXAMPLE,
  },
  "dougherty-babu": {
    options: [
      ...screenOptions("aquiferThickness", CONFINED_THICKNESS, "the top of the aquifer", "optional"),
      ...FINITE_WELL_OPTIONS,
      flag("leaky", "true for a leaky aquifer (an aquitard without storage, as Hantush-Jacob): adds the leakage factor B (m).", false),
      STEHFEST_OPTION,
    ],
    build: (o, where) => doughertyBabuModel({ ...screened(o, where, "aquiferThickness", false), ...finiteWell(o), leaky: o.leaky === true }),
    example: { aquiferThickness: 20, screenTop: 0, screenBottom: 10, wellRadius: 0.1, casingRadius: 0.1 },
  },
  "moench-water-table": {
    options: [
      ...screenOptions("saturatedThickness", WATER_TABLE_THICKNESS, "the initial water table", "optional"),
      ...FINITE_WELL_OPTIONS,
      choice("drainage", ["gradual", "instantaneous"], 'Drainage at the water table: "gradual" fits the drainage constant alpha (1/d); "instantaneous" is Neuman\'s condition.', "gradual"),
      STEHFEST_OPTION,
    ],
    build: (o, where) => moenchWaterTableModel({
      ...screened(o, where, "saturatedThickness", false),
      ...finiteWell(o),
      drainage: (o.drainage ?? "gradual") as "gradual" | "instantaneous",
    }),
    example: { saturatedThickness: 20, screenTop: 5, screenBottom: 15, wellRadius: 0.1, casingRadius: 0.1 },
  },
  "neuman-partial-penetration": {
    options: [...screenOptions("saturatedThickness", WATER_TABLE_THICKNESS, "the initial water table", "required"), STEHFEST_OPTION],
    build: (o, where) => {
      const g = screened(o, where, "saturatedThickness", true);
      return neumanPartialPenetrationModel({ ...g, observation: g.observation! });
    },
    example: { saturatedThickness: 20, screenTop: 5, screenBottom: 15, piezometerDepth: 10 },
  },
  "moench-double-porosity": {
    options: [
      ...screenOptions("aquiferThickness", CONFINED_THICKNESS, "the top of the aquifer", "optional"),
      ...FINITE_WELL_OPTIONS,
      choice("blockShape", ["slab", "sphere"], "Shape of the matrix blocks.", "slab"),
      fittable("fractureSkin", 'Fracture skin sf >= 0 of the block faces (Moench 1984), or "fitted" to fit it as sf.', 0),
      STEHFEST_OPTION,
    ],
    build: (o, where) => moenchDoublePorosityModel({
      ...screened(o, where, "aquiferThickness", false),
      ...finiteWell(o),
      blockShape: (o.blockShape ?? "slab") as "slab" | "sphere",
      fractureSkin: (o.fractureSkin ?? 0) as number | "fitted",
    }),
    example: { aquiferThickness: 50, screenTop: 0, screenBottom: 25, wellRadius: 0.1, casingRadius: 0.1 },
  },
  "dupuit-thiem": {
    options: [length("saturatedThickness", true, "Undisturbed saturated thickness H of the unconfined aquifer above its base, m.")],
    build: (o) => dupuitThiemModel(num(o, "saturatedThickness")),
    example: { saturatedThickness: 20 },
  },
  "gringarten-fracture": {
    options: [
      length("halfLength", true, "Half-length xf of the vertical fracture, m; the fracture lies along the x axis of the well coordinates."),
      choice("conductivity", ["uniform-flux", "infinite-conductivity"], "Flow in the fracture: uniform flux along it, or infinite conductivity (approximation at x = 0.732 xf).", "uniform-flux"),
    ],
    build: (o) => gringartenFractureModel({ halfLength: num(o, "halfLength"), conductivity: (o.conductivity ?? "uniform-flux") as "uniform-flux" | "infinite-conductivity" }),
    example: { halfLength: 20 },
  },
  "jacob-lohman": {
    options: [
      length("wellRadius", true, "Effective radius rw of the well, m; at r = rw the model gives the well's discharge (m3/d)."),
      length("wellDrawdown", true, "Constant drawdown sw held in the well, m (for a flowing well the shut-in head above the outlet)."),
    ],
    build: (o) => jacobLohmanModel({ rw: num(o, "wellRadius"), drawdown: num(o, "wellDrawdown") }),
    example: { wellRadius: 0.1, wellDrawdown: 10 },
  },
  "kgs-slug": {
    options: [
      length("aquiferThickness", true, CONFINED_THICKNESS),
      length("screenTop", true, "Top d of the screen, m below the top of the aquifer."),
      length("screenBottom", true, "Bottom l of the screen, m below the top of the aquifer."),
      length("casingRadius", true, "Inside radius rc of the casing where the water level moves, m (> 0)."),
      length("wellRadius", true, "Radius rw of the screen (or of the gravel pack, if more permeable), m (> 0)."),
      ratio("anisotropy", false, "Kz/Kr when known; when left out it is fitted as the parameter KzKr."),
      fittable("skin", 'Thin-skin factor >= 0, or "fitted" to fit it as Sk.', 0),
    ],
    build: (o) => kgsSlugModel({
      thickness: num(o, "aquiferThickness"),
      screenTop: num(o, "screenTop"),
      screenBottom: num(o, "screenBottom"),
      rc: num(o, "casingRadius"),
      rw: num(o, "wellRadius"),
      ...(o.anisotropy === undefined ? {} : { anisotropy: num(o, "anisotropy") }),
      skin: (o.skin ?? 0) as number | "fitted",
    }),
    example: { aquiferThickness: 10, screenTop: 2, screenBottom: 5, casingRadius: 0.05, wellRadius: 0.1 },
  },
  "underdamped-slug": {
    options: [
      length("casingRadius", true, "Inside radius rc of the casing where the water level moves, m."),
      length("screenLength", true, "Length Ls of the screen, m."),
      ratio("lnReRw", true, "Bouwer-Rice shape factor ln(Re/rw) of the screen (aq.bouwerRiceLnReRw gives it)."),
    ],
    build: (o) => underdampedSlugModel({ rc: num(o, "casingRadius"), screenLength: num(o, "screenLength"), lnReRw: num(o, "lnReRw") }),
    example: { casingRadius: 0.05, screenLength: 3, lnReRw: 3 },
  },
  "theis+well-loss": {
    options: [schedule("steps", STEPS_TEXT)],
    build: (o) => stepDrawdownModel(theisModel, o.steps as readonly ScheduleStep[]),
    example: { steps: EXAMPLE_STEPS },
  },
  "papadopulos-cooper+well-loss": {
    options: [...PAPADOPULOS_COOPER_OPTIONS, schedule("steps", STEPS_TEXT)],
    build: (o) => stepDrawdownModel(papadopulosCooperFrom(o), o.steps as readonly ScheduleStep[]),
    example: { casingRadius: 0.1, wellRadius: 0.1, steps: EXAMPLE_STEPS },
  },
});

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

/** Where to go for a partially penetrating well in a leaky aquifer, for ids and options that ask for it. */
const LEAKY_PARTIAL_PENETRATION =
  'for a partially penetrating well in a leaky aquifer use "hantush-leaky-partial-penetration" (Hantush 1964), ' +
  '{ id: "hantush-leaky-partial-penetration", aquiferThickness, screenTop, screenBottom, piezometerDepth (or ' +
  "observationScreenTop and observationScreenBottom), anisotropy? }, whose parameters are T, S and B; or " +
  '"dougherty-babu" with leaky: true for a finite-diameter well with storage and skin.';

const PENETRATION_OPTIONS = new Set(["aquiferThickness", "screenTop", "screenBottom", "piezometerDepth", "observationScreenTop", "observationScreenBottom", "anisotropy"]);
const LEAKAGE_OPTIONS = new Set(["B", "leakageFactor", "leakance", "aquitardStorativity", "leaky"]);

function unknownModel(id: string): Error {
  const asked = String(id).toLowerCase();
  if (/leaky|hantush-?1964/.test(asked) && /partial|penetrat/.test(asked)) {
    return new UnknownModelError(id, modelIds, `Unknown model "${id}"; ${LEAKY_PARTIAL_PENETRATION}`);
  }
  const wellLoss = /^(.+)\+well-loss$/.exec(asked);
  if (wellLoss) {
    return new UnknownModelError(
      id,
      modelIds,
      `Unknown model "${id}": the step test with well loss is registered for "theis+well-loss" and "papadopulos-cooper+well-loss" only.`,
    );
  }
  return new UnknownModelError(id, modelIds);
}

function describeGiven(given: unknown): string {
  return JSON.stringify(given) ?? String(given);
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
    throw new ModelInputError(`${where}: option ${d.name} must be ${form}, got ${describeGiven(given)}.`);
  }
  if (!Number.isFinite(value)) throw new ModelInputError(`${where}: option ${d.name} is ${value}; it must be a finite number.`);
  return value;
}

function optionSchedule(where: string, d: ModelOptionDescriptor, given: unknown): readonly ScheduleStep[] {
  const form = `give ${d.name} as [{ start, rate }, ...] with start in d since the first step and rate in m3/d`;
  if (!Array.isArray(given) || given.length === 0) throw new ModelInputError(`${where}: option ${d.name} must be a non-empty list of steps; ${form}. Got ${describeGiven(given)}.`);
  const steps = given.map((step: unknown, i): ScheduleStep => {
    const s = step as { start?: unknown; rate?: unknown } | null;
    if (s === null || typeof s !== "object" || typeof s.start !== "number" || typeof s.rate !== "number" || !Number.isFinite(s.start) || !Number.isFinite(s.rate)) {
      throw new ModelInputError(`${where}: option ${d.name}, step ${i} is ${describeGiven(step)}; ${form}.`);
    }
    const extra = Object.keys(s).filter((k) => k !== "start" && k !== "rate");
    if (extra.length > 0) throw new ModelInputError(`${where}: option ${d.name}, step ${i} has ${extra.map((k) => JSON.stringify(k)).join(", ")}; a step has only start (d) and rate (m3/d).`);
    return Object.freeze({ start: s.start, rate: s.rate });
  });
  steps.forEach((s, i) => {
    if (i > 0 && !(s.start > steps[i - 1]!.start)) {
      throw new ModelInputError(`${where}: option ${d.name}, step ${i} starts at ${s.start} d, not after step ${i - 1} (${steps[i - 1]!.start} d); list the steps in time order without repeats.`);
    }
  });
  if (steps.filter((s) => s.rate > 0).length < 2) {
    throw new ModelInputError(`${where}: option ${d.name} has ${steps.filter((s) => s.rate > 0).length} pumping step(s); a step test with well loss needs at least two steps of different rates.`);
  }
  return Object.freeze(steps);
}

/** The checked value of one given option. */
function optionValue(where: string, d: ModelOptionDescriptor, given: unknown): CheckedOption {
  switch (d.kind ?? "number") {
    case "choice":
      if (typeof given !== "string" || !d.choices!.includes(given)) {
        throw new ModelInputError(`${where}: option ${d.name} is ${describeGiven(given)}; use ${d.choices!.map((c) => JSON.stringify(c)).join(" or ")}.`);
      }
      return given;
    case "flag":
      if (typeof given !== "boolean") throw new ModelInputError(`${where}: option ${d.name} is ${describeGiven(given)}; give true or false.`);
      return given;
    case "number-or-fitted":
      if (given === "fitted") return given;
      if (typeof given !== "number") throw new ModelInputError(`${where}: option ${d.name} must be a number or "fitted", got ${describeGiven(given)}.`);
      return optionNumber(where, d, given);
    case "schedule":
      return optionSchedule(where, d, given);
    default:
      return optionNumber(where, d, given);
  }
}

/** The id and the options of a spec, checked for shape (not yet against the model). */
function splitSpec(spec: ModelSpec): { id: string; given: Record<string, unknown> } {
  if (typeof spec === "string") return { id: spec, given: {} };
  if (spec === null || typeof spec !== "object" || typeof spec.id !== "string") {
    throw new ModelInputError(
      `a model is given by its id ("theis") or by { id, ...options } for a model bound to geometry ({ id: "neuman", saturatedThickness: 12 }); got ${describeGiven(spec)}.`,
    );
  }
  const { id, ...given } = spec;
  return { id, given };
}

/**
 * The model named by `spec`: a registered id ("theis"), or for a model bound to geometry the id with its
 * options, e.g. { id: "neuman", saturatedThickness: 12 } or { id: "papadopulos-cooper", casingRadius: 0.1,
 * wellRadius: { value: 6, unit: "in" } }. Lengths are numbers in m or { value, unit } (converted with the units
 * module); choices are words, flags true or false, schedules [{ start (d), rate (m3/d) }]. See
 * `describeModel(id).options` for each model's options.
 * @throws UnknownModelError naming the known ids (and, for leaky partial penetration, the model to use);
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
      throw new ModelInputError(`${where} takes no geometry options (it is for a fully penetrating well); ${LEAKY_PARTIAL_PENETRATION}`);
    }
    throw new ModelInputError(`${where} takes no options (got ${names.join(", ")}); give it by its id alone, "${id}".`);
  }
  const entry = GEOMETRY[id];
  if (id === "hantush-partial-penetration" && names.some((n) => LEAKAGE_OPTIONS.has(n))) {
    throw new ModelInputError(`${where} is for a confined aquifer (no leakage option; B is a fitted parameter of the leaky model); ${LEAKY_PARTIAL_PENETRATION}`);
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
  const values: Record<string, CheckedOption> = {};
  for (const o of entry.options) {
    if (given[o.name] !== undefined) values[o.name] = optionValue(where, o, given[o.name]);
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
    ...(model.notSuperposable === undefined ? {} : { notSuperposable: model.notSuperposable }),
    ...(model.directional === undefined ? {} : { directional: model.directional }),
  };
}

/**
 * A registered model's descriptor (name, source, assumptions, validity, cautions, parameters with units and
 * bounds) and the geometry options it takes. For models whose parameters depend on the options (KzKr fitted when
 * anisotropy is left out, Sk when the skin is "fitted", ...) the parameters listed are those of the example
 * geometry the registry keeps for each model.
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
