/**
 * The built workbench page for the browser tests and benchmarks: packages/viewer/dist, rebuilt with Vite when
 * any source it is built from (viewer, kernel, document, aquifer, docs/api.md) is newer than the build, so a
 * test never drives a stale page. `npm ci` builds it once through `prepare`.
 */
import { existsSync, readdirSync, statSync } from "node:fs";
import { join } from "node:path";
import { fileURLToPath } from "node:url";

const ROOT = fileURLToPath(new URL("../../", import.meta.url));
/** Folder of the built page. */
export const VIEWER_DIST = join(ROOT, "packages/viewer/dist");

function newest(path: string): number {
  const info = statSync(path);
  if (!info.isDirectory()) return info.mtimeMs;
  let n = info.mtimeMs;
  for (const name of readdirSync(path)) if (name !== "node_modules" && name !== "dist") n = Math.max(n, newest(join(path, name)));
  return n;
}

/** True when dist/index.html exists and is newer than every source of the page. */
export function viewerBuildIsFresh(): boolean {
  const index = join(VIEWER_DIST, "index.html");
  if (!existsSync(index)) return false;
  const built = statSync(index).mtimeMs;
  const sources = ["packages/viewer/src", "packages/viewer/index.html", "packages/viewer/vite.config.ts", "packages/kernel/src", "packages/document/src", "packages/aquifer/src", "docs/api.md"];
  return sources.every((s) => newest(join(ROOT, s)) <= built);
}

/** Builds the page with Vite unless the build is fresh; returns the build time in ms (0 when nothing was built). */
export async function ensureViewerBuilt(): Promise<number> {
  if (viewerBuildIsFresh()) return 0;
  const t0 = performance.now();
  const { build } = await import("vite");
  await build({ configFile: join(ROOT, "packages/viewer/vite.config.ts"), logLevel: "error" });
  return performance.now() - t0;
}
