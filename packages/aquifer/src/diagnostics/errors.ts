/** Thrown when a diagnostic cannot be computed from the data given; the message says what would fix it. */
export class DiagnosticError extends Error {
  override readonly name = "DiagnosticError";
}
