/**
 * Node entry: a kernel on the release-sync variant, and a `readFile` that reads pinned data files beside a
 * document, refusing paths that leave the document's folder.
 */
import { readFile } from "node:fs/promises";
import { isAbsolute, relative, resolve } from "node:path";
import type { ReadFile } from "./data-cells.js";
import { createKernel, type Kernel } from "./kernel.js";

/** A kernel with the default (release-sync) module. */
export function createNodeKernel(): Kernel {
  return createKernel();
}

/** A ReadFile for data cells: paths are relative to `baseDir` and must stay inside it. */
export function fileReaderFor(baseDir: string): ReadFile {
  return async (path) => {
    const full = resolve(baseDir, path);
    const rel = relative(resolve(baseDir), full);
    if (isAbsolute(path) || rel.startsWith("..") || isAbsolute(rel)) {
      throw new Error(`${path} is outside the document's folder ${baseDir}; data files must sit beside the document`);
    }
    return new Uint8Array(await readFile(full));
  };
}
