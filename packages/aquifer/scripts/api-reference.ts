/**
 * Generates docs/api-reference.md, the reference of the public API of @conebook/aquifer, from the doc comments
 * of packages/aquifer/src and from the model registry (models/registry.ts), so that neither can drift from the
 * code. Run: `npx tsx packages/aquifer/scripts/api-reference.ts`.
 *
 * Pipeline: createAquiferProgram (a TypeScript Program over src/index.ts, options from the package tsconfig)
 * -> collectApi (exports of the entry module, aliases resolved, each with kind, signatures, doc text, tags,
 * area and place) -> renderApiReference (Markdown, grouped by area, then the registry's models).
 * packages/aquifer/test/api-reference.test.ts regenerates in memory and compares with the committed file, and
 * fails on any exported function, class or variable without a doc comment (listed by collectApi as missingDocs).
 */
import { readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
import ts from "typescript";
import { describeModel, modelIds, type ModelDescription } from "../src/models/registry.js";

/** Root of the repository (three levels above this script). */
export const REPO_ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../../..");
/** The package whose API is documented. */
export const AQUIFER_DIR = path.join(REPO_ROOT, "packages/aquifer");
/** The generated reference, relative to the repository root. */
export const API_REFERENCE_FILE = "docs/api-reference.md";
/** This script, relative to the repository root, as named in the generated file. */
export const API_REFERENCE_SCRIPT = "packages/aquifer/scripts/api-reference.ts";

/** Kinds of exported declarations the reference distinguishes. */
export type ExportKind = "function" | "class" | "const" | "let" | "interface" | "type" | "enum" | "namespace";

/** Kinds that must carry a doc comment (the public values of the library). */
export const KINDS_NEEDING_DOCS: readonly ExportKind[] = ["function", "class", "const", "let"];

/** One JSDoc tag of an export, e.g. { name: "throws", text: "UnitError on a dimension mismatch." }. */
export interface DocTag {
  readonly name: string;
  readonly text: string;
}

/** A public member of an exported class: its declaration as one line and its doc text. */
export interface ClassMember {
  readonly name: string;
  readonly declaration: string;
  readonly doc: string;
  readonly tags: readonly DocTag[];
}

/** One exported name of the entry module, with everything the reference prints about it. */
export interface ApiEntry {
  readonly name: string;
  /** More than one when a value and a type share the name. */
  readonly kinds: readonly ExportKind[];
  /** Folder under src/ of the declaration ("" when declared in src/ itself). */
  readonly area: string;
  /** Declaration file relative to the repository root, with "/" separators. */
  readonly file: string;
  /** 1-based line of the declaration (used in messages; the reference itself omits it to stay stable). */
  readonly line: number;
  /** Code lines describing the declaration: signatures, a const's type, an interface's text. */
  readonly code: readonly string[];
  readonly doc: string;
  readonly tags: readonly DocTag[];
  readonly members: readonly ClassMember[];
}

/** An exported value without a doc comment. */
export interface MissingDoc {
  readonly name: string;
  readonly kind: ExportKind;
  readonly file: string;
  readonly line: number;
}

/** The public API of an entry module, sorted by area order then name. */
export interface CollectedApi {
  readonly entries: readonly ApiEntry[];
  /** Top comment of each area's index.ts, by area. */
  readonly areaIntros: ReadonlyMap<string, string>;
  readonly missingDocs: readonly MissingDoc[];
}

/** Where the entry module and its source tree are. */
export interface ApiLocation {
  /** Absolute path of the entry module (src/index.ts). */
  readonly entryFile: string;
  /** Absolute path of the source root whose first-level folders are the areas. */
  readonly sourceRoot: string;
  /** Absolute path that file names in the output are made relative to. */
  readonly repoRoot: string;
  /**
   * Areas in the order to present them; when absent, the order in which the entry file re-exports them
   * (`export * from "./units/index.js"` ...). Areas not listed follow, alphabetically.
   */
  readonly areaOrder?: readonly string[];
}

/** The location of @conebook/aquifer in this repository. */
export const AQUIFER_LOCATION: ApiLocation = {
  entryFile: path.join(AQUIFER_DIR, "src/index.ts"),
  sourceRoot: path.join(AQUIFER_DIR, "src"),
  repoRoot: REPO_ROOT,
};

/** Signatures longer than this are printed one parameter per line. */
const ONE_LINE_LIMIT = 110;
/** Printed types longer than this fall back to the compiler's truncated form ("{ ...; }"). */
const TYPE_TEXT_LIMIT = 600;
/** Object types of constants may be printed in full up to this length, one member per line. */
const OBJECT_TEXT_LIMIT = 4000;

const FULL_TYPE_FLAGS = ts.TypeFormatFlags.NoTruncation | ts.TypeFormatFlags.UseAliasDefinedOutsideCurrentScope;
const SHORT_TYPE_FLAGS = ts.TypeFormatFlags.UseAliasDefinedOutsideCurrentScope;

/**
 * A Program over packages/aquifer/src/index.ts with the compiler options of packages/aquifer/tsconfig.json.
 * Takes one to two seconds (parsing the library and lib.es2022).
 * @throws Error naming the file when the tsconfig cannot be read.
 */
export function createAquiferProgram(): ts.Program {
  const configPath = path.join(AQUIFER_DIR, "tsconfig.json");
  const read = ts.readConfigFile(configPath, (file) => ts.sys.readFile(file));
  if (read.error) {
    throw new Error(`Cannot read ${configPath}: ${ts.flattenDiagnosticMessageText(read.error.messageText, "\n")}`);
  }
  const parsed = ts.parseJsonConfigFileContent(read.config, ts.sys, AQUIFER_DIR, undefined, configPath);
  return ts.createProgram({ rootNames: [AQUIFER_LOCATION.entryFile], options: parsed.options });
}

/** Path relative to `root`, always with "/" separators so output is the same on every platform. */
function relativePath(root: string, file: string): string {
  return path.relative(root, file).split(path.sep).join("/");
}

/** Collapses runs of whitespace to one space. */
function oneLine(text: string): string {
  return text.replace(/\s+/g, " ").trim();
}

/** Text of a JSDoc tag, e.g. "x the argument" for `@param x the argument`. */
function tagText(tag: ts.JSDocTagInfo): string {
  return oneLine(ts.displayPartsToString(tag.text ?? []));
}

/** The documentation text and tags of a symbol; docs of every declaration are merged by the compiler. */
function docOf(symbol: ts.Symbol, checker: ts.TypeChecker): { doc: string; tags: DocTag[] } {
  const doc = ts.displayPartsToString(symbol.getDocumentationComment(checker)).trim();
  const tags = symbol.getJsDocTags(checker).map((tag) => ({ name: tag.name, text: tagText(tag) }));
  return { doc, tags };
}

/** The kinds of a resolved symbol, in a fixed order. */
function kindsOf(symbol: ts.Symbol): ExportKind[] {
  const kinds: ExportKind[] = [];
  const flags = symbol.flags;
  if (flags & ts.SymbolFlags.Function) kinds.push("function");
  if (flags & ts.SymbolFlags.Class) kinds.push("class");
  if (flags & ts.SymbolFlags.Variable) {
    const declaration = symbol.declarations?.find(ts.isVariableDeclaration);
    const isConst = declaration !== undefined && (ts.getCombinedNodeFlags(declaration) & ts.NodeFlags.Const) !== 0;
    kinds.push(isConst ? "const" : "let");
  }
  if (flags & ts.SymbolFlags.Interface) kinds.push("interface");
  if (flags & ts.SymbolFlags.TypeAlias) kinds.push("type");
  if (flags & ts.SymbolFlags.Enum) kinds.push("enum");
  if (flags & ts.SymbolFlags.Module) kinds.push("namespace");
  return kinds;
}

/** Index just past the bracket that closes the one at `open`, skipping string literals. */
function closingBracket(text: string, open: number): number {
  let depth = 0;
  let quote: string | null = null;
  for (let i = open; i < text.length; i++) {
    const c = text[i]!;
    if (quote !== null) {
      if (c === "\\") i++;
      else if (c === quote) quote = null;
      continue;
    }
    if (c === '"' || c === "'" || c === "`") quote = c;
    else if (c === "(" || c === "[" || c === "{" || c === "<") depth++;
    else if (c === ")" || c === "]" || c === "}" || (c === ">" && text[i - 1] !== "=")) {
      depth--;
      if (depth === 0) return i + 1;
    }
  }
  return text.length;
}

/** Splits a list (without its brackets) at top-level occurrences of `separator` ("," or ";"). */
function splitTopLevel(list: string, separator = ","): string[] {
  const parts: string[] = [];
  let depth = 0;
  let quote: string | null = null;
  let start = 0;
  for (let i = 0; i < list.length; i++) {
    const c = list[i]!;
    if (quote !== null) {
      if (c === "\\") i++;
      else if (c === quote) quote = null;
      continue;
    }
    if (c === '"' || c === "'" || c === "`") quote = c;
    else if (c === "(" || c === "[" || c === "{" || c === "<") depth++;
    else if (c === ")" || c === "]" || c === "}" || (c === ">" && list[i - 1] !== "=")) depth--;
    else if (c === separator && depth === 0) {
      parts.push(list.slice(start, i).trim());
      start = i + 1;
    }
  }
  const last = list.slice(start).trim();
  if (last !== "") parts.push(last);
  return parts;
}

/**
 * `prefix` + signature text, on one line when short, else one parameter per line:
 * "function f(\n  a: number,\n  b: string,\n): number".
 */
function layoutSignature(prefix: string, signature: string): string {
  const oneLineText = `${prefix}${signature}`;
  if (oneLineText.length <= ONE_LINE_LIMIT) return oneLineText;
  const typeParameters = signature.startsWith("<") ? signature.slice(0, closingBracket(signature, 0)) : "";
  const open = typeParameters.length;
  if (signature[open] !== "(") return oneLineText;
  const close = closingBracket(signature, open);
  const parameters = splitTopLevel(signature.slice(open + 1, close - 1));
  if (parameters.length === 0) return oneLineText;
  const body = parameters.map((parameter) => `  ${parameter},`).join("\n");
  return `${prefix}${typeParameters}(\n${body}\n)${signature.slice(close)}`;
}

/** Members of an object type listed one per line; at most this many, then a count of the rest. */
const MAX_LISTED_MEMBERS = 40;

/**
 * An object type's text ("{ a: 1; b: 2; }") one member per line when longer than a line; other text as it is.
 */
function layoutObjectType(text: string): string {
  if (text.length <= ONE_LINE_LIMIT || !text.startsWith("{") || closingBracket(text, 0) !== text.length) return text;
  const members = splitTopLevel(text.slice(1, -1), ";");
  const listed = members.slice(0, MAX_LISTED_MEMBERS).map((member) => `  ${member};`);
  if (members.length > MAX_LISTED_MEMBERS) listed.push(`  // ... ${members.length - MAX_LISTED_MEMBERS} more`);
  return `{\n${listed.join("\n")}\n}`;
}

/** A type as text: in full when readable, else the compiler's truncated form. */
function typeText(checker: ts.TypeChecker, type: ts.Type, enclosing: ts.Node): string {
  const full = checker.typeToString(type, enclosing, FULL_TYPE_FLAGS);
  return full.length <= TYPE_TEXT_LIMIT ? full : checker.typeToString(type, enclosing, SHORT_TYPE_FLAGS);
}

/** The inferred type of a constant: an object type in full, one member per line, unless enormous. */
function constantTypeText(checker: ts.TypeChecker, type: ts.Type, enclosing: ts.Node): string {
  const full = checker.typeToString(type, enclosing, FULL_TYPE_FLAGS);
  if (full.length <= TYPE_TEXT_LIMIT) return layoutObjectType(full);
  if (full.length <= OBJECT_TEXT_LIMIT && full.startsWith("{")) return layoutObjectType(full);
  return checker.typeToString(type, enclosing, SHORT_TYPE_FLAGS);
}

/** A call or construct signature as text, falling back to the truncated form when enormous. */
function signatureText(checker: ts.TypeChecker, signature: ts.Signature, enclosing: ts.Node): string {
  const full = checker.signatureToString(signature, enclosing, FULL_TYPE_FLAGS);
  return full.length <= TYPE_TEXT_LIMIT ? full : checker.signatureToString(signature, enclosing, SHORT_TYPE_FLAGS);
}

/** Source text of a declaration without its `export`/`declare` keywords, comments kept, re-indented. */
function declarationSource(node: ts.Node): string {
  const sourceFile = node.getSourceFile();
  const text = sourceFile.text.slice(node.getStart(sourceFile), node.getEnd());
  const withoutExport = text.replace(/^export\s+(declare\s+)?/, "");
  const column = sourceFile.getLineAndCharacterOfPosition(node.getStart(sourceFile)).character;
  return withoutExport
    .split("\n")
    .map((line, i) => (i === 0 ? line : line.slice(Math.min(column, line.length - line.trimStart().length))))
    .join("\n");
}

/** True for members a user of the class can reach (not private, protected or #private). */
function isPublicMember(member: ts.ClassElement | ts.ParameterDeclaration): boolean {
  if (member.name !== undefined && ts.isPrivateIdentifier(member.name)) return false;
  const flags = ts.getCombinedModifierFlags(member);
  return (flags & (ts.ModifierFlags.Private | ts.ModifierFlags.Protected)) === 0;
}

/**
 * Public members of a class: its construct signatures (inherited ones included, so an error class shows how it
 * is thrown), then properties and methods in source order (parameter properties where the constructor is).
 */
function classMembers(checker: ts.TypeChecker, declaration: ts.ClassDeclaration, className: string): ClassMember[] {
  const members: ClassMember[] = [];
  const classSymbol = checker.getSymbolAtLocation(declaration.name!);
  const constructSignatures = classSymbol
    ? checker.getTypeOfSymbolAtLocation(classSymbol, declaration).getConstructSignatures()
    : [];
  for (const signature of constructSignatures) {
    const text = signatureText(checker, signature, declaration);
    const returnSuffix = `: ${className}`;
    const parameters = text.endsWith(returnSuffix) ? text.slice(0, -returnSuffix.length) : text;
    const line = layoutSignature("constructor", parameters);
    if (members.some((member) => member.declaration === line)) continue;
    members.push({
      name: "constructor",
      declaration: line,
      doc: ts.displayPartsToString(signature.getDocumentationComment(checker)).trim(),
      tags: signature.getJsDocTags().map((tag) => ({ name: tag.name, text: tagText(tag) })),
    });
  }
  for (const member of declaration.members) {
    if (!isPublicMember(member)) continue;
    if (ts.isConstructorDeclaration(member)) {
      for (const parameter of member.parameters) {
        if (!ts.isParameterPropertyDeclaration(parameter, member) || !isPublicMember(parameter)) continue;
        const property = checker.getSymbolAtLocation(parameter.name);
        if (property === undefined) continue;
        const readonly = (ts.getCombinedModifierFlags(parameter) & ts.ModifierFlags.Readonly) !== 0 ? "readonly " : "";
        const type = typeText(checker, checker.getTypeOfSymbolAtLocation(property, parameter), parameter);
        members.push({ name: property.getName(), declaration: `${readonly}${property.getName()}: ${type}`, ...docOf(property, checker) });
      }
      continue;
    }
    if (member.name === undefined) continue;
    const symbol = checker.getSymbolAtLocation(member.name);
    if (symbol === undefined) continue;
    const name = symbol.getName();
    const isStatic = (ts.getCombinedModifierFlags(member) & ts.ModifierFlags.Static) !== 0;
    const prefix = isStatic ? "static " : "";
    let declarationText: string;
    if (ts.isMethodDeclaration(member)) {
      if (member.body === undefined && declaration.members.some((m) => m !== member && m.name?.getText() === name && ts.isMethodDeclaration(m) && m.body)) {
        continue;
      }
      const type = checker.getTypeOfSymbolAtLocation(symbol, member);
      declarationText = type
        .getCallSignatures()
        .map((signature) => layoutSignature(`${prefix}${name}`, signatureText(checker, signature, member)))
        .join("\n");
    } else if (ts.isPropertyDeclaration(member) || ts.isGetAccessorDeclaration(member)) {
      const readonly =
        ts.isGetAccessorDeclaration(member) ||
        (ts.getCombinedModifierFlags(member) & ts.ModifierFlags.Readonly) !== 0
          ? "readonly "
          : "";
      const type = checker.getTypeOfSymbolAtLocation(symbol, member);
      declarationText = `${prefix}${readonly}${name}: ${typeText(checker, type, member)}`;
    } else {
      continue;
    }
    const { doc, tags } = docOf(symbol, checker);
    members.push({ name, declaration: declarationText, doc, tags });
  }
  return members;
}

/** Code lines for one exported symbol of the given kinds. */
function codeOf(checker: ts.TypeChecker, symbol: ts.Symbol, name: string, kinds: readonly ExportKind[]): string[] {
  const code: string[] = [];
  const declarations = symbol.declarations ?? [];
  for (const kind of kinds) {
    if (kind === "function") {
      const declaration = declarations.find(ts.isFunctionDeclaration)!;
      const type = checker.getTypeOfSymbolAtLocation(symbol, declaration);
      for (const signature of type.getCallSignatures()) {
        code.push(layoutSignature(`function ${name}`, signatureText(checker, signature, declaration)));
      }
    } else if (kind === "const" || kind === "let") {
      const declaration = declarations.find(ts.isVariableDeclaration)!;
      const annotated = declaration.type !== undefined ? oneLine(declaration.type.getText()) : undefined;
      const type = annotated ?? constantTypeText(checker, checker.getTypeOfSymbolAtLocation(symbol, declaration), declaration);
      code.push(`${kind} ${name}: ${type}`);
    } else if (kind === "class") {
      const declaration = declarations.find(ts.isClassDeclaration)!;
      const heritage = (declaration.heritageClauses ?? []).map((clause) => oneLine(clause.getText())).join(" ");
      const typeParameters = declaration.typeParameters
        ? `<${declaration.typeParameters.map((p) => oneLine(p.getText())).join(", ")}>`
        : "";
      code.push(`class ${name}${typeParameters}${heritage ? ` ${heritage}` : ""}`);
    } else {
      const declaration = declarations.find(
        (d) =>
          (kind === "interface" && ts.isInterfaceDeclaration(d)) ||
          (kind === "type" && ts.isTypeAliasDeclaration(d)) ||
          (kind === "enum" && ts.isEnumDeclaration(d)) ||
          (kind === "namespace" && ts.isModuleDeclaration(d)),
      );
      if (declaration !== undefined) code.push(declarationSource(declaration));
    }
  }
  return code;
}

/** The text of the first `/** ... *\/` comment of a file, without delimiters and leading asterisks. */
export function topComment(text: string): string {
  const ranges = ts.getLeadingCommentRanges(text, 0) ?? [];
  const first = ranges.find((range) => text.startsWith("/**", range.pos));
  if (first === undefined) return "";
  return text
    .slice(first.pos + 3, first.end - 2)
    .split("\n")
    .map((line) => line.replace(/^\s*\* ?/, "").trimEnd())
    .join("\n")
    .trim();
}

/** Areas in the order the entry file re-exports them: "./units/index.js" gives "units". */
export function reexportOrder(entry: ts.SourceFile): string[] {
  const areas: string[] = [];
  for (const statement of entry.statements) {
    if (!ts.isExportDeclaration(statement) || statement.moduleSpecifier === undefined) continue;
    if (!ts.isStringLiteral(statement.moduleSpecifier)) continue;
    const match = /^\.\/([^/]+)\//.exec(statement.moduleSpecifier.text);
    if (match !== null && !areas.includes(match[1]!)) areas.push(match[1]!);
  }
  return areas;
}

/** Orders names case-insensitively, ties by code unit, so the order is the same in every locale. */
function compareNames(a: string, b: string): number {
  const la = a.toLowerCase();
  const lb = b.toLowerCase();
  if (la !== lb) return la < lb ? -1 : 1;
  return a < b ? -1 : a > b ? 1 : 0;
}

/**
 * The public API of `location.entryFile` in `program`: every export with aliases resolved, sorted by area
 * (folder under the source root, in the order of `areaOrder` or of the entry's re-exports) then name, and the exported
 * functions, classes and variables that have no doc comment.
 * @throws Error when the entry file is not in the program or is not a module.
 */
export function collectApi(program: ts.Program, location: ApiLocation): CollectedApi {
  const checker = program.getTypeChecker();
  const entry = program.getSourceFile(location.entryFile);
  if (entry === undefined) throw new Error(`Entry file ${location.entryFile} is not part of the program.`);
  const moduleSymbol = checker.getSymbolAtLocation(entry);
  if (moduleSymbol === undefined) throw new Error(`Entry file ${location.entryFile} has no exports (not a module).`);

  const entries: ApiEntry[] = [];
  const missingDocs: MissingDoc[] = [];
  for (const exported of checker.getExportsOfModule(moduleSymbol)) {
    const symbol = exported.flags & ts.SymbolFlags.Alias ? checker.getAliasedSymbol(exported) : exported;
    const name = exported.getName();
    const declaration = symbol.declarations?.[0];
    if (declaration === undefined) continue;
    const sourceFile = declaration.getSourceFile();
    const file = relativePath(location.repoRoot, sourceFile.fileName);
    const line = sourceFile.getLineAndCharacterOfPosition(declaration.getStart(sourceFile)).line + 1;
    const withinSource = relativePath(location.sourceRoot, sourceFile.fileName).split("/");
    const area = withinSource.length > 1 ? withinSource[0]! : "";
    const kinds = kindsOf(symbol);
    const { doc, tags } = docOf(symbol, checker);
    const classDeclaration = symbol.declarations?.find(ts.isClassDeclaration);
    const members = classDeclaration ? classMembers(checker, classDeclaration, name) : [];
    entries.push({ name, kinds, area, file, line, code: codeOf(checker, symbol, name, kinds), doc, tags, members });
    if (doc === "") {
      for (const kind of kinds) {
        if (KINDS_NEEDING_DOCS.includes(kind)) missingDocs.push({ name, kind, file, line });
      }
    }
  }

  const areaOrder = location.areaOrder ?? reexportOrder(entry);
  const areaRank = (area: string): number => {
    const rank = areaOrder.indexOf(area);
    return rank === -1 ? areaOrder.length : rank;
  };
  entries.sort((a, b) => areaRank(a.area) - areaRank(b.area) || compareNames(a.area, b.area) || compareNames(a.name, b.name));
  missingDocs.sort((a, b) => compareNames(a.file, b.file) || a.line - b.line || compareNames(a.name, b.name));

  const areaIntros = new Map<string, string>();
  for (const area of new Set(entries.map((e) => e.area))) {
    const index = program.getSourceFile(path.join(location.sourceRoot, area, "index.ts"));
    areaIntros.set(area, index ? topComment(index.text) : "");
  }
  return { entries, areaIntros, missingDocs };
}

/** A missing doc comment as "file:line name (kind)", the form the test prints. */
export function formatMissingDoc(missing: MissingDoc): string {
  return `${missing.file}:${missing.line} ${missing.name} (${missing.kind})`;
}

/** Escapes the characters that would break a Markdown table cell. */
function cell(text: string): string {
  return oneLine(text).replace(/\\/g, "\\\\").replace(/\|/g, "\\|");
}

/** A bound as short text: 1e-7, 0.5, 1e6. */
function formatBound(value: number): string {
  if (!Number.isFinite(value)) return value > 0 ? "∞" : value < 0 ? "−∞" : "NaN";
  const abs = Math.abs(value);
  if (abs !== 0 && (abs < 1e-3 || abs >= 1e4)) return value.toExponential().replace("e+", "e");
  return String(value);
}

/** A parameter's base unit for a table: "dimensionless" for "1". */
function formatUnit(unit: string): string {
  return unit === "1" ? "dimensionless" : unit;
}

/** Markdown anchor GitHub makes from a heading. */
function anchor(heading: string): string {
  return heading
    .toLowerCase()
    .replace(/[^\p{L}\p{N}\s-]/gu, "")
    .trim()
    .replace(/\s/g, "-");
}

/** The tags of an entry as Markdown list items. */
function renderTags(tags: readonly DocTag[]): string[] {
  return tags.map((tag) => `- \`@${tag.name}\`${tag.text ? ` ${tag.text}` : ""}`);
}

/** One export as a Markdown section. */
function renderEntry(entry: ApiEntry): string[] {
  const lines: string[] = [`### \`${entry.name}\``, "", `${entry.kinds.join(", ")} · \`${entry.file}\``, ""];
  const code = [...entry.code];
  if (entry.members.length > 0) {
    code[0] = `${code[0]} {\n${entry.members
      .map((member) =>
        member.declaration
          .split("\n")
          .map((line) => `  ${line}`)
          .join("\n"),
      )
      .join("\n")}\n}`;
  }
  lines.push("```ts", ...code, "```", "");
  lines.push(entry.doc === "" ? "_No doc comment._" : entry.doc, "");
  const tags = renderTags(entry.tags);
  if (tags.length > 0) lines.push(...tags, "");
  const documentedMembers = entry.members.filter((member) => member.doc !== "" || member.tags.length > 0);
  if (documentedMembers.length > 0) {
    for (const member of documentedMembers) {
      const text = [member.doc, ...member.tags.map((tag) => `@${tag.name} ${tag.text}`.trim())].filter((t) => t !== "");
      lines.push(`- \`${member.name}\`: ${oneLine(text.join(" "))}`);
    }
    lines.push("");
  }
  return lines;
}

/** One registry model: citation, parameter table, assumptions, validity and cautions. */
function renderModel(model: ModelDescription): string[] {
  const lines: string[] = [`### \`${model.id}\`: ${model.name}`, "", `Source: ${oneLine(model.source)}`, ""];
  if (model.options.length > 0) {
    lines.push(
      `Bound to geometry: give it as \`{ id: "${model.id}", ...options }\` wherever a model is asked for.`,
      "",
      "| option | base unit | required | default | description |",
      "| --- | --- | --- | --- | --- |",
    );
    for (const o of model.options) {
      lines.push(`| \`${cell(o.name)}\` | ${cell(formatUnit(o.unit))} | ${o.required ? "yes" : "no"} | ${o.default === undefined ? "" : String(o.default)} | ${cell(o.description)} |`);
    }
    lines.push("");
  }
  lines.push("| parameter | name | base unit | bounds | fitted as | description |");
  lines.push("| --- | --- | --- | --- | --- | --- |");
  for (const parameter of model.parameters) {
    const [low, high] = parameter.bounds;
    lines.push(
      `| \`${cell(parameter.name)}\` | ${cell(parameter.label)} | ${cell(formatUnit(parameter.unit))} | ` +
        `${formatBound(low)} to ${formatBound(high)} | ${parameter.positive ? "ln(value)" : "value"} | ` +
        `${cell(parameter.description)} |`,
    );
  }
  lines.push("");
  const list = (title: string, items: readonly string[]): void => {
    lines.push(`${title}:`, "");
    if (items.length === 0) lines.push("- (none stated)");
    for (const item of items) lines.push(`- ${oneLine(item)}`);
    lines.push("");
  };
  list("Assumptions", model.assumptions);
  list("Validity", model.validity);
  list("Cautions", model.cautions);
  return lines;
}

/** Title of an area section: its folder name, or "(root)" for declarations in src/ itself. */
function areaTitle(area: string): string {
  return area === "" ? "(root)" : area;
}

/**
 * The Markdown reference: a generated-file notice, a table of contents, one section per area (its index.ts
 * top comment, then each export), then the registry's models. Deterministic: no dates, no absolute paths,
 * no line numbers, so the text changes only when the API, its docs or the registry change.
 */
export function renderApiReference(api: CollectedApi, registry: readonly ModelDescription[]): string {
  const areas: string[] = [];
  for (const entry of api.entries) if (!areas.includes(entry.area)) areas.push(entry.area);
  const modelsHeading = "Models in the registry";
  const lines: string[] = [
    `<!-- Generated by ${API_REFERENCE_SCRIPT}: do not edit. Rerun \`npx tsx ${API_REFERENCE_SCRIPT}\`. -->`,
    "",
    "# @conebook/aquifer API reference",
    "",
    `Generated from the doc comments of \`packages/aquifer/src\` and from the model registry ` +
      `(\`packages/aquifer/src/models/registry.ts\`) by \`${API_REFERENCE_SCRIPT}\`. Do not edit this file: ` +
      `change the doc comments or the model descriptors, then rerun \`npx tsx ${API_REFERENCE_SCRIPT}\`. ` +
      "`packages/aquifer/test/api-reference.test.ts` fails while this file is out of date.",
    "",
    "Base units of the library: length m, time d, discharge m3/d, transmissivity m2/d, hydraulic conductivity " +
      "m/d, leakance 1/d; storativity and other ratios dimensionless. Signatures are as the compiler prints " +
      "them; very long types are shortened with `...`.",
    "",
    "## Contents",
    "",
  ];
  for (const area of areas) {
    const count = api.entries.filter((entry) => entry.area === area).length;
    lines.push(`- [${areaTitle(area)}](#${anchor(areaTitle(area))}) (${count} exports)`);
  }
  lines.push(`- [${modelsHeading}](#${anchor(modelsHeading)}) (${registry.length} models)`, "");

  for (const area of areas) {
    lines.push(`## ${areaTitle(area)}`, "");
    const intro = api.areaIntros.get(area) ?? "";
    if (intro !== "") lines.push(intro, "");
    for (const entry of api.entries) if (entry.area === area) lines.push(...renderEntry(entry));
  }

  lines.push(
    `## ${modelsHeading}`,
    "",
    "Read from `describeModel(id)` (`packages/aquifer/src/models/registry.ts`), in registry order. Bounds " +
      "are the widest plausible values in base units and the default fitting bounds; a parameter that must be " +
      "positive is fitted as ln(value).",
    "",
  );
  for (const model of registry) lines.push(...renderModel(model));
  return `${lines.join("\n").replace(/\n{3,}/g, "\n\n").trimEnd()}\n`;
}

/** The registered models' descriptors in registry order. */
export function registryDescriptors(): ModelDescription[] {
  return modelIds.map((id) => describeModel(id));
}

/** Builds the program, collects the API and renders the reference: what the script writes. */
export function generateApiReference(): { markdown: string; api: CollectedApi } {
  const api = collectApi(createAquiferProgram(), AQUIFER_LOCATION);
  return { markdown: renderApiReference(api, registryDescriptors()), api };
}

/**
 * Writes docs/api-reference.md, lists exported types without a doc comment, and lists exported values without one
 * on stderr with exit code 1.
 */
function main(): void {
  const { markdown, api } = generateApiReference();
  const output = path.join(REPO_ROOT, API_REFERENCE_FILE);
  let previous: string | undefined;
  try {
    previous = readFileSync(output, "utf8");
  } catch {
    previous = undefined;
  }
  writeFileSync(output, markdown);
  const state = previous === markdown ? "unchanged" : "written";
  console.log(`${API_REFERENCE_FILE} ${state}: ${api.entries.length} exports, ${registryDescriptors().length} models.`);
  const undocumentedTypes = api.entries.filter((e) => e.doc === "" && !e.kinds.some((k) => KINDS_NEEDING_DOCS.includes(k)));
  if (undocumentedTypes.length > 0) {
    console.log(`${undocumentedTypes.length} exported types have no doc comment (shown as such in the reference):`);
    for (const entry of undocumentedTypes) console.log(`  ${entry.file}:${entry.line} ${entry.name} (${entry.kinds.join(", ")})`);
  }
  if (api.missingDocs.length > 0) {
    console.error(`${api.missingDocs.length} exported values have no doc comment:`);
    for (const missing of api.missingDocs) console.error(`  ${formatMissingDoc(missing)}`);
    process.exitCode = 1;
  }
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) main();
