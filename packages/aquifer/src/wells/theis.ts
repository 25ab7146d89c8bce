import { expint1 } from "../special/index.js";
import { checkU } from "./validate.js";

/**
 * The Theis (1935) well function W(u) = E1(u) = ∫_u^∞ e^−y / y dy, dimensionless, for u = r²S/(4Tt) > 0.
 * Evaluated by the special-function module's expint1 (its accuracy is stated there). Underflows to 0 for u
 * above about 700.
 * @throws RangeError when u is not a finite number > 0.
 */
export function theisW(u: number): number {
  checkU("theisW", u);
  return expint1(u);
}

/**
 * dW/du of the Theis well function: −e^−u / u (the integrand at its lower limit). Dimensionless.
 * @throws RangeError when u is not a finite number > 0.
 */
export function theisWdU(u: number): number {
  checkU("theisWdU", u);
  return -Math.exp(-u) / u;
}
