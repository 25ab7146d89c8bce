/**
 * Bad data never passes silently: each case of docs/bad-data.md is a pinned data file read by
 * `aq.parseObservationCsv` in a small invented document (Sedge Holm, invented), run through the built command
 * (packages/cli/dist/conebook.js). Each row asserts the exit code (docs/cli.md: 1 a cell failed or a pinned file
 * changed, 2 an input the command cannot read) and the parts of the message a user acts on: the file and line,
 * what was wrong and the fix. The table in docs/bad-data.md quotes these messages; keep the two in step.
 */
import { spawnSync } from "node:child_process";
import { createHash } from "node:crypto";
import { mkdirSync, mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";

const CLI = fileURLToPath(new URL("../packages/cli/dist/conebook.js", import.meta.url));
const GOOD = "t_min,s_m\n1,0.12\n2,0.2\n3,0.3\n";

interface BadDataCase {
  readonly name: string;
  readonly csv: string | Uint8Array;
  readonly lengthUnit?: string;
  /** Bytes written after pinning (a changed pinned file). */
  readonly changedTo?: string;
  readonly code: number;
  /** Parts the message must contain. */
  readonly parts: readonly string[];
  /** A case the importer accepts, with the readings it keeps and a note it must give. */
  readonly readings?: number;
  readonly note?: string;
}

export const BAD_DATA: readonly BadDataCase[] = [
  { name: "a missing value", csv: "t_min,s_m\n1,0.12\n2,\n3,0.3\n", code: 1, parts: ["data/obs.csv:3: column 's_m' (2): the level is missing", "Fix: fill in the reading, or set missing: 'exclude'"] },
  { name: "text in a numeric column", csv: "t_min,s_m\n1,0.12\n2,abc\n3,0.3\n", code: 1, parts: ["data/obs.csv:3: column 's_m' (2): 'abc' is not a number", "Fix: correct the value"] },
  { name: "a negative time", csv: "t_min,s_m\n-1,0.12\n2,0.2\n3,0.3\n", code: 1, parts: ["data/obs.csv:2: column 't_min' (1): time -1 min is negative (before pumping started)", "set beforeStart: 'exclude'"] },
  { name: "a duplicated time", csv: "t_min,s_m\n1,0.12\n2,0.2\n2,0.21\n3,0.3\n", code: 1, parts: ["data/obs.csv:4: column 't_min' (1): time 2 min repeats the time of row 3", "Fix: remove one of the two readings"] },
  { name: "unsorted times", csv: "t_min,s_m\n1,0.12\n3,0.3\n2,0.2\n", code: 1, parts: ["data/obs.csv:4: column 't_min' (1): time 2 min comes after 3 min on row 3", "set outOfOrder: 'sort'"] },
  { name: "an empty file", csv: "", code: 1, parts: ["d.cone.md:8: error in cell obs-file", "data \"obs\" is empty; give a header line with column names and then the rows"] },
  { name: "a header and no rows", csv: "t_min,s_m\n", code: 1, parts: ["data/obs.csv:1: the header is not followed by any data rows", "Fix: give a file with readings below the header"] },
  { name: "decimal commas in a comma-separated file", csv: "t_min,s_m\n1,0,12\n2,0,2\n", code: 1, parts: ["data \"obs\", line 2: 3 fields but the header has 2; give one field per column"] },
  { name: "an unknown unit", csv: GOOD, lengthUnit: "meters", code: 1, parts: ["lengthUnit: unknown unit 'meters'", "for a length try 'ft', 'm', 'mm'", "Fix: give lengthUnit as a length unit"] },
  { name: "a time unit given for the levels", csv: GOOD, lengthUnit: "min", code: 1, parts: ["lengthUnit: expected a length, in a unit such as 'm', got 'min' (a time)"] },
  { name: "a pinned file whose bytes changed", csv: GOOD, changedTo: GOOD.replace("0.2", "0.25"), code: 1, parts: ["d.cone.md:7:1: data file data/obs.csv changed since it was pinned", "re-pin it with conebook pin d.cone.md"] },
  { name: "bytes that are not UTF-8", csv: new Uint8Array([...Buffer.from("t_min,s_m\n1,0.12\n2,0."), 0xff, 0xfe, ...Buffer.from("2\n")]), code: 2, parts: ["data/obs.csv", "not UTF-8", "byte"] },
  { name: "a semicolon-separated file (accepted, with a note)", csv: "t_min;s_m\n1;0.12\n2;0.2\n", code: 0, parts: [], readings: 2, note: "field separator detected: semicolon" },
  { name: "a byte order mark (accepted)", csv: "\uFEFF" + GOOD, code: 0, parts: [], readings: 3 },
];

function runCase(c: BadDataCase): { code: number | null; stderr: string; stdout: string } {
  const dir = mkdtempSync(join(tmpdir(), "conebook-bad-data-"));
  mkdirSync(join(dir, "data"));
  const bytes = typeof c.csv === "string" ? Buffer.from(c.csv, "utf8") : Buffer.from(c.csv);
  writeFileSync(join(dir, "data/obs.csv"), bytes);
  const sha = createHash("sha256").update(bytes).digest("hex");
  const doc = [
    "---",
    "conebook: 1",
    "title: Bad data at Sedge Holm SH-OB1 (invented)",
    "seed: 1",
    "---",
    "",
    `\`\`\`csv data:obs-file name=obs file=data/obs.csv sha256=${sha}`,
    "```",
    "",
    "```ts code:read",
    `const read = aq.parseObservationCsv(obs.csv, { timeColumn: "t_min", valueColumn: "s_m", timeUnit: "min", lengthUnit: ${JSON.stringify(c.lengthUnit ?? "m")}, kind: "drawdown", radius: { value: 30, unit: "m" }, pumpingRate: { value: 900, unit: "m3/d" } });`,
    "JSON.stringify({ readings: read.series.times.length, notes: read.notes })",
    "```",
    "",
  ].join("\n");
  writeFileSync(join(dir, "d.cone.md"), doc);
  if (c.changedTo !== undefined) writeFileSync(join(dir, "data/obs.csv"), c.changedTo);
  // Accepted files are read back from the JSON result; refused ones are judged by what the terminal shows.
  const args = c.readings === undefined ? ["run", "d.cone.md"] : ["run", "d.cone.md", "--json"];
  const r = spawnSync(process.execPath, [CLI, ...args], { cwd: dir, encoding: "utf8", timeout: 60_000 });
  return { code: r.status, stderr: r.stderr, stdout: r.stdout };
}

describe("bad data never passes silently", () => {
  for (const c of BAD_DATA) {
    it(`${c.name}: exit ${c.code}${c.parts.length ? " with the place and the fix" : ""}`, () => {
      const r = runCase(c);
      expect(r.code, r.stderr).toBe(c.code);
      for (const part of c.parts) expect(r.stderr).toContain(part);
      expect(r.stderr).not.toMatch(/^\s+at .+:\d+:\d+\)?$/m);
      if (c.readings !== undefined) {
        const json = JSON.parse(r.stdout) as { cells: { id: string; outputs: { value?: unknown; text?: string }[] }[] };
        const output = json.cells.find((x) => x.id === "read")!.outputs[0]!;
        const value = JSON.parse(String(output.value ?? output.text)) as { readings: number; notes: string[] };
        expect(value.readings).toBe(c.readings);
        if (c.note) expect(value.notes.join(" ")).toContain(c.note);
      }
    });
  }
});
