/**
 * Argument checks shared by the models. They run once per call (not per time step), so their cost is
 * negligible next to the well-function evaluations.
 */
import { ModelInputError } from "./errors.js";
import type { ModelDescriptor, ObservationGeometry } from "./model.js";

/** Checks that p has one finite value per descriptor parameter and that positive parameters are > 0. */
export function checkParameters(model: ModelDescriptor, p: ArrayLike<number>): void {
  const expected = model.parameters;
  if (p.length !== expected.length) {
    const names = expected.map((d) => d.name).join(", ");
    throw new ModelInputError(
      `${model.name}: expected ${expected.length} parameters (${names}) but got ${p.length}.`,
    );
  }
  for (let k = 0; k < expected.length; k++) {
    const d = expected[k]!;
    const v = p[k]!;
    if (!Number.isFinite(v) || (d.positive && !(v > 0))) {
      throw new ModelInputError(
        `${model.name}: parameter ${d.name} (${d.label}) is ${v} ${d.unit}; it must be a finite number` +
          (d.positive ? " greater than 0." : "."),
      );
    }
  }
}

/** Checks that the geometry has a finite r > 0 (m) and a finite Q (m3/d). */
export function checkGeometry(modelName: string, g: ObservationGeometry): void {
  if (!(Number.isFinite(g.r) && g.r > 0)) {
    throw new ModelInputError(
      `${modelName}: radial distance r is ${g.r} m; it must be a finite number greater than 0 ` +
        "(use the well radius for the pumped well).",
    );
  }
  if (!Number.isFinite(g.Q)) {
    throw new ModelInputError(`${modelName}: pumping rate Q is ${g.Q} m3/d; it must be a finite number.`);
  }
}

/** Checks that a scalar argument is finite and, when `positive`, greater than 0. */
export function checkScalar(where: string, name: string, value: number, unit: string, positive: boolean): void {
  if (!Number.isFinite(value) || (positive && !(value > 0))) {
    throw new ModelInputError(
      `${where}: ${name} is ${value}${unit === "1" ? "" : " " + unit}; it must be a finite number` +
        (positive ? " greater than 0." : "."),
    );
  }
}

/** Returns `out` after checking its length, or a new array of length n. */
export function outputArray(modelName: string, n: number, out?: Float64Array): Float64Array {
  if (out === undefined) return new Float64Array(n);
  if (out.length !== n) {
    throw new ModelInputError(
      `${modelName}: output array has length ${out.length} but there are ${n} times; pass an array of length ${n}.`,
    );
  }
  return out;
}
