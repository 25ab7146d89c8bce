import { describe, expect, it } from "vitest";
import { ComputationStopped, FitInputError, fitModel, theisDrawdown, theisModel, type DrawdownModel } from "../src/index.js";

/** Theis whose drawdown throws the caller's stop, as a host's time budget does once its deadline has passed. */
function stoppingModel(): DrawdownModel {
  return Object.create(theisModel, {
    drawdown: { value: () => { throw new ComputationStopped("stopped at the caller's time limit"); } },
    jacobian: { value: undefined },
  }) as DrawdownModel;
}

describe("a caller's stop inside a fit", () => {
  const t = Float64Array.from({ length: 20 }, (_, i) => 0.001 * 1.5 ** i);
  const s = Float64Array.from(t, (ti) => theisDrawdown(300, 2e-4, 1000, 30, ti));
  const wells = [{ name: "OW-1", geometry: { r: 30, Q: 1000 }, t, s }];

  it("reaches the caller unchanged when it happens at the start values, not reworded as a model that cannot be evaluated", () => {
    let thrown: unknown;
    try {
      fitModel({ model: stoppingModel(), wells, start: { T: 100, S: 1e-4 } });
    } catch (e) {
      thrown = e;
    }
    expect(thrown).toBeInstanceOf(ComputationStopped);
    expect(thrown).not.toBeInstanceOf(FitInputError);
    expect((thrown as Error).message).toBe("stopped at the caller's time limit");
  });

  it("reaches the caller unchanged when it happens while start values are derived from the data", () => {
    expect(() => fitModel({ model: stoppingModel(), wells })).toThrow(ComputationStopped);
  });
});
