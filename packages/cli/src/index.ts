/** @conebook/cli: the `conebook` command (src/cli.ts) and the report builder (src/report/). */
export { main, MAIN_HELP } from "./cli.js";
export { EXIT, InputError, UsageError } from "./errors.js";
export type { Io } from "./io.js";
export * from "./report/index.js";
