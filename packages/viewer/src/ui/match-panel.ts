/**
 * <cb-match>: matching a model curve to an observation record by hand, and marking data windows. The analyst
 * moves the curve of any registered model over the record on log-log axes (dragging it, or with the arrow keys,
 * which change the parameters as a type-curve match does) or sets each parameter with a log-scaled slider or a
 * typed value with its unit; the curve, the residual strip and the error figures follow at once (computed by the
 * aquifer library in the page, model/match.ts). Beside it: the equivalent match point, "Refine" (least squares
 * from the matched values, with estimates, 95 % intervals and correlations) and "Keep" (a code cell for the
 * document). On the log-log, semilog and derivative charts readings are selected by brushing a time range or by
 * clicking one (or with the keyboard) and left out with a reason; left-out readings are drawn hollow, their
 * reason on hover. Everything kept leaves as an event the workbench turns into a transaction.
 */
import { LitElement, css, html, nothing, svg, type PropertyValues } from "lit";
import { guard } from "lit/directives/guard.js";
import { convert, describeModel, modelIds, type DrawdownModel, type FitResult } from "@conebook/aquifer";
import {
  curveAt,
  curveDerivative,
  dataDerivative,
  errorFigures,
  keptValues,
  logTimes,
  matchPointOf,
  modelOf,
  refine,
  shiftParameters,
  startingPosition,
  type ModelChoice,
  type ObservationRecord,
} from "../model/match.js";
import { COMMON_REASONS, emptyWindows, windowEnd, windowMask, windowReasons, withWindow, withoutWindow, type WindowSet, type WindowsReading } from "../model/windows.js";
import { formatNumber } from "./format.js";
import { Axis, axesOf, extent, linePath, type Frame } from "./plot.js";
import { CHART_PALETTE, controls, tokens } from "./theme.js";

/** What "Keep" asks the workbench to write. */
export interface KeepRequest {
  record: ObservationRecord;
  choice: ModelChoice;
  values: Float64Array;
  refined: boolean;
}

type Chart = "loglog" | "semilog" | "derivative";

const TIME_UNITS = ["s", "min", "h", "d"] as const;
const LOGLOG: Frame = { width: 560, height: 330, left: 58, right: 14, top: 12, bottom: 38 };
const STRIP: Frame = { width: 560, height: 120, left: 58, right: 14, top: 8, bottom: 34 };
const SMALL: Frame = { width: 400, height: 250, left: 58, right: 12, top: 12, bottom: 38 };
const DATA_COLOUR = CHART_PALETTE[0];
const CURVE_COLOUR = CHART_PALETTE[3];
const SELECT_COLOUR = CHART_PALETTE[1];
/** Log decades per arrow key press (times 10 with Shift). */
const KEY_STEP = 0.01;

export class CbMatch extends LitElement {
  static override properties = {
    records: { attribute: false },
    recordsProblem: { attribute: false },
    windows: { attribute: false },
    recordIndex: { state: true },
    choice: { state: true },
    optionText: { state: true },
    values: { state: true },
    refined: { state: true },
    refineProblem: { state: true },
    timeUnit: { state: true },
    tool: { state: true },
    selection: { state: true },
    brush: { state: true },
    reason: { state: true },
    typed: { state: true },
  };
  declare records: ObservationRecord[] | undefined;
  declare recordsProblem: string | undefined;
  declare windows: WindowsReading;
  declare recordIndex: number;
  declare choice: ModelChoice;
  /** Geometry options as typed, by name. */
  declare optionText: Record<string, string>;
  declare values: Float64Array | undefined;
  declare refined: { fit: FitResult; from: Float64Array } | undefined;
  declare refineProblem: string | undefined;
  declare timeUnit: string;
  declare tool: "move" | "select";
  /** Selected readings: a time range in d, both ends included. */
  declare selection: { from: number; to: number } | undefined;
  declare brush: { chart: Chart; x0: number; x1: number } | undefined;
  declare reason: string;
  /** Text typed into a parameter's field that does not read (shown with the problem), by parameter index. */
  declare typed: Record<number, { text: string; problem: string }>;

  /** Milliseconds from each input (drag step, key, slider) to the redrawn curve and figures, newest last (for the bench). */
  latencies: number[] = [];
  #inputAt: number | undefined;
  #drag: { chart: Chart; x: number; y: number; start: number; mode: "move" | "brush" } | undefined;
  #cursor = 0;
  #anchor: number | undefined;
  #derivativeCache: { key: string; value: { t: Float64Array; ds: Float64Array } } | undefined;

  static override styles = [
    tokens,
    controls,
    css`
      :host {
        display: block;
        background: var(--cb-sheet);
        border: 2px solid var(--cb-action);
        border-radius: 8px;
        padding: 0.6rem 0.9rem 0.9rem;
        margin-bottom: 1rem;
        scroll-margin-top: 3.2rem;
      }
      h2 {
        font-size: 1.05rem;
        margin: 0;
      }
      h3 {
        font-size: 0.9rem;
        margin: 0.7rem 0 0.3rem;
      }
      .head {
        display: flex;
        flex-wrap: wrap;
        gap: 0.6rem;
        align-items: center;
      }
      .head .grow {
        flex: 1;
      }
      label {
        font-size: 0.85rem;
      }
      .grid {
        display: grid;
        grid-template-columns: 560px minmax(18rem, 1fr);
        gap: 1rem;
        margin-top: 0.5rem;
      }
      .charts-row {
        display: flex;
        gap: 1rem;
        flex-wrap: wrap;
        margin-top: 0.4rem;
      }
      .plot {
        position: relative;
        outline: none;
        touch-action: none;
        user-select: none;
      }
      .plot:focus-visible {
        outline: 3px solid var(--cb-focus);
      }
      .plot svg {
        display: block;
      }
      .plot .caption {
        font-size: 0.78rem;
        color: var(--cb-muted);
      }
      svg text.tick {
        font-size: 11px;
        fill: #1c2a30;
      }
      svg text.title {
        font-size: 12px;
        fill: #1c2a30;
      }
      .loglog.move svg {
        cursor: grab;
      }
      .loglog.move.dragging svg {
        cursor: grabbing;
      }
      .select svg,
      .semilog svg,
      .derivative svg {
        cursor: crosshair;
      }
      .param {
        display: grid;
        grid-template-columns: 7.5rem 1fr 7rem 3.5rem;
        gap: 0.4rem;
        align-items: center;
        font-size: 0.85rem;
        margin: 0.2rem 0;
      }
      .param input[type="range"] {
        width: 100%;
      }
      .param input[type="text"],
      .opts input,
      .window-form input {
        font: inherit;
        font-size: 0.85rem;
        width: 100%;
        box-sizing: border-box;
        padding: 0.1rem 0.3rem;
        border: 1px solid var(--cb-rule);
        border-radius: 3px;
      }
      .param .bad {
        grid-column: 1 / -1;
        color: var(--cb-error);
        font-size: 0.78rem;
      }
      .unit {
        color: var(--cb-muted);
      }
      .figures {
        font-size: 0.88rem;
        background: #f3f1eb;
        padding: 0.35rem 0.55rem;
        border-radius: 4px;
        margin: 0.4rem 0;
      }
      .figures strong {
        font-variant-numeric: tabular-nums;
      }
      .matchpoint {
        font-size: 0.8rem;
        color: var(--cb-ink);
        border-left: 3px solid var(--cb-rule);
        padding-left: 0.5rem;
      }
      .actions {
        display: flex;
        gap: 0.4rem;
        flex-wrap: wrap;
        margin: 0.5rem 0;
      }
      table {
        border-collapse: collapse;
        font-size: 0.8rem;
        font-variant-numeric: tabular-nums;
      }
      th,
      td {
        padding: 0.1rem 0.45rem;
        border-bottom: 1px solid #ece8de;
        text-align: right;
        white-space: nowrap;
      }
      th:first-child,
      td:first-child {
        text-align: left;
      }
      .problem {
        color: var(--cb-error);
        font-size: 0.85rem;
      }
      .note {
        font-size: 0.78rem;
        color: var(--cb-muted);
      }
      .window-form {
        display: flex;
        flex-wrap: wrap;
        gap: 0.4rem;
        align-items: end;
        font-size: 0.85rem;
      }
      .window-form label {
        display: flex;
        flex-direction: column;
        gap: 0.1rem;
      }
      .window-form input {
        width: 8rem;
      }
      .window-form input.reason {
        width: 12rem;
      }
      ul.windows {
        padding-left: 1.1rem;
        margin: 0.3rem 0;
        font-size: 0.85rem;
      }
      .opts {
        display: flex;
        flex-wrap: wrap;
        gap: 0.4rem;
        font-size: 0.8rem;
      }
      .opts label {
        display: flex;
        flex-direction: column;
      }
      .opts input {
        width: 7rem;
      }
      @media (max-width: 72rem) {
        .grid {
          grid-template-columns: minmax(0, 1fr);
        }
      }
    `,
  ];

  constructor() {
    super();
    this.records = undefined;
    this.recordsProblem = undefined;
    this.windows = { set: emptyWindows(), cell: undefined };
    this.recordIndex = 0;
    this.choice = { id: "theis", options: {} };
    this.optionText = {};
    this.values = undefined;
    this.refined = undefined;
    this.refineProblem = undefined;
    this.timeUnit = "min";
    this.tool = "move";
    this.selection = undefined;
    this.brush = undefined;
    this.reason = "";
    this.typed = {};
  }

  get record(): ObservationRecord | undefined {
    return this.records?.[this.recordIndex];
  }

  get #set(): WindowSet | undefined {
    return "set" in this.windows ? this.windows.set : undefined;
  }

  get #model(): DrawdownModel | undefined {
    const m = modelOf(this.choice);
    return "model" in m ? m.model : undefined;
  }

  override willUpdate(changed: PropertyValues<this>): void {
    if ((changed.has("records") || changed.has("recordIndex") || changed.has("choice")) && this.values === undefined) this.#reset();
  }

  override updated(): void {
    if (this.#inputAt !== undefined) {
      const at = this.#inputAt;
      this.#inputAt = undefined;
      this.latencies.push(performance.now() - at);
      if (this.latencies.length > 500) this.latencies.splice(0, this.latencies.length - 500);
      this.dispatchEvent(new CustomEvent("cb-match-drawn", { bubbles: true, composed: true }));
    }
  }

  /** Starting values for the current model and record. */
  #reset(): void {
    const model = this.#model;
    const record = this.record;
    this.refined = undefined;
    this.refineProblem = undefined;
    this.typed = {};
    this.values = model && record ? startingPosition(model, record).values : undefined;
  }

  #setValues(next: Float64Array, at = performance.now()): void {
    this.#inputAt = at;
    this.values = next;
    if (this.refined) this.refined = undefined;
  }

  /** Moves the curve by decades in time and drawdown (a drag step or an arrow key). */
  shift(dLogT: number, dLogS: number): void {
    const model = this.#model;
    if (!model || !this.values) return;
    this.#setValues(shiftParameters(model, this.values, dLogT, dLogS));
  }

  #selectModel(id: string): void {
    const options: Record<string, number> = {};
    for (const o of describeModel(id).options) {
      const text = this.optionText[o.name];
      const v = Number(text);
      if (text !== undefined && text.trim() !== "" && Number.isFinite(v)) options[o.name] = v;
    }
    this.choice = { id, options };
    this.values = undefined;
    this.#reset();
  }

  #setOption(name: string, text: string): void {
    this.optionText = { ...this.optionText, [name]: text };
    const options = { ...this.choice.options };
    const v = Number(text);
    if (text.trim() !== "" && Number.isFinite(v)) options[name] = v;
    else delete options[name];
    this.choice = { ...this.choice, options };
    this.values = undefined;
    this.#reset();
  }

  // ---- what is drawn ------------------------------------------------------------------------------------------

  get #perDay(): number {
    return convert(1, "d", this.timeUnit);
  }

  #used(record: ObservationRecord): boolean[] {
    return windowMask(this.#set, record.name, record.t);
  }

  #timeAxis(record: ObservationRecord, frame: Frame): Axis {
    const f = this.#perDay;
    return new Axis("log", extent(Array.from(record.t, (t) => t * f), "log", 0.04), [frame.left, frame.width - frame.right]);
  }

  #selected(t: number): boolean {
    return this.selection !== undefined && t >= this.selection.from && t <= this.selection.to;
  }

  #points(record: ObservationRecord, x: Axis, y: Axis, ys: ArrayLike<number>, used: boolean[], reasons: string[], ts: ArrayLike<number> = record.t, indexOf?: (k: number) => number) {
    const f = this.#perDay;
    return svg`${Array.from({ length: ts.length }, (_, k) => {
      const i = indexOf ? indexOf(k) : k;
      const px = x.px(ts[k]! * f);
      const py = y.px(ys[k]!);
      if (!Number.isFinite(px) || !Number.isFinite(py)) return null;
      const out = !used[i];
      const sel = this.#selected(record.t[i]!);
      const label = `${formatNumber(record.t[i]! * f)} ${this.timeUnit}, ${formatNumber(record.s[i]!)} m${out ? `: left out (${reasons[i]})` : ""}`;
      return svg`<circle cx=${px.toFixed(1)} cy=${py.toFixed(1)} r=${sel ? 4.6 : 3.4} fill=${out ? "#ffffff" : DATA_COLOUR} stroke=${sel ? SELECT_COLOUR : DATA_COLOUR} stroke-width=${sel ? 2.4 : 1.3} class=${out ? "left-out" : "used"}><title>${label}</title></circle>`;
    })}`;
  }

  #brushRect(chart: Chart, frame: Frame) {
    const b = this.brush;
    if (!b || b.chart !== chart) return nothing;
    const x0 = Math.min(b.x0, b.x1);
    return svg`<rect x=${x0} y=${frame.top} width=${Math.abs(b.x1 - b.x0)} height=${frame.height - frame.top - frame.bottom} fill=${SELECT_COLOUR} fill-opacity="0.18" stroke=${SELECT_COLOUR}></rect>`;
  }

  #cursorMark(x: Axis, frame: Frame, chart: Chart) {
    const record = this.record;
    if (!record || this.#focusChart !== chart || this.tool !== "select" && chart === "loglog") return nothing;
    const t = record.t[this.#cursor];
    if (t === undefined) return nothing;
    const px = x.px(t * this.#perDay);
    return svg`<line x1=${px} x2=${px} y1=${frame.top} y2=${frame.height - frame.bottom} stroke=${SELECT_COLOUR} stroke-dasharray="3 3"></line>`;
  }

  #focusChart: Chart | undefined;

  /**
   * What the readings' marks depend on: the record, the time unit, the windows and the selection. While a drag
   * moves only the curve these stay the same, and `guard` skips redrawing the axes and the readings.
   */
  #marksKey(record: ObservationRecord, used: boolean[]): string {
    return `${record.expression}|${this.timeUnit}|${used.map((u) => (u ? 1 : 0)).join("")}|${this.selection?.from ?? ""}|${this.selection?.to ?? ""}`;
  }

  #plot(chart: Chart, frame: Frame, label: string, body: unknown, x: Axis) {
    const classes = `plot ${chart} ${chart === "loglog" ? this.tool : "select"}${this.#drag?.mode === "move" ? " dragging" : ""}`;
    return html`<div
      class=${classes}
      tabindex="0"
      role="group"
      aria-label=${label}
      @pointerdown=${(e: PointerEvent) => this.#down(e, chart, x)}
      @pointermove=${(e: PointerEvent) => this.#move(e, chart, x)}
      @pointerup=${(e: PointerEvent) => this.#up(e, chart, x)}
      @keydown=${(e: KeyboardEvent) => this.#key(e, chart)}
      @focus=${() => {
        this.#focusChart = chart;
        this.requestUpdate();
      }}
      @blur=${() => {
        this.#focusChart = undefined;
        this.requestUpdate();
      }}
    >
      <svg width=${frame.width} height=${frame.height} viewBox=${`0 0 ${frame.width} ${frame.height}`} role="img" aria-label=${label}>${body}</svg>
    </div>`;
  }

  #logLog(record: ObservationRecord, model: DrawdownModel | undefined, values: Float64Array | undefined, used: boolean[], reasons: string[], grid: Float64Array, curve: Float64Array | undefined) {
    const f = this.#perDay;
    const x = this.#timeAxis(record, LOGLOG);
    const y = new Axis("log", extent(record.s, "log", 0.08), [LOGLOG.height - LOGLOG.bottom, LOGLOG.top]);
    const key = this.#marksKey(record, used);
    const body = svg`${guard([record, this.timeUnit], () => axesOf(LOGLOG, x, y, `time since pumping started (${this.timeUnit})`, "drawdown (m)"))}
      <clipPath id="clip-loglog"><rect x=${LOGLOG.left} y=${LOGLOG.top} width=${LOGLOG.width - LOGLOG.left - LOGLOG.right} height=${LOGLOG.height - LOGLOG.top - LOGLOG.bottom}></rect></clipPath>
      <g clip-path="url(#clip-loglog)">
        ${curve ? svg`<path class="curve" d=${linePath(x, y, Array.from(grid, (t) => t * f), curve)} fill="none" stroke=${CURVE_COLOUR} stroke-width="2.2"></path>` : nothing}
        ${guard([key], () => this.#points(record, x, y, record.s, used, reasons))}
        ${this.#brushRect("loglog", LOGLOG)} ${this.#cursorMark(x, LOGLOG, "loglog")}
      </g>`;
    const what = model && values ? `${model.name} curve` : "no curve";
    return this.#plot(
      "loglog",
      LOGLOG,
      `Log-log chart of ${record.name} with the ${what}. ${this.tool === "move" ? "Drag, or use the arrow keys, to move the curve (Shift for larger steps)" : "Brush a time range or click a reading to select; arrow keys move the cursor, Shift+arrow extends the selection"}`,
      body,
      x,
    );
  }

  #strip(record: ObservationRecord, residuals: Float64Array | undefined, used: boolean[], reasons: string[]) {
    const x = this.#timeAxis(record, STRIP);
    const top = residuals ? Math.max(1e-3, ...Array.from(residuals).filter((r, i) => used[i] && Number.isFinite(r)).map(Math.abs)) * 1.15 : 0.01;
    const y = new Axis("linear", [-top, top], [STRIP.height - STRIP.bottom, STRIP.top]);
    const body = svg`${axesOf(STRIP, x, y, `time (${this.timeUnit})`, "residual (m)")}
      <line x1=${STRIP.left} x2=${STRIP.width - STRIP.right} y1=${y.px(0)} y2=${y.px(0)} stroke="#56656b" stroke-dasharray="4 3"></line>
      ${residuals ? this.#points(record, x, y, residuals, used, reasons) : nothing}`;
    return html`<div class="plot strip" role="img" aria-label=${`Residuals of ${record.name} (observed minus model drawdown)`}>
      <svg width=${STRIP.width} height=${STRIP.height} viewBox=${`0 0 ${STRIP.width} ${STRIP.height}`} aria-hidden="true">${body}</svg>
    </div>`;
  }

  #semilog(record: ObservationRecord, used: boolean[], reasons: string[], grid: Float64Array, curve: Float64Array | undefined) {
    const f = this.#perDay;
    const x = this.#timeAxis(record, SMALL);
    const y = new Axis("linear", extent(record.s, "linear", 0.06), [SMALL.height - SMALL.bottom, SMALL.top]);
    const key = this.#marksKey(record, used);
    const body = svg`${guard([record, this.timeUnit], () => axesOf(SMALL, x, y, `time (${this.timeUnit})`, "drawdown (m)"))}
      <clipPath id="clip-semilog"><rect x=${SMALL.left} y=${SMALL.top} width=${SMALL.width - SMALL.left - SMALL.right} height=${SMALL.height - SMALL.top - SMALL.bottom}></rect></clipPath>
      <g clip-path="url(#clip-semilog)">
        ${curve ? svg`<path d=${linePath(x, y, Array.from(grid, (t) => t * f), curve)} fill="none" stroke=${CURVE_COLOUR} stroke-width="2"></path>` : nothing}
        ${guard([key], () => this.#points(record, x, y, record.s, used, reasons))} ${this.#brushRect("semilog", SMALL)} ${this.#cursorMark(x, SMALL, "semilog")}
      </g>`;
    return this.#plot("semilog", SMALL, `Semilog chart of ${record.name}: brush a time range or click a reading to select it`, body, x);
  }

  #derivative(record: ObservationRecord, used: boolean[], reasons: string[], grid: Float64Array, curve: Float64Array | undefined) {
    const f = this.#perDay;
    const key = `${record.expression}|${used.map((u) => (u ? 1 : 0)).join("")}`;
    if (this.#derivativeCache?.key !== key) this.#derivativeCache = { key, value: dataDerivative(record, used) };
    const d = this.#derivativeCache.value;
    const x = this.#timeAxis(record, SMALL);
    const modelDs = curve ? curveDerivative(grid, curve) : undefined;
    const y = new Axis("log", extent([...d.ds], "log", 0.15), [SMALL.height - SMALL.bottom, SMALL.top]);
    const index = new Map(Array.from(record.t, (t, i) => [t, i]));
    const marks = this.#marksKey(record, used);
    const body = svg`${guard([record, this.timeUnit, d], () => axesOf(SMALL, x, y, `time (${this.timeUnit})`, "ds/d ln t (m)"))}
      <clipPath id="clip-derivative"><rect x=${SMALL.left} y=${SMALL.top} width=${SMALL.width - SMALL.left - SMALL.right} height=${SMALL.height - SMALL.top - SMALL.bottom}></rect></clipPath>
      <g clip-path="url(#clip-derivative)">
        ${modelDs ? svg`<path d=${linePath(x, y, Array.from(grid, (t) => t * f), modelDs)} fill="none" stroke=${CURVE_COLOUR} stroke-width="2"></path>` : nothing}
        ${guard([marks, d], () => this.#points(record, x, y, d.ds, used, reasons, d.t, (k) => index.get(d.t[k]!) ?? 0))}
        ${this.#brushRect("derivative", SMALL)} ${this.#cursorMark(x, SMALL, "derivative")}
      </g>`;
    return this.#plot("derivative", SMALL, `Log derivative of the readings of ${record.name} that are used (Bourdet, 0.2 log cycles) and of the model curve: brush or click to select`, body, x);
  }

  // ---- pointer and keys --------------------------------------------------------------------------------------

  #localX(e: PointerEvent): { x: number; y: number } {
    const svgEl = (e.currentTarget as HTMLElement).querySelector("svg")!;
    const r = svgEl.getBoundingClientRect();
    return { x: e.clientX - r.left, y: e.clientY - r.top };
  }

  #down(e: PointerEvent, chart: Chart, _x: Axis): void {
    if (e.button !== 0) return;
    const p = this.#localX(e);
    (e.currentTarget as HTMLElement).setPointerCapture(e.pointerId);
    const mode = chart === "loglog" && this.tool === "move" ? "move" : "brush";
    this.#drag = { chart, x: p.x, y: p.y, start: p.x, mode };
    if (mode === "brush") this.brush = { chart, x0: p.x, x1: p.x };
    e.preventDefault();
  }

  #move(e: PointerEvent, chart: Chart, x: Axis): void {
    const d = this.#drag;
    if (!d || d.chart !== chart) return;
    const p = this.#localX(e);
    if (d.mode === "move") {
      const record = this.record;
      if (!record) return;
      const y = new Axis("log", extent(record.s, "log", 0.08), [LOGLOG.height - LOGLOG.bottom, LOGLOG.top]);
      const dLogT = (p.x - d.x) / x.perUnit;
      const dLogS = (p.y - d.y) / y.perUnit;
      d.x = p.x;
      d.y = p.y;
      const at = e.timeStamp > 0 && e.timeStamp <= performance.now() ? e.timeStamp : performance.now();
      const model = this.#model;
      if (model && this.values) this.#setValues(shiftParameters(model, this.values, dLogT, dLogS), at);
    } else this.brush = { chart, x0: d.start, x1: p.x };
  }

  #up(e: PointerEvent, chart: Chart, x: Axis): void {
    const d = this.#drag;
    this.#drag = undefined;
    if (!d || d.chart !== chart) return;
    if (d.mode === "move") {
      this.requestUpdate();
      return;
    }
    const p = this.#localX(e);
    this.brush = undefined;
    const record = this.record;
    if (!record) return;
    const f = this.#perDay;
    if (Math.abs(p.x - d.start) < 4) {
      // A click: the reading nearest in time within 8 px.
      let best = -1;
      let dist = 8;
      record.t.forEach((t, i) => {
        const dx = Math.abs(x.px(t * f) - p.x);
        if (dx < dist) {
          dist = dx;
          best = i;
        }
      });
      if (best >= 0) {
        this.#cursor = best;
        this.selection = { from: record.t[best]!, to: record.t[best]! };
      } else this.selection = undefined;
      return;
    }
    const a = x.value(Math.min(d.start, p.x)) / f;
    const b = x.value(Math.max(d.start, p.x)) / f;
    const inside = Array.from(record.t).filter((t) => t >= a && t <= b);
    this.selection = inside.length ? { from: inside[0]!, to: inside[inside.length - 1]! } : undefined;
  }

  #key(e: KeyboardEvent, chart: Chart): void {
    const record = this.record;
    if (!record) return;
    const step = e.shiftKey ? KEY_STEP * 10 : KEY_STEP;
    if (chart === "loglog" && this.tool === "move") {
      const moves: Record<string, [number, number]> = { ArrowLeft: [-step, 0], ArrowRight: [step, 0], ArrowUp: [0, step], ArrowDown: [0, -step] };
      const m = moves[e.key];
      if (!m) return;
      e.preventDefault();
      this.shift(m[0], m[1]);
      return;
    }
    const n = record.t.length;
    if (e.key === "ArrowLeft" || e.key === "ArrowRight") {
      e.preventDefault();
      const next = Math.max(0, Math.min(n - 1, this.#cursor + (e.key === "ArrowRight" ? 1 : -1)));
      if (e.shiftKey) {
        this.#anchor ??= this.#cursor;
        const lo = Math.min(this.#anchor, next);
        const hi = Math.max(this.#anchor, next);
        this.selection = { from: record.t[lo]!, to: record.t[hi]! };
      } else this.#anchor = undefined;
      this.#cursor = next;
      this.requestUpdate();
    } else if (e.key === "Enter" || e.key === " ") {
      e.preventDefault();
      this.#anchor = this.#cursor;
      this.selection = { from: record.t[this.#cursor]!, to: record.t[this.#cursor]! };
    } else if (e.key === "Escape" && this.selection) {
      e.preventDefault();
      e.stopPropagation();
      this.selection = undefined;
      this.#anchor = undefined;
    }
  }

  // ---- windows -----------------------------------------------------------------------------------------------

  #leaveOut(): void {
    const record = this.record;
    const set = this.#set;
    if (!record || !set || !this.selection) return;
    const reason = this.reason.trim();
    if (reason === "") {
      this.renderRoot.querySelector<HTMLInputElement>("input.reason")?.focus();
      return;
    }
    const next = withWindow(set, record.name, { from: windowEnd(set, this.selection.from), to: windowEnd(set, this.selection.to), reason });
    const count = windowMask(next, record.name, record.t).filter((u) => !u).length;
    this.#send("cb-windows-change", { set: next, message: `${record.name}: readings from ${formatNumber(this.selection.from * this.#perDay)} to ${formatNumber(this.selection.to * this.#perDay)} ${this.timeUnit} left out (${reason}); ${count} left out in all` });
    this.selection = undefined;
    this.reason = "";
    this.refined = undefined;
  }

  #putBack(index: number): void {
    const record = this.record;
    const set = this.#set;
    if (!record || !set) return;
    this.#send("cb-windows-change", { set: withoutWindow(set, record.name, index), message: `${record.name}: a data window removed; its readings are used again` });
    this.refined = undefined;
  }

  #typedRange(which: "from" | "to", text: string): void {
    const record = this.record;
    const v = Number(text) / this.#perDay;
    if (!record || !Number.isFinite(v)) return;
    const cur = this.selection ?? { from: v, to: v };
    this.selection = which === "from" ? { from: v, to: Math.max(v, cur.to) } : { from: Math.min(cur.from, v), to: v };
  }

  #send(type: string, detail: unknown): void {
    this.dispatchEvent(new CustomEvent(type, { detail, bubbles: true, composed: true }));
  }

  // ---- parameters --------------------------------------------------------------------------------------------

  #typedValue(i: number, text: string): void {
    const model = this.#model;
    if (!model || !this.values) return;
    const p = model.parameters[i]!;
    const m = /^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*?)\s*$/.exec(text);
    let problem: string | undefined;
    let v = Number.NaN;
    if (!m) problem = `type a number, optionally with a unit (for example 350 or 0.004 m2/s)`;
    else {
      try {
        v = m[2] === "" || m[2] === p.unit ? Number(m[1]) : convert(Number(m[1]), m[2]!, p.unit);
      } catch (e) {
        problem = (e as Error).message;
      }
      if (problem === undefined && !(v >= p.bounds[0] && v <= p.bounds[1])) problem = `${p.name} must lie in ${formatNumber(p.bounds[0])} to ${formatNumber(p.bounds[1])} ${p.unit}`;
    }
    if (problem !== undefined) {
      this.typed = { ...this.typed, [i]: { text, problem } };
      return;
    }
    const { [i]: _gone, ...rest } = this.typed;
    this.typed = rest;
    const next = Float64Array.from(this.values);
    next[i] = v;
    this.#setValues(next);
  }

  #slider(i: number, raw: string): void {
    const model = this.#model;
    if (!model || !this.values) return;
    const p = model.parameters[i]!;
    const next = Float64Array.from(this.values);
    next[i] = p.bounds[0] > 0 ? 10 ** Number(raw) : Number(raw);
    this.#setValues(next);
  }

  #parameters(model: DrawdownModel, values: Float64Array) {
    return html`${model.parameters.map((p, i) => {
      const log = p.bounds[0] > 0;
      const v = values[i]!;
      const typed = this.typed[i];
      return html`<div class="param">
        <label for=${`p-${i}`} title=${p.description}><strong>${p.name}</strong> ${p.label}</label>
        <input
          type="range"
          aria-label=${`${p.name} (${p.label}) on a ${log ? "log" : "linear"} scale`}
          min=${log ? Math.log10(p.bounds[0]) : p.bounds[0]}
          max=${log ? Math.log10(p.bounds[1]) : p.bounds[1]}
          step=${log ? 0.001 : (p.bounds[1] - p.bounds[0]) / 1000}
          .value=${String(log ? Math.log10(v) : v)}
          @input=${(e: Event) => this.#slider(i, (e.target as HTMLInputElement).value)}
        />
        <input
          id=${`p-${i}`}
          type="text"
          aria-label=${`${p.name} value in ${p.unit} (a value in another unit is converted)`}
          .value=${typed ? typed.text : formatNumber(Number(v.toPrecision(4)))}
          @change=${(e: Event) => this.#typedValue(i, (e.target as HTMLInputElement).value)}
        />
        <span class="unit">${p.unit}</span>
        ${typed ? html`<span class="bad" role="alert">${typed.problem}</span>` : nothing}
      </div>`;
    })}`;
  }

  #options() {
    const d = describeModel(this.choice.id);
    if (d.options.length === 0) return nothing;
    return html`<div class="opts" role="group" aria-label="Geometry of the model">
      ${d.options
        .filter((o) => o.required || o.name !== "tolerance")
        .map(
          (o) => html`<label
            >${o.name}${o.required ? " *" : ""} (${o.unit})
            <input
              type="text"
              inputmode="decimal"
              title=${o.description}
              aria-label=${`${o.name} in ${o.unit}${o.required ? ", required" : ""}: ${o.description}`}
              .value=${this.optionText[o.name] ?? ""}
              placeholder=${o.default !== undefined ? String(o.default) : ""}
              @change=${(e: Event) => this.#setOption(o.name, (e.target as HTMLInputElement).value)}
          /></label>`,
        )}
    </div>`;
  }

  #refine(): void {
    const model = this.#model;
    const record = this.record;
    if (!model || !record || !this.values) return;
    const from = keptValues(this.values);
    try {
      const fit = refine(model, record, from, this.#used(record));
      this.refined = { fit, from };
      this.refineProblem = undefined;
      this.values = Float64Array.from(fit.parameters.map((p) => p.estimate));
    } catch (e) {
      this.refineProblem = (e as Error).message;
    }
  }

  #keep(refined: boolean): void {
    const record = this.record;
    if (!record || !this.values) return;
    const values = this.refined ? this.refined.from : keptValues(this.values);
    const request: KeepRequest = { record, choice: this.choice, values, refined };
    this.#send("cb-match-keep", request);
  }

  #refinedTable(fit: FitResult) {
    const free = fit.freeParameters;
    return html`<h3>Refined by least squares, from the matched values</h3>
      <div style="display:flex;gap:1.2rem;flex-wrap:wrap;align-items:flex-start">
      <table>
        <caption class="note" style="caption-side:bottom;text-align:left">
          ${fit.n} readings, RMSE ${formatNumber(fit.rmse)} m, ${fit.converged ? "converged" : "not converged"} after ${fit.iterations} iterations
        </caption>
        <thead>
          <tr><th scope="col">parameter</th><th scope="col">estimate</th><th scope="col">std. error</th><th scope="col">95 % low</th><th scope="col">95 % high</th><th scope="col">unit</th></tr>
        </thead>
        <tbody>
          ${fit.parameters.map(
            (p) => html`<tr>
              <td>${p.name} ${p.label}</td>
              <td>${formatNumber(p.estimate)}</td>
              <td>${p.standardError === null ? "" : formatNumber(p.standardError)}</td>
              <td>${p.ci95 ? formatNumber(p.ci95[0]) : ""}</td>
              <td>${p.ci95 ? formatNumber(p.ci95[1]) : ""}</td>
              <td>${p.unit}</td>
            </tr>`,
          )}
        </tbody>
      </table>
      <table aria-label="Correlation of the estimates">
        <thead>
          <tr><th scope="col">correlation</th>${free.map((n) => html`<th scope="col">${n}</th>`)}</tr>
        </thead>
        <tbody>
          ${free.map((n, i) => html`<tr><td>${n}</td>${free.map((_, j) => html`<td>${formatNumber(Number(fit.correlation[i]![j]!.toFixed(4)))}</td>`)}</tr>`)}
        </tbody>
      </table>
      </div>
      ${fit.warnings.map((w) => html`<p class="note">${w}</p>`)}`;
  }

  #windowsPart(record: ObservationRecord, used: boolean[]) {
    if ("problem" in this.windows) return html`<p class="problem" role="alert">${this.windows.problem}</p>`;
    const set = this.windows.set;
    const list = Object.hasOwn(set.records, record.name) ? set.records[record.name]! : [];
    const f = this.#perDay;
    const sel = this.selection;
    const inSel = sel ? Array.from(record.t).filter((t) => t >= sel.from && t <= sel.to).length : 0;
    return html`<h3>Data windows of ${record.name}</h3>
      <p class="note">${used.filter((u) => !u).length} of ${used.length} readings left out. Fits, the derivative and the error figures here use the rest; a kept match uses them through <code>windowMask</code>.</p>
      ${list.length
        ? html`<ul class="windows">
            ${list.map(
              (w, i) => html`<li>
                ${formatNumber(w.from)} to ${formatNumber(w.to)} ${set.timeUnit}: ${w.reason}
                <button @click=${() => this.#putBack(i)} aria-label=${`Use the readings from ${w.from} to ${w.to} ${set.timeUnit} again`}>use again</button>
              </li>`,
            )}
          </ul>`
        : nothing}
      <div class="window-form" role="group" aria-label="Leave readings out">
        <label>from (${this.timeUnit})<input type="text" inputmode="decimal" aria-label=${`selection from, ${this.timeUnit}`} .value=${sel ? formatNumber(sel.from * f) : ""} @change=${(e: Event) => this.#typedRange("from", (e.target as HTMLInputElement).value)} /></label>
        <label>to (${this.timeUnit})<input type="text" inputmode="decimal" aria-label=${`selection to, ${this.timeUnit}`} .value=${sel ? formatNumber(sel.to * f) : ""} @change=${(e: Event) => this.#typedRange("to", (e.target as HTMLInputElement).value)} /></label>
        <label
          >reason
          <input class="reason" type="text" list="reasons" aria-label="Reason for leaving the readings out" .value=${this.reason} @input=${(e: Event) => (this.reason = (e.target as HTMLInputElement).value)} @keydown=${(e: KeyboardEvent) => e.key === "Enter" && this.#leaveOut()} />
        </label>
        <datalist id="reasons">${COMMON_REASONS.map((r) => html`<option value=${r}></option>`)}</datalist>
        <button class="primary" ?disabled=${!sel || this.reason.trim() === ""} @click=${() => this.#leaveOut()}>Leave out ${inSel ? `${inSel} reading${inSel === 1 ? "" : "s"}` : ""}</button>
      </div>`;
  }

  /** What a frame shows besides the marks: the curve on a grid, the figures at the readings, the match point. */
  #compute(record: ObservationRecord, model: DrawdownModel | undefined, values: Float64Array | undefined, used: boolean[]) {
    const grid = logTimes(record.t[0]! / 2, record.t[record.t.length - 1]! * 2, 160);
    const curve = model && values ? curveAt(model, values, record, grid) : undefined;
    const atReadings = model && values ? curveAt(model, values, record, record.t) : undefined;
    const figures = atReadings ? errorFigures(record, atReadings, used) : undefined;
    const point = model && values ? matchPointOf(this.choice, values, record) : undefined;
    if (curve) curveDerivative(grid, curve);
    return { grid, curve, figures, point };
  }

  /**
   * The computation of one frame without drawing it (curve, derivative, figures, match point), for the bench's
   * peer figure; returns the RMSE (m).
   */
  computeOnly(): number {
    const record = this.record;
    if (!record) return Number.NaN;
    return this.#compute(record, this.#model, this.values, this.#used(record)).figures?.rmse ?? Number.NaN;
  }

  override render() {
    const records = this.records;
    const head = html`<div class="head">
      <h2 id="match-title">Match by hand</h2>
      ${records && records.length
        ? html`<label
              >record
              <select aria-label="Observation record" .value=${String(this.recordIndex)} @change=${(e: Event) => {
                this.recordIndex = Number((e.target as HTMLSelectElement).value);
                this.selection = undefined;
                this.values = undefined;
                this.#reset();
              }}>
                ${records.map((r, i) => html`<option value=${String(i)} ?selected=${i === this.recordIndex}>${r.name} (${r.expression}, r = ${formatNumber(r.r)} m)</option>`)}
              </select></label
            >
            <label
              >model
              <select aria-label="Drawdown model" .value=${this.choice.id} @change=${(e: Event) => this.#selectModel((e.target as HTMLSelectElement).value)}>
                ${modelIds.map((id) => html`<option value=${id} ?selected=${id === this.choice.id}>${describeModel(id).name}</option>`)}
              </select></label
            >
            <label
              >time in
              <select aria-label="Time unit of the charts" .value=${this.timeUnit} @change=${(e: Event) => (this.timeUnit = (e.target as HTMLSelectElement).value)}>
                ${TIME_UNITS.map((u) => html`<option value=${u} ?selected=${u === this.timeUnit}>${u}</option>`)}
              </select></label
            >
            <span role="radiogroup" aria-label="What a drag on the log-log chart does">
              <label><input type="radio" name="tool" .checked=${this.tool === "move"} @change=${() => (this.tool = "move")} /> move the curve</label>
              <label><input type="radio" name="tool" .checked=${this.tool === "select"} @change=${() => (this.tool = "select")} /> select readings</label>
            </span>`
        : nothing}
      <span class="grow"></span>
      <button @click=${() => this.#send("cb-match-close", {})} aria-label="Close the matching panel">Close</button>
    </div>`;
    if (this.recordsProblem) return html`${head}<p class="problem" role="alert">${this.recordsProblem}</p>`;
    if (!records) return html`${head}<p role="status">Running the document once to find its observation records…</p>`;
    const record = this.record;
    if (!record) {
      return html`${head}<p role="status">
          No observation records were found. A record is a value shaped like the result of <code>aq.toBaseUnits</code> (name, t in d, s in m, r, Q), or a list of them, kept in a top-level
          <code>const</code> of a code cell.
        </p>`;
    }
    const made = modelOf(this.choice);
    const model = "model" in made ? made.model : undefined;
    const values = this.values;
    const used = this.#used(record);
    const reasons = windowReasons(this.#set, record.name, record.t);
    const { grid, curve, figures, point } = this.#compute(record, model, values, used);
    const f = this.#perDay;
    return html`${head}
      ${this.#options()}
      ${"problem" in made ? html`<p class="problem" role="alert">${made.problem}</p>` : nothing}
      <div class="grid">
        <div>${this.#logLog(record, model, values, used, reasons, grid, curve)} ${this.#strip(record, figures?.residuals, used, reasons)}</div>
        <div>
          ${model && values ? this.#parameters(model, values) : nothing}
          ${figures
            ? html`<div class="figures" role="status" aria-live="polite" aria-label="Error figures">
                RMSE <strong class="rmse">${formatNumber(figures.rmse)} m</strong> (${formatNumber(figures.rmse * 1000)} mm) over ${figures.used} of ${figures.total} readings;
                largest residual <strong class="largest">${figures.largest ? `${formatNumber(figures.largest.residual)} m` : "none"}</strong>${figures.largest ? ` at ${formatNumber(figures.largest.t * f)} ${this.timeUnit}` : ""}
              </div>`
            : nothing}
          ${point
            ? html`<div class="matchpoint">
                <strong>Match point.</strong> ${point.reading} falls at s = ${formatNumber(point.s)} m and t = ${formatNumber(point.t * f)} ${this.timeUnit}; from that reading the library's ${point.method}
                gives ${point.gives.map((g, i) => html`${i ? ", " : ""}${g.name} = ${formatNumber(g.value)}${g.unit === "1" ? "" : ` ${g.unit}`}`)}.
              </div>`
            : model
              ? html`<div class="matchpoint">No match-point procedure of the library for ${model.name}; the parameters above are the match.</div>`
              : nothing}
          <div class="actions">
            <button @click=${() => this.#refine()} ?disabled=${!model || !values} title="Least squares from the matched values (4 significant digits), on the readings the windows keep">Refine</button>
            <button class="primary" @click=${() => this.#keep(true)} ?disabled=${!model || !values}>Keep, refined</button>
            <button @click=${() => this.#keep(false)} ?disabled=${!model || !values}>Keep as matched</button>
            <button @click=${() => this.#reset()} ?disabled=${!model}>Start again</button>
          </div>
          <p class="note">Keep writes a code cell after the record's cell: the model, the record, the ${this.refined ? "values as matched before refining" : "values as matched"} (4 significant digits) and the data windows; run the document to record its outputs.</p>
          ${this.refineProblem ? html`<p class="problem" role="alert">The fit failed: ${this.refineProblem}</p>` : nothing}
        </div>
      </div>
      ${this.refined ? html`<div class="refined">${this.#refinedTable(this.refined.fit)}</div>` : nothing}
      <p class="note" role="note">A match shows what the model and these readings imply, not what the aquifer is: interpreting it is for qualified professionals, and local regulations and licensed practice govern.</p>
      <div class="charts-row">${this.#semilog(record, used, reasons, grid, curve)} ${this.#derivative(record, used, reasons, grid, curve)}</div>
      ${this.#windowsPart(record, used)}`;
  }
}

customElements.define("cb-match", CbMatch);
