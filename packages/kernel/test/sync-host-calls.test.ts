import { describe, expect, it } from "vitest";
import { newQuickJSWASMModuleFromVariant, type QuickJSSyncVariant } from "quickjs-emscripten-core";
import RELEASE_SYNC from "@jitl/quickjs-wasmfile-release-sync";
import { useSyncHostCalls } from "../src/sync-host-calls.js";

describe("synchronous host-function trampoline", () => {
  it("is installed on the pinned quickjs-emscripten and keeps values, this, thrown errors and { error } replies", async () => {
    const module = await newQuickJSWASMModuleFromVariant(RELEASE_SYNC as unknown as QuickJSSyncVariant);
    const ctx = module.newContext();
    expect(useSyncHostCalls(ctx)).toBe(true);
    let calls = 0;
    const fns = {
      add: ctx.newFunction("add", (a, b) => {
        calls++;
        return ctx.newNumber(ctx.getNumber(a) + ctx.getNumber(b));
      }),
      tag: ctx.newFunction("tag", function (this: unknown) {
        return ctx.getProp(this as never, "tag");
      }),
      nothing: ctx.newFunction("nothing", () => undefined),
      thrown: ctx.newFunction("thrown", () => {
        throw new Error("the host refused");
      }),
      replied: ctx.newFunction("replied", () => ({ error: ctx.newError({ name: "RangeError", message: "too large" }) })),
    };
    for (const [name, fn] of Object.entries(fns)) {
      ctx.setProp(ctx.global, name, fn);
      fn.dispose();
    }
    const run = (code: string) => {
      const handle = ctx.unwrapResult(ctx.evalCode(code));
      const value: unknown = ctx.dump(handle);
      handle.dispose();
      return value;
    };
    expect(run("let s = 0; for (let i = 0; i < 10000; i++) s = add(s, 1); s")).toBe(10000);
    expect(calls).toBe(10000);
    expect(run("({ tag: 'piezometer P2', f: tag }).f()")).toBe("piezometer P2");
    expect(run("typeof nothing()")).toBe("undefined");
    expect(run("try { thrown(); 'no error' } catch (e) { e.name + ': ' + e.message }")).toBe("Error: the host refused");
    expect(run("try { replied(); 'no error' } catch (e) { e.name + ': ' + e.message }")).toBe("RangeError: too large");
    ctx.dispose();
  });
});
