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
const common = {
  outdir: staging,
  bundle: true,
  format: "esm",
  platform: "node",
  target: "node20",
  // playwright-core and @sparticuz/chromium (PDF printing) find their own files beside their modules too.
  external: ["@jitl/*", "quickjs-emscripten-core", "playwright-core", "@sparticuz/chromium"],
  // Some bundled CommonJS modules call require() for Node built-ins.
  banner: { js: "import { createRequire as conebookCreateRequire } from 'node:module'; const require = conebookCreateRequire(import.meta.url);" },
  logLevel: "warning",
};
// Two bundles. The command (main thread) is split by subcommand (cli.ts imports each command when it is run), so
// `conebook verify` loads the document format and the comparison, not the aquifer library, the type stripper and
// the sandbox, which only the run worker needs. The run worker (src/run-worker.ts, started by execute.ts from
// beside the bundle) is one file with everything it runs. Shared chunks between the two would make the command
// load the worker's code again, since esbuild puts code both reach into one chunk.
await build({ ...common, entryPoints: { conebook: `${root}src/main.ts` }, splitting: true });
await build({ ...common, entryPoints: { "run-worker": `${root}src/run-worker.ts` } });
await rm(`${root}dist`, { recursive: true, force: true });
await rename(staging, `${root}dist`);
