/**
 * The time budget of a host call. The engine's interrupt cannot stop work on the host's side of the bridge, so a
 * long host function (a Monte Carlo forecast) calls `checkHostDeadline` between steps; past the cell's deadline it
 * throws HostTimeLimitError, which the sandbox turns into the cell's time-limit stop. Host calls are synchronous
 * and never nested, so the deadline of the call in progress is one module-level value.
 */
import { ComputationStopped, type DrawdownModel } from "@conebook/aquifer";

/** A host call reached the deadline of the cell that made it (a ComputationStopped, which library code passes on). */
export class HostTimeLimitError extends ComputationStopped {
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

/**
 * The model with the deadline checked before each evaluation of its drawdown and Jacobian, for host calls that
 * evaluate a model many times (fits: up to maxEvaluations plus profile intervals). Everything else is the model's
 * own (inherited), so results are unchanged; one evaluation is the margin past the deadline.
 */
export function deadlineCheckedModel<M extends DrawdownModel>(model: M, where: string): M {
  // Own properties defined over the inherited ones: registered models are frozen.
  const own: PropertyDescriptorMap = {
    drawdown: {
      value: (p: ArrayLike<number>, geometry: Parameters<DrawdownModel["drawdown"]>[1], t: ArrayLike<number>, out?: Float64Array) => {
        checkHostDeadline(where);
        return model.drawdown(p, geometry, t, out);
      },
    },
  };
  const jacobian = model.jacobian;
  if (jacobian) {
    own.jacobian = {
      value: (p: ArrayLike<number>, geometry: Parameters<DrawdownModel["drawdown"]>[1], t: ArrayLike<number>) => {
        checkHostDeadline(where);
        return jacobian.call(model, p, geometry, t);
      },
    };
  }
  return Object.create(model, own) as M;
}
