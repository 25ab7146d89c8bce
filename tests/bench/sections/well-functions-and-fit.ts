/**
 * Benchmarks of the foundation beside scipy in the same time window: E1 over 1e6 log-spaced u in [1e-10, 50], a
 * 1,000-point Theis fit (the same data, start and tolerances on both sides), and the Hantush-Jacob W(u, r/B).
 * E1 and the fit are measured in interleaved rounds against the persistent scipy peer (peer/peer_server.py):
 * each round times one run here and one there, alternating which goes first, and the figure is the median of the
 * per-round ratios, with their spread, wall and CPU time. Each round's result is checked against the peer's.
 */
import { readFileSync } from "node:fs";
import { expint1, fitModel, hantushW, theisModel } from "@conebook/aquifer";
import { bestOf, logspace, measure, medianSample, pairedRounds, runPeer, type Measurement } from "../harness.js";
import type { PeerProcess } from "../python-peer.js";

interface FixtureWell { name: string; r: number; Q: number; t: number[]; s: number[] }
interface FixtureDataset { id: string; start: { T: number; S: number }; wells: FixtureWell[] }

function expectClose(label: string, value: number, reference: number, rel: number): void {
  if (!(Math.abs(value - reference) <= rel * Math.abs(reference))) {
    throw new Error(`${label}: ${value} differs from the peer's ${reference} by more than ${rel} relative`);
  }
}

const E1 = { n: 1_000_000, lo: 1e-10, hi: 50 };
const ROUNDS = 15;
const FIT_REPEATS = 5;

/** E1 and the Theis fit against the persistent peer, and Hantush W against the one-shot quadrature peer. */
export async function wellFunctionsAndFit(peer: PeerProcess | null, scipyVersion: string): Promise<Measurement[]> {
  const rows: Measurement[] = [];
  const u = logspace(E1.lo, E1.hi, E1.n);
  const e1Once = () =>
    measure(() => {
      let sum = 0;
      for (let i = 0; i < u.length; i++) sum += expint1(u[i]!);
      return sum;
    });
  for (let i = 0; i < 3; i++) e1Once(); // JIT warm-up: the figure is the steady-state cost
  let e1Sum = NaN;
  let peerE1Sum = NaN;
  const hereE1 = () => {
    const s = e1Once();
    e1Sum = s.result;
    return s;
  };
  const fixture = JSON.parse(readFileSync(new URL("../../fixtures/fit/theis-fits.json", import.meta.url), "utf8")) as { datasets: FixtureDataset[] };
  const dataset = fixture.datasets.find((d) => d.id === "thousand-point");
  if (!dataset) throw new Error("tests/fixtures/fit/theis-fits.json has no 'thousand-point' data set");
  const well = dataset.wells[0]!;
  const wells = [{ name: well.name, geometry: { r: well.r, Q: well.Q }, t: Float64Array.from(well.t), s: Float64Array.from(well.s) }];
  const fit = () => fitModel({ model: theisModel, wells, start: dataset.start, ftol: 1e-10, xtol: 1e-10, gtol: 1e-10 });
  for (let i = 0; i < 100; i++) fit(); // JIT warm-up
  let fitT = NaN;
  let peerT = NaN;
  const hereFit = () => {
    const s = measure(() => {
      let last = fit();
      for (let i = 1; i < FIT_REPEATS; i++) last = fit();
      return last;
    });
    fitT = s.result.parameters.find((p) => p.name === "T")!.estimate;
    return { wallMs: s.wallMs / FIT_REPEATS, cpuMs: s.cpuMs / FIT_REPEATS };
  };

  if (peer) {
    const peerE1 = async () => {
      const a = await peer.ask({ case: "e1", ...E1 });
      peerE1Sum = a.checksum as number;
      return { wallMs: a.wallMs as number, cpuMs: a.cpuMs as number };
    };
    await peerE1(); // the peer's warm-up round (grid made, code paths loaded)
    const e1 = await pairedRounds(ROUNDS, hereE1, peerE1);
    expectClose("E1 checksum", e1Sum, peerE1Sum, 1e-12);
    const here = medianSample(e1.here);
    const there = medianSample(e1.peer);
    rows.push({
      name: `E1(u), ${E1.n.toExponential(0)} log-spaced u in [${E1.lo}, ${E1.hi}]`,
      value: (here.wallMs * 1e6) / E1.n,
      cpu: (here.cpuMs * 1e6) / E1.n,
      unit: "ns/eval",
      peer: (there.wallMs * 1e6) / E1.n,
      peerCpu: (there.cpuMs * 1e6) / E1.n,
      peerName: `scipy ${scipyVersion} special.exp1, vectorised`,
      paired: e1.paired,
      target: { ratio: 0.25 },
      note: `at least 4x faster; checksum ${e1Sum.toPrecision(15)} agrees with the peer's to 1e-12; medians of ${ROUNDS} interleaved rounds`,
    });

    const peerFit = async () => {
      const a = await peer.ask({ case: "theis-fit", repeats: FIT_REPEATS });
      peerT = a.T as number;
      return { wallMs: a.wallMs as number, cpuMs: a.cpuMs as number };
    };
    await peerFit();
    const fits = await pairedRounds(ROUNDS, hereFit, peerFit);
    expectClose("Theis fit T", fitT, peerT, 1e-6);
    const fh = medianSample(fits.here);
    const fp = medianSample(fits.peer);
    rows.push({
      name: `Theis fit, ${well.t.length} points`,
      value: fh.wallMs,
      cpu: fh.cpuMs,
      unit: "ms",
      peer: fp.wallMs,
      peerCpu: fp.cpuMs,
      peerName: `scipy ${scipyVersion} least_squares lm`,
      paired: fits.paired,
      target: { ratio: 1 / 3 },
      note: `at least 3x faster; same data, start and tolerances (xtol = ftol = gtol = 1e-10), analytic Jacobians on both sides; T = ${fitT.toPrecision(10)} m2/d here, ${peerT.toPrecision(10)} on the peer; each round the mean of ${FIT_REPEATS} fits`,
    });
  } else {
    const e1 = medianSample(Array.from({ length: ROUNDS }, hereE1));
    const f = medianSample(Array.from({ length: ROUNDS }, hereFit));
    rows.push({ name: `E1(u), ${E1.n.toExponential(0)} log-spaced u in [${E1.lo}, ${E1.hi}]`, value: (e1.wallMs * 1e6) / E1.n, cpu: (e1.cpuMs * 1e6) / E1.n, unit: "ns/eval", target: { ratio: 0.25 } });
    rows.push({ name: `Theis fit, ${well.t.length} points`, value: f.wallMs, cpu: f.cpuMs, unit: "ms", target: { ratio: 1 / 3 } });
  }

  const hantushPeer = runPeer(["hantush"]);
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
      if (hantushPeer) expectClose("Hantush W checksum", sum, hantushPeer.hantush!.checksum as number, 1e-8);
    },
  );
  rows.push({
    name: "Hantush W(u, r/B), 100 u x 20 r/B",
    value: (hantushMs * 1e6) / (repeats * us.length * rbs.length),
    unit: "ns/eval",
    peer: hantushPeer ? (hantushPeer.hantush!.nsPerEvaluation as number) : undefined,
    peerName: "scipy quad of the integral",
    note: "best of 5 here; the peer (one-shot, tests/bench/peer/peer_bench.py) integrates the definition, so the ratio is not a like-for-like comparison",
  });
  return rows;
}
