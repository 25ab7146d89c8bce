import { describe, it, expect } from "vitest";
import { readFileSync } from "node:fs";
import { seededRandom } from "../src/forecast/index.js";

// Reference: tests/fixtures/forecast/forecast.json, written by generate_forecast.py: a Python transcription of the
// published xoshiro128** and SplitMix64 reference algorithms (Blackman and Vigna; Steele, Lea and Flood 2014).
const fixture = JSON.parse(readFileSync(new URL("../../../tests/fixtures/forecast/forecast.json", import.meta.url), "utf8")) as {
  prng: { seed: number; uint32: number[]; uniform: number[] }[];
};

describe("seededRandom", () => {
  for (const ref of fixture.prng) {
    it(`produces the reference xoshiro128** integers and 53-bit uniforms for seed ${ref.seed}`, () => {
      const a = seededRandom(ref.seed);
      expect(ref.uint32.map(() => a.nextUint32())).toEqual(ref.uint32);
      const b = seededRandom(ref.seed);
      expect(ref.uniform.map(() => b.nextUniform())).toEqual(ref.uniform);
    });
  }

  it("gives bit-identical normal streams for the same seed and different ones for another seed", () => {
    const a = seededRandom(2024);
    const b = seededRandom(2024);
    const c = seededRandom(2025);
    const xa = Float64Array.from({ length: 1000 }, () => a.nextNormal());
    const xb = Float64Array.from({ length: 1000 }, () => b.nextNormal());
    const xc = Float64Array.from({ length: 1000 }, () => c.nextNormal());
    expect(Buffer.from(xa.buffer).equals(Buffer.from(xb.buffer))).toBe(true);
    expect(Buffer.from(xa.buffer).equals(Buffer.from(xc.buffer))).toBe(false);
  });

  it("draws standard normals: mean, variance and tail fraction within 5 Monte Carlo standard errors for 200 000 draws", () => {
    const N = 200000;
    const g = seededRandom(7);
    let sum = 0;
    let sum2 = 0;
    let above = 0;
    for (let i = 0; i < N; i++) {
      const z = g.nextNormal();
      sum += z;
      sum2 += z * z;
      if (z > 1.6448536269514722) above++;
    }
    const mean = sum / N;
    const variance = sum2 / N - mean * mean;
    // Standard errors: mean 1/sqrt(N), variance sqrt(2/N), tail fraction sqrt(p(1-p)/N) with p = 0.05 (the normal
    // 0.95 quantile 1.644854 from Abramowitz and Stegun 1964, table 26.1).
    expect(Math.abs(mean)).toBeLessThan(5 / Math.sqrt(N));
    expect(Math.abs(variance - 1)).toBeLessThan(5 * Math.sqrt(2 / N));
    expect(Math.abs(above / N - 0.05)).toBeLessThan(5 * Math.sqrt((0.05 * 0.95) / N));
  });

  it("refuses a seed that is not a safe integer", () => {
    expect(() => seededRandom(1.5)).toThrow(/seed is 1.5/);
  });
});
