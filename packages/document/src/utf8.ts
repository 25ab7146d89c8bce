/**
 * Checking and decoding UTF-8 without replacing anything: a Conebook document and its data files are UTF-8, and
 * a decoder that silently turns a bad byte into U+FFFD would let `run --write` rewrite the user's bytes and let a
 * number in a CSV field become text. Well-formed means the byte sequences of Unicode 15.0, Table 3-7: no overlong
 * forms, no surrogates (U+D800..U+DFFF), nothing above U+10FFFF, no truncated sequence.
 */

/** Where a byte string stops being well-formed UTF-8. Line and column are 1-based; columns count UTF-16 code units. */
export interface Utf8Problem {
  /** Offset of the first byte of the ill-formed sequence. */
  offset: number;
  line: number;
  column: number;
  /** The offending bytes (up to 4) as upper-case hex pairs, e.g. "FF FE". */
  bytes: string;
}

/** Length of the well-formed sequence starting at `i`, or 0 when the bytes there are ill-formed. */
function sequenceLength(b: Uint8Array, i: number): number {
  const c = b[i]!;
  if (c < 0x80) return 1;
  const cont = (k: number, lo = 0x80, hi = 0xbf): boolean => i + k < b.length && b[i + k]! >= lo && b[i + k]! <= hi;
  if (c >= 0xc2 && c <= 0xdf) return cont(1) ? 2 : 0;
  if (c === 0xe0) return cont(1, 0xa0) && cont(2) ? 3 : 0;
  if ((c >= 0xe1 && c <= 0xec) || c === 0xee || c === 0xef) return cont(1) && cont(2) ? 3 : 0;
  if (c === 0xed) return cont(1, 0x80, 0x9f) && cont(2) ? 3 : 0;
  if (c === 0xf0) return cont(1, 0x90) && cont(2) && cont(3) ? 4 : 0;
  if (c >= 0xf1 && c <= 0xf3) return cont(1) && cont(2) && cont(3) ? 4 : 0;
  if (c === 0xf4) return cont(1, 0x80, 0x8f) && cont(2) && cont(3) ? 4 : 0;
  return 0;
}

/** The platform's strict decoder (WHATWG UTF-8, which accepts exactly the sequences of Table 3-7), made once. */
let strictDecoder: { decode(bytes: Uint8Array): string } | undefined;

/**
 * The text of `bytes` when they are well-formed UTF-8 (a leading byte order mark kept as U+FEFF, as decodeUtf8
 * does), else the first problem. One native pass; the problem's place is found by utf8Problem only when there is one.
 */
export function decodeUtf8Strict(bytes: Uint8Array): { ok: true; text: string } | { ok: false; problem: Utf8Problem } {
  strictDecoder ??= new TextDecoder("utf-8", { fatal: true, ignoreBOM: true });
  try {
    return { ok: true, text: strictDecoder.decode(bytes) };
  } catch {
    const problem = scanUtf8(bytes);
    // The platform decoder and the scan below follow the same table; should they ever disagree, trust the decoder.
    return problem ? { ok: false, problem } : { ok: false, problem: { offset: 0, line: 1, column: 1, bytes: "" } };
  }
}

/**
 * The first ill-formed UTF-8 sequence in `bytes`, or undefined when all of it is well-formed. Linear time: the
 * platform's strict decoder checks the bytes natively, and the byte-by-byte scan runs only to place a problem.
 */
export function utf8Problem(bytes: Uint8Array): Utf8Problem | undefined {
  const decoded = decodeUtf8Strict(bytes);
  return decoded.ok ? undefined : decoded.problem;
}

/** The byte-by-byte scan behind utf8Problem: the first ill-formed sequence with its line and column. */
function scanUtf8(bytes: Uint8Array): Utf8Problem | undefined {
  let line = 1;
  let column = 1;
  for (let i = 0; i < bytes.length; ) {
    const n = sequenceLength(bytes, i);
    if (n === 0) {
      const shown = Array.from(bytes.subarray(i, Math.min(bytes.length, i + 4)), (x) => x.toString(16).toUpperCase().padStart(2, "0"));
      // Show the bad byte and the ones after it that cannot start a character either.
      let k = 1;
      while (k < shown.length && sequenceLength(bytes, i + k) === 0) k++;
      return { offset: i, line, column, bytes: shown.slice(0, k).join(" ") };
    }
    if (bytes[i] === 0x0a) {
      line++;
      column = 1;
    } else column += n === 4 ? 2 : 1;
    i += n;
  }
  return undefined;
}

/** What to say about a problem: "byte offset 42 (line 3, column 7): bytes FF FE are not UTF-8". */
export function describeUtf8Problem(p: Utf8Problem): string {
  return `byte offset ${p.offset} (line ${p.line}, column ${p.column}): ${p.bytes.includes(" ") ? "bytes" : "byte"} ${p.bytes} ${p.bytes.includes(" ") ? "are" : "is"} not UTF-8`;
}

/** Decodes well-formed UTF-8 to text, keeping a byte order mark as U+FEFF; throws nothing, replaces nothing. */
export function decodeUtf8(bytes: Uint8Array): string {
  return new TextDecoder("utf-8", { ignoreBOM: true }).decode(bytes);
}
