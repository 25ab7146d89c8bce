/**
 * Suggestions for unknown unit text when the dimension the caller expects is known (a rate, a length, a
 * transmissivity...): units of that dimension come first, so 'Mgal/d' for a rate suggests 'US MGD' and 'ML/d',
 * not 'MPa'. The spellings offered are the catalogue's units of that dimension and the compounds the trade
 * writes (common practice, no source).
 */
import { CATALOGUE } from "./catalogue.js";
import { DIMENSIONS, dimensionLabel, dimensionPhrase, sameDimension, type Dimension, type DimensionVector } from "./dimension.js";
import { UnitError } from "./errors.js";
import { editDistance } from "./suggest.js";

/** Compound spellings usual in the trade, by dimension (each parses to a unit of that dimension). */
const COMPOUNDS: Partial<Record<Dimension, readonly string[]>> = {
  discharge: ["m3/d", "m3/h", "m3/s", "L/s", "L/min", "ML/d", "US gal/min", "imp gal/min", "ft3/d"],
  transmissivity: ["m2/d", "m2/s", "ft2/d", "US gpd/ft", "imp gpd/ft", "cm2/s"],
  velocity: ["m/d", "m/s", "cm/s", "ft/d", "US gpd/ft2"],
  leakance: ["1/d", "1/s"],
  area: ["m2", "ft2", "km2"],
  volume: ["m3", "ft3"],
};

/** Candidate spellings of the dimension. */
function spellings(dimension: DimensionVector): string[] {
  const label = dimensionLabel(dimension);
  const atoms = CATALOGUE.filter((e) => sameDimension(e.dimension, dimension)).map((e) => e.symbols[0]!);
  return [...atoms, ...(label ? (COMPOUNDS[label] ?? []) : [])];
}

/**
 * A UnitError for `text`, which did not parse, suggesting the three spellings of `dimension` closest to it
 * (edit distance, case-insensitive), after the message of the original error.
 */
export function errorForDimension(text: string, dimension: DimensionVector | Dimension, original: UnitError): UnitError {
  const vector = typeof dimension === "string" ? DIMENSIONS[dimension] : dimension;
  const candidates = spellings(vector);
  if (candidates.length === 0) return original;
  const lower = text.toLowerCase();
  const ranked = candidates
    .map((c) => ({ c, d: editDistance(lower, c.toLowerCase()) - (/gal|gpm|gpd|mgd/i.test(text) && /gal|gpm|gpd|MGD/.test(c) ? 2 : 0) }))
    .sort((a, b) => a.d - b.d || a.c.localeCompare(b.c));
  const first = original.suggestions.filter((s) => candidates.includes(s));
  const suggestions = [...new Set([...first, ...ranked.map((r) => r.c)])].slice(0, 3);
  const base = original.message.replace(/ — did you mean .*\?$/, "");
  return new UnitError(`${base}; for ${dimensionPhrase(vector)} try ${suggestions.map((s) => `'${s}'`).join(", ")}`, suggestions);
}
