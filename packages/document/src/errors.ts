import type { Diagnostic, Position, Severity } from "./types.js";

/** Formats a diagnostic as `file:line:column: severity: message`, the form editors and terminals link. */
export function formatDiagnostic(d: Diagnostic): string {
  return `${d.file ?? "<document>"}:${d.line}:${d.column}: ${d.severity}: ${d.message}`;
}

/** Builds a diagnostic from a catalogue entry (messages.ts) and a position. */
export function diagnostic(
  severity: Severity,
  entry: { code: string; message: string },
  at: Position,
  file?: string,
  cellId?: string,
): Diagnostic {
  const d: Diagnostic = { severity, code: entry.code, message: entry.message, line: at.line, column: at.column };
  if (file !== undefined) d.file = file;
  if (cellId !== undefined) d.cellId = cellId;
  return d;
}

/**
 * A problem that stops a document from being read or written at all (for example a header that is not YAML).
 * The message carries `file:line:column` and says what would fix it; the fields repeat them for programs.
 */
export class DocumentError extends Error {
  override readonly name = "DocumentError";
  readonly code: string;
  readonly file: string | undefined;
  readonly line: number;
  readonly column: number;

  constructor(entry: { code: string; message: string }, at: Position, file?: string) {
    super(`${file ?? "<document>"}:${at.line}:${at.column}: ${entry.message}`);
    this.code = entry.code;
    this.file = file;
    this.line = at.line;
    this.column = at.column;
  }
}
