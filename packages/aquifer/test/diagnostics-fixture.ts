/**
 * Typed access to tests/fixtures/diagnostics/diagnostics.json, written by
 * tests/fixtures/diagnostics/generate_diagnostics.py (mpmath 30 digits; scipy.stats.linregress).
 */
import { readFileSync } from "node:fs";

export interface LineReference {
  slope: number; intercept: number; slopeStandardError: number; interceptStandardError: number;
  rSquared: number; n: number; t975: number; low95: number; high95: number;
}
export interface DiagnosticsFixture {
  reference: string;
  theis: {
    T: number; S: number; Q: number; r: number; timeUnit: string; lengthUnit: string;
    times: number[]; drawdowns: number[]; logDerivative: number[];
  };
  barometric: {
    efficiency: number; levelUnit: string; pressureUnit: string; depthToWater: number[]; pressures: number[];
    levels: LineReference; differences: LineReference;
  };
  trend: {
    slope: number; timeUnit: string; valueUnit: string; pumpingStart: number; times: number[]; values: number[];
    preTestCount: number; fit: LineReference;
  };
}

export const diagnosticsFixture: DiagnosticsFixture = JSON.parse(
  readFileSync(new URL("../../../tests/fixtures/diagnostics/diagnostics.json", import.meta.url), "utf8"),
) as DiagnosticsFixture;

/** Relative difference |a - b| / |b|. */
export function relDiff(a: number, b: number): number {
  return Math.abs(a - b) / Math.abs(b);
}
