/**
 * Special functions of the aquifer library: the exponential integral E1 (the Theis well function) and the
 * modified Bessel functions I0, I1, K0, K1 with their exponentially scaled forms. All dimensionless.
 */
export { expint1, expint1Scaled } from "./expint.js";
export {
  besselI0,
  besselI0e,
  besselI1,
  besselI1e,
  besselK0,
  besselK0e,
  besselK1,
  besselK1e,
} from "./bessel.js";
