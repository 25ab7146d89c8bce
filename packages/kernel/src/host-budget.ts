/**
 * The time budget of a host call. The engine's interrupt cannot stop work on the host's side of the bridge, so a
 * long host function (a Monte Carlo forecast) calls `checkHostDeadline` between steps; past the cell's deadline it
 * throws HostTimeLimitError, which the sandbox turns into the cell's time-limit stop. Host calls are synchronous
 * and never nested, so the deadline of the call in progress is one module-level value.
 */

/** A host call reached the deadline of the cell that made it. */
export class HostTimeLimitError extends Error {
  override readonly name = "HostTimeLimitError";
}

let deadline = Infinity;

/** Runs `call` with `until` (a Date.now() value) as the deadline that checkHostDeadline enforces. */
export function withHostDeadline<T>(until: number, call: () => T): T {
  const before = deadline;
  deadline = until;
  try {
    return call();
  } finally {
    deadline = before;
  }
}

/** Throws HostTimeLimitError when the host call in progress has run past its cell's deadline. */
export function checkHostDeadline(where: string): void {
  if (Date.now() > deadline) throw new HostTimeLimitError(`${where} was stopped at the cell's time limit`);
}

/** A checkpoint callback for a host function's long loops (see forecastDrawdown's `checkpoint`). */
export function hostCheckpoint(where: string): () => void {
  return () => checkHostDeadline(where);
}
