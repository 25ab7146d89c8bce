/**
 * Reading a Conebook file. Pipeline: split off the YAML header -> find the CommonMark block structure of the
 * rest (markdown-it, block phase only) -> classify top-level blocks (cell fences, outputs fences, narrative markers,
 * everything else) -> group them into cells, keeping every character of the file in some cell's origin or in
 * the document layout -> assign ids to cells that lack one -> validate.
 */

import MarkdownIt from "markdown-it";
import { cellSnapshot, outputsKey } from "./cell-keys.js";
import { mayStartCell, startsCell } from "./cell-start.js";
import { DocumentError, diagnostic } from "./errors.js";
import { closesFence, readCellInfo, readOpeningFence } from "./fence.js";
import type { CellInfo, OpeningFence } from "./fence.js";
import { headerSnapshot, readHeader } from "./header.js";
import { messages } from "./messages.js";
import { readOutputs } from "./outputs.js";
import { REVIEW_MARKER, REVIEW_MARKER_START, type ReviewMark } from "./review-notes.js";
import { LineTable, PositionMap, detectEol, dropFinalEol } from "./text.js";
import type { Cell, CellOutput, ConebookDocument, Diagnostic, Position } from "./types.js";
import { validateDocument } from "./validate.js";
import { readYamlValue } from "./yaml-read.js";
import { MAX_JSON_DEPTH, nestedTooDeep } from "./json-depth.js";

export interface ParseOptions {
  /** File name used in diagnostics and errors. */
  file?: string;
}

export interface ParseResult {
  document: ConebookDocument;
  /** Problems found, sorted by position: parse warnings and errors, then validation (see validateDocument). */
  diagnostics: Diagnostic[];
}

/** The languages each fenced kind may be written in. */
const LANGUAGES: Record<string, readonly string[]> = {
  code: ["ts"],
  data: ["csv"],
  chart: ["json", "yaml"],
  outputs: ["json"],
};

const NARRATIVE_MARKER = /^\[narrative(?::([^\]\s]*))?\]:[ \t]*#[ \t]*$/;

/**
 * The block structure of the file comes from markdown-it in strict CommonMark mode with HTML blocks on (as
 * CommonMark viewers see them) and the inline phase off: about eight times faster than a full mdast parse,
 * and its line maps give exact, line-based block boundaries.
 */
const blockParser = new MarkdownIt("commonmark", { html: true });
blockParser.core.ruler.disable(["inline", "text_join"], true);

/** markdown-it's key for a reference label (CommonMark 4.7: case-folded, inner whitespace collapsed). */
function normalizeLabel(label: string): string {
  return blockParser.utils.normalizeReference(label);
}

/**
 * Parses a Conebook file. Never loses text: parts the parser does not understand stay in the narrative or the
 * layout and are written back unchanged. Throws DocumentError only when the header is missing, unclosed, not
 * YAML, not a mapping, or from a newer format version.
 */
export function parseDocument(text: string, options: ParseOptions = {}): ParseResult {
  const { file } = options;
  const lines = new LineTable(text);
  const lineText = (i: number): string => text.slice(lines.start(i), lines.end(i));
  const first = lineText(0).replace(/^\uFEFF/, "");
  if (!/^---[ \t]*$/.test(first)) throw new DocumentError(messages.headerMissing(), { line: 1, column: 1 }, file);
  let close = -1;
  for (let i = 1; i < lines.length; i++) {
    if (/^(---|\.\.\.)[ \t]*$/.test(lineText(i))) {
      close = i;
      break;
    }
  }
  if (close < 0) throw new DocumentError(messages.headerUnclosed(), { line: 1, column: 1 }, file);
  const headerEnd = lines.end(close);
  const yamlText = text.slice(lines.start(1), lines.start(close));
  const headerReading = readHeader(yamlText, 2, file);

  const body = readBody(text, headerEnd, file, lines);
  const diagnostics = [...headerReading.diagnostics, ...body.diagnostics];
  const document: ConebookDocument = {
    header: headerReading.header,
    cells: body.cells,
    layout: {
      eol: detectEol(text),
      headerText: text.slice(0, headerEnd),
      headerSnapshot: headerSnapshot(headerReading.header),
      headerPositions: headerReading.positions,
      trailing: body.trailing,
    },
  };
  // One at a time: spreading a list of 100,000 diagnostics into push() overflows the stack.
  for (const d of validateDocument(document, { file })) diagnostics.push(d);
  diagnostics.sort((a, b) => a.line - b.line || a.column - b.column);
  return { document, diagnostics };
}

interface FencedBlock {
  type: "fenced";
  start: number;
  end: number;
  line: number;
  fence: OpeningFence;
  info: CellInfo;
  closeLine: number;
}
interface MarkerBlock {
  type: "marker";
  start: number;
  end: number;
  id: string | undefined;
  review?: ReviewMark;
}
interface ContentBlock {
  type: "content";
  start: number;
  end: number;
}
type Block = FencedBlock | MarkerBlock | ContentBlock;

export interface BodyReading {
  cells: Cell[];
  trailing: string;
  diagnostics: Diagnostic[];
}

/**
 * Splits the text after offset `from` (the end of the header) into cells. Exported for the serializer, which
 * uses it to check that a regenerated narrative cell reads back as itself.
 */
export function splitBody(text: string, from: number, file?: string): BodyReading {
  return readBody(text, from, file, new LineTable(text));
}

/** splitBody over the lines of the text, split once by the caller. */
function readBody(text: string, from: number, file: string | undefined, lines: LineTable): BodyReading {
  const positions = new PositionMap(text, lines.starts);
  const lineText = (i: number): string => text.slice(lines.start(i), lines.end(i));
  const diagnostics: Diagnostic[] = [];
  const warn = (entry: { code: string; message: string }, at: Position, id?: string): void => {
    diagnostics.push(diagnostic("warning", entry, at, file, id));
  };
  const fail = (entry: { code: string; message: string }, at: Position, id?: string): void => {
    diagnostics.push(diagnostic("error", entry, at, file, id));
  };

  // Blank out the header (keeping line endings) so line numbers from the Markdown parser are file lines.
  const masked = text.slice(0, from).replace(/[^\r\n]/g, " ") + text.slice(from);
  const env: Record<string, unknown> = {};
  const tokens = blockParser.parse(masked, env);
  const isBlankLine = (i: number): boolean => /^[ \t]*$/.test(lineText(i));

  const blocks: Block[] = [];
  const covered: [number, number][] = [];
  for (const token of tokens) {
    if (token.level !== 0 || !token.map || token.nesting === -1) continue;
    const startLine = token.map[0];
    let endLine = Math.max(startLine, token.map[1] - 1);
    covered.push([startLine, token.map[1]]);
    if (token.type === "fence") {
      const fence = readOpeningFence(lineText(startLine));
      const info = fence ? readCellInfo(fence.info) : undefined;
      if (fence && info) {
        const at = { line: startLine + 1, column: fence.indent + 1 };
        if (!LANGUAGES[info.kind]!.includes(info.lang)) {
          fail(messages.cellLanguage(info.kind, info.lang, LANGUAGES[info.kind]!.map((l) => JSON.stringify(l)).join(" or ")), at);
          blocks.push({ type: "content", start: lines.start(startLine), end: lines.end(endLine) });
          continue;
        }
        const closed = endLine > startLine && closesFence(lineText(endLine), fence);
        let inside: { line: number; text: string } | undefined;
        for (let j = startLine + 1, bodyEnd = closed ? endLine : lines.length; j < bodyEnd; j++) {
          if (mayStartCell(text, lines.start(j), lines.end(j)) && startsCell(lineText(j))) {
            inside = { line: j - startLine, text: lineText(j).trim() };
            break;
          }
        }
        if (inside) warn(messages.fenceSwallowsCell(fence.char.repeat(fence.length), startLine + 1 + inside.line, inside.text), at, info.id);
        else if (!closed) warn(messages.fenceUnclosed(fence.char.repeat(fence.length)), at, info.id);
        blocks.push({
          type: "fenced",
          start: lines.start(startLine),
          end: closed ? lines.end(endLine) : text.length,
          line: startLine,
          fence,
          info,
          closeLine: closed ? endLine : -1,
        });
        continue;
      }
    }
    while (endLine > startLine && isBlankLine(endLine)) endLine--;
    blocks.push({ type: "content", start: lines.start(startLine), end: lines.end(endLine) });
  }
  // Link reference definitions make no token: a line no block covers that reads as a narrative marker, and
  // whose label the parser recorded as a definition, is a marker.
  let next = 0;
  covered.sort((x, y) => x[0] - y[0]);
  // The line of `from`: the number of line breaks before it (a lone "\r" when `from` splits a "\r\n" counts).
  const firstLine = positions.at(from).line - 1 + (text.charCodeAt(from - 1) === 13 && text.charCodeAt(from) === 10 ? 1 : 0);
  for (let i = firstLine; i < lines.length; i++) {
    while (next < covered.length && covered[next]![1] <= i) next++;
    if (next < covered.length && covered[next]![0] <= i) {
      // Inside a block: its lines are covered up to its end.
      i = covered[next]![1] - 1;
      continue;
    }
    // Every marker starts with "[" in the first column: skip the other uncovered lines (mostly blank) at once.
    if (text.charCodeAt(lines.start(i)) !== 91 || lines.start(i) >= lines.end(i)) continue;
    const line = lineText(i);
    const m = NARRATIVE_MARKER.exec(line);
    const r = m ? null : REVIEW_MARKER.exec(line);
    const references = env.references as Record<string, unknown> | undefined;
    const isDefinition = (): boolean => references !== undefined && normalizeLabel(line.slice(1, line.indexOf("]"))) in references;
    if (m && isDefinition()) {
      blocks.push({ type: "marker", start: lines.start(i), end: lines.end(i), id: m[1] === "" || m[1] === undefined ? undefined : m[1] });
    } else if (r && isDefinition()) {
      blocks.push({ type: "marker", start: lines.start(i), end: lines.end(i), id: r[1]!, review: { on: r[2]!, status: r[3] as ReviewMark["status"] } });
    } else if (!m && REVIEW_MARKER_START.test(line) && isDefinition()) {
      warn(messages.reviewMarkerUnread(), positions.at(lines.start(i)));
    }
  }
  blocks.sort((x, y) => x.start - y.start);

  const cells: Cell[] = [];
  const assigned = new Set<Cell>();
  let cursor = from;
  let lastFenced: Cell | undefined;
  let narrative: { leading: string; markerStart?: number; markerEnd?: number; id?: string; review?: ReviewMark; contentStart?: number; contentEnd?: number } | undefined;

  const flushNarrative = (): void => {
    if (!narrative) return;
    const n = narrative;
    narrative = undefined;
    const markerStart = n.markerStart;
    const headEnd = n.contentStart ?? n.markerEnd!;
    const head = markerStart === undefined ? "" : text.slice(markerStart, headEnd);
    const bodyText = n.contentStart === undefined ? "" : text.slice(n.contentStart, n.contentEnd);
    const start = positions.at(markerStart ?? n.contentStart!);
    const sourceStart = n.contentStart === undefined ? { line: start.line + 1, column: 1 } : positions.at(n.contentStart);
    const cell: Cell = {
      id: n.id ?? "",
      kind: "narrative",
      source: bodyText,
      sourceStart,
      outputs: [],
      origin: { leading: n.leading, head, body: bodyText, tail: "", snapshot: "", idAssigned: n.id === undefined, start },
    };
    if (n.review) cell.review = n.review;
    if (n.id === undefined) assigned.add(cell);
    cells.push(cell);
  };

  for (const block of blocks) {
    const gap = text.slice(cursor, block.start);
    if (block.type === "fenced" && block.info.kind === "outputs") {
      const target = narrative === undefined ? lastFenced : undefined;
      const blockId = block.info.id === "" ? undefined : block.info.id;
      const raw = target && target.origin!.outputsText === undefined && (blockId === undefined || blockId === target.id) ? fencedParts(text, lines, block) : undefined;
      let reading: ReturnType<typeof readOutputs> | undefined;
      if (raw) {
        try {
          reading = readOutputs(raw.source);
        } catch (e) {
          // Not JSON: nothing in it can be trusted as outputs, and dropping it would lose text. It stays as
          // ordinary Markdown (below), like an orphan block; a rerun records fresh outputs after the cell.
          warn(messages.outputsJson(target!.id, (e as Error).message), raw.sourceStart, target!.id);
        }
      } else warn(messages.outputsOrphan(blockId ?? "(no id)"), positions.at(block.start), blockId);
      if (raw && reading) {
        target!.origin!.outputsLeading = gap;
        target!.origin!.outputsText = raw.head + raw.body + raw.tail;
        for (const problem of reading.problems) fail(messages.outputsShape(problem), raw.sourceStart, target!.id);
        target!.outputs = reading.outputs;
        target!.origin!.outputsSnapshot = outputsKey(blockId ?? null, reading.outputs);
        cursor = block.end;
        lastFenced = undefined;
        continue;
      }
      // An orphan or unreadable outputs block is kept as ordinary Markdown: fall through to the content case.
    }
    if (block.type === "marker") {
      flushNarrative();
      narrative = { leading: gap, markerStart: block.start, markerEnd: block.end };
      if (block.id !== undefined) narrative.id = block.id;
      if (block.review) narrative.review = block.review;
      cursor = block.end;
      lastFenced = undefined;
      continue;
    }
    if (block.type === "content" || block.info.kind === "outputs") {
      if (!narrative) narrative = { leading: gap };
      if (narrative.contentStart === undefined) narrative.contentStart = block.start;
      narrative.contentEnd = block.end;
      cursor = block.end;
      lastFenced = undefined;
      continue;
    }
    flushNarrative();
    const cell = fencedCell(text, lines, block, gap, file, diagnostics);
    if (block.info.id === undefined || block.info.id === "") assigned.add(cell);
    cells.push(cell);
    cursor = block.end;
    lastFenced = cell;
  }
  flushNarrative();

  // Deterministic ids for cells without one: <kind><n>, n counting cells of that kind from 1, skipping ids in use.
  const used = new Set(cells.filter((c) => !assigned.has(c)).map((c) => c.id));
  const counters: Record<string, number> = {};
  for (const cell of cells) {
    counters[cell.kind] = (counters[cell.kind] ?? 0) + 1;
    if (!assigned.has(cell)) continue;
    let n = counters[cell.kind]!;
    while (used.has(`${cell.kind}${n}`)) n++;
    cell.id = `${cell.kind}${n}`;
    used.add(cell.id);
    if (cell.kind === "data" && cell.name === "") cell.name = cell.id;
    warn(messages.idAssigned(cell.id), cell.origin!.start, cell.id);
  }
  for (const cell of cells) cell.origin!.snapshot = cellSnapshot(cell);
  return { cells, trailing: text.slice(cursor), diagnostics };
}

interface FencedParts {
  head: string;
  body: string;
  tail: string;
  source: string;
  sourceStart: Position;
}

/** Cuts a fenced block into opening line, body and closing line, and reads the source from the body. */
function fencedParts(text: string, lines: LineTable, block: FencedBlock): FencedParts {
  const open = { start: lines.start(block.line), eolEnd: lines.eolEnd(block.line) };
  const head = text.slice(open.start, open.eolEnd);
  const bodyEnd = block.closeLine >= 0 ? lines.start(block.closeLine) : text.length;
  const body = text.slice(open.eolEnd, Math.max(open.eolEnd, bodyEnd));
  const tail = block.closeLine >= 0 ? text.slice(lines.start(block.closeLine), lines.end(block.closeLine)) : "";
  const indent = block.fence.indent;
  const source =
    indent === 0 ? dropFinalEol(body) : dropFinalEol(body.replace(new RegExp(`(^|\\r\\n|\\n|\\r) {0,${indent}}`, "g"), "$1"));
  return { head, body, tail, source, sourceStart: { line: block.line + 2, column: 1 + indent } };
}

/** The file position of an offset into a fenced block's source (whose lines lost the fence's indent). */
function sourcePosition(parts: FencedParts, offset: number): Position {
  const before = parts.source.slice(0, offset);
  const lineStart = Math.max(before.lastIndexOf("\n"), before.lastIndexOf("\r")) + 1;
  const breaks = before.match(/\r\n|\n|\r/g)?.length ?? 0;
  return { line: parts.sourceStart.line + breaks, column: parts.sourceStart.column + offset - lineStart };
}

const KNOWN_ATTRIBUTES: Record<string, readonly string[]> = { code: [], data: ["name", "file", "sha256"], chart: [] };

function fencedCell(text: string, lines: LineTable, block: FencedBlock, leading: string, file: string | undefined, diagnostics: Diagnostic[]): Cell {
  const parts = fencedParts(text, lines, block);
  const { info } = block;
  const start: Position = { line: block.line + 1, column: block.fence.indent + 1 };
  const id = info.id ?? "";
  if (info.error) {
    const line = parts.head.replace(/(\r\n|\n|\r)$/, "");
    const afterFence = block.fence.indent + block.fence.length;
    const infoStart = afterFence + (line.length - afterFence - line.slice(afterFence).trimStart().length);
    const col = infoStart + info.error.offset + 1;
    diagnostics.push(diagnostic("error", messages.attributeSyntax(info.error.detail), { line: start.line, column: col }, file, id));
  }
  const known = KNOWN_ATTRIBUTES[info.kind]!;
  const unknown: Record<string, string> = {};
  for (const key of info.order) {
    if (known.includes(key)) continue;
    unknown[key] = info.attributes[key]!;
    diagnostics.push(diagnostic("warning", messages.attributeUnknown(key, info.kind), start, file, id));
  }
  const origin = { leading, head: parts.head, body: parts.body, tail: parts.tail, snapshot: "", idAssigned: id === "", start };
  // Each cell is one object literal (keys in the order id, source, sourceStart, outputs, origin, kind, ...).
  const { source, sourceStart } = parts;
  const withAttributes = <T extends Cell>(cell: T): T => {
    if (Object.keys(unknown).length > 0) cell.attributes = unknown;
    return cell;
  };
  if (info.kind === "code") return withAttributes({ id, source, sourceStart, outputs: [] as CellOutput[], origin, kind: "code", language: "ts" });
  if (info.kind === "data") {
    const a = info.attributes;
    const cell: Cell = { id, source, sourceStart, outputs: [], origin, kind: "data", name: a.name ?? id, format: "csv" };
    if (a.file !== undefined || a.sha256 !== undefined) cell.file = { path: a.file ?? "", sha256: a.sha256 ?? "" };
    return withAttributes(cell);
  }
  const specFormat = info.lang as "json" | "yaml";
  let spec: Record<string, unknown> = {};
  try {
    let value: unknown;
    if (specFormat === "json") value = JSON.parse(parts.source);
    else {
      const reading = readYamlValue(parts.source);
      value = reading.value;
      for (const note of reading.notes) {
        diagnostics.push(diagnostic("warning", messages.yamlPassedOver("chart specification", note.message), sourcePosition(parts, note.offset), file, id));
      }
    }
    if (nestedTooDeep(value)) throw new SyntaxError(`it nests more than ${MAX_JSON_DEPTH} ${specFormat === "json" ? "arrays and objects" : "lists and mappings"} deep; flatten it`);
    if (typeof value === "object" && value !== null && !Array.isArray(value)) spec = value as Record<string, unknown>;
    else diagnostics.push(diagnostic("error", messages.chartNotObject(), parts.sourceStart, file, id));
  } catch (e) {
    diagnostics.push(diagnostic("error", messages.chartSyntax(specFormat.toUpperCase(), (e as Error).message.split("\n")[0]!), parts.sourceStart, file, id));
  }
  return withAttributes({ id, source, sourceStart, outputs: [], origin, kind: "chart", spec, specFormat });
}
