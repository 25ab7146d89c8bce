/**
 * Exit codes and the two kinds of failure a command reports: a usage error (the command line itself is wrong)
 * and an input error (a file or value it names is wrong). Both exit with code 2; their messages carry
 * `file:line:column` where there is a place to point at, and say what would fix the problem.
 */

/** Exit codes of every command. */
export const EXIT = {
  /** The command did what was asked (for verify: everything matched). */
  ok: 0,
  /** A check failed: verify found differences, or a run had a failing cell. */
  checkFailed: 1,
  /** The command line or an input file is wrong; nothing was written. */
  inputError: 2,
} as const;

/** The command line is wrong: an unknown option, a missing argument, a malformed value. */
export class UsageError extends Error {
  override readonly name = "UsageError";
  constructor(
    message: string,
    readonly command?: string,
  ) {
    super(message);
  }
}

/** An input is wrong: a malformed document, a missing data file, a value out of range. */
export class InputError extends Error {
  override readonly name = "InputError";
}

/** `file:line:column` (column omitted when unknown), the place form terminals and editors link. */
export function place(file: string, line: number, column?: number): string {
  return column === undefined ? `${file}:${line}` : `${file}:${line}:${column}`;
}
