/**
 * Small SVG charts for live work (curve matching, data windows): scales, axes and marks as lit `svg`
 * templates, drawn by the page itself rather than by vega-embed so that a drag redraws within a frame. Log axes
 * follow the project's rule (DESIGN.md): ticks at 1..9 x 10^k, labels only at decades, stronger grid at decades;
 * values <= 0 are not drawn on a log axis.
 */
import { svg, type SVGTemplateResult } from "lit";

/** One axis: log or linear, data domain to pixel range. */
export class Axis {
  readonly lo: number;
  readonly hi: number;
  constructor(
    readonly kind: "log" | "linear",
    domain: [number, number],
    readonly range: [number, number],
  ) {
    let [a, b] = domain;
    if (!(a < b)) {
      const mid = Number.isFinite(a) ? a : 1;
      [a, b] = kind === "log" ? [mid / 10, mid * 10] : [mid - 1, mid + 1];
    }
    this.lo = kind === "log" ? Math.log10(a) : a;
    this.hi = kind === "log" ? Math.log10(b) : b;
  }

  /** Pixel of a data value (NaN for values <= 0 on a log axis). */
  px(v: number): number {
    const x = this.kind === "log" ? (v > 0 ? Math.log10(v) : Number.NaN) : v;
    return this.range[0] + ((x - this.lo) / (this.hi - this.lo)) * (this.range[1] - this.range[0]);
  }

  /** Data value of a pixel. */
  value(px: number): number {
    const x = this.lo + ((px - this.range[0]) / (this.range[1] - this.range[0])) * (this.hi - this.lo);
    return this.kind === "log" ? 10 ** x : x;
  }

  /** Pixels per decade (log) or per unit (linear), signed as the range runs. */
  get perUnit(): number {
    return (this.range[1] - this.range[0]) / (this.hi - this.lo);
  }

  /** Tick values with whether each is labelled (log: 1..9 x 10^k, labels at decades; linear: about 6 round steps). */
  ticks(): { v: number; major: boolean; label: boolean }[] {
    if (this.kind === "log") {
      const out: { v: number; major: boolean; label: boolean; m: number }[] = [];
      for (let k = Math.floor(this.lo); k <= Math.ceil(this.hi); k++) {
        for (let m = 1; m <= 9; m++) {
          const x = k + Math.log10(m);
          if (x >= this.lo - 1e-9 && x <= this.hi + 1e-9) out.push({ v: m * 10 ** k, major: m === 1, label: m === 1, m });
        }
      }
      // Less than two decades shown: 2 and 5 are labelled too, so the axis can still be read.
      if (out.filter((t) => t.major).length < 2) for (const t of out) if (t.m === 2 || t.m === 5) t.label = true;
      return out;
    }
    const span = this.hi - this.lo;
    const raw = span / 6;
    const mag = 10 ** Math.floor(Math.log10(raw));
    const step = [1, 2, 5, 10].map((f) => f * mag).find((s) => s >= raw) ?? raw;
    const out: { v: number; major: boolean; label: boolean }[] = [];
    for (let v = Math.ceil(this.lo / step) * step; v <= this.hi + step * 1e-9; v += step) out.push({ v: Math.abs(v) < step * 1e-9 ? 0 : v, major: true, label: true });
    return out;
  }
}

/** The data range of finite (and, for log, positive) values, widened by `pad` (a fraction of a decade or of the span). */
export function extent(values: Iterable<number>, kind: "log" | "linear", pad = 0.05): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    if (!Number.isFinite(v) || (kind === "log" && v <= 0)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (!Number.isFinite(lo)) return kind === "log" ? [0.1, 10] : [0, 1];
  if (kind === "log") {
    const f = 10 ** (pad * Math.max(1, Math.log10(hi / lo)));
    return [lo / f, hi * f];
  }
  const span = hi - lo || Math.abs(hi) || 1;
  return [lo - pad * span, hi + pad * span];
}

/** A short label for a tick value. */
export function tickLabel(v: number, kind: "log" | "linear"): string {
  if (kind === "log") {
    const k = Math.round(Math.log10(v));
    return k >= -3 && k <= 4 ? String(Number(v.toPrecision(1))) : `1e${k}`;
  }
  return String(Number(v.toPrecision(4)));
}

/** The plot area of a chart. */
export interface Frame {
  width: number;
  height: number;
  left: number;
  right: number;
  top: number;
  bottom: number;
}

/** Axes, grid and titles of a chart (drawn behind the marks). */
export function axesOf(frame: Frame, x: Axis, y: Axis, xTitle: string, yTitle: string): SVGTemplateResult {
  const { left, right, top, bottom, width, height } = frame;
  const xr = width - right;
  const yb = height - bottom;
  return svg`<g class="axes">
    <rect x=${left} y=${top} width=${xr - left} height=${yb - top} fill="#ffffff" stroke="#cfc9ba"></rect>
    ${x.ticks().map((t) => {
      const p = x.px(t.v);
      return svg`<line x1=${p} x2=${p} y1=${top} y2=${yb} stroke=${t.major ? "#d8d2c4" : "#eeebe3"}></line>
        <line x1=${p} x2=${p} y1=${yb} y2=${yb + (t.major ? 6 : 3)} stroke="#56656b"></line>
        ${t.label ? svg`<text x=${p} y=${yb + 17} text-anchor="middle" class="tick">${tickLabel(t.v, x.kind)}</text>` : null}`;
    })}
    ${y.ticks().map((t) => {
      const p = y.px(t.v);
      return svg`<line x1=${left} x2=${xr} y1=${p} y2=${p} stroke=${t.major ? "#d8d2c4" : "#eeebe3"}></line>
        <line x1=${left - (t.major ? 6 : 3)} x2=${left} y1=${p} y2=${p} stroke="#56656b"></line>
        ${t.label ? svg`<text x=${left - 8} y=${p + 4} text-anchor="end" class="tick">${tickLabel(t.v, y.kind)}</text>` : null}`;
    })}
    <text x=${(left + xr) / 2} y=${height - 4} text-anchor="middle" class="title">${xTitle}</text>
    <text transform=${`translate(12 ${(top + yb) / 2}) rotate(-90)`} text-anchor="middle" class="title">${yTitle}</text>
  </g>`;
}

/** An SVG path through points (gaps where a value cannot be drawn). */
export function linePath(x: Axis, y: Axis, xs: ArrayLike<number>, ys: ArrayLike<number>): string {
  let d = "";
  let pen = false;
  for (let i = 0; i < xs.length; i++) {
    const px = x.px(xs[i]!);
    const py = y.px(ys[i]!);
    if (!Number.isFinite(px) || !Number.isFinite(py)) {
      pen = false;
      continue;
    }
    d += `${pen ? "L" : "M"}${px.toFixed(1)},${py.toFixed(1)}`;
    pen = true;
  }
  return d;
}
