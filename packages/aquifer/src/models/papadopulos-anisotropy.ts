/**
 * Papadopulos (1965): drawdown around a well pumping at a constant rate from a confined aquifer that is
 * homogeneous but anisotropic in the horizontal plane, with principal transmissivities Tmax along the direction
 * theta (radians, counter-clockwise from the x axis) and Tmin across it:
 *
 *   s = Q / (4 pi sqrt(Txx Tyy - Txy^2)) W(u),   u = S (Txx y^2 + Tyy x^2 - 2 Txy x y) / (4 t (Txx Tyy - Txy^2)),
 *   Txx = Tmax cos^2 theta + Tmin sin^2 theta,  Tyy = Tmax sin^2 theta + Tmin cos^2 theta,
 *   Txy = (Tmax - Tmin) sin theta cos theta,
 *
 * with (x, y) the position of the observation point relative to the pumping well (m; ObservationGeometry.x, .y).
 * Fitting three or more wells in different directions determines Tmax, Tmin, theta and S; the tensor form is
 * Papadopulos's, the principal-axis parameters keep the tensor positive definite throughout a fit.
 * Source: Papadopulos, I.S. (1965). Nonsteady flow to a well in an infinite anisotropic aquifer. Proceedings of
 * the Dubrovnik Symposium on the Hydrology of Fractured Rocks, IASH Publication 73, 21-31.
 */
import { expint1 } from "../special/index.js";
import { checkParameters, outputArray } from "./checks.js";
import { ModelInputError } from "./errors.js";
import type { DrawdownModel, ObservationGeometry, ParameterDescriptor } from "./model.js";
import { storativityParameter } from "./parameters.js";
import { portableCos, portableSin } from "../numerics/portable-math.js";

const tMax: ParameterDescriptor = {
  name: "Tmax",
  label: "major principal transmissivity",
  unit: "m2/d",
  positive: true,
  bounds: [1e-4, 1e6],
  description: "Transmissivity along the principal direction theta.",
};
const tMin: ParameterDescriptor = {
  name: "Tmin",
  label: "minor principal transmissivity",
  unit: "m2/d",
  positive: true,
  bounds: [1e-4, 1e6],
  description: "Transmissivity across the principal direction.",
};
const theta: ParameterDescriptor = {
  name: "theta",
  label: "principal direction (radians from the x axis, counter-clockwise)",
  unit: "1",
  positive: false,
  bounds: [-2 * Math.PI, 2 * Math.PI],
  description: "Angle of the major principal axis from the x axis of the well coordinates, radians.",
};

/** Txx, Tyy, Txy (m2/d) of a principal-axis description (Tmax, Tmin in m2/d, theta in radians). */
export function transmissivityTensor(Tmax: number, Tmin: number, angle: number): { Txx: number; Tyy: number; Txy: number } {
  const c = portableCos(angle);
  const s = portableSin(angle);
  return { Txx: Tmax * c * c + Tmin * s * s, Tyy: Tmax * s * s + Tmin * c * c, Txy: (Tmax - Tmin) * s * c };
}

function position(name: string, g: ObservationGeometry): { x: number; y: number } {
  if (!(Number.isFinite(g.x) && Number.isFinite(g.y)) || (g.x === 0 && g.y === 0)) {
    throw new ModelInputError(
      `${name}: the observation point needs plan coordinates x and y (m, relative to the pumping well, not both 0); got x = ${g.x}, y = ${g.y}.`,
    );
  }
  if (!Number.isFinite(g.Q)) throw new ModelInputError(`${name}: pumping rate Q is ${g.Q} m3/d; it must be finite.`);
  return { x: g.x!, y: g.y! };
}

/** Papadopulos (1965) anisotropic model; parameters [Tmax (m2/d), Tmin (m2/d), theta (rad), S]. Drawdown in m, t in d. */
export const papadopulosAnisotropyModel: DrawdownModel = {
  id: "papadopulos-anisotropy",
  name: "Papadopulos (1965) horizontally anisotropic confined aquifer",
  source:
    "Papadopulos, I.S. (1965). Nonsteady flow to a well in an infinite anisotropic aquifer. Proceedings of the " +
    "Dubrovnik Symposium on the Hydrology of Fractured Rocks, IASH Publication 73, 21-31.",
  assumptions: [
    "The aquifer is confined, of uniform thickness and infinite extent, homogeneous but anisotropic in the " +
      "horizontal plane (a transmissivity tensor with principal values Tmax, Tmin).",
    "The well fully penetrates and pumps at a constant rate; its radius and storage are negligible.",
    "Observation points are given by plan coordinates (x, y) relative to the pumping well.",
  ],
  validity: [
    "All t > 0. Three or more observation wells on different rays from the pumping well are needed to determine " +
      "Tmax, Tmin and theta (wells on one ray, or on two opposite rays, leave the tensor undetermined).",
  ],
  cautions: [
    "Apparent anisotropy also arises from heterogeneity, a nearby boundary or partial penetration; check the " +
      "geology and the residuals of each well.",
    "theta and theta + pi are the same direction; Tmax and Tmin swap when theta turns by pi/2.",
  ],
  parameters: [tMax, tMin, theta, storativityParameter],
  directional: true,
  drawdown(p: ArrayLike<number>, g: ObservationGeometry, t: ArrayLike<number>, out?: Float64Array): Float64Array {
    checkParameters(papadopulosAnisotropyModel, p);
    const { x, y } = position(papadopulosAnisotropyModel.name, g);
    const { Txx, Tyy, Txy } = transmissivityTensor(p[0]!, p[1]!, p[2]!);
    const det = Txx * Tyy - Txy * Txy;
    const coef = g.Q / (4 * Math.PI * Math.sqrt(det));
    const uTimesT = (p[3]! * (Txx * y * y + Tyy * x * x - 2 * Txy * x * y)) / (4 * det);
    const result = outputArray(papadopulosAnisotropyModel.name, t.length, out);
    for (let i = 0; i < t.length; i++) {
      const ti = t[i]!;
      result[i] = ti > 0 && Number.isFinite(ti) ? coef * expint1(uTimesT / ti) : ti <= 0 ? 0 : Number.NaN;
    }
    return result;
  },
};

/**
 * Points of the transmissivity ellipse for a plot: the curve x^2/Tmax + y^2/Tmin = 1 in principal axes (radius
 * sqrt(T) in each direction, m/d^0.5), turned by theta, with `count` points (default 73, closed).
 */
export function transmissivityEllipse(Tmax: number, Tmin: number, angle: number, count = 73): { x: Float64Array; y: Float64Array } {
  if (!(Tmax > 0 && Tmin > 0)) throw new ModelInputError(`transmissivityEllipse: Tmax = ${Tmax}, Tmin = ${Tmin} m2/d; both must be > 0.`);
  const x = new Float64Array(count);
  const y = new Float64Array(count);
  const c = portableCos(angle);
  const s = portableSin(angle);
  for (let k = 0; k < count; k++) {
    const phi = (2 * Math.PI * k) / (count - 1);
    const a = Math.sqrt(Tmax) * portableCos(phi);
    const b = Math.sqrt(Tmin) * portableSin(phi);
    x[k] = a * c - b * s;
    y[k] = a * s + b * c;
  }
  return { x, y };
}
