/**
 * The one way the document changes in the page: a Transaction. Every edit (typing in a cell, adding, deleting,
 * moving a cell, changing its kind, recording outputs, undo and redo) is a transaction applied by `applyTransaction`;
 * the undo history, the dirty state, the recovery copy and saving all consume transactions and nothing else.
 *
 * A transaction is a list of cell splices (replace the cells `from..to` by `insert`, applied in order, indexes
 * into the list as it is when that splice applies) and optionally a new header. Cells are the document
 * package's `Cell` values and are never mutated: an edited cell is a new object, an untouched cell stays the
 * same object, which is what lets the serializer write untouched text back byte for byte and lets the page
 * tell cheaply which cells changed. DOM-free: tested in Node.
 */
import type { Cell, ConebookDocument, DocumentHeader } from "@conebook/document";

/** Replace `cells[from..to)` by `insert`. */
export interface CellSplice {
  readonly from: number;
  readonly to: number;
  readonly insert: readonly Cell[];
}

/** What a transaction was, for grouping undo steps and for observers. */
export type UserEvent = "edit" | "insert" | "delete" | "move" | "kind" | "record" | "header" | "undo" | "redo" | "windows" | "note";

/** One change of the document. */
export interface Transaction {
  readonly splices: readonly CellSplice[];
  /** A new header (replaces the whole header). */
  readonly header?: DocumentHeader;
  readonly userEvent: UserEvent;
  /** The cell an edit concerns; consecutive edits of one cell merge into one undo step. */
  readonly cellId?: string;
  /** False for changes that undo should skip (default true). */
  readonly addToHistory?: boolean;
  /** The cell to focus after the change (for the view). */
  readonly focus?: string;
}

/** Thrown for a transaction that does not fit the document, e.g. a splice past the end. */
export class TransactionError extends Error {
  override readonly name = "TransactionError";
}

/** The result of applying a transaction: the new document and the transaction that undoes it. */
export interface Applied {
  doc: ConebookDocument;
  inverse: Transaction;
}

/**
 * Applies `tr` to `doc` (neither is changed) and returns the new document and the inverse transaction.
 * Cost: O(number of cells) per splice.
 */
export function applyTransaction(doc: ConebookDocument, tr: Transaction): Applied {
  let cells = doc.cells.slice();
  const inverse: CellSplice[] = [];
  for (const s of tr.splices) {
    if (!Number.isInteger(s.from) || !Number.isInteger(s.to) || s.from < 0 || s.to < s.from || s.to > cells.length) {
      throw new TransactionError(`invalid splice ${s.from}..${s.to} in a document of ${cells.length} cells`);
    }
    const removed = cells.slice(s.from, s.to);
    cells = [...cells.slice(0, s.from), ...s.insert, ...cells.slice(s.to)];
    inverse.unshift({ from: s.from, to: s.from + s.insert.length, insert: removed });
  }
  const ids = new Set<string>();
  for (const c of cells) {
    if (ids.has(c.id)) throw new TransactionError(`the change would give two cells the id "${c.id}"`);
    ids.add(c.id);
  }
  const next: ConebookDocument = { ...doc, cells, ...(tr.header ? { header: tr.header } : {}) };
  const inv: Transaction = {
    splices: inverse,
    userEvent: tr.userEvent,
    ...(tr.header ? { header: doc.header } : {}),
    ...(tr.cellId !== undefined ? { cellId: tr.cellId } : {}),
    ...(tr.focus !== undefined ? { focus: tr.focus } : {}),
  };
  return { doc: next, inverse: inv };
}

/** Index of the cell with `id`; throws TransactionError when there is none. */
export function indexOfCell(doc: ConebookDocument, id: string): number {
  const i = doc.cells.findIndex((c) => c.id === id);
  if (i < 0) throw new TransactionError(`no cell has the id "${id}" (the document has ${doc.cells.length} cells)`);
  return i;
}

/** A transaction replacing the cell `id` by `cell`. */
export function replaceCell(doc: ConebookDocument, id: string, cell: Cell, userEvent: UserEvent): Transaction {
  const i = indexOfCell(doc, id);
  return { splices: [{ from: i, to: i + 1, insert: [cell] }], userEvent, cellId: cell.id, focus: cell.id };
}

/** A transaction inserting `cell` at `index` (0 = first). */
export function insertCell(index: number, cell: Cell): Transaction {
  return { splices: [{ from: index, to: index, insert: [cell] }], userEvent: "insert", cellId: cell.id, focus: cell.id };
}

/** A transaction deleting the cell `id`; focus goes to the cell after it (or before, at the end). */
export function deleteCell(doc: ConebookDocument, id: string): Transaction {
  const i = indexOfCell(doc, id);
  const neighbour = doc.cells[i + 1] ?? doc.cells[i - 1];
  return { splices: [{ from: i, to: i + 1, insert: [] }], userEvent: "delete", cellId: id, ...(neighbour ? { focus: neighbour.id } : {}) };
}

/** A transaction moving the cell `id` by `delta` places (-1 up, +1 down); undefined when it cannot move. */
export function moveCell(doc: ConebookDocument, id: string, delta: number): Transaction | undefined {
  const i = indexOfCell(doc, id);
  const j = i + delta;
  if (j < 0 || j >= doc.cells.length) return undefined;
  const cell = doc.cells[i]!;
  return { splices: [{ from: i, to: i + 1, insert: [] }, { from: j, to: j, insert: [cell] }], userEvent: "move", cellId: id, focus: id };
}
