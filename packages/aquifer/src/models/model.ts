/**
 * The contract every drawdown model in the library meets. Fitting, forecasting, the docs and the viewer read
 * models only through this interface.
 *
 * Base units inside the library: length m, time d, discharge m3/d, transmissivity m2/d, hydraulic
 * conductivity m/d, leakance 1/d; storativity and other ratios dimensionless ("1"). Callers with other
 * units convert at the edges with the units module.
 */

/** One parameter of a model, stated in base units. */
export interface ParameterDescriptor {
  /** Key used in parameter records and fit results, e.g. "T". */
  readonly name: string;
  /** Trade name, e.g. "transmissivity". */
  readonly label: string;
  /** Base unit as a unit string of the units module: "m2/d", "1", "m", "1/d". */
  readonly unit: string;
  /** True when the parameter must be > 0; such parameters are fitted as ln(value). */
  readonly positive: boolean;
  /** Widest physically plausible range in base units; the default fitting bounds. */
  readonly bounds: readonly [number, number];
  /** One sentence for docs, completion and the viewer. */
  readonly description: string;
  /**
   * What a fitted estimate at a bound says about the aquifer, in words for a report (for example "leakage not
   * detected" for a leakage factor at its upper bound); absent where a bound has no such meaning.
   */
  readonly atBound?: { readonly lower?: string; readonly upper?: string };
}

/** What a model is, where it comes from and when it may be used. */
export interface ModelDescriptor {
  /** Stable identifier, e.g. "theis". */
  readonly id: string;
  /** Display name with author and year, e.g. "Theis (1935) confined aquifer". */
  readonly name: string;
  /** Full citation of the published solution. */
  readonly source: string;
  /** Conceptual assumptions, one per entry. */
  readonly assumptions: readonly string[];
  /** Where the solution is valid (ranges of u, r/B, time), one per entry. */
  readonly validity: readonly string[];
  /** Ways the model can mislead a design decision when misused. */
  readonly cautions: readonly string[];
  /** Parameters in the order used by parameter vectors. */
  readonly parameters: readonly ParameterDescriptor[];
  /**
   * Optional order constraints: each pair [a, b] of parameter names requires a < b (e.g. Neuman's elastic
   * storativity below the specific yield). Fitting enforces them.
   */
  readonly orderedParameters?: readonly (readonly [string, string])[];
  /**
   * Why the model's output cannot be superposed over rate changes or wells (absent when it can): a slug test's
   * normalized head, the discharge of a well held at a constant drawdown, a well loss that is not linear in Q.
   * Superposition (rate schedules, several wells, boundaries, forecasts) refuses such a model with this sentence.
   */
  readonly notSuperposable?: string;
  /**
   * True when the drawdown depends on the direction from the pumping well (geometry.x and geometry.y), not on
   * the distance r alone (horizontal anisotropy, a vertical fracture).
   */
  readonly directional?: boolean;
}

/** What a model needs to know about one observation point, in base units. */
export interface ObservationGeometry {
  /** Radial distance from the pumping well to the observation point, m (the well radius for the pumped well). */
  readonly r: number;
  /** Constant pumping rate, m3/d, positive for abstraction. */
  readonly Q: number;
  /**
   * Optional plan coordinates of the observation point, m, in the frame of a well scheme or boundary set
   * (read by the superposition models; plain radial models ignore them).
   */
  readonly x?: number;
  readonly y?: number;
}

/** A forward model: drawdown at one observation point as a function of time. */
export interface DrawdownModel extends ModelDescriptor {
  /**
   * Drawdown in m at elapsed times t (d since pumping started) for parameter vector p (descriptor order,
   * base units). Writes into `out` when given (length t.length) and returns it.
   */
  drawdown(p: ArrayLike<number>, geometry: ObservationGeometry, t: ArrayLike<number>, out?: Float64Array): Float64Array;
  /**
   * Optional analytic Jacobian: result[k][i] = d s(t_i) / d p_k, in m per base unit of parameter k.
   * Fitting uses it when present and finite differences otherwise.
   */
  jacobian?(p: ArrayLike<number>, geometry: ObservationGeometry, t: ArrayLike<number>): Float64Array[];
}
