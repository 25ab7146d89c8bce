/** Numerical building blocks: complex arithmetic, adaptive quadrature, Laplace inversion, complex K0. */
export type { Complex } from "./complex.js";
export { complex, cadd, csub, cmul, cscale, cdiv, cabs, carg, cexp, clog, csqrt } from "./complex.js";
export type { IntegrateOptions, IntegrateResult } from "./quadrature.js";
export { integrate, integrateToInfinity, QuadratureError } from "./quadrature.js";
export type { KronrodPanel } from "./gaussKronrod.js";
export { kronrod15, kronrodErrorEstimate, KRONROD15_NODES, KRONROD15_WEIGHTS, GAUSS7_WEIGHTS } from "./gaussKronrod.js";
export { stehfest, stehfestCoefficients, STEHFEST_MIN_TERMS, STEHFEST_MAX_TERMS } from "./stehfest.js";
export type { DeHoogOptions } from "./deHoog.js";
export { deHoog } from "./deHoog.js";
export { besselK0Complex } from "./besselK0Complex.js";
export { portableCos, portableExp10, portablePow, portableSin } from "./portable-math.js";
export { ComputationStopped, isComputationStopped } from "./computation-stopped.js";
