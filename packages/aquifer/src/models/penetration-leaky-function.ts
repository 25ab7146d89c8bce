/**
 * The Hantush-Jacob leaky well function W(u, beta) and its derivative in beta at the fixed cost that the
 * partial-penetration series needs: one call per series term, with beta = n pi r sqrt(Kz/Kr) / b growing with
 * n. Inside the ranges of wells/hantush.ts the library routines are used as they are; where those fall back
 * to adaptive quadrature (beta > 10 with both u and x = beta^2/(4u) above 3 and |sqrt(u) - sqrt(x)| > 1.5),
 * the Gaussian tail below is used instead.
 *
 * Tail route. With y = (beta/2) e^s and w = sqrt(2 beta) sinh(s/2) (wells/hantush.ts),
 * W = 2 e^-beta int_alpha^inf e^(-w^2) (w^2 + 2 beta)^(-1/2) dw, alpha = sqrt(u) - sqrt(x), and
 * alpha^2 = u + x - beta. Substituting w^2 = alpha^2 + E (derived here, not from a publication):
 *   2 e^-beta int_|alpha|^inf ... dw = e^-(u + x) I0,   I0 = int_0^inf e^-E ((a + E)(a + 2 beta + E))^(-1/2) dE,
 * a = alpha^2 >= 2.25, so W = e^-(u+x) I0 for alpha > 0 and W = 2 K0(beta) - e^-(u+x) I0 for alpha < 0;
 * likewise dW/dbeta = e^-(u+x) (1/beta - I1) or -2 K1(beta) + e^-(u+x) (1/beta + I1), with I1 the same
 * integral weighted by 1 + (a + E)/beta. I0 and I1 are Laplace-type integrals of functions whose nearest
 * singularity is at E = -a <= -2.25; a 30-point Gauss-Laguerre rule gives them to about 1e-13 relative
 * (penetration tests compare against the adaptive quadrature of wells/hantush.ts).
 */
import { besselK0, besselK1 } from "../special/index.js";
import { hantushW, hantushWdRB, hantushWdU } from "../wells/index.js";

const LAGUERRE_POINTS = 30;

/** Nodes and weights of the Gauss-Laguerre rule with weight e^-x on [0, inf), by Newton iteration on L_n. */
function gaussLaguerre(n: number): { nodes: Float64Array; weights: Float64Array } {
  const nodes = new Float64Array(n);
  const weights = new Float64Array(n);
  let z = 0;
  for (let i = 0; i < n; i++) {
    // Starting guesses of Numerical Recipes' gaulag (alf = 0), then Newton on the three-term recurrence.
    if (i === 0) z = 3 / (1 + 2.4 * n);
    else if (i === 1) z += 15 / (1 + 2.5 * n);
    else z += ((1 + 2.55 * (i - 1)) / (1.9 * (i - 1))) * (z - nodes[i - 2]!);
    let derivative = 0;
    let previous = 0;
    for (let iteration = 0; iteration < 100; iteration++) {
      let p1 = 1;
      let p2 = 0;
      for (let j = 1; j <= n; j++) {
        const p3 = p2;
        p2 = p1;
        p1 = ((2 * j - 1 - z) * p2 - (j - 1) * p3) / j;
      }
      previous = p2;
      derivative = (n * p1 - n * p2) / z;
      const step = p1 / derivative;
      z -= step;
      if (Math.abs(step) <= 1e-15 * Math.abs(z)) break;
    }
    nodes[i] = z;
    weights[i] = -1 / (derivative * n * previous);
  }
  return { nodes, weights };
}

const RULE = gaussLaguerre(LAGUERRE_POINTS);

function tailRoute(u: number, beta: number): boolean {
  if (!(beta > 10 && u > 3)) return false;
  const x = (beta * beta) / (4 * u);
  return x > 3 && Math.abs(Math.sqrt(u) - Math.sqrt(x)) > 1.5;
}

/** I0 (and I1 when asked) of the module comment for a = alpha^2, by the Gauss-Laguerre rule. */
function tailIntegrals(a: number, beta: number): { i0: number; i1: number } {
  let i0 = 0;
  let i1 = 0;
  for (let j = 0; j < LAGUERRE_POINTS; j++) {
    const e = RULE.nodes[j]!;
    const g = RULE.weights[j]! / Math.sqrt((a + e) * (a + 2 * beta + e));
    i0 += g;
    i1 += g * (1 + (a + e) / beta);
  }
  return { i0, i1 };
}

/**
 * Leaky well function W(u, beta) = int_u^inf exp(-y - beta^2/(4y)) / y dy (Hantush and Jacob 1955),
 * dimensionless, for u > 0 and beta >= 0; `hantushW` except in the tail regime of the module comment.
 */
export function penetrationLeakyW(u: number, beta: number): number {
  if (!tailRoute(u, beta)) return hantushW(u, beta);
  const x = (beta * beta) / (4 * u);
  const alpha = Math.sqrt(u) - Math.sqrt(x);
  const { i0 } = tailIntegrals(alpha * alpha, beta);
  const part = Math.exp(-(u + x)) * i0;
  return alpha > 0 ? part : 2 * besselK0(beta) - part;
}

/** dW/dbeta of the leaky well function (dimensionless); `hantushWdRB` except in the tail regime. */
export function penetrationLeakyWdBeta(u: number, beta: number): number {
  if (!tailRoute(u, beta)) return hantushWdRB(u, beta);
  const x = (beta * beta) / (4 * u);
  const alpha = Math.sqrt(u) - Math.sqrt(x);
  const { i1 } = tailIntegrals(alpha * alpha, beta);
  const e = Math.exp(-(u + x));
  return alpha > 0 ? e * (1 / beta - i1) : -2 * besselK1(beta) + e * (1 / beta + i1);
}

/** dW/du of the leaky well function: -exp(-u - beta^2/(4u)) / u, closed form (Hantush and Jacob 1955). */
export function penetrationLeakyWdU(u: number, beta: number): number {
  return hantushWdU(u, beta);
}
