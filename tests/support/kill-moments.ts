/**
 * What the kill tests of saving share (packages/cli/test/run-write.kill.test.ts, serve-save.kill.test.ts and the
 * soak tests/soak/save-kills.ts): seeded moments for the kills and the temporary files an atomic write leaves.
 */
import { readdir } from "node:fs/promises";

/** `count` seeded fractions in [0, 1) (a linear congruential generator, Numerical Recipes constants), 4 digits each. */
export function seededFractions(seed: number, count: number): number[] {
  let s = seed >>> 0;
  return Array.from({ length: count }, () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return (s % 10_000) / 10_000;
  });
}

/** The temporary files of atomic writes in `dir` (`FILE.tmp-<pid>-<hex>`, packages/cli/src/atomic-write.ts). */
export async function temporaries(dir: string): Promise<string[]> {
  return (await readdir(dir)).filter((f) => f.includes(".tmp-"));
}
