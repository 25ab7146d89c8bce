/**
 * Web Worker entry of the browser tests: the kernel on the release-sync QuickJS variant, its wasm file loaded
 * from beside this bundle (the test server serves both from one folder), behind the kernel's worker port.
 */
import { loadBrowserModule } from "../../packages/kernel/src/browser.js";
import { createKernel } from "../../packages/kernel/src/kernel.js";
import { serveKernelWorker, type KernelWorkerScope } from "@conebook/kernel/worker";

const wasmUrl = new URL("emscripten-module.wasm", import.meta.url).href;
serveKernelWorker(globalThis as unknown as KernelWorkerScope, createKernel({ loadModule: loadBrowserModule(wasmUrl) }));
