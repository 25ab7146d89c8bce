/**
 * A line diff for the "compare" choice after a save conflict: the longest common subsequence of lines
 * (Hunt–Szymanski style dynamic programming on the lines between a common prefix and suffix), as a list of
 * kept, removed and added lines. O(n m) in the changed middle part, which is small for a conflict between
 * two versions of one document; past `maxCells` (default 4e6) the middle is shown as all removed then added.
 */

/** One line of a diff. */
export interface DiffLine {
  op: "same" | "removed" | "added";
  text: string;
}

/** The line diff from `before` to `after`. */
export function lineDiff(before: string, after: string, maxCells = 4_000_000): DiffLine[] {
  const a = before.split(/\r\n|\n/);
  const b = after.split(/\r\n|\n/);
  let start = 0;
  while (start < a.length && start < b.length && a[start] === b[start]) start++;
  let endA = a.length;
  let endB = b.length;
  while (endA > start && endB > start && a[endA - 1] === b[endB - 1]) {
    endA--;
    endB--;
  }
  const head: DiffLine[] = a.slice(0, start).map((text) => ({ op: "same", text }));
  const tail: DiffLine[] = a.slice(endA).map((text) => ({ op: "same", text }));
  const midA = a.slice(start, endA);
  const midB = b.slice(start, endB);
  const n = midA.length;
  const m = midB.length;
  if (n * m > maxCells) {
    return [...head, ...midA.map((text) => ({ op: "removed" as const, text })), ...midB.map((text) => ({ op: "added" as const, text })), ...tail];
  }
  const lcs = new Uint32Array((n + 1) * (m + 1));
  for (let i = n - 1; i >= 0; i--) {
    for (let j = m - 1; j >= 0; j--) {
      lcs[i * (m + 1) + j] = midA[i] === midB[j] ? lcs[(i + 1) * (m + 1) + j + 1]! + 1 : Math.max(lcs[(i + 1) * (m + 1) + j]!, lcs[i * (m + 1) + j + 1]!);
    }
  }
  const mid: DiffLine[] = [];
  let i = 0;
  let j = 0;
  while (i < n && j < m) {
    if (midA[i] === midB[j]) {
      mid.push({ op: "same", text: midA[i]! });
      i++;
      j++;
    } else if (lcs[(i + 1) * (m + 1) + j]! >= lcs[i * (m + 1) + j + 1]!) mid.push({ op: "removed", text: midA[i++]! });
    else mid.push({ op: "added", text: midB[j++]! });
  }
  while (i < n) mid.push({ op: "removed", text: midA[i++]! });
  while (j < m) mid.push({ op: "added", text: midB[j++]! });
  return [...head, ...mid, ...tail];
}
