/**
 * Builds the browser test page in memory: the page script and the kernel worker bundled by esbuild (platform
 * browser, ESM), the QuickJS release-sync wasm file beside them, and an HTML page. Nothing is written to disk.
 */
import { readFile } from "node:fs/promises";
import { createRequire } from "node:module";
import { fileURLToPath } from "node:url";
import { build } from "esbuild";

/** One file the test server serves. */
export interface Asset {
  body: Uint8Array;
  contentType: string;
}

const HERE = fileURLToPath(new URL(".", import.meta.url));
const KERNEL_PACKAGE = fileURLToPath(new URL("../../packages/kernel/package.json", import.meta.url));

const PAGE_HTML = `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<title>Conebook kernel in a worker</title>
<link rel="icon" href="data:,">
<script type="module" src="./page.js"></script>
</head>
<body><p>Conebook kernel browser test page.</p></body>
</html>
`;

/** The page's files by URL path (`/`, `/page.js`, `/worker.js`, `/emscripten-module.wasm`) and the build time in ms. */
export async function buildTestPage(): Promise<{ assets: Map<string, Asset>; buildMs: number }> {
  const t0 = performance.now();
  const result = await build({
    entryPoints: { page: `${HERE}page-harness.ts`, worker: `${HERE}worker-entry.ts` },
    outdir: "/conebook-test-page",
    write: false,
    bundle: true,
    format: "esm",
    platform: "browser",
    target: "chrome120",
    logLevel: "silent",
  });
  if (result.errors.length > 0) throw new Error(`bundling the test page failed: ${result.errors.map((e) => e.text).join("; ")}`);
  const assets = new Map<string, Asset>();
  for (const out of result.outputFiles) {
    const name = out.path.slice(out.path.lastIndexOf("/"));
    assets.set(name, { body: out.contents, contentType: "text/javascript; charset=utf-8" });
  }
  const wasmPath = createRequire(KERNEL_PACKAGE).resolve("@jitl/quickjs-wasmfile-release-sync/wasm");
  assets.set("/emscripten-module.wasm", { body: new Uint8Array(await readFile(wasmPath)), contentType: "application/wasm" });
  assets.set("/", { body: new TextEncoder().encode(PAGE_HTML), contentType: "text/html; charset=utf-8" });
  return { assets, buildMs: performance.now() - t0 };
}
