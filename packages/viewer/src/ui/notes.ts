/**
 * Review notes in the page: <cb-note-form> writes a new note on a cell (a challenge, a question, an acceptance or
 * a comment), <cb-note> shows a note's thread with its status and lets the author answer, resolve and reopen it.
 * Both leave as `cb-note-action` events; the workbench turns them into transactions on the note's narrative
 * cell (docs/format.md, review notes), so notes are saved, undone and verified like any text.
 */
import { LitElement, css, html, nothing } from "lit";
import { REVIEW_ENTRY_KINDS, type ReviewEntry, type ReviewEntryKind, type ReviewStatus } from "@conebook/document";
import { controls, tokens } from "./theme.js";

/** What a note form or a note asks for. */
export type NoteAction =
  | { action: "add"; kind: ReviewEntryKind; who: string; text: string }
  | { action: "reply"; kind: ReviewEntryKind; who: string; text: string }
  | { action: "status"; status: ReviewStatus }
  | { action: "cancel" };

const shared = css`
  :host {
    display: block;
    font-size: 0.86rem;
  }
  textarea,
  input[type="text"] {
    font: inherit;
    font-size: 0.85rem;
    border: 1px solid var(--cb-rule);
    border-radius: 3px;
    padding: 0.2rem 0.35rem;
    box-sizing: border-box;
  }
  textarea {
    width: 100%;
    min-height: 3.5rem;
  }
  .line {
    display: flex;
    gap: 0.4rem;
    flex-wrap: wrap;
    align-items: center;
    margin: 0.3rem 0;
  }
`;

function send(el: HTMLElement, detail: NoteAction): void {
  el.dispatchEvent(new CustomEvent<NoteAction>("cb-note-action", { detail, bubbles: true, composed: true }));
}

/** Remembered name of the person writing notes in this browser (localStorage), or the fallback. */
export function rememberedName(fallback: string): string {
  try {
    return localStorage.getItem("conebook.note-name") ?? fallback;
  } catch {
    return fallback;
  }
}

function remember(name: string): void {
  try {
    localStorage.setItem("conebook.note-name", name);
  } catch {
    // Storage refused: the name is simply not remembered.
  }
}

export class CbNoteForm extends LitElement {
  static override properties = { cellId: { type: String }, who: { type: String }, kind: { state: true }, text: { state: true } };
  declare cellId: string;
  declare who: string;
  declare kind: ReviewEntryKind;
  declare text: string;
  static override styles = [tokens, controls, shared, css`:host { border-left: 3px solid #b7791f; padding: 0.3rem 0.6rem; background: #fff8e8; margin-top: 0.4rem; }`];

  constructor() {
    super();
    this.cellId = "";
    this.who = "";
    this.kind = "challenge";
    this.text = "";
  }

  override firstUpdated(): void {
    this.renderRoot.querySelector("textarea")?.focus();
  }

  #add(): void {
    if (this.text.trim() === "" && this.kind !== "accepted") return;
    remember(this.who);
    send(this, { action: "add", kind: this.kind, who: this.who.trim(), text: this.text.trim() });
  }

  override render() {
    return html`<div class="line" role="group" aria-label=${`New review note on cell ${this.cellId}`}>
        <strong>Review note on ${this.cellId}</strong>
        <label>kind <select aria-label="Kind of note" .value=${this.kind} @change=${(e: Event) => (this.kind = (e.target as HTMLSelectElement).value as ReviewEntryKind)}>
          ${REVIEW_ENTRY_KINDS.filter((k) => k.kind !== "answer").map((k) => html`<option value=${k.kind} ?selected=${k.kind === this.kind}>${k.word.toLowerCase()}</option>`)}
        </select></label>
        <label>from <input type="text" aria-label="Your name" .value=${this.who} @input=${(e: Event) => (this.who = (e.target as HTMLInputElement).value)} /></label>
      </div>
      <textarea
        aria-label=${`Text of the note on cell ${this.cellId}`}
        .value=${this.text}
        @input=${(e: Event) => (this.text = (e.target as HTMLTextAreaElement).value)}
        @keydown=${(e: KeyboardEvent) => {
          // Keys typed into the note are the note's (Shift+Enter is a line break here, not "run from"); Ctrl+S still saves.
          if (!((e.ctrlKey || e.metaKey) && e.key.toLowerCase() === "s")) e.stopPropagation();
          if (e.key === "Enter" && (e.ctrlKey || e.metaKey)) this.#add();
          if (e.key === "Escape") send(this, { action: "cancel" });
        }}
      ></textarea>
      <div class="line">
        <button class="primary" @click=${() => this.#add()} ?disabled=${this.text.trim() === "" && this.kind !== "accepted"}>Add the note</button>
        <button @click=${() => send(this, { action: "cancel" })}>Cancel</button>
        <span class="hint" style="color:var(--cb-muted);font-size:0.78rem">Ctrl+Enter adds; saved with the document as plain text</span>
      </div>`;
  }
}

export class CbNote extends LitElement {
  static override properties = {
    on: { type: String },
    status: { type: String },
    entries: { attribute: false },
    who: { type: String },
    replying: { state: true },
    text: { state: true },
    kind: { state: true },
  };
  declare on: string;
  declare status: ReviewStatus;
  declare entries: ReviewEntry[];
  declare who: string;
  declare replying: boolean;
  declare text: string;
  declare kind: ReviewEntryKind;

  static override styles = [
    tokens,
    controls,
    shared,
    css`
      .card {
        border: 1px solid #e2c98c;
        border-left: 5px solid #b7791f;
        background: #fffaf0;
        border-radius: 0 6px 6px 0;
        padding: 0.35rem 0.7rem;
      }
      .card.resolved {
        border-color: #cfe3d6;
        border-left-color: #17603a;
        background: #f5faf6;
      }
      .status {
        font-weight: 700;
        text-transform: uppercase;
        font-size: 0.72rem;
        letter-spacing: 0.05em;
      }
      .entry {
        margin: 0.3rem 0;
        white-space: pre-wrap;
      }
      .who {
        color: var(--cb-muted);
      }
    `,
  ];

  constructor() {
    super();
    this.on = "";
    this.status = "open";
    this.entries = [];
    this.who = "";
    this.replying = false;
    this.text = "";
    this.kind = "answer";
  }

  #reply(): void {
    if (this.text.trim() === "") return;
    remember(this.who);
    send(this, { action: "reply", kind: this.kind, who: this.who.trim(), text: this.text.trim() });
    this.text = "";
    this.replying = false;
  }

  override render() {
    const word = (k: ReviewEntryKind) => REVIEW_ENTRY_KINDS.find((x) => x.kind === k)!.word;
    return html`<div class="card ${this.status}" role="group" aria-label=${`Review note on cell ${this.on}, ${this.status}`}>
      <div class="line">
        <span class="status">${this.status}</span> review note on cell <code>${this.on}</code>
        <span style="flex:1"></span>
        <button @click=${() => this.dispatchEvent(new CustomEvent("cb-note-goto", { detail: { id: this.on }, bubbles: true, composed: true }))} aria-label=${`Go to cell ${this.on}`}>go to the cell</button>
        ${this.status === "open"
          ? html`<button @click=${() => send(this, { action: "status", status: "resolved" })}>Resolve</button>`
          : html`<button @click=${() => send(this, { action: "status", status: "open" })}>Reopen</button>`}
        <button @click=${() => (this.replying = !this.replying)} aria-expanded=${this.replying ? "true" : "false"}>Answer</button>
      </div>
      ${this.entries.map((e) => html`<div class="entry"><strong>${word(e.kind)}</strong>${e.who ? html` <span class="who">from ${e.who}</span>` : nothing}: ${e.text}</div>`)}
      ${this.replying
        ? html`<div class="line">
              <label>kind <select aria-label="Kind of entry" .value=${this.kind} @change=${(e: Event) => (this.kind = (e.target as HTMLSelectElement).value as ReviewEntryKind)}>
                ${REVIEW_ENTRY_KINDS.map((k) => html`<option value=${k.kind} ?selected=${k.kind === this.kind}>${k.word.toLowerCase()}</option>`)}
              </select></label>
              <label>from <input type="text" aria-label="Your name" .value=${this.who} @input=${(e: Event) => (this.who = (e.target as HTMLInputElement).value)} /></label>
            </div>
            <textarea
              aria-label=${`Answer to the note on cell ${this.on}`}
              .value=${this.text}
              @input=${(e: Event) => (this.text = (e.target as HTMLTextAreaElement).value)}
              @keydown=${(e: KeyboardEvent) => {
                if (!((e.ctrlKey || e.metaKey) && e.key.toLowerCase() === "s")) e.stopPropagation();
                if (e.key === "Enter" && (e.ctrlKey || e.metaKey)) this.#reply();
              }}
            ></textarea>
            <div class="line"><button class="primary" @click=${() => this.#reply()} ?disabled=${this.text.trim() === ""}>Add the answer</button></div>`
        : nothing}
    </div>`;
  }
}

customElements.define("cb-note-form", CbNoteForm);
customElements.define("cb-note", CbNote);
