/**
 * The registry of drawdown models by id. Docs, completion, the viewer and fitting look models up here.
 */
import { cooperJacobModel } from "./cooper-jacob.js";
import { UnknownModelError } from "./errors.js";
import { hantushAquitardStorageModel } from "./hantush-aquitard-storage.js";
import { hantushJacobModel } from "./hantush-jacob.js";
import type { DrawdownModel } from "./model.js";
import { theisModel } from "./theis.js";
import { thiemModel } from "./thiem.js";

/** Ids of the registered models. */
export type ModelId = "theis" | "cooper-jacob" | "hantush-jacob" | "hantush-aquitard-storage" | "thiem";

/** Every registered model, by id. */
export const models: Readonly<Record<ModelId, DrawdownModel>> = Object.freeze({
  theis: theisModel,
  "cooper-jacob": cooperJacobModel,
  "hantush-jacob": hantushJacobModel,
  "hantush-aquitard-storage": hantushAquitardStorageModel,
  thiem: thiemModel,
});

/** Ids of the registered models, in registry order. */
export const modelIds: readonly ModelId[] = Object.freeze(Object.keys(models) as ModelId[]);

/** True when `id` names a registered model. */
export function isModelId(id: string): id is ModelId {
  return Object.prototype.hasOwnProperty.call(models, id);
}

/**
 * The model registered under `id`.
 * @throws UnknownModelError naming the known ids when there is none.
 */
export function getModel(id: string): DrawdownModel {
  if (!isModelId(id)) throw new UnknownModelError(id, modelIds);
  return models[id];
}
