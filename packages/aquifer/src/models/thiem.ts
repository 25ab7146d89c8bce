/**
 * Thiem (1906): steady radial flow to a well pumping at a constant rate from a confined aquifer.
 *
 *   s(r) = Q / (2 pi T) ln(R / r),
 *
 * with R the radius of influence (the distance at which drawdown is zero). Between two observation points
 * the unknown R cancels: s1 - s2 = Q / (2 pi T) ln(r2 / r1).
 *
 * Source: Thiem, G. (1906). Hydrologische Methoden. J.M. Gebhardt, Leipzig.
 */
import { checkGeometry, checkParameters, checkScalar, outputArray } from "./checks.js";
import { ModelInputError } from "./errors.js";
import type { DrawdownModel, ObservationGeometry, ParameterDescriptor } from "./model.js";
import { transmissivityParameter } from "./parameters.js";

const TWO_PI = 2 * Math.PI;

/** Radius of influence R in m: where the steady cone of depression meets the undisturbed head. */
export const radiusOfInfluenceParameter: ParameterDescriptor = {
  name: "R",
  label: "radius of influence",
  unit: "m",
  positive: true,
  bounds: [0.1, 1e6],
  description: "Distance from the well at which steady drawdown is zero; must exceed every observation distance.",
};

/** Thiem steady-state model; parameter vector [T (m2/d), R (m)]. Drawdown does not depend on t. */
export const thiemModel: DrawdownModel = {
  id: "thiem",
  name: "Thiem (1906) steady state",
  source: "Thiem, G. (1906). Hydrologische Methoden. J.M. Gebhardt, Leipzig.",
  assumptions: [
    "The aquifer is confined, homogeneous, isotropic and of uniform thickness.",
    "Flow is steady: drawdown no longer changes with time anywhere within the radius of influence.",
    "The well pumps at a constant rate and fully penetrates the aquifer; flow to it is horizontal and radial.",
    "Head is fixed at the undisturbed level at distance R (a circular constant-head boundary).",
  ],
  validity: [
    "Observation distances r < R; the formula turns negative for r > R.",
    "Only once drawdown has stopped changing; in a Theis aquifer it never does, but the difference in " +
      "drawdown between two points becomes steady once u <= 0.01 at both (common practice, no source).",
  ],
  cautions: [
    "The model returns the same drawdown at every time, including t <= 0: it describes the steady state only.",
    "With one observation point, T and R are not separately determined (only ln(R/r)/T is); use two or more " +
      "distances, e.g. thiemTwoWells.",
    "R is not a property of the aquifer: in a transient system it grows with time, so a yield or drawdown " +
      "projection based on a fitted R holds only for the pumping duration that produced it.",
  ],
  parameters: [transmissivityParameter, radiusOfInfluenceParameter],

  drawdown(p: ArrayLike<number>, geometry: ObservationGeometry, t: ArrayLike<number>, out?: Float64Array): Float64Array {
    checkParameters(thiemModel, p);
    checkGeometry(thiemModel.name, geometry);
    const result = outputArray(thiemModel.name, t.length, out);
    result.fill((geometry.Q / (TWO_PI * p[0]!)) * Math.log(p[1]! / geometry.r));
    return result;
  },

  jacobian(p: ArrayLike<number>, geometry: ObservationGeometry, t: ArrayLike<number>): Float64Array[] {
    checkParameters(thiemModel, p);
    checkGeometry(thiemModel.name, geometry);
    const T = p[0]!;
    const R = p[1]!;
    const s = (geometry.Q / (TWO_PI * T)) * Math.log(R / geometry.r);
    // ds/dT = -s / T,  ds/dR = Q / (2 pi T R).
    return [new Float64Array(t.length).fill(-s / T), new Float64Array(t.length).fill(geometry.Q / (TWO_PI * T * R))];
  },
};

/**
 * Thiem steady drawdown in m at distance r (m) for T (m2/d), radius of influence R (m) and Q (m3/d).
 * Source: Thiem (1906).
 */
export function thiemDrawdown(T: number, R: number, Q: number, r: number): number {
  return thiemModel.drawdown([T, R], { r, Q }, [0])[0]!;
}

/**
 * Transmissivity in m2/d from steady drawdowns s1, s2 (m) at distances r1, r2 (m) from a well pumping
 * Q (m3/d): T = Q ln(r2/r1) / (2 pi (s1 - s2)). Source: Thiem (1906).
 *
 * @throws ModelInputError when a value is not finite, r1 = r2, s1 = s2, or the drawdowns do not decrease
 *   away from the well (which gives T <= 0).
 */
export function thiemTwoWells(Q: number, r1: number, s1: number, r2: number, s2: number): number {
  const where = "thiemTwoWells";
  checkScalar(where, "pumping rate Q", Q, "m3/d", false);
  checkScalar(where, "distance r1", r1, "m", true);
  checkScalar(where, "drawdown s1", s1, "m", false);
  checkScalar(where, "distance r2", r2, "m", true);
  checkScalar(where, "drawdown s2", s2, "m", false);
  if (r1 === r2) throw new ModelInputError(`${where}: both distances are ${r1} m; the two points must differ in r.`);
  if (s1 === s2) {
    throw new ModelInputError(`${where}: both drawdowns are ${s1} m; equal drawdowns at different r give no T.`);
  }
  const T = (Q * Math.log(r2 / r1)) / (TWO_PI * (s1 - s2));
  if (!(T > 0)) {
    throw new ModelInputError(
      `${where}: drawdown ${s1} m at r1 = ${r1} m and ${s2} m at r2 = ${r2} m do not decrease away from a well ` +
        `pumping Q = ${Q} m3/d (they give T = ${T.toPrecision(3)} m2/d); check the pairing of distances and drawdowns.`,
    );
  }
  return T;
}

/**
 * Radius of influence R = r exp(2 pi T s / Q) in m from transmissivity T (m2/d), steady drawdown s (m) at
 * distance r (m) and pumping rate Q (m3/d): the Thiem equation solved for R. Source: Thiem (1906).
 */
export function thiemRadiusOfInfluence(T: number, Q: number, r: number, s: number): number {
  const where = "thiemRadiusOfInfluence";
  checkScalar(where, "transmissivity T", T, "m2/d", true);
  checkScalar(where, "pumping rate Q", Q, "m3/d", false);
  checkScalar(where, "radial distance r", r, "m", true);
  checkScalar(where, "drawdown s", s, "m", false);
  if (Q === 0) throw new ModelInputError(`${where}: pumping rate Q is 0 m3/d; R is undefined without pumping.`);
  return r * Math.exp((TWO_PI * T * s) / Q);
}
