/**
 * Benchmarks of Boulton (1963), the Jacob-Lohman (1952) discharge, Hantush (1964) leaky partial penetration, the
 * underdamped slug model and the barometric response regression, each beside an independent numpy/scipy peer
 * (tests/bench/peer/classic_peer.py) measured in the same run on identical inputs, and 200-point fits of the first
 * three. Each benchmark checks its values against the peer's, so the work cannot be optimised away.
 */
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import {
  barometricResponse,
  boultonModel,
  fitModel,
  hantushLeakyPartialPenetrationModel,
  jacobLohmanModel,
  underdampedSlugModel,
  type DrawdownModel,
} from "@conebook/aquifer";
import { bestOf, logspace, runPythonPeer, type Measurement } from "../harness.js";
import { normalGenerator } from "../../support/seeded-noise.js";

const PEER_SCRIPT = fileURLToPath(new URL("../peer/classic_peer.py", import.meta.url));

function runPeer(input: unknown): Record<string, Record<string, unknown>> | null {
  const folder = mkdtempSync(join(tmpdir(), "conebook-classic-peer-"));
  try {
    const file = join(folder, "input.json");
    writeFileSync(file, JSON.stringify(input));
    return runPythonPeer(PEER_SCRIPT, [file]);
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
}

interface Case {
  readonly label: string;
  readonly model: DrawdownModel;
  readonly parameters: readonly number[];
  readonly geometry: { r: number; Q: number };
  readonly t: number[];
  readonly peer: Record<string, unknown>;
  readonly peerName: string;
  readonly tolerance: number;
  /** Parameters to start a 200-point fit from (none: no fit benchmark). */
  readonly fitStart?: Record<string, number>;
  readonly noise?: number;
}

function cases(): Case[] {
  const t = Array.from(logspace(1e-4, 10, 200));
  const leakyGeometry = { thickness: 20, screenTop: 0, screenBottom: 8, observation: { depth: 15 }, anisotropy: 0.3 };
  return [
    {
      label: "Boulton (1963), r = 15 m",
      model: boultonModel,
      parameters: [200, 1e-3, 0.1, 5],
      geometry: { r: 15, Q: 500 },
      t,
      peer: { kind: "boulton", T: 200, S: 1e-3, Sy: 0.1, alpha: 5, r: 15, Q: 500, t, repeats: 5 },
      peerName: "numpy + scipy.special.k0, Stehfest N = 16",
      // The 16 alternating weights (up to 1e9) amplify the rounding of the weights and of K0 to about 1e-7.
      tolerance: 1e-6,
      fitStart: { T: 100, S: 3e-3, Sy: 0.2, alpha: 1 },
      noise: 0.003,
    },
    {
      label: "Jacob-Lohman (1952) discharge at the well",
      model: jacobLohmanModel({ rw: 0.1, drawdown: 12 }),
      parameters: [80, 2e-4],
      geometry: { r: 0.1, Q: 1 },
      t,
      peer: { kind: "jacob-lohman", T: 80, S: 2e-4, rw: 0.1, sw: 12, t, repeats: 5 },
      peerName: "numpy + scipy.special k0e, k1e, Stehfest N = 14",
      tolerance: 1e-7,
      fitStart: { T: 30, S: 1e-3 },
      noise: 2,
    },
    {
      label: "Hantush (1964) leaky partial penetration, piezometer at 15 m",
      model: hantushLeakyPartialPenetrationModel(leakyGeometry),
      parameters: [200, 1e-4, 300],
      geometry: { r: 15, Q: 500 },
      t,
      peer: { kind: "leaky-penetration", T: 200, S: 1e-4, B: 300, Q: 500, b: 20, d: 0, l: 8, z: 15, KzKr: 0.3, r: 15, t, repeats: 1 },
      peerName: "scipy.integrate.quad of W(u, beta) per term",
      tolerance: 1e-8,
      fitStart: { T: 100, S: 1e-3, B: 1000 },
      noise: 0.003,
    },
    {
      label: "Underdamped slug test",
      model: underdampedSlugModel({ rc: 0.025, screenLength: 2, lnReRw: 2.8 }),
      parameters: [250, 9],
      geometry: { r: 1, Q: 1 },
      t: Array.from(logspace(1e-6, 5e-4, 200)),
      peer: { kind: "underdamped", K: 250, Le: 9, rc: 0.025, Ls: 2, lnReRw: 2.8, t: Array.from(logspace(1e-6, 5e-4, 200)), repeats: 5 },
      peerName: "numpy, closed form",
      tolerance: 1e-10,
    },
  ];
}

/** An invented hourly barometric record of 480 readings with a lagged response (seeded; for timing only). */
function barometricRecord() {
  const normal = normalGenerator(20270601);
  const n = 480;
  const times = Array.from({ length: n }, (_, i) => i / 24);
  const pressures: number[] = [];
  let p = 1013;
  for (let i = 0; i < n; i++) pressures.push((p += 0.35 * normal()) + 0.9 * Math.cos(2 * Math.PI * 2 * times[i]!));
  const kernel = [0.3, 0.12, 0.08, 0.05, 0.03, 0.02];
  const levels = pressures.map(() => 12);
  for (let i = 1; i < n; i++) {
    let d = 0;
    for (let k = 0; k < kernel.length && i - k >= 1; k++) d += (kernel[k]! * (pressures[i - k]! - pressures[i - k - 1]!) * 100) / 9806.65;
    levels[i] = levels[i - 1]! + d + 0.0005 * normal();
  }
  return { times, pressures, levels };
}

/**
 * The classic-models section of `npm run bench`: per-point values (us) beside the peer, 200-point fits (ms), and the
 * barometric response regression (ms) beside numpy.
 * @throws Error when a result disagrees with the peer's beyond the stated tolerance.
 */
export function classicModelBenchmarks(): Measurement[] {
  const list = cases();
  const brf = barometricRecord();
  const input: Record<string, unknown> = Object.fromEntries(list.map((c, i) => [`case-${i}`, c.peer]));
  input.brf = { kind: "brf", levels: brf.levels, pressures: brf.pressures, lags: 12, repeats: 5 };
  const peer = runPeer(input);
  const out: Measurement[] = [];
  list.forEach((c, i) => {
    let values: Float64Array = new Float64Array(0);
    const ms = bestOf(5, () => c.model.drawdown(c.parameters, c.geometry, c.t), (v) => {
      values = v;
      if (!v.every(Number.isFinite)) throw new Error(`${c.label}: values are not all finite`);
    });
    let note = "no peer: values checked finite only";
    if (peer) {
      const theirs = peer[`case-${i}`]!.values as number[];
      const top = Math.max(...theirs.map(Math.abs));
      let worst = 0;
      theirs.forEach((v, k) => (worst = Math.max(worst, Math.abs(values[k]! - v) / top)));
      if (!(worst <= c.tolerance)) throw new Error(`${c.label}: differs from the peer by ${worst.toExponential(2)} of its largest value, more than ${c.tolerance}`);
      note = `agrees with the peer to ${worst.toExponential(1)} of the largest value`;
    }
    out.push({ name: `${c.label}, ${c.t.length} points`, value: (ms * 1e3) / c.t.length, unit: "us/point", peer: peer ? (peer[`case-${i}`]!.usPerPoint as number) : undefined, peerName: c.peerName, target: { absolute: 50 }, note });
  });
  list.forEach((c, i) => {
    if (!c.fitStart) return;
    const normal = normalGenerator(20270700 + i);
    const clean = c.model.drawdown(c.parameters, c.geometry, c.t);
    const s = Array.from(clean, (v) => v + c.noise! * normal());
    let summary = "";
    const ms = bestOf(3, () => fitModel({ model: c.model, wells: [{ name: "record", geometry: c.geometry, t: c.t, s }], start: c.fitStart }), (r) => {
      if (!r.converged) throw new Error(`${c.label}: the fit did not converge (${r.convergence})`);
      summary = r.parameters.map((p) => `${p.name} ${p.estimate.toPrecision(4)}`).join(", ") + ` (true ${c.model.parameters.map((d, k) => `${d.name} ${c.parameters[k]}`).join(", ")}); ${r.evaluations} evaluations`;
    });
    out.push({ name: `${c.label}: fit of 200 points, ${c.model.parameters.length} parameters`, value: ms, unit: "ms", target: { absolute: 1000 }, note: `no peer; ${summary}` });
  });
  let response: number[] = [];
  const ms = bestOf(5, () => barometricResponse({ times: brf.times, timeUnit: "d", levels: brf.levels, levelKind: "depth-to-water", levelUnit: "m", pressures: brf.pressures, pressureUnit: "hPa", lags: 12 }), (r) => {
    response = r.lags.map((l) => l.response);
  });
  let note = "no peer";
  if (peer) {
    const theirs = peer.brf!.values as number[];
    const worst = Math.max(...theirs.map((v, k) => Math.abs(v - response[k]!)));
    if (!(worst <= 1e-10)) throw new Error(`barometric response: differs from numpy by ${worst.toExponential(2)}`);
    note = `cumulative response agrees with numpy to ${worst.toExponential(1)}`;
  }
  out.push({ name: "Barometric response function, 480 readings, 13 lags", value: ms, unit: "ms", peer: peer ? (peer.brf!.usPerPoint as number) / 1e3 : undefined, peerName: "numpy.linalg.lstsq", note });
  return out;
}
