/**
 * `conebook new TEMPLATE -o FILE [--set name=value ...] [--data slot=path ...] [--force]`: a new document from a
 * template, with header parameters filled (type, unit and range checked), data slots bound to files pinned by
 * SHA-256, and every recorded output cleared.
 */
import { mkdir, readFile, stat } from "node:fs/promises";
import { basename, dirname, relative, resolve, sep } from "node:path";
import { TemplateInputError, documentFromTemplate, isSafeRelativePath, templateSlot, type TemplateData } from "@conebook/document";
import { onePositional, parseArgs, type OptionSpec } from "../args.js";
import { writeFileAtomic } from "../atomic-write.js";
import { EXIT, InputError, UsageError } from "../errors.js";
import type { Io } from "../io.js";
import { loadDocument, nodeSha256, shownPath } from "../load.js";
import { parseSettings } from "../settings.js";

export const NEW_OPTIONS: readonly OptionSpec[] = [
  { name: "output", alias: "o", kind: "value" },
  { name: "set", kind: "list" },
  { name: "data", kind: "list" },
  { name: "info", kind: "list" },
  { name: "force", kind: "flag" },
  { name: "title", kind: "value" },
];

export const NEW_HELP = `Usage: conebook new TEMPLATE -o FILE [--title TEXT] [--set name=value ...] [--data slot=path ...] [--info key=text ...] [--force]

Writes a new document FILE from the document TEMPLATE: header parameters take the values given with --set
(checked against their type, unit and range), each data slot is bound to a CSV file given with --data, and all
recorded outputs are cleared. A data file inside FILE's folder is referred to where it is; any other is copied
to data/NAME beside FILE. Either way it is pinned by its SHA-256.

A parameter the template marks required (its value is only the demonstration's) must be given with --set;
every other value kept from the template is named on standard error and in a note at the top of FILE.
{{name}} in the title and the narrative becomes the parameter's value; narrative cells whose id starts with
"template-" (the template describing itself and its demonstration data) are left out. The workbench's template
form makes the same document from the same inputs.

Options:
  -o, --output FILE     the document to write (refused if it exists, unless --force)
  --title TEXT          the new document's title (default: the template's, placeholders filled)
  --set name=value      a value for a template parameter; a number may carry a unit (--set rate=8L/s)
  --data slot=path      the CSV file for a data slot declared in the template's header
  --info key=text       a text field of the test information: site, location, purpose, analyst, reviewer,
                        datum, notes, started, ended, wells.N.name or wells.N.notes (--info analyst="A. Name")
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

/** `key=text` words of --info, by key. */
function parseInfo(words: readonly string[]): Record<string, string> {
  const out: Record<string, string> = {};
  for (const word of words) {
    const eq = word.indexOf("=");
    if (eq <= 0) throw new UsageError(`--info needs key=text (for example --info analyst="A. Name"), got ${JSON.stringify(word)}`, "new");
    const key = word.slice(0, eq).trim();
    if (Object.hasOwn(out, key)) throw new UsageError(`--info ${key} is given twice; give each key once`, "new");
    out[key] = word.slice(eq + 1);
  }
  return out;
}

/** Runs the command; returns the exit code. */
export async function newCommand(argv: readonly string[], io: Io): Promise<number> {
  const args = parseArgs(argv, NEW_OPTIONS, "new");
  const templateFile = onePositional(args, "a TEMPLATE document", "new");
  const outFile = args.values.get("output");
  if (!outFile) throw new UsageError("`conebook new` needs -o FILE, the document to write", "new");
  const settings = parseSettings(args.lists.get("set") ?? [], "new");
  const info = parseInfo(args.lists.get("info") ?? []);
  const force = args.flags.has("force");

  const template = await loadDocument(templateFile, io.cwd);
  const outPath = resolve(io.cwd, outFile);
  const outShown = shownPath(outPath, io.cwd);
  if (outPath === template.path) throw new InputError(`${outShown} is the template itself; give another -o FILE`);
  if (!force && (await exists(outPath))) throw new InputError(`${outShown} already exists; choose another -o FILE or add --force to overwrite it`);
  const outFolder = dirname(outPath);
  if (!(await exists(outFolder))) throw new InputError(`${shownPath(outFolder, io.cwd)}: no such folder for -o ${outFile}; create it first`);

  const copies: { from: string; to: string }[] = [];
  const data: TemplateData[] = [];
  try {
    for (const word of args.lists.get("data") ?? []) {
      const eq = word.indexOf("=");
      if (eq <= 0 || eq === word.length - 1) throw new UsageError(`--data needs slot=path (for example --data obs=ob2.csv), got ${JSON.stringify(word)}`, "new");
      const slot = templateSlot(template.document, template.shown, word.slice(0, eq));
      const source = resolve(io.cwd, word.slice(eq + 1));
      let bytes: Uint8Array;
      try {
        bytes = new Uint8Array(await readFile(source));
      } catch (e) {
        throw new InputError(`--data ${slot.name}=${shownPath(source, io.cwd)}: cannot read the file (${(e as NodeJS.ErrnoException).code ?? (e as Error).message}); check the path`);
      }
      const inPlace = relative(outFolder, source).split(sep).join("/");
      let path = inPlace;
      if (!isSafeRelativePath(inPlace)) {
        path = `data/${basename(source)}`;
        const target = resolve(outFolder, path);
        if (await exists(target)) {
          const current = nodeSha256(new Uint8Array(await readFile(target)));
          if (current !== nodeSha256(bytes) && !force) {
            throw new InputError(`${shownPath(target, io.cwd)} already exists with other contents; remove it, rename the data file, or add --force`);
          }
        }
        copies.push({ from: source, to: target });
      }
      data.push({ slot: slot.name, path, bytes });
    }
    const title = args.values.get("title");
    const made = documentFromTemplate({ template: template.document, templateShown: template.shown, outShown, settings, ...(title === undefined ? {} : { title }), info, data });
    for (const w of made.warnings) io.err(w);
    for (const c of copies) {
      await mkdir(dirname(c.to), { recursive: true });
      await writeFileAtomic(c.to, new Uint8Array(await readFile(c.from)));
    }
    await writeFileAtomic(outPath, made.text);
    const list = made.parameters.map((p) => `${p.name}=${p.value}${p.unit ? ` ${p.unit}` : ""}`);
    io.out(`wrote ${outShown} from ${template.shown}${list.length ? `; parameters ${list.join(", ")}` : ""}${made.bound.length ? `; data ${made.bound.join(", ")}` : ""}`);
    return EXIT.ok;
  } catch (e) {
    if (e instanceof TemplateInputError) throw new InputError(e.message);
    throw e;
  }
}
