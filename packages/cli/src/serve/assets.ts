/**
 * The built workbench page (packages/viewer/dist, made by `npm run build:viewer`) read into memory once at
 * start: the server serves exactly these files and nothing else from disk, so no URL can reach another file.
 */
import { existsSync } from "node:fs";
import { readdir, readFile } from "node:fs/promises";
import { join, relative } from "node:path";
import { fileURLToPath } from "node:url";

/** One file of the page. */
export interface PageAsset {
  body: Buffer;
  contentType: string;
}

const TYPES: Record<string, string> = {
  html: "text/html; charset=utf-8",
  js: "text/javascript; charset=utf-8",
  css: "text/css; charset=utf-8",
  wasm: "application/wasm",
  svg: "image/svg+xml",
  json: "application/json; charset=utf-8",
  woff2: "font/woff2",
};

/**
 * The folder of the built page: CONEBOOK_VIEWER_DIST when set, else packages/viewer/dist found from this module
 * (the CLI runs from packages/cli/dist/ as a bundle or from packages/cli/src/serve/ through tsx).
 */
export function viewerDistFolder(): string | undefined {
  const chosen = process.env.CONEBOOK_VIEWER_DIST;
  if (chosen) return chosen;
  for (const up of ["../../viewer/dist/", "../../../viewer/dist/"]) {
    const folder = fileURLToPath(new URL(up, import.meta.url));
    if (existsSync(join(folder, "index.html"))) return folder;
  }
  return undefined;
}

async function listFiles(folder: string): Promise<string[]> {
  const out: string[] = [];
  for (const entry of await readdir(folder, { withFileTypes: true })) {
    const path = join(folder, entry.name);
    if (entry.isDirectory()) out.push(...(await listFiles(path)));
    else if (entry.isFile()) out.push(path);
  }
  return out;
}

/** Every file of the built page by URL path (`/index.html`, `/assets/...`); `/` serves index.html. */
export async function loadPageAssets(folder: string): Promise<Map<string, PageAsset>> {
  const assets = new Map<string, PageAsset>();
  for (const path of await listFiles(folder)) {
    const url = `/${relative(folder, path).split("\\").join("/")}`;
    const ext = url.slice(url.lastIndexOf(".") + 1).toLowerCase();
    assets.set(url, { body: await readFile(path), contentType: TYPES[ext] ?? "application/octet-stream" });
  }
  const index = assets.get("/index.html");
  if (index) assets.set("/", index);
  return assets;
}
