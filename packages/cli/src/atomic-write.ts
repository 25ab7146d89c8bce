/**
 * Replacing a file so that it is never left half-written: the new bytes go to `FILE.tmp-<pid>` in the same
 * folder, are flushed to disk (fsync), and the temporary file is renamed over the original (rename within one
 * file system is atomic on POSIX). On any failure the temporary file is removed and the original is untouched.
 */
import { open, rename, rm } from "node:fs/promises";
import { dirname } from "node:path";

/** The temporary name a write to `path` uses. */
export function temporaryPathFor(path: string, pid = process.pid): string {
  return `${path}.tmp-${pid}`;
}

/** Writes `data` to `path` atomically (see the module comment). Throws the underlying error after cleaning up. */
export async function writeFileAtomic(path: string, data: string | Uint8Array): Promise<void> {
  const tmp = temporaryPathFor(path);
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
    throw e;
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
