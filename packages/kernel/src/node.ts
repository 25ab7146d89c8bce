/**
 * Node entry: a kernel on the release-sync variant, and a `readFile` that reads pinned data files beside a
 * document, refusing paths that leave the document's folder, also through symbolic links.
 */
import { readFile, realpath } from "node:fs/promises";
import { isAbsolute, relative, resolve } from "node:path";
import { createKernel, type Kernel } from "./kernel.js";

/** A kernel with the default (release-sync) module. */
export function createNodeKernel(): Kernel {
  return createKernel();
}

/**
 * A ReadFile for data cells: paths are relative to `baseDir` and must stay inside it, also after following
 * symbolic links (the real path of the file must lie inside the real path of the folder).
 */
export function fileReaderFor(baseDir: string): (path: string) => Promise<Uint8Array> {
  return async (path) => {
    const full = resolve(baseDir, path);
    const rel = relative(resolve(baseDir), full);
    if (isAbsolute(path) || rel.startsWith("..") || isAbsolute(rel)) {
      throw new Error(`${path} is outside the document's folder ${baseDir}; data files must sit beside the document`);
    }
    const [realFolder, realFile] = await Promise.all([realpath(baseDir), realpath(full)]);
    const realRel = relative(realFolder, realFile);
    if (realRel.startsWith("..") || isAbsolute(realRel)) {
      throw new Error(`${path} leads outside the document's folder ${baseDir} (to ${realFile}); data files must sit beside the document, not be links to elsewhere`);
    }
    return new Uint8Array(await readFile(realFile));
  };
}
