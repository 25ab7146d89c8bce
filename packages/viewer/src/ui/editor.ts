/**
 * <cb-editor>: one CodeMirror 6 editor in a shadow root (created with `root: this.shadowRoot` once the editor
 * comes within about two screens of the viewport, or when it is focused or clicked; until then its text is
 * shown as plain preformatted text, so opening a long document does not build every editor at once;
 * destroyed on disconnect). It holds no history of its own: every change is reported as a `cb-edit` event with
 * the new text, which the page turns into a transaction; undo and redo are the page's (across cells). When the
 * `value` property changes from outside (undo, reload) the editor takes the new text without reporting it back.
 * Keys the page handles (run, save, undo, move...) are reported as `cb-key` events.
 */
import { LitElement, css, html, nothing, type PropertyValues } from "lit";
import { autocompletion, closeBrackets, closeBracketsKeymap, completionKeymap, type CompletionContext, type CompletionResult } from "@codemirror/autocomplete";
import { defaultKeymap, indentWithTab } from "@codemirror/commands";
import { javascript, typescriptLanguage } from "@codemirror/lang-javascript";
import { markdown } from "@codemirror/lang-markdown";
import { yaml } from "@codemirror/lang-yaml";
import { bracketMatching, defaultHighlightStyle, indentOnInput, syntaxHighlighting } from "@codemirror/language";
import { lintGutter, setDiagnostics, type Diagnostic } from "@codemirror/lint";
import { Annotation, Compartment, EditorState, Prec, type Extension } from "@codemirror/state";
import { EditorView, drawSelection, highlightActiveLine, keymap, lineNumbers, placeholder } from "@codemirror/view";
import type { ApiEntry } from "../model/api-catalogue.js";

/** The commands an editor passes up to the page, by key. */
export const EDITOR_KEYS: Readonly<Record<string, string>> = {
  "Mod-Enter": "run-cell",
  "Shift-Enter": "run-from",
  "Mod-Shift-Enter": "run-all",
  "Mod-.": "stop",
  "Mod-s": "save",
  "Mod-z": "undo",
  "Mod-Shift-z": "redo",
  "Mod-y": "redo",
  Escape: "leave-editor",
  "Alt-Shift-ArrowUp": "move-up",
  "Alt-Shift-ArrowDown": "move-down",
  "Alt-Shift-n": "add-below",
  "Alt-Shift-Delete": "delete-cell",
  "Alt-Shift-k": "next-kind",
};

/** A problem to mark in the editor: 1-based line (and column) of the editor's own text. */
export interface EditorMark {
  line: number;
  column?: number;
  message: string;
  severity: "error" | "warning";
}

const external = Annotation.define<boolean>();

/** Completion of the cell API (aq, charts, show, control) and of model ids inside strings. */
export function apiCompletionSource(entries: readonly ApiEntry[]) {
  const top = entries.filter((e) => !e.name.includes(".") && e.kind !== "model");
  const models = entries.filter((e) => e.kind === "model");
  return (ctx: CompletionContext): CompletionResult | null => {
    const member = ctx.matchBefore(/\b(?:aq|charts|show)\.[\w$]*$/);
    if (member) {
      const dot = member.text.indexOf(".");
      const ns = member.text.slice(0, dot + 1);
      return {
        from: member.from + dot + 1,
        options: entries
          .filter((e) => e.name.startsWith(ns) && !e.name.slice(ns.length).includes("."))
          .map((e) => ({ label: e.name.slice(ns.length), detail: e.signature.slice(e.name.length), info: e.doc, type: "function" })),
        validFor: /^[\w$]*$/,
      };
    }
    const quoted = ctx.matchBefore(/["'][a-z0-9-]*$/);
    if (quoted && /model\s*:\s*["'][a-z0-9-]*$|\(\s*["'][a-z0-9-]*$/.test(ctx.state.sliceDoc(Math.max(0, quoted.from - 40), ctx.pos))) {
      return { from: quoted.from + 1, options: models.map((e) => ({ label: e.name, detail: "model", info: e.doc, type: "enum" })), validFor: /^[a-z0-9-]*$/ };
    }
    const word = ctx.matchBefore(/[\w$]+$/);
    if (!word && !ctx.explicit) return null;
    return { from: word ? word.from : ctx.pos, options: top.map((e) => ({ label: e.name, detail: e.signature.slice(e.name.length), info: e.doc, type: e.kind === "namespace" ? "namespace" : "function" })), validFor: /^[\w$]*$/ };
  };
}

function languageFor(language: string, entries: readonly ApiEntry[]): Extension {
  switch (language) {
    case "ts":
      return [javascript({ typescript: true }), typescriptLanguage.data.of({ autocomplete: apiCompletionSource(entries) })];
    case "markdown":
      return markdown();
    case "yaml":
      return yaml();
    case "json":
      return javascript();
    default:
      return [];
  }
}

export class CbEditor extends LitElement {
  static override properties = {
    value: { type: String },
    language: { type: String },
    label: { type: String },
    marks: { attribute: false },
    completions: { attribute: false },
    hint: { type: String },
  };
  declare value: string;
  declare language: string;
  declare label: string;
  declare marks: readonly EditorMark[];
  declare completions: readonly ApiEntry[];
  declare hint: string;

  #view: EditorView | undefined;
  #languageSlot = new Compartment();

  static override styles = css`
    :host {
      display: block;
      border: 1px solid var(--cb-rule);
      border-radius: 4px;
      background: var(--cb-sheet);
    }
    :host(:focus-within) {
      border-color: var(--cb-action);
    }
    .cm-editor {
      font-size: 13px;
      max-height: 36rem;
    }
    .cm-editor.cm-focused {
      outline: none;
    }
    .cm-scroller {
      font-family: var(--cb-mono);
      line-height: 1.45;
    }
    .fallback {
      margin: 0;
      padding: 4px 6px 4px 34px;
      font-family: var(--cb-mono);
      font-size: 13px;
      line-height: 1.45;
      white-space: pre-wrap;
      overflow-wrap: anywhere;
      max-height: 36rem;
      overflow: hidden;
    }
    .cm-gutters {
      background: #f2f0ea;
      color: #7b8589;
      border-right: 1px solid var(--cb-rule);
    }
  `;

  constructor() {
    super();
    this.value = "";
    this.language = "plain";
    this.label = "cell text";
    this.marks = [];
    this.completions = [];
    this.hint = "";
  }

  /** The editor's current text. */
  get text(): string {
    return this.#view?.state.doc.toString() ?? this.value;
  }

  override focus(): void {
    this.#create();
    this.#view?.focus();
  }

  /** Places the cursor at a 1-based line and column and focuses the editor. */
  reveal(line: number, column = 1): void {
    this.#create();
    const view = this.#view;
    if (!view) return;
    const l = view.state.doc.line(Math.min(Math.max(1, line), view.state.doc.lines));
    const pos = Math.min(l.to, l.from + Math.max(0, column - 1));
    view.dispatch({ selection: { anchor: pos }, scrollIntoView: true });
    view.focus();
  }

  #observer: IntersectionObserver | undefined;

  override firstUpdated(): void {
    this.#observer = new IntersectionObserver((entries) => entries.some((e) => e.isIntersecting) && this.#create(), { rootMargin: "1200px 0px" });
    this.#observer.observe(this);
  }

  /** Builds the CodeMirror view (once). */
  #create(): void {
    if (this.#view || !this.isConnected) return;
    this.#observer?.disconnect();
    const pageKeys = Prec.highest(
      keymap.of(
        Object.entries(EDITOR_KEYS).map(([key, command]) => ({
          key,
          run: () => {
            this.dispatchEvent(new CustomEvent("cb-key", { detail: { command }, bubbles: true, composed: true }));
            return true;
          },
        })),
      ),
    );
    const state = EditorState.create({
      doc: this.value,
      extensions: [
        pageKeys,
        lineNumbers(),
        drawSelection(),
        highlightActiveLine(),
        indentOnInput(),
        bracketMatching(),
        closeBrackets(),
        autocompletion({ icons: false }),
        syntaxHighlighting(defaultHighlightStyle, { fallback: true }),
        lintGutter(),
        keymap.of([...closeBracketsKeymap, ...completionKeymap, ...defaultKeymap, indentWithTab]),
        EditorView.lineWrapping,
        EditorView.contentAttributes.of({ "aria-label": this.label, "aria-multiline": "true" }),
        placeholder(this.hint),
        this.#languageSlot.of(languageFor(this.language, this.completions)),
        EditorView.updateListener.of((update) => {
          if (!update.docChanged || update.transactions.some((t) => t.annotation(external))) return;
          this.dispatchEvent(new CustomEvent("cb-edit", { detail: { text: update.state.doc.toString() }, bubbles: true, composed: true }));
        }),
      ],
    });
    const host = this.renderRoot.querySelector<HTMLElement>(".host")!;
    this.#view = new EditorView({ state, parent: host, root: this.renderRoot as ShadowRoot });
    this.requestUpdate();
    this.#applyMarks();
  }

  override updated(changed: PropertyValues<this>): void {
    const view = this.#view;
    if (!view) return;
    if (changed.has("value") && this.value !== view.state.doc.toString()) {
      view.dispatch({ changes: { from: 0, to: view.state.doc.length, insert: this.value }, annotations: external.of(true) });
    }
    if (changed.has("language") || changed.has("completions")) {
      view.dispatch({ effects: this.#languageSlot.reconfigure(languageFor(this.language, this.completions)) });
    }
    if (changed.has("marks") || changed.has("value")) this.#applyMarks();
  }

  #applyMarks(): void {
    const view = this.#view;
    if (!view) return;
    const doc = view.state.doc;
    const diagnostics: Diagnostic[] = this.marks.map((m) => {
      const line = doc.line(Math.min(Math.max(1, m.line), doc.lines));
      const from = m.column === undefined ? line.from : Math.min(line.to, line.from + Math.max(0, m.column - 1));
      return { from, to: m.column === undefined ? line.to : Math.min(line.to, from + 1), severity: m.severity, message: m.message };
    });
    view.dispatch(setDiagnostics(view.state, diagnostics));
  }

  override disconnectedCallback(): void {
    super.disconnectedCallback();
    this.#observer?.disconnect();
    this.#view?.destroy();
    this.#view = undefined;
  }

  override connectedCallback(): void {
    super.connectedCallback();
    // Reconnected after a move in the list: the editor is made anew.
    if (this.hasUpdated && !this.#view) {
      this.requestUpdate();
      this.firstUpdated();
    }
  }

  override render() {
    return html`<div class="host"></div>${this.#view
        ? nothing
        : html`<pre class="fallback" tabindex="0" aria-label=${this.label} @focus=${() => this.focus()} @pointerdown=${() => this.focus()}>${this.value || this.hint}</pre>`}`;
  }
}

customElements.define("cb-editor", CbEditor);
