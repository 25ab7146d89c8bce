/**
 * The outline: the Markdown headings (ATX `#` to `######`) of the narrative cells, outside fenced code, in
 * document order, each with the cell it sits in. Setext headings are not listed (common practice in this
 * project's documents is ATX). DOM-free.
 */
import type { Cell } from "@conebook/document";

/** One heading. */
export interface OutlineEntry {
  cellId: string;
  /** 1 for `#`, up to 6. */
  level: number;
  text: string;
}

const ATX = /^ {0,3}(#{1,6})[ \t]+(.*?)(?:[ \t]+#+)?[ \t]*$/;
const FENCE = /^ {0,3}(`{3,}|~{3,})/;

/** The headings of `cells`, in order. Cost: linear in the narrative text. */
export function outlineOf(cells: readonly Cell[]): OutlineEntry[] {
  const out: OutlineEntry[] = [];
  for (const cell of cells) {
    if (cell.kind !== "narrative") continue;
    let fence: string | undefined;
    for (const line of cell.source.split(/\r\n|\n|\r/)) {
      const f = FENCE.exec(line);
      if (f) {
        if (fence === undefined) fence = f[1]![0]!.repeat(f[1]!.length);
        else if (f[1]!.startsWith(fence)) fence = undefined;
        continue;
      }
      if (fence !== undefined) continue;
      const m = ATX.exec(line);
      if (m) out.push({ cellId: cell.id, level: m[1]!.length, text: m[2]!.replace(/[*_`]/g, "") });
    }
  }
  return out;
}
