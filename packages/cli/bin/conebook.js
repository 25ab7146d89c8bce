#!/usr/bin/env node
// Launcher of the `conebook` command. Runs the esbuild bundle (dist/conebook.js, made by scripts/build.mjs)
// when it is newer than every source file it was built from; otherwise runs the TypeScript entry through tsx,
// so a stale bundle is never used. CONEBOOK_NO_BUNDLE=1 always takes the tsx route.
import { readdirSync, statSync } from "node:fs";
import { fileURLToPath } from "node:url";

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
