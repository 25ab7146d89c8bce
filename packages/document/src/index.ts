/**
 * @conebook/document: the plain-text Conebook document format. Parse and serialize (lossless), validation with
 * line:column, SHA-256 pins for data files, narrative rendering, JSON Schemas. No execution, no Node APIs.
 */

export type {
  Cell,
  CellKind,
  CellOrigin,
  CellOutput,
  CellOutputType,
  ChartCell,
  CodeCell,
  ConebookDocument,
  DataCell,
  DataSlot,
  Diagnostic,
  DocumentHeader,
  DocumentLayout,
  NarrativeCell,
  Position,
  Severity,
  TemplateParameter,
} from "./types.js";
export { parseDocument } from "./parse.js";
export { cellStartInside } from "./cell-start.js";
export type { ParseOptions, ParseResult } from "./parse.js";
export { serializeDocument } from "./serialize.js";
export type { SerializeOptions } from "./serialize.js";
export { withOutputs } from "./with-outputs.js";
export type { WithOutputsOptions } from "./with-outputs.js";
export { validateDocument, CELL_ID_PATTERN, DATA_NAME_PATTERN, SHA256_PATTERN, isSafeRelativePath } from "./validate.js";
export type { ValidateOptions } from "./validate.js";
export { DocumentError, formatDiagnostic } from "./errors.js";
export { messages } from "./messages.js";
export { RESERVED_NAMES, isReservedName, reservedNameReason } from "./names.js";
export { renderNarrative } from "./render.js";
export {
  TEMPLATE_INFO_KEYS,
  TemplateInputError,
  checkTemplateUnits,
  csvHeaderColumns,
  documentFromTemplate,
  readTemplateSetting,
  settingNumber,
  templateSlot,
  withParameterValue,
} from "./from-template.js";
export type { TemplateData, TemplateInfo, TemplateInput, TemplateOutcome, TemplateSetting } from "./from-template.js";
export { REVIEW_ENTRY_KINDS, isReviewNote, readReviewThread, reviewMarker, reviewNotes, writeReviewThread } from "./review-notes.js";
export type { ReviewEntry, ReviewEntryKind, ReviewMark, ReviewNote, ReviewStatus } from "./review-notes.js";
export { sha256Hex, utf8Bytes } from "./sha256.js";
export { decodeUtf8, decodeUtf8Strict, describeUtf8Problem, utf8Problem, type Utf8Problem } from "./utf8.js";
export { FORMAT_VERSION, HEADER_KEYS } from "./header.js";
export { DEFAULT_CELL_TIME_LIMIT_MS, MAX_CELL_TIME_LIMIT_MS, DEFAULT_MEMORY_LIMIT_MB, MAX_MEMORY_LIMIT_MB } from "./limits.js";
export { headerSchema, chartSpecSchema } from "./schema.js";
export { validateJsonSchema } from "./json-schema.js";
export type { JsonSchema, SchemaProblem } from "./json-schema.js";
export { readOutputs, writeOutputs, outputShapeProblem } from "./outputs.js";
export { readTestInformation, testInformationSchema, testDateValue } from "./test-information.js";
export type { TestInformation, TestWell, RateStep } from "./test-information.js";
export {
  DEFAULT_SIGNIFICANT_DIGITS,
  MINUS,
  ROUNDING_RULE_TEXT,
  formatAtPlace,
  formatPlain,
  formatQuantity,
  formatWithUncertainty,
  isDimensionless,
  typesetUnit,
  uncertaintyPlace,
} from "./number-text.js";
export type { RoundedEstimate } from "./number-text.js";
export { estimateColumns, rowUncertainty, unconstrainedReason } from "./estimate-columns.js";
export type { EstimateColumns } from "./estimate-columns.js";
export { codeRanges, findReferences, positionInSource, readReference, referenceText, resolveReference } from "./references.js";
export type { FoundReference, NarrativeReference, ResolvedReference } from "./references.js";
export { computedNumbers, matchesComputed, narrativeNumbers, numberIndex, numbersInText, unmatchedNumbers } from "./narrative-numbers.js";
export type { NarrativeNumber } from "./narrative-numbers.js";
export type { ReferenceRendering, RenderNarrativeOptions } from "./render.js";
