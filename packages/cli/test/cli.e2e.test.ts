/**
 * End-to-end tests of the `conebook` binary: each spawns `node packages/cli/bin/conebook.js` on small documents
 * of an invented scenario (well PW-3 at the invented Hollin Marsh site, pumped at 6 L/s) written to a temporary
 * folder. Independent commands are spawned in parallel to keep the file fast.
 */
import { execFile } from "node:child_process";
import { mkdir, mkdtemp, readFile, readdir, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { sha256Hex, utf8Bytes } from "@conebook/document";

const BIN = fileURLToPath(new URL("../bin/conebook.js", import.meta.url));
const BUILD = fileURLToPath(new URL("../scripts/build.mjs", import.meta.url));

interface Outcome {
  code: number;
  stdout: string;
  stderr: string;
}

function spawnNode(cwd: string, args: string[], env: Record<string, string> = {}): Promise<Outcome> {
  return new Promise((resolve) => {
    execFile(process.execPath, args, { cwd, timeout: 60000, env: { ...process.env, ...env } }, (error, stdout, stderr) => {
      const code = error ? (typeof error.code === "number" ? error.code : -1) : 0;
      resolve({ code, stdout, stderr });
    });
  });
}

/** Runs the binary as a user would; it takes the bundle, which beforeAll has just built from the sources. */
function conebook(cwd: string, ...args: string[]): Promise<Outcome> {
  return spawnNode(cwd, [BIN, ...args]);
}

const CSV = "t_s,s_m\n60,0.31\n120,0.52\n300,0.80\n600,1.01\n1200,1.22\n";

const DEMO = `---
conebook: 1
title: Constant-rate test at PW-3, Hollin Marsh (invented)
seed: 11
parameters:
  - name: rate
    value: 0.006
    unit: m3/s
    range: [0.001, 0.02]
    description: pumping rate of PW-3
---

[narrative:intro]: #

Drawdown at observation well OB-4, 25 m from PW-3. Late points lie on a line on a semi-log plot.

\`\`\`csv data:record name=obs file=data/ob4.csv sha256=${sha256Hex(utf8Bytes(CSV))}
\`\`\`

\`\`\`ts code:slope
const Q = control("rate", { value: 0.006, min: 0.001, max: 0.02, unit: "m3/s" });
const late = obs.rows.filter((r) => (r.t_s as number) >= 300);
const x = late.map((r) => Math.log10(r.t_s as number));
const y = late.map((r) => r.s_m as number);
const mx = x.reduce((a, v) => a + v, 0) / x.length;
const my = y.reduce((a, v) => a + v, 0) / y.length;
let sxy = 0, sxx = 0;
x.forEach((xi, i) => { sxy += (xi - mx) * (y[i] - my); sxx += (xi - mx) ** 2; });
const slope = sxy / sxx;
show(show.value(slope, "m", "drawdown per log cycle"));
show(show.value((Math.LN10 * Q) / (4 * Math.PI * slope), "m2/s", "transmissivity"));
show.table(late.map((r) => ({ t: r.t_s, s: r.s_m })), { units: { t: "s", s: "m" }, title: "late points" });
\`\`\`

\`\`\`yaml chart:semilog
data: {name: obs}
mark: point
encoding:
  x: {field: t_s, type: quantitative, scale: {type: log}, title: "time (s)"}
  y: {field: s_m, type: quantitative, title: "drawdown (m)"}
\`\`\`
`;

const FAILING = `---
conebook: 1
title: A run that fails
seed: 1
---

\`\`\`ts code:ok
const a = 2;
a * 3
\`\`\`

\`\`\`ts code:broken
const b: number = 1;
b.nothing.here
\`\`\`
`;

const HOSTILE = `---
conebook: 1
title: "Report </title><script>alert(1)</script>"
seed: 1
---

[narrative:bad]: #

Text with <script>alert(2)</script> and <img src=x onerror=alert(3)>, a reference {=evil/"<script>alert(8)</script>"}
and one that is not {=<script>alert(9)</script>}.

\`\`\`ts code:evil
show("</pre><script>alert(4)</script>");
show.table([{ "<b onmouseover=alert(5)>": "<script>alert(6)</script>" }]);
const pts = [{ t: 1, s: 0.1 }, { t: 10, s: 0.4 }];
\`\`\`

\`\`\`json chart:evil-chart
{"title": "<script>alert(7)</script>", "data": {"name": "pts"}, "mark": "line",
 "encoding": {"x": {"field": "t", "type": "quantitative"}, "y": {"field": "s", "type": "quantitative"}}}
\`\`\`
`;

const TEMPLATE = `---
conebook: 1
title: Semi-log check template
seed: 5
parameters:
  - name: rate
    value: 0.006
    unit: m3/s
    range: [0.001, 0.02]
  - name: well
    value: OB-1
dataSlots:
  - name: obs
    columns: [{name: t_s, unit: s}, {name: s_m, unit: m}]
---

\`\`\`csv data:record name=obs file=sample.csv sha256=${"0".repeat(64)}
\`\`\`

\`\`\`ts code:count
const Q = control("rate", { value: 0.006, min: 0.001, max: 0.02, unit: "m3/s" });
show(show.value(obs.rows.length, "", "points"));
show(show.value(Q * 1000, "L/s", "rate"));
\`\`\`

\`\`\`json outputs:count
[{"type":"value","value":99,"label":"points"}]
\`\`\`
`;

let dir: string;
const read = (name: string) => readFile(join(dir, name), "utf8");

beforeAll(async () => {
  // One esbuild bundle of the current sources (about 1 s) makes each later spawn start about 3x faster.
  const built = await spawnNode(process.cwd(), [BUILD]);
  expect(built.code, built.stderr).toBe(0);
  dir = await mkdtemp(join(tmpdir(), "conebook-cli-"));
  await mkdir(join(dir, "data"));
  await mkdir(join(dir, "tpl"));
  await mkdir(join(dir, "site"));
  await writeFile(join(dir, "data/ob4.csv"), CSV);
  await writeFile(join(dir, "demo.cone.md"), DEMO);
  await writeFile(join(dir, "failing.cone.md"), FAILING);
  await writeFile(join(dir, "hostile.cone.md"), HOSTILE);
  await writeFile(join(dir, "tpl/semilog.cone.md"), TEMPLATE);
  await writeFile(join(dir, "ob9.csv"), "t_s,s_m\n30,0.11\n90,0.25\n");
  await writeFile(join(dir, "wrong-columns.csv"), "time,drawdown\n30,0.11\n");
  await writeFile(join(dir, "bad-header.cone.md"), "---\nconebook: 1\ntitle: [unclosed\n---\n");
  await writeFile(join(dir, "missing-data.cone.md"), DEMO.replace("data/ob4.csv", "data/absent.csv"));
  await writeFile(join(dir, "bad-unit.cone.md"), DEMO.replace("unit: m3/s", "unit: m3/sec"));
  await writeFile(join(dir, "unknown-ref.cone.md"), DEMO.replace("data: {name: obs}", "data: {name: drawdowns}"));
});

afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

describe("conebook run", () => {
  it("prints a summary per cell, JSON with --json, help, and refuses unknown options", async () => {
    const [summary, json, help, unknown, noCommand] = await Promise.all([
      conebook(dir, "run", "demo.cone.md"),
      conebook(dir, "run", "demo.cone.md", "--json"),
      conebook(dir, "run", "--help"),
      conebook(dir, "run", "demo.cone.md", "--frobnicate"),
      conebook(dir, "launch"),
    ]);
    expect(summary.code).toBe(0);
    expect(summary.stdout).toMatch(/ok\s+data\s+record\s+\d+ ms\s+data "obs" from data\/ob4\.csv/);
    // Cooper-Jacob slope of the late points (t >= 300 s): least squares in log10 t, computed here from the CSV.
    const late = [[300, 0.8], [600, 1.01], [1200, 1.22]] as const;
    const xs = late.map(([t]) => Math.log10(t));
    const mx = xs.reduce((a, v) => a + v, 0) / 3;
    const my = late.reduce((a, [, s]) => a + s, 0) / 3;
    const slope = late.reduce((a, [, s], i) => a + (xs[i]! - mx) * (s - my), 0) / xs.reduce((a, x) => a + (x - mx) ** 2, 0);
    expect(summary.stdout).toContain(`drawdown per log cycle = ${Number(slope.toPrecision(6))} m`);
    expect(summary.stdout).toMatch(/3 cells: 3 ok, 0 failed, 0 not run/);

    expect(json.code).toBe(0);
    const parsed = JSON.parse(json.stdout);
    expect(parsed.cells.map((c: { id: string; status: string }) => [c.id, c.status])).toEqual([["record", "ok"], ["slope", "ok"], ["semilog", "ok"]]);
    const values = parsed.cells[1].outputs.filter((o: { type: string }) => o.type === "value");
    expect(values[0].value).toBeCloseTo(slope, 12);
    // T = 2.303 Q / (4 pi Delta s) (Cooper-Jacob 1946, straight-line method).
    expect(values[1].value).toBeCloseTo((Math.LN10 * 0.006) / (4 * Math.PI * slope), 14);
    expect(parsed.controlsUsed).toEqual([expect.objectContaining({ cellId: "slope", name: "rate", value: 0.006 })]);

    expect(help.code).toBe(0);
    expect(help.stdout).toMatch(/^Usage: conebook run FILE/);
    expect(unknown.code).toBe(2);
    expect(unknown.stderr).toContain("unknown option --frobnicate for `conebook run`");
    expect(noCommand.code).toBe(2);
    expect(noCommand.stderr).toContain('unknown command "launch"');
  });

  it("takes --set values in range (converting units) and refuses out-of-range, mis-dimensioned and unknown names", async () => {
    const [inRange, outOfRange, badUnit, unknown] = await Promise.all([
      conebook(dir, "run", "demo.cone.md", "--json", "--set", "rate=8L/s"),
      conebook(dir, "run", "demo.cone.md", "--set", "rate=0.5"),
      conebook(dir, "run", "demo.cone.md", "--set", "rate=3 kg"),
      conebook(dir, "run", "demo.cone.md", "--set", "porosity=0.2"),
    ]);
    expect(inRange.code).toBe(0);
    // 8 L/s = 0.008 m3/s (1 L = 1e-3 m3, SI).
    expect(JSON.parse(inRange.stdout).controlsUsed[0].value).toBeCloseTo(0.008, 15);
    expect(outOfRange.code).toBe(2);
    expect(outOfRange.stderr).toContain('demo.cone.md:7:12: --set rate=0.5: parameter "rate" must lie in [0.001, 0.02] m3/s');
    expect(badUnit.code).toBe(2);
    expect(badUnit.stderr).toMatch(/demo\.cone\.md:7:12: --set rate=3 kg: parameter "rate" is in m3\/s/);
    expect(unknown.code).toBe(2);
    expect(unknown.stderr).toContain('there is no template parameter or control named "porosity"');
  });

  it("leaves the file byte-identical and no temporary file when a run with --write fails", async () => {
    const before = await read("failing.cone.md");
    const r = await conebook(dir, "run", "failing.cone.md", "--write");
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/failing\.cone\.md:14:\d+: error in cell broken: TypeError/);
    expect(r.stderr).toContain("failing.cone.md was not written");
    expect(await read("failing.cone.md")).toBe(before);
    expect((await readdir(dir)).filter((f) => f.includes(".tmp-"))).toEqual([]);
  });

  it("reports a malformed document, a missing data file, an unknown unit and an unknown chart reference with file:line and exit 2", async () => {
    const [bad, missing, absent, unit, reference] = await Promise.all([
      conebook(dir, "run", "bad-header.cone.md"),
      conebook(dir, "verify", "missing-data.cone.md"),
      conebook(dir, "run", "nowhere.cone.md"),
      conebook(dir, "run", "bad-unit.cone.md"),
      conebook(dir, "run", "unknown-ref.cone.md"),
    ]);
    expect(unit.code).toBe(2);
    expect(unit.stderr).toContain('bad-unit.cone.md:8:11: template parameter "rate" has the unit "m3/sec", which is not known');
    expect(reference.code).toBe(2);
    expect(reference.stderr).toContain('unknown-ref.cone.md:35: chart semilog draws the data "drawdowns", which no earlier cell defines');
    expect(bad.code).toBe(2);
    expect(bad.stderr).toMatch(/bad-header\.cone\.md:\d+:\d+: the header is not valid YAML/);
    expect(missing.code).toBe(2);
    expect(missing.stderr).toMatch(/missing-data\.cone\.md:17:1: data "obs" refers to data\/absent\.csv, which cannot be read/);
    expect(absent.code).toBe(2);
    expect(absent.stderr).toContain("nowhere.cone.md: no such file");
  });
});

describe("conebook run --write, verify and export", () => {
  beforeAll(async () => {
    const r = await conebook(dir, "run", "demo.cone.md", "--write");
    expect(r.code).toBe(0);
    const text = await read("demo.cone.md");
    await writeFile(join(dir, "edited.cone.md"), text.replace(/"value":0\.00(\d+),"unit":"m2\/s"/, '"value":0.01$1,"unit":"m2/s"').replace("recordedWith: 0.1.0", "recordedWith: 0.0.9"));
    await mkdir(join(dir, "copy/data"), { recursive: true });
    await writeFile(join(dir, "copy/demo.cone.md"), text);
    await writeFile(join(dir, "copy/data/ob4.csv"), CSV.replace("1200,1.22", "1200,1.23"));
  });

  it("records outputs so that verify passes, and fails naming the cell or the data file when something changed", async () => {
    const text = await read("demo.cone.md");
    expect(text).toContain("recordedWith: 0.1.0");
    expect(text).toContain("```json outputs:slope");
    expect(await read("edited.cone.md")).not.toBe(text);
    const [ok, viaTsx, edited, changedData, tolerant] = await Promise.all([
      conebook(dir, "verify", "demo.cone.md"),
      spawnNode(dir, [BIN, "verify", "demo.cone.md"], { CONEBOOK_NO_BUNDLE: "1" }),
      conebook(dir, "verify", "edited.cone.md"),
      conebook(dir, "verify", "copy/demo.cone.md"),
      conebook(dir, "verify", "demo.cone.md", "--rtol", "-1"),
    ]);
    expect(ok.code).toBe(0);
    expect(ok.stdout).toMatch(/^demo\.cone\.md: verified: all 5 recorded outputs of 3 cells match \(rtol 1e-9; aquifer 0\.1\.0\)\n$/);
    expect(viaTsx).toEqual(ok);
    expect(edited.code).toBe(1);
    expect(edited.stdout).toMatch(/edited\.cone\.md:21: cell slope: outputs\[2\]\.value: recorded 0\.01\d+, now 0\.00\d+ \(relative difference/);
    expect(edited.stdout).toContain("not verified: 1 difference in 1 of 3 cells");
    expect(edited.stdout).toContain("edited.cone.md: recorded with aquifer 0.0.9, now 0.1.0, and results differ");
    expect(changedData.code).toBe(1);
    expect(changedData.stdout).toContain(`data file data/ob4.csv changed since it was pinned: the document pins SHA-256 ${sha256Hex(utf8Bytes(CSV))}`);
    expect(changedData.stdout).toContain(`the file now has ${sha256Hex(utf8Bytes(CSV.replace("1200,1.22", "1200,1.23")))}`);
    expect(tolerant.code).toBe(2);
    expect(tolerant.stderr).toContain("--rtol must be a number >= 0");
  });

  it("lists the review notes of a verified document, open and resolved, without changing the exit code", async () => {
    const text = await read("demo.cone.md");
    const notes = [
      "",
      '[review:slope-note-1]: # "on slope, open"',
      "",
      "> **Challenge** from R. E. Viewer: Only the readings from 300 s on are used; why not the earlier ones?",
      ">",
      "> **Answer** from A. N. Analyst: Cooper-Jacob holds for small u only.",
      "",
      '[review:slope-note-2]: # "on slope, resolved"',
      "",
      "> **Accepted** from R. E. Viewer: The slope.",
      "",
    ].join("\n");
    await writeFile(join(dir, "noted.cone.md"), text + notes);
    const r = await conebook(dir, "verify", "noted.cone.md");
    const at = text.split("\n").length + 1;
    expect(r.code).toBe(0);
    expect(r.stdout.split("\n")).toEqual([
      "noted.cone.md: 2 review notes, 1 open, 1 resolved:",
      `noted.cone.md:${at}: review note slope-note-1 on cell slope: open: Challenge from R. E. Viewer: Only the readings from 300 s on are used; why not the earlier ones? (1 more entry)`,
      `noted.cone.md:${at + 6}: review note slope-note-2 on cell slope: resolved: Accepted from R. E. Viewer: The slope.`,
      "noted.cone.md: verified: all 5 recorded outputs of 3 cells match (rtol 1e-9; aquifer 0.1.0)",
      "",
    ]);
  });

  it("exports one offline HTML report with an inline SVG chart, the CSP, the caution, provenance and no script", async () => {
    const [recorded, hostile, unverified, edited] = await Promise.all([
      conebook(dir, "export", "demo.cone.md", "-o", "report.html", "--run-date", "2026-03-14"),
      conebook(dir, "export", "hostile.cone.md", "-o", "hostile.html", "--rerun"),
      conebook(dir, "export", "demo.cone.md", "-o", "unverified.html", "--no-verify"),
      conebook(dir, "export", "edited.cone.md", "-o", "edited.html"),
    ]);
    expect(recorded.code).toBe(0);
    expect(recorded.stdout).toBe("wrote report.html: report of demo.cone.md (1 chart drawn; verified)\n");
    const html = await read("report.html");
    expect(html).toMatch(/<svg[^>]*xmlns="http:\/\/www\.w3\.org\/2000\/svg"/);
    expect(html).toContain(`<meta http-equiv="Content-Security-Policy" content="default-src 'none'; img-src data:; style-src 'unsafe-inline'">`);
    expect(html).toContain("model interpretations");
    expect(html).toContain("qualified professionals");
    expect(html).toContain("licensed practice govern");
    expect(html).not.toMatch(/<script/i);
    expect(html).toContain('<details class="code"><summary>Code (cell slope)</summary>');
    expect(html).toContain("<strong>Verified at export.</strong> export reran the document: all 5 recorded outputs of 3 cells");
    expect(html).toContain(sha256Hex(utf8Bytes(await read("demo.cone.md"))));
    expect(html).toContain(sha256Hex(utf8Bytes(CSV)));
    expect(html).toContain("<dt>Date of the run</dt><dd>2026-03-14</dd>");
    expect(unverified.code).toBe(0);
    const skipped = await read("unverified.html");
    expect(skipped).toContain("<strong>Not verified at export (skipped).</strong> the report was made with --no-verify");
    expect(skipped).toContain("<dt>Date of the run</dt><dd>not stated");
    expect(edited.code).toBe(1);
    expect(edited.stderr).toMatch(/edited\.cone\.md:\d+: cell slope: outputs\[2\]\.value: recorded 0\.01\d+, now 0\.00\d+/);
    expect(await read("edited.html")).toContain("<strong>Not verified at export.</strong> export reran the document and 1 output difference");

    expect(hostile.code).toBe(0);
    const evil = await read("hostile.html");
    expect(evil).not.toMatch(/<script/i);
    expect(evil).not.toMatch(/<img|<b /i);
    expect(evil).toContain("&lt;script&gt;alert(4)&lt;/script&gt;");
    expect(evil).toContain("<svg");
    expect(evil).not.toContain("alert(8)</script>");
    expect(evil).toContain("&lt;script&gt;alert(9)&lt;/script&gt;");
    expect(evil).toContain("Not verified at export (skipped).");
  });
});

describe("conebook new", () => {
  it("fills parameters and data slots from a template, pins the data, clears outputs, and refuses to overwrite", async () => {
    const [made, inPlace, outOfRange, wrongColumns, unknownSlot] = await Promise.all([
      conebook(dir, "new", "tpl/semilog.cone.md", "-o", "site/ob9.cone.md", "--set", "rate=5L/s", "--set", "well=OB-9", "--data", "obs=ob9.csv"),
      conebook(dir, "new", "tpl/semilog.cone.md", "-o", "here.cone.md", "--data", "obs=ob9.csv"),
      conebook(dir, "new", "tpl/semilog.cone.md", "-o", "x.cone.md", "--set", "rate=0.03", "--data", "obs=ob9.csv"),
      conebook(dir, "new", "tpl/semilog.cone.md", "-o", "y.cone.md", "--data", "obs=wrong-columns.csv"),
      conebook(dir, "new", "tpl/semilog.cone.md", "-o", "z.cone.md", "--data", "levels=ob9.csv"),
    ]);
    expect(made.code).toBe(0);
    const doc = await read("site/ob9.cone.md");
    const pin = sha256Hex(utf8Bytes("t_s,s_m\n30,0.11\n90,0.25\n"));
    expect(doc).toContain(`\`\`\`csv data:record name=obs file=data/ob9.csv sha256=${pin}`);
    expect(await read("site/data/ob9.csv")).toBe("t_s,s_m\n30,0.11\n90,0.25\n");
    expect(doc).toMatch(/- name: rate\n\s+value: 0\.005\n/);
    expect(doc).toMatch(/- name: well\n\s+value: OB-9\n/);
    expect(doc).not.toContain("outputs:count");
    expect(inPlace.code).toBe(0);
    expect(await read("here.cone.md")).toContain(`file=ob9.csv sha256=${pin}`);
    expect(outOfRange.code).toBe(2);
    expect(outOfRange.stderr).toContain('tpl/semilog.cone.md:7:12: --set rate=0.03: parameter "rate" must lie in [0.001, 0.02] m3/s');
    expect(wrongColumns.code).toBe(2);
    expect(wrongColumns.stderr).toMatch(/tpl\/semilog\.cone\.md:13:\d+: --data obs=wrong-columns\.csv: data slot "obs" needs the columns t_s \(s\), s_m \(m\)/);
    expect(unknownSlot.code).toBe(2);
    expect(unknownSlot.stderr).toContain('the template has no data slot named "levels"; its slots are obs');

    const [again, rerun] = await Promise.all([
      conebook(dir, "new", "tpl/semilog.cone.md", "-o", "site/ob9.cone.md", "--data", "obs=ob9.csv"),
      conebook(dir, "run", "site/ob9.cone.md", "--json"),
    ]);
    expect(again.code).toBe(2);
    expect(again.stderr).toContain("site/ob9.cone.md already exists; choose another -o FILE or add --force");
    expect(rerun.code).toBe(0);
    const outputs = JSON.parse(rerun.stdout).cells[1].outputs;
    // The template parameter rate = 0.005 m3/s reaches the control of the same name: 5 L/s.
    expect(outputs).toContainEqual({ type: "value", value: 2, label: "points", unit: "" });
    expect(outputs.find((o: { label?: string }) => o.label === "rate").value).toBeCloseTo(5, 12);
  });
});
