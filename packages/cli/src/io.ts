/** What a command may touch besides files: its output streams and working folder. */
export interface Io {
  /** Writes text to standard output (the command adds line endings). */
  out(text: string): void;
  /** Writes text to standard error. */
  err(text: string): void;
  /** Folder relative paths are resolved against. */
  cwd: string;
  /** True when standard error is a terminal (progress lines are shown only then). */
  progress: boolean;
}
