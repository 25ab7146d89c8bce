/**
 * The page's look, our own: warm paper background, dark slate ink, a deep teal for actions, a band of colour at
 * each cell's edge by kind (with the kind also written out, so colour is never the only sign). Chart colours use
 * the Okabe-Ito palette (Okabe & Ito 2008, "Color Universal Design", J*FLY), chosen to stay distinguishable for
 * readers with protanopia, deuteranopia and tritanopia.
 */
import { css } from "lit";

/** Okabe & Ito (2008) categorical colours, black left out (used for text), in their published order. */
export const OKABE_ITO = ["#E69F00", "#56B4E9", "#009E73", "#F0E442", "#0072B2", "#D55E00", "#CC79A7"] as const;

/** Reordered for charts so that the first colours, used most, are the strongest pairs: blue, orange, green, vermillion... */
export const CHART_PALETTE = ["#0072B2", "#E69F00", "#009E73", "#D55E00", "#56B4E9", "#CC79A7", "#F0E442"] as const;

export const tokens = css`
  :host {
    --cb-paper: #f6f4ee;
    --cb-sheet: #ffffff;
    --cb-ink: #1c2a30;
    --cb-muted: #56656b;
    --cb-rule: #d9d4c7;
    --cb-action: #0b6262;
    --cb-action-ink: #ffffff;
    --cb-focus: #c2410c;
    --cb-warn-bg: #fff4d9;
    --cb-warn: #7a4a00;
    --cb-error: #9d1c32;
    --cb-error-bg: #fdecef;
    --cb-ok: #17603a;
    --cb-kind-narrative: #b9ae94;
    --cb-kind-code: #0b6262;
    --cb-kind-data: #7a5a00;
    --cb-kind-chart: #3c4fa0;
    --cb-mono: ui-monospace, "DejaVu Sans Mono", Menlo, Consolas, monospace;
    --cb-sans: system-ui, "DejaVu Sans", "Segoe UI", sans-serif;
  }
`;

export const controls = css`
  button,
  select {
    font: inherit;
    font-size: 0.85rem;
    color: var(--cb-ink);
    background: var(--cb-sheet);
    border: 1px solid var(--cb-rule);
    border-radius: 4px;
    padding: 0.2rem 0.55rem;
    cursor: pointer;
    display: inline-flex;
    align-items: center;
    gap: 0.3rem;
  }
  button:hover:not(:disabled) {
    border-color: var(--cb-action);
  }
  button.primary {
    background: var(--cb-action);
    color: var(--cb-action-ink);
    border-color: var(--cb-action);
  }
  button:disabled {
    opacity: 0.45;
    cursor: default;
  }
  button:focus-visible,
  select:focus-visible,
  a:focus-visible,
  [tabindex]:focus-visible {
    outline: 3px solid var(--cb-focus);
    outline-offset: 1px;
  }
  svg.icon {
    width: 14px;
    height: 14px;
    flex: none;
  }
  .sr-only {
    position: absolute;
    width: 1px;
    height: 1px;
    overflow: hidden;
    clip: rect(0 0 0 0);
    white-space: nowrap;
  }
`;
