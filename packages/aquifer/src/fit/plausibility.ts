/**
 * Plausibility notes on fitted parameters: an estimate far outside the range the trade usually meets for the
 * model's kind of aquifer, or drawdown larger than the saturated thickness, is stated as a sentence. These are
 * notes, never errors: real aquifers go beyond every typical range, but a value out there is more often a wrong
 * unit (a rate in US gallons read as m3/d shifts T and S by 3.785), a wrong distance or the wrong model.
 * Every range below is common practice, no source (values recalled from general hydrogeology texts, from memory).
 */
import type { DrawdownModel } from "../models/index.js";

/** A typical range of a parameter, base units, and what a value outside it often means. */
interface TypicalRange {
  readonly low: number;
  readonly high: number;
  readonly what: string;
  readonly below: string;
  readonly above: string;
}

const UNIT_HINT = "check the units of the rate, the distance and the drawdown (a rate in US gallons read as m3/d makes T and S 3.785 times too large)";

const TRANSMISSIVITY: TypicalRange = {
  low: 1,
  high: 2e4,
  what: "transmissivities of aquifers worth testing",
  below: `an aquitard or a poorly developed well, or ${UNIT_HINT}`,
  above: `karst or very coarse gravel, or ${UNIT_HINT}`,
};
const CONFINED_S: TypicalRange = {
  low: 1e-5,
  high: 5e-3,
  what: "storativities of confined aquifers",
  below: `a very stiff, thin aquifer, or ${UNIT_HINT}`,
  above: `a value more like a specific yield: the aquifer may be unconfined or leaky, or ${UNIT_HINT}`,
};
const SPECIFIC_YIELD: TypicalRange = {
  low: 0.01,
  high: 0.35,
  what: "specific yields of unconfined aquifers",
  below: "a test too short to reach gravity drainage, or a slowly draining unsaturated zone",
  above: "more than the porosity of most sediments; check the model and the data",
};
const ANISOTROPY: TypicalRange = {
  low: 1e-3,
  high: 1,
  what: "ratios Kz/Kr of layered sediments",
  below: "very strong layering, or a ratio the data do not determine",
  above: "vertical conductivity above horizontal, which layered sediments rarely show",
};

/** The typical ranges that apply to a model's parameters, by parameter name. */
function rangesFor(model: DrawdownModel): Record<string, TypicalRange> {
  const base = model.id.split("+")[0];
  if (base === "neuman") return { T: TRANSMISSIVITY, Sy: SPECIFIC_YIELD, KzKr: ANISOTROPY };
  if (base === "thiem") return { T: TRANSMISSIVITY };
  return { T: TRANSMISSIVITY, S: CONFINED_S, KzKr: ANISOTROPY };
}

function format(v: number): string {
  return Number(v.toPrecision(3)).toString();
}

/**
 * Notes on fitted estimates (base units, by parameter name) outside the typical range for the model's kind of
 * aquifer, and on the largest observed drawdown (m) against the model's saturated thickness when the model is
 * bound to one (Neuman: saturatedThickness; Hantush 1961: aquiferThickness). Each note says that its range is
 * common practice. Empty when nothing is out of the way.
 */
export function plausibilityNotes(model: DrawdownModel, estimates: Readonly<Record<string, number>>, largestDrawdown: number): string[] {
  const notes: string[] = [];
  const ranges = rangesFor(model);
  for (const d of model.parameters) {
    const range = ranges[d.name];
    const v = estimates[d.name];
    if (!range || v === undefined || !Number.isFinite(v)) continue;
    if (v < range.low || v > range.high) {
      const side = v < range.low ? range.below : range.above;
      notes.push(
        `Plausibility: ${d.name} = ${format(v)} ${d.unit === "1" ? "" : `${d.unit} `}is outside the ${range.what} usually met, ` +
          `${range.low} to ${range.high}${d.unit === "1" ? "" : ` ${d.unit}`} (common practice, no source): this may be ${side}.`,
      );
    }
  }
  const spec = (model as { spec?: Record<string, unknown> }).spec;
  const thickness = typeof spec?.saturatedThickness === "number" ? spec.saturatedThickness : typeof spec?.aquiferThickness === "number" ? spec.aquiferThickness : undefined;
  if (thickness !== undefined && Number.isFinite(largestDrawdown)) {
    if (largestDrawdown > thickness) {
      notes.push(
        `Plausibility: the largest drawdown, ${format(largestDrawdown)} m, exceeds the saturated thickness ${format(thickness)} m: the aquifer ` +
          "cannot be drawn down further than its thickness; check the thickness, the drawdown units and the static level.",
      );
    } else if (model.id.startsWith("neuman") && largestDrawdown > 0.1 * thickness) {
      notes.push(
        `Plausibility: the largest drawdown, ${format(largestDrawdown)} m, is more than 10 % of the saturated thickness ${format(thickness)} m, ` +
          "where the Neuman model's linearised water table starts to fail (common practice, no source); consider the Jacob (1944) correction.",
      );
    }
  }
  return notes;
}
