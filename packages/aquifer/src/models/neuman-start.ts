/**
 * Starting values for the Neuman (1974) model that put the two storativities the right way round: the elastic
 * storativity S from the early readings, the specific yield Sy from the late ones.
 *
 * Neuman's drawdown follows Theis with S at early time and Theis with S + Sy at late time (Neuman 1974; the
 * limits are checked in models-neuman.test.ts). So:
 * 1. T and S + Sy from the Cooper-Jacob line through the latest 40 % of the readings (the late Theis branch);
 * 2. S from the earliest 30 % of the readings: Theis with that T, S on a logarithmic grid from 1e-7 up to
 *    S + Sy (40 points), the smallest sum of squares wins;
 * 3. Sy = (S + Sy) - S, or 10 S when that is not larger than S (the record may not reach the late branch);
 * 4. Kz/Kr on a logarithmic grid across its bounds (16 points), the others held, over at most 32 readings.
 * Rough by design: they need only start a fit in the right basin. A fit started from the Cooper-Jacob line
 * alone gives S the late storativity, runs into the constraint S < Sy and stops there.
 */
import { theisDrawdown } from "./theis.js";
import { cooperJacobLine } from "./cooper-jacob.js";
import { ModelInputError } from "./errors.js";
import type { DrawdownModel, ObservationGeometry } from "./model.js";

const fmt = (v: number) => Number(v.toPrecision(3)).toString();

/**
 * Starting vector [T (m2/d), S, Sy, Kz/Kr] for a Neuman model (descriptor order T, S, Sy, KzKr) from drawdown s
 * (m) at times t (d) at one observation point, with notes. Method: see the module comment.
 * @throws ModelInputError with fewer than 8 usable readings.
 */
export function neumanStartingValues(
  model: DrawdownModel,
  geometry: ObservationGeometry,
  t: ArrayLike<number>,
  s: ArrayLike<number>,
): { values: Float64Array; notes: string[] } {
  const order = Array.from({ length: t.length }, (_, i) => i)
    .filter((i) => t[i]! > 0 && Number.isFinite(t[i]!) && Number.isFinite(s[i]!))
    .sort((a, b) => t[a]! - t[b]!);
  if (order.length < 8) {
    throw new ModelInputError(`startingValues for the Neuman model: ${order.length} usable readings; the early and late branches need at least 8.`);
  }
  const late = order.slice(Math.floor(order.length * 0.6));
  const line = cooperJacobLine(late.map((i) => t[i]!), late.map((i) => s[i]!), { r: geometry.r, Q: geometry.Q, iterate: false });
  const bounds = model.parameters.map((d) => d.bounds);
  const clamp = (k: number, v: number) => Math.min(Math.max(v, bounds[k]![0]), bounds[k]![1]);
  const T = clamp(0, line.T);
  const total = line.S;
  const early = order.slice(0, Math.max(3, Math.floor(order.length * 0.3)));
  let S = bounds[1]![0];
  let best = Infinity;
  const top = Math.max(Math.min(total, bounds[1]![1]), 2e-7);
  for (let k = 0; k < 40; k++) {
    const trial = Math.exp(Math.log(1e-7) + (k / 39) * (Math.log(top) - Math.log(1e-7)));
    let ssr = 0;
    for (const i of early) ssr += (theisDrawdown(T, trial, geometry.Q, geometry.r, t[i]!) - s[i]!) ** 2;
    if (ssr < best) {
      best = ssr;
      S = trial;
    }
  }
  S = clamp(1, S);
  const notes = [
    `T = ${fmt(T)} m2/d and S + Sy = ${fmt(total)} from the Cooper-Jacob line through the latest ${late.length} readings; ` +
      `S = ${fmt(S)} from Theis matched to the earliest ${early.length}.`,
  ];
  let Sy = total - S;
  if (!(Sy > S)) {
    Sy = 10 * S;
    notes.push(`The late line does not rise above the early storativity; Sy starts at 10 S = ${fmt(Sy)}: the record may not reach the late branch.`);
  }
  Sy = clamp(2, Math.max(Sy, S * 1.01));
  const sample = order.length <= 32 ? order : Array.from({ length: 32 }, (_, k) => order[Math.round((k * (order.length - 1)) / 31)]!);
  const times = sample.map((i) => t[i]!);
  let kappa = Math.sqrt(bounds[3]![0] * bounds[3]![1]);
  best = Infinity;
  for (let k = 0; k < 16; k++) {
    const trial = Math.exp(Math.log(bounds[3]![0]) + ((k + 0.5) / 16) * (Math.log(bounds[3]![1]) - Math.log(bounds[3]![0])));
    let ssr = 0;
    try {
      const model_s = model.drawdown([T, S, Sy, trial], geometry, times);
      sample.forEach((i, j) => (ssr += (model_s[j]! - s[i]!) ** 2));
    } catch {
      ssr = Infinity;
    }
    if (ssr < best) {
      best = ssr;
      kappa = trial;
    }
  }
  notes.push(`Sy = ${fmt(Sy)}; Kz/Kr = ${fmt(kappa)} from a 16-point search across its bounds with T, S and Sy held.`);
  return { values: Float64Array.of(T, S, Sy, kappa), notes };
}
