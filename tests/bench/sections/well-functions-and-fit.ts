/**
 * Benchmarks of the foundation: E1 over 1e6 log-spaced u, the Hantush-Jacob W(u, r/B), and a 1,000-point
 * Theis fit, each beside scipy measured in the same run (tests/bench/peer/peer_bench.py).
 */
import { readFileSync } from "node:fs";
import { expint1, fitModel, hantushW, theisModel } from "@conebook/aquifer";
import { bestOf, logspace, runPeer, type Measurement } from "../harness.js";

interface FixtureWell { name: string; r: number; Q: number; t: number[]; s: number[] }
interface FixtureDataset { id: string; start: { T: number; S: number }; wells: FixtureWell[] }


function expectClose(label: string, value: number, reference: number, rel: number): void {
  if (!(Math.abs(value - reference) <= rel * Math.abs(reference))) {
    throw new Error(`${label}: ${value} differs from the peer's ${reference} by more than ${rel} relative`);
  }
}

export function wellFunctionsAndFit(): Measurement[] {
  const peer = runPeer(["e1", "hantush", "theis-fit"]);

  const u = logspace(1e-8, 50, 1_000_000);
  let e1Sum = 0;
  const e1Ms = bestOf(
    7,
    () => {
      let sum = 0;
      for (let i = 0; i < u.length; i++) sum += expint1(u[i]!);
      e1Sum = sum;
      return sum;
    },
    (sum) => {
      if (peer) expectClose("E1 checksum", sum, peer.e1!.checksum as number, 1e-12);
      else if (!Number.isFinite(sum)) throw new Error("E1 checksum is not finite");
    },
  );

  const us = logspace(1e-6, 10, 100);
  const rbs = logspace(1e-3, 3, 20);
  const repeats = 100;
  const hantushMs = bestOf(
    5,
    () => {
      let sum = 0;
      for (let k = 0; k < repeats; k++) for (let i = 0; i < us.length; i++) for (let j = 0; j < rbs.length; j++) sum += hantushW(us[i]!, rbs[j]!);
      return sum / repeats;
    },
    (sum) => {
      if (peer) expectClose("Hantush W checksum", sum, peer.hantush!.checksum as number, 1e-8);
    },
  );

  const fixture = JSON.parse(readFileSync(new URL("../../fixtures/fit/theis-fits.json", import.meta.url), "utf8")) as { datasets: FixtureDataset[] };
  const dataset = fixture.datasets.find((d) => d.id === "thousand-point");
  if (!dataset) throw new Error("tests/fixtures/fit/theis-fits.json has no 'thousand-point' data set");
  const well = dataset.wells[0]!;
  const wells = [{ name: well.name, geometry: { r: well.r, Q: well.Q }, t: Float64Array.from(well.t), s: Float64Array.from(well.s) }];
  const fit = () => fitModel({ model: theisModel, wells, start: dataset.start, ftol: 1e-10, xtol: 1e-10, gtol: 1e-10 });
  for (let i = 0; i < 100; i++) fit(); // JIT warm-up: the figure is the steady-state cost of a fit
  const fitMs = bestOf(
    100,
    fit,
    (result) => {
      const T = result.parameters.find((p) => p.name === "T")!.estimate;
      if (peer) expectClose("Theis fit T", T, peer["theis-fit"]!.T as number, 1e-6);
    },
  );

  return [
    {
      name: "E1(u), 1e6 log-spaced u in [1e-8, 50]",
      value: (e1Ms * 1e6) / u.length,
      unit: "ns/eval",
      peer: peer ? (peer.e1!.nsPerEvaluation as number) : undefined,
      peerName: "scipy.special.exp1, vectorised",
      target: { ratio: 0.5 },
      note: `checksum ${e1Sum.toPrecision(15)} agrees with the peer's to 1e-12`,
    },
    {
      name: "Hantush W(u, r/B), 100 u x 20 r/B",
      value: (hantushMs * 1e6) / (repeats * us.length * rbs.length),
      unit: "ns/eval",
      peer: peer ? (peer.hantush!.nsPerEvaluation as number) : undefined,
      peerName: "scipy quad of the integral",
      target: { absolute: 1000 },
    },
    {
      name: `Theis fit, ${well.t.length} points`,
      value: fitMs,
      unit: "ms",
      peer: peer ? (peer["theis-fit"]!.ms as number) : undefined,
      peerName: "scipy least_squares lm",
      target: { ratio: 0.5 },
      note: "same data, start and tolerances (xtol = ftol = gtol = 1e-10), analytic Jacobians on both sides; best of 100 after 100 warm-up fits here, best of 20 for the peer",
    },
  ];
}
