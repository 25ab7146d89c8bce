/**
 * The documents `conebook serve` offers: the `*.cone.md` files of the served folder (and its subfolders), read
 * with their SHA-256 and the check of their pinned data files (the same checkDataPins the CLI uses), and saved
 * atomically only when the file on disk is still the one the page opened.
 */
import { createHash } from "node:crypto";
import { mkdir, readdir, readFile, realpath, stat } from "node:fs/promises";
import { basename, dirname, join, relative, sep } from "node:path";
import { DocumentError, isSafeRelativePath, parseDocument } from "@conebook/document";
import { checkDataPins, type PinCheck } from "@conebook/kernel";
import { writeFileAtomic } from "../atomic-write.js";
import { PathRefused, resolveExisting, resolveForWrite } from "./paths.js";

/** SHA-256 (FIPS 180-4) of bytes, lowercase hex. */
export function sha256Of(bytes: Uint8Array | string): string {
  return createHash("sha256").update(bytes).digest("hex");
}

/** The documents below `rootReal`, as relative paths with forward slashes, sorted; hidden folders and node_modules skipped. */
export async function listDocuments(rootReal: string, limit = 500): Promise<string[]> {
  const found: string[] = [];
  async function walk(folder: string, depth: number): Promise<void> {
    if (depth > 6 || found.length >= limit) return;
    const entries = await readdir(folder, { withFileTypes: true });
    for (const e of entries) {
      if (e.name.startsWith(".") || e.name === "node_modules") continue;
      const path = join(folder, e.name);
      if (e.isDirectory()) await walk(path, depth + 1);
      else if (e.isFile() && e.name.endsWith(".cone.md")) found.push(relative(rootReal, path).split("\\").join("/"));
    }
  }
  await walk(rootReal, 0);
  return found.sort();
}

/** What the page gets when it opens a document. */
export interface OpenedDocument {
  path: string;
  text: string;
  sha256: string;
  /** Pins of the data files, checked as the CLI checks them; empty when the document does not parse. */
  pins: PinCheck[];
}

/** Joins a data path (relative to the document's folder) to the document's path, both relative to the root. */
export function dataPathFromRoot(documentPath: string, dataPath: string): string {
  const folder = dirname(documentPath);
  return folder === "." ? dataPath : `${folder}/${dataPath}`;
}

/** Reads a document and checks its pins. Throws PathRefused, or the file system's error (ENOENT). */
export async function openDocument(rootReal: string, path: string): Promise<OpenedDocument> {
  if (!path.endsWith(".cone.md")) throw new PathRefused(`${JSON.stringify(path)} is refused: only Conebook documents (*.cone.md) are opened`);
  const full = await resolveExisting(rootReal, path);
  const bytes = await readFile(full);
  const text = new TextDecoder("utf-8").decode(bytes);
  let pins: PinCheck[] = [];
  try {
    const parsed = parseDocument(text, { file: path });
    pins = await checkDataPins(parsed.document, async (dataPath) => readDataFile(rootReal, path, dataPath));
  } catch (e) {
    if (!(e instanceof DocumentError)) throw e;
  }
  return { path, text, sha256: sha256Of(bytes), pins };
}

/** Reads a data file a document pins (path relative to the document). Throws PathRefused for a path that leaves the root. */
export async function readDataFile(rootReal: string, documentPath: string, dataPath: string): Promise<Uint8Array> {
  const full = await resolveExisting(rootReal, dataPathFromRoot(documentPath, dataPath));
  return new Uint8Array(await readFile(full));
}

/** The outcome of a save. */
export type SaveOutcome =
  | { status: "saved"; sha256: string }
  | { status: "conflict"; text: string; sha256: string }
  | { status: "missing" };

/**
 * Saves `text` over the document at `path` when the file's SHA-256 is still `baseSha256` (the text the page
 * opened); otherwise returns the text now on disk and writes nothing. The write is atomic (atomic-write.ts).
 * A check-then-write race with another writer in the same millisecond is not excluded; the page's own saves
 * are serialized.
 */
export async function saveDocument(
  rootReal: string,
  path: string,
  text: string,
  baseSha256: string,
  write: (path: string, text: string) => Promise<void> = writeFileAtomic,
): Promise<SaveOutcome> {
  if (!path.endsWith(".cone.md")) throw new PathRefused(`${JSON.stringify(path)} is refused: only Conebook documents (*.cone.md) are saved`);
  const full = await resolveForWrite(rootReal, path);
  let current: Buffer;
  try {
    current = await readFile(full);
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === "ENOENT") return { status: "missing" };
    throw e;
  }
  const currentSha = sha256Of(current);
  if (currentSha !== baseSha256) return { status: "conflict", text: new TextDecoder("utf-8").decode(current), sha256: currentSha };
  await write(full, text);
  return { status: "saved", sha256: sha256Of(text) };
}

async function exists(path: string): Promise<boolean> {
  try {
    await stat(path);
    return true;
  } catch {
    return false;
  }
}

/**
 * Writes `text` as a new document beside `path`, named `NAME.copy-N.cone.md` with the first N that is free,
 * and never over an existing file. Returns the new relative path.
 */
export async function saveCopy(
  rootReal: string,
  path: string,
  text: string,
  write: (path: string, text: string) => Promise<void> = writeFileAtomic,
): Promise<string> {
  if (!path.endsWith(".cone.md")) throw new PathRefused(`${JSON.stringify(path)} is refused: only Conebook documents (*.cone.md) are copied`);
  const stem = path.slice(0, -".cone.md".length);
  for (let n = 1; n < 1000; n++) {
    const candidate = `${stem}.copy-${n}.cone.md`;
    const full = await resolveForWrite(rootReal, candidate);
    if (await exists(full)) continue;
    await write(full, text);
    return candidate;
  }
  throw new Error(`no free name for a copy of ${basename(path)} (copy-1 to copy-999 exist); remove some copies`);
}

/** Creates the folder `full` (absolute, below the root) when missing, after checking its nearest existing ancestor lies inside the root. */
async function ensureFolder(rootReal: string, full: string, shown: string): Promise<void> {
  let probe = full;
  for (;;) {
    try {
      const real = await realpath(probe);
      const rel = relative(rootReal, real);
      if (rel.startsWith("..") || rel.startsWith(sep)) throw new PathRefused(`${JSON.stringify(shown)} is refused: its folder lies outside the served folder (through a symbolic link)`);
      break;
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code !== "ENOENT") throw e;
      probe = dirname(probe);
    }
  }
  await mkdir(full, { recursive: true });
}

/** The outcome of making a new document. */
export type CreateOutcome = { status: "created"; sha256: string } | { status: "exists"; path: string; reason: string };

/**
 * Writes a new document (made by the page's template form) and its data files: the data files first (each at a
 * path relative to the document, refused when a different file is already there, kept when the same bytes are),
 * then the document, never over an existing file. Writes are atomic.
 */
export async function createDocument(
  rootReal: string,
  path: string,
  text: string,
  files: readonly { path: string; bytes: Uint8Array }[],
  write: (path: string, text: string) => Promise<void> = writeFileAtomic,
): Promise<CreateOutcome> {
  if (!path.endsWith(".cone.md")) throw new PathRefused(`${JSON.stringify(path)} is refused: only Conebook documents (*.cone.md) are made`);
  const full = await resolveForWrite(rootReal, path);
  if (await exists(full)) return { status: "exists", path, reason: `${path} already exists; choose another file name` };
  const targets: { full: string; bytes: Uint8Array; shown: string }[] = [];
  for (const f of files) {
    if (!isSafeRelativePath(f.path)) throw new PathRefused(`${JSON.stringify(f.path)} is refused: a data path must be relative to the document and stay beside it`);
    const shown = dataPathFromRoot(path, f.path);
    await ensureFolder(rootReal, dirname(join(rootReal, ...shown.split("/"))), shown);
    const target = await resolveForWrite(rootReal, shown);
    if (await exists(target)) {
      if (sha256Of(await readFile(target)) !== sha256Of(f.bytes)) return { status: "exists", path: shown, reason: `${shown} already exists with other contents; rename the data file before choosing it` };
      continue;
    }
    targets.push({ full: target, bytes: f.bytes, shown });
  }
  await ensureFolder(rootReal, dirname(full), path);
  for (const t of targets) await writeFileAtomic(t.full, t.bytes);
  await write(await resolveForWrite(rootReal, path), text);
  return { status: "created", sha256: sha256Of(text) };
}
