/**
 * @conebook/kernel: runs a parsed Conebook document's cells in a QuickJS sandbox. No Node APIs here; the
 * Node entry (`@conebook/kernel/node`, src/node.ts) adds file reading, the browser entry (src/browser.ts)
 * loading the wasm from a URL.
 */
export { createKernel, type CellStart, type CellStatus, type Kernel, type KernelOptions, type ModuleLoader, type RunOptions, type RunProgress, type RunResult } from "./kernel.js";
export {
  DEFAULT_MEMORY_LIMIT_MB,
  DEFAULT_TIME_LIMIT_MS,
  HOST_HEAP_LIMIT_MB,
  HOST_RESERVE_MB,
  MAX_ELEMENTS_PER_CALL,
  MAX_FORECAST_VALUES,
  MAX_MEMORY_LIMIT_MB,
  MAX_PROXY_KEYS,
  MAX_STRING_LENGTH,
  MAX_TIME_LIMIT_MS,
  SANDBOX_BASE_MB,
  WATCHDOG_MARGIN_MS,
  WORK_CHECK_UNITS,
  limitsFor,
  type RunLimits,
} from "./limits.js";
export { abortMessage } from "./locations.js";
export { STACK_LIMIT_BYTES, Sandbox, type SandboxHooks, type SandboxOptions } from "./sandbox.js";
export { AQUIFER_API, BRIDGE_API, CHART_API, arg, fn, type BridgeArgument, type BridgeEntry } from "./bridge-api.js";
export { ArgumentError } from "./validators.js";
export { stripTypes, stripTypesCached, strippedFrom, CellSyntaxError, type StripCache, type StrippedCell, type StrippedForm } from "./strip-types.js";
export { parseDataTable, DataCellError, type DataTable, type HashedBytes, type ReadFile } from "./data-cells.js";
export { platformSha256, type Sha256 } from "./digest.js";
export { recordedControlValues, recordedRunSettings, type ControlRecord, type RecordedControl } from "./controls.js";
export * from "./charts/index.js";
export { referenceProblems, type ReferenceProblem } from "./reference-check.js";
export { DEFAULT_RTOL, checkDataPins, compareOutputs, numbersAgree, recordedOutputs, relativeDifference, type CompareOptions, type DifferenceKind, type OutputDifference, type PinCheck } from "./verify.js";
