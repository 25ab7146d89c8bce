/**
 * The error a caller's checkpoint throws to stop a long computation (a host's time budget for one call). Library
 * code that turns failures of a computation into its own errors (a fit's "the model cannot be evaluated at the start
 * values") passes this one on unchanged, so the caller sees its own stop and not a failure of the model.
 */
export class ComputationStopped extends Error {
  override readonly name: string = "ComputationStopped";
}

/** True when `error` is a ComputationStopped (or a subclass), which must not be caught and reworded. */
export function isComputationStopped(error: unknown): error is ComputationStopped {
  return error instanceof ComputationStopped;
}
