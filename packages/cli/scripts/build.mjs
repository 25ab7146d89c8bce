// Bundles the `conebook` command into packages/cli/dist/ with esbuild, so that it starts without compiling
// TypeScript at each launch (bin/conebook.js uses the bundle while it is newer than every source file).
// The QuickJS packages stay external: they locate their .wasm file relative to their own module; so do the
// browser packages used for PDF printing.
import { build } from "esbuild";
import { rename, rm } from "node:fs/promises";
import { fileURLToPath } from "node:url";

const root = fileURLToPath(new URL("..", import.meta.url));
// Built beside dist/ and swapped in, so a launcher never imports a half-written bundle.
const staging = `${root}dist.tmp-${process.pid}`;
await rm(staging, { recursive: true, force: true });
await build({
  // The run worker (src/run-worker.ts) is a second entry: execute.ts starts it from beside the bundle.
  entryPoints: { conebook: `${root}src/main.ts`, "run-worker": `${root}src/run-worker.ts` },
  outdir: staging,
  bundle: true,
  splitting: true,
  format: "esm",
  platform: "node",
  target: "node20",
  // playwright-core and @sparticuz/chromium (PDF printing) find their own files beside their modules too.
  external: ["@jitl/*", "quickjs-emscripten-core", "playwright-core", "@sparticuz/chromium"],
  // Some bundled CommonJS modules call require() for Node built-ins.
  banner: { js: "import { createRequire as conebookCreateRequire } from 'node:module'; const require = conebookCreateRequire(import.meta.url);" },
  logLevel: "warning",
});
await rm(`${root}dist`, { recursive: true, force: true });
await rename(staging, `${root}dist`);
