/**
 * Browser entry: loads the release-sync QuickJS variant from an explicit wasm URL. Under Vite, import the URL
 * with `import wasmUrl from "@jitl/quickjs-wasmfile-release-sync/wasm?url"` in the viewer and pass it here;
 * the default loader breaks under the dev pre-bundler, which moves the JavaScript but not the wasm.
 * (The cast: the package's types describe its CommonJS build; its ESM build has the variant as default export.)
 */
import { newQuickJSWASMModuleFromVariant, newVariant, type QuickJSSyncVariant, type QuickJSWASMModule } from "quickjs-emscripten-core";
import RELEASE_SYNC from "@jitl/quickjs-wasmfile-release-sync";
import type { WasmMemory } from "./wasm-memory.js";

/** A module loader for createKernel({ loadModule }) that fetches the wasm from `wasmLocation` and runs it on the kernel's memory. */
export function loadBrowserModule(wasmLocation: string): (memory: WasmMemory) => Promise<QuickJSWASMModule> {
  // `as never`: WasmMemory is a real WebAssembly.Memory, a type the ES library the kernel compiles against lacks.
  return (memory) => newQuickJSWASMModuleFromVariant(newVariant(RELEASE_SYNC as unknown as QuickJSSyncVariant, { wasmLocation, wasmMemory: memory as never }));
}
