/** Small line icons drawn for this page (14 px, currentColor). Each is decorative: buttons carry their own labels. */
import { svg, type SVGTemplateResult } from "lit";

const icon = (body: SVGTemplateResult) => svg`<svg class="icon" viewBox="0 0 16 16" fill="none" stroke="currentColor" stroke-width="1.6" stroke-linecap="round" stroke-linejoin="round" aria-hidden="true">${body}</svg>`;

export const icons = {
  /** A drop falling into a cone: run. */
  run: icon(svg`<path d="M4 3l9 5-9 5z" fill="currentColor" stroke="none"/>`),
  runAll: icon(svg`<path d="M2 3l6 5-6 5zM8 3l6 5-6 5z" fill="currentColor" stroke="none"/>`),
  runTo: icon(svg`<path d="M3 3l7 5-7 5z" fill="currentColor" stroke="none"/><path d="M13 3v10"/>`),
  stop: icon(svg`<rect x="3.5" y="3.5" width="9" height="9" rx="1" fill="currentColor" stroke="none"/>`),
  save: icon(svg`<path d="M3 2.5h8l2.5 2.5v8.5h-10.5z"/><path d="M5.5 2.5v3.5h5v-3.5M5 13.5v-4h6v4"/>`),
  undo: icon(svg`<path d="M5 4L2 7l3 3"/><path d="M2 7h7.5a3.5 3.5 0 010 7H7"/>`),
  redo: icon(svg`<path d="M11 4l3 3-3 3"/><path d="M14 7H6.5a3.5 3.5 0 000 7H9"/>`),
  up: icon(svg`<path d="M8 13V3M4 7l4-4 4 4"/>`),
  down: icon(svg`<path d="M8 3v10M4 9l4 4 4-4"/>`),
  remove: icon(svg`<path d="M3 4.5h10M6.5 4.5V3h3v1.5M4.5 4.5l.7 9h5.6l.7-9"/>`),
  add: icon(svg`<path d="M8 3v10M3 8h10"/>`),
  keys: icon(svg`<rect x="1.5" y="4" width="13" height="8" rx="1.5"/><path d="M4 6.5h1M7 6.5h1M10 6.5h2M4.5 9.5h7"/>`),
  edit: icon(svg`<path d="M10.5 2.5l3 3-8 8H2.5v-3z"/>`),
  outline: icon(svg`<path d="M3 4h10M5 8h8M5 12h8"/>`),
};
