/**
 * <cb-review-cell>: what the review view says about one cell: reproduced or not, and where not, each difference
 * with the recorded and the rerun value; a table that differs is shown with its differing cells highlighted
 * (recorded value, then rerun value), a chart that differs is drawn as recorded and as rerun side by side.
 */
import { LitElement, css, html, nothing } from "lit";
import type { CellOutput } from "@conebook/document";
import { relativeDifference, type OutputDifference } from "@conebook/kernel";
import { concernsOutput, differingTableCells, type CellReview } from "../model/review.js";
import { formatNumber } from "./format.js";
import "./chart.js";

const SHOWN = 8;

function shown(v: unknown): string {
  if (v === undefined) return "nothing";
  if (typeof v === "number") return formatNumber(v);
  const s = JSON.stringify(v) ?? String(v);
  return s.length > 80 ? `${s.slice(0, 79)}…` : s;
}

export class CbReviewCell extends LitElement {
  static override properties = { review: { attribute: false }, cellId: { type: String } };
  declare review: CellReview;
  declare cellId: string;

  static override styles = css`
    :host {
      display: block;
      margin-top: 0.4rem;
      border-top: 1px dashed var(--cb-rule, #d9d4c7);
      padding-top: 0.35rem;
      font-size: 0.85rem;
    }
    .badge {
      display: inline-block;
      font-weight: 650;
      padding: 0.05rem 0.45rem;
      border-radius: 3px;
    }
    .reproduced {
      color: #17603a;
      background: #e6f2ea;
    }
    .differs,
    .failed {
      color: #9d1c32;
      background: #fdecef;
    }
    .unrecorded {
      color: #7a4a00;
      background: #fff4d9;
    }
    ul {
      margin: 0.3rem 0;
      padding-left: 1.2rem;
      font-family: ui-monospace, "DejaVu Sans Mono", monospace;
      font-size: 0.78rem;
    }
    table {
      border-collapse: collapse;
      font-size: 0.78rem;
      font-variant-numeric: tabular-nums;
      margin: 0.3rem 0;
    }
    td,
    th {
      border-bottom: 1px solid #ece8de;
      padding: 0.1rem 0.45rem;
      white-space: nowrap;
      text-align: right;
    }
    td.moved {
      background: #fde4e4;
      outline: 1px solid #9d1c32;
    }
    td.moved del {
      color: #56656b;
    }
    td.moved ins {
      text-decoration: none;
      font-weight: 700;
      color: #9d1c32;
    }
    .table {
      max-height: 16rem;
      overflow: auto;
      border: 1px solid #d9d4c7;
    }
    .pair {
      display: flex;
      gap: 0.8rem;
      flex-wrap: wrap;
    }
    .pair figure {
      margin: 0;
      border: 1px solid #d9d4c7;
      padding: 0.2rem;
    }
    figcaption {
      font-weight: 650;
      font-size: 0.8rem;
    }
  `;

  #diffLine(d: OutputDifference) {
    const rel = typeof d.recorded === "number" && typeof d.fresh === "number" ? ` (relative difference ${relativeDifference(d.recorded, d.fresh).toExponential(2)})` : "";
    return html`<li>outputs${d.path}: recorded ${shown(d.recorded)}, rerun ${shown(d.fresh)}${d.note && !rel ? ` (${d.note})` : rel}</li>`;
  }

  #table(recorded: Extract<CellOutput, { type: "table" }>, fresh: CellOutput | undefined, index: number) {
    const moved = differingTableCells(this.review.differences, index);
    const rowsShown = [...new Set([...moved.keys()].map((k) => Number(k.split(",")[0])))].sort((a, b) => a - b).slice(0, 40);
    const rerun = fresh?.type === "table" ? fresh : undefined;
    return html`<div class="table" role="region" tabindex="0" aria-label=${`rows of ${recorded.title ?? `table ${index + 1}`} that differ`}>
      <table>
        <caption style="text-align:left;font-weight:650">${recorded.title ?? `table ${index + 1}`}: ${moved.size} cell${moved.size === 1 ? "" : "s"} differ (recorded, then rerun)</caption>
        <thead><tr><th scope="col">row</th>${recorded.columns.map((c) => html`<th scope="col">${c.name}${c.unit ? ` (${c.unit})` : ""}</th>`)}</tr></thead>
        <tbody>
          ${rowsShown.map(
            (r) => html`<tr>
              <th scope="row">${r + 1}</th>
              ${recorded.columns.map((_, c) => {
                const d = moved.get(`${r},${c}`);
                const then = recorded.rows[r]?.[c];
                if (!d) return html`<td>${typeof then === "number" ? formatNumber(then) : (then ?? "")}</td>`;
                const now = rerun?.rows[r]?.[c];
                return html`<td class="moved" title=${`recorded ${String(then)}, rerun ${String(now)}`}><del>${shown(then)}</del> <ins>${shown(now)}</ins></td>`;
              })}
            </tr>`,
          )}
        </tbody>
      </table>
    </div>`;
  }

  override render() {
    const r = this.review;
    const words = { reproduced: "reproduced", differs: `differs: ${r.differences.length} difference${r.differences.length === 1 ? "" : "s"}`, failed: "fails now", unrecorded: "no recorded outputs to compare" };
    const parts = r.recorded.map((o, i) => {
      if (!r.differences.some((d) => concernsOutput(d, i))) return nothing;
      if (o.type === "table" && r.fresh[i]?.type === "table") return this.#table(o, r.fresh[i], i);
      const fresh = r.fresh[i];
      if (o.type === "chart" && fresh?.type === "chart") {
        return html`<div class="pair">
          <figure><figcaption>recorded</figcaption><cb-chart .spec=${o.spec} label=${`recorded chart of cell ${this.cellId}`}></cb-chart></figure>
          <figure><figcaption>rerun</figcaption><cb-chart .spec=${fresh.spec} label=${`rerun chart of cell ${this.cellId}`}></cb-chart></figure>
        </div>`;
      }
      return nothing;
    });
    return html`<span class="badge ${r.status}" role="status">Review: ${words[r.status]}</span>
      ${r.differences.length ? html`<ul>${r.differences.slice(0, SHOWN).map((d) => this.#diffLine(d))}${r.differences.length > SHOWN ? html`<li>… and ${r.differences.length - SHOWN} more</li>` : nothing}</ul>` : nothing}
      ${parts}`;
  }
}

customElements.define("cb-review-cell", CbReviewCell);
