/**
 * One set of limit values: the defaults and caps of the cell time and sandbox memory are defined once
 * (packages/document/src/limits.ts); the validator, the kernel, its messages and the docs all say the same.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import {
  DEFAULT_CELL_TIME_LIMIT_MS,
  DEFAULT_MEMORY_LIMIT_MB,
  MAX_CELL_TIME_LIMIT_MS,
  MAX_MEMORY_LIMIT_MB,
  headerSchema,
  validateDocument,
  validateJsonSchema,
} from "@conebook/document";
import { createKernel, limitsFor, MAX_MEMORY_LIMIT_MB as KERNEL_MAX_MEMORY, MAX_TIME_LIMIT_MS as KERNEL_MAX_TIME } from "../src/index.js";
import { makeDoc } from "./helpers.js";

const doc = (name: string) => readFileSync(new URL(`../../../docs/${name}`, import.meta.url), "utf8");

describe("limit values", () => {
  it("are 10000 ms and 256 MiB by default, capped at 600000 ms and 1024 MiB", () => {
    expect([DEFAULT_CELL_TIME_LIMIT_MS, MAX_CELL_TIME_LIMIT_MS, DEFAULT_MEMORY_LIMIT_MB, MAX_MEMORY_LIMIT_MB]).toEqual([10000, 600000, 256, 1024]);
  });

  it("are the ones the kernel applies when the header sets none or asks for more than the cap", () => {
    expect(limitsFor({})).toEqual({ timeLimitMs: DEFAULT_CELL_TIME_LIMIT_MS, memoryLimitMb: DEFAULT_MEMORY_LIMIT_MB });
    expect(limitsFor({ timeLimitMs: 1e9, memoryLimitMb: 1e9 })).toEqual({ timeLimitMs: MAX_CELL_TIME_LIMIT_MS, memoryLimitMb: MAX_MEMORY_LIMIT_MB });
    expect([KERNEL_MAX_TIME, KERNEL_MAX_MEMORY]).toEqual([MAX_CELL_TIME_LIMIT_MS, MAX_MEMORY_LIMIT_MB]);
  });

  it("are the caps the validator and the header schema enforce", () => {
    const codes = (timeLimitMs: number, memoryLimitMb: number) =>
      validateDocument(makeDoc([], { timeLimitMs, memoryLimitMb })).map((d) => d.code);
    expect(codes(MAX_CELL_TIME_LIMIT_MS, MAX_MEMORY_LIMIT_MB)).toEqual([]);
    expect(codes(MAX_CELL_TIME_LIMIT_MS + 1, MAX_MEMORY_LIMIT_MB + 1)).toEqual(["limit-too-large", "limit-too-large"]);
    const raw = { conebook: 1, title: "t", seed: 1, limits: { cellTimeMs: MAX_CELL_TIME_LIMIT_MS + 1, memoryMb: MAX_MEMORY_LIMIT_MB + 1 } };
    expect(validateJsonSchema(headerSchema, raw).map((p) => p.message)).toEqual([
      `must be at most ${MAX_CELL_TIME_LIMIT_MS}`,
      `must be at most ${MAX_MEMORY_LIMIT_MB}`,
    ]);
  });

  it("are quoted by the time-limit message of a stopped cell", async () => {
    const r = await createKernel().runDocument(makeDoc(["for (;;) {}"], { timeLimitMs: 100 }));
    expect(r.outputs.c1![0]).toMatchObject({ type: "error", message: expect.stringContaining(`raise limits.cellTimeMs in the header (at most ${MAX_CELL_TIME_LIMIT_MS})`) });
  });

  it("are the ones docs/format.md states in its header table", () => {
    const format = doc("format.md");
    expect(format).toContain(`| \`limits.cellTimeMs\`| number > 0, <= ${MAX_CELL_TIME_LIMIT_MS} | no       | wall-clock limit per cell, ms (default ${DEFAULT_CELL_TIME_LIMIT_MS})`);
    expect(format).toMatch(new RegExp(`\\| \`limits\\.memoryMb\` +\\| number > 0, <= ${MAX_MEMORY_LIMIT_MB} +\\| no +\\| sandbox memory limit, MiB \\(default ${DEFAULT_MEMORY_LIMIT_MB}\\)`));
  });

  it("are the ones docs/sandbox.md states", () => {
    const sandbox = doc("sandbox.md");
    expect(sandbox).toContain(`default ${DEFAULT_CELL_TIME_LIMIT_MS} ms, header \`limits.cellTimeMs\` up to ${MAX_CELL_TIME_LIMIT_MS} ms`);
    expect(sandbox).toContain(`default ${DEFAULT_MEMORY_LIMIT_MB} MiB, header \`limits.memoryMb\` up to ${MAX_MEMORY_LIMIT_MB} MiB`);
    // No other figure for the same limits anywhere in the two files.
    for (const text of [sandbox, doc("format.md")]) {
      for (const m of text.matchAll(/cellTimeMs[^.\n]*?(?:up to|<=|at most) (\d+)/g)) expect(Number(m[1])).toBe(MAX_CELL_TIME_LIMIT_MS);
      for (const m of text.matchAll(/memoryMb[^.\n]*?(?:up to|<=|at most) (\d+)/g)) expect(Number(m[1])).toBe(MAX_MEMORY_LIMIT_MB);
    }
  });
});
