/**
 * The catalogue of every diagnostic the document package reports. Code and tests both use these builders,
 * so the wording and the assertions cannot drift apart. Each message says what is wrong and what would fix it.
 */

import { reservedNameReason } from "./names.js";

const q = (s: string): string => JSON.stringify(s);

export const messages = {
  headerMissing: () => ({
    code: "header-missing",
    message: "a Conebook document starts with a YAML header between two '---' lines; add '---', 'conebook: 1', 'title: ...', 'seed: 1' and '---' at the top",
  }),
  headerUnclosed: () => ({
    code: "header-unclosed",
    message: "the header opened by '---' on line 1 is never closed; add a line '---' after the last header line",
  }),
  headerYaml: (detail: string) => ({ code: "header-yaml", message: `the header is not valid YAML: ${detail}` }),
  yamlPassedOver: (where: "header" | "chart specification", detail: string) => ({
    code: "yaml-passed-over",
    message: `the ${where} is read, but its YAML ${detail.startsWith("a ") ? "has " : "has a problem: "}${detail}; write it in plain YAML (text keys, no custom tags or directives) so that it reads as meant`,
  }),
  headerAlias: (name: string) => ({
    code: "header-alias",
    message: `the header uses the YAML alias *${name}; Conebook headers allow no aliases (a chain of them can make a few lines expand to billions of values). Write the value out in full`,
  }),
  headerTooDeep: (max: number) => ({
    code: "header-too-deep",
    message: `the header nests lists and mappings more than ${max} levels deep here; a Conebook header needs a few levels, so flatten the value`,
  }),
  headerNotMapping: () => ({
    code: "header-not-mapping",
    message: "the header must be a YAML mapping of keys to values (for example 'title: Pumping test')",
  }),
  headerType: (key: string, expected: string) => ({
    code: "header-type",
    message: `header key ${q(key)} must be ${expected}; fix the value`,
  }),
  headerRequired: (key: string, example: string) => ({
    code: "header-required",
    message: `header key ${q(key)} is missing; add a line like '${example}'`,
  }),
  formatTooNew: (version: number, supported: number) => ({
    code: "format-too-new",
    message: `this document uses format version ${version}, newer than the supported ${supported}; open it with a newer Conebook`,
  }),
  limitTooLarge: (key: string, value: number, cap: number) => ({
    code: "limit-too-large",
    message: `${key} ${value} exceeds the cap of ${cap}; lower it to at most ${cap}`,
  }),
  parameterOutOfRange: (name: string, value: number, min: number, max: number) => ({
    code: "parameter-out-of-range",
    message: `template parameter ${q(name)} has value ${value} outside its range [${min}, ${max}]; change the value or widen the range`,
  }),
  parameterRangeInverted: (name: string) => ({
    code: "parameter-range-inverted",
    message: `template parameter ${q(name)} has a range whose minimum exceeds its maximum; write it as [min, max]`,
  }),
  nameReserved: (what: string, name: string) => ({
    code: "name-reserved",
    message: `${what} ${reservedNameReason(name)}`,
  }),
  parameterDuplicate: (name: string) => ({
    code: "parameter-duplicate",
    message: `template parameter ${q(name)} is declared twice; rename or remove one`,
  }),
  fenceUnclosed: (fence: string) => ({
    code: "fence-unclosed",
    message: `this code fence is never closed, so it runs to the end of the file; add a line ${q(fence)} where the block should end`,
  }),
  fenceSwallowsCell: (fence: string, line: number, text: string) => ({
    code: "fence-swallows-cell",
    message: `this code fence is not closed before line ${line}, which starts another cell (${text}); that cell is read as part of this one. Add a line ${q(fence)} before line ${line}`,
  }),
  cellLanguage: (kind: string, lang: string, allowed: string) => ({
    code: "cell-language",
    message: `a ${kind} cell cannot be written in ${q(lang)}; use ${allowed}. The block is kept as ordinary Markdown`,
  }),
  attributeSyntax: (detail: string) => ({
    code: "attribute-syntax",
    message: `cell attributes could not be read: ${detail}; write them as key=value or key="value with spaces"`,
  }),
  attributeUnknown: (key: string, kind: string) => ({
    code: "attribute-unknown",
    message: `attribute ${q(key)} is not known on ${kind} cells; it is kept as written but ignored`,
  }),
  idAssigned: (id: string) => ({
    code: "id-assigned",
    message: `this cell has no id, so it was given the id ${q(id)}; saving the document writes it into the file`,
  }),
  idMalformed: (id: string) => ({
    code: "id-malformed",
    message: `cell id ${q(id)} is not well formed; use a letter followed by letters, digits, '-' or '_' (at most 64 characters)`,
  }),
  idDuplicate: (id: string, line: number) => ({
    code: "id-duplicate",
    message: `cell id ${q(id)} is already used by the cell on line ${line}; give one of them another id`,
  }),
  outputsOrphan: (id: string) => ({
    code: "outputs-orphan",
    message: `this outputs block for ${q(id)} does not directly follow cell ${q(id)}; it is kept as ordinary Markdown and ignored. Move it right after its cell or delete it`,
  }),
  outputsJson: (id: string, detail: string) => ({
    code: "outputs-json",
    message: `the recorded outputs of cell ${q(id)} are not valid JSON (${detail}); the block is kept as written, as ordinary text, and ignored. Rerun with --write to record fresh outputs after the cell, then delete the old block`,
  }),
  outputsShape: (detail: string) => ({
    code: "outputs-shape",
    message: `a recorded output is malformed: ${detail}; rerun the document to record it again`,
  }),
  outputsOnNarrative: (id: string) => ({
    code: "outputs-on-narrative",
    message: `narrative cell ${q(id)} carries outputs, which are never written; remove them`,
  }),
  chartSyntax: (format: string, detail: string) => ({
    code: "chart-syntax",
    message: `the chart specification is not valid ${format}: ${detail}`,
  }),
  chartNotObject: () => ({
    code: "chart-not-object",
    message: "a chart specification must be a JSON/YAML object (a Vega-Lite spec such as {\"mark\": \"point\", ...})",
  }),
  chartSchema: (detail: string) => ({ code: "chart-schema", message: `the chart specification ${detail}` }),
  dataName: (name: string) => ({
    code: "data-name",
    message: `data set name ${q(name)} is not well formed; use a letter followed by letters, digits or '_'`,
  }),
  dataNameDuplicate: (name: string, line: number) => ({
    code: "data-name-duplicate",
    message: `data set name ${q(name)} is already used by the data cell on line ${line}; rename one of them`,
  }),
  dataFileIncomplete: () => ({
    code: "data-file-incomplete",
    message: "a data cell that refers to a file needs both file=PATH and sha256=HEX (the 64-digit SHA-256 of the file's bytes)",
  }),
  dataSha: (sha: string) => ({
    code: "data-sha",
    message: `sha256 ${q(sha)} is not 64 lowercase hexadecimal digits; write the SHA-256 of the file's bytes`,
  }),
  dataPath: (path: string) => ({
    code: "data-path",
    message: `data file path ${q(path)} must be relative to the document, use '/' and stay beside it (no '..', no leading '/')`,
  }),
  dataFileAndInline: () => ({
    code: "data-file-and-inline",
    message: "this data cell refers to a file and also has inline rows; the inline rows are ignored, so delete them",
  }),
  narrativeUnsafe: (id: string, detail: string) => ({
    code: "narrative-unsafe",
    message: `narrative cell ${q(id)} would not read back as written: ${detail}`,
  }),
  attributeLineBreak: (key: string, id: string) => ({
    code: "attribute-line-break",
    message: `attribute ${q(key)} of cell ${q(id)} contains a line break; attribute values must fit on the fence line, so remove it`,
  }),
  outputsUnknownCell: (id: string) => ({
    code: "outputs-unknown-cell",
    message: `outputs were given for cell ${q(id)}, but no cell has that id; check the ids the run used`,
  }),
  outputsForNarrative: (id: string) => ({
    code: "outputs-for-narrative",
    message: `outputs were given for narrative cell ${q(id)}; only code, data and chart cells record outputs`,
  }),
  reviewMarkerUnread: () => ({
    code: "review-marker-unread",
    message: 'this line starts like a review note\'s marker but does not read as one, so it is kept as ordinary Markdown; write it as [review:ID]: # "on CELL, open" (or resolved)',
  }),
  reviewTargetMissing: (id: string, on: string) => ({
    code: "review-target-missing",
    message: `review note ${q(id)} is on cell ${q(on)}, but no cell has that id; change "on ${on}" to the cell the note concerns, or delete the note`,
  }),
  codeLanguageModel: (id: string, lang: string) => ({
    code: "code-language",
    message: `code cell ${q(id)} has language ${q(lang)}; only "ts" is supported`,
  }),
} as const;

export type MessageCode = ReturnType<(typeof messages)[keyof typeof messages]>["code"];
