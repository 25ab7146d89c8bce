/**
 * @conebook/viewer: the workbench page. The page itself is built by Vite from index.html and src/main.ts; this
 * entry re-exports the DOM-free document model that the page's features build on (and that tests use in Node).
 */
export { applyTransaction, deleteCell, indexOfCell, insertCell, moveCell, replaceCell, TransactionError, type Applied, type CellSplice, type Transaction, type UserEvent } from "./model/transaction.js";
export { DocumentStore, MERGE_EDITS_MS, sameDocument, type StoreListener } from "./model/store.js";
export { CELL_KINDS, changeKind, freshId, newCell, readChartSource, withSource, type SpecReading } from "./model/cells.js";
export { currentPrefix, executablesOf, isExecutable, recordable, shownResults, startRun, withProgress, withResult, withStop, type CellRunStatus, type RunMode, type RunRecord, type ShownResult } from "./model/runs.js";
export { AQUIFER_VERSION, outputsToRecord, textToSave, type SaveText } from "./model/recording.js";
export { recordedRunSettings } from "./model/run-overrides.js";
export { outlineOf, type OutlineEntry } from "./model/outline.js";
export { lineDiff, type DiffLine } from "./model/line-diff.js";
export { THIN_LIMIT, thinRows, thinSpec, type ThinNote } from "./model/thin.js";
export { dropRecovery, keepRecovery, readRecovery, type KeyValueStorage, type RecoveryCopy } from "./model/recovery.js";
export { apiCatalogue, bridgeEntries, guestDisplayEntries, modelEntries, type ApiEntry } from "./model/api-catalogue.js";
