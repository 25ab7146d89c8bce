/** Well functions: Theis W(u) and the Hantush-Jacob leaky W(u, r/B) with their derivatives. */
export { theisW, theisWdU } from "./theis.js";
export {
  hantushW,
  hantushWdU,
  hantushWdRB,
  hantushWByQuadrature,
  hantushWdRBByQuadrature,
} from "./hantush.js";
