/**
 * The user's guide (docs/guide.md) and the review page (docs/review.md), followed step by step: a document is
 * made with `conebook new` from the constant-rate template with an invented record (Harrow Lea, the second data
 * set of tests/fixtures/templates/), the note for the author deleted and the test information replaced, its
 * outputs recorded, verified and exported to HTML and PDF, opened and run in the workbench page, and then
 * challenged as a reviewer would (a changed control, a tampered record, a changed data file, another model).
 * The commands are the guide's; each check asserts what the guide says the reader will see. Pictures of the
 * page and of the report are written to tests/output/guide/ (not committed); docs/images/guide-*.png are copies
 * of them, refreshed by hand after a change to the page or the report.
 */
import { copyFile, mkdir, mkdtemp, readFile, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import { main, type Io } from "../../packages/cli/src/index.js";
import { launchChromium } from "./chromium.js";
import { openDocument, runAndWait, startWorkbench, statusLine, type Workbench } from "./workbench-harness.js";

const ROOT = fileURLToPath(new URL("../..", import.meta.url));
const SHOTS = join(ROOT, "tests/output/guide");
const TEMPLATE = join(ROOT, "notebooks/templates/constant-rate-test.cone.md");
const RECORD = join(ROOT, "tests/fixtures/templates/constant-rate-harrow-lea-hl-ob2.csv");

/** The test information of the invented Harrow Lea test, as the guide has the reader write it. */
const TEST_INFORMATION = `testInformation:
  site: Harrow Lea (invented)
  purpose: Transmissivity and storativity of the confined sandstone for a supply licence (invented)
  started: 2027-06-14T07:30
  ended: 2027-06-15T16:50
  analyst: A. Analyst (invented)
  reviewer: R. Reviewer (invented)
  datum: ground level
  units: {length: m, time: min, rate: m3/d}
  wells:
    - {name: HL-PW1, role: pumped, screen: [31, 58], radius: 0.1}
    - {name: HL-OB2, role: observation, distance: 55, screen: [33, 57]}
  rates:
    - {from: 0, to: 2000, rate: 680}`;

async function conebook(cwd: string, ...argv: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = "";
  let err = "";
  const io: Io = { out: (t) => void (out += `${t}\n`), err: (t) => void (err += `${t}\n`), cwd, progress: false };
  return { code: await main(argv, io), out, err };
}

let dir: string;
const FILE = "harrow-lea.cone.md";

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), "conebook-guide-"));
  await mkdir(SHOTS, { recursive: true });
}, 30_000);

afterAll(async () => {
  if (dir) await rm(dir, { recursive: true, force: true });
});

describe("the guide, step by step", () => {
  it("refuses to make a document until every required parameter is given, naming each", async () => {
    const r = await conebook(dir, "new", TEMPLATE, "-o", FILE, "--set", "rate=680 m3/d", "--data", `obs=${RECORD}`);
    expect(r.code).toBe(2);
    for (const name of ["distance", "static_depth", "site", "pumped_well", "observation_well"]) expect(r.err).toContain(`parameter "${name}"`);
  });

  it("makes the new document, copies the record beside it and writes a note for the author", async () => {
    const r = await conebook(dir, "new", TEMPLATE, "-o", FILE, "--title", "Constant-rate test of HL-PW1 at Harrow Lea, June 2027",
      "--set", "rate=680 m3/d", "--set", "distance=55 m", "--set", "static_depth=21.37 m", "--set", "duration=2000 min",
      "--set", "site=Harrow Lea (invented)", "--set", "pumped_well=HL-PW1", "--set", "observation_well=HL-OB2",
      "--data", `obs=${RECORD}`);
    expect(r.code, r.err).toBe(0);
    expect(r.out).toContain("data obs -> data/constant-rate-harrow-lea-hl-ob2.csv");
    expect(r.err).toContain("the test information in the header is the template's");
    const text = await readFile(join(dir, FILE), "utf8");
    expect(text).toContain("[narrative:author-notes]: #");
    expect(text).not.toContain("[narrative:template-about]");
    expect(text).toContain("Pumped well HL-PW1 at 680 m3/d for 2000 min; observation well HL-OB2 at 55 m;");
    // As the guide says: read the note, delete it, replace the test information.
    const noteStart = text.indexOf("[narrative:author-notes]: #");
    const noteEnd = text.indexOf("\n[", noteStart + 1);
    const withoutNote = text.slice(0, noteStart) + text.slice(noteEnd + 1);
    const start = withoutNote.indexOf("testInformation:\n");
    const end = withoutNote.indexOf("\n---\n", start);
    await writeFile(join(dir, FILE), withoutNote.slice(0, start) + TEST_INFORMATION + withoutNote.slice(end));
  });

  it("runs, records and verifies the document", async () => {
    const run = await conebook(dir, "run", FILE, "--write");
    expect(run.code, run.err).toBe(0);
    expect(run.out).toMatch(/T \(transmissivity\) = 149\.\d+ m2\/d \(95 %: 14\d\.\d+ to 15\d\.\d+\)/);
    const verify = await conebook(dir, "verify", FILE);
    expect(verify.code, verify.err).toBe(0);
    expect(verify.out).toMatch(/verified: all \d+ recorded outputs of 8 cells and 3 narrative references match/);
  });

  it("exports the report to HTML and PDF, verified at export, with the caution and the test information on page 1", async () => {
    const r = await conebook(dir, "export", FILE, "-o", "report.html", "--pdf", "report.pdf", "--run-date", "2027-06-20");
    expect(r.code, r.err).toBe(0);
    const html = await readFile(join(dir, "report.html"), "utf8");
    expect(html).toContain("Verified at export.");
    expect(html).toContain("Harrow Lea (invented)");
    expect(html).toContain("qualified professionals");
    const pdf = await readFile(join(dir, "report.pdf"));
    expect(pdf.subarray(0, 5).toString()).toBe("%PDF-");
    const browser = await launchChromium(inject("chromiumPath"));
    try {
      const page = await browser.newPage({ viewport: { width: 794, height: 1123 }, javaScriptEnabled: false });
      await page.route("**/*", (route) => route.abort());
      await page.emulateMedia({ media: "print" });
      await page.setContent(html, { waitUntil: "load" });
      await page.screenshot({ path: join(SHOTS, "guide-05-report-first-page.png"), clip: { x: 0, y: 0, width: 794, height: 1123 } });
      const caption = page.locator("caption", { hasText: "Fitted parameters: Theis (1935) confined aquifer" }).first();
      await caption.scrollIntoViewIfNeeded();
      await page.locator("table", { has: caption }).first().screenshot({ path: join(SHOTS, "guide-06-report-fit-table.png") });
    } finally {
      await browser.close();
    }
  }, 90_000);
});

describe("the document in the page", () => {
  let wb: Workbench;
  let page: Page;

  beforeAll(async () => {
    const files: Record<string, string> = {
      [`harrow-lea/${FILE}`]: await readFile(join(dir, FILE), "utf8"),
      "harrow-lea/data/constant-rate-harrow-lea-hl-ob2.csv": await readFile(RECORD, "utf8"),
    };
    wb = await startWorkbench(inject("chromiumPath"), files);
    ({ page } = await wb.newPage());
  }, 60_000);

  afterAll(async () => {
    await wb?.close();
  });

  it("opens with the caution, runs every cell, and shows the fit and the residuals the CLI recorded", async () => {
    await openDocument(wb, page, `harrow-lea/${FILE}`);
    await expect.poll(() => page.locator("cb-workbench .caution").innerText()).toMatch(/qualified professionals/);
    await page.screenshot({ path: join(SHOTS, "guide-01-page-opened.png") });
    await runAndWait(page);
    expect(await statusLine(page)).toMatch(/^Ran 8 cells in /);
    const fit = page.locator('cb-cell[data-id="fit-theis"]');
    await fit.scrollIntoViewIfNeeded();
    await expect.poll(() => fit.getByText("T (transmissivity)").count()).toBeGreaterThan(0);
    await fit.screenshot({ path: join(SHOTS, "guide-02-page-fit.png") });
    const loglog = page.locator('cb-cell[data-id="loglog"]');
    await loglog.scrollIntoViewIfNeeded();
    await expect.poll(() => loglog.locator("svg").count()).toBeGreaterThan(0);
    await loglog.screenshot({ path: join(SHOTS, "guide-03-page-diagnostic-plot.png") });
    const residuals = page.locator('cb-cell[data-id="residuals"]');
    await residuals.scrollIntoViewIfNeeded();
    await expect.poll(() => residuals.locator("svg").count()).toBeGreaterThan(0);
    await residuals.screenshot({ path: join(SHOTS, "guide-04-page-residuals.png") });
  }, 90_000);
});

describe("the review page's challenges", () => {
  it("reruns with another distance: S moves by the square of the distance ratio, T hardly at all, and the file stays as it was", async () => {
    const before = await readFile(join(dir, FILE), "utf8");
    const base = await conebook(dir, "run", FILE);
    const moved = await conebook(dir, "run", FILE, "--set", "distance=60 m");
    expect(moved.code, moved.err).toBe(0);
    const read = (out: string, p: string) => Number(new RegExp(`${p} \\([a-z]+\\) = ([0-9.e-]+)`).exec(out)![1]);
    // Theis: u = r² S/(4 T t), so at the same fit r² S is unchanged (fact of the trade, no source needed).
    expect(read(moved.out, "S") / read(base.out, "S")).toBeCloseTo((55 / 60) ** 2, 3);
    expect(Math.abs(read(moved.out, "T") / read(base.out, "T") - 1)).toBeLessThan(1e-3);
    expect(await readFile(join(dir, FILE), "utf8")).toBe(before);
  });

  it("swaps the model of a fit: the changed cell is reported by verify, and the run shows the new model's table", async () => {
    const text = await readFile(join(dir, FILE), "utf8");
    await writeFile(join(dir, "swapped.cone.md"), text.replace('aq.fitModel({ model: "theis", wells: [well] })', 'aq.fitModel({ model: "hantush-aquitard-storage", wells: [well] })'));
    const run = await conebook(dir, "run", "swapped.cone.md");
    expect(run.code, run.err).toBe(0);
    expect(run.out).toContain("Fitted parameters: Hantush (1960) leaky aquifer with aquitard storage");
    const verify = await conebook(dir, "verify", "swapped.cone.md");
    expect(verify.code).toBe(1);
    expect(verify.out + verify.err).toMatch(/swapped\.cone\.md:\d+: cell fit-theis: /);
  });

  it("names the cell, the output and both values when a recorded number was changed by hand", async () => {
    const path = join(dir, FILE);
    const text = await readFile(path, "utf8");
    const tampered = text.replace(/"rows": \[\[(\d+),(\d+),/, (_, a: string, b: string) => `"rows": [[${Number(a) + 1},${b},`);
    expect(tampered).not.toBe(text);
    await writeFile(join(dir, "tampered.cone.md"), tampered);
    const r = await conebook(dir, "verify", "tampered.cone.md");
    expect(r.code).toBe(1);
    expect(r.out + r.err).toMatch(/tampered\.cone\.md:\d+: cell load: outputs\[\d+\]\.rows\[0\]\[0\]: recorded \d+, now \d+/);
  });

  it("refuses a data file changed since it was pinned, with both digests, until it is re-pinned", async () => {
    const copy = join(dir, "changed");
    await mkdir(join(copy, "data"), { recursive: true });
    await copyFile(join(dir, FILE), join(copy, FILE));
    const csv = await readFile(RECORD, "utf8");
    await writeFile(join(copy, "data/constant-rate-harrow-lea-hl-ob2.csv"), csv.replace(/\n([0-9.]+),([0-9.]+)\n/, (_, t: string, d: string) => `\n${t},${(Number(d) + 0.01).toFixed(3)}\n`));
    const r = await conebook(copy, "verify", FILE);
    expect(r.code).toBe(1);
    expect(r.out + r.err).toMatch(/SHA-256/);
    expect(r.out + r.err).toContain("conebook pin");
  });
});
