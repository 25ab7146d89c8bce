/**
 * Golden reports: the demo, every template as it stands, and a document made from the template with an invented
 * confined record (tests/fixtures/report/make_confined_record.py, where the leakage factor runs to its bound)
 * export through `conebook export` (in process, the same code the binary runs) to HTML whose text and
 * structure (tests/support/html-outline.ts: headings, captions, table cells, paragraphs; not the SVG bytes)
 * match the committed expectation in tests/golden/reports/. After an intended change to a report, rerun with
 * CONEBOOK_UPDATE_GOLDEN=1 and read the diff of the expectations.
 *
 * The demo is also printed to PDF on A4 and the template document on US Letter through the Chromium of
 * @sparticuz/chromium (or CONEBOOK_CHROMIUM); pdfjs-dist reads back the pages and their text. The first pages
 * of each report are written as PNG screenshots to tests/output/reports/ (not committed) for a person to look at.
 */
import { mkdir, mkdtemp, readFile, rm, writeFile } from "node:fs/promises";
import { existsSync, readdirSync } from "node:fs";
import { tmpdir } from "node:os";
import { basename, dirname, join } from "node:path";
import { fileURLToPath } from "node:url";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { sha256Hex } from "@conebook/document";
import { main, type Io } from "../packages/cli/src/index.js";
import { launchChromium } from "../packages/cli/src/report/pdf.js";
import { reportOutline } from "./support/html-outline.js";

const ROOT = fileURLToPath(new URL("..", import.meta.url));
const GOLDEN = join(ROOT, "tests/golden/reports");
const SHOTS = join(ROOT, "tests/output/reports");
const UPDATE = process.env.CONEBOOK_UPDATE_GOLDEN === "1";
/** The other templates, each exported as it stands: golden name `template-<file name without .cone.md>`. */
const OTHER_TEMPLATES = readdirSync(join(ROOT, "notebooks/templates"))
  .filter((f) => f.endsWith(".cone.md") && f !== "constant-rate-test.cone.md")
  .sort()
  .map((f) => ({ name: `template-${f.replace(/\.cone\.md$/, "")}`, path: join(ROOT, "notebooks/templates", f) }));

interface Captured {
  code: number;
  out: string;
  err: string;
}

async function conebook(cwd: string, ...argv: string[]): Promise<Captured> {
  let out = "";
  let err = "";
  const io: Io = { out: (t) => void (out += `${t}\n`), err: (t) => void (err += `${t}\n`), cwd, progress: false };
  const code = await main(argv, io);
  return { code, out, err };
}

/** Test information of the invented Hollin Marsh test (the scenario of tests/fixtures/report/make_confined_record.py). */
const HOLLIN_MARSH = `testInformation:
  site: Hollin Marsh (invented)
  purpose: Confined-aquifer check before a dewatering design (invented)
  started: 2026-05-04T09:30
  ended: 2026-05-05T09:30
  analyst: H. Analyst (invented)
  reviewer: M. Reviewer (invented)
  datum: ground level
  units: {length: m, time: min, rate: m3/d}
  wells:
    - {name: HM-PW2, role: pumped, screen: [20, 35], radius: 0.1}
    - {name: HM-OB3, role: observation, distance: 40, screen: [22, 34]}
  rates:
    - {from: 0, to: 1440, rate: 900}`;

let dir: string;
const reports: Record<string, { html: string; document: string }> = {};

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), "conebook-reports-"));
  const made = await conebook(
    dir,
    "new",
    join(ROOT, "notebooks/templates/constant-rate-test.cone.md"),
    "-o",
    "hollin-marsh.cone.md",
    "--set",
    "rate=900m3/d",
    "--set",
    "distance=40m",
    "--set",
    "static_depth=8.2m",
    "--set",
    "duration=1440min",
    "--set",
    "site=Hollin Marsh (invented)",
    "--set",
    "pumped_well=HM-PW2",
    "--set",
    "observation_well=HM-OB3",
    "--data",
    `obs=${join(ROOT, "tests/fixtures/report/hollin-marsh-hm-ob3.csv")}`,
  );
  expect(made.code, made.err).toBe(0);
  // As an analyst would: read the note for the author and delete it, then replace the template's test
  // information with this test's.
  const madePath = join(dir, "hollin-marsh.cone.md");
  const made0 = await readFile(madePath, "utf8");
  const noteStart = made0.indexOf("[narrative:author-notes]: #");
  const noteEnd = made0.indexOf("\n[", noteStart + 1);
  expect(noteStart, "conebook new writes a note for the author").toBeGreaterThan(0);
  expect(made0.slice(noteStart, noteEnd)).toContain("the test information in the header");
  const text = made0.slice(0, noteStart) + made0.slice(noteEnd + 1);
  const start = text.indexOf("testInformation:\n");
  const end = text.indexOf("\n---\n", start);
  expect(start).toBeGreaterThan(0);
  await writeFile(madePath, text.slice(0, start) + HOLLIN_MARSH + text.slice(end));
  expect((await conebook(dir, "run", "hollin-marsh.cone.md", "--write")).code).toBe(0);
  const documents: Record<string, string> = {
    demo: join(ROOT, "notebooks/kestrel-moor-constant-rate.cone.md"),
    template: join(ROOT, "notebooks/templates/constant-rate-test.cone.md"),
    "from-template": join(dir, "hollin-marsh.cone.md"),
    ...Object.fromEntries(OTHER_TEMPLATES.map((t) => [t.name, t.path])),
  };
  for (const [name, path] of Object.entries(documents)) {
    const out = join(dir, `${name}.html`);
    const pdf = name === "demo" ? ["--pdf", join(dir, "demo.pdf")] : name === "from-template" ? ["--pdf", join(dir, "from-template.pdf"), "--paper", "Letter"] : [];
    // From the document's folder, so that the report names it the same wherever the test runs.
    const r = await conebook(dirname(path), "export", basename(path), "-o", out, "--run-date", "2026-03-14", ...pdf);
    expect(r.code, r.err).toBe(0);
    reports[name] = { html: await readFile(out, "utf8"), document: path };
  }
}, 240_000);

afterAll(async () => {
  if (dir) await rm(dir, { recursive: true, force: true });
});

describe("golden reports", () => {
  for (const name of ["demo", "template", "from-template", ...OTHER_TEMPLATES.map((t) => t.name)]) {
    it(`the ${name} report has the committed text and structure`, async () => {
      const outline = reportOutline(reports[name]!.html);
      const file = join(GOLDEN, `${name}.txt`);
      if (UPDATE || !existsSync(file)) await writeFile(file, outline);
      expect(outline).toBe(await readFile(file, "utf8"));
    });
  }

  it("every report opens with the caution and the verification, is offline, and cites nothing from memory", async () => {
    for (const [name, { html, document }] of Object.entries(reports)) {
      const outline = reportOutline(html);
      const lines = outline.split("\n");
      expect(lines.slice(0, 6).join(" "), name).toMatch(/^AQUIFER-TEST ANALYSIS REPORT|Aquifer-test analysis report/i);
      expect(lines.findIndex((l) => l.startsWith("Caution."))).toBeLessThan(6);
      expect(lines.findIndex((l) => l.startsWith("Verified at export."))).toBeLessThan(8);
      expect(html).toContain(`<meta http-equiv="Content-Security-Policy" content="default-src 'none'; img-src data:; style-src 'unsafe-inline'">`);
      expect(html).not.toMatch(/<script|<link (?!rel="icon" href="data:,")|\bsrc="(?!data:)|url\((?!#)/i);
      expect(outline).not.toMatch(/from memory/i);
      expect(html).toContain(sha256Hex(new Uint8Array(await readFile(document))));
    }
  });

  it("the document made from the template says in words that the leakage factor ran to its bound", () => {
    const outline = reportOutline(reports["from-template"]!.html);
    expect(outline).toContain(
      "| B (leakage factor) | 1 × 10⁶ | at the upper bound of its fitting range: the data do not constrain B; leakage not detected: within this record the drawdown shows no leakage through the confining layer | m |",
    );
    expect(outline).toMatch(/\| \d+ \| 1500 \| [0-9.]+ \| left out: after the pumping stopped at 1440 min \(recovery\) \|/);
  });
});

describe("PDF", () => {
  async function pdfText(path: string): Promise<{ pages: string[]; size: [number, number] }> {
    const pdfjs = await import("pdfjs-dist/legacy/build/pdf.mjs");
    const doc = await pdfjs.getDocument({ data: new Uint8Array(await readFile(path)), verbosity: 0 }).promise;
    const pages: string[] = [];
    let size: [number, number] = [0, 0];
    for (let i = 1; i <= doc.numPages; i++) {
      const page = await doc.getPage(i);
      if (i === 1) size = [page.view[2]!, page.view[3]!];
      const content = await page.getTextContent();
      // Items split words at ligatures ("Veri", "fi", "ed"); spaces come as items of their own or line ends.
      pages.push(content.items.map((it) => ("str" in it ? it.str + (it.hasEOL ? " " : "") : "")).join("").replace(/\s+/g, " "));
    }
    await doc.destroy();
    return { pages, size };
  }

  it("prints the demo on A4 and the template document on Letter, with page numbers and the caution on page 1", async () => {
    const demo = await pdfText(join(dir, "demo.pdf"));
    // A4 is 210 x 297 mm = 595.3 x 841.9 pt (ISO 216); Chromium prints it as 8.27 x 11.7 in = 595.4 x 842.4 pt
    // and rounds to whole device pixels, so allow 1.5 pt. US Letter is 8.5 x 11 in = 612 x 792 pt.
    expect(Math.abs(demo.size[0] - 595.3)).toBeLessThan(1.5);
    expect(Math.abs(demo.size[1] - 841.9)).toBeLessThan(1.5);
    expect(demo.pages.length).toBeGreaterThan(10);
    expect(demo.pages[0]).toContain("Caution.");
    expect(demo.pages[0]).toContain("Verified at export.");
    expect(demo.pages[0]).toContain("Test information");
    demo.pages.forEach((p, i) => expect(p).toContain(`Page ${i + 1} of ${demo.pages.length}`));
    expect(demo.pages[demo.pages.length - 1]).toContain("Provenance");
    expect(demo.pages.join(" ")).toContain("379.92 ± 0.29 m²/d");
    const letter = await pdfText(join(dir, "from-template.pdf"));
    expect(Math.abs(letter.size[0] - 612)).toBeLessThan(1.5);
    expect(Math.abs(letter.size[1] - 792)).toBeLessThan(1.5);
    expect(letter.pages[0]).toContain("Caution.");
  }, 60_000);

  it("writes screenshots of the first pages of each report for a person to look at", async () => {
    await mkdir(SHOTS, { recursive: true });
    const browser = await launchChromium();
    try {
      // A4 at 96 px per inch: 794 x 1123 px a page.
      const page = await browser.newPage({ viewport: { width: 794, height: 1123 }, javaScriptEnabled: false });
      await page.route("**/*", (route) => route.abort());
      await page.emulateMedia({ media: "print" });
      for (const [name, { html }] of Object.entries(reports)) {
        await page.setContent(html, { waitUntil: "load" });
        const path = join(SHOTS, `${name}-first-pages.png`);
        await page.screenshot({ path, fullPage: false, clip: { x: 0, y: 0, width: 794, height: 2246 } });
        expect((await readFile(path)).subarray(1, 4).toString()).toBe("PNG");
      }
    } finally {
      await browser.close();
    }
  }, 60_000);
});

