#!/usr/bin/env node
// Launcher of the `conebook` command. Runs the esbuild bundle (dist/conebook.js, made by scripts/build.mjs)
// when it is newer than every source file it was built from; otherwise runs the TypeScript entry through tsx,
// so a stale bundle is never used. CONEBOOK_NO_BUNDLE=1 always takes the tsx route.
import { readdirSync, statSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { setFlagsFromString } from "node:v8";

// The sandbox (QuickJS) is WebAssembly. V8's optimising tier for it costs more CPU than it saves over the seconds a
// command lasts: measured with `npm run bench` and /usr/bin/time on the demo, a cold verify took 0.82 s of CPU
// with it and 0.63 s with the baseline compiler alone, and even a guest loop of 9 s CPU ran faster without it
// (7.3 s). WebAssembly arithmetic gives the same bits in either tier, so results do not change. Set before the
// run worker compiles the module; the flag is process-wide, so the worker thread inherits it.
setFlagsFromString("--liftoff-only");

const packages = fileURLToPath(new URL("../../", import.meta.url));
const bundle = fileURLToPath(new URL("../dist/conebook.js", import.meta.url));

function newestSource(folder) {
  let newest = 0;
  for (const entry of readdirSync(folder, { withFileTypes: true })) {
    const path = `${folder}/${entry.name}`;
    if (entry.isDirectory()) newest = Math.max(newest, newestSource(path));
    else if (entry.name.endsWith(".ts") || entry.name.endsWith(".json")) newest = Math.max(newest, statSync(path).mtimeMs);
  }
  return newest;
}

function bundleIsFresh() {
  if (process.env.CONEBOOK_NO_BUNDLE === "1") return false;
  let built;
  try {
    built = statSync(bundle).mtimeMs;
  } catch {
    return false;
  }
  for (const name of ["aquifer", "document", "kernel", "cli"]) {
    const base = `${packages}${name}`;
    if (newestSource(`${base}/src`) > built || statSync(`${base}/package.json`).mtimeMs > built) return false;
  }
  return true;
}

if (bundleIsFresh()) {
  await import(bundle);
} else {
  const { register } = await import("tsx/esm/api");
  register();
  await import("../src/main.ts");
}
