/**
 * Benchmarks of the screened-well models (Dougherty-Babu 1984, Moench 1997, Neuman 1974 partial penetration),
 * the KGS slug model, a 200-point Dougherty-Babu fit and a 200-point transient step-test fit, each beside an
 * independent numpy/scipy peer (tests/bench/peer/methods_peer.py) measured in the same run on identical
 * inputs. The peer sums every series term directly, so the values agree to the accuracy of the library's tail
 * treatment and truncation (about 1e-6 relative), which each benchmark checks.
 */
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import {
  doughertyBabuModel,
  fitModel,
  fitStepDrawdown,
  gringartenFractureModel,
  kgsSlugModel,
  moenchDoublePorosityModel,
  papadopulosAnisotropyModel,
  transmissivityTensor,
  moenchWaterTableModel,
  neumanPartialPenetrationModel,
  stepDrawdownModel,
  theisModel,
  type DrawdownModel,
} from "@conebook/aquifer";
import { bestOf, logspace, runPythonPeer, type Measurement } from "../harness.js";
import { normalGenerator } from "../../support/seeded-noise.js";

const PEER_SCRIPT = fileURLToPath(new URL("../peer/methods_peer.py", import.meta.url));
type PeerOutput = Record<string, Record<string, unknown>>;

function runPeer(input: unknown): PeerOutput | null {
  const folder = mkdtempSync(join(tmpdir(), "conebook-methods-peer-"));
  try {
    const file = join(folder, "input.json");
    writeFileSync(file, JSON.stringify(input));
    return runPythonPeer(PEER_SCRIPT, [file]);
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
}

/** Invented site: a 20 m aquifer, screen 5-10 m below its top, piezometer at 12 m depth. */
const B = 20;
const SCREEN = { top: 5, bottom: 10 };
const T_POINTS = logspace(1e-4, 10, 200);

interface SeriesCase {
  readonly label: string;
  readonly model: DrawdownModel;
  readonly parameters: readonly number[];
  readonly r: number;
  readonly Q: number;
  readonly peerCase: Record<string, unknown>;
}

function vertical(observation: { zeta: number } | { zeta1: number; zeta2: number }) {
  return { b: B, zetaA: B - SCREEN.bottom, zetaB: B - SCREEN.top, observation };
}

function cases(): SeriesCase[] {
  const well = { rw: 0.1, rc: 0.1, skin: 1 };
  const screenObs = { zeta1: B - SCREEN.bottom, zeta2: B - SCREEN.top };
  const confined = { T: 120, S: 2e-4, kappa: 0.3, lambda: 0, Sy: 0, alpha: null };
  const water = { T: 150, S: 2e-3, kappa: 0.3, lambda: 0, Sy: 0.12, alpha: 20 };
  const db = doughertyBabuModel({ thickness: B, screenTop: SCREEN.top, screenBottom: SCREEN.bottom, ...well, anisotropy: 0.3, observation: { depth: 12 } });
  const moench = moenchWaterTableModel({ thickness: B, screenTop: SCREEN.top, screenBottom: SCREEN.bottom, ...well, anisotropy: 0.3, observation: { depth: 12 } });
  const neuman = neumanPartialPenetrationModel({ thickness: B, screenTop: SCREEN.top, screenBottom: SCREEN.bottom, anisotropy: 0.3, observation: { depth: 12 } });
  const kgs = kgsSlugModel({ thickness: 12, screenTop: 4, screenBottom: 6, rc: 0.025, rw: 0.05, anisotropy: 0.2 });
  const t = Array.from(T_POINTS);
  return [
    { label: "Dougherty-Babu pumped well", model: db, parameters: [120, 2e-4], r: 0.1, Q: 500, peerCase: { aquifer: confined, geometry: vertical(screenObs), well, Q: 500, pumped: true, r: 0.1, t } },
    { label: "Dougherty-Babu piezometer at 8 m", model: db, parameters: [120, 2e-4], r: 8, Q: 500, peerCase: { aquifer: confined, geometry: vertical({ zeta: B - 12 }), well, Q: 500, pumped: false, r: 8, t } },
    { label: "Moench (1997) pumped well", model: moench, parameters: [150, 2e-3, 0.12, 20], r: 0.1, Q: 500, peerCase: { aquifer: water, geometry: vertical(screenObs), well, Q: 500, pumped: true, r: 0.1, t } },
    { label: "Moench (1997) piezometer at 8 m", model: moench, parameters: [150, 2e-3, 0.12, 20], r: 8, Q: 500, peerCase: { aquifer: water, geometry: vertical({ zeta: B - 12 }), well, Q: 500, pumped: false, r: 8, t } },
    { label: "Neuman (1974) partial penetration, piezometer at 8 m", model: neuman, parameters: [150, 2e-3, 0.12], r: 8, Q: 500, peerCase: { aquifer: { ...water, alpha: null }, geometry: vertical({ zeta: B - 12 }), well: { rw: 0, rc: 0, skin: 0 }, Q: 500, pumped: false, r: 8, t } },
    {
      label: "KGS slug test",
      model: kgs,
      parameters: [6, 3e-5],
      r: 0.05,
      Q: 1,
      peerCase: { aquifer: { T: 6, S: 3e-5, kappa: 0.2, lambda: 0, Sy: 0, alpha: null }, geometry: { b: 12, zetaA: 6, zetaB: 8, observation: { zeta1: 6, zeta2: 8 } }, well: { rw: 0.05, rc: 0.025, skin: 0 }, Q: 1, pumped: true, slug: true, r: 0.05, t: Array.from(logspace(1e-6, 1e-2, 200)) },
    },
  ];
}

/** Models with closed-form peers: double porosity (full penetration), anisotropy and the fracture. */
function closedFormCases() {
  const tensor = transmissivityTensor(400, 90, 0.6);
  return [
    {
      label: "Moench (1984) double porosity, slab blocks, r = 20 m",
      model: moenchDoublePorosityModel({ thickness: 30, screenTop: 0, screenBottom: 30, anisotropy: 1, rw: 1e-3, rc: 0 }),
      parameters: [80, 1e-5, 5e-4, 2],
      geometry: { r: 20, Q: 300 },
      peerCase: { kind: "double-porosity", T: 80, S: 1e-5, Sm: 5e-4, rate: 2, Q: 300, r: 20 },
      peerName: "numpy + scipy.special.k0, line source, Stehfest N = 12",
      tolerance: 1e-6,
    },
    {
      label: "Papadopulos (1965) anisotropy",
      model: papadopulosAnisotropyModel,
      parameters: [400, 90, 0.6, 3e-4],
      geometry: { r: 39.05, Q: 1200, x: -30, y: -25 },
      peerCase: { kind: "anisotropy", ...tensor, S: 3e-4, Q: 1200, x: -30, y: -25 },
      peerName: "numpy + scipy.special.exp1",
      tolerance: 1e-12,
    },
    {
      label: "Gringarten (1974) uniform-flux fracture, pumped well",
      model: gringartenFractureModel({ halfLength: 15 }),
      parameters: [60, 2e-4],
      geometry: { r: 0.1, Q: 250 },
      peerCase: { kind: "fracture", T: 60, S: 2e-4, Q: 250, xf: 15 },
      peerName: "numpy + scipy.special exp1, erf",
      tolerance: 1e-12,
    },
  ];
}

/** The step test: an invented four-step schedule, 50 readings a step, seeded 4 mm noise. */
function stepData() {
  const steps = [{ start: 0, rate: 400 }, { start: 0.0833, rate: 700 }, { start: 0.1667, rate: 1000 }, { start: 0.25, rate: 1300 }];
  const t: number[] = [];
  steps.forEach((s, i) => {
    const end = i + 1 < steps.length ? steps[i + 1]!.start : 0.3333;
    for (const v of logspace(2e-4, end - s.start, 50)) t.push(s.start + v);
  });
  const truth = [250, 2e-4, 2e-7, 2.3];
  const clean = stepDrawdownModel(theisModel, steps).drawdown(truth, { r: 0.15, Q: 400 }, t);
  const normal = normalGenerator(20261203);
  return { steps, t, s: Array.from(clean, (v) => v + 0.004 * normal()), truth };
}

/**
 * The new-methods section of `npm run bench`: per-point drawdown (us) of each screened-well model and the KGS
 * slug model, and 200-point fits (ms), beside the numpy/scipy peer.
 * @throws Error when a result disagrees with the peer's beyond the stated tolerance.
 */
export function newMethodBenchmarks(): Measurement[] {
  const list = cases();
  const step = stepData();
  const stepStart = { T: 100, S: 1e-3, C: 1e-6, n: 2 };
  const peerInput: Record<string, unknown> = Object.fromEntries(list.map((c, i) => [`series-${i}`, { ...c.peerCase, repeats: 1 }]));
  const closed = closedFormCases();
  closed.forEach((c, i) => (peerInput[`closed-${i}`] = { ...c.peerCase, t: Array.from(T_POINTS), repeats: 5 }));
  peerInput["step-fit"] = { steps: step.steps, t: step.t, s: step.s, rw: 0.15, start: stepStart, repeats: 3 };
  const peer = runPeer(peerInput);
  const out: Measurement[] = [];
  list.forEach((c, i) => {
    const t = (c.peerCase.t as number[]) ?? Array.from(T_POINTS);
    let values: Float64Array = new Float64Array(0);
    const ms = bestOf(5, () => c.model.drawdown(c.parameters, { r: c.r, Q: c.Q }, t), (v) => {
      values = v;
      if (!v.every(Number.isFinite)) throw new Error(`${c.label}: drawdowns are not all finite`);
    });
    let note = "no peer: values checked finite only";
    if (peer) {
      const theirs = peer[`series-${i}`]!.values as number[];
      const top = Math.max(...theirs);
      let worst = 0;
      theirs.forEach((v, k) => {
        if (v > 1e-3 * top) worst = Math.max(worst, Math.abs(values[k]! / v - 1));
      });
      if (!(worst <= 5e-4)) throw new Error(`${c.label}: differs from the peer by ${worst.toExponential(2)} relative, more than 5e-4`);
      note = `agrees with the brute-force peer to ${worst.toExponential(1)} relative where s > 1e-3 of its largest value`;
    }
    out.push({
      name: `${c.label}, ${t.length} points`,
      value: (ms * 1e3) / t.length,
      unit: "us/point",
      peer: peer ? (peer[`series-${i}`]!.usPerPoint as number) : undefined,
      peerName: "numpy + scipy.special, every term summed",
      target: { absolute: 50 },
      note: `${note}; Stehfest N = 12, t over 5 log cycles`,
    });
  });

  closed.forEach((c, i) => {
    const t = Array.from(T_POINTS);
    let values: Float64Array = new Float64Array(0);
    const ms = bestOf(5, () => c.model.drawdown(c.parameters, c.geometry, t), (v) => {
      values = v;
      if (!v.every(Number.isFinite)) throw new Error(`${c.label}: drawdowns are not all finite`);
    });
    let note = "no peer: values checked finite only";
    if (peer) {
      const theirs = peer[`closed-${i}`]!.values as number[];
      let worst = 0;
      theirs.forEach((v, k) => (worst = Math.max(worst, Math.abs(values[k]! / v - 1))));
      if (!(worst <= c.tolerance)) throw new Error(`${c.label}: differs from the peer by ${worst.toExponential(2)}, more than ${c.tolerance}`);
      note = `agrees with the peer to ${worst.toExponential(1)} relative`;
    }
    out.push({
      name: `${c.label}, ${t.length} points`,
      value: (ms * 1e3) / t.length,
      unit: "us/point",
      peer: peer ? (peer[`closed-${i}`]!.usPerPoint as number) : undefined,
      peerName: c.peerName,
      target: { absolute: 50 },
      note,
    });
  });

  // A 200-point Dougherty-Babu fit (pumped well, T and S; anisotropy and skin fixed).
  const db = doughertyBabuModel({ thickness: B, screenTop: SCREEN.top, screenBottom: SCREEN.bottom, rw: 0.1, rc: 0.1, skin: 1, anisotropy: 0.3 });
  const fitT = Array.from(logspace(1e-3, 2, 200));
  const normal = normalGenerator(20261204);
  const fitS = Array.from(db.drawdown([120, 2e-4], { r: 0.1, Q: 500 }, fitT), (v) => v + 0.003 * normal());
  let dbSummary = "";
  const dbMs = bestOf(3, () => fitModel({ model: db, wells: [{ name: "PW", geometry: { r: 0.1, Q: 500 }, t: fitT, s: fitS }], start: { T: 60, S: 1e-3 } }), (r) => {
    if (!r.converged) throw new Error(`Dougherty-Babu fit did not converge (${r.convergence})`);
    dbSummary = r.parameters.map((p) => `${p.name} ${p.estimate.toPrecision(5)}`).join(", ") + ` (true T 120, S 2e-4); ${r.evaluations} evaluations`;
  });
  out.push({ name: "Dougherty-Babu fit, 200 points, 2 parameters", value: dbMs, unit: "ms", target: { absolute: 1000 }, note: `no peer (its brute-force series would take minutes); ${dbSummary}` });

  // Transient step-test fit.
  let stepSummary = "";
  const stepMs = bestOf(3, () => fitStepDrawdown({ aquifer: theisModel, steps: step.steps, wellRadius: 0.15, t: step.t, s: step.s, start: stepStart }), (r) => {
    if (!r.fit.converged) throw new Error(`step fit did not converge (${r.fit.convergence})`);
    const mine = Object.fromEntries(r.fit.parameters.map((p) => [p.name, p.estimate]));
    let worst = 0;
    if (peer) {
      const theirs = peer["step-fit"]!.estimate as Record<string, number>;
      for (const k of ["T", "S", "C", "n"]) worst = Math.max(worst, Math.abs(mine[k]! / theirs[k]! - 1));
      if (!(worst <= 1e-4)) throw new Error(`step fit: estimates differ from the peer's by ${worst.toExponential(2)}, more than 1e-4`);
    }
    stepSummary = `${r.fit.parameters.map((p) => `${p.name} ${p.estimate.toPrecision(5)}`).join(", ")} (true T 250, S 2e-4, C 2e-7, n 2.3)` +
      (peer ? `; agrees with the peer's estimates to ${worst.toExponential(1)}` : "");
  });
  out.push({
    name: `Transient step-test fit, ${step.t.length} points, 4 parameters`,
    value: stepMs,
    unit: "ms",
    peer: peer ? (peer["step-fit"]!.ms as number) : undefined,
    peerName: "scipy least_squares lm",
    target: { absolute: 1000 },
    note: stepSummary,
  });
  return out;
}
