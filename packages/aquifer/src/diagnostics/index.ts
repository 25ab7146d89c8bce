/**
 * Diagnostics of drawdown records: the Bourdet et al. (1989) log derivative for drawdown and recovery,
 * regime hints read from its shape, and T from a flat derivative level.
 */
export { DiagnosticError } from "./errors.js";
export { bourdetDerivative, bourdetRecoveryDerivative } from "./bourdet.js";
export type {
  BourdetOptions,
  DerivativeStencil,
  EndpointPolicy,
  LogDerivative,
  RecoveryData,
  RecoveryLogDerivative,
} from "./bourdet.js";
export { regimeHints } from "./regime-hints.js";
export type { RegimeHint, RegimeHintKind, RegimeHintOptions, RegimeHintResult } from "./regime-hints.js";
export { transmissivityFromDerivativeLevel } from "./transmissivity-from-level.js";
export { slopeHints, type SlopeHint, type SlopeHintKind, type SlopeHintOptions } from "./regime-slopes.js";
export { compositePlot, hornerPlot, powerTimePlot, type CompositeSeries, type SpecialisedPlot } from "./specialised-plots.js";
