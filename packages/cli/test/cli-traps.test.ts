/**
 * The command line where a user could get a wrong or missing answer without a word: recorded control values
 * against an edited default, values typed with units in the header, kept template defaults, a changed pinned
 * file, the terminal summary of fits. The commands run in-process through `main` on small documents of an
 * invented scenario (well PW-7 at the invented Tarn Gill site) written to a temporary folder.
 */
import { mkdtemp, readFile, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { main } from "../src/cli.js";

let dir: string;

async function conebook(...argv: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  const out: string[] = [];
  const err: string[] = [];
  const code = await main(argv, { out: (t) => out.push(t), err: (t) => err.push(t), cwd: dir, progress: false });
  return { code, stdout: out.join("\n"), stderr: err.join("\n") };
}

const RATE_DOC = (value: number) => `---
conebook: 1
title: Rate control at PW-7, Tarn Gill (invented)
seed: 3
---

\`\`\`ts code:rate
const Q = control("rate", { value: ${value}, min: 100, max: 5000, unit: "m3/d" });
show.value(Q, "m3/d", "rate used");
\`\`\`
`;

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), "conebook-traps-"));
});

afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

function valueOf(json: string, cell: string, label: string): number {
  const run = JSON.parse(json) as { cells: { id: string; outputs: { type: string; label?: string; value: number }[] }[] };
  return run.cells.find((c) => c.id === cell)!.outputs.find((o) => o.label === label)!.value;
}

describe("recorded control values and edited defaults", () => {
  it("uses an edited default rather than the value recorded for the old default", async () => {
    await writeFile(join(dir, "rate.cone.md"), RATE_DOC(900));
    expect((await conebook("run", "rate.cone.md", "--write")).code).toBe(0);
    const text = await readFile(join(dir, "rate.cone.md"), "utf8");
    await writeFile(join(dir, "rate.cone.md"), text.replace("value: 900,", "value: 1000,"));
    const run = await conebook("run", "rate.cone.md", "--json");
    expect(run.code).toBe(0);
    expect(valueOf(run.stdout, "rate", "rate used")).toBe(1000);
  });

  it("keeps a value set with --set while the default is unchanged, and says so when an edited default sets it aside", async () => {
    await writeFile(join(dir, "set.cone.md"), RATE_DOC(900));
    expect((await conebook("run", "set.cone.md", "--write", "--set", "rate=1200")).code).toBe(0);
    const kept = await conebook("run", "set.cone.md", "--json");
    expect(valueOf(kept.stdout, "rate", "rate used")).toBe(1200);
    const fresh = await conebook("run", "set.cone.md", "--json", "--fresh");
    expect(valueOf(fresh.stdout, "rate", "rate used")).toBe(900);
    const text = await readFile(join(dir, "set.cone.md"), "utf8");
    await writeFile(join(dir, "set.cone.md"), text.replace("value: 900,", "value: 1000,"));
    const edited = await conebook("run", "set.cone.md");
    expect(edited.stdout).toContain("rate used = 1000 m3/d");
    expect(edited.stderr).toContain(
      // Line 8: the fence of cell rate, one line lower once --write added recordedWith to the header.
      'set.cone.md:8: note: control "rate": the default in the code changed from 900 m3/d to 1000 m3/d since the value 1200 m3/d was recorded, so the new default 1000 m3/d is used; give --set rate=1200 to use the recorded value again',
    );
  });
});

const PARAM_DOC = `---
conebook: 1
title: Rate parameter at PW-7, Tarn Gill (invented)
seed: 3
parameters:
  - name: rate
    value: 900
    unit: m3/d
    range: [1, 100000]
---

\`\`\`ts code:rate
const Q = control("rate", { value: 900, min: 1, max: 100000, unit: "m3/d" });
show.value(Q, "m3/d", "rate used");
\`\`\`
`;

describe("values typed with a unit", () => {
  it("keeps the value and unit typed in the header beside the converted value", async () => {
    await writeFile(join(dir, "param.cone.md"), PARAM_DOC);
    const run = await conebook("run", "param.cone.md", "--write", "--set", "rate=8L/s");
    expect(run.code, run.stderr).toBe(0);
    const text = await readFile(join(dir, "param.cone.md"), "utf8");
    // 8 L/s = 8e-3 m3/s x 86400 s/d = 691.2 m3/d (NIST SP 811: L = 1e-3 m3, d = 86400 s).
    expect(text).toMatch(/- name: rate\n\s+value: 691\.2\d*\n\s+unit: m3\/d\n\s+range: \[ ?1, 100000 ?\]\n\s+given: 8 L\/s\n/);
    const plain = await conebook("run", "param.cone.md", "--write", "--set", "rate=700");
    expect(plain.code).toBe(0);
    expect(await readFile(join(dir, "param.cone.md"), "utf8")).not.toContain("given:");
  });
});

describe("conebook new from a template with demonstration values", () => {
  const TEMPLATE = new URL("../../../notebooks/templates/constant-rate-test.cone.md", import.meta.url);
  // An invented record for the new document: a few depth-to-water readings at observation well TG-OB2.
  const READINGS = "elapsed_min,depth_to_water_m\n1,8.80\n2,8.86\n5,8.95\n10,9.02\n30,9.13\n100,9.24\n";

  it("refuses, naming each required parameter left out, instead of keeping the demonstration rate and distance", async () => {
    await writeFile(join(dir, "readings.csv"), READINGS);
    const out = await conebook("new", TEMPLATE.pathname, "-o", "tg.cone.md", "--set", "static_depth=8.72", "--data", "obs=readings.csv");
    expect(out.code).toBe(2);
    for (const name of ["rate", "distance", "site", "pumped_well", "observation_well"]) expect(out.stderr).toContain(`parameter "${name}"`);
    expect(out.stderr).toMatch(/constant-rate-test\.cone\.md:9:\d+: parameter "rate" \(m3\/d\) must be given: the template's 1150 is its demonstration value; add --set rate=VALUE/);
    expect(out.stderr).not.toContain('parameter "static_depth" (m) must');
  });

  it("fills the title and narrative placeholders, leaves out the template's own cells and states each kept default", async () => {
    const out = await conebook(
      "new", TEMPLATE.pathname, "-o", "tg2.cone.md", "--data", "obs=readings.csv",
      "--set", "static_depth=8.72", "--set", "rate=250 m3/d", "--set", "distance=15", "--set", "site=Tarn Gill", "--set", "pumped_well=TG-PW1", "--set", "observation_well=TG-OB2",
    );
    expect(out.code, out.stderr).toBe(0);
    expect(out.stderr).toMatch(/warning: parameter "duration" keeps the template's value 1440 min/);
    const text = await readFile(join(dir, "tg2.cone.md"), "utf8");
    expect(text).toMatch(/title: "?Constant-rate pumping test at Tarn Gill, observation well TG-OB2"?\n/);
    expect(text).toContain("Pumped well TG-PW1 at 250 m3/d for 1440 min; observation well TG-OB2 at 15 m;");
    expect(text).not.toContain("Wrenfield");
    expect(text).not.toContain("template-about");
    expect(text).toContain("> - parameter `duration` keeps the template's value 1440 min");
    const titled = await conebook("new", TEMPLATE.pathname, "-o", "tg3.cone.md", "--data", "obs=readings.csv", "--title", "PW-7 test, May",
      "--set", "static_depth=8.72", "--set", "rate=250", "--set", "distance=15", "--set", "site=Tarn Gill", "--set", "pumped_well=TG-PW1", "--set", "observation_well=TG-OB2", "--set", "duration=100");
    expect(titled.code, titled.stderr).toBe(0);
    const third = await readFile(join(dir, "tg3.cone.md"), "utf8");
    expect(third).toContain("title: PW-7 test, May");
    // Every parameter and the title given: the only note left is the template's test information to replace.
    expect(third).toContain("> - the test information in the header");
    expect(third).not.toContain("keeps the template's value");
    expect(third).not.toContain("the title is the template's");
    expect(third).toContain("site: Tarn Gill");
  });
});

describe("a pinned data file that changed", () => {
  const CSV = "t_s,s_m\n60,0.31\n120,0.52\n";
  const doc = (sha: string) => `---
conebook: 1
title: Pinned record at PW-7 (invented)
seed: 3
---

\`\`\`csv data:record name=obs file=ob7.csv sha256=${sha}
\`\`\`

\`\`\`ts code:count
obs.rows.length
\`\`\`
`;

  it("makes run exit 1, as docs/cli.md says, and pin re-pins it printing both digests", async () => {
    const { sha256Hex, utf8Bytes } = await import("@conebook/document");
    const before = sha256Hex(utf8Bytes(CSV));
    await writeFile(join(dir, "ob7.csv"), CSV);
    await writeFile(join(dir, "pinned.cone.md"), doc(before));
    expect((await conebook("run", "pinned.cone.md")).code).toBe(0);
    const edited = `${CSV}300,0.80\n`;
    const after = sha256Hex(utf8Bytes(edited));
    await writeFile(join(dir, "ob7.csv"), edited);
    const run = await conebook("run", "pinned.cone.md");
    expect(run.code).toBe(1);
    expect(run.stderr).toContain(`pinned.cone.md:7:1: data file ob7.csv changed since it was pinned: the document pins SHA-256 ${before}, the file now has ${after}`);
    const docs = await readFile(new URL("../../../docs/cli.md", import.meta.url), "utf8");
    expect(docs).toMatch(/\| 1 \| a check failed: .*a data file changed since it was pinned/);
    const pin = await conebook("pin", "pinned.cone.md");
    expect(pin.code).toBe(0);
    expect(pin.stdout).toContain(`pinned.cone.md:7: re-pinned data "obs" (ob7.csv): SHA-256 was ${before}, now ${after}`);
    expect(await readFile(join(dir, "pinned.cone.md"), "utf8")).toBe(doc(after));
    expect((await conebook("run", "pinned.cone.md")).code).toBe(0);
  });
});

describe("a code fence left open before the next cell", () => {
  it("warns at the opening fence and the run reports the cell's error there, not a syntax error at the next marker", async () => {
    const text = `---
conebook: 1
title: Unclosed fence (invented)
seed: 3
---

\`\`\`ts code:first
const a = 2;

[narrative:middle]: #

Some prose.

\`\`\`ts code:second
a * 3
\`\`\`
`;
    await writeFile(join(dir, "unclosed.cone.md"), text);
    const run = await conebook("run", "unclosed.cone.md");
    expect(run.code).toBe(1);
    expect(run.stderr).toContain("unclosed.cone.md:7:1: warning: this code fence is not closed before line 10, which starts another cell ([narrative:middle]: #)");
    expect(run.stderr).toContain("unclosed.cone.md:7: error in cell first: the fence of cell first (line 7) is not closed before line 10, which starts another cell ([narrative:middle]: #)");
    expect(run.stderr).not.toContain("SyntaxError");
  });
});

describe("CSV problems found at run time", () => {
  it("names the data file and its line, beside the code line that read it", async () => {
    const { sha256Hex, utf8Bytes } = await import("@conebook/document");
    // Line 1 is the header; the reading on line 4 is missing.
    const CSV = "elapsed_min,depth_to_water_m\n1,8.80\n2,8.86\n5,\n10,9.02\n";
    await writeFile(join(dir, "obs-gap.csv"), CSV);
    await writeFile(join(dir, "gap.cone.md"), `---
conebook: 1
title: A gap in the record (invented)
seed: 3
---

\`\`\`csv data:record name=obs file=obs-gap.csv sha256=${sha256Hex(utf8Bytes(CSV))}
\`\`\`

\`\`\`ts code:load
const imported = aq.parseObservationCsv(obs.csv, {
  timeColumn: "elapsed_min", valueColumn: "depth_to_water_m", timeUnit: "min", kind: "depth-to-water", staticLevel: 8.72,
  lengthUnit: "m", radius: { value: 15, unit: "m" }, pumpingRate: { value: 250, unit: "m3/d" },
});
\`\`\`
`);
    const run = await conebook("run", "gap.cone.md");
    expect(run.code).toBe(1);
    expect(run.stderr).toMatch(/gap\.cone\.md:11:\d+: error in cell load: /);
    expect(run.stderr).toContain("obs-gap.csv:4: column 'depth_to_water_m' (2): the level is missing. Fix:");
  });
});

describe("the terminal summary", () => {
  it("shows the estimates of a fit with their 95 % intervals, and every table in full with --show", async () => {
    await writeFile(join(dir, "fit.cone.md"), `---
conebook: 1
title: Theis fit at TG-OB2 (invented)
seed: 3
---

\`\`\`ts code:fit
const t = [0.001, 0.003, 0.01, 0.03, 0.1, 0.3, 1];
const s = aq.drawdown("theis", { T: 250, S: 2e-4 }, { r: 30, Q: 900 }, t).map((v, i) => v * (1 + 0.004 * Math.sin(i)));
const fit = aq.fitModel({ model: "theis", wells: [{ name: "TG-OB2", geometry: { r: 30, Q: 900 }, t, s }] });
show.fit(fit, { title: "Theis (1935) fit to the record of observation well TG-OB2, 1-day test" });
show.table({ t, s }, { title: "Drawdown readings used for the fit at TG-OB2", units: { t: "d", s: "m" } });
\`\`\`
`);
    const run = await conebook("run", "fit.cone.md");
    expect(run.code, run.stderr).toBe(0);
    expect(run.stdout).toContain("    Theis (1935) fit to the record of observation well TG-OB2, 1-day test\n");
    expect(run.stdout).toMatch(/\n {6}T \(transmissivity\) = 2\d\d\.\d+ m2\/d \(95 %: 2\d\d\.\d+ to 2\d\d\.\d+\)\n/);
    expect(run.stdout).toMatch(/\n {6}S \(storativity\) = 0\.000\d+ \(95 %: /);
    const shown = await conebook("run", "fit.cone.md", "--show");
    expect(shown.stdout).toContain("    Drawdown readings used for the fit at TG-OB2\n    t (d)  s (m)");
    expect(shown.stdout).toMatch(/\n {4}parameter +estimate +standard error +95 % low +95 % high +unit +interval\n/);
  });
});
