/**
 * <cb-cell>: one cell of the document. Narrative is shown rendered (markdown-it, raw HTML off) and edited in a
 * Markdown editor; code in a TypeScript editor with API completion; a chart spec in a YAML (or JSON) editor
 * checked against the chart-cell schema as you type; inline data in a text editor with its table below; a
 * file-pinned data cell shows the file, its SHA-256 (and whether the bytes still match) and its rows. A bar
 * gives the cell's kind, status, time and its actions. Every change leaves as a `cb-cell` event that the
 * workbench turns into a transaction; nothing here changes the document itself.
 */
import { LitElement, css, html, nothing, type PropertyValues } from "lit";
import { narrativeFragment } from "./narrative.js";
import { chartSpecSchema, readReviewThread, renderNarrative, validateJsonSchema, type Cell, type DataSlot, type Diagnostic } from "@conebook/document";
import { parseDataTable, type PinCheck } from "@conebook/kernel";
import type { ApiEntry } from "../model/api-catalogue.js";
import { CELL_KINDS, readChartSource } from "../model/cells.js";
import type { CellReview } from "../model/review.js";
import type { ShownResult } from "../model/runs.js";
import type { NoteAction } from "./notes.js";
import type { CbEditor, EditorMark } from "./editor.js";
import { formatMs, formatNumber } from "./format.js";
import { icons } from "./icons.js";
import { controls, tokens } from "./theme.js";
import "./editor.js";
import "./notes.js";
import "./outputs.js";
import "./review-cell.js";

/** Rows of a data table shown in the cell. */
const DATA_ROWS_SHOWN = 500;

/** A request from a cell to the workbench. */
export interface CellCommand {
  command: string;
  cellId: string;
  text?: string;
  kind?: string;
  note?: NoteAction;
}

const STATUS_WORDS: Record<string, string> = {
  ok: "ran",
  error: "failed",
  "not-run": "not run",
  running: "running",
  queued: "waiting",
  stopped: "stopped",
};

export class CbCell extends LitElement {
  static override properties = {
    cell: { attribute: false },
    shown: { attribute: false },
    pin: { attribute: false },
    dataText: { attribute: false },
    dataSlots: { attribute: false },
    completions: { attribute: false },
    problems: { attribute: false },
    file: { type: String },
    position: { type: Number },
    count: { type: Number },
    editing: { type: Boolean, reflect: true },
    selected: { type: Boolean, reflect: true },
    review: { attribute: false },
    noteName: { type: String },
    controlValues: { attribute: false },
    writingNote: { state: true },
  };
  declare cell: Cell;
  declare shown: ShownResult | undefined;
  declare pin: PinCheck | undefined;
  /** The text of a pinned data file as read through the server, or the reason it could not be read. */
  declare dataText: { text: string } | { problem: string } | undefined;
  declare dataSlots: readonly DataSlot[];
  declare completions: readonly ApiEntry[];
  /** Diagnostics of the document that concern this cell. */
  declare problems: readonly Diagnostic[];
  declare file: string;
  declare position: number;
  declare count: number;
  declare editing: boolean;
  declare selected: boolean;
  /** What the review view says about this cell, while a review is shown. */
  declare review: CellReview | undefined;
  /** The name a new note or answer is signed with, at first. */
  declare noteName: string;
  /** Values of controls changed in the page and not yet recorded, by name. */
  declare controlValues: Readonly<Record<string, number>>;
  declare writingNote: boolean;

  static override styles = [
    tokens,
    controls,
    css`
      :host {
        display: block;
        position: relative;
        margin: 0 0 0.9rem;
        border-left: 5px solid var(--stripe, var(--cb-rule));
        background: var(--cb-sheet);
        border-radius: 0 6px 6px 0;
        box-shadow: 0 1px 0 var(--cb-rule);
      }
      :host([kind="narrative"]) {
        --stripe: var(--cb-kind-narrative);
        background: transparent;
        box-shadow: none;
      }
      :host([kind="code"]) {
        --stripe: var(--cb-kind-code);
      }
      :host([kind="data"]) {
        --stripe: var(--cb-kind-data);
      }
      :host([kind="chart"]) {
        --stripe: var(--cb-kind-chart);
      }
      :host([selected]) {
        box-shadow: 0 0 0 2px #c9d9d7;
      }
      .frame {
        outline: none;
        padding: 0.35rem 0.8rem 0.6rem;
      }
      .frame:focus-visible {
        outline: 3px solid var(--cb-focus);
      }
      .bar {
        display: flex;
        align-items: center;
        gap: 0.35rem;
        flex-wrap: wrap;
        font-size: 0.78rem;
        color: var(--cb-muted);
        min-height: 1.7rem;
      }
      .kind {
        font-weight: 700;
        letter-spacing: 0.04em;
        text-transform: uppercase;
        color: var(--stripe);
        filter: brightness(0.8);
      }
      .id {
        font-family: var(--cb-mono);
      }
      .status {
        padding: 0 0.4rem;
        border-radius: 3px;
        background: #eceae3;
      }
      .status.ok {
        color: var(--cb-ok);
      }
      .status.error {
        color: var(--cb-error);
        background: var(--cb-error-bg);
      }
      .status.running {
        color: var(--cb-action);
        font-weight: 600;
      }
      .stale {
        color: var(--cb-warn);
        background: var(--cb-warn-bg);
        padding: 0 0.4rem;
        border-radius: 3px;
      }
      .spacer {
        flex: 1;
      }
      .bar button,
      .bar select {
        font-size: 0.75rem;
        padding: 0.1rem 0.4rem;
        opacity: 0.35;
      }
      :host(:hover) .bar button,
      :host(:hover) .bar select,
      :host(:focus-within) .bar button,
      :host(:focus-within) .bar select,
      :host([selected]) .bar button,
      :host([selected]) .bar select {
        opacity: 1;
      }
      .prose {
        line-height: 1.55;
        max-width: 46rem;
        cursor: text;
      }
      .prose :is(h1, h2, h3) {
        line-height: 1.25;
      }
      .prose code {
        font-family: var(--cb-mono);
        font-size: 0.88em;
        background: #ece9e1;
        padding: 0 0.2em;
      }
      .prose pre {
        background: #ece9e1;
        padding: 0.5rem;
        overflow: auto;
      }
      .prose:empty::before {
        content: "Empty text cell: press Enter to write.";
        color: var(--cb-muted);
      }
      .problems {
        color: var(--cb-error);
        font-size: 0.85rem;
        margin: 0.3rem 0;
        padding-left: 1.1rem;
      }
      .pin {
        font-size: 0.85rem;
        margin: 0.2rem 0 0.4rem;
      }
      .pin code {
        font-family: var(--cb-mono);
        font-size: 0.78rem;
        word-break: break-all;
      }
      .pin .bad {
        color: var(--cb-error);
        font-weight: 600;
      }
      .data {
        max-height: 18rem;
        overflow: auto;
        border: 1px solid var(--cb-rule);
        font-size: 0.8rem;
        margin-top: 0.35rem;
      }
      .data table {
        border-collapse: collapse;
        font-variant-numeric: tabular-nums;
      }
      .data th,
      .data td {
        padding: 0.1rem 0.5rem;
        border-bottom: 1px solid #ece8de;
        white-space: nowrap;
        text-align: right;
      }
      .data th {
        position: sticky;
        top: 0;
        background: #efe9d8;
      }
      .unit {
        color: var(--cb-muted);
        font-weight: 400;
      }
      cb-outputs {
        margin-top: 0.35rem;
      }
      .hint {
        font-size: 0.75rem;
        color: var(--cb-muted);
      }
    `,
  ];

  constructor() {
    super();
    this.shown = undefined;
    this.pin = undefined;
    this.dataText = undefined;
    this.dataSlots = [];
    this.completions = [];
    this.problems = [];
    this.file = "";
    this.position = 0;
    this.count = 1;
    this.editing = false;
    this.selected = false;
    this.review = undefined;
    this.noteName = "";
    this.controlValues = {};
    this.writingNote = false;
    this.addEventListener("cb-note-action", (e) => {
      e.stopPropagation();
      const action = (e as CustomEvent<NoteAction>).detail;
      if (action.action === "add" || action.action === "cancel") this.writingNote = false;
      if (action.action !== "cancel") this.#send("note", { note: action });
    });
  }

  /** Opens the form for a new review note on this cell. */
  writeNote(): void {
    this.writingNote = true;
  }

  override willUpdate(changed: PropertyValues<this>): void {
    if (changed.has("cell")) this.setAttribute("kind", this.cell.kind);
  }

  #send(command: string, extra: Partial<CellCommand> = {}): void {
    this.dispatchEvent(new CustomEvent<CellCommand>("cb-cell", { detail: { command, cellId: this.cell.id, ...extra }, bubbles: true, composed: true }));
  }

  /** Focuses the cell's frame (for keyboard navigation between cells). */
  focusFrame(): void {
    this.renderRoot.querySelector<HTMLElement>(".frame")?.focus();
  }

  /** Focuses the cell's editor (opening a narrative cell for editing); resolves when it has focus. */
  async focusEditor(line?: number, column?: number): Promise<void> {
    if (this.cell.kind === "narrative" && !this.editing) this.#send("edit-narrative");
    await this.updateComplete;
    const editor = this.renderRoot.querySelector<CbEditor>("cb-editor");
    if (!editor) return this.focusFrame();
    await editor.updateComplete;
    if (line !== undefined) editor.reveal(line, column);
    else editor.focus();
  }

  #frameKey(e: KeyboardEvent): void {
    if (e.target !== e.currentTarget || e.altKey || e.ctrlKey || e.metaKey) return;
    if (e.key === "Enter" && !e.ctrlKey && !e.shiftKey && !e.metaKey) {
      e.preventDefault();
      void this.focusEditor();
    } else if (e.key === "ArrowDown" || e.key === "ArrowUp") {
      e.preventDefault();
      this.#send(e.key === "ArrowDown" ? "select-next" : "select-previous");
    }
  }

  #marks(): EditorMark[] {
    const marks: EditorMark[] = [];
    const start = this.cell.sourceStart.line;
    for (const p of this.problems) {
      marks.push({ line: Math.max(1, p.line - start + 1), column: p.column, message: p.message, severity: p.severity });
    }
    if (this.cell.kind === "chart") {
      const reading = readChartSource(this.cell.source, this.cell.specFormat);
      if ("problem" in reading) marks.push({ line: reading.line ?? 1, message: reading.problem, severity: "error" });
    }
    const shown = this.shown;
    const sourceLine = shown?.run?.sourceLines[this.cell.id];
    if (shown && !shown.outOfDate && !shown.previous && sourceLine !== undefined) {
      for (const o of shown.outputs) {
        if (o.type === "error" && o.line !== undefined && o.line >= sourceLine) {
          marks.push({ line: o.line - sourceLine + 1, ...(o.column !== undefined ? { column: o.column } : {}), message: o.message, severity: "error" });
        }
      }
    }
    return marks;
  }

  #problemsFor: { source: string; problems: string[] } | undefined;

  #chartProblems(): string[] {
    if (this.cell.kind !== "chart") return [];
    if (this.#problemsFor?.source === this.cell.source) return this.#problemsFor.problems;
    const problems = this.#readChartProblems();
    this.#problemsFor = { source: this.cell.source, problems };
    return problems;
  }

  #readChartProblems(): string[] {
    if (this.cell.kind !== "chart") return [];
    const reading = readChartSource(this.cell.source, this.cell.specFormat);
    if ("problem" in reading) return [`The chart specification does not read as ${this.cell.specFormat.toUpperCase()}: ${reading.problem}`];
    return validateJsonSchema(chartSpecSchema, reading.spec).map((p) => `The chart specification ${p.path === "" ? "" : `at ${p.path} `}${p.message}`);
  }

  #bar() {
    const c = this.cell;
    const shown = this.shown;
    const status = shown?.status;
    const kindLabel = c.kind === "narrative" && c.review ? "review note" : (CELL_KINDS.find((k) => k.kind === c.kind)?.label ?? c.kind);
    const executable = c.kind !== "narrative";
    return html`<div class="bar">
      <span class="kind">${kindLabel}</span>
      <span class="id" title="cell id">${c.id}</span>
      ${executable && status ? html`<span class="status ${status}" role="status">${STATUS_WORDS[status] ?? status}${shown?.ms !== undefined && (status === "ok" || status === "error") ? ` in ${formatMs(shown.ms)}` : ""}</span>` : nothing}
      ${executable && !status && c.outputs.length > 0 ? html`<span class="status" title="outputs as recorded in the file">recorded</span>` : nothing}
      ${executable && shown?.previous && shown.outputs.length > 0 ? html`<span class="status" title="the run has not reached this cell yet">earlier outputs</span>` : nothing}
      ${executable && shown?.outOfDate ? html`<span class="stale" title="this cell or one above it changed since these outputs were made">out of date</span>` : nothing}
      <span class="spacer"></span>
      ${executable
        ? html`<button @click=${() => this.#send("run-cell")} aria-label=${`Run up to cell ${c.id}`} title="Run the document up to this cell (Ctrl+Enter)">${icons.runTo}<span>to here</span></button>
            <button @click=${() => this.#send("run-from")} aria-label=${`Run from cell ${c.id} to the end`} title="Run to the end (Shift+Enter)">${icons.run}<span>from here</span></button>`
        : html`<button @click=${() => this.#send(this.editing ? "done-narrative" : "edit-narrative")} aria-label=${this.editing ? `Finish editing text cell ${c.id}` : `Edit text cell ${c.id}`}>${icons.edit}<span>${this.editing ? "done" : "edit"}</span></button>`}
      <label class="sr-only" for="kind">Kind of cell ${c.id}</label>
      <select id="kind" aria-label=${`Kind of cell ${c.id}`} .value=${c.kind} @change=${(e: Event) => this.#send("set-kind", { kind: (e.target as HTMLSelectElement).value })}>
        ${CELL_KINDS.map((k) => html`<option value=${k.kind} ?selected=${k.kind === c.kind}>${k.label}</option>`)}
      </select>
      <button @click=${() => this.#send("move-up")} ?disabled=${this.position === 0} aria-label=${`Move cell ${c.id} up`} title="Move up (Alt+Shift+Up)">${icons.up}</button>
      <button @click=${() => this.#send("move-down")} ?disabled=${this.position >= this.count - 1} aria-label=${`Move cell ${c.id} down`} title="Move down (Alt+Shift+Down)">${icons.down}</button>
      ${c.kind === "narrative" && c.review ? nothing : html`<button @click=${() => (this.writingNote = !this.writingNote)} aria-label=${`Write a review note on cell ${c.id}`} title="Write a review note on this cell (Alt+Shift+R)">note</button>`}
      <button @click=${() => this.#send("add-below")} aria-label=${`Add a cell below ${c.id}`} title="Add a code cell below (Alt+Shift+N)">${icons.add}</button>
      <button @click=${() => this.#send("delete-cell")} aria-label=${`Delete cell ${c.id}`} title="Delete (Alt+Shift+Delete; undo brings it back)">${icons.remove}</button>
    </div>`;
  }

  #dataTable(text: string) {
    const c = this.cell;
    if (c.kind !== "data") return nothing;
    let table;
    try {
      table = parseDataTable(c.name, text);
    } catch (e) {
      return html`<ul class="problems"><li>${(e as Error).message}</li></ul>`;
    }
    const slot = this.dataSlots.find((s) => s.name === c.name);
    const unitOf = (name: string) => slot?.columns?.find((col) => col.name === name)?.unit;
    const n = Math.min(table.length, DATA_ROWS_SHOWN);
    const rows = Array.from({ length: n }, (_, r) => table.values.map((col) => col[r] ?? null));
    return html`<div class="hint">${table.length} rows × ${table.columns.length} columns${table.length > n ? `, first ${n} shown` : ""}</div>
      <div class="data" tabindex="0" role="region" aria-label=${`rows of data ${c.name}`}>
        <table>
          <thead>
            <tr>
              ${table.columns.map((name) => html`<th scope="col">${name}${unitOf(name) ? html` <span class="unit">(${unitOf(name)})</span>` : nothing}</th>`)}
            </tr>
          </thead>
          <tbody>
            ${rows.map((r) => html`<tr>${r.map((v) => html`<td>${typeof v === "number" ? (Number.isNaN(v) ? "" : formatNumber(v)) : v ?? ""}</td>`)}</tr>`)}
          </tbody>
        </table>
      </div>`;
  }

  #body() {
    const c = this.cell;
    const edit = (e: CustomEvent<{ text: string }>) => this.#send("edit", { text: e.detail.text });
    const marks = this.#marks();
    if (c.kind === "narrative") {
      if (this.editing) {
        return html`<cb-editor .value=${c.source} language="markdown" label=${`Text of cell ${c.id} (Markdown)`} .marks=${marks} hint="Write Markdown here; Escape to finish" @cb-edit=${edit}></cb-editor>`;
      }
      if (c.review) return html`<cb-note .on=${c.review.on} .status=${c.review.status} .entries=${readReviewThread(c.source)} .who=${this.noteName}></cb-note>`;
      return html`<div class="prose" @dblclick=${() => void this.focusEditor()}>${narrativeFragment(renderNarrative(c.source))}</div>`;
    }
    if (c.kind === "code") {
      return html`<cb-editor .value=${c.source} language="ts" label=${`Code of cell ${c.id} (TypeScript)`} .marks=${marks} .completions=${this.completions} hint="TypeScript: aq., show., charts., control(...)" @cb-edit=${edit}></cb-editor>`;
    }
    if (c.kind === "chart") {
      const problems = this.#chartProblems();
      return html`<cb-editor .value=${c.source} language=${c.specFormat === "json" ? "json" : "yaml"} label=${`Chart specification of cell ${c.id} (${c.specFormat.toUpperCase()})`} .marks=${marks} @cb-edit=${edit}></cb-editor>
        ${problems.length ? html`<ul class="problems" role="alert">${problems.map((p) => html`<li>${p}</li>`)}</ul>` : nothing}`;
    }
    if (c.file) {
      const pin = this.pin;
      const text = this.dataText;
      return html`<div class="pin">
          Data <strong>${c.name}</strong> from the file <code>${c.file.path}</code>, pinned by SHA-256 <code>${c.file.sha256}</code>
          ${pin?.status === "ok" ? html`<span>(the file's bytes match)</span>` : nothing}
          ${pin?.status === "changed" ? html`<span class="bad">The file changed since it was pinned: it now has SHA-256 <code>${pin.actual}</code>.</span>` : nothing}
          ${pin?.status === "unreadable" ? html`<span class="bad">The file cannot be read: ${pin.reason}</span>` : nothing}
        </div>
        ${text && "text" in text ? this.#dataTable(text.text) : text && "problem" in text ? html`<ul class="problems"><li>${text.problem}</li></ul>` : nothing}`;
    }
    return html`<cb-editor .value=${c.source} language="plain" label=${`CSV of data cell ${c.id}`} .marks=${marks} @cb-edit=${edit}></cb-editor>${this.#dataTable(c.source)}`;
  }

  override render() {
    const c = this.cell;
    const docProblems = this.problems.filter((p) => p.severity === "error");
    return html`<div class="frame" tabindex="0" aria-label=${`${CELL_KINDS.find((k) => k.kind === c.kind)?.label ?? c.kind} cell ${c.id}, ${this.position + 1} of ${this.count}`} @keydown=${this.#frameKey} @focusin=${() => !this.selected && this.#send("select")}>
      ${this.#bar()} ${this.#body()}
      ${docProblems.length && c.kind !== "chart" ? html`<ul class="problems" role="alert">${docProblems.map((p) => html`<li>line ${p.line}: ${p.message}</li>`)}</ul>` : nothing}
      ${c.kind !== "narrative" && this.shown ? html`<cb-outputs .outputs=${this.shown.outputs} cellId=${c.id} file=${this.file} .controlValues=${this.controlValues} .sourceLine=${this.shown.previous ? undefined : this.shown.run?.sourceLines[c.id]}></cb-outputs>` : nothing}
      ${this.review ? html`<cb-review-cell .review=${this.review} cellId=${c.id}></cb-review-cell>` : nothing}
      ${this.writingNote ? html`<cb-note-form cellId=${c.id} who=${this.noteName}></cb-note-form>` : nothing}
    </div>`;
  }
}

customElements.define("cb-cell", CbCell);
