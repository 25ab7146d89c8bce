/**
 * <cb-workbench>: the page. It owns the document store (model/store.ts, the one change path), the kernel
 * client (a Web Worker running the kernel's runDocument, as the CLI does), the runs, the talk with
 * `conebook serve` (open, conflict-aware save, copies, pinned data) and the recovery copy; it renders the bar,
 * the caution, the outline and the cells, and turns every cell event and key into a transaction or a command.
 */
import { LitElement, css, html, nothing } from "lit";
import { repeat } from "lit/directives/repeat.js";
import { DocumentError, parseDocument, readReviewThread, serializeDocument, writeReviewThread, type Cell, type ConebookDocument, type Diagnostic } from "@conebook/document";
import { checkDataPins, recordedOutputs, type PinCheck } from "@conebook/kernel";
import apiDoc from "../../../../docs/api.md?raw";
import { KernelClient } from "../kernel/client.js";
import { apiCatalogue } from "../model/api-catalogue.js";
import { CELL_KINDS, changeKind, freshId, newCell, withSource } from "../model/cells.js";
import { globalName, keptMatchSource, type ObservationRecord } from "../model/match.js";
import { PROBE_CELL_ID, declaredNames, readProbe, withProbe } from "../model/records.js";
import { headlineNumbers, reviewRun, whatMoves, type Review } from "../model/review.js";
import { isTemplate } from "../model/template-form.js";
import { WINDOWS_CELL_ID, readWindows, windowsCell, type WindowSet } from "../model/windows.js";
import { lineDiff, type DiffLine } from "../model/line-diff.js";
import { outlineOf } from "../model/outline.js";
import { dropRecovery, keepRecovery, readRecovery, type RecoveryCopy } from "../model/recovery.js";
import { textToSave } from "../model/recording.js";
import { recordedRunSettings } from "../model/run-overrides.js";
import { executablesOf, recordable, shownResults, startRun, withProgress, withResult, withStop, type RunMode, type RunRecord, type ShownResult } from "../model/runs.js";
import { DocumentStore } from "../model/store.js";
import { deleteCell, insertCell, moveCell, replaceCell, type Transaction } from "../model/transaction.js";
import * as server from "../server-api.js";
import { PAGE_CAUTION } from "./caution.js";
import type { CbCell, CellCommand } from "./cell.js";
import type { KeepRequest } from "./match-panel.js";
import { rememberedName } from "./notes.js";
import type { TemplateMake } from "./template-form.js";
import type { EditorMark } from "./editor.js";
import { formatMs, formatNumber } from "./format.js";
import { SHORTCUTS } from "./help.js";
import { icons } from "./icons.js";
import { controls, tokens } from "./theme.js";
import "./cell.js";
import "./editor.js";
import "./match-panel.js";
import "./template-form.js";

const catalogue = apiCatalogue(apiDoc);

const CELL_FENCE = /^ {0,3}(?:`{3,}|~{3,})\s*\w+\s+(?:code|data|chart):([^\s]+)/;

/**
 * The file line of each fenced cell's first source line in `text`, found from the opening fences (a cheap scan
 * instead of a second parse on the main thread; the worker parses the text itself). Used to place errors.
 */
export function sourceLinesOf(text: string): Record<string, number> {
  const out: Record<string, number> = {};
  const lines = text.split("\n");
  for (let i = 0; i < lines.length; i++) {
    const m = CELL_FENCE.exec(lines[i]!);
    if (m && !Object.hasOwn(out, m[1]!)) out[m[1]!] = i + 2;
  }
  return out;
}
/** A kernel worker (the literal `new Worker(new URL(...))` form lets Vite bundle the worker). */
function makeKernelWorker(): Worker {
  return new Worker(new URL("../kernel/kernel-worker.ts", import.meta.url), { type: "module" });
}

/** The review shown: the verdicts, the document reviewed and when. */
type ReviewShown = Review & { doc: ConebookDocument; ms: number; at: number };

const RECOVERY_DELAY_MS = 400;
const DEFAULT_CELL_LIMIT_MS = 10_000;

/** A document that could not be opened as cells: its text, shown in a plain editor with the errors marked. */
interface RawView {
  text: string;
  problems: Diagnostic[];
  message: string;
}

interface Conflict {
  theirs: string;
  theirSha: string;
  mine: string;
  diff?: DiffLine[];
}

/** What the page shows in its live status line. */
type Notice = { text: string; tone: "info" | "ok" | "error" };

export class CbWorkbench extends LitElement {
  static override properties = {
    notice: { state: true },
    helpOpen: { state: true },
    conflict: { state: true },
    raw: { state: true },
    recovery: { state: true },
    documents: { state: true },
    loading: { state: true },
    matchOpen: { state: true },
    matchRecords: { state: true },
    matchProblem: { state: true },
    reviewShown: { state: true },
    reviewing: { state: true },
    templateOpen: { state: true },
  };
  declare notice: Notice | undefined;
  declare helpOpen: boolean;
  declare conflict: Conflict | undefined;
  declare raw: RawView | undefined;
  declare recovery: RecoveryCopy | undefined;
  declare documents: string[];
  declare loading: boolean;
  declare matchOpen: boolean;
  declare matchRecords: ObservationRecord[] | undefined;
  declare matchProblem: string | undefined;
  declare reviewShown: ReviewShown | undefined;
  declare reviewing: boolean;
  declare templateOpen: boolean;

  store: DocumentStore | undefined;
  path = "";
  baseSha = "";
  /** The document as opened or last saved (results before any run are judged against it). */
  opened: ConebookDocument | undefined;
  pins: PinCheck[] = [];
  dataTexts = new Map<string, { text: string } | { problem: string }>();
  diagnostics: Diagnostic[] = [];
  runs: RunRecord[] = [];
  selectedId: string | undefined;
  editingNarrative = new Set<string>();
  saving = false;
  readonly kernel = new KernelClient(makeKernelWorker);
  /** Values of controls changed in the page, by name: every run uses them until a save records them. */
  controlOverrides: Record<string, number> = {};
  #pendingRerun = false;
  #runIds = 1;
  #recoveryTimer: ReturnType<typeof setTimeout> | undefined;
  #unsubscribe: (() => void) | undefined;

  static override styles = [
    tokens,
    controls,
    css`
      :host {
        display: block;
        min-height: 100vh;
        background: var(--cb-paper);
        color: var(--cb-ink);
        font-family: var(--cb-sans);
        font-size: 15px;
      }
      header.top {
        position: sticky;
        top: 0;
        z-index: 5;
        background: #17353a;
        color: #f3efe4;
        display: flex;
        align-items: center;
        gap: 0.6rem;
        padding: 0.4rem 1rem;
        flex-wrap: nowrap;
      }
      .mark {
        font-weight: 800;
        letter-spacing: 0.08em;
        font-size: 0.8rem;
        text-transform: uppercase;
        color: #9fd3cc;
      }
      .title {
        font-weight: 600;
        overflow: hidden;
        text-overflow: ellipsis;
        white-space: nowrap;
        min-width: 0;
        flex: 0 1 auto;
      }
      .path {
        min-width: 0;
        overflow: hidden;
        text-overflow: ellipsis;
        white-space: nowrap;
        flex: 0 2 auto;
        font-family: var(--cb-mono);
        font-size: 0.78rem;
        color: #b9c8c6;
      }
      .state {
        font-size: 0.75rem;
        padding: 0.05rem 0.45rem;
        border-radius: 3px;
        background: #2c5257;
      }
      .state.dirty {
        background: #b7791f;
        color: #1c1606;
      }
      .grow {
        flex: 1 0 0.5rem;
      }
      header.top button {
        flex: none;
      }
      header.top button {
        background: #244a50;
        color: #f3efe4;
        border-color: #3b666c;
      }
      header.top button.primary {
        background: #e0b352;
        color: #1c1606;
        border-color: #e0b352;
      }
      .caution {
        margin: 0;
        padding: 0.45rem 1rem;
        background: var(--cb-warn-bg);
        color: #4a3300;
        border-bottom: 1px solid #e8d5a6;
        font-size: 0.84rem;
      }
      .layout {
        display: grid;
        grid-template-columns: 15rem minmax(0, 1fr);
        gap: 1.2rem;
        padding: 1rem;
        max-width: 84rem;
        margin: 0 auto;
      }
      nav.outline {
        position: sticky;
        top: 4.5rem;
        align-self: start;
        max-height: calc(100vh - 6rem);
        overflow: auto;
        font-size: 0.85rem;
      }
      nav.outline h2 {
        font-size: 0.72rem;
        text-transform: uppercase;
        letter-spacing: 0.08em;
        color: var(--cb-muted);
        margin: 0.2rem 0 0.4rem;
      }
      nav.outline ul {
        list-style: none;
        padding: 0;
        margin: 0 0 1rem;
      }
      nav.outline button {
        border: none;
        background: none;
        padding: 0.15rem 0.2rem;
        text-align: left;
        width: 100%;
        color: var(--cb-ink);
        display: block;
      }
      nav.outline button:hover {
        background: #ebe6d9;
      }
      main {
        min-width: 0;
      }
      .status-line {
        font-size: 0.82rem;
        padding: 0.3rem 0.6rem;
        border-radius: 4px;
        margin: 0 0 0.8rem;
        background: #e9efee;
      }
      .status-line.error {
        background: var(--cb-error-bg);
        color: var(--cb-error);
      }
      .status-line.ok {
        background: #e6f2ea;
        color: var(--cb-ok);
      }
      .banner {
        border: 2px solid #b7791f;
        background: #fff8e8;
        padding: 0.6rem 0.8rem;
        margin-bottom: 0.9rem;
        border-radius: 6px;
      }
      .banner.error {
        border-color: var(--cb-error);
        background: var(--cb-error-bg);
      }
      .add-end {
        display: flex;
        gap: 0.4rem;
        margin: 0.5rem 0 3rem;
        font-size: 0.85rem;
        align-items: center;
        color: var(--cb-muted);
      }
      dialog {
        border: 1px solid var(--cb-rule);
        border-radius: 8px;
        max-width: min(60rem, 92vw);
        padding: 1rem 1.2rem;
        color: var(--cb-ink);
      }
      dialog::backdrop {
        background: rgba(20, 35, 40, 0.45);
      }
      dialog table {
        border-collapse: collapse;
        font-size: 0.86rem;
      }
      dialog td,
      dialog th {
        padding: 0.2rem 0.6rem;
        border-bottom: 1px solid #ece8de;
        text-align: left;
        vertical-align: top;
      }
      kbd {
        font-family: var(--cb-mono);
        font-size: 0.8rem;
        white-space: nowrap;
      }
      .diff {
        font-family: var(--cb-mono);
        font-size: 0.75rem;
        max-height: 50vh;
        overflow: auto;
        border: 1px solid var(--cb-rule);
        white-space: pre-wrap;
      }
      .diff .removed {
        background: #fde4e4;
      }
      .diff .added {
        background: #e1f3e5;
      }
      .diff .same {
        color: var(--cb-muted);
      }
      .actions {
        display: flex;
        gap: 0.5rem;
        flex-wrap: wrap;
        margin-top: 0.8rem;
      }
      .doclist a {
        color: var(--cb-action);
      }
      .banner.review.ok {
        border-color: var(--cb-ok);
        background: #f1f8f3;
      }
      .banner .grow {
        flex: 1;
      }
      .banner .hint {
        font-size: 0.82rem;
        color: var(--cb-muted);
        margin: 0.2rem 0;
      }
      button.link {
        border: none;
        background: none;
        color: var(--cb-action);
        text-decoration: underline;
        padding: 0;
      }
      .moves {
        max-height: 16rem;
        overflow: auto;
      }
      .moves table,
      .banner table {
        border-collapse: collapse;
        font-size: 0.82rem;
        font-variant-numeric: tabular-nums;
      }
      .moves td,
      .moves th {
        padding: 0.1rem 0.5rem;
        border-bottom: 1px solid #ece8de;
        text-align: left;
      }
      .moves td:not(:nth-child(2)) {
        white-space: nowrap;
        font-variant-numeric: tabular-nums;
      }
      dialog.template-form {
        width: min(64rem, 94vw);
        max-height: 90vh;
        overflow: auto;
      }
      @media (max-width: 60rem) {
        .layout {
          grid-template-columns: minmax(0, 1fr);
        }
        nav.outline {
          position: static;
          max-height: none;
        }
      }
    `,
  ];

  constructor() {
    super();
    this.notice = undefined;
    this.helpOpen = false;
    this.conflict = undefined;
    this.raw = undefined;
    this.recovery = undefined;
    this.documents = [];
    this.loading = true;
    this.matchOpen = false;
    this.matchRecords = undefined;
    this.matchProblem = undefined;
    this.reviewShown = undefined;
    this.reviewing = false;
    this.templateOpen = false;
    this.addEventListener("cb-cell", (e) => this.#onCell((e as CustomEvent<CellCommand>).detail));
    this.addEventListener("cb-match-keep", (e) => this.#keep((e as CustomEvent<KeepRequest>).detail));
    this.addEventListener("cb-windows-change", (e) => {
      const d = (e as CustomEvent<{ set: WindowSet; message: string }>).detail;
      this.#windowsChange(d.set, d.message);
    });
    this.addEventListener("cb-match-close", () => (this.matchOpen = false));
    this.addEventListener("cb-control", (e) => this.#control((e as CustomEvent<{ name: string; value: number; commit: boolean }>).detail));
    this.addEventListener("cb-note-goto", (e) => this.#goTo((e as CustomEvent<{ id: string }>).detail.id));
    this.addEventListener("cb-template-make", (e) => void this.#templateMake((e as CustomEvent<TemplateMake>).detail));
    this.addEventListener("cb-template-close", () => (this.templateOpen = false));
    this.addEventListener("cb-key", (e) => this.#onKey((e as CustomEvent<{ command: string }>).detail.command, e));
    this.addEventListener("keydown", (e) => this.#onKeydown(e));
  }

  override connectedCallback(): void {
    super.connectedCallback();
    void this.#boot();
    window.addEventListener("beforeunload", this.#beforeUnload);
  }

  override disconnectedCallback(): void {
    super.disconnectedCallback();
    window.removeEventListener("beforeunload", this.#beforeUnload);
    this.kernel.dispose();
  }

  #beforeUnload = (e: BeforeUnloadEvent) => {
    if (this.store?.dirty) {
      this.#keepRecoveryNow();
      e.preventDefault();
    }
  };

  async #boot(): Promise<void> {
    try {
      const session = await server.getSession();
      this.documents = session.documents;
      const wanted = new URLSearchParams(location.search).get("open") ?? session.initial;
      this.kernel.warm();
      if (wanted) await this.open(wanted);
      else this.loading = false;
    } catch (e) {
      this.loading = false;
      this.#say(`The server did not answer: ${(e as Error).message}`, "error");
    }
  }

  #say(text: string, tone: Notice["tone"] = "info"): void {
    this.notice = { text, tone };
  }

  /** Opens a document from the server (replacing the one shown). */
  async open(path: string, textOverride?: string): Promise<void> {
    this.loading = true;
    let opened: server.Opened;
    try {
      opened = await server.openDocument(path);
    } catch (e) {
      this.loading = false;
      this.#say(`${path} could not be opened: ${(e as Error).message}`, "error");
      return;
    }
    this.path = path;
    this.baseSha = opened.sha256;
    this.pins = opened.pins;
    this.runs = [];
    this.conflict = undefined;
    this.editingNarrative.clear();
    this.controlOverrides = {};
    this.reviewShown = undefined;
    this.matchOpen = false;
    this.matchRecords = undefined;
    this.templateOpen = false;
    const url = new URL(location.href);
    url.searchParams.set("open", path);
    history.replaceState(null, "", url);
    const recovery = readRecovery(localStorage, path);
    this.recovery = recovery && recovery.text !== opened.text && textOverride === undefined ? recovery : undefined;
    this.#load(textOverride ?? opened.text);
    this.loading = false;
    await this.#loadDataTexts();
    this.#mark("conebook-interactive");
  }

  /** Parses `text` into the store, or shows it in the plain-text editor when it does not open as cells. */
  #load(text: string): void {
    let parsed;
    try {
      parsed = parseDocument(text, { file: this.path });
    } catch (e) {
      if (!(e instanceof DocumentError)) throw e;
      this.raw = { text, problems: [{ severity: "error", code: "header", message: e.message, line: e.line, column: e.column }], message: e.message };
      this.store = undefined;
      this.#say(`${this.path} does not open as a document; fix the marked place in the text below`, "error");
      return;
    }
    const errors = parsed.diagnostics.filter((d) => d.severity === "error");
    const outsideCells = errors.filter((d) => d.cellId === undefined);
    if (outsideCells.length > 0) {
      this.raw = { text, problems: errors, message: errors.map((d) => `line ${d.line}, column ${d.column}: ${d.message}`).join("\n") };
      this.store = undefined;
      this.#say(`${this.path} has ${errors.length === 1 ? "an error" : `${errors.length} errors`} outside its cells; fix the marked places in the text below`, "error");
      return;
    }
    this.raw = undefined;
    this.diagnostics = parsed.diagnostics;
    this.#unsubscribe?.();
    this.store = new DocumentStore(parsed.document);
    this.opened = parsed.document;
    this.#unsubscribe = this.store.subscribe((tr) => this.#changed(tr));
    this.selectedId = parsed.document.cells[0]?.id;
    this.#say(errors.length ? `${this.path} opened with ${errors.length} problems in its cells (marked in the cells)` : `${this.path} opened`, errors.length ? "error" : "info");
    this.requestUpdate();
  }

  async #loadDataTexts(): Promise<void> {
    const doc = this.store?.doc;
    if (!doc) return;
    this.dataTexts = new Map();
    for (const cell of doc.cells) {
      if (cell.kind !== "data" || !cell.file) continue;
      try {
        const bytes = await server.readDataFile(this.path, cell.file.path);
        this.dataTexts.set(cell.id, { text: new TextDecoder("utf-8").decode(bytes) });
      } catch (e) {
        this.dataTexts.set(cell.id, { problem: (e as Error).message });
      }
    }
    this.requestUpdate();
  }

  #mark(name: string): void {
    performance.mark(name);
    document.body.dataset.conebook = name;
  }

  #changed(tr: Transaction): void {
    this.requestUpdate();
    clearTimeout(this.#recoveryTimer);
    this.#recoveryTimer = setTimeout(() => this.#keepRecoveryNow(), RECOVERY_DELAY_MS);
    if (tr.focus !== undefined && tr.userEvent !== "edit") {
      this.selectedId = tr.focus;
      void this.updateComplete.then(() => this.#cellElement(tr.focus!)?.focusFrame());
    }
  }

  #keepRecoveryNow(): void {
    clearTimeout(this.#recoveryTimer);
    const store = this.store;
    if (!store || !this.path) return;
    if (!store.dirty) {
      dropRecovery(localStorage, this.path);
      return;
    }
    try {
      keepRecovery(localStorage, this.path, { text: serializeDocument(store.doc, { writeAssignedIds: false }), baseSha256: this.baseSha, keptAt: Date.now() });
    } catch (e) {
      this.#say(`The edits cannot be written as text yet: ${(e as Error).message}`, "error");
    }
  }

  #cellElement(id: string): CbCell | undefined {
    return this.renderRoot.querySelector<CbCell>(`cb-cell[data-id="${CSS.escape(id)}"]`) ?? undefined;
  }

  #dispatch(tr: Transaction): void {
    try {
      this.store?.dispatch(tr);
    } catch (e) {
      this.#say((e as Error).message, "error");
    }
  }

  #onCell(c: CellCommand): void {
    const store = this.store;
    if (!store) return;
    const doc = store.doc;
    const cell = doc.cells.find((x) => x.id === c.cellId);
    if (!cell) return;
    switch (c.command) {
      case "edit":
        if (c.text !== undefined && c.text !== cell.source) this.#dispatch({ ...replaceCell(doc, cell.id, withSource(cell, c.text), "edit"), focus: undefined } as Transaction);
        return;
      case "select":
        this.selectedId = cell.id;
        this.requestUpdate();
        return;
      case "select-next":
      case "select-previous": {
        const i = doc.cells.indexOf(cell) + (c.command === "select-next" ? 1 : -1);
        const next = doc.cells[i];
        if (next) {
          this.selectedId = next.id;
          this.#cellElement(next.id)?.focusFrame();
        }
        return;
      }
      case "edit-narrative":
        this.editingNarrative.add(cell.id);
        this.requestUpdate();
        return;
      case "note":
        if (c.note) this.#note(cell, c.note);
        return;
      case "done-narrative":
        this.editingNarrative.delete(cell.id);
        this.requestUpdate();
        void this.updateComplete.then(() => this.#cellElement(cell.id)?.focusFrame());
        return;
      default:
        this.selectedId = cell.id;
        this.#command(c.command, cell, c.kind);
    }
  }

  #command(command: string, cell: Cell | undefined, kind?: string): void {
    const store = this.store;
    if (!store) {
      if (command === "save") void this.#saveRaw();
      return;
    }
    const doc = store.doc;
    switch (command) {
      case "run-all":
        return void this.run("all");
      case "run-cell":
        return void this.run(cell && cell.kind !== "narrative" ? "cell" : "all", cell?.id);
      case "run-from":
        return void this.run("from", cell?.id);
      case "stop":
        return this.stop();
      case "save":
        return void this.save();
      case "undo":
        if (!store.undo()) this.#say("Nothing to undo");
        return;
      case "redo":
        if (!store.redo()) this.#say("Nothing to redo");
        return;
      case "help":
        this.helpOpen = !this.helpOpen;
        return;
      case "match":
        return void this.openMatch();
      case "review":
        return void this.review();
    }
    if (!cell) return;
    switch (command) {
      case "leave-editor":
        this.editingNarrative.delete(cell.id);
        this.requestUpdate();
        void this.updateComplete.then(() => this.#cellElement(cell.id)?.focusFrame());
        return;
      case "move-up":
      case "move-down": {
        const tr = moveCell(doc, cell.id, command === "move-up" ? -1 : 1);
        if (tr) this.#dispatch(tr);
        return;
      }
      case "add-below": {
        const fresh = newCell(doc, "code");
        this.#dispatch(insertCell(doc.cells.indexOf(cell) + 1, fresh));
        void this.updateComplete.then(() => this.#cellElement(fresh.id)?.focusEditor());
        return;
      }
      case "write-note":
        this.#cellElement(cell.id)?.writeNote();
        return;
      case "delete-cell":
        this.#dispatch(deleteCell(doc, cell.id));
        this.#say(`Deleted cell ${cell.id}; Ctrl+Z brings it back`);
        return;
      case "set-kind":
      case "next-kind": {
        const order = CELL_KINDS.map((k) => k.kind);
        const target = command === "set-kind" ? (kind as Cell["kind"]) : order[(order.indexOf(cell.kind) + 1) % order.length]!;
        if (!order.includes(target) || target === cell.kind) return;
        this.#dispatch(replaceCell(doc, cell.id, changeKind(cell, target), "kind"));
        this.#say(`Cell ${cell.id} is now a ${CELL_KINDS.find((k) => k.kind === target)!.label} cell`);
        return;
      }
    }
  }

  #onKey(command: string, e: Event): void {
    e.stopPropagation();
    const cell = this.store?.doc.cells.find((c) => c.id === this.selectedId);
    this.#command(command, cell);
  }

  #onKeydown(e: KeyboardEvent): void {
    const mod = e.ctrlKey || e.metaKey;
    let command: string | undefined;
    if (e.key === "F1" || (mod && e.key === "/")) command = "help";
    else if (mod && e.shiftKey && e.key === "Enter") command = "run-all";
    else if (mod && e.key === "Enter") command = "run-cell";
    else if (e.shiftKey && !mod && e.key === "Enter") command = "run-from";
    else if (mod && e.key === ".") command = "stop";
    else if (mod && e.key.toLowerCase() === "s") command = "save";
    else if (mod && e.key.toLowerCase() === "z") command = e.shiftKey ? "redo" : "undo";
    else if (mod && e.key.toLowerCase() === "y") command = "redo";
    else if (e.altKey && e.shiftKey && e.key === "ArrowUp") command = "move-up";
    else if (e.altKey && e.shiftKey && e.key === "ArrowDown") command = "move-down";
    else if (e.altKey && e.shiftKey && e.code === "KeyN") command = "add-below";
    else if (e.altKey && e.shiftKey && e.code === "KeyK") command = "next-kind";
    else if (e.altKey && e.shiftKey && e.key === "Delete") command = "delete-cell";
    else if (e.altKey && e.shiftKey && e.code === "KeyM") command = "match";
    else if (e.altKey && e.shiftKey && e.code === "KeyV") command = "review";
    else if (e.altKey && e.shiftKey && e.code === "KeyR") command = "write-note";
    if (!command) return;
    e.preventDefault();
    const cell = this.store?.doc.cells.find((c) => c.id === this.selectedId);
    this.#command(command, cell);
  }

  /** Runs the document (all, up to a cell, or from a cell to the end) in the kernel worker. */
  async run(mode: RunMode, cellId?: string): Promise<void> {
    const store = this.store;
    if (!store) return;
    if (this.kernel.running) {
      this.#say("A run is in progress; stop it first (Ctrl+.)");
      return;
    }
    const doc = store.doc;
    let runDoc = doc;
    if (mode === "cell" && cellId !== undefined) {
      const i = doc.cells.findIndex((c) => c.id === cellId);
      runDoc = { ...doc, cells: doc.cells.slice(0, i + 1) };
    }
    let text: string;
    try {
      text = serializeDocument(runDoc, { writeAssignedIds: false });
    } catch (e) {
      this.#say(`The document cannot be run as it is: ${(e as Error).message}`, "error");
      return;
    }
    const sourceLines = sourceLinesOf(text);
    let record = startRun(this.#runIds++, mode, runDoc, cellId, sourceLines, performance.now());
    const files = await this.#files(runDoc);
    this.runs = [...this.runs.slice(-2), record];
    const update = (next: RunRecord) => {
      record = next;
      this.runs = [...this.runs.slice(0, -1), next];
      this.requestUpdate();
    };
    this.#mark("conebook-running");
    this.#say(`Running ${mode === "cell" ? `up to cell ${cellId}` : mode === "from" ? `from cell ${cellId} to the end` : "the whole document"}…`);
    this.requestUpdate();
    const limit = doc.header.timeLimitMs ?? DEFAULT_CELL_LIMIT_MS;
    const end = await this.kernel.run({ text, file: this.path, ...this.#settings(doc), files }, limit, (p) => update(withProgress(record, p.cellId, p.status, p.elapsedMs)));
    performance.mark("conebook-result-received");
    if (end.type === "result") {
      update(withResult(record, end.result, performance.now()));
      const failed = Object.entries(end.result.status).filter(([, s]) => s === "error").map(([id]) => id);
      this.#say(
        failed.length
          ? `Cell ${failed.join(", ")} failed (${formatMs(end.result.timings.totalMs)}); the error is shown in the cell`
          : `Ran ${Object.keys(end.result.status).length} cells in ${formatMs(end.result.timings.totalMs)}${recordable(record, store.doc) ? "; saving records these outputs" : ""}`,
        failed.length ? "error" : "ok",
      );
      if (failed[0]) void this.updateComplete.then(() => this.#revealError(failed[0]!));
    } else if (end.type === "failed") {
      update(withStop(record, "failed", end.message, performance.now()));
      this.#say(`The document was not run: ${end.message}`, "error");
    } else {
      update(withStop(record, "stopped", end.reason, performance.now()));
      this.#say(`Run stopped: ${end.reason}. The next run starts a fresh kernel.`, "info");
    }
    this.#mark("conebook-ran");
    this.dispatchEvent(new CustomEvent("cb-run-ended", { detail: { id: record.id } }));
    if (this.#pendingRerun) {
      this.#pendingRerun = false;
      void this.run("all");
    }
  }

  /** What a run gets: the recorded settings (as conebook run and verify), with the controls changed in the page over them. */
  #settings(doc: ConebookDocument): ReturnType<typeof recordedRunSettings> {
    const recorded = recordedRunSettings(doc);
    return { ...recorded, overrides: { ...recorded.overrides, ...this.controlOverrides } };
  }

  /** The bytes of the data files `doc` pins, read through the server (a file that cannot be read is left out). */
  async #files(doc: ConebookDocument): Promise<Record<string, Uint8Array>> {
    const files: Record<string, Uint8Array> = {};
    for (const cell of doc.cells) {
      if (cell.kind !== "data" || !cell.file || Object.hasOwn(files, cell.file.path)) continue;
      try {
        files[cell.file.path] = await server.readDataFile(this.path, cell.file.path);
      } catch {
        // The kernel reports a file it was not sent, at the data cell.
      }
    }
    return files;
  }

  /** A control changed in the page: the document is run again with the new value (the latest wins while a run is on). */
  #control(c: { name: string; value: number; commit: boolean }): void {
    if (this.controlOverrides[c.name] === c.value && !c.commit) return;
    this.controlOverrides = { ...this.controlOverrides, [c.name]: c.value };
    this.requestUpdate();
    if (this.kernel.running) this.#pendingRerun = true;
    else void this.run("all");
  }

  /** Waits until no run is in progress (at most `ms`); false when one still is. */
  async #idle(ms = 60_000): Promise<boolean> {
    const until = performance.now() + ms;
    while (this.kernel.running && performance.now() < until) await new Promise((r) => setTimeout(r, 50));
    return !this.kernel.running;
  }

  /** Opens the matching panel: one run of the document with a probe cell finds its observation records. */
  async openMatch(): Promise<void> {
    const store = this.store;
    if (!store) return;
    this.matchOpen = true;
    this.matchRecords = undefined;
    this.matchProblem = undefined;
    this.#mark("conebook-match-loading");
    if (!(await this.#idle())) {
      this.matchProblem = "A run is still in progress; stop it (Ctrl+.) and open the panel again";
      return;
    }
    const doc = store.doc;
    let text: string;
    try {
      text = serializeDocument(withProbe(doc), { writeAssignedIds: false });
    } catch (e) {
      this.matchProblem = `The document cannot be run as it is: ${(e as Error).message}`;
      return;
    }
    const end = await this.kernel.run({ text, file: this.path, ...this.#settings(doc), files: await this.#files(doc) }, doc.header.timeLimitMs ?? DEFAULT_CELL_LIMIT_MS, () => undefined);
    if (end.type !== "result") {
      this.matchProblem = `The document did not run to the end, so its records are not known: ${end.type === "failed" ? end.message : end.reason}`;
      return;
    }
    this.matchRecords = readProbe(doc, end.result.outputs[PROBE_CELL_ID]);
    if (end.result.status[PROBE_CELL_ID] !== "ok") {
      const failed = Object.entries(end.result.status).filter(([, st]) => st === "error").map(([id]) => id);
      this.matchProblem = `The document stopped at cell ${failed[0] ?? "?"} with an error, so its records are not known; run it and fix that cell first`;
    }
    this.#mark("conebook-match-ready");
    void this.updateComplete.then(() => this.renderRoot.querySelector("cb-match")?.scrollIntoView({ block: "start" }));
  }

  /** "Keep": the match becomes a code cell after the record's cell (and after the data windows). */
  #keep(req: KeepRequest): void {
    const store = this.store;
    if (!store) return;
    const doc = store.doc;
    const slug = req.record.name.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "") || "record";
    const base = `match-${slug}-${req.choice.id}`.slice(0, 56);
    const ids = new Set(doc.cells.map((c) => c.id));
    let id = base;
    for (let k = 2; ids.has(id); k++) id = `${base}-${k}`;
    const names = new Set(declaredNames(doc).map((d) => d.name));
    let name = globalName(id);
    for (let k = 2; names.has(name); k++) name = `${globalName(id)}${k}`;
    const windowsAt = doc.cells.findIndex((c) => c.id === WINDOWS_CELL_ID);
    const reading = readWindows(doc);
    const windowed = windowsAt >= 0 && "set" in reading;
    let at = Math.max(doc.cells.findIndex((c) => c.id === req.record.cellId), windowsAt) + 1;
    if (at <= 0) at = doc.cells.length;
    while (doc.cells[at]?.id.startsWith("match-")) at++;
    const cell: Cell = {
      kind: "code",
      language: "ts",
      id,
      source: keptMatchSource({ ...req, windowed, name }),
      sourceStart: { line: 1, column: 1 },
      outputs: [],
    };
    this.#dispatch({ ...insertCell(at, cell), focus: undefined });
    this.#say(`Kept the match of ${req.record.name} as cell ${id} (${req.refined ? "refined by least squares from the matched values" : "the values as matched"}); run the whole document to see and record its outputs`, "ok");
  }

  /** New data windows: the data-windows cell is replaced (or made, after the first record's cell). */
  #windowsChange(set: WindowSet, message: string): void {
    const store = this.store;
    if (!store) return;
    const doc = store.doc;
    const reading = readWindows(doc);
    if ("problem" in reading) {
      this.#say(reading.problem, "error");
      return;
    }
    if (reading.cell) this.#dispatch({ ...replaceCell(doc, WINDOWS_CELL_ID, windowsCell(set, reading.cell), "windows"), focus: undefined });
    else {
      const owner = this.matchRecords?.[0]?.cellId;
      const at = owner ? doc.cells.findIndex((c) => c.id === owner) + 1 : doc.cells.length;
      this.#dispatch({ ...insertCell(at > 0 ? at : doc.cells.length, windowsCell(set, undefined)), userEvent: "windows", focus: undefined });
    }
    this.#say(`${message}. Written into cell ${WINDOWS_CELL_ID}; Ctrl+Z takes it back`, "ok");
  }

  /** A review note written, answered, resolved or reopened: a transaction on the note's narrative cell. */
  #note(cell: Cell, action: NonNullable<CellCommand["note"]>): void {
    const store = this.store!;
    const doc = store.doc;
    if (action.action === "add") {
      let at = doc.cells.indexOf(cell) + 1;
      for (let next = doc.cells[at]; next?.kind === "narrative" && next.review?.on === cell.id; next = doc.cells[at]) at++;
      const id = freshId(doc, `${cell.id.slice(0, 52)}-note`);
      const note: Cell = {
        kind: "narrative",
        id,
        source: writeReviewThread([{ kind: action.kind, who: action.who, text: action.text }]),
        sourceStart: { line: 1, column: 1 },
        outputs: [],
        review: { on: cell.id, status: action.kind === "accepted" ? "resolved" : "open" },
      };
      this.#dispatch({ ...insertCell(at, note), userEvent: "note" });
      this.#say(`Review note ${id} on cell ${cell.id} written (${note.kind === "narrative" && note.review?.status}); it is saved with the document`, "ok");
      return;
    }
    if (cell.kind !== "narrative" || !cell.review) return;
    if (action.action === "reply") {
      const entry = writeReviewThread([{ kind: action.kind, who: action.who, text: action.text }]);
      const source = readReviewThread(cell.source).length ? `${cell.source}\n>\n${entry}` : entry;
      this.#dispatch({ ...replaceCell(doc, cell.id, { ...cell, source }, "note"), focus: undefined });
      this.#say(`Answer added to review note ${cell.id}`, "ok");
    } else if (action.action === "status") {
      this.#dispatch({ ...replaceCell(doc, cell.id, { ...cell, review: { ...cell.review, status: action.status } }, "note"), focus: undefined });
      this.#say(`Review note ${cell.id} is ${action.status} now`, "ok");
    }
  }

  /**
   * The review view: the whole document rerun in a fresh worker with its recorded settings and compared with its
   * recorded outputs by the kernel's compareOutputs and referenceProblems at DEFAULT_RTOL, as conebook verify does.
   */
  async review(): Promise<void> {
    const store = this.store;
    if (!store || this.reviewing) return;
    this.reviewing = true;
    this.#mark("conebook-reviewing");
    const started = performance.now();
    this.#say("Review: rerunning the whole document in a fresh kernel…");
    const doc = store.doc;
    try {
      const text = serializeDocument(doc, { writeAssignedIds: false });
      const files = await this.#files(doc);
      const pins = await checkDataPins(doc, (path) => {
        if (!Object.hasOwn(files, path)) throw new Error(`${path} cannot be read through the server`);
        return files[path]!;
      });
      let fresh: Record<string, import("@conebook/document").CellOutput[]> = {};
      if (pins.every((p) => p.status === "ok")) {
        const client = new KernelClient(makeKernelWorker);
        const end = await client.run({ text, file: this.path, ...recordedRunSettings(doc), files }, doc.header.timeLimitMs ?? DEFAULT_CELL_LIMIT_MS, () => undefined);
        client.dispose();
        if (end.type !== "result") {
          this.#say(`The review could not rerun the document: ${end.type === "failed" ? end.message : end.reason}`, "error");
          return;
        }
        fresh = end.result.outputs;
      }
      const review = reviewRun(doc, fresh, pins);
      this.reviewShown = { ...review, doc, ms: performance.now() - started, at: performance.now() };
      this.#say(`${review.summary}; reviewed in ${formatMs(performance.now() - started)}`, review.tone);
    } finally {
      this.reviewing = false;
      this.#mark("conebook-reviewed");
    }
  }

  async #templateMake(made: TemplateMake): Promise<void> {
    try {
      const r = await server.createDocument(made.path, made.text, made.files);
      this.documents = (await server.getSession()).documents;
      this.templateOpen = false;
      await this.open(r.path);
      this.#say(`Made ${r.path} from the template${made.files.length ? ` with ${made.files.map((f) => f.path).join(", ")}` : ""}; run it, check the note for the author, then save`, "ok");
      this.#mark("conebook-made");
    } catch (e) {
      this.#say(`The document was not made: ${(e as Error).message}`, "error");
      const form = this.renderRoot.querySelector<HTMLElement & { problem: string | undefined }>("cb-template-form");
      if (form) form.problem = (e as Error).message;
    }
  }

  #revealError(cellId: string): void {
    const run = this.runs[this.runs.length - 1];
    const error = run?.outputs[cellId]?.find((o) => o.type === "error");
    const start = run?.sourceLines[cellId];
    const element = this.#cellElement(cellId);
    if (!element || !error || error.type !== "error") return;
    element.scrollIntoView({ block: "center" });
    if (error.line !== undefined && start !== undefined && error.line >= start) void element.focusEditor(error.line - start + 1, error.column);
  }

  /** Stops the run in progress (terminates the worker; a fresh one serves the next run). */
  stop(): void {
    if (!this.kernel.running) {
      this.#say("No run to stop");
      return;
    }
    this.kernel.stop();
  }

  /** Saves the document: atomically, refused by the server when the file changed on disk since it was opened. */
  async save(): Promise<void> {
    const store = this.store;
    if (!store || this.saving) return;
    const latest = this.runs[this.runs.length - 1];
    let out;
    try {
      out = textToSave(store.doc, latest);
    } catch (e) {
      this.#say(`Not saved: ${(e as Error).message}`, "error");
      return;
    }
    this.saving = true;
    this.#keepRecoveryNow();
    const reply = await server.saveDocument(this.path, out.text, this.baseSha);
    this.saving = false;
    if (reply.status === "saved") {
      this.baseSha = reply.sha256;
      if (out.doc !== store.doc) this.#adoptRecorded(out.doc);
      if (out.recordedCells !== undefined) this.controlOverrides = {};
      store.markSaved();
      this.opened = store.doc;
      dropRecovery(localStorage, this.path);
      this.recovery = undefined;
      this.#say(
        `Saved ${this.path}${out.recordedCells === undefined ? (store.doc.cells.some((c) => c.kind !== "narrative") ? " (outputs as recorded before: run the whole document to record new ones)" : "") : out.recordedCells === 0 ? " with its outputs (all agree with the record)" : ` and recorded the outputs of ${out.recordedCells} cells`}`,
        "ok",
      );
      this.#mark("conebook-saved");
    } else if (reply.status === "conflict") {
      this.conflict = { theirs: reply.text, theirSha: reply.sha256, mine: out.text };
      this.#say(`Not saved: ${this.path} changed on disk since it was opened. Choose below; nothing was overwritten.`, "error");
    } else {
      this.#say(`Not saved: ${reply.message}. The file on disk is as it was; your edits are still here and in this browser's recovery copy.`, "error");
    }
    this.requestUpdate();
  }

  /** After recording outputs: the store takes the recorded cells, and the run that made them stays current. */
  #adoptRecorded(next: ConebookDocument): void {
    const store = this.store!;
    const byId = new Map(next.cells.map((c) => [c.id, c]));
    const splices = store.doc.cells.flatMap((c, i) => (byId.get(c.id) !== c ? [{ from: i, to: i + 1, insert: [byId.get(c.id)!] }] : []));
    const latest = this.runs[this.runs.length - 1];
    store.dispatch({ splices, header: next.header, userEvent: "record", addToHistory: false });
    // The recorded run ran exactly these cells (only their recorded outputs changed): it stays current.
    if (latest) this.runs = [...this.runs.slice(0, -1), { ...latest, header: store.doc.header, executables: executablesOf(store.doc) }];
  }

  async #saveRaw(): Promise<void> {
    if (!this.raw) return;
    const text = this.#rawText();
    const reply = await server.saveDocument(this.path, text, this.baseSha);
    if (reply.status === "saved") {
      this.baseSha = reply.sha256;
      this.#say(`Saved ${this.path} as text`, "ok");
    } else if (reply.status === "conflict") this.conflict = { theirs: reply.text, theirSha: reply.sha256, mine: text };
    else this.#say(`Not saved: ${reply.message}`, "error");
  }

  #rawText(): string {
    return this.renderRoot.querySelector<HTMLElement & { text: string }>("cb-editor.raw")?.text ?? this.raw?.text ?? "";
  }

  async #resolveConflict(choice: "theirs" | "copy" | "compare" | "cancel"): Promise<void> {
    const c = this.conflict;
    if (!c) return;
    if (choice === "compare") {
      this.conflict = { ...c, diff: lineDiff(c.theirs, c.mine) };
      return;
    }
    if (choice === "cancel") {
      this.conflict = undefined;
      return;
    }
    if (choice === "theirs") {
      dropRecovery(localStorage, this.path);
      await this.open(this.path);
      this.#say(`Reloaded ${this.path} as it is on disk; your edits were discarded`, "info");
      return;
    }
    try {
      const copy = await server.saveCopy(this.path, c.mine);
      dropRecovery(localStorage, this.path);
      this.documents = [...new Set([...this.documents, copy])].sort();
      await this.open(copy);
      this.#say(`Your version was saved as ${copy} (and is open now); ${c.theirs === "" ? "" : "the changed file was left as it is"}`, "ok");
    } catch (e) {
      this.#say(`The copy could not be written: ${(e as Error).message}`, "error");
    }
  }

  #restoreRecovery(): void {
    const copy = this.recovery;
    if (!copy || !this.store) return;
    this.recovery = undefined;
    const opened = this.store.doc;
    let parsed;
    try {
      parsed = parseDocument(copy.text, { file: this.path });
    } catch (e) {
      this.#say(`The kept edits do not read as a document: ${(e as Error).message}`, "error");
      return;
    }
    // The kept text becomes one undoable change from the file as opened, so the page is dirty until saved.
    this.#dispatch({ splices: [{ from: 0, to: opened.cells.length, insert: parsed.document.cells }], header: parsed.document.header, userEvent: "record" });
    if (copy.baseSha256 !== this.baseSha) this.#say("Restored edits made on an older version of the file; saving will ask what to do", "info");
    else this.#say("Restored the unsaved edits", "ok");
  }

  #discardRecovery(): void {
    dropRecovery(localStorage, this.path);
    this.recovery = undefined;
  }

  #top() {
    const store = this.store;
    const title = store?.doc.header.title ?? (this.raw ? "Document with errors" : "Conebook");
    const dirty = store?.dirty ?? false;
    const running = this.kernel.running;
    const current = this.runs[this.runs.length - 1];
    return html`<header class="top">
      <span class="mark" aria-hidden="true">Conebook</span>
      <h1 class="title" style="font-size:1rem;margin:0">${title}</h1>
      ${this.path ? html`<span class="path">${this.path}</span>` : nothing}
      ${store ? html`<span class="state ${dirty ? "dirty" : ""}" role="status">${dirty ? "unsaved changes" : "saved"}</span>` : nothing}
      ${running && current ? html`<span class="state" role="status">running ${Object.values(current.status).filter((s) => s !== "queued" && s !== "running").length} / ${current.executables.length}</span>` : nothing}
      <span class="grow"></span>
      <button @click=${() => void this.run("all")} ?disabled=${!store || running} title="Run all (Ctrl+Shift+Enter)">${icons.runAll}<span>Run all</span></button>
      <button @click=${() => this.stop()} ?disabled=${!running} title="Stop (Ctrl+.)">${icons.stop}<span>Stop</span></button>
      <button @click=${() => void this.openMatch()} ?disabled=${!store} title="Match a model curve by hand and mark data windows (Alt+Shift+M)"><span>Match by hand</span></button>
      <button @click=${() => void this.review()} ?disabled=${!store || this.reviewing} title="Rerun in a fresh kernel and compare every cell with the record, as conebook verify does (Alt+Shift+V)"><span>${this.reviewing ? "Reviewing…" : "Review"}</span></button>
      <button @click=${() => this.store?.undo()} ?disabled=${!store?.canUndo} aria-label="Undo" title="Undo (Ctrl+Z)">${icons.undo}</button>
      <button @click=${() => this.store?.redo()} ?disabled=${!store?.canRedo} aria-label="Redo" title="Redo (Ctrl+Shift+Z)">${icons.redo}</button>
      <button class="primary" @click=${() => (this.raw ? void this.#saveRaw() : void this.save())} ?disabled=${!store && !this.raw} title="Save (Ctrl+S)">${icons.save}<span>Save</span></button>
      <button @click=${() => (this.helpOpen = !this.helpOpen)} aria-label="Keyboard help" title="Keyboard help (F1)">${icons.keys}<span>Keys</span></button>
    </header>
    <p class="caution" role="note"><strong>Caution.</strong> ${PAGE_CAUTION}</p>`;
  }

  #outline() {
    const store = this.store;
    const entries = store ? outlineOf(store.doc.cells) : [];
    return html`<nav class="outline" aria-label="Outline">
      ${this.documents.length > 1 || !this.path
        ? html`<h2>Documents</h2>
            <ul class="doclist">
              ${this.documents.map((d) => html`<li><button @click=${() => void this.open(d)} aria-current=${d === this.path ? "page" : "false"}>${d}</button></li>`)}
            </ul>`
        : nothing}
      ${entries.length
        ? html`<h2>Contents</h2>
            <ul>
              ${entries.map(
                (e) => html`<li>
                  <button style=${`padding-left:${(e.level - 1) * 0.8 + 0.2}rem`} @click=${() => this.#goTo(e.cellId)}>${e.text}</button>
                </li>`,
              )}
            </ul>`
        : nothing}
    </nav>`;
  }

  #goTo(id: string): void {
    const el = this.#cellElement(id);
    if (!el) return;
    this.selectedId = id;
    el.scrollIntoView({ block: "start" });
    el.focusFrame();
    this.requestUpdate();
  }

  #help() {
    if (!this.helpOpen) return nothing;
    return html`<dialog class="help" aria-labelledby="help-title" @close=${() => (this.helpOpen = false)}>
      <h2 id="help-title">Keys</h2>
      <table>
        <tbody>
          ${SHORTCUTS.map((s) => html`<tr><th scope="row"><kbd>${s.keys}</kbd></th><td>${s.what}</td></tr>`)}
        </tbody>
      </table>
      <div class="actions"><button class="primary" @click=${() => (this.helpOpen = false)} autofocus>Close</button></div>
    </dialog>`;
  }

  #conflictDialog() {
    const c = this.conflict;
    if (!c) return nothing;
    return html`<dialog aria-labelledby="conflict-title" class="conflict" @cancel=${(e: Event) => e.preventDefault()}>
      <h2 id="conflict-title">The file changed on disk</h2>
      <p>${this.path} was changed by someone or something else after this page opened it. Nothing was overwritten. What should happen to your version?</p>
      <div class="actions">
        <button @click=${() => void this.#resolveConflict("theirs")}>Reload theirs (discard mine)</button>
        <button class="primary" @click=${() => void this.#resolveConflict("copy")}>Keep mine as a copy</button>
        <button @click=${() => void this.#resolveConflict("compare")}>Compare</button>
        <button @click=${() => void this.#resolveConflict("cancel")}>Not now</button>
      </div>
      ${c.diff
        ? html`<p>Lines only on disk are marked −, lines only in your version +.</p>
            <div class="diff" role="region" aria-label="Differences between the file on disk and your version" tabindex="0">
              ${c.diff.filter((d, i, all) => d.op !== "same" || all.slice(Math.max(0, i - 2), i + 3).some((x) => x.op !== "same")).map((d) => html`<div class=${d.op}>${d.op === "removed" ? "− " : d.op === "added" ? "+ " : "  "}${d.text}</div>`)}
            </div>`
        : nothing}
    </dialog>`;
  }

  #rawView() {
    const raw = this.raw!;
    const marks: EditorMark[] = raw.problems.map((p) => ({ line: p.line, column: p.column, message: p.message, severity: "error" }));
    return html`<div class="banner error" role="alert">
        <strong>This document does not open as cells.</strong>
        <pre style="white-space:pre-wrap;margin:0.4rem 0">${raw.message}</pre>
        Fix it in the text below (the place is marked), then check it again or save the text as it is.
      </div>
      <cb-editor class="raw" .value=${raw.text} language="plain" label="Text of the document" .marks=${marks}></cb-editor>
      <div class="actions">
        <button class="primary" @click=${() => this.#load(this.#rawText())}>Check again and open</button>
        <button @click=${() => void this.#saveRaw()}>Save the text</button>
      </div>`;
  }

  #matchPanel() {
    const doc = this.store!.doc;
    return html`<cb-match .records=${this.matchRecords} .recordsProblem=${this.matchProblem} .windows=${readWindows(doc)} aria-labelledby="match-title" role="region"></cb-match>`;
  }

  #templateBanner() {
    const doc = this.store!.doc;
    if (!isTemplate(doc)) return nothing;
    return html`<div class="banner template" role="note">
        <strong>This document is a template.</strong> It declares ${doc.header.parameters.length} parameters and ${doc.header.dataSlots?.length ?? 0} data slots; its values and rows are a demonstration's.
        <div class="actions"><button class="primary" @click=${() => (this.templateOpen = true)}>Make a document from it</button></div>
      </div>
      ${this.templateOpen
        ? html`<dialog class="template-form" aria-labelledby="template-form-title" @cancel=${() => (this.templateOpen = false)}>
            <cb-template-form .template=${doc} templatePath=${this.path}></cb-template-form>
          </dialog>`
        : nothing}`;
  }

  #reviewBanner() {
    const r = this.reviewShown;
    if (!r) return nothing;
    const store = this.store!;
    const latest = this.runs[this.runs.length - 1];
    const moved = latest && latest.phase === "done" && latest.startedAt > r.at - r.ms ? whatMoves(headlineNumbers(r.doc, recordedOutputs(r.doc)), headlineNumbers(store.doc, latest.outputs)) : undefined;
    const differing = [...r.cells.entries()].filter(([, c]) => c.status !== "reproduced");
    const changed = Object.entries(this.controlOverrides);
    return html`<section class="banner review ${r.tone === "ok" ? "ok" : "error"}" aria-labelledby="review-title">
      <div class="actions" style="margin-top:0;align-items:center">
        <h2 id="review-title" style="font-size:1rem;margin:0">Review</h2>
        <span class="review-summary" role="status">${r.summary}; rerun in ${formatMs(r.ms)} in a fresh kernel</span>
        <span class="grow"></span>
        <button @click=${() => void this.review()} ?disabled=${this.reviewing}>Review again</button>
        <button @click=${() => (this.reviewShown = undefined)}>Close the review</button>
      </div>
      ${r.pins.length ? html`<ul>${r.pins.map((p) => html`<li>data ${p.name} (${p.path}): ${p.status === "changed" ? `changed since it was pinned: SHA-256 now ${p.actual}` : p.status === "unreadable" ? p.reason : ""}</li>`)}</ul>` : nothing}
      ${differing.length
        ? html`<p>Cells that did not reproduce: ${differing.map(([id, c], i) => html`${i ? ", " : ""}<button class="link" @click=${() => this.#goTo(id)}>${id}</button> (${c.status === "differs" ? `${c.differences.length} difference${c.differences.length === 1 ? "" : "s"}` : c.status})`)}</p>`
        : nothing}
      ${r.references.length ? html`<ul>${r.references.map((p) => html`<li>narrative ${p.cellId}, line ${p.line}: reference ${p.text}: ${p.message}</li>`)}</ul>` : nothing}
      <h3 style="font-size:0.9rem;margin:0.5rem 0 0.2rem">What moves</h3>
      ${moved
        ? moved.moved.length
          ? html`<p class="hint">${moved.moved.length} headline numbers changed from the record to the latest run${changed.length ? ` (controls changed here: ${changed.map(([k, v]) => `${k} = ${formatNumber(v)}`).join(", ")})` : ""}; ${moved.unchanged} stayed. Nothing is saved until you save.</p>
              <div class="moves" tabindex="0" role="region" aria-label="Headline numbers before and after">
                <table>
                  <thead><tr><th scope="col">cell</th><th scope="col">result</th><th scope="col">recorded</th><th scope="col">now</th><th scope="col">change</th></tr></thead>
                  <tbody>
                    ${moved.moved.slice(0, 30).map(
                      (m) => html`<tr>
                        <td>${m.cellId}</td>
                        <td>${m.label}${m.unit ? ` (${m.unit})` : ""}</td>
                        <td>${m.before === undefined ? "none" : formatNumber(m.before)}</td>
                        <td>${m.after === undefined ? "none" : formatNumber(m.after)}</td>
                        <td>${m.change === undefined ? "" : `${m.change >= 0 ? "+" : "−"}${Number(Math.abs(m.change * 100).toPrecision(3))} %`}</td>
                      </tr>`,
                    )}
                  </tbody>
                </table>
              </div>`
          : html`<p class="hint">The latest run gives every headline number as recorded (${moved.unchanged} of them).</p>`
        : html`<p class="hint">Change a control (in its cell's outputs) or a data window, run, and the headline numbers that move are listed here against the record, without saving.</p>`}
    </section>`;
  }

  #shownCache = new Map<string, ShownResult>();

  /** The same ShownResult object while nothing about it changed, so cells that did not change do not re-render. */
  #stableShown(fresh: Map<string, ShownResult>): Map<string, ShownResult> {
    const out = new Map<string, ShownResult>();
    for (const [id, r] of fresh) {
      const old = this.#shownCache.get(id);
      const same =
        old !== undefined &&
        old.source === r.source &&
        old.outputs === r.outputs &&
        old.status === r.status &&
        old.ms === r.ms &&
        old.outOfDate === r.outOfDate &&
        old.previous === r.previous &&
        old.run?.sourceLines === r.run?.sourceLines;
      out.set(id, same ? old : r);
    }
    this.#shownCache = out;
    return out;
  }

  #cells() {
    const store = this.store!;
    const doc = store.doc;
    const shown = this.#stableShown(shownResults(doc, this.runs, this.opened ?? doc));
    const pins = new Map(this.pins.map((p) => [p.cellId, p]));
    const problems = new Map<string, Diagnostic[]>();
    for (const d of this.diagnostics) if (d.cellId !== undefined) problems.set(d.cellId, [...(problems.get(d.cellId) ?? []), d]);
    const opened = new Set((this.opened ?? doc).cells);
    const noteName = rememberedName(doc.header.testInformation?.reviewer ?? "");
    return html`${repeat(
        doc.cells,
        (c) => c.id,
        (c, i) => html`<cb-cell
          data-id=${c.id}
          .cell=${c}
          .shown=${shown.get(c.id)}
          .pin=${pins.get(c.id)}
          .dataText=${this.dataTexts.get(c.id)}
          .dataSlots=${doc.header.dataSlots ?? []}
          .completions=${catalogue}
          .problems=${opened.has(c) ? (problems.get(c.id) ?? []) : []}
          file=${this.path}
          .position=${i}
          .count=${doc.cells.length}
          ?editing=${this.editingNarrative.has(c.id)}
          ?selected=${this.selectedId === c.id}
          .review=${this.reviewShown?.cells.get(c.id)}
          .controlValues=${this.controlOverrides}
          noteName=${noteName}
        ></cb-cell>`,
      )}
      <div class="add-end">
        <span>Add a cell at the end:</span>
        ${CELL_KINDS.map(
          (k) => html`<button
            @click=${() => {
              const fresh = newCell(store.doc, k.kind);
              this.#dispatch(insertCell(store.doc.cells.length, fresh));
              void this.updateComplete.then(() => this.#cellElement(fresh.id)?.focusEditor());
            }}
          >
            ${icons.add}<span>${k.label}</span>
          </button>`,
        )}
      </div>`;
  }

  override updated(): void {
    // Dialogs open modal (focus stays inside, the page behind is inert) as soon as they are rendered.
    for (const d of this.renderRoot.querySelectorAll("dialog")) if (!d.open) d.showModal();
  }

  override render() {
    const n = this.notice;
    return html`${this.#top()}
      <div class="layout">
        ${this.#outline()}
        <main>
          <div class="status-line ${n?.tone ?? ""}" role="status" aria-live="polite">${n?.text ?? (this.loading ? "Opening…" : "Ready")}</div>
          ${this.recovery
            ? html`<div class="banner" role="alert">
                Unsaved edits to ${this.path} from ${new Date(this.recovery.keptAt).toLocaleString()} were kept in this browser${this.recovery.baseSha256 !== this.baseSha ? ", made on an older version of the file" : ""}.
                <div class="actions">
                  <button class="primary" @click=${() => this.#restoreRecovery()}>Restore them</button>
                  <button @click=${() => this.#discardRecovery()}>Discard them</button>
                </div>
              </div>`
            : nothing}
          ${this.store && !this.raw ? html`${this.#templateBanner()} ${this.#reviewBanner()} ${this.matchOpen ? this.#matchPanel() : nothing}` : nothing}
          ${this.raw ? this.#rawView() : this.store ? this.#cells() : !this.loading ? html`<p>Choose a document on the left.</p>` : nothing}
        </main>
      </div>
      ${this.#help()} ${this.#conflictDialog()}`;
  }
}

customElements.define("cb-workbench", CbWorkbench);
