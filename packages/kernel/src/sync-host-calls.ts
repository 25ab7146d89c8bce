/**
 * A synchronous trampoline for the host functions of one QuickJS context.
 *
 * quickjs-emscripten (0.32.0, pinned exactly in package.json) runs every call of a host function made with
 * `newFunction` through a generator, so that a host function may return a promise on the asyncified build. The
 * sandbox uses the synchronous build and host functions that never return promises, and the generator costs: in a
 * cell making 20,000 bridge calls it took 1.2 s of the 7.5 s the cell ran (profiled with node --cpu-prof; 16 % of
 * every call). This replaces, for one context, the callback the library registered for C-to-host calls with one
 * that does the same work without the generator: the same weak handles for `this` and the arguments, the same
 * handling of a returned handle, `{ value }` or `{ error }`, and of a thrown error (thrown into the guest).
 *
 * It relies on three internals of that version: the context's `cToHostCallbacks` object (which the module's
 * callback table holds by reference), `ffi` and `memory`. `useSyncHostCalls` checks they exist and leaves the
 * library's trampoline in place when they do not, so an upgrade that changes them is slower, not broken; the
 * kernel's tests (every bridge call) cover both the returned-value and the thrown-error paths.
 */
import { Lifetime, WeakLifetime, type QuickJSContext, type QuickJSHandle } from "quickjs-emscripten-core";

type CallFunction = (ctxPtr: number, thisPtr: number, argc: number, argv: number, fnId: number) => number;

interface ContextInternals {
  cToHostCallbacks?: { callFunction?: CallFunction };
  ctx?: { value: number };
  ffi?: { QTS_ArgvGetJSValueConstPointer(argv: number, i: number): number; QTS_DupValuePointer(ctx: number, v: number): number; QTS_Throw(ctx: number, v: number): number };
  memory?: { copyJSValue: (v: number) => number; freeJSValue: (v: number) => void };
  runtime?: unknown;
  getFunction?: (id: number) => unknown;
  errorToHandle?: (e: unknown) => QuickJSHandle;
}

type HostResult = QuickJSHandle | { value: QuickJSHandle; error?: undefined } | { error: QuickJSHandle } | undefined | void;

/**
 * Makes the host functions of `context` run without the library's generator trampoline; returns false (and changes
 * nothing) when this version of quickjs-emscripten does not have the internals it needs.
 */
export function useSyncHostCalls(context: QuickJSContext): boolean {
  const c = context as unknown as ContextInternals;
  const callbacks = c.cToHostCallbacks;
  const { ffi, memory, runtime } = c;
  if (!callbacks || typeof callbacks.callFunction !== "function" || !c.ctx || !ffi || !memory || !runtime) return false;
  if (typeof c.getFunction !== "function" || typeof c.errorToHandle !== "function") return false;
  const ctxPtr = c.ctx.value;
  const getFunction = c.getFunction.bind(context);
  const errorToHandle = c.errorToHandle.bind(context);
  const weak = (ptr: number) => new WeakLifetime(ptr, memory.copyJSValue, memory.freeJSValue, runtime as never) as unknown as QuickJSHandle;
  callbacks.callFunction = (calledCtx, thisPtr, argc, argv, fnId) => {
    if (calledCtx !== ctxPtr) throw new Error("a host function of another QuickJS context was called through this one");
    const fn = getFunction(fnId) as (this: QuickJSHandle, ...args: QuickJSHandle[]) => HostResult;
    const thisHandle = weak(thisPtr);
    const args = new Array<QuickJSHandle>(argc);
    for (let i = 0; i < argc; i++) args[i] = weak(ffi.QTS_ArgvGetJSValueConstPointer(argv, i));
    let returned: QuickJSHandle | undefined;
    try {
      const result = fn.apply(thisHandle, args);
      if (!result) return 0;
      if (result instanceof Promise) throw new Error("a sandbox host function returned a promise; host functions must be synchronous");
      if (!(result instanceof Lifetime) && "error" in result && result.error) throw result.error;
      returned = result instanceof Lifetime ? result : (result as { value: QuickJSHandle }).value;
      return ffi.QTS_DupValuePointer(ctxPtr, returned.value);
    } catch (error) {
      return errorToHandle(error).consume((h) => ffi.QTS_Throw(ctxPtr, h.value));
    } finally {
      if (returned?.alive) returned.dispose();
      thisHandle.dispose();
      for (const a of args) a.dispose();
    }
  };
  return true;
}
