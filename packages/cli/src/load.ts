/**
 * Reading a document from disk for a command: the bytes (for the document's SHA-256), the parsed model, and its
 * warnings. Errors in the document become one InputError listing every error as `file:line:column: message`.
 */
import { createHash } from "node:crypto";
import { readFile } from "node:fs/promises";
import { dirname, relative, resolve } from "node:path";
import { DocumentError, decodeUtf8Strict, describeUtf8Problem, formatDiagnostic, parseDocument } from "@conebook/document";
import type { ConebookDocument, Diagnostic } from "@conebook/document";
import { checkDataPins, type HashedBytes, type PinCheck } from "@conebook/kernel";
import { fileReaderFor } from "@conebook/kernel/node";
import { InputError, place } from "./errors.js";

/** A document read from disk. */
export interface LoadedDocument {
  /** Absolute path. */
  path: string;
  /** The path as shown in messages (relative to the working folder when inside it). */
  shown: string;
  /** Folder of the document; data files are read relative to it. */
  folder: string;
  bytes: Uint8Array;
  text: string;
  document: ConebookDocument;
  warnings: Diagnostic[];
  /**
   * The pinned data files as `checkPins` read and hashed them, by path: the run takes them from here (each file is
   * read and hashed once per command) and empties the map.
   */
  checkedFiles: Map<string, HashedBytes>;
}

/** The SHA-256 (FIPS 180-4) of bytes with Node's crypto, lowercase hex. */
export function nodeSha256(bytes: Uint8Array): string {
  return createHash("sha256").update(bytes).digest("hex");
}

/** The path as a user would type it from the working folder. */
export function shownPath(path: string, cwd: string): string {
  const rel = relative(cwd, path);
  return rel !== "" && !rel.startsWith("..") ? rel : path;
}

/** Reads and parses a document; throws InputError for a missing file or a document with errors. */
export async function loadDocument(file: string, cwd: string): Promise<LoadedDocument> {
  const path = resolve(cwd, file);
  const shown = shownPath(path, cwd);
  let bytes: Uint8Array;
  try {
    bytes = new Uint8Array(await readFile(path));
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    if (code === "ENOENT") throw new InputError(`${shown}: no such file; check the path`);
    if (code === "EISDIR") throw new InputError(`${shown} is a folder; give a document file (*.cone.md)`);
    throw new InputError(`${shown}: cannot read: ${(e as Error).message}`);
  }
  // Refused rather than decoded with replacement characters, which --write would then save over the bytes.
  const decoded = decodeUtf8Strict(bytes);
  if (!decoded.ok) {
    const notUtf8 = decoded.problem;
    throw new InputError(`${place(shown, notUtf8.line, notUtf8.column)}: the file is not UTF-8 at ${describeUtf8Problem(notUtf8)}; save it as UTF-8`);
  }
  const text = decoded.text;
  let parsed;
  try {
    parsed = parseDocument(text, { file: shown });
  } catch (e) {
    if (e instanceof DocumentError) throw new InputError(e.message);
    throw e;
  }
  const errors = parsed.diagnostics.filter((d) => d.severity === "error");
  if (errors.length > 0) {
    const lines = errors.map((d) => formatDiagnostic({ ...d, file: shown }));
    throw new InputError(`${shown} has ${errors.length === 1 ? "an error" : `${errors.length} errors`}:\n${lines.join("\n")}`);
  }
  return {
    path,
    shown,
    folder: dirname(path),
    bytes,
    text,
    document: parsed.document,
    warnings: parsed.diagnostics.filter((d) => d.severity === "warning").map((d) => ({ ...d, file: shown })),
    checkedFiles: new Map(),
  };
}

/** The SHA-256 of the document's bytes (FIPS 180-4), lowercase hex. */
export function documentSha256(loaded: LoadedDocument): string {
  return nodeSha256(loaded.bytes);
}

/**
 * Checks the data files the document pins. An unreadable file is an InputError (with the data cell's place);
 * a changed file is returned in `changed` for the command to report as it sees fit.
 */
export async function checkPins(loaded: LoadedDocument): Promise<{ checks: PinCheck[]; changed: PinCheck[] }> {
  const read = fileReaderFor(loaded.folder);
  const checks = await checkDataPins(loaded.document, async (path) => {
    const bytes = await read(path);
    const hashed = { bytes, sha256: nodeSha256(bytes) };
    loaded.checkedFiles.set(path, hashed);
    return hashed;
  });
  const unreadable = checks.filter((c) => c.status === "unreadable");
  if (unreadable.length > 0) {
    const lines = unreadable.map(
      (c) => `${place(loaded.shown, c.line, 1)}: data "${c.name}" refers to ${c.path}, which cannot be read beside the document (${c.reason}); put the file there or fix file=`,
    );
    throw new InputError(lines.join("\n"));
  }
  const notText = checks.filter((c) => c.status === "not-utf8");
  if (notText.length > 0) {
    throw new InputError(
      notText.map((c) => `${place(loaded.shown, c.line, 1)}: data "${c.name}" refers to ${c.path}, which is not UTF-8 at ${c.reason}; save it as UTF-8 and pin the new bytes`).join("\n"),
    );
  }
  return { checks, changed: checks.filter((c) => c.status === "changed") };
}

/** The message for a data file whose bytes no longer match the document's pin. */
export function pinChangedMessage(shown: string, c: PinCheck): string {
  return `${place(shown, c.line, 1)}: data file ${c.path} changed since it was pinned: the document pins SHA-256 ${c.pinned}, the file now has ${c.actual}`;
}
