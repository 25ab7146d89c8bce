import { describe, it, expect } from "vitest";
import { createObservationSeries, logResample } from "../src/data/index.js";
import type { ObservationSeries } from "../src/data/index.js";

/**
 * Invented logger records for observation well OB-2 of the Hollow Creek wellfield (25 m from PW-1,
 * 12 L/s). Drawdown follows a straight line in log t with a small deterministic ripple, so that every
 * reading is distinct; the shape is for the checks only.
 */
function loggerRecord(times: Float64Array): ObservationSeries {
  const drawdowns = times.map((t, i) => 0.3 + 0.25 * Math.log10(t) + 0.002 * Math.sin(i));
  return createObservationSeries({
    name: "OB-2",
    times,
    drawdowns,
    timeUnit: "s",
    lengthUnit: "m",
    radius: { value: 25, unit: "m" },
    pumpingRate: { value: 12, unit: "L/s" },
    metadata: { site: "Hollow Creek wellfield" },
  });
}

/** 100,000 readings every second from 1 s to 100,000 s: five decades, most readings in the last one. */
const fixedInterval = loggerRecord(Float64Array.from({ length: 100000 }, (_, i) => i + 1));
/** 100,000 readings spaced evenly in log t from 1 s to 100,000 s. */
const logSpaced = loggerRecord(Float64Array.from({ length: 100000 }, (_, i) => 10 ** ((5 * i) / 99999)));

function expectRealReadings(thinned: ObservationSeries, indices: Uint32Array, original: ObservationSeries): void {
  indices.forEach((index, k) => {
    expect(thinned.times[k]).toBe(original.times[index]);
    expect(thinned.drawdowns[k]).toBe(original.drawdowns[index]);
  });
}

describe("thinning a logger record on a log time axis", () => {
  it("keeps about pointsPerDecade readings per decade of a 100,000-reading fixed-interval record", () => {
    const { series, kept, removed, indices } = logResample(fixedInterval, { pointsPerDecade: 10 });
    // 5 decades x 10 bins, plus the last reading, which lies on the edge of a 51st bin; the first decade
    // at one reading a second leaves a few bins empty (e.g. none between 1.26 s and 1.58 s).
    expect(kept).toBeGreaterThanOrEqual(45);
    expect(kept).toBeLessThanOrEqual(51);
    expect(kept + removed).toBe(100000);
    expect(series.times.length).toBe(kept);
    expect(indices[0]).toBe(0);
    expect(indices[kept - 1]).toBe(99999);
    expect(series.times[0]).toBe(1);
    expect(series.times[kept - 1]).toBe(100000);
    for (let k = 1; k < kept; k++) expect(series.times[k]!).toBeGreaterThan(series.times[k - 1]!);
    expectRealReadings(series, indices, fixedInterval);
  });

  it("keeps exactly one reading per bin of a log-spaced record, plus the last reading", () => {
    const { kept, indices } = logResample(logSpaced, { pointsPerDecade: 10 });
    expect(kept).toBe(51);
    const bins = Array.from(indices, (i) => Math.floor(Math.log10(logSpaced.times[i]!) * 10 + 1e-9));
    expect(bins).toEqual(Array.from({ length: 51 }, (_, k) => k));
  });

  it("keeps in each inner bin the reading nearest the bin's centre in log t", () => {
    const { series, kept } = logResample(fixedInterval, { pointsPerDecade: 5 });
    for (let k = 1; k < kept - 1; k++) {
      const logT = Math.log10(series.times[k]!);
      const bin = Math.floor(logT * 5 + 1e-9);
      const centre = (bin + 0.5) / 5;
      // At one reading a second the neighbours are 1 s away; none of them is nearer the centre.
      for (const neighbour of [series.times[k]! - 1, series.times[k]! + 1]) {
        if (neighbour >= 1 && Math.floor(Math.log10(neighbour) * 5 + 1e-9) === bin) {
          expect(Math.abs(logT - centre)).toBeLessThanOrEqual(Math.abs(Math.log10(neighbour) - centre));
        }
      }
    }
  });

  it("passes over a single spike with the median method, where the nearest-centre reading may be the spike", () => {
    const times = Float64Array.from({ length: 1000 }, (_, i) => i + 1);
    const base = loggerRecord(times);
    const nearest = logResample(base, { pointsPerDecade: 4 });
    const spikeIndex = nearest.indices[5]!;
    const drawdowns = Float64Array.from(base.drawdowns);
    drawdowns[spikeIndex] = 5;
    const spiky = { ...base, drawdowns };
    expect(logResample(spiky, { pointsPerDecade: 4 }).series.drawdowns).toContain(5);
    const median = logResample(spiky, { pointsPerDecade: 4, method: "median" });
    expect(median.series.drawdowns).not.toContain(5);
    expectRealReadings(median.series, median.indices, spiky);
  });

  it("records the thinning in the metadata and leaves excluded readings as they were", () => {
    const withExcluded = { ...fixedInterval, excluded: [{ row: 2, time: 0, value: 0, reason: "reading at t = 0" }] };
    const { series } = logResample(withExcluded, { pointsPerDecade: 10 });
    expect(series.metadata["site"]).toBe("Hollow Creek wellfield");
    expect(series.metadata["thinning"]).toMatch(/^log-resampled to 10 per decade \(nearest-centre\): 4\d of 100000 readings kept, 999\d\d removed$/);
    expect(series.excluded).toEqual(withExcluded.excluded);
  });

  it("returns a short record unchanged", () => {
    const two = loggerRecord(Float64Array.from([1, 2]));
    expect(Array.from(logResample(two, { pointsPerDecade: 1 }).indices)).toEqual([0, 1]);
    const one = loggerRecord(Float64Array.from([3]));
    expect(logResample(one, { pointsPerDecade: 1 }).kept).toBe(1);
  });

  it("refuses a non-positive pointsPerDecade and times that break the series rule", () => {
    expect(() => logResample(fixedInterval, { pointsPerDecade: 0 })).toThrow(
      "pointsPerDecade is 0; give a positive number of readings per decade, e.g. 10",
    );
    const broken = { ...fixedInterval, times: Float64Array.from([1, 3, 2]), drawdowns: Float64Array.from([0, 0, 0]) };
    expect(() => logResample(broken, { pointsPerDecade: 10 })).toThrow("series 'OB-2': times[2] = 2 is not > 0 and after the previous time");
  });
});
