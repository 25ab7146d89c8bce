/**
 * One QuickJS runtime and context with Conebook's limits and bridge installed: the place cells run.
 *
 * Limits: a memory limit for the runtime (`setMemoryLimit`), a 128 KiB stack limit (`setMaxStackSize`; without
 * one, deep recursion overflows the host stack), and a fresh deadline interrupt for each evaluation. The
 * interrupt is checked by the interpreter only every 10,000 steps and never inside one native builtin or a host
 * bridge call, so three more guards hold the limits there:
 *  - the prelude meters the builtins that work through a length (guest-prelude.ts) and calls `host.overdue`
 *    every WORK_CHECK_UNITS of work; past the deadline it spins, so the interrupt stops the cell;
 *  - host functions with long loops call checkHostDeadline (host-budget.ts); a call stopped there stops the cell;
 *  - QuickJS's allocator limit misses typed arrays and string data, so the sandbox also watches the WebAssembly
 *    memory itself: the kernel gives each module a memory that cannot grow past SANDBOX_BASE_MB + memoryMb +
 *    HOST_RESERVE_MB, a run that grows it past SANDBOX_BASE_MB + memoryMb is stopped with the memory message,
 *    and the host writes a reply into the sandbox only when the memory can hold it.
 * A stop the host decides (a forced abort) cannot be caught by the cell: the interrupt handler keeps returning
 * true. After an abort (time, memory or stack) the sandbox is marked `broken` and must be disposed; a browser host
 * also keeps a worker it can terminate, and the CLI a watchdog, for work no guard sees.
 *
 * Every handle made here is disposed before the call that made it returns, except the prelude's internals,
 * which the sandbox owns and frees in `dispose`.
 */
import type { QuickJSContext, QuickJSHandle, QuickJSRuntime, QuickJSWASMModule } from "quickjs-emscripten-core";
import { BRIDGE_API } from "./bridge-api.js";
import { HostTimeLimitError, withHostDeadline } from "./host-budget.js";
import { HOST_RESERVE_MB, MAX_ELEMENTS_PER_CALL, MAX_PROXY_KEYS, MAX_STRING_LENGTH, SANDBOX_BASE_MB, TEXT_REFERENCE_MIN_LENGTH, WORK_CHECK_UNITS } from "./limits.js";
import { numericColumnsOf, type DataTable } from "./data-cells.js";
import { GUEST_PRELUDE, GUEST_PRELUDE_FILENAME } from "./guest-prelude.js";
import { useSyncHostCalls } from "./sync-host-calls.js";
import { ArgumentError } from "./validators.js";
import type { WasmMemory } from "./wasm-memory.js";
import { decodeWireValue, encodeHostValue, type WireValue } from "./wire.js";

/** The stack limit of every sandbox: 128 KiB, safe in Node, Chromium and workers. */
export const STACK_LIMIT_BYTES = 128 * 1024;

/** Why an evaluation was stopped by a limit rather than by a thrown error. */
export type AbortKind = "time" | "memory" | "stack";

/** A guest error as plain data: name, message and the guest stack text. */
export interface GuestError {
  name: string;
  message: string;
  stack: string;
  abort?: AbortKind;
}

/** What an evaluation produced: a value decoded from the guest, or a guest error. */
export type Outcome<T> = { ok: true; value: T } | { ok: false; error: GuestError };

/** Callbacks the guest's `show` and `control` reach; the kernel points them at the current cell. */
export interface SandboxHooks {
  /** A display record from `show(...)` (decoded wire data, not yet validated). */
  emit(display: unknown): void;
  /** `control(name, options)`: returns the value the cell gets; throws ArgumentError for bad options. */
  control(name: unknown, options: unknown): number;
  /**
   * Where a text a cell passed to the bridge came from, when it is a data cell's CSV: a function from a 1-based
   * line of the text to its place ("data/obs.csv:10"). Used to add the file and its line to CSV errors.
   */
  placeOfText?(text: string): ((line: number) => string) | undefined;
}

/** Settings of a new sandbox. */
export interface SandboxOptions {
  memoryLimitBytes: number;
  seed: number;
  hooks: SandboxHooks;
  /**
   * Largest size the module's WebAssembly memory can grow to, bytes, when the host created that memory with a
   * maximum (see kernel.ts); default 2 GiB, the most a module makes for itself.
   */
  wasmMaxBytes?: number;
}

const MIB = 2 ** 20;
/** What a module's own WebAssembly memory can grow to (emscripten's default maximum of 32768 pages). */
const MODULE_DEFAULT_MAX_BYTES = 2 * 1024 * MIB;
/** Room kept free beyond a reply's own bytes when the host writes it into the sandbox. */
const WRITE_HEADROOM_BYTES = MIB;

function errorMessage(e: unknown): { name: string; message: string } {
  if (e instanceof Error) return { name: e.name, message: e.message };
  return { name: "Error", message: String(e) };
}

/**
 * A CSV error whose problems carry a line of the text (`row`) gets each problem restated at its place in the data
 * file or document ("data/obs.csv:10: column 'depth_to_water_m' (2): the level is missing"); others pass as they are.
 */
function withTextPlaces(e: unknown, place: ((line: number) => string) | undefined): unknown {
  if (!place || !(e instanceof Error) || e.name !== "CsvError") return e;
  const problems = (e as Error & { problems?: readonly { row?: number; message: string; fix: string }[] }).problems ?? [];
  const placed = problems.filter((p) => typeof p.row === "number").slice(0, 20);
  if (placed.length === 0) return e;
  const lines = placed.map((p) => `${place(p.row!)}: ${p.message.replace(/^row \d+(, |: )?/, "")}. Fix: ${p.fix}.`);
  const out = new Error(`${e.message}\nWhere in the data:\n${lines.join("\n")}`);
  out.name = e.name;
  return out;
}

/** The guest-facing name of a host error: "aq.expint1: ..." (a message already starting with the bare name keeps one prefix). */
function bridgeErrorMessage(guestName: string, e: unknown): { name: string; message: string } {
  const { name, message } = errorMessage(e);
  if (e instanceof ArgumentError) return { name: "TypeError", message };
  const bare = guestName.slice(guestName.indexOf(".") + 1);
  const rest = message.startsWith(`${bare}: `) ? message.slice(bare.length + 2) : message;
  return { name: name === "Error" ? "Error" : name, message: `${guestName}: ${rest}` };
}

/** A QuickJS context ready to run cells. */
export class Sandbox {
  readonly runtime: QuickJSRuntime;
  readonly context: QuickJSContext;
  private readonly internals: QuickJSHandle;
  private deadline = Infinity;
  private interrupted = false;
  /** A stop the host decided; the interrupt handler then stops the guest whatever it catches. */
  private forcedAbort: AbortKind | undefined;
  private readonly memory: WasmMemory;
  /** The memory may not grow past this during a run (SANDBOX_BASE_MB + the run's limit), bytes. */
  private readonly softCapBytes: number;
  /** The memory cannot grow past this, bytes. */
  readonly capBytes: number;
  /** The data tables defined so far, by the index the guest knows them by (their parts are sent when read). */
  private readonly tables: DataTable[] = [];
  /** True after an abort: the runtime may be in a bad state; dispose it. */
  broken = false;
  hooks: SandboxHooks;

  /** Creates a runtime and context on `module`, installs limits, bridge and prelude. Cost: about a millisecond. */
  constructor(module: QuickJSWASMModule, options: SandboxOptions) {
    this.hooks = options.hooks;
    this.memory = module.getWasmMemory();
    this.capBytes = options.wasmMaxBytes ?? MODULE_DEFAULT_MAX_BYTES;
    this.softCapBytes = Math.min(this.capBytes - HOST_RESERVE_MB * MIB, SANDBOX_BASE_MB * MIB + options.memoryLimitBytes);
    this.runtime = module.newRuntime();
    this.runtime.setMemoryLimit(options.memoryLimitBytes);
    this.runtime.setMaxStackSize(STACK_LIMIT_BYTES);
    this.runtime.setInterruptHandler(() => this.overdue());
    this.context = this.runtime.newContext();
    useSyncHostCalls(this.context);
    try {
      this.internals = this.installPrelude(options.seed);
    } catch (e) {
      this.context.dispose();
      this.runtime.dispose();
      throw e;
    }
  }

  /** Size of the sandbox's WebAssembly memory now, bytes (it never shrinks, so this is the run's peak). */
  memoryBytes(): number {
    return this.memory.buffer.byteLength;
  }

  /** True when the guest must stop: a forced abort, the deadline passed, or the memory grew past its limit. */
  private overdue(): boolean {
    if (this.forcedAbort !== undefined) return true;
    if (Date.now() > this.deadline) {
      this.interrupted = true;
      return true;
    }
    if (this.memoryBytes() > this.softCapBytes) {
      this.forcedAbort = "memory";
      return true;
    }
    return false;
  }

  /** Throws (and stops the run at the memory limit) unless `bytes` more can be written into the sandbox. */
  private ensureRoom(bytes: number): void {
    if (this.capBytes - this.memoryBytes() >= bytes + WRITE_HEADROOM_BYTES) return;
    this.forcedAbort = "memory";
    throw new Error(`the reply of ${Math.ceil(bytes / MIB)} MiB does not fit in the sandbox's memory`);
  }

  private installPrelude(seed: number): QuickJSHandle {
    const ctx = this.context;
    const preludeFn = ctx.unwrapResult(ctx.evalCode(GUEST_PRELUDE, GUEST_PRELUDE_FILENAME, { type: "global", strict: true }));
    const host = ctx.newObject();
    const call = ctx.newFunction("call", (nameH, jsonH, ...bufferHs) => this.hostCall(nameH, jsonH, bufferHs));
    const emit = ctx.newFunction("emit", (jsonH, ...bufferHs) => this.hostEmit(jsonH, bufferHs));
    const control = ctx.newFunction("control", (jsonH, ...bufferHs) => this.hostControl(jsonH, bufferHs));
    const overdue = ctx.newFunction("overdue", () => (this.overdue() ? ctx.true : ctx.false));
    const part = ctx.newFunction("part", (indexH, whichH) => this.hostTablePart(indexH, whichH));
    ctx.setProp(host, "call", call);
    ctx.setProp(host, "emit", emit);
    ctx.setProp(host, "control", control);
    ctx.setProp(host, "overdue", overdue);
    ctx.setProp(host, "part", part);
    call.dispose();
    emit.dispose();
    control.dispose();
    overdue.dispose();
    part.dispose();
    const names = Object.keys(BRIDGE_API);
    const configJson = JSON.stringify({
      seed,
      aquifer: names.filter((n) => n.startsWith("aq.")),
      charts: names.filter((n) => n.startsWith("charts.")),
      maxElements: MAX_ELEMENTS_PER_CALL,
      workCheck: WORK_CHECK_UNITS,
      maxProxyKeys: MAX_PROXY_KEYS,
      textReferenceMin: TEXT_REFERENCE_MIN_LENGTH,
    });
    const config = ctx.unwrapResult(ctx.evalCode(`(${configJson})`, GUEST_PRELUDE_FILENAME));
    const result = ctx.callFunction(preludeFn, ctx.undefined, host, config);
    preludeFn.dispose();
    host.dispose();
    config.dispose();
    return ctx.unwrapResult(result);
  }

  /** Reads wire data the guest sent (its text, then each buffer as an argument); buffers are copied out of QuickJS memory. */
  private readWire(jsonH: QuickJSHandle, bufferHs: readonly QuickJSHandle[]): WireValue {
    const ctx = this.context;
    const json = ctx.getString(jsonH);
    const buffers: ArrayBuffer[] = [];
    for (const h of bufferHs) {
      const bytes = ctx.getArrayBuffer(h);
      buffers.push(bytes.value.slice().buffer as ArrayBuffer);
      bytes.dispose();
    }
    return { json, buffers };
  }

  /**
   * Builds the wire value the prelude's `decode` reads: the text alone when there are no buffers (most replies),
   * else the array [text, buffer0, buffer1, ...].
   */
  private newWire(value: unknown): QuickJSHandle {
    const ctx = this.context;
    // The bytes are copied into QuickJS memory at once, so the wire may share the host arrays' buffers.
    const wire = encodeHostValue(value, { shareBuffers: true });
    // Each buffer is copied twice on its way in (a heap buffer, then the ArrayBuffer), the text once as UTF-8.
    this.ensureRoom(3 * wire.json.length + 2 * wire.buffers.reduce((n, b) => n + b.byteLength, 0));
    const json = ctx.newString(wire.json);
    if (wire.buffers.length === 0) return json;
    const out = ctx.newArray();
    ctx.setProp(out, 0, json);
    json.dispose();
    wire.buffers.forEach((b, i) => {
      const h = ctx.newArrayBuffer(b);
      ctx.setProp(out, i + 1, h);
      h.dispose();
    });
    return out;
  }

  /** A host call that reached the cell's deadline (HostTimeLimitError) stops the cell: the cell cannot catch it. */
  private stopIfPastDeadline(e: unknown): void {
    if (!(e instanceof HostTimeLimitError)) return;
    this.interrupted = true;
    this.forcedAbort = "time";
  }

  private hostCall(nameH: QuickJSHandle, jsonH: QuickJSHandle, bufferHs: readonly QuickJSHandle[]) {
    const ctx = this.context;
    const guestName = ctx.getString(nameH);
    const entry = Object.hasOwn(BRIDGE_API, guestName) ? BRIDGE_API[guestName] : undefined;
    try {
      if (!entry) throw new ArgumentError(`${guestName} is not an available function`);
      const args = decodeWireValue(this.readWire(jsonH, bufferHs), this.tableTexts) as unknown[];
      if (args.length > entry.args.length) {
        throw new ArgumentError(`${guestName} takes ${entry.args.length} argument(s) (${entry.args.map((a) => a.name).join(", ")}), got ${args.length}`);
      }
      const checked = entry.args.map((a, i) => a.validator.check(args[i], `${guestName}: argument ${i + 1} (${a.name})`));
      try {
        return this.newWire(withHostDeadline(this.deadline, () => (entry.call as (...a: unknown[]) => unknown)(...checked)));
      } catch (e) {
        throw withTextPlaces(e, typeof checked[0] === "string" ? this.hooks.placeOfText?.(checked[0]) : undefined);
      }
    } catch (e) {
      this.stopIfPastDeadline(e);
      return { error: ctx.newError(bridgeErrorMessage(guestName, e)) };
    }
  }

  /** The CSV text of every table, by table index: a text reference from the guest names one of these. */
  private readonly tableTexts = (index: number): string | undefined => this.tables[index]?.csv;

  /**
   * A part of data table `index` that a cell reads for the first time: column `which` (its values, a fresh copy)
   * or, for -1, the CSV text. Sent only when read, so a large record that only goes to an importer as text never
   * crosses as columns, and one that is read by columns never crosses as text.
   */
  private hostTablePart(indexH: QuickJSHandle, whichH: QuickJSHandle) {
    const ctx = this.context;
    try {
      const table = this.tables[ctx.getNumber(indexH)];
      const which = ctx.getNumber(whichH);
      if (!table) throw new Error("no such data table");
      if (which === -1) {
        this.ensureRoom(3 * table.csv.length);
        return ctx.newString(table.csv);
      }
      // A text column is read from the CSV text on first use, within the cell's deadline.
      const column = which >= 0 && which < table.values.length ? withHostDeadline(this.deadline, () => table.values[which]) : undefined;
      if (!column) throw new Error("no such column");
      return this.newWire(column instanceof Float64Array ? column.slice() : column);
    } catch (e) {
      this.stopIfPastDeadline(e);
      return { error: ctx.newError(errorMessage(e)) };
    }
  }

  private hostEmit(jsonH: QuickJSHandle, bufferHs: readonly QuickJSHandle[]) {
    try {
      this.hooks.emit(decodeWireValue(this.readWire(jsonH, bufferHs)));
      return undefined;
    } catch (e) {
      return { error: this.context.newError(errorMessage(e)) };
    }
  }

  private hostControl(jsonH: QuickJSHandle, bufferHs: readonly QuickJSHandle[]) {
    try {
      const [name, options] = decodeWireValue(this.readWire(jsonH, bufferHs)) as unknown[];
      return this.newWire(this.hooks.control(name, options));
    } catch (e) {
      const { message } = errorMessage(e);
      return { error: this.context.newError({ name: e instanceof ArgumentError ? "TypeError" : "Error", message }) };
    }
  }

  /** Turns a guest error handle into plain data, classifying limit aborts. Disposes the handle. */
  private takeError(h: QuickJSHandle): GuestError {
    const described = this.describeThrown(h);
    const dumped: unknown = described === undefined ? this.context.dump(h) : undefined;
    h.dispose();
    let error: GuestError;
    if (described !== undefined) {
      const [, nameLength, messageLength, rest] = /^(\d+),(\d+),([\s\S]*)$/.exec(described)!;
      const a = Number(nameLength), b = a + Number(messageLength);
      error = { name: rest!.slice(0, a), message: rest!.slice(a, b), stack: rest!.slice(b) };
    } else if (dumped !== null && typeof dumped === "object") {
      const d = dumped as Record<string, unknown>;
      error = { name: String(d.name ?? "Error"), message: String(d.message ?? ""), stack: String(d.stack ?? "") };
    } else error = { name: "Error", message: `a value was thrown that is not an Error: ${String(dumped)}`, stack: "" };
    if (this.forcedAbort !== undefined) error.abort = this.forcedAbort;
    else if (this.interrupted && error.name === "InternalError" && error.message === "interrupted") error.abort = "time";
    else if (error.name === "InternalError" && error.message === "out of memory") error.abort = "memory";
    // An allocation that failed for want of WebAssembly memory can leave an error that cannot even be described.
    else if (this.memoryBytes() > this.softCapBytes) error.abort = "memory";
    // JSON.parse of deeply nested text reports its stack overflow as a SyntaxError.
    else if ((error.name === "InternalError" || error.name === "SyntaxError") && error.message === "stack overflow") error.abort = "stack";
    else if (error.name === "RangeError" && /Maximum call stack/.test(error.message)) error.abort = "stack";
    // The engine was interrupted at the deadline while the host read the thrown value (a getter that never returns).
    else if (this.interrupted) error.abort = "time";
    if (error.abort) this.broken = true;
    else if (error.name === "InternalError" && error.message === "string too long") {
      error.message = `string too long: a string in a cell may hold at most ${MAX_STRING_LENGTH} characters; build the text in smaller parts`;
    }
    return error;
  }

  /** The guest's own description of a thrown object (see describeThrown in the prelude), or undefined. */
  private describeThrown(h: QuickJSHandle): string | undefined {
    const ctx = this.context;
    const kind = ctx.typeof(h);
    if (kind !== "object" && kind !== "function") return undefined;
    const fnH = ctx.getProp(this.internals, "describeThrown");
    const result = ctx.callFunction(fnH, ctx.undefined, h);
    fnH.dispose();
    if (result.error) {
      result.error.dispose();
      return undefined;
    }
    const text = ctx.typeof(result.value) === "string" ? ctx.getString(result.value) : undefined;
    result.value.dispose();
    return text;
  }

  private withDeadline<T>(timeLimitMs: number, run: () => Outcome<T>): Outcome<T> {
    this.interrupted = false;
    this.deadline = Date.now() + timeLimitMs;
    try {
      return this.guarded(run);
    } finally {
      this.deadline = Infinity;
    }
  }

  /**
   * Runs `run`; a stop the host decided meanwhile (a host call at the deadline, a reply that did not fit) becomes
   * the outcome, also when the cell caught the error and finished or the host's own write was refused.
   */
  private guarded<T>(run: () => Outcome<T>): Outcome<T> {
    const stopped = (): Outcome<T> => {
      this.broken = true;
      return { ok: false, error: { name: "InternalError", message: "stopped by the host", stack: "", abort: this.forcedAbort } };
    };
    let outcome: Outcome<T>;
    try {
      outcome = run();
    } catch (e) {
      if (this.forcedAbort !== undefined) return stopped();
      throw e;
    }
    return outcome.ok && this.forcedAbort !== undefined ? stopped() : outcome;
  }

  private callInternal(method: string, args: QuickJSHandle[], timeLimitMs: number): Outcome<unknown> {
    const ctx = this.context;
    return this.withDeadline(timeLimitMs, () => {
      const fnH = ctx.getProp(this.internals, method);
      const result = ctx.callFunction(fnH, ctx.undefined, ...args);
      fnH.dispose();
      if (result.error) return { ok: false, error: this.takeError(result.error) };
      const value = this.readWireHandle(result.value);
      return { ok: true, value };
    });
  }

  /** Reads a guest wire array (or undefined) from a handle and disposes it. */
  private readWireHandle(h: QuickJSHandle): unknown {
    const ctx = this.context;
    if (ctx.typeof(h) === "undefined") {
      h.dispose();
      return undefined;
    }
    const jsonH = ctx.getProp(h, 0);
    const buffersH = ctx.getProp(h, 1);
    const lengthH = ctx.getProp(buffersH, "length");
    const n = ctx.typeof(lengthH) === "number" ? ctx.getNumber(lengthH) : 0;
    lengthH.dispose();
    const bufferHs = Array.from({ length: n }, (_, i) => ctx.getProp(buffersH, i));
    try {
      return decodeWireValue(this.readWire(jsonH, bufferHs));
    } finally {
      for (const b of bufferHs) b.dispose();
      jsonH.dispose();
      buffersH.dispose();
      h.dispose();
    }
  }

  /**
   * Runs JavaScript as a global script (top-level const/let/function stay visible to later scripts) within
   * `timeLimitMs`, and returns the display record of its completion value (undefined when there is none).
   */
  evalScript(code: string, filename: string, timeLimitMs: number): Outcome<unknown> {
    const ctx = this.context;
    return this.withDeadline(timeLimitMs, () => {
      this.ensureRoom(3 * code.length);
      // Strict: assigning to a read-only data global or an undeclared name is an error, as in TypeScript modules.
      const result = ctx.evalCode(code, filename, { type: "global", strict: true });
      if (result.error) return { ok: false, error: this.takeError(result.error) };
      const display = ctx.getProp(this.internals, "displayCompletion");
      const wire = ctx.callFunction(display, ctx.undefined, result.value);
      display.dispose();
      result.value.dispose();
      if (wire.error) return { ok: false, error: this.takeError(wire.error) };
      return { ok: true, value: this.readWireHandle(wire.value) };
    });
  }

  /**
   * Defines the read-only global `table.name` holding a data cell's table (`{ name, columns, rows, csv, byColumn }`,
   * see data-cells.ts). Only the names and the numeric columns (as bytes) cross now; text columns, the CSV text and
   * the copies `rows` is built from cross when a cell first reads them (hostTablePart).
   */
  defineTable(table: DataTable, timeLimitMs: number): Outcome<unknown> {
    return this.guarded(() => {
      const ctx = this.context;
      const index = this.tables.length;
      this.tables.push(table);
      // newWire checks its own room before it makes a handle, so nothing is left undisposed when it throws.
      const numeric = numericColumnsOf(table);
      const wire = this.newWire({ columns: table.columns, numeric, length: table.length });
      const nameH = ctx.newString(table.name);
      const indexH = ctx.newNumber(index);
      const outcome = this.callInternal("defineTable", [nameH, indexH, wire], timeLimitMs);
      nameH.dispose();
      indexH.dispose();
      wire.dispose();
      return outcome;
    });
  }

  /** The value of the guest global (or global lexical binding) `name`, as plain data. */
  readGlobal(name: string, timeLimitMs: number): Outcome<unknown> {
    const nameH = this.context.newString(name);
    const outcome = this.callInternal("readGlobal", [nameH], timeLimitMs);
    nameH.dispose();
    return outcome;
  }

  /** Frees the internals, the context and the runtime. Safe to call twice. */
  dispose(): void {
    if (!this.runtime.alive) return;
    if (this.internals.alive) this.internals.dispose();
    this.context.dispose();
    this.runtime.dispose();
  }
}
