/**
 * Where `conebook serve` may read and write: relative paths inside one folder. A path is refused when it is
 * empty, absolute, contains a backslash, a NUL, a `.` or `..` segment, or a segment starting with `.` (hidden
 * files and temporary files), or when the real path of what it names (symbolic links followed) lies outside
 * the folder. Percent-decoding happens once, in the request parser, before these checks: an encoded `%2e%2e`
 * arrives here as `..` and is refused like a typed one.
 */
import { realpath } from "node:fs/promises";
import { dirname, join, relative, sep } from "node:path";

/** A path the server refuses, with the reason shown to the page. */
export class PathRefused extends Error {
  override readonly name = "PathRefused";
}

/** The reason a relative path is refused on its face, or undefined when it is well-formed. */
export function relativePathProblem(path: string): string | undefined {
  if (path === "") return "the path is empty";
  if (path.includes("\0")) return "the path contains a NUL character";
  if (path.includes("\\")) return "the path contains a backslash; use forward slashes";
  if (path.startsWith("/")) return "the path is absolute; give it relative to the served folder";
  for (const segment of path.split("/")) {
    if (segment === "" ) return "the path has an empty segment (a doubled or trailing slash)";
    if (segment === "." || segment === "..") return `the path has a "${segment}" segment; paths may not leave or name the folder itself`;
    if (segment.startsWith(".")) return `the path names a hidden entry ("${segment}")`;
  }
  return undefined;
}

/** True when `inner` is `outer` or lies below it (both absolute, already resolved). */
function inside(outer: string, inner: string): boolean {
  const rel = relative(outer, inner);
  return rel === "" || (!rel.startsWith("..") && !rel.startsWith(sep) && rel !== "..");
}

/**
 * The absolute path of `path` inside `rootReal` (the real path of the served folder), for reading an existing
 * file. Throws PathRefused when the path is malformed or its real path (links followed) leaves the folder;
 * a missing file is reported by the caller's read (ENOENT).
 */
export async function resolveExisting(rootReal: string, path: string): Promise<string> {
  const problem = relativePathProblem(path);
  if (problem) throw new PathRefused(`${JSON.stringify(path)} is refused: ${problem}`);
  const full = join(rootReal, ...path.split("/"));
  let real: string;
  try {
    real = await realpath(full);
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === "ENOENT") return checkParent(rootReal, full, path);
    throw e;
  }
  if (!inside(rootReal, real)) throw new PathRefused(`${JSON.stringify(path)} is refused: it leads outside the served folder (through a symbolic link)`);
  return real;
}

/** For a file that does not exist yet: its folder's real path must lie inside the root. */
async function checkParent(rootReal: string, full: string, path: string): Promise<string> {
  let parent: string;
  try {
    parent = await realpath(dirname(full));
  } catch {
    return full;
  }
  if (!inside(rootReal, parent)) throw new PathRefused(`${JSON.stringify(path)} is refused: its folder lies outside the served folder (through a symbolic link)`);
  return join(parent, full.slice(dirname(full).length + 1));
}

/** For writing: the same checks as resolveExisting (the file itself may not exist yet). */
export const resolveForWrite = resolveExisting;
