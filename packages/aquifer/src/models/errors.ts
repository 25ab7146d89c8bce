/**
 * Errors raised by the models when called with values they cannot work with. Each message names the
 * model, the offending value and what would fix it.
 */

/** A parameter, geometry or data value outside what a model accepts. */
export class ModelInputError extends RangeError {
  override readonly name = "ModelInputError";
}

/** A model id that is not in the registry. */
export class UnknownModelError extends Error {
  override readonly name = "UnknownModelError";
  /** The ids the registry does know, for a message or a suggestion list. */
  readonly knownIds: readonly string[];
  /** `message` replaces the default one where there is more to say (a method the library lacks, the nearest models). */
  constructor(id: string, knownIds: readonly string[], message?: string) {
    super(message ? `${message} Known models: ${knownIds.join(", ")}.` : `Unknown model "${id}". Known models: ${knownIds.join(", ")}.`);
    this.knownIds = knownIds;
  }
}
