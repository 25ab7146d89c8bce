/**
 * Parsing unit text as the trade writes it ("m3/d", "L/s", "US gpm", "US gal/d/ft", "m^2/s", "ftH2O") into a
 * `Unit`: its dimension and its factor to the library's base units (m, d; pressure in Pa).
 *
 * Grammar, after trimming and collapsing whitespace:
 *   product  := term ( ("/" | "*" | "·" | " ") term )*      "/" divides by the next term only: a/b/c = a/(b·c)
 *   term     := factor exponent?
 *   factor   := symbol | "1" | "(" product ")"
 *   exponent := "^" [+-]? digits | digits | superscript digits (m², d⁻¹)
 * A symbol is matched longest first and must not run on into further letters, so "min" is not "m" + "in".
 * "", "-" and "1" are the dimensionless unit.
 */
import { CATALOGUE, AMBIGUOUS } from "./catalogue.js";
import type { CatalogueEntry } from "./catalogue.js";
import { DIMENSIONS, multiplyDimensions, divideDimensions, powerDimension } from "./dimension.js";
import type { DimensionVector } from "./dimension.js";
import { UnitError } from "./errors.js";
import { closeMatches } from "./suggest.js";

/** A unit: how it was written, its dimension and the value of one of it in base units. */
export interface Unit {
  readonly symbol: string;
  readonly dimension: DimensionVector;
  /** Value of 1 of this unit in the library's base units (m, d, Pa and their products). */
  readonly factor: number;
}

interface Scaled {
  readonly dimension: DimensionVector;
  readonly factor: number;
}

const ENTRY_BY_SYMBOL = new Map<string, CatalogueEntry>();
for (const entry of CATALOGUE) for (const symbol of entry.symbols) ENTRY_BY_SYMBOL.set(symbol, entry);
const SYMBOLS_LONGEST_FIRST = [...ENTRY_BY_SYMBOL.keys()].sort((a, b) => b.length - a.length);

const SUPERSCRIPT_DIGITS = "⁰¹²³⁴⁵⁶⁷⁸⁹";
const DIMENSIONLESS_SPELLINGS = new Set(["", "-", "−", "1"]);
const SEPARATOR_CHARS = " /*·()^";

/** Every symbol `parseUnit` accepts as a single unit, in catalogue order (compounds of them are accepted too). */
export function knownUnitSymbols(): readonly string[] {
  return [...ENTRY_BY_SYMBOL.keys()];
}

const cache = new Map<string, Unit>();

/**
 * Parse unit text into a Unit. Case-sensitive ("M" is not "m"); whitespace-tolerant ("m3 / d").
 * @throws UnitError naming the text, with close known symbols when there are any
 *   ("unknown unit 'gmp' — did you mean 'US gpm' or 'imp gpm'?").
 */
export function parseUnit(text: string): Unit {
  if (typeof text !== "string") {
    throw new UnitError(`a unit must be text such as 'm' or 'm3/d', got ${String(text)}`);
  }
  const cached = cache.get(text);
  if (cached !== undefined) return cached;
  const normalized = text.trim().replace(/\s+/g, " ");
  const scaled: Scaled = DIMENSIONLESS_SPELLINGS.has(normalized)
    ? { dimension: DIMENSIONS.dimensionless, factor: 1 }
    : new UnitParser(normalized).parseAll();
  const symbol = DIMENSIONLESS_SPELLINGS.has(normalized) ? "1" : normalized;
  const unit: Unit = Object.freeze({ symbol, dimension: scaled.dimension, factor: scaled.factor });
  cache.set(text, unit);
  return unit;
}

/** The Unit itself, or the parsed text. */
export function resolveUnit(unit: string | Unit): Unit {
  return typeof unit === "string" ? parseUnit(unit) : unit;
}

function product(a: Scaled, b: Scaled): Scaled {
  return { dimension: multiplyDimensions(a.dimension, b.dimension), factor: a.factor * b.factor };
}

function quotient(a: Scaled, b: Scaled): Scaled {
  return { dimension: divideDimensions(a.dimension, b.dimension), factor: a.factor / b.factor };
}

function power(a: Scaled, exponent: number): Scaled {
  return { dimension: powerDimension(a.dimension, exponent), factor: a.factor ** exponent };
}

function isLetter(char: string | undefined): boolean {
  return char !== undefined && /[A-Za-z]/.test(char);
}

function quoteList(items: readonly string[]): string {
  const quoted = items.map((item) => `'${item}'`);
  return quoted.length <= 1 ? quoted.join("") : `${quoted.slice(0, -1).join(", ")} or ${quoted[quoted.length - 1]}`;
}

/** Recursive-descent parser over one normalized unit text. */
class UnitParser {
  private readonly text: string;
  private pos = 0;

  constructor(text: string) {
    this.text = text;
  }

  parseAll(): Scaled {
    const result = this.parseProduct();
    if (this.pos < this.text.length) {
      throw new UnitError(`unexpected ')' ${this.where()}: remove it or add the matching '('`);
    }
    return result;
  }

  private parseProduct(): Scaled {
    let result = this.parseTerm();
    for (;;) {
      const sawSpace = this.skipSpaces();
      const char = this.text[this.pos];
      if (char === undefined || char === ")") return result;
      if (char === "/") {
        this.pos++;
        result = quotient(result, this.parseTerm());
      } else if (char === "*" || char === "·") {
        this.pos++;
        result = product(result, this.parseTerm());
      } else if (sawSpace) {
        result = product(result, this.parseTerm());
      } else {
        throw new UnitError(
          `unexpected '${char}' ${this.where()}: separate units with '/', '*' or a space, as in 'm3/d'`,
        );
      }
    }
  }

  private parseTerm(): Scaled {
    this.skipSpaces();
    const factor = this.parseFactor();
    return power(factor, this.parseExponent());
  }

  private parseFactor(): Scaled {
    const char = this.text[this.pos];
    if (char === undefined || char === ")" || char === "/" || char === "*" || char === "·" || char === "^") {
      throw new UnitError(`expected a unit ${this.where()}, e.g. 'm' or 'd'`);
    }
    if (char === "(") {
      this.pos++;
      const inner = this.parseProduct();
      if (this.text[this.pos] !== ")") throw new UnitError(`missing ')' ${this.where()}`);
      this.pos++;
      return inner;
    }
    if (/[0-9.]/.test(char)) return this.parseNumber();
    for (const symbol of SYMBOLS_LONGEST_FIRST) {
      if (this.text.startsWith(symbol, this.pos) && !isLetter(this.text[this.pos + symbol.length])) {
        this.pos += symbol.length;
        const entry = ENTRY_BY_SYMBOL.get(symbol) as CatalogueEntry;
        return { dimension: entry.dimension, factor: entry.factor };
      }
    }
    throw this.unknownUnitError();
  }

  private parseNumber(): Scaled {
    const match = /^[0-9.]+/.exec(this.text.slice(this.pos)) as RegExpExecArray;
    if (match[0] !== "1") {
      throw new UnitError(
        `unexpected number '${match[0]}' in '${this.text}': the only number a unit may contain is 1, ` +
          `as in '1/d'; put any scale into the value instead`,
      );
    }
    this.pos += 1;
    return { dimension: DIMENSIONS.dimensionless, factor: 1 };
  }

  private parseExponent(): number {
    const rest = this.text.slice(this.pos);
    const caret = /^ ?\^ ?([+\-−]?)([0-9]+)/.exec(rest);
    if (caret !== null) {
      this.pos += caret[0].length;
      return (caret[1] === "" || caret[1] === "+" ? 1 : -1) * Number(caret[2]);
    }
    if (/^ ?\^/.test(rest)) {
      throw new UnitError(`'^' must be followed by an integer exponent, as in 'm^2' or 'd^-1' (in '${this.text}')`);
    }
    const plain = /^[0-9]+/.exec(rest);
    if (plain !== null) {
      this.pos += plain[0].length;
      return Number(plain[0]);
    }
    const superscript = new RegExp(`^(⁻?)([${SUPERSCRIPT_DIGITS}]+)`).exec(rest);
    if (superscript !== null) {
      this.pos += superscript[0].length;
      const digits = [...superscript[2]].map((d) => SUPERSCRIPT_DIGITS.indexOf(d)).join("");
      return (superscript[1] === "" ? 1 : -1) * Number(digits);
    }
    return 1;
  }

  /** Skips one space (the text is normalized); reports whether there was one. */
  private skipSpaces(): boolean {
    if (this.text[this.pos] !== " ") return false;
    this.pos++;
    return true;
  }

  private where(): string {
    if (this.pos >= this.text.length) return `at the end of '${this.text}'`;
    if (this.pos === 0) return `at the start of '${this.text}'`;
    return `after '${this.text.slice(0, this.pos)}' in '${this.text}'`;
  }

  private unknownUnitError(): UnitError {
    const words = this.wordsAhead(3);
    const first = words[0];
    const ambiguous = Object.hasOwn(AMBIGUOUS, first) ? AMBIGUOUS[first] : undefined;
    if (ambiguous !== undefined) return new UnitError(`${ambiguous.advice} (in '${this.text}')`, ambiguous.instead);
    const candidates = knownUnitSymbols();
    for (let count = words.length; count >= 1; count--) {
      const span = words.slice(0, count).join(" ");
      const near = closeMatches(span, [...candidates, ...Object.keys(AMBIGUOUS)]);
      const suggestions = [...new Set(near.flatMap((c) => (Object.hasOwn(AMBIGUOUS, c) ? AMBIGUOUS[c]!.instead : [c])))];
      if (suggestions.length > 0) {
        return new UnitError(`unknown unit '${span}'${this.inWhole(span)} — did you mean ${quoteList(suggestions)}?`, suggestions);
      }
    }
    return new UnitError(
      `unknown unit '${first}'${this.inWhole(first)}; known units include m, cm, ft, in, s, min, h, d, L, ML, US gal, ` +
        `imp gal, US gpm, imp gpm, US gpd, US MGD, cfs, Pa, kPa, psi, mH2O, ftH2O, darcy, mD, and products and ` +
        `quotients of them such as m3/d, L/s, ML/d, m2/d, m2/s, ft2/d, US gpd/ft, ft/d`,
    );
  }

  private inWhole(span: string): string {
    return span === this.text ? "" : ` in '${this.text}'`;
  }

  /** Up to `count` space-separated words from the current position, stopping at any operator. */
  private wordsAhead(count: number): string[] {
    const words: string[] = [];
    let pos = this.pos;
    while (words.length < count && pos < this.text.length) {
      let end = pos;
      while (end < this.text.length && !SEPARATOR_CHARS.includes(this.text[end] as string)) end++;
      if (end === pos) break;
      words.push(this.text.slice(pos, end));
      if (this.text[end] !== " ") break;
      pos = end + 1;
    }
    return words.length > 0 ? words : [this.text.slice(this.pos)];
  }
}
