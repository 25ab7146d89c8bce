/**
 * The page's document store: holds the current document, applies transactions, keeps the undo history and
 * tells observers. Undo and redo are transactions too (the inverse of the step undone), so observers see one
 * kind of change. Dirty means "differs from the document last opened or saved", decided by cell identity, so
 * undoing back to the saved state makes the document clean again. DOM-free.
 */
import type { ConebookDocument } from "@conebook/document";
import { applyTransaction, type Transaction } from "./transaction.js";

/** Called after every applied transaction with the new document. */
export type StoreListener = (tr: Transaction, doc: ConebookDocument) => void;

/** Consecutive edits of one cell within this many ms form one undo step. */
export const MERGE_EDITS_MS = 1000;

interface HistoryEntry {
  inverse: Transaction;
  at: number;
}

/** True when two documents have the same header object and the same cell objects in the same order. */
export function sameDocument(a: ConebookDocument, b: ConebookDocument): boolean {
  return a.header === b.header && a.cells.length === b.cells.length && a.cells.every((c, i) => c === b.cells[i]);
}

export class DocumentStore {
  #doc: ConebookDocument;
  #saved: ConebookDocument;
  #undo: HistoryEntry[] = [];
  #redo: HistoryEntry[] = [];
  #listeners = new Set<StoreListener>();
  readonly #now: () => number;

  constructor(doc: ConebookDocument, now: () => number = () => Date.now()) {
    this.#doc = doc;
    this.#saved = doc;
    this.#now = now;
  }

  get doc(): ConebookDocument {
    return this.#doc;
  }

  /** True when the document differs from the one last opened or saved. */
  get dirty(): boolean {
    return !sameDocument(this.#doc, this.#saved);
  }

  get canUndo(): boolean {
    return this.#undo.length > 0;
  }

  get canRedo(): boolean {
    return this.#redo.length > 0;
  }

  /** Registers a listener; returns a function that removes it. */
  subscribe(listener: StoreListener): () => void {
    this.#listeners.add(listener);
    return () => this.#listeners.delete(listener);
  }

  /** Applies a transaction (throws TransactionError when it does not fit) and records its undo step. */
  dispatch(tr: Transaction): void {
    const { doc, inverse } = applyTransaction(this.#doc, tr);
    if (tr.addToHistory !== false) {
      const now = this.#now();
      const top = this.#undo[this.#undo.length - 1];
      const merges =
        top !== undefined && tr.userEvent === "edit" && top.inverse.userEvent === "edit" && top.inverse.cellId === tr.cellId && now - top.at < MERGE_EDITS_MS;
      if (merges) top.at = now;
      else this.#undo.push({ inverse, at: now });
      this.#redo = [];
    }
    this.#commit(tr, doc);
  }

  /** Undoes the last step; false when there is none. */
  undo(): boolean {
    return this.#step(this.#undo, this.#redo, "undo");
  }

  /** Redoes the last undone step; false when there is none. */
  redo(): boolean {
    return this.#step(this.#redo, this.#undo, "redo");
  }

  /** Marks `doc` (normally the current document) as the saved state. */
  markSaved(doc: ConebookDocument = this.#doc): void {
    this.#saved = doc;
  }

  /** Replaces the document (opening another file or reloading); clears the history. */
  reset(doc: ConebookDocument): void {
    this.#doc = doc;
    this.#saved = doc;
    this.#undo = [];
    this.#redo = [];
    this.#commit({ splices: [], userEvent: "record", addToHistory: false }, doc);
  }

  #step(from: HistoryEntry[], to: HistoryEntry[], userEvent: "undo" | "redo"): boolean {
    const entry = from.pop();
    if (!entry) return false;
    const { doc, inverse } = applyTransaction(this.#doc, entry.inverse);
    to.push({ inverse, at: 0 });
    this.#commit({ ...entry.inverse, userEvent, addToHistory: false }, doc);
    return true;
  }

  #commit(tr: Transaction, doc: ConebookDocument): void {
    this.#doc = doc;
    for (const l of this.#listeners) l(tr, doc);
  }
}
