/**
 * Resource limits of a run: the header may ask for more (or less) than the defaults, up to fixed caps.
 */
import type { DocumentHeader } from "@conebook/document";

/** Time limit per cell when the header sets none, ms. */
export const DEFAULT_TIME_LIMIT_MS = 5000;
/** Largest time limit per cell a header may ask for, ms. */
export const MAX_TIME_LIMIT_MS = 60000;
/** Memory limit of a run's sandbox when the header sets none, MiB. */
export const DEFAULT_MEMORY_LIMIT_MB = 256;
/** Largest memory limit a header may ask for, MiB (the sandbox is 32-bit WebAssembly). */
export const MAX_MEMORY_LIMIT_MB = 1024;

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

/** The limits for a document: its header's values, clamped to [1 ms, 60000 ms] and [1 MiB, 1024 MiB]. */
export function limitsFor(header: Pick<DocumentHeader, "timeLimitMs" | "memoryLimitMb">): RunLimits {
  return {
    timeLimitMs: clamp(header.timeLimitMs, DEFAULT_TIME_LIMIT_MS, 1, MAX_TIME_LIMIT_MS),
    memoryLimitMb: clamp(header.memoryLimitMb, DEFAULT_MEMORY_LIMIT_MB, 1, MAX_MEMORY_LIMIT_MB),
  };
}
