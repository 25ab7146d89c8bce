/**
 * The page's kernel worker: the kernel's own worker entry (packages/kernel/src/worker.ts) on the release-sync
 * QuickJS variant, its wasm file located by Vite (`?url`, the browser entry's loader; see packages/kernel/src/browser.ts).
 */
import wasmUrl from "@jitl/quickjs-wasmfile-release-sync/wasm?url";
import { createKernel } from "@conebook/kernel";
import { loadBrowserModule } from "@conebook/kernel/browser";
import { serveKernelWorker, type KernelWorkerScope } from "@conebook/kernel/worker";

serveKernelWorker(globalThis as unknown as KernelWorkerScope, createKernel({ loadModule: loadBrowserModule(new URL(wasmUrl, import.meta.url).href) }));
