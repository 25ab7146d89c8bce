/**
 * Replacing a file so that it is never left half-written: the new bytes go to a temporary file in the same
 * folder, `FILE.tmp-<pid>-<16 random hex digits>`, created exclusively (it cannot overwrite or reuse anything),
 * are flushed to disk (fsync), and the temporary file is renamed over the original (rename within one file
 * system is atomic on POSIX). On any failure the temporary file is removed and the original is untouched.
 *
 * A process killed between creating and renaming its temporary file leaves it behind. Before writing, stale
 * temporary files of the same target are removed: those whose writer process no longer runs, those that bear
 * this process's pid but are not one of its writes in progress (a reused pid), and those older than
 * STALE_TEMPORARY_MS (a write takes milliseconds, so an older one is left over whatever its pid says).
 */
import { randomBytes } from "node:crypto";
import { open, readdir, rename, rm, stat } from "node:fs/promises";
import { basename, dirname, join } from "node:path";

/** Age after which a temporary file of a target is left over whatever its pid says, ms. */
export const STALE_TEMPORARY_MS = 60_000;

/** A file could not be written; the message names it and says why. The original file is unchanged. */
export class WriteError extends Error {
  override readonly name = "WriteError";
  constructor(
    message: string,
    readonly code?: string,
  ) {
    super(message);
  }
}

/** A fresh temporary name for a write to `path`: same folder, the pid and 64 random bits. */
export function temporaryPathFor(path: string, pid = process.pid): string {
  return `${path}.tmp-${pid}-${randomBytes(8).toString("hex")}`;
}

const TEMPORARY = /^\.tmp-(\d+)(?:-[0-9a-f]{16})?$/;
/** Base names of this process's temporary files being written now. */
const inProgress = new Set<string>();

function processRuns(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    return (e as NodeJS.ErrnoException).code === "EPERM";
  }
}

/**
 * True when `name` (a file in the target's folder) is a temporary file of a write to `target` (a base name) that
 * is left over: its writer no longer runs or it is older than STALE_TEMPORARY_MS. Names this module never
 * writes are never stale.
 */
export function isStaleTemporary(target: string, name: string, modifiedMs: number, nowMs = Date.now()): boolean {
  if (!name.startsWith(target)) return false;
  const m = TEMPORARY.exec(name.slice(target.length));
  if (!m) return false;
  const pid = Number(m[1]);
  if (pid === process.pid) return !inProgress.has(name);
  return nowMs - modifiedMs > STALE_TEMPORARY_MS || !processRuns(pid);
}

/** Removes the stale temporary files of `path` (best effort: a file another process removes first is fine). */
async function removeStaleTemporaries(path: string): Promise<void> {
  const folder = dirname(path);
  const target = basename(path);
  let names: string[];
  try {
    names = await readdir(folder);
  } catch {
    return;
  }
  await Promise.all(
    names
      .filter((n) => n.startsWith(`${target}.tmp-`))
      .map(async (n) => {
        try {
          if (isStaleTemporary(target, n, (await stat(join(folder, n))).mtimeMs)) await rm(join(folder, n), { force: true });
        } catch {
          // Gone already, or not ours to remove: the write below does not depend on it.
        }
      }),
  );
}

const REASONS: Record<string, string> = {
  ENOENT: "its folder does not exist",
  EACCES: "permission denied",
  EPERM: "the operation is not permitted",
  EROFS: "the file system is read-only",
  ENOSPC: "the disk is full",
  EDQUOT: "the disk quota is used up",
  EISDIR: "it is a folder",
  ENOTEMPTY: "it is a folder",
  ENOTDIR: "a part of its path is not a folder",
};

function writeError(path: string, e: unknown): WriteError {
  const code = (e as NodeJS.ErrnoException).code;
  const reason = code !== undefined && REASONS[code] !== undefined ? `${REASONS[code]} (${code})` : e instanceof Error ? e.message : String(e);
  return new WriteError(`cannot write ${path}: ${reason}; the file is unchanged`, code);
}

/** Writes `data` to `path` atomically (see the module comment). Throws WriteError after cleaning up. */
export async function writeFileAtomic(path: string, data: string | Uint8Array): Promise<void> {
  await removeStaleTemporaries(path);
  const tmp = temporaryPathFor(path);
  inProgress.add(basename(tmp));
  try {
    const handle = await open(tmp, "wx");
    try {
      await handle.writeFile(data);
      await handle.sync();
    } finally {
      await handle.close();
    }
    await rename(tmp, path);
  } catch (e) {
    await rm(tmp, { force: true });
    throw writeError(path, e);
  } finally {
    inProgress.delete(basename(tmp));
  }
  await syncFolder(dirname(path));
}

/** Flushes a folder's entry list so the rename survives a crash; best effort (not every platform allows it). */
async function syncFolder(folder: string): Promise<void> {
  try {
    const handle = await open(folder, "r");
    try {
      await handle.sync();
    } finally {
      await handle.close();
    }
  } catch {
    // Some file systems refuse fsync on a folder; the rename itself has already happened.
  }
}
