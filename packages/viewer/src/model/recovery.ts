/**
 * The recovery copy: the text of unsaved edits kept in browser storage (localStorage of the page's origin,
 * which `conebook serve`'s fixed default port keeps stable across restarts), one entry per document path, so
 * that a crash or a closed tab loses nothing. Written after changes, removed after a save or a discard.
 * DOM-free: it takes any Storage-like object.
 */

/** The part of the Web Storage API used here. */
export interface KeyValueStorage {
  getItem(key: string): string | null;
  setItem(key: string, value: string): void;
  removeItem(key: string): void;
}

/** One kept copy. */
export interface RecoveryCopy {
  /** The document's text with the unsaved edits. */
  text: string;
  /** SHA-256 of the file the edits were made on. */
  baseSha256: string;
  /** When it was kept (ms since 1970). */
  keptAt: number;
}

const PREFIX = "conebook.recovery:";

/** Reads the copy kept for `path`, or undefined (also for an unreadable entry). */
export function readRecovery(storage: KeyValueStorage, path: string): RecoveryCopy | undefined {
  const raw = storage.getItem(PREFIX + path);
  if (raw === null) return undefined;
  try {
    const v = JSON.parse(raw) as Partial<RecoveryCopy>;
    if (typeof v.text === "string" && typeof v.baseSha256 === "string" && typeof v.keptAt === "number") return { text: v.text, baseSha256: v.baseSha256, keptAt: v.keptAt };
  } catch {
    // An entry that is not JSON is not a copy this page wrote.
  }
  return undefined;
}

/** Keeps `copy` for `path`; false when the storage refused (full, or disabled). */
export function keepRecovery(storage: KeyValueStorage, path: string, copy: RecoveryCopy): boolean {
  try {
    storage.setItem(PREFIX + path, JSON.stringify(copy));
    return true;
  } catch {
    return false;
  }
}

/** Forgets the copy for `path`. */
export function dropRecovery(storage: KeyValueStorage, path: string): void {
  storage.removeItem(PREFIX + path);
}
