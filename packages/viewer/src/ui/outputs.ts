/**
 * <cb-outputs>: every output type the kernel produces, shown as text the page never interprets as markup
 * (lit escapes every interpolated string): values with units, text, tables with their units in a scrolling
 * box, charts (<cb-chart>), JSON, controls with unit, range and description, errors with their place, and
 * cells that did not run.
 */
import { LitElement, css, html, nothing } from "lit";
import type { CellOutput } from "@conebook/document";
import { formatNumber } from "./format.js";
import "./chart.js";

/** Rows shown at first in a long table; the rest on request. */
export const TABLE_ROWS_SHOWN = 200;

export class CbOutputs extends LitElement {
  static override properties = {
    outputs: { attribute: false },
    cellId: { type: String },
    /** Text to put before an error's line number, e.g. the document's name. */
    file: { type: String },
    /** Line of the cell's first source line in the text that ran, to give errors an editor line. */
    sourceLine: { type: Number },
    controlValues: { attribute: false },
    expanded: { state: true },
  };
  declare outputs: readonly CellOutput[];
  declare cellId: string;
  declare file: string;
  declare sourceLine: number | undefined;
  /** Values of controls changed in the page and not yet recorded, by name (shown in the inputs until a run uses them). */
  declare controlValues: Readonly<Record<string, number>>;
  declare expanded: Set<number>;

  static override styles = css`
    :host {
      display: block;
    }
    .value {
      margin: 0.3rem 0;
      font-size: 0.95rem;
    }
    .value .number {
      font-weight: 650;
      font-variant-numeric: tabular-nums;
    }
    .unit {
      color: var(--cb-muted);
    }
    pre {
      font-family: var(--cb-mono);
      font-size: 0.82rem;
      background: #f3f1eb;
      padding: 0.45rem 0.6rem;
      margin: 0.3rem 0;
      white-space: pre-wrap;
      overflow-wrap: anywhere;
      max-height: 24rem;
      overflow: auto;
    }
    .table {
      max-height: 22rem;
      overflow: auto;
      border: 1px solid var(--cb-rule);
      margin: 0.35rem 0;
      background: var(--cb-sheet);
    }
    table {
      border-collapse: collapse;
      font-size: 0.82rem;
      font-variant-numeric: tabular-nums;
    }
    caption {
      text-align: left;
      font-weight: 650;
      padding: 0.3rem 0.5rem;
      caption-side: top;
    }
    th,
    td {
      padding: 0.15rem 0.55rem;
      border-bottom: 1px solid #ece8de;
      text-align: left;
      white-space: nowrap;
    }
    th {
      position: sticky;
      top: 0;
      background: #ebe7dc;
      font-weight: 600;
    }
    td.num {
      text-align: right;
    }
    .control input[type="number"] {
      font: inherit;
      width: 7rem;
    }
    .control input[type="range"] {
      width: 12rem;
    }
    .control .description {
      flex-basis: 100%;
      font-size: 0.82rem;
    }
    .control {
      display: flex;
      gap: 0.5rem;
      align-items: baseline;
      flex-wrap: wrap;
      font-size: 0.9rem;
      margin: 0.25rem 0;
      padding: 0.3rem 0.5rem;
      border-left: 3px solid var(--cb-action);
      background: #eef5f4;
    }
    .error {
      color: var(--cb-error);
      background: var(--cb-error-bg);
      border-left: 3px solid var(--cb-error);
      padding: 0.4rem 0.6rem;
      margin: 0.3rem 0;
      font-size: 0.88rem;
      white-space: pre-wrap;
    }
    .not-run {
      color: var(--cb-muted);
      font-style: italic;
      font-size: 0.88rem;
    }
    button {
      font: inherit;
      font-size: 0.8rem;
      margin: 0.2rem 0;
    }
  `;

  constructor() {
    super();
    this.outputs = [];
    this.cellId = "";
    this.file = "";
    this.sourceLine = undefined;
    this.controlValues = {};
    this.expanded = new Set();
  }

  #table(o: Extract<CellOutput, { type: "table" }>, index: number) {
    const all = this.expanded.has(index);
    const rows = all ? o.rows : o.rows.slice(0, TABLE_ROWS_SHOWN);
    return html`<div class="table" tabindex="0" role="region" aria-label=${o.title ?? `table of cell ${this.cellId}`}>
        <table>
          ${o.title ? html`<caption>${o.title}</caption>` : nothing}
          <thead>
            <tr>
              ${o.columns.map((c) => html`<th scope="col">${c.name}${c.unit ? html` <span class="unit">(${c.unit})</span>` : nothing}</th>`)}
            </tr>
          </thead>
          <tbody>
            ${rows.map((r) => html`<tr>${r.map((v) => html`<td class=${typeof v === "number" ? "num" : ""} title=${typeof v === "number" ? String(v) : nothing}>${typeof v === "number" ? formatNumber(v) : v ?? ""}</td>`)}</tr>`)}
          </tbody>
        </table>
      </div>
      ${o.rows.length > rows.length
        ? html`<button @click=${() => (this.expanded = new Set([...this.expanded, index]))}>Show all ${o.rows.length} rows</button>`
        : nothing}`;
  }

  #one(o: CellOutput, index: number) {
    switch (o.type) {
      case "value":
        return html`<p class="value">${o.label ? html`<span class="label">${o.label}</span> = ` : nothing}<span class="number" title=${String(o.value)}>${formatNumber(o.value)}</span>${o.unit ? html` <span class="unit">${o.unit}</span>` : nothing}</p>`;
      case "text":
        return html`<pre class="text">${o.text}</pre>`;
      case "table":
        return this.#table(o, index);
      case "chart":
        return html`<cb-chart .spec=${o.spec} label=${typeof o.spec.title === "string" ? o.spec.title : `chart of cell ${this.cellId}`}></cb-chart>`;
      case "json":
        return html`<pre class="json">${JSON.stringify(o.value, null, 2) ?? "null"}</pre>`;
      case "control": {
        const unit = o.unit ? ` ${o.unit}` : "";
        const pending = Object.hasOwn(this.controlValues, o.name) ? this.controlValues[o.name]! : undefined;
        const value = pending ?? o.value;
        const ranged = o.min !== undefined && o.max !== undefined;
        const change = (raw: string, commit: boolean) => {
          const v = Number(raw);
          if (raw.trim() === "" || !Number.isFinite(v)) return;
          this.dispatchEvent(new CustomEvent("cb-control", { detail: { name: o.name, value: v, commit }, bubbles: true, composed: true }));
        };
        return html`<div class="control" role="group" aria-label=${`adjustable value ${o.name}`}>
          <label for=${`control-${o.name}`}><strong>${o.name}</strong></label>
          <input
            id=${`control-${o.name}`}
            class="control-number"
            type="number"
            aria-label=${`${o.name}${unit ? ` in${unit}` : ""}`}
            .value=${String(value)}
            min=${o.min ?? nothing}
            max=${o.max ?? nothing}
            step="any"
            @change=${(e: Event) => change((e.target as HTMLInputElement).value, true)}
          />
          <span class="unit">${o.unit ?? ""}</span>
          ${ranged
            ? html`<input
                class="control-slider"
                type="range"
                aria-label=${`${o.name} slider, ${formatNumber(o.min!)} to ${formatNumber(o.max!)}${unit}`}
                min=${o.min!}
                max=${o.max!}
                step=${(o.max! - o.min!) / 200}
                .value=${String(value)}
                @input=${(e: Event) => change((e.target as HTMLInputElement).value, false)}
                @change=${(e: Event) => change((e.target as HTMLInputElement).value, true)}
              />`
            : nothing}
          <span class="unit">used ${formatNumber(o.value)}${unit}; default ${formatNumber(o.default)}${unit}${ranged ? `, range ${formatNumber(o.min!)} to ${formatNumber(o.max!)}${unit}` : ""}</span>
          ${pending !== undefined && pending !== o.value ? html`<span class="unit" role="status">rerunning with ${formatNumber(pending)}${unit}…</span>` : nothing}
          ${o.description ? html`<span class="description">${o.description}</span>` : nothing}
        </div>`;
      }
      case "error": {
        const editorLine = o.line !== undefined && this.sourceLine !== undefined ? o.line - this.sourceLine + 1 : undefined;
        const where =
          o.line === undefined
            ? ""
            : `${this.file}:${o.line}${o.column !== undefined ? `:${o.column}` : ""}${editorLine !== undefined && editorLine >= 1 ? ` (line ${editorLine} of the cell)` : ""}: `;
        return html`<div class="error" role="alert"><strong>Error</strong> ${where}${o.message}</div>`;
      }
      case "not-run":
        return html`<p class="not-run">Not run: ${o.reason}</p>`;
    }
  }

  override render() {
    return html`${this.outputs.map((o, i) => this.#one(o, i))}`;
  }
}

customElements.define("cb-outputs", CbOutputs);
