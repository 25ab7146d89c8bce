/**
 * The checker for hand-typed numbers: numbers written in narrative prose that match no computed value, as a hint
 * for a reviewer (a quote that drifted from the fit, a figure from elsewhere). A number written with s
 * significant digits matches a computed value that rounds to it at s digits (sign ignored: prose says "falls by
 * 0.8" of a slope of −0.78). Computed values are those of every output (values, controls, table cells, numbers
 * inside text outputs, table text and column names, the extremes of chart data) and of the header (template parameters and
 * test information).
 *
 * Not checked, by rule: code spans and blocks, narrative references, link targets, whole numbers below 10
 * written without a decimal point (counts and ordinals), and years of citations (a whole number from 1800 to
 * 2099 after a capitalised name or "et al.").
 */
import { codeRanges } from "./references.js";
import type { CellOutput, DocumentHeader } from "./types.js";

/** A number as written in prose. */
export interface NarrativeNumber {
  /** The text as written ("3.5 × 10⁻⁴"). */
  text: string;
  /** Its value. */
  value: number;
  /** Significant digits written (trailing zeros of a whole number do not count). */
  significant: number;
  /** Offset in the narrative source. */
  offset: number;
}

const SUPERSCRIPT_DIGITS = "⁰¹²³⁴⁵⁶⁷⁸⁹";
const NUMBER = new RegExp(
  String.raw`(?<![\p{L}\p{N}_.\-−])([-−](?=\d))?(\d{1,3}(?:,\d{3})+|\d+)(\.\d+)?` +
    String.raw`(?:\s*[×x·]\s*10(?:\^\(?([-−]?\d+)\)?|([⁻]?[${SUPERSCRIPT_DIGITS}]+))|[eE]([-+]?\d+))?(?![\p{L}\p{N}_])`,
  "gu",
);
const CITATION_BEFORE = /(?:\p{Lu}[\p{L}'’-]+|al\.),?\s*\(?\s*$/u;

function superscriptValue(s: string): number {
  const sign = s.startsWith("⁻") ? -1 : 1;
  const digits = [...s.replace("⁻", "")].map((c) => SUPERSCRIPT_DIGITS.indexOf(c)).join("");
  return sign * Number(digits);
}

function blank(text: string, ranges: readonly [number, number][]): string {
  let out = text;
  for (const [a, b] of ranges) out = out.slice(0, a) + out.slice(a, b).replace(/[^\n]/g, " ") + out.slice(b);
  return out;
}

/** The numbers of a piece of plain text (output text, a table's text cell), without the prose exclusions. */
export function numbersInText(text: string): number[] {
  return [...text.matchAll(NUMBER)].map((m) => readMatch(m).value);
}

function readMatch(m: RegExpMatchArray): { value: number; significant: number; hasPower: boolean; power: number } {
  const negative = m[1] !== undefined;
  const whole = m[2]!.replace(/,/g, "");
  const fraction = m[3] ?? "";
  const power = m[4] !== undefined ? Number(m[4].replace("−", "-")) : m[5] !== undefined ? superscriptValue(m[5]) : m[6] !== undefined ? Number(m[6]) : 0;
  const hasPower = m[4] !== undefined || m[5] !== undefined || m[6] !== undefined;
  const mantissa = Number(`${whole}${fraction}`);
  let digits = (whole + fraction.slice(1)).replace(/^0+/, "");
  if (fraction === "") digits = digits.replace(/0+$/, "");
  return { value: (negative ? -1 : 1) * mantissa * 10 ** power, significant: Math.max(digits.length, 1), hasPower, power };
}

/** The numbers of a narrative source that the checker looks at (see the module note for what it skips). */
export function narrativeNumbers(source: string): NarrativeNumber[] {
  const skip: [number, number][] = [...codeRanges(source)];
  for (const m of source.matchAll(/\{=[^}\n]*\}?/g)) skip.push([m.index!, m.index! + m[0].length]);
  for (const m of source.matchAll(/\]\([^)\n]*\)/g)) skip.push([m.index!, m.index! + m[0].length]);
  for (const m of source.matchAll(/^\s*\[[^\]]+\]:\s*\S+.*$/gm)) skip.push([m.index!, m.index! + m[0].length]);
  const prose = blank(source, skip);
  const read = [...prose.matchAll(NUMBER)].map((m) => ({ m, ...readMatch(m) }));
  // "3.49 to 3.52 × 10⁻⁴": the power written once belongs to both numbers.
  for (let k = 0; k + 1 < read.length; k++) {
    const a = read[k]!;
    const b = read[k + 1]!;
    const between = prose.slice(a.m.index! + a.m[0].length, b.m.index!);
    if (!a.hasPower && b.hasPower && /^\s*(to|and|or|–|-)\s*$/.test(between)) {
      a.value *= 10 ** b.power;
      a.hasPower = true;
    }
  }
  const found: NarrativeNumber[] = [];
  for (const r of read) {
    const at = r.m.index!;
    const isWhole = r.m[3] === undefined && !r.hasPower;
    if (isWhole && Math.abs(r.value) < 10) continue;
    if (isWhole && r.value >= 1800 && r.value <= 2099 && CITATION_BEFORE.test(prose.slice(Math.max(0, at - 40), at))) continue;
    found.push({ text: r.m[0], value: r.value, significant: r.significant, offset: at });
  }
  return found;
}

/** Every number an analysis computed or declared: outputs by cell, and the header's parameters and test information. */
export function computedNumbers(outputsByCell: Readonly<Record<string, readonly CellOutput[]>>, header?: DocumentHeader): number[] {
  const values: number[] = [];
  const add = (v: unknown): void => {
    if (typeof v === "number" && Number.isFinite(v)) values.push(v);
    else if (typeof v === "string") for (const n of numbersInText(v)) values.push(n);
  };
  const walk = (v: unknown): void => {
    if (Array.isArray(v)) v.forEach(walk);
    else if (v !== null && typeof v === "object") Object.values(v).forEach(walk);
    else add(v);
  };
  for (const list of Object.values(outputsByCell)) {
    for (const o of list) {
      switch (o.type) {
        case "value":
          add(o.value);
          break;
        case "control":
          [o.value, o.default, o.min, o.max].forEach(add);
          break;
        case "table":
          o.rows.forEach((r) => r.forEach(add));
          o.columns.forEach((c) => add(c.name));
          if (o.title) add(o.title);
          break;
        case "text":
          add(o.text);
          break;
        case "chart":
          for (const d of o.summary.datasets) for (const f of d.fields) [f.min, f.max].forEach(add);
          break;
        case "json":
          walk(o.value);
          break;
        default:
          break;
      }
    }
  }
  if (header) {
    for (const p of header.parameters) [p.value, ...(p.range ?? [])].forEach(add);
    if (header.testInformation) walk(header.testInformation);
  }
  return values;
}

/** An index of computed numbers for matching: sorted magnitudes. */
export function numberIndex(values: readonly number[]): Float64Array {
  return Float64Array.from(values, Math.abs).sort();
}

/** True when some computed number rounds to `n` at its significant digits (magnitudes compared). */
export function matchesComputed(n: NarrativeNumber, index: Float64Array): boolean {
  const v = Math.abs(n.value);
  if (v === 0) return index.length > 0 && index[0] === 0;
  const place = Math.floor(Math.log10(v) + 1e-12) - n.significant + 1;
  const half = 0.5 * 10 ** place * (1 + 1e-9);
  const lo = v - half;
  let a = 0;
  let b = index.length;
  while (a < b) {
    const mid = (a + b) >> 1;
    if (index[mid]! < lo) a = mid + 1;
    else b = mid;
  }
  return a < index.length && index[a]! <= v + half;
}

/** The numbers of a narrative source that match no computed value. */
export function unmatchedNumbers(source: string, index: Float64Array): NarrativeNumber[] {
  return narrativeNumbers(source).filter((n) => !matchesComputed(n, index));
}
