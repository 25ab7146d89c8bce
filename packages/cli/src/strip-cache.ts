/**
 * The CLI's cache of stripped cells: one small JSON file per cell source under the user's cache folder
 * (CONEBOOK_CACHE_DIR, else $XDG_CACHE_HOME/conebook, else ~/.cache/conebook), named by the SHA-256 of the type
 * stripper's version and the source, so a cold command skips sucrase for every cell it has seen before. A file
 * that cannot be read or parsed is a miss; a write that fails is dropped (the cache is never needed for a result).
 * Writes go to a temporary name and are renamed into place, so a reader never sees half a file.
 */
import { createHash } from "node:crypto";
import { mkdirSync, readFileSync, renameSync, writeFileSync } from "node:fs";
import { homedir } from "node:os";
import { join } from "node:path";
import type { StripCache, StrippedForm } from "@conebook/kernel";
import { SUCRASE_VERSION } from "./versions.js";

/** The folder the cache lives in. */
export function stripCacheFolder(): string {
  const base = process.env.CONEBOOK_CACHE_DIR ?? join(process.env.XDG_CACHE_HOME ?? join(homedir(), ".cache"), "conebook");
  return join(base, "stripped-cells");
}

/** A StripCache on files under `folder`. */
export function fileStripCache(folder = stripCacheFolder()): StripCache {
  const fileOf = (source: string) => join(folder, `${createHash("sha256").update(`sucrase ${SUCRASE_VERSION}\0${source}`).digest("hex")}.json`);
  let made = false;
  return {
    get(source) {
      try {
        const form = JSON.parse(readFileSync(fileOf(source), "utf8")) as Partial<StrippedForm> & { source?: unknown };
        return form.source === source && typeof form.code === "string" && typeof form.mappings === "string" ? { code: form.code, mappings: form.mappings } : undefined;
      } catch {
        return undefined;
      }
    },
    set(source, form) {
      try {
        if (!made) mkdirSync(folder, { recursive: true });
        made = true;
        const file = fileOf(source);
        const temporary = `${file}.${process.pid}.${Math.random().toString(36).slice(2)}.tmp`;
        writeFileSync(temporary, JSON.stringify({ source, ...form }));
        renameSync(temporary, file);
      } catch {
        // best effort: a cell whose form was not kept is stripped again next time
      }
    },
  };
}
