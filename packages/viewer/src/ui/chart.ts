/**
 * <cb-chart>: a chart output drawn with vega-embed from the very specification the CLI's report draws, locked
 * down for specs that come from a document (untrusted): parsed to an AST and evaluated by vega-interpreter (no
 * eval), a loader that loads nothing (`sanitize` yields an empty href, so no link, image or data URL can be
 * followed), `usermeta` removed (vega-embed would merge it over these options), no action menu, the view never
 * exposed on window. Large inline datasets are thinned for drawing only (model/thin.ts). Colours: Okabe-Ito.
 */
import { LitElement, css, html, nothing, type PropertyValues } from "lit";
import embed, { type Result } from "vega-embed";
import { expressionInterpreter } from "vega-interpreter";
import { loader as vegaLoader } from "vega";
import { thinSpec, type ThinNote } from "../model/thin.js";
import { CHART_PALETTE } from "./theme.js";

/** A loader that refuses everything and records what was asked for. */
export function refusingLoader(refused: string[]) {
  const l = vegaLoader();
  l.load = async (uri: string) => {
    refused.push(uri);
    throw new Error(`refused to load ${uri}: charts in Conebook draw inline data only`);
  };
  l.sanitize = async (uri: string) => {
    refused.push(uri);
    return { href: "" };
  };
  l.http = async (uri: string) => {
    refused.push(uri);
    throw new Error(`refused to load ${uri}`);
  };
  l.file = async (uri: string) => {
    refused.push(uri);
    throw new Error(`refused to load ${uri}`);
  };
  return l;
}

/**
 * Removes what a document may not pass to the chart library: `usermeta` anywhere in the spec tree, and the
 * `href` channel of every encoding (a chart in the page links nowhere; even an emptied link would reload the
 * page and drop unsaved edits). Inline data values are left as they are.
 */
export function lockedSpec(spec: Record<string, unknown>): Record<string, unknown> {
  const strip = (node: unknown, parent: string): unknown => {
    if (Array.isArray(node)) return node.map((x) => strip(x, parent));
    if (node === null || typeof node !== "object") return node;
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(node as Record<string, unknown>)) {
      if (k === "usermeta" || (k === "href" && parent === "encoding")) continue;
      out[k] = k === "values" ? v : strip(v, k);
    }
    return out;
  };
  return strip(spec, "") as Record<string, unknown>;
}

const CONFIG = {
  range: { category: [...CHART_PALETTE] },
  font: "system-ui, DejaVu Sans, sans-serif",
  axis: { labelColor: "#1c2a30", titleColor: "#1c2a30", gridColor: "#e4e0d5" },
  view: { stroke: "#d9d4c7" },
};

export class CbChart extends LitElement {
  static override properties = {
    spec: { attribute: false },
    label: { type: String },
    problem: { state: true },
    notes: { state: true },
  };
  declare spec: Record<string, unknown> | undefined;
  declare label: string;
  declare problem: string | undefined;
  declare notes: ThinNote[];
  #result: Result | undefined;
  #drawn = 0;
  /** The spec last drawn, as JSON: a rerun that yields the same chart does not redraw it. */
  #drawnKey = "";
  #visible = false;
  #observer: IntersectionObserver | undefined;
  /** What the loader was asked for (always refused); for tests and the console. */
  refused: string[] = [];

  static override styles = css`
    :host {
      display: block;
      overflow-x: auto;
      margin: 0.4rem 0;
    }
    .problem {
      color: var(--cb-error);
      font-size: 0.9rem;
    }
    .note {
      color: var(--cb-muted);
      font-size: 0.8rem;
    }
  `;

  constructor() {
    super();
    // No link inside a chart is ever followed (see lockedSpec).
    this.addEventListener("click", (e) => {
      if (e.composedPath().some((n) => n instanceof Element && n.tagName.toLowerCase() === "a")) e.preventDefault();
    }, { capture: true });
    this.spec = undefined;
    this.label = "chart";
    this.problem = undefined;
    this.notes = [];
  }

  override updated(changed: PropertyValues<this>): void {
    if (changed.has("spec") && this.#visible) void this.#draw();
  }

  override firstUpdated(): void {
    // Charts are drawn when they come near the screen (and redrawn only when their spec changed), so opening
    // or rerunning a long document does not draw every chart at once on the main thread.
    this.#observer = new IntersectionObserver(
      (entries) => {
        this.#visible = entries.some((e) => e.isIntersecting);
        if (this.#visible) void this.#draw();
      },
      { rootMargin: "600px 0px" },
    );
    this.#observer.observe(this);
  }

  async #draw(): Promise<void> {
    const target = this.renderRoot.querySelector<HTMLElement>(".chart");
    if (!target || !this.spec) return;
    const { spec, notes } = thinSpec(lockedSpec(this.spec));
    const key = JSON.stringify(spec);
    if (key === this.#drawnKey && this.#result) return;
    const ticket = ++this.#drawn;
    this.#result?.finalize();
    this.#result = undefined;
    this.#drawnKey = key;
    try {
      const result = await embed(target, spec as never, {
        renderer: "svg",
        actions: false,
        ast: true,
        expr: expressionInterpreter,
        loader: refusingLoader(this.refused),
        config: CONFIG as never,
        defaultStyle: false,
        tooltip: false,
        logLevel: 0,
        i18n: undefined,
      } as never);
      if (ticket !== this.#drawn) {
        result.finalize();
        return;
      }
      this.#result = result;
      this.problem = undefined;
      this.notes = notes;
      target.querySelector("svg")?.setAttribute("role", "img");
      target.querySelector("svg")?.setAttribute("aria-label", this.label);
      this.dispatchEvent(new CustomEvent("cb-chart-drawn", { bubbles: true, composed: true }));
    } catch (e) {
      if (ticket !== this.#drawn) return;
      this.#drawnKey = "";
      this.problem = e instanceof Error ? e.message : String(e);
    }
  }

  override disconnectedCallback(): void {
    super.disconnectedCallback();
    this.#observer?.disconnect();
    this.#result?.finalize();
    this.#result = undefined;
    this.#drawnKey = "";
  }

  override connectedCallback(): void {
    super.connectedCallback();
    if (this.hasUpdated) this.#observer?.observe(this);
  }

  override render() {
    return html`<div class="chart"></div>
      ${this.problem ? html`<p class="problem" role="alert">The chart could not be drawn: ${this.problem}</p>` : nothing}
      ${this.notes.map((n) => html`<p class="note">${n.name}: ${n.drawn} of ${n.rows} rows drawn (thinned for display only; every row is kept and computed with)</p>`)}`;
  }
}

customElements.define("cb-chart", CbChart);
