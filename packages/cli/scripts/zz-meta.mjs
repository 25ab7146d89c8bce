import { build } from "esbuild";
const root = "/work/main/packages/cli/";
const entry = process.argv[2];
const r = await build({ entryPoints: [`${root}src/${entry}`], bundle: true, write: false, metafile: true, format: "esm", platform: "node", target: "node20", outdir: "/tmp/metaout",
  external: ["@jitl/*", "quickjs-emscripten-core", "playwright-core", "@sparticuz/chromium"], logLevel: "error" });
const out = Object.values(r.metafile.outputs)[0];
const sizes = {}; for (const [k, v] of Object.entries(out.inputs)) { const key = k.includes("node_modules") ? k.replace(/.*node_modules\/((@[^/]+\/)?[^/]+).*/, "$1") : k.replace(/.*packages\/([^/]+)\/src\/([^/]+).*/, "$1/$2"); sizes[key] = (sizes[key] ?? 0) + v.bytesInOutput; }
console.log(Object.entries(sizes).sort((a, b) => b[1] - a[1]).slice(0, 40).map(([k, v]) => `${k} ${v}`).join("\n"));
