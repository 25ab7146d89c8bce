/**
 * Resource limits of a run. The default and largest time and memory limits are the document format's
 * (@conebook/document, src/limits.ts: the one place they are defined); this module adds how the kernel applies
 * them. docs/sandbox.md states each of these values beside the test that holds it.
 */
import {
  DEFAULT_CELL_TIME_LIMIT_MS,
  DEFAULT_MEMORY_LIMIT_MB as DOCUMENT_DEFAULT_MEMORY_LIMIT_MB,
  MAX_CELL_TIME_LIMIT_MS,
  MAX_MEMORY_LIMIT_MB as DOCUMENT_MAX_MEMORY_LIMIT_MB,
  type DocumentHeader,
} from "@conebook/document";
import { MAX_MONTE_CARLO_VALUES } from "@conebook/aquifer";

/** Time limit per cell when the header sets none, ms (the format's default). */
export const DEFAULT_TIME_LIMIT_MS = DEFAULT_CELL_TIME_LIMIT_MS;
/** Largest time limit per cell a header may ask for, ms (the format's cap). */
export const MAX_TIME_LIMIT_MS = MAX_CELL_TIME_LIMIT_MS;
/** Memory limit of a run's sandbox when the header sets none, MiB (the format's default). */
export const DEFAULT_MEMORY_LIMIT_MB = DOCUMENT_DEFAULT_MEMORY_LIMIT_MB;
/** Largest memory limit a header may ask for, MiB (the format's cap). */
export const MAX_MEMORY_LIMIT_MB = DOCUMENT_MAX_MEMORY_LIMIT_MB;

/**
 * Most elements one call of an Array.prototype method may go through (2^24). A generic object can claim any
 * length up to 2^53 - 1 and a sparse array up to 2^32 - 1 at no memory cost, and the engine's interrupt is not
 * checked inside one builtin, so such a call would never return; 2^24 holes take about 0.3 to 0.45 s.
 */
export const MAX_ELEMENTS_PER_CALL = 2 ** 24;
/**
 * Work (about one element of a builtin, some 25 ns) between two checks of the deadline by the metered builtins:
 * QuickJS calls its interrupt handler only every 10,000 interpreter steps, so a loop of builtins that each take
 * milliseconds would otherwise be checked only every 10 to 100 s.
 */
export const WORK_CHECK_UNITS = 2 ** 20;
/** Most characters of one string in the sandbox (QuickJS's own cap, 2^30 - 1; checked by sandbox-attacks.test.ts). */
export const MAX_STRING_LENGTH = 2 ** 30 - 1;
/** Most keys a Proxy's ownKeys trap may return (the engine's duplicate check is quadratic: 10,000 keys take about 25 ms). */
export const MAX_PROXY_KEYS = 10_000;
/**
 * Length from which a string a cell passes to the host is first compared with the data tables' CSV texts: one that
 * is a table's text crosses as a reference to the host's own copy instead of as characters (about 3 ms for 30 MB).
 */
export const TEXT_REFERENCE_MIN_LENGTH = 4096;
/** WebAssembly memory the engine needs before a cell allocates anything (its initial memory), MiB. */
export const SANDBOX_BASE_MB = 16;
/**
 * WebAssembly memory kept above a run's memory limit for the host's replies and for a cell to fail cleanly, MiB.
 * The sandbox's memory cannot grow past SANDBOX_BASE_MB + memoryMb + HOST_RESERVE_MB; a run that grows past
 * SANDBOX_BASE_MB + memoryMb is stopped with the memory message.
 */
export const HOST_RESERVE_MB = 16;
/** How long after a cell's time limit the CLI's watchdog ends a run that the kernel did not stop, ms. */
export const WATCHDOG_MARGIN_MS = 1000;
/** JavaScript heap of the CLI's run worker (the host side of the bridge), MiB; past it the run is ended. */
export const HOST_HEAP_LIMIT_MB = 1024;
/** Most drawdown values (samples x points x times) one Monte Carlo forecast may compute; checked before any work. */
export const MAX_FORECAST_VALUES = MAX_MONTE_CARLO_VALUES;

/** The limits a run applies. */
export interface RunLimits {
  /** Wall-clock limit per cell, ms. */
  timeLimitMs: number;
  /** Memory limit of the sandbox, MiB. */
  memoryLimitMb: number;
}

function clamp(v: number | undefined, fallback: number, lo: number, hi: number): number {
  if (v === undefined || !Number.isFinite(v)) return fallback;
  return Math.min(hi, Math.max(lo, v));
}

/**
 * The limits for a document: its header's values, clamped to [1 ms, MAX_TIME_LIMIT_MS] and
 * [1 MiB, MAX_MEMORY_LIMIT_MB]; the defaults where the header gives none.
 */
export function limitsFor(header: Pick<DocumentHeader, "timeLimitMs" | "memoryLimitMb">): RunLimits {
  return {
    timeLimitMs: clamp(header.timeLimitMs, DEFAULT_TIME_LIMIT_MS, 1, MAX_TIME_LIMIT_MS),
    memoryLimitMb: clamp(header.memoryLimitMb, DEFAULT_MEMORY_LIMIT_MB, 1, MAX_MEMORY_LIMIT_MB),
  };
}
