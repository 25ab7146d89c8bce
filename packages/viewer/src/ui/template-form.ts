/**
 * <cb-template-form>: making a document from a template in the page. Every header parameter with its unit
 * (a value typed in another unit of the same dimension is converted, and the conversion shown), range and
 * description, each to be changed or confirmed; every data slot with a file chooser and drop area, a preview
 * of the first rows, the mapping of the file's columns to the slot's columns and units, and the SHA-256 pin
 * computed at once; the title, the file name and the people and wells of the test information. The document is
 * made by the document package's `documentFromTemplate`, the function behind `conebook new`, and leaves as a
 * `cb-template-make` event with its text and data files.
 */
import { LitElement, css, html, nothing } from "lit";
import { TemplateInputError, documentFromTemplate, type ConebookDocument, type DataSlot } from "@conebook/document";
import {
  blockingParameters,
  csvPreview,
  formInfo,
  formSettings,
  infoFields,
  initialField,
  initialMapping,
  mappingProblems,
  needsConfirmation,
  prepareData,
  readField,
  type ColumnSource,
  type ParameterField,
  type PreparedData,
} from "../model/template-form.js";
import { controls, tokens } from "./theme.js";

/** A chosen file for a slot. */
interface ChosenFile {
  name: string;
  bytes: Uint8Array;
  mapping: Record<string, ColumnSource>;
}

/** What the form asks the workbench to write. */
export interface TemplateMake {
  path: string;
  text: string;
  files: { path: string; bytes: Uint8Array }[];
}

export class CbTemplateForm extends LitElement {
  static override properties = {
    template: { attribute: false },
    templatePath: { type: String },
    fields: { state: true },
    files: { state: true },
    docTitle: { state: true },
    info: { state: true },
    outPath: { state: true },
    problem: { state: true },
  };
  declare template: ConebookDocument;
  declare templatePath: string;
  declare fields: Record<string, ParameterField>;
  declare files: Record<string, ChosenFile>;
  declare docTitle: string;
  declare info: Record<string, string>;
  declare outPath: string;
  declare problem: string | undefined;

  static override styles = [
    tokens,
    controls,
    css`
      :host {
        display: block;
      }
      h2 {
        margin: 0 0 0.4rem;
        font-size: 1.1rem;
      }
      h3 {
        font-size: 0.95rem;
        margin: 0.9rem 0 0.3rem;
      }
      fieldset {
        border: 1px solid var(--cb-rule);
        border-radius: 6px;
        margin: 0.4rem 0;
        padding: 0.4rem 0.7rem;
      }
      legend {
        font-weight: 650;
        font-size: 0.9rem;
      }
      .row {
        display: grid;
        grid-template-columns: 11rem 12rem 5rem 1fr;
        gap: 0.5rem;
        align-items: center;
        font-size: 0.85rem;
        margin: 0.25rem 0;
      }
      input[type="text"] {
        font: inherit;
        font-size: 0.85rem;
        padding: 0.15rem 0.35rem;
        border: 1px solid var(--cb-rule);
        border-radius: 3px;
        width: 100%;
        box-sizing: border-box;
      }
      .hint {
        color: var(--cb-muted);
        font-size: 0.78rem;
      }
      .bad {
        color: var(--cb-error);
        font-size: 0.8rem;
      }
      .ok {
        color: var(--cb-ok);
        font-size: 0.8rem;
      }
      .drop {
        border: 2px dashed var(--cb-rule);
        border-radius: 6px;
        padding: 0.6rem;
        font-size: 0.85rem;
        text-align: center;
      }
      .drop.over {
        border-color: var(--cb-action);
        background: #eef5f4;
      }
      table {
        border-collapse: collapse;
        font-size: 0.78rem;
        margin: 0.3rem 0;
      }
      td,
      th {
        border-bottom: 1px solid #ece8de;
        padding: 0.1rem 0.45rem;
        text-align: left;
      }
      code {
        font-family: var(--cb-mono);
        font-size: 0.78rem;
        word-break: break-all;
      }
      .actions {
        display: flex;
        gap: 0.5rem;
        margin-top: 0.8rem;
        flex-wrap: wrap;
        align-items: center;
      }
      .people {
        display: grid;
        grid-template-columns: 16rem 1fr;
        gap: 0.3rem 0.6rem;
        font-size: 0.85rem;
        align-items: center;
      }
    `,
  ];

  constructor() {
    super();
    this.templatePath = "";
    this.fields = {};
    this.files = {};
    this.docTitle = "";
    this.info = {};
    this.outPath = "";
    this.problem = undefined;
  }

  override willUpdate(): void {
    if (this.outPath === "" && this.templatePath) this.outPath = `${this.templatePath.replace(/^.*\//, "").replace(/\.cone\.md$/, "")}-new.cone.md`;
    for (const p of this.template?.header.parameters ?? []) if (!this.fields[p.name]) this.fields = { ...this.fields, [p.name]: initialField(p) };
  }

  #field(name: string, next: Partial<ParameterField>): void {
    this.fields = { ...this.fields, [name]: { ...this.fields[name]!, ...next } };
  }

  async #choose(slot: DataSlot, file: File | undefined): Promise<void> {
    if (!file) return;
    const bytes = new Uint8Array(await file.arrayBuffer());
    const columns = csvPreview(new TextDecoder("utf-8").decode(bytes)).columns;
    this.files = { ...this.files, [slot.name]: { name: file.name, bytes, mapping: initialMapping(slot, columns) } };
  }

  #prepared(slot: DataSlot): PreparedData | undefined {
    const f = this.files[slot.name];
    if (!f || mappingProblems(slot, f.mapping).length > 0) return undefined;
    return prepareData(slot, f.name, f.bytes, f.mapping);
  }

  /** The document the form would make now, or the problem. */
  #made(): { text: string; files: PreparedData[] } | { problem: string } {
    const t = this.template;
    const blocking = blockingParameters(t.header.parameters, this.fields);
    if (blocking.length > 0) return { problem: `Change or confirm ${blocking.join(", ")}: a template's values belong to its demonstration` };
    const data: PreparedData[] = [];
    for (const slot of t.header.dataSlots ?? []) {
      const f = this.files[slot.name];
      if (!f) continue;
      const problems = mappingProblems(slot, f.mapping);
      if (problems.length) return { problem: `Data ${slot.name}: ${problems.join("; ")}` };
      data.push(this.#prepared(slot)!);
    }
    if (!/^[A-Za-z0-9._/-]+\.cone\.md$/.test(this.outPath) || this.outPath.split("/").some((s) => s === ".." || s === "")) return { problem: "Give a file name ending in .cone.md (letters, digits, - _ . and / for a folder)" };
    try {
      const slots = (t.header.dataSlots ?? []).filter((s) => this.files[s.name]);
      const made = documentFromTemplate({
        template: t,
        templateShown: this.templatePath,
        outShown: this.outPath,
        settings: formSettings(t.header.parameters, this.fields),
        ...(this.docTitle.trim() ? { title: this.docTitle.trim() } : {}),
        info: formInfo(this.info),
        data: slots.map((s, i) => ({ slot: s.name, path: data[i]!.path, bytes: data[i]!.bytes })),
      });
      return { text: made.text, files: data };
    } catch (e) {
      if (e instanceof TemplateInputError) return { problem: e.message };
      throw e;
    }
  }

  #make(): void {
    const made = this.#made();
    if ("problem" in made) {
      this.problem = made.problem;
      return;
    }
    const detail: TemplateMake = { path: this.outPath, text: made.text, files: made.files.map((f) => ({ path: f.path, bytes: f.bytes })) };
    this.dispatchEvent(new CustomEvent("cb-template-make", { detail, bubbles: true, composed: true }));
  }

  #slot(slot: DataSlot) {
    const f = this.files[slot.name];
    const preview = f ? csvPreview(new TextDecoder("utf-8").decode(f.bytes)) : undefined;
    const prepared = this.#prepared(slot);
    const problems = f ? mappingProblems(slot, f.mapping) : [];
    return html`<fieldset>
      <legend>Data ${slot.name}</legend>
      ${slot.description ? html`<div class="hint">${slot.description}</div>` : nothing}
      <div class="hint">Columns: ${(slot.columns ?? []).map((c) => `${c.name}${c.unit ? ` (${c.unit})` : ""}`).join(", ")}</div>
      <div
        class="drop"
        @dragover=${(e: DragEvent) => {
          e.preventDefault();
          (e.currentTarget as HTMLElement).classList.add("over");
        }}
        @dragleave=${(e: DragEvent) => (e.currentTarget as HTMLElement).classList.remove("over")}
        @drop=${(e: DragEvent) => {
          e.preventDefault();
          (e.currentTarget as HTMLElement).classList.remove("over");
          void this.#choose(slot, e.dataTransfer?.files[0]);
        }}
      >
        <label>Choose a CSV file <input type="file" accept=".csv,text/csv,text/plain" aria-label=${`CSV file for data ${slot.name}`} @change=${(e: Event) => void this.#choose(slot, (e.target as HTMLInputElement).files?.[0])} /></label>
        <div class="hint">or drop it here. ${f ? "" : "Without a file the new document keeps the template's demonstration rows (and says so)."}</div>
      </div>
      ${f && preview
        ? html`<div class="hint">${f.name}: ${preview.lines} rows; the first ${preview.rows.length}:</div>
            <table>
              <thead><tr>${preview.columns.map((c) => html`<th scope="col">${c}</th>`)}</tr></thead>
              <tbody>${preview.rows.map((r) => html`<tr>${r.map((v) => html`<td>${v}</td>`)}</tr>`)}</tbody>
            </table>
            ${(slot.columns ?? []).map(
              (c) => html`<div class="row">
                <label for=${`map-${slot.name}-${c.name}`}>${c.name}${c.unit ? ` (${c.unit})` : ""} from</label>
                <select
                  id=${`map-${slot.name}-${c.name}`}
                  .value=${f.mapping[c.name]?.column ?? ""}
                  @change=${(e: Event) => (this.files = { ...this.files, [slot.name]: { ...f, mapping: { ...f.mapping, [c.name]: { ...f.mapping[c.name]!, column: (e.target as HTMLSelectElement).value } } } })}
                >
                  <option value="">(choose a column)</option>
                  ${preview.columns.map((col) => html`<option value=${col} ?selected=${f.mapping[c.name]?.column === col}>${col}</option>`)}
                </select>
                <input
                  type="text"
                  aria-label=${`unit of the file's column for ${c.name}`}
                  .value=${f.mapping[c.name]?.unit ?? ""}
                  @change=${(e: Event) => (this.files = { ...this.files, [slot.name]: { ...f, mapping: { ...f.mapping, [c.name]: { ...f.mapping[c.name]!, unit: (e.target as HTMLInputElement).value.trim() } } } })}
                />
                <span class="hint">unit of the file's numbers${c.unit ? `; converted to ${c.unit}` : ""}</span>
              </div>`,
            )}
            ${problems.length ? html`<div class="bad" role="alert">${problems.join("; ")}</div>` : nothing}
            ${prepared
              ? html`<div class="ok">
                  Pinned as <code>${prepared.path}</code>, SHA-256 <code class="pin">${prepared.sha256}</code>
                  ${prepared.asChosen ? "(the file as chosen)" : "(a new file: the mapped columns, converted to the slot's units)"}
                </div>`
              : nothing}`
        : nothing}
    </fieldset>`;
  }

  override render() {
    const t = this.template;
    if (!t) return nothing;
    const made = this.#made();
    return html`<h2 id="template-form-title">A new document from this template</h2>
      <p class="hint">The same document <code>conebook new ${this.templatePath}</code> writes from the same values. Each value of the template belongs to its demonstration: change it or confirm it.</p>
      <h3>Parameters</h3>
      ${t.header.parameters.map((p) => {
        const f = this.fields[p.name] ?? initialField(p);
        const reading = readField(p, f);
        const demo = needsConfirmation(p, f);
        return html`<div class="row">
          <label for=${`param-${p.name}`}><strong>${p.name}</strong>${p.unit ? html` <span class="hint">(${p.unit})</span>` : nothing}</label>
          <input id=${`param-${p.name}`} type="text" .value=${f.text} @input=${(e: Event) => this.#field(p.name, { text: (e.target as HTMLInputElement).value })} aria-describedby=${`param-${p.name}-about`} />
          <label class="hint"><input type="checkbox" .checked=${f.confirmed} @change=${(e: Event) => this.#field(p.name, { confirmed: (e.target as HTMLInputElement).checked })} aria-label=${`Confirm the value of ${p.name}`} /> confirm</label>
          <span id=${`param-${p.name}-about`} class="hint">
            ${p.description ? `${p.description.replace(/\.?$/, ".")} ` : ""}${p.range ? `Range ${p.range[0]} to ${p.range[1]}${p.unit ? ` ${p.unit}` : ""}.` : ""}
            ${"problem" in reading ? html`<span class="bad">${reading.problem}</span>` : demo ? html`<span class="bad">the template's demonstration value: change or confirm it</span>` : html`<span class="ok">= ${reading.shown}</span>`}
          </span>
        </div>`;
      })}
      <h3>Data</h3>
      ${(t.header.dataSlots ?? []).map((s) => this.#slot(s))}
      <h3>Document</h3>
      <div class="people">
        <label for="out-path">file name (in the served folder)</label>
        <input id="out-path" type="text" .value=${this.outPath} @input=${(e: Event) => (this.outPath = (e.target as HTMLInputElement).value.trim())} />
        <label for="doc-title">title</label>
        <input id="doc-title" type="text" placeholder="the template's, with the parameters filled in" .value=${this.docTitle} @input=${(e: Event) => (this.docTitle = (e.target as HTMLInputElement).value)} />
        ${infoFields(t).map(
          (f) => html`<label for=${`info-${f.key}`}>${f.label}</label>
            <input id=${`info-${f.key}`} type="text" placeholder=${f.hint ? `template: ${f.hint}` : ""} .value=${this.info[f.key] ?? ""} @input=${(e: Event) => (this.info = { ...this.info, [f.key]: (e.target as HTMLInputElement).value })} />`,
        )}
      </div>
      <div class="actions">
        <button class="primary" ?disabled=${"problem" in made} @click=${() => this.#make()}>Make the document</button>
        <button @click=${() => this.dispatchEvent(new CustomEvent("cb-template-close", { bubbles: true, composed: true }))}>Cancel</button>
        <span class=${"problem" in made ? "bad" : "ok"} role="status">${"problem" in made ? made.problem : "Ready: nothing is written until you make the document."}</span>
      </div>
      ${this.problem ? html`<p class="bad" role="alert">${this.problem}</p>` : nothing}`;
  }
}

customElements.define("cb-template-form", CbTemplateForm);
