import { kronrod15, kronrodErrorEstimate } from "./gaussKronrod.js";

/** Options of `integrate`. */
export interface IntegrateOptions {
  /** Absolute tolerance on the integral (default 1e-12). */
  readonly absTol?: number;
  /** Relative tolerance on the integral (default 1e-10). */
  readonly relTol?: number;
  /** Largest number of panels the interval may be split into (default 500). */
  readonly maxSubdivisions?: number;
}

/** What `integrate` returns. */
export interface IntegrateResult {
  /** The integral estimate (Kronrod sums over all panels). */
  readonly value: number;
  /** Estimated absolute error (QUADPACK-style, usually pessimistic for smooth integrands). */
  readonly errorEstimate: number;
  /** Number of integrand evaluations. */
  readonly evaluations: number;
}

/** Thrown when `integrate` cannot reach the requested tolerance; carries the best estimate reached. */
export class QuadratureError extends Error {
  override readonly name = "QuadratureError";
  constructor(
    message: string,
    readonly value: number,
    readonly errorEstimate: number,
    readonly evaluations: number,
  ) {
    super(message);
  }
}

interface Panel {
  readonly a: number;
  readonly b: number;
  readonly value: number;
  readonly error: number;
}

/**
 * ∫_a^b f(x) dx by globally adaptive G7-K15 Gauss-Kronrod quadrature (the strategy of QUADPACK's QAG:
 * bisect the panel with the largest error estimate until the sum of estimates is at most
 * max(absTol, relTol·|value|)). Infinite endpoints are mapped to a finite interval: [a, ∞) by x = a + t/(1 − t),
 * (−∞, b] by x = b − t/(1 − t), (−∞, ∞) by x = t/(1 − t²); the Kronrod nodes never touch the mapped end points,
 * so integrable endpoint singularities (ln x, x^−1/2) are handled by bisection toward them.
 * Not suited to oscillatory integrals over infinite ranges (∫ sin x / x), which converge only conditionally.
 * Reversed limits (b < a) give the negated integral. Units: those of f times those of x.
 * @throws RangeError for NaN limits, a non-finite integrand value or invalid options.
 * @throws QuadratureError when maxSubdivisions panels do not reach the tolerance.
 */
export function integrate(
  f: (x: number) => number,
  a: number,
  b: number,
  options: IntegrateOptions = {},
): IntegrateResult {
  const absTol = options.absTol ?? 1e-12;
  const relTol = options.relTol ?? 1e-10;
  const maxSubdivisions = options.maxSubdivisions ?? 500;
  if (Number.isNaN(a) || Number.isNaN(b)) {
    throw new RangeError(`integrate: the limits must be numbers, got a = ${a}, b = ${b}.`);
  }
  if (!(absTol >= 0) || !(relTol >= 0) || (absTol === 0 && relTol === 0)) {
    throw new RangeError(
      `integrate: absTol = ${absTol} and relTol = ${relTol}; both must be >= 0 and at least one > 0.`,
    );
  }
  if (!Number.isInteger(maxSubdivisions) || maxSubdivisions < 1) {
    throw new RangeError(`integrate: maxSubdivisions = ${maxSubdivisions}; use a positive integer.`);
  }
  if (a === b) return { value: 0, errorEstimate: 0, evaluations: 0 };
  if (b < a) {
    const r = integrate(f, b, a, options);
    return { value: -r.value, errorEstimate: r.errorEstimate, evaluations: r.evaluations };
  }
  if (a === -Infinity && b === Infinity) {
    return adaptive(mapped(f, (t) => t / (1 - t * t), (t) => (1 + t * t) / ((1 - t * t) * (1 - t * t))), -1, 1,
      absTol, relTol, maxSubdivisions);
  }
  if (b === Infinity) {
    return adaptive(mapped(f, (t) => a + t / (1 - t), (t) => 1 / ((1 - t) * (1 - t))), 0, 1,
      absTol, relTol, maxSubdivisions);
  }
  if (a === -Infinity) {
    return adaptive(mapped(f, (t) => b - t / (1 - t), (t) => 1 / ((1 - t) * (1 - t))), 0, 1,
      absTol, relTol, maxSubdivisions);
  }
  return adaptive(f, a, b, absTol, relTol, maxSubdivisions);
}

/**
 * ∫_a^∞ f(x) dx: `integrate(f, a, Infinity, options)`, named for readability at call sites.
 */
export function integrateToInfinity(
  f: (x: number) => number,
  a: number,
  options: IntegrateOptions = {},
): IntegrateResult {
  return integrate(f, a, Infinity, options);
}

/**
 * The integrand after a change of variable x = map(t), times dx/dt. Where the map reaches ±∞ in double
 * precision (only at the mapped end point) the contribution is taken as 0; a non-finite value elsewhere is
 * reported at the original x.
 */
function mapped(
  f: (x: number) => number,
  map: (t: number) => number,
  jacobian: (t: number) => number,
): (t: number) => number {
  return (t) => {
    const x = map(t);
    if (!Number.isFinite(x)) return 0;
    const fx = f(x);
    if (!Number.isFinite(fx)) {
      throw new RangeError(`The integrand returned ${fx} at x = ${x}; it must be finite on the whole interval.`);
    }
    const y = fx * jacobian(t);
    return Number.isFinite(y) ? y : 0;
  };
}

function adaptive(
  f: (x: number) => number,
  a: number,
  b: number,
  absTol: number,
  relTol: number,
  maxSubdivisions: number,
): IntegrateResult {
  const panels: Panel[] = [makePanel(f, a, b)];
  let evaluations = 15;
  for (;;) {
    let value = 0;
    let error = 0;
    let worst = 0;
    for (let i = 0; i < panels.length; i++) {
      const p = panels[i]!;
      value += p.value;
      error += p.error;
      if (p.error > panels[worst]!.error) worst = i;
    }
    if (error <= Math.max(absTol, relTol * Math.abs(value))) {
      return { value, errorEstimate: error, evaluations };
    }
    const p = panels[worst]!;
    const mid = 0.5 * (p.a + p.b);
    if (panels.length >= maxSubdivisions || !(mid > p.a && mid < p.b)) {
      const why =
        panels.length >= maxSubdivisions
          ? `after ${panels.length} panels (maxSubdivisions)`
          : `because the panel [${p.a}, ${p.b}] cannot be split further in double precision`;
      throw new QuadratureError(
        `integrate: the tolerance max(absTol = ${absTol}, relTol = ${relTol} · |value|) was not reached ${why}; ` +
          `value ≈ ${value} with estimated error ${error.toExponential(2)}, worst panel [${p.a}, ${p.b}] (in the mapped variable t when a limit is infinite). ` +
          `Loosen the tolerance, raise maxSubdivisions, or split the interval at a singularity.`,
        value,
        error,
        evaluations,
      );
    }
    panels[worst] = makePanel(f, p.a, mid);
    panels.push(makePanel(f, mid, p.b));
    evaluations += 30;
  }
}

function makePanel(f: (x: number) => number, a: number, b: number): Panel {
  const k = kronrod15(f, a, b);
  return { a, b, value: k.kronrod, error: kronrodErrorEstimate(k) };
}
