import { describe, expect, it } from "vitest";
import { messages, parseDocument, readReviewThread, reviewNotes, serializeDocument, writeReviewThread } from "../src/index.js";
import type { Cell, ConebookDocument, ReviewEntry } from "../src/index.js";
import { HEADER, lines } from "./helpers.js";

const NOTE_DOC = lines(
  ...HEADER,
  "",
  "```ts code:fit",
  "const T = 250;",
  "```",
  "",
  '[review:fit-note-1]: # "on fit, open"',
  "",
  "> **Challenge** from R. E. Viewer: Why 250 m2/d?",
  "> The derivative suggests less.",
  ">",
  "> **Answer** from A. N. Analyst: It is the fitted value.",
  "",
  '[review:fit-note-2]:   #   "on fit, resolved"',
  "",
  "**Accepted** from R. E. Viewer:",
  "",
  "[narrative:after]: #",
  "",
  "Text after the notes.",
);

describe("review notes in the document format", () => {
  it("reads a review marker as a narrative cell with the cell it concerns and its status", () => {
    const { document, diagnostics } = parseDocument(NOTE_DOC);
    expect(diagnostics).toEqual([]);
    expect(document.cells.map((c) => [c.id, c.kind, c.kind === "narrative" ? c.review : undefined])).toEqual([
      ["fit", "code", undefined],
      ["fit-note-1", "narrative", { on: "fit", status: "open" }],
      ["fit-note-2", "narrative", { on: "fit", status: "resolved" }],
      ["after", "narrative", undefined],
    ]);
    expect(reviewNotes(document)).toEqual([
      {
        id: "fit-note-1",
        on: "fit",
        status: "open",
        entries: [
          { kind: "challenge", who: "R. E. Viewer", text: "Why 250 m2/d?\nThe derivative suggests less." },
          { kind: "answer", who: "A. N. Analyst", text: "It is the fitted value." },
        ],
        at: { line: 11, column: 1 },
      },
      { id: "fit-note-2", on: "fit", status: "resolved", entries: [{ kind: "accepted", who: "R. E. Viewer", text: "" }], at: { line: 18, column: 1 } },
    ]);
  });

  it("writes a document with review notes back byte for byte", () => {
    expect(serializeDocument(parseDocument(NOTE_DOC).document)).toBe(NOTE_DOC);
    const crlf = NOTE_DOC.split("\n").join("\r\n");
    expect(serializeDocument(parseDocument(crlf).document)).toBe(crlf);
  });

  it("rewrites only the marker line when a note is resolved", () => {
    const { document } = parseDocument(NOTE_DOC);
    const cells = document.cells.map((c): Cell => (c.id === "fit-note-1" && c.kind === "narrative" ? { ...c, review: { on: "fit", status: "resolved" } } : c));
    const text = serializeDocument({ ...document, cells });
    expect(text).toBe(NOTE_DOC.replace('[review:fit-note-1]: # "on fit, open"', '[review:fit-note-1]: # "on fit, resolved"'));
    expect(reviewNotes(parseDocument(text).document)[0]!.status).toBe("resolved");
  });

  it("writes a new note after its cell so that it reads back as the same thread", () => {
    const { document } = parseDocument(NOTE_DOC);
    const entries: ReviewEntry[] = [
      { kind: "question", who: "R. E. Viewer", text: "Is B at its bound?\n\nSee the fit table." },
      { kind: "answer", who: "A. N. Analyst", text: "No." },
    ];
    const note: Cell = { kind: "narrative", id: "fit-note-3", source: writeReviewThread(entries), sourceStart: { line: 1, column: 1 }, outputs: [], review: { on: "fit", status: "open" } };
    const doc: ConebookDocument = { ...document, cells: [document.cells[0]!, note, ...document.cells.slice(1)] };
    const text = serializeDocument(doc);
    expect(text).toContain(
      ['[review:fit-note-3]: # "on fit, open"', "", "> **Question** from R. E. Viewer: Is B at its bound?", ">", "> See the fit table.", ">", "> **Answer** from A. N. Analyst: No."].join("\n"),
    );
    const back = reviewNotes(parseDocument(text).document);
    expect(back.map((n) => n.id)).toEqual(["fit-note-3", "fit-note-1", "fit-note-2"]);
    expect(back[0]!.entries).toEqual(entries);
  });

  it("reports a note on a cell that does not exist, and a marker that does not read", () => {
    const text = lines(...HEADER, "", '[review:n1]: # "on nowhere, open"', "", "> **Question**: why?", "", '[review:n2]: # "about fit"', "", "text");
    const { document, diagnostics } = parseDocument(text);
    expect(diagnostics.map((d) => [d.code, d.line])).toEqual([
      [messages.reviewTargetMissing("n1", "nowhere").code, 7],
      [messages.reviewMarkerUnread().code, 11],
    ]);
    expect(diagnostics[0]!.message).toContain('review note "n1" is on cell "nowhere"');
    // The unread marker stays in the narrative of the note before it, byte for byte.
    expect(document.cells.length).toBe(1);
    expect(document.cells[0]!.source).toContain('[review:n2]: # "about fit"');
    expect(serializeDocument(document)).toBe(text);
  });

  it("reads text before the first entry as a comment and drops names' colons when writing", () => {
    expect(readReviewThread("Plain words.\n\n**Comment**: more")).toEqual([
      { kind: "comment", who: "", text: "Plain words." },
      { kind: "comment", who: "", text: "more" },
    ]);
    expect(writeReviewThread([{ kind: "comment", who: "Dr: X", text: "t" }])).toBe("> **Comment** from Dr X: t");
  });
});
