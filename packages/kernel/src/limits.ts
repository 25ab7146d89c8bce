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

/** Time limit per cell when the header sets none, ms (the format's default). */
export const DEFAULT_TIME_LIMIT_MS = DEFAULT_CELL_TIME_LIMIT_MS;
/** Largest time limit per cell a header may ask for, ms (the format's cap). */
export const MAX_TIME_LIMIT_MS = MAX_CELL_TIME_LIMIT_MS;
/** Memory limit of a run's sandbox when the header sets none, MiB (the format's default). */
export const DEFAULT_MEMORY_LIMIT_MB = DOCUMENT_DEFAULT_MEMORY_LIMIT_MB;
/** Largest memory limit a header may ask for, MiB (the format's cap). */
export const MAX_MEMORY_LIMIT_MB = DOCUMENT_MAX_MEMORY_LIMIT_MB;

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
