/**
 * Production build of the workbench page: packages/viewer/dist (index.html, hashed assets, the kernel worker and
 * the QuickJS wasm), built on `npm ci` through the root `prepare` script and served by `conebook serve`. All
 * asset URLs are relative (`base: "./"`), so the page works under the server's per-start token prefix.
 */
import { defineConfig } from "vite";

export default defineConfig({
  root: new URL(".", import.meta.url).pathname,
  base: "./",
  logLevel: "warn",
  build: {
    outDir: "dist",
    emptyOutDir: true,
    target: "chrome120",
    chunkSizeWarningLimit: 4000,
    reportCompressedSize: false,
    modulePreload: { polyfill: false },
  },
  worker: { format: "es" },
});
