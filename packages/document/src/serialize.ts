/**
 * Writing a Conebook file. Parts of a parsed document whose meaning did not change are written back from
 * their original text, so parse -> serialize is byte-identical; changed parts (and documents built in memory)
 * are generated in the canonical layout described in docs/format.md.
 */

import { stringify as stringifyYaml } from "yaml";
import { bodyKey, markerKey, outputsKey } from "./cell-keys.js";
import { DocumentError } from "./errors.js";
import { closesFence, formatCellInfo, readCellInfo, readOpeningFence, safeFence } from "./fence.js";
import type { FenceKind } from "./fence.js";
import { YAML_WRITE_OPTIONS, headerSnapshot, rewriteHeaderYaml, writeHeaderYaml } from "./header.js";
import { messages } from "./messages.js";
import { writeOutputs } from "./outputs.js";
import { splitBody } from "./parse.js";
import { reviewMarker } from "./review-notes.js";
import { isBlank, splitLines, stableStringify } from "./text.js";
import { readYamlValue } from "./yaml-read.js";
import type { Cell, ChartCell, ConebookDocument, DocumentHeader, Position } from "./types.js";

export interface SerializeOptions {
  /**
   * Write the ids the parser assigned to cells that had none (default true), so they stay stable from then on.
   * With false, a parsed document is written back exactly as it was read.
   */
  writeAssignedIds?: boolean;
}

/**
 * Writes a document as Conebook text. Throws DocumentError when a cell cannot be written so that it reads back
 * as itself (a narrative cell that leaves a fence open, an attribute value with a line break).
 */
export function serializeDocument(doc: ConebookDocument, options: SerializeOptions = {}): string {
  const writeIds = options.writeAssignedIds ?? true;
  const eol = doc.layout?.eol ?? "\n";
  const out: string[] = [writeHeader(doc, eol)];
  doc.cells.forEach((cell, i) => {
    const isLast = i === doc.cells.length - 1;
    out.push(cell.origin?.leading ?? eol + eol);
    out.push(cell.kind === "narrative" ? writeNarrative(cell, eol, writeIds) : writeFenced(cell, eol, writeIds, isLast && cell.outputs.length === 0));
    if (cell.kind !== "narrative") out.push(writeOutputsBlock(cell, eol, writeIds));
  });
  out.push(doc.layout?.trailing ?? eol);
  return out.join("");
}

function writeHeader(doc: ConebookDocument, eol: string): string {
  const layout = doc.layout;
  if (!layout) return `---${eol}${writeHeaderYaml(doc.header).split("\n").join(eol)}---`;
  if (headerSnapshot(doc.header) === layout.headerSnapshot) return layout.headerText;
  const lines = splitLines(layout.headerText);
  const last = lines[lines.length - 1]!;
  const open = layout.headerText.slice(0, lines[0]!.eolEnd);
  const yaml = layout.headerText.slice(lines[0]!.eolEnd, last.start);
  const before = JSON.parse(layout.headerSnapshot) as DocumentHeader;
  return open + rewriteHeaderYaml(yaml, before, doc.header, eol) + layout.headerText.slice(last.start);
}

/** The line ending to put after `text` so that dropping one final line ending gives `text` back. */
const endingFor = (text: string, eol: string): string => (text.endsWith("\r") ? "\r\n" : eol);

function narrativeMarker(id: string): string {
  return `[narrative:${id}]: #`;
}

/** The marker of a narrative cell: a review marker for a review note. */
function markerOf(cell: Cell): string {
  return cell.kind === "narrative" && cell.review ? reviewMarker(cell.id, cell.review) : narrativeMarker(cell.id);
}

/** Trims blank lines from both ends: they are layout, not content, in a narrative cell. */
function trimBlankLines(source: string): string {
  const lines = splitLines(source);
  let a = 0;
  let b = lines.length - 1;
  const blank = (i: number): boolean => isBlank(source.slice(lines[i]!.start, lines[i]!.end));
  while (a <= b && blank(a)) a++;
  while (b >= a && blank(b)) b--;
  return a > b ? "" : source.slice(lines[a]!.start, lines[b]!.end);
}

function writeNarrative(cell: Cell, eol: string, writeIds: boolean): string {
  const o = cell.origin;
  const idUnchanged = o !== undefined && markerKey(cell) === JSON.parse(o.snapshot).marker;
  const bodyUnchanged = o !== undefined && bodyKey(cell) === JSON.parse(o.snapshot).body;
  if (o && idUnchanged && bodyUnchanged) {
    if (!o.idAssigned || !writeIds) return o.head + o.body;
    if (o.head === "") return markerOf(cell) + eol + eol + o.body;
    return markerOf(cell) + o.head.slice(splitLines(o.head)[0]!.end) + o.body;
  }
  if (o && o.head !== "" && bodyUnchanged) {
    // Only the marker changed (an id, or a review note's status): the marker line is rewritten, the rest kept.
    return markerOf(cell) + o.head.slice(splitLines(o.head)[0]!.end) + o.body;
  }
  const source = trimBlankLines(cell.source);
  checkNarrative(cell.id, source, eol, o?.start ?? cell.sourceStart);
  return source === "" ? markerOf(cell) : markerOf(cell) + eol + eol + source;
}

/** Throws unless `source`, written as a narrative cell between other cells, reads back as exactly itself. */
function checkNarrative(id: string, source: string, eol: string, at: Position): void {
  const probeHeader = `---${eol}---`;
  const text = `${probeHeader}${eol}${eol}${narrativeMarker(id)}${eol}${eol}${source}${eol}${eol}\`\`\`ts code:narrative-probe${eol}\`\`\`${eol}`;
  const { cells } = splitBody(text, probeHeader.length);
  if (cells.length >= 1 && cells[0]!.kind === "narrative" && cells[0]!.source === source && cells.length === 2) return;
  const detail =
    cells.length > 2 || (cells.length === 2 && cells[1]!.id !== "narrative-probe")
      ? "its text contains a Conebook cell fence or narrative marker at the top level; indent that example by four spaces or change its info string"
      : "it leaves a code fence or HTML block open, which would swallow the cells after it; close the fence or block";
  throw new DocumentError(messages.narrativeUnsafe(id, detail), at);
}

function fenceLang(cell: Exclude<Cell, { kind: "narrative" }>): string {
  return cell.kind === "code" ? "ts" : cell.kind === "data" ? "csv" : cell.specFormat;
}

function cellAttributes(cell: Exclude<Cell, { kind: "narrative" }>): [string, string][] {
  const attrs: [string, string][] = [];
  if (cell.kind === "data") {
    if (cell.name !== cell.id) attrs.push(["name", cell.name]);
    if (cell.file) attrs.push(["file", cell.file.path], ["sha256", cell.file.sha256]);
  }
  for (const [k, v] of Object.entries(cell.attributes ?? {})) attrs.push([k, v]);
  for (const [k, v] of attrs) {
    if (/[\r\n]/.test(v)) {
      throw new DocumentError(messages.attributeLineBreak(k, cell.id), cell.origin?.start ?? { line: 1, column: 1 });
    }
  }
  return attrs;
}

/**
 * The chart's source: kept while it still says what `spec` says (unchanged, or edited as text together with its
 * spec, as an editor does, so comments and layout survive), otherwise written from `spec`.
 */
function chartSource(cell: ChartCell): string {
  const o = cell.origin;
  const specEdited = o
    ? stableStringify((JSON.parse(JSON.parse(o.snapshot).body) as { spec: unknown }).spec) !== stableStringify(cell.spec)
    : !sourceMatchesSpec(cell);
  if (!specEdited || (o && sourceMatchesSpec(cell))) return cell.source;
  return cell.specFormat === "json" ? JSON.stringify(cell.spec, null, 2) : stringifyYaml(cell.spec, YAML_WRITE_OPTIONS).replace(/\n$/, "");
}

function sourceMatchesSpec(cell: ChartCell): boolean {
  try {
    const parsed: unknown = cell.specFormat === "json" ? JSON.parse(cell.source) : readYamlValue(cell.source).value;
    return stableStringify(parsed) === stableStringify(cell.spec);
  } catch {
    return false;
  }
}

const endsWithEol = (s: string): boolean => /(\r\n|\n|\r)$/.test(s);

function writeFenced(cell: Exclude<Cell, { kind: "narrative" }>, eol: string, writeIds: boolean, mayStayOpen: boolean): string {
  const o = cell.origin;
  const source = cell.kind === "chart" ? chartSource(cell) : cell.source;
  const snap = o ? (JSON.parse(o.snapshot) as { marker: string; body: string }) : undefined;
  const bodySame = snap !== undefined && (JSON.parse(snap.body) as { source: string }).source === source;
  const markerSame = snap !== undefined && markerKey(cell) === snap.marker;
  const body = bodySame ? o!.body : source === "" ? "" : source + endingFor(source, eol);
  const closable = body === "" || endsWithEol(body) ? body : body + eol;
  const attrs = cellAttributes(cell);

  if (o && markerSame) {
    const fence = readOpeningFence(o.head.replace(/(\r\n|\n|\r)$/, ""))!;
    const headHasEol = endsWithEol(o.head);
    const bodyFits = bodySame || (fence.indent === 0 && !splitLines(body).some((l) => closesFence(body.slice(l.start, l.end), fence)));
    if (bodyFits && headHasEol) {
      const head = o.idAssigned && writeIds ? insertId(o.head, cell.id) : o.head;
      if (o.tail === "" && bodySame && mayStayOpen) return head + body;
      return head + closable + (o.tail !== "" ? o.tail : fence.char.repeat(fence.length));
    }
  }
  // A new opening fence starts at column 1, so a body kept from an indented fence would change meaning.
  const indented = o !== undefined && readOpeningFence(o.head.replace(/(\r\n|\n|\r)$/, ""))!.indent > 0;
  const plain = source === "" ? "" : source + endingFor(source, eol);
  const text = indented || !bodySame ? plain : closable;
  const char = attrs.some(([, v]) => v.includes("`")) ? "~" : "`";
  const fence = safeFence(text, char);
  const info = formatCellInfo(fenceLang(cell), cell.kind as FenceKind, cell.id, attrs);
  return `${fence}${info}${eol}${text}${fence}`;
}

/** Puts `:id` after the kind word of a raw opening fence line that had no id. */
function insertId(head: string, id: string): string {
  const line = head.replace(/(\r\n|\n|\r)$/, "");
  const fence = readOpeningFence(line)!;
  const after = fence.indent + fence.length;
  const infoStart = after + (line.slice(after).length - line.slice(after).trimStart().length);
  const info = readCellInfo(fence.info)!;
  const at = infoStart + info.kindEnd;
  const insert = line[at] === ":" ? id : `:${id}`;
  const pos = line[at] === ":" ? at + 1 : at;
  return head.slice(0, pos) + insert + head.slice(pos);
}

function writeOutputsBlock(cell: Cell, eol: string, writeIds: boolean): string {
  const o = cell.origin;
  if (o?.outputsText !== undefined) {
    const same = o.outputsSnapshot === outputsKey(cell.id, cell.outputs) || (!writeIds && o.outputsSnapshot === outputsKey(null, cell.outputs));
    if (same) return o.outputsLeading! + o.outputsText;
  }
  if (cell.outputs.length === 0) return "";
  const json = writeOutputs(cell.outputs).split("\n").join(eol);
  const fence = safeFence(json, "`");
  return `${o?.outputsText !== undefined ? o.outputsLeading! : eol + eol}${fence}json outputs:${cell.id}${eol}${json}${eol}${fence}`;
}
