/**
 * Review notes: a reviewer's challenge, question or acceptance attached to a cell, with the author's answers,
 * kept in the document as plain text (docs/format.md, section 2.4). A note is a narrative cell whose marker
 * names the cell it concerns and whether it is open or resolved:
 *
 *   [review:ID]: # "on CELL, open"
 *
 *   > **Challenge** from R. E. Viewer: Why is ...?
 *   >
 *   > **Answer** from A. N. Analyst: Because ...
 *
 * The marker is a CommonMark link reference definition, so every Markdown viewer hides it and shows the
 * thread as a block quote. The parser keeps the text byte for byte like any narrative cell; the thread is a
 * reading of that text (`readReviewThread`), and `writeReviewThread` makes the text a viewer writes.
 */

import type { Cell, ConebookDocument, NarrativeCell, Position } from "./types.js";

/** Whether a note still asks for something. */
export type ReviewStatus = "open" | "resolved";

/** What one entry of a thread is. */
export type ReviewEntryKind = "challenge" | "question" | "accepted" | "answer" | "comment";

/** The kinds in the order a viewer offers them, with the word written in the file. */
export const REVIEW_ENTRY_KINDS: readonly { kind: ReviewEntryKind; word: string }[] = [
  { kind: "challenge", word: "Challenge" },
  { kind: "question", word: "Question" },
  { kind: "accepted", word: "Accepted" },
  { kind: "answer", word: "Answer" },
  { kind: "comment", word: "Comment" },
];

/** What a review marker says: the cell the note concerns and its status. */
export interface ReviewMark {
  on: string;
  status: ReviewStatus;
}

/** One entry of a note's thread. */
export interface ReviewEntry {
  kind: ReviewEntryKind;
  /** Who wrote it, as written after "from" (may be empty). */
  who: string;
  /** The entry's text (Markdown, without the block-quote markers). */
  text: string;
}

/** A review note as listed by `reviewNotes`. */
export interface ReviewNote {
  /** The note's own cell id. */
  id: string;
  on: string;
  status: ReviewStatus;
  entries: ReviewEntry[];
  /** Where the note's marker starts in the file (its cell's start for a note built in memory). */
  at: Position;
}

/**
 * A review marker line: `[review:ID]: # "on CELL, open"` (or `resolved`). ID and CELL are cell ids. Exported
 * for the parser; a viewer uses `reviewMarker`.
 */
export const REVIEW_MARKER = /^\[review:([A-Za-z][A-Za-z0-9_-]{0,63})\]:[ \t]*#[ \t]+"on ([A-Za-z][A-Za-z0-9_-]{0,63}), (open|resolved)"[ \t]*$/;

/** A line that starts like a review marker (reported when it does not read as one). */
export const REVIEW_MARKER_START = /^\[review:[^\]]*\]:/;

/** The marker line of a note. */
export function reviewMarker(id: string, mark: ReviewMark): string {
  return `[review:${id}]: # "on ${mark.on}, ${mark.status}"`;
}

const WORDS = new Map(REVIEW_ENTRY_KINDS.map((k) => [k.word, k.kind]));
const ENTRY_START = new RegExp(`^\\*\\*(${REVIEW_ENTRY_KINDS.map((k) => k.word).join("|")})\\*\\*(?: from ([^:\\n]*?))?:(?: (.*))?$`);

/**
 * Reads a note's text as a thread. Lines may carry block-quote markers (`> `); an entry starts at a line
 * `**Word** from NAME: text` (Word one of Challenge, Question, Accepted, Answer, Comment; `from NAME` may be
 * left out) and runs to the next such line. Text before the first entry is a comment without an author.
 * Blank lines at either end of an entry are dropped. Cost: linear in the text.
 */
export function readReviewThread(source: string): ReviewEntry[] {
  const lines = source.split(/\r\n|\n|\r/).map((l) => l.replace(/^ {0,3}> ?/, "").replace(/^>$/, ""));
  const entries: ReviewEntry[] = [];
  let current: { kind: ReviewEntryKind; who: string; lines: string[] } | undefined;
  const flush = () => {
    if (!current) return;
    const text = trimBlank(current.lines).join("\n");
    if (text !== "" || current.kind !== "comment" || current.who !== "") entries.push({ kind: current.kind, who: current.who, text });
    current = undefined;
  };
  for (const line of lines) {
    const m = ENTRY_START.exec(line);
    if (m) {
      flush();
      current = { kind: WORDS.get(m[1]!)!, who: (m[2] ?? "").trim(), lines: m[3] === undefined ? [] : [m[3]] };
      continue;
    }
    current ??= { kind: "comment", who: "", lines: [] };
    current.lines.push(line);
  }
  flush();
  return entries;
}

function trimBlank(lines: string[]): string[] {
  let a = 0;
  let b = lines.length;
  while (a < b && lines[a]!.trim() === "") a++;
  while (b > a && lines[b - 1]!.trim() === "") b--;
  return lines.slice(a, b);
}

/**
 * The text of a thread as a viewer writes it: one block quote, entries separated by a quoted blank line, each
 * starting `**Word** from NAME: `. Names lose colons and line breaks (they end the name when read back).
 * `readReviewThread(writeReviewThread(e))` gives `e` back for entries whose text has no blank lines at its ends
 * and no line that starts like an entry.
 */
export function writeReviewThread(entries: readonly ReviewEntry[]): string {
  const blocks = entries.map((e) => {
    const word = REVIEW_ENTRY_KINDS.find((k) => k.kind === e.kind)!.word;
    const who = e.who.replace(/[:\r\n]+/g, " ").replace(/ {2,}/g, " ").trim();
    const [first = "", ...rest] = e.text.split(/\r\n|\n|\r/);
    const head = `**${word}**${who ? ` from ${who}` : ""}:${first === "" ? "" : ` ${first}`}`;
    return [head, ...rest].map((l) => (l === "" ? ">" : `> ${l}`)).join("\n");
  });
  return blocks.join("\n>\n");
}

/** True for a narrative cell that is a review note. */
export function isReviewNote(cell: Cell): cell is NarrativeCell & { review: ReviewMark } {
  return cell.kind === "narrative" && cell.review !== undefined;
}

/** Every review note of the document, in document order. */
export function reviewNotes(doc: ConebookDocument): ReviewNote[] {
  return doc.cells.filter(isReviewNote).map((c) => ({
    id: c.id,
    on: c.review.on,
    status: c.review.status,
    entries: readReviewThread(c.source),
    at: c.origin?.start ?? c.sourceStart,
  }));
}
