/**
 * The resource limits of a run, defined once. The header may ask for a time and a memory limit
 * (`limits.cellTimeMs`, `limits.memoryMb`) up to the caps below; without them a run gets the defaults. The
 * validator refuses values over a cap, the kernel applies these values, its messages quote them, and
 * docs/format.md and docs/sandbox.md quote the same numbers (a test reads both files and checks them).
 */

/** Wall-clock limit per cell when the header sets none, ms. */
export const DEFAULT_CELL_TIME_LIMIT_MS = 10_000;
/** Largest wall-clock limit per cell a header may ask for, ms (10 minutes). */
export const MAX_CELL_TIME_LIMIT_MS = 600_000;
/** Sandbox memory limit of a run when the header sets none, MiB. */
export const DEFAULT_MEMORY_LIMIT_MB = 256;
/**
 * Largest sandbox memory limit a header may ask for, MiB. The sandbox is 32-bit WebAssembly whose memory can
 * grow to 2 GiB at most; 1024 MiB leaves room for the engine and the host's replies under that ceiling.
 */
export const MAX_MEMORY_LIMIT_MB = 1024;
