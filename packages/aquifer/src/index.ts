/**
 * @conebook/aquifer: the public surface of the aquifer-analysis library.
 * Pure numerics: no DOM, no Node APIs. Each area re-exports its own public names.
 */
export * from "./units/index.js";
export * from "./special/index.js";
export * from "./numerics/index.js";
export * from "./wells/index.js";
export * from "./models/index.js";
export * from "./data/index.js";
export * from "./fit/index.js";
export * from "./corrections/index.js";
export * from "./diagnostics/index.js";
export * from "./steptest/index.js";
export * from "./slug/index.js";
export * from "./superposition/index.js";
export * from "./forecast/index.js";
export * from "./analysis/index.js";
