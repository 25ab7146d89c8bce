/**
 * The WebAssembly memory a sandbox's module runs on. The ES library types the kernel compiles against declare no
 * WebAssembly, so this names the part of `WebAssembly.Memory` the kernel uses; every host (Node, browsers,
 * workers) has the real thing.
 */

/** A WebAssembly.Memory as far as the kernel uses it. */
export interface WasmMemory {
  readonly buffer: ArrayBuffer;
}

const api = (globalThis as unknown as { WebAssembly: { Memory: new (descriptor: { initial: number; maximum: number }) => WasmMemory } }).WebAssembly;

/** A new memory of `initialPages` 64 KiB pages that can grow to `maximumPages`. */
export function newWasmMemory(initialPages: number, maximumPages: number): WasmMemory {
  return new api.Memory({ initial: initialPages, maximum: maximumPages });
}
