/**
 * The run function shared by the CLI, the viewer's worker and the tests: a parsed document in, its outputs out.
 *
 *   document cells --(in order)--> code: strip types -> evaluate as a global script -> displays -> outputs
 *                                  data: read CSV (check the pin) -> define a read-only global
 *                                  chart: read the named globals -> inline them in the spec -> chart output
 *
 * All cells of a run share one fresh QuickJS context, so a top-level const/let/function of one code cell is
 * visible to the cells below it. The first cell that fails gets an `error` output; the cells after it get
 * `not-run`. Each run starts from a new sandbox, which makes two runs of one document identical.
 */
import type { QuickJSSyncVariant, QuickJSWASMModule } from "quickjs-emscripten-core";
import { cellStartInside, type Cell, type CellOutput, type ChartCell, type CodeCell, type ConebookDocument, type DataCell } from "@conebook/document";
import { chartDataNames, chartRecords, fillChartData } from "./chart-cells.js";
import { controlValue, type ControlRecord, type RecordedControl } from "./controls.js";
import { dataCellText, DataCellError, parseDataTable, type ReadFile } from "./data-cells.js";
import { chartOutput, displayToOutputs } from "./displays.js";
import { HostTimeLimitError, hostCheckpoint, withHostDeadline } from "./host-budget.js";
import { newWasmMemory, type WasmMemory } from "./wasm-memory.js";
import { HOST_RESERVE_MB, SANDBOX_BASE_MB, limitsFor, type RunLimits } from "./limits.js";
import { abortMessage, cellFilename, errorLocation } from "./locations.js";
import { Sandbox, STACK_LIMIT_BYTES, type GuestError } from "./sandbox.js";
import { CellSyntaxError, stripTypesCached, type StripCache } from "./strip-types.js";

/** Status of an executable cell after a run. */
export type CellStatus = "ok" | "error" | "not-run";

/** Progress report after each executable cell. */
export interface RunProgress {
  cellId: string;
  /** 0-based index among the executable (code, data, chart) cells. */
  index: number;
  total: number;
  status: CellStatus;
  elapsedMs: number;
  /** The cell's outputs (so a host that has to stop the run midway still has those of the finished cells). */
  outputs: CellOutput[];
}

/** Report before each executable cell runs (a watchdog's starting signal). */
export interface CellStart {
  cellId: string;
  index: number;
  total: number;
  /** The cell's time limit, ms. */
  timeLimitMs: number;
}

/** Options of one run. */
export interface RunOptions {
  /** Values for `control(name, ...)` calls, by control name; each must lie in the control's range. */
  overrides?: Record<string, number>;
  /**
   * Control values recorded in the document, with the default recorded beside each: used where no override is
   * given and only while the control's default in the code is unchanged (see controls.ts).
   */
  recordedControls?: Record<string, RecordedControl>;
  /** Reads a pinned data file beside the document (path relative, forward slashes). */
  readFile?: ReadFile;
  onProgress?: (progress: RunProgress) => void;
  onCellStart?: (start: CellStart) => void;
}

/** What a run produced. Narrative cells do not appear. */
export interface RunResult {
  outputs: Record<string, CellOutput[]>;
  status: Record<string, CellStatus>;
  /** Wall-clock time per cell in ms, and for the whole run including sandbox start (`total`, `sandboxStart`). */
  timings: { cells: Record<string, number>; sandboxStartMs: number; totalMs: number };
  /** Every control the run met, in order, with the value used. */
  controlsUsed: ControlRecord[];
  /** Override names that no control asked for (probably misspelt). */
  unusedOverrides: string[];
  /** What a reader should know about the values used, by cell: e.g. a recorded control value set aside. */
  notes: { cellId: string; message: string }[];
  limits: RunLimits;
  /** The sandbox's WebAssembly memory: its size at the end of the run (it never shrinks) and its cap, bytes. */
  memory: { peakBytes: number; capBytes: number };
}

/**
 * Loads the QuickJS module a kernel runs on, instantiated on `memory` (pass it as `wasmMemory` to `newVariant`; a WebAssembly.Memory):
 * the kernel makes that memory with the run's cap as its maximum, which is what bounds typed arrays and strings.
 * A loader that ignores `memory` still works, with the module's own 2 GiB maximum as the only hard bound.
 */
export type ModuleLoader = (memory: WasmMemory) => Promise<QuickJSWASMModule> | QuickJSWASMModule;

/** Settings of a kernel. */
export interface KernelOptions {
  /**
   * Loads the QuickJS module; by default the release-sync variant as its package loads it (fine in Node;
   * under Vite pass `loadBrowserModule(wasmUrl)` from the browser entry). Called again after a run was
   * aborted by a limit, so that the wasm memory a runaway cell grew is released.
   */
  loadModule?: ModuleLoader;
  /** Keeps stripped cells between runs by their source (the CLI keeps them on disk); none by default. */
  stripCache?: StripCache;
}

/** Runs documents; keeps the loaded QuickJS module between runs. */
export interface Kernel {
  runDocument(doc: ConebookDocument, options?: RunOptions): Promise<RunResult>;
  /** Creates and disposes one sandbox and returns its start time in ms (for benchmarks). */
  measureSandboxStart(seed?: number): Promise<number>;
  /** Forgets the loaded module. */
  dispose(): void;
}

async function defaultLoader(memory: WasmMemory): Promise<QuickJSWASMModule> {
  const [{ newQuickJSWASMModuleFromVariant, newVariant }, variant] = await Promise.all([
    import("quickjs-emscripten-core"),
    import("@jitl/quickjs-wasmfile-release-sync"),
  ]);
  // The package's types describe its CommonJS build; the ESM build has the variant as its default export.
  // `as never`: WasmMemory is a real WebAssembly.Memory, a type the ES library the kernel compiles against lacks.
  return newQuickJSWASMModuleFromVariant(newVariant(variant.default as unknown as QuickJSSyncVariant, { wasmMemory: memory as never }));
}

const PAGE_BYTES = 65536;
const MIB = 2 ** 20;

/** A loaded module with the memory it was given and that memory's cap. */
interface LoadedModule {
  memoryLimitMb: number;
  module: QuickJSWASMModule;
  /** The cap of the module's memory when it is the one the kernel made, bytes. */
  wasmMaxBytes: number | undefined;
}

/** A WebAssembly memory for a run whose limit is `memoryLimitMb`: the engine's base, the limit and the reserve. */
function sandboxMemory(memoryLimitMb: number): { memory: WasmMemory; maxBytes: number } {
  const maxBytes = Math.ceil(((SANDBOX_BASE_MB + memoryLimitMb + HOST_RESERVE_MB) * MIB) / PAGE_BYTES) * PAGE_BYTES;
  return { memory: newWasmMemory((SANDBOX_BASE_MB * MIB) / PAGE_BYTES, maxBytes / PAGE_BYTES), maxBytes };
}

const IDENTIFIER = /^[A-Za-z_$][A-Za-z0-9_$]*$/;

function isExecutable(cell: Cell): cell is CodeCell | DataCell | ChartCell {
  return cell.kind === "code" || cell.kind === "data" || cell.kind === "chart";
}

/** Creates a kernel. See KernelOptions. */
export function createKernel(options: KernelOptions = {}): Kernel {
  const load = options.loadModule ?? defaultLoader;
  let loaded: Promise<LoadedModule> | undefined;
  let loadedLimitMb: number | undefined;
  // One module at a time, on a memory made for the run's memory limit; another limit loads another module.
  const getModule = (memoryLimitMb: number): Promise<LoadedModule> => {
    if (loaded === undefined || loadedLimitMb !== memoryLimitMb) {
      const { memory, maxBytes } = sandboxMemory(memoryLimitMb);
      loadedLimitMb = memoryLimitMb;
      loaded = Promise.resolve(load(memory)).then((module) => ({
        memoryLimitMb,
        module,
        wasmMaxBytes: module.getWasmMemory() === memory ? maxBytes : undefined,
      }));
    }
    return loaded;
  };

  return {
    async measureSandboxStart(seed = 1) {
      const mod = (await getModule(limitsFor({}).memoryLimitMb)).module;
      const t0 = performance.now();
      const sandbox = new Sandbox(mod, {
        memoryLimitBytes: 256 * 1024 * 1024,
        seed,
        hooks: { emit() {}, control: () => NaN },
      });
      sandbox.dispose();
      return performance.now() - t0;
    },
    async runDocument(doc, runOptions = {}) {
      const result = await runWithModule(await getModule(limitsFor(doc.header).memoryLimitMb), doc, runOptions, options.stripCache);
      // A fresh module after an abort, or after a run that grew the memory past half its limit: wasm memory never
      // shrinks, and the next run should start with its whole allowance.
      const grown = result.result.memory.peakBytes > (SANDBOX_BASE_MB + result.result.limits.memoryLimitMb / 2) * MIB;
      if (result.aborted || grown) loaded = undefined;
      return result.result;
    },
    dispose() {
      loaded = undefined;
    },
  };
}

async function runWithModule(
  { module: mod, wasmMaxBytes }: LoadedModule,
  doc: ConebookDocument,
  options: RunOptions,
  stripCache: StripCache | undefined,
): Promise<{ result: RunResult; aborted: boolean }> {
  const tStart = performance.now();
  const limits = limitsFor(doc.header);
  const overrides = options.overrides ?? {};
  const outputs: Record<string, CellOutput[]> = {};
  const status: Record<string, CellStatus> = {};
  const cellTimes: Record<string, number> = {};
  const controlsUsed: ControlRecord[] = [];
  const notes: { cellId: string; message: string }[] = [];
  /** The CSV text of each data cell read so far, with where its lines are (for CSV errors found later). */
  const dataTexts = new Map<string, (line: number) => string>();
  let current: { cell: Cell; outputs: CellOutput[] } | undefined;

  const sandbox = new Sandbox(mod, {
    memoryLimitBytes: limits.memoryLimitMb * 1024 * 1024,
    ...(wasmMaxBytes !== undefined ? { wasmMaxBytes } : {}),
    seed: doc.header.seed,
    hooks: {
      emit(display) {
        const outs = displayToOutputs(display);
        if (current) current.outputs.push(...outs);
      },
      placeOfText(text) {
        return dataTexts.get(text);
      },
      control(name, opts) {
        const said: string[] = [];
        const record = controlValue(name, opts, overrides, controlsUsed, current?.cell.id ?? "", options.recordedControls, said);
        for (const message of said) notes.push({ cellId: record.cellId, message });
        controlsUsed.push(record);
        current?.outputs.push(record.output);
        return record.output.value;
      },
    },
  });
  const sandboxStartMs = performance.now() - tStart;
  const cells = doc.cells.filter(isExecutable);
  let failedAt: string | undefined;
  let aborted = false;
  let memory = { peakBytes: 0, capBytes: 0 };

  try {
    for (const [index, cell] of cells.entries()) {
      const t0 = performance.now();
      if (failedAt !== undefined) {
        outputs[cell.id] = [{ type: "not-run", reason: `an earlier cell (${failedAt}) failed` }];
        status[cell.id] = "not-run";
      } else {
        current = { cell, outputs: [] };
        options.onCellStart?.({ cellId: cell.id, index, total: cells.length, timeLimitMs: limits.timeLimitMs });
        const error = await runCell(sandbox, cell, limits, options.readFile, current.outputs, dataTexts, stripCache);
        outputs[cell.id] = current.outputs;
        if (error) {
          current.outputs.push(error);
          status[cell.id] = "error";
          failedAt = cell.id;
          if (sandbox.broken) aborted = true;
        } else status[cell.id] = "ok";
        current = undefined;
      }
      cellTimes[cell.id] = performance.now() - t0;
      options.onProgress?.({ cellId: cell.id, index, total: cells.length, status: status[cell.id]!, elapsedMs: cellTimes[cell.id]!, outputs: outputs[cell.id]! });
    }
    memory = { peakBytes: sandbox.memoryBytes(), capBytes: sandbox.capBytes };
  } finally {
    sandbox.dispose();
  }
  const used = new Set(controlsUsed.map((c) => c.output.name));
  return {
    aborted,
    result: {
      outputs,
      status,
      timings: { cells: cellTimes, sandboxStartMs, totalMs: performance.now() - tStart },
      controlsUsed,
      unusedOverrides: Object.keys(overrides).filter((k) => !used.has(k)),
      notes,
      limits,
      memory,
    },
  };
}

type ErrorOutput = Extract<CellOutput, { type: "error" }>;

function guestErrorOutput(cell: Cell, error: GuestError, limits: RunLimits, map?: (line: number, column: number) => number): ErrorOutput {
  if (error.abort) {
    const out: ErrorOutput = { type: "error", message: abortMessage(cell.id, error.abort, limits, STACK_LIMIT_BYTES) };
    const loc = errorLocation(cell, error.stack, map);
    return loc ? { ...out, ...loc } : out;
  }
  const out: ErrorOutput = { type: "error", message: `${error.name}: ${error.message}` };
  const loc = errorLocation(cell, error.stack, map);
  return loc ? { ...out, ...loc } : out;
}

/** Runs one cell; returns its error output, or undefined when it succeeded. */
async function runCell(
  sandbox: Sandbox,
  cell: CodeCell | DataCell | ChartCell,
  limits: RunLimits,
  readFile: ReadFile | undefined,
  outputs: CellOutput[],
  dataTexts: Map<string, (line: number) => string>,
  stripCache: StripCache | undefined,
): Promise<ErrorOutput | undefined> {
  const fileLine = (line: number) => cell.sourceStart.line + line - 1;
  const fileColumn = (line: number, column: number) => (line === 1 ? cell.sourceStart.column + column - 1 : column);
  try {
    const inside = cell.kind === "code" || (cell.kind === "data" && !cell.file) ? cellStartInside(cell.source) : undefined;
    if (cell.kind === "code" || cell.kind === "data") {
      if (inside) {
        const fenceLine = cell.origin?.start.line ?? cell.sourceStart.line - 1;
        return {
          type: "error",
          message: `the fence of cell ${cell.id} (line ${fenceLine}) is not closed before line ${fileLine(inside.line)}, which starts another cell (${inside.text}); add the closing fence before line ${fileLine(inside.line)}`,
          line: fenceLine,
        };
      }
    }
    if (cell.kind === "code") {
      let stripped;
      try {
        stripped = stripTypesCached(cell.source, stripCache);
      } catch (e) {
        if (!(e instanceof CellSyntaxError)) throw e;
        return { type: "error", message: `SyntaxError: ${e.message}`, line: fileLine(e.line), column: fileColumn(e.line, e.column) };
      }
      const outcome = sandbox.evalScript(stripped.code, cellFilename(cell.id), limits.timeLimitMs);
      if (!outcome.ok) return guestErrorOutput(cell, outcome.error, limits, stripped.sourceColumn);
      if (outcome.value !== undefined) outputs.push(...displayToOutputs(outcome.value));
      return undefined;
    }
    if (cell.kind === "data") {
      if (!IDENTIFIER.test(cell.name)) {
        return { type: "error", message: `data name "${cell.name}" is not a valid name; use letters, digits and _ (not starting with a digit)`, line: cell.sourceStart.line };
      }
      const text = await dataCellText(cell, readFile);
      const path = cell.file?.path;
      dataTexts.set(text, path !== undefined ? (line) => `${path}:${line}` : (line) => `data cell ${cell.id}, line ${fileLine(line)} of the document`);
      // The host's reading of the CSV counts against the cell's time limit like the cell's own work would.
      let table;
      try {
        table = withHostDeadline(Date.now() + limits.timeLimitMs, () =>
          parseDataTable(cell.name, text, cell.file ? 1 : cell.sourceStart.line, hostCheckpoint(`data "${cell.name}"`)),
        );
      } catch (e) {
        if (!(e instanceof HostTimeLimitError)) throw e;
        return { type: "error", message: abortMessage(cell.id, "time", limits, STACK_LIMIT_BYTES), line: cell.sourceStart.line };
      }
      const outcome = sandbox.defineTable(table, limits.timeLimitMs);
      if (!outcome.ok) return guestErrorOutput(cell, outcome.error, limits);
      return undefined;
    }
    const values = new Map<string, unknown[]>();
    for (const name of chartDataNames(cell.spec)) {
      if (!IDENTIFIER.test(name)) {
        return { type: "error", message: `chart data name "${name}" is not a valid name; name a value defined in an earlier cell`, line: cell.sourceStart.line };
      }
      const outcome = sandbox.readGlobal(name, limits.timeLimitMs);
      if (!outcome.ok) return { type: "error", message: `${outcome.error.name}: ${outcome.error.message}`, line: cell.sourceStart.line };
      values.set(name, chartRecords(name, outcome.value));
    }
    outputs.push(chartOutput(fillChartData(cell.spec, values)));
    return undefined;
  } catch (e) {
    const message = e instanceof Error ? `${e.name}: ${e.message}` : String(e);
    const line = e instanceof DataCellError && e.line !== undefined && !(cell.kind === "data" && cell.file) ? e.line : cell.sourceStart.line;
    return { type: "error", message, line };
  }
}
