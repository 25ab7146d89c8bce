/**
 * `conebook new TEMPLATE -o FILE [--set name=value ...] [--data slot=path ...] [--force]`: a new document from a
 * template, with header parameters filled (type, unit and range checked), data slots bound to files pinned by
 * SHA-256, and every recorded output cleared.
 */
import { mkdir, readFile, stat } from "node:fs/promises";
import { basename, dirname, relative, resolve, sep } from "node:path";
import { DocumentError, isSafeRelativePath, serializeDocument, validateDocument } from "@conebook/document";
import type { Cell, ConebookDocument, DataCell, DataSlot, Position } from "@conebook/document";
import { onePositional, parseArgs, type OptionSpec } from "../args.js";
import { writeFileAtomic } from "../atomic-write.js";
import { EXIT, InputError, UsageError, place } from "../errors.js";
import { cellLine } from "../execute.js";
import type { Io } from "../io.js";
import { loadDocument, nodeSha256, shownPath, type LoadedDocument } from "../load.js";
import { applySettings, checkParameterUnits, parseSettings } from "../settings.js";

export const NEW_OPTIONS: readonly OptionSpec[] = [
  { name: "output", alias: "o", kind: "value" },
  { name: "set", kind: "list" },
  { name: "data", kind: "list" },
  { name: "force", kind: "flag" },
  { name: "title", kind: "value" },
];

export const NEW_HELP = `Usage: conebook new TEMPLATE -o FILE [--title TEXT] [--set name=value ...] [--data slot=path ...] [--force]

Writes a new document FILE from the document TEMPLATE: header parameters take the values given with --set
(checked against their type, unit and range), each data slot is bound to a CSV file given with --data, and all
recorded outputs are cleared. A data file inside FILE's folder is referred to where it is; any other is copied
to data/NAME beside FILE. Either way it is pinned by its SHA-256.

A parameter the template marks required (its value is only the demonstration's) must be given with --set;
every other value kept from the template is named on standard error and in a note at the top of FILE.
{{name}} in the title and the narrative becomes the parameter's value; narrative cells whose id starts with
"template-" (the template describing itself and its demonstration data) are left out.

Options:
  -o, --output FILE     the document to write (refused if it exists, unless --force)
  --title TEXT          the new document's title (default: the template's, placeholders filled)
  --set name=value      a value for a template parameter; a number may carry a unit (--set rate=8L/s)
  --data slot=path      the CSV file for a data slot declared in the template's header
  --force               overwrite FILE (and a different file of the same name under data/)
  --help                show this help

Exit codes: 0 written; 2 usage or input error, or a required parameter not given (nothing written).`;

async function exists(path: string): Promise<boolean> {
  try {
    await stat(path);
    return true;
  } catch {
    return false;
  }
}

interface Binding {
  slot: DataSlot;
  source: string;
}

function parseBindings(words: readonly string[], template: LoadedDocument, cwd: string): Binding[] {
  const slots = template.document.header.dataSlots ?? [];
  const pos = template.document.layout?.headerPositions ?? {};
  const slotsAt: Position = pos["dataSlots"] ?? { line: 1, column: 1 };
  return words.map((word) => {
    const eq = word.indexOf("=");
    if (eq <= 0 || eq === word.length - 1) throw new UsageError(`--data needs slot=path (for example --data obs=ob2.csv), got ${JSON.stringify(word)}`, "new");
    const name = word.slice(0, eq);
    const slot = slots.find((s) => s.name === name);
    if (!slot) {
      throw new InputError(
        `${place(template.shown, slotsAt.line, slotsAt.column)}: --data ${name}: the template has no data slot named "${name}"; ${slots.length ? `its slots are ${slots.map((s) => s.name).join(", ")}` : "it declares no data slots"}`,
      );
    }
    return { slot, source: resolve(cwd, word.slice(eq + 1)) };
  });
}

/** The first line of a CSV file, split at its separator (the most frequent of , ; tab). */
function headerColumns(text: string): string[] {
  const first = text.slice(0, text.search(/\r|\n|$/)).replace(/^\uFEFF/, "");
  const sepChar = [",", ";", "\t"].reduce((best, c) => (first.split(c).length > first.split(best).length ? c : best), ",");
  return first.split(sepChar).map((c) => c.trim().replace(/^"(.*)"$/, "$1"));
}

/** `value` with `fill` applied to every string in it (objects and arrays copied, other values kept). */
function fillStrings<T>(value: T, fill: (text: string) => string): T {
  if (typeof value === "string") return fill(value) as T;
  if (Array.isArray(value)) return value.map((v) => fillStrings(v, fill)) as T;
  if (value !== null && typeof value === "object") {
    return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, fillStrings(v, fill)])) as T;
  }
  return value;
}

/** `base`, or `base-2`, `base-3`, ... when a cell already has that id. */
function uniqueId(cells: readonly Cell[], base: string): string {
  const ids = new Set(cells.map((c) => c.id));
  if (!ids.has(base)) return base;
  let k = 2;
  while (ids.has(`${base}-${k}`)) k++;
  return `${base}-${k}`;
}

/** Runs the command; returns the exit code. */
export async function newCommand(argv: readonly string[], io: Io): Promise<number> {
  const args = parseArgs(argv, NEW_OPTIONS, "new");
  const templateFile = onePositional(args, "a TEMPLATE document", "new");
  const outFile = args.values.get("output");
  if (!outFile) throw new UsageError("`conebook new` needs -o FILE, the document to write", "new");
  const settings = parseSettings(args.lists.get("set") ?? [], "new");
  const force = args.flags.has("force");

  const template = await loadDocument(templateFile, io.cwd);
  const outPath = resolve(io.cwd, outFile);
  const outShown = shownPath(outPath, io.cwd);
  if (outPath === template.path) throw new InputError(`${outShown} is the template itself; give another -o FILE`);
  if (!force && (await exists(outPath))) throw new InputError(`${outShown} already exists; choose another -o FILE or add --force to overwrite it`);
  const outFolder = dirname(outPath);
  if (!(await exists(outFolder))) throw new InputError(`${shownPath(outFolder, io.cwd)}: no such folder for -o ${outFile}; create it first`);

  checkParameterUnits(template.document, template.shown);
  const applied = applySettings(template.document, template.shown, settings, false);
  const bindings = parseBindings(args.lists.get("data") ?? [], template, io.cwd);
  const pos = template.document.layout?.headerPositions ?? {};
  const slotAt = (slot: DataSlot): Position => {
    const i = (template.document.header.dataSlots ?? []).indexOf(slot);
    return pos[`dataSlots.${i}.name`] ?? pos["dataSlots"] ?? { line: 1, column: 1 };
  };

  const given = new Set(settings.map((s) => s.name));
  const paramAt = (i: number): Position => pos[`parameters.${i}.value`] ?? pos["parameters"] ?? { line: 1, column: 1 };
  const missing = template.document.header.parameters
    .map((p, i) => ({ p, i }))
    .filter(({ p }) => p.required === true && !given.has(p.name));
  if (missing.length > 0) {
    throw new InputError(
      missing
        .map(({ p, i }) => {
          const at = paramAt(i);
          return `${place(template.shown, at.line, at.column)}: parameter "${p.name}"${p.unit ? ` (${p.unit})` : ""} must be given: the template's ${JSON.stringify(p.value)} is its demonstration value; add --set ${p.name}=VALUE`;
        })
        .join("\n"),
    );
  }
  const kept: string[] = [];
  applied.parameters.forEach((p, i) => {
    if (given.has(p.name)) return;
    const at = paramAt(i);
    const shown = `${p.value}${p.unit ? ` ${p.unit}` : ""}`;
    io.err(`${place(template.shown, at.line, at.column)}: warning: parameter "${p.name}" keeps the template's value ${shown}; give --set ${p.name}=VALUE if that is not your test's`);
    kept.push(`parameter \`${p.name}\` keeps the template's value ${shown}`);
  });
  const values = new Map(applied.parameters.map((p) => [p.name, `${p.value}${typeof p.value === "number" && p.unit ? ` ${p.unit}` : ""}`]));
  const fill = (text: string): string => text.replace(/\{\{\s*([A-Za-z_][A-Za-z0-9_]*)\s*\}\}/g, (whole, name: string) => values.get(name) ?? whole);
  const titleOption = args.values.get("title");
  const title = titleOption ?? fill(template.document.header.title);
  if (titleOption === undefined) kept.push(`the title is the template's (${JSON.stringify(title)}); change it in the header or give --title`);

  const cells: Cell[] = template.document.cells
    .filter((c) => !(c.kind === "narrative" && c.id.startsWith("template-")))
    .map((c) => (c.kind === "narrative" ? { ...c, source: fill(c.source), outputs: [] } : { ...c, outputs: [] }));
  const copies: { from: string; to: string }[] = [];
  const bound: string[] = [];
  for (const b of bindings) {
    const at = slotAt(b.slot);
    const where = place(template.shown, at.line, at.column);
    const index = cells.findIndex((c) => c.kind === "data" && c.name === b.slot.name);
    if (index < 0) throw new InputError(`${where}: data slot "${b.slot.name}" has no data cell named "${b.slot.name}" in the template; add one (\`\`\`csv data:ID name=${b.slot.name})`);
    let bytes: Uint8Array;
    try {
      bytes = new Uint8Array(await readFile(b.source));
    } catch (e) {
      throw new InputError(`--data ${b.slot.name}=${shownPath(b.source, io.cwd)}: cannot read the file (${(e as NodeJS.ErrnoException).code ?? (e as Error).message}); check the path`);
    }
    const columns = headerColumns(new TextDecoder("utf-8").decode(bytes));
    const missing = (b.slot.columns ?? []).filter((c) => !columns.includes(c.name));
    if (missing.length > 0) {
      throw new InputError(
        `${where}: --data ${b.slot.name}=${shownPath(b.source, io.cwd)}: data slot "${b.slot.name}" needs the column${missing.length === 1 ? "" : "s"} ` +
          `${missing.map((c) => `${c.name}${c.unit ? ` (${c.unit})` : ""}`).join(", ")}, but the file's header line has ${columns.join(", ")}`,
      );
    }
    const sha256 = nodeSha256(bytes);
    const inPlace = relative(outFolder, b.source).split(sep).join("/");
    let path = inPlace;
    if (!isSafeRelativePath(inPlace)) {
      path = `data/${basename(b.source)}`;
      const target = resolve(outFolder, path);
      if (await exists(target)) {
        const current = nodeSha256(new Uint8Array(await readFile(target)));
        if (current !== sha256 && !force) {
          throw new InputError(`${shownPath(target, io.cwd)} already exists with other contents; remove it, rename the data file, or add --force`);
        }
      }
      copies.push({ from: b.source, to: target });
    }
    const cell = cells[index] as DataCell;
    cells[index] = { ...cell, source: "", file: { path, sha256 } };
    bound.push(`${b.slot.name} -> ${path} (sha256 ${sha256.slice(0, 12)}…)`);
  }
  for (const slot of template.document.header.dataSlots ?? []) {
    if (bindings.some((b) => b.slot === slot)) continue;
    const cell = cells.find((c): c is DataCell => c.kind === "data" && c.name === slot.name);
    const at = slotAt(slot);
    if (!cell || cell.file) {
      throw new InputError(`${place(template.shown, at.line, at.column)}: data slot "${slot.name}" needs a file; add --data ${slot.name}=PATH`);
    }
    io.err(`${place(template.shown, cellLine(cell))}: warning: data slot "${slot.name}" keeps the template's inline rows (its demonstration data); give --data ${slot.name}=PATH to use your own`);
    kept.push(`data slot \`${slot.name}\` keeps the template's inline rows (its demonstration data)`);
  }
  const { libraryVersion: _recorded, ...header } = template.document.header;
  const testInformation = header.testInformation === undefined ? undefined : fillStrings(header.testInformation, fill);
  if (testInformation !== undefined) {
    kept.push("the test information in the header (dates, wells with distances and screens, rates, analyst, reviewer) is the template's, with its placeholders filled; replace it with this test's");
    io.err(`${place(template.shown, (pos["testInformation"] ?? { line: 1 }).line)}: warning: the test information in the header is the template's; replace it with this test's`);
  }
  if (kept.length > 0) {
    const note: Cell = {
      kind: "narrative",
      id: uniqueId(cells, "author-notes"),
      source: [`> **For the author** (from \`conebook new\` with the template ${template.shown}): check these, then delete this note.`, ">", ...kept.map((k) => `> - ${k}`)].join("\n"),
      sourceStart: { line: 1, column: 1 },
      outputs: [],
    };
    cells.unshift(note);
  }

  const doc: ConebookDocument = {
    ...template.document,
    header: { ...header, title, parameters: applied.parameters, ...(testInformation === undefined ? {} : { testInformation }) },
    cells,
  };
  const problems = validateDocument(doc, { file: outShown }).filter((d) => d.severity === "error");
  if (problems.length > 0) throw new InputError(problems.map((d) => `${place(outShown, d.line, d.column)}: ${d.message}`).join("\n"));
  let text: string;
  try {
    text = serializeDocument(doc);
  } catch (e) {
    if (e instanceof DocumentError) throw new InputError(`${outShown} was not written: ${e.message}`);
    throw e;
  }
  for (const c of copies) {
    await mkdir(dirname(c.to), { recursive: true });
    await writeFileAtomic(c.to, new Uint8Array(await readFile(c.from)));
  }
  await writeFileAtomic(outPath, text);
  const list = applied.parameters.map((p) => `${p.name}=${p.value}${p.unit ? ` ${p.unit}` : ""}`);
  io.out(`wrote ${outShown} from ${template.shown}${list.length ? `; parameters ${list.join(", ")}` : ""}${bound.length ? `; data ${bound.join(", ")}` : ""}`);
  return EXIT.ok;
}
