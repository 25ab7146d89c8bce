import { readFileSync } from "node:fs";

/** The complete example document of docs/format.md (the block fenced with ````markdown). */
export function formatDocExample(): string {
  const doc = readFileSync(new URL("../../../docs/format.md", import.meta.url), "utf8");
  const m = /^````markdown\n([\s\S]*?\n)````$/m.exec(doc);
  if (!m) throw new Error("docs/format.md has no ````markdown example block");
  return m[1]!;
}

/** Joins lines with LF and a final LF. */
export const lines = (...ls: string[]): string => ls.join("\n") + "\n";

export const HEADER = ["---", "conebook: 1", "title: Step test at PW-4", "seed: 11", "---"];
