/**
 * Markup in every user-controlled field of a report executes nothing and requests nothing: the payloads of
 * tests/support/markup-payloads.ts go into the title, the test information (site, analyst, well names and notes),
 * the narrative, a value output, a table output's cells, an error message and the values of a data table; the
 * document is run, exported through `conebook export` (in process, the code the binary runs) and the report is
 * loaded in Chromium with JavaScript enabled. Every payload tries to call a function the test exposes, open a
 * dialog or make a request; the test counts each and asserts none. The page's own check of a hostile document is
 * tests/browser/workbench-security.test.ts.
 */
import { mkdtemp, readFile, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { main, type Io } from "../packages/cli/src/index.js";
import { launchChromium } from "../packages/cli/src/report/pdf.js";
import { MARKUP_PAYLOADS } from "./support/markup-payloads.js";

const quoteYaml = (s: string): string => `'${s.replace(/'/g, "''")}'`;
const quoteCsv = (s: string): string => `"${s.replace(/"/g, '""')}"`;

/** The fields a payload is placed in, each once per payload. */
const FIELDS = ["title", "site", "analyst", "well name", "well notes", "narrative", "value output", "table output", "data value"] as const;

function hostileDocument(): string {
  const all = MARKUP_PAYLOADS.map((p) => p.text);
  const joined = all.join(" ");
  const wells = all.map((p, i) => `    - {name: ${quoteYaml(`OB-${i} ${p}`)}, role: observation, distance: ${10 + i}, notes: ${quoteYaml(p)}}`);
  return [
    "---",
    "conebook: 1",
    `title: ${quoteYaml(`Hostile report at Marrow Fen (invented) ${joined}`)}`,
    "seed: 2",
    "testInformation:",
    `  site: ${quoteYaml(`Marrow Fen (invented) ${joined}`)}`,
    `  analyst: ${quoteYaml(`A. Analyst (invented) ${joined}`)}`,
    "  units: {length: m, time: min, rate: m3/d}",
    "  wells:",
    `    - {name: MF-PW1, role: pumped, screen: [10, 20], radius: 0.1}`,
    ...wells,
    "  rates:",
    "    - {from: 0, to: 1440, rate: 800}",
    "---",
    "",
    "[narrative:intro]: #",
    "",
    "A report whose every field carries markup (invented scenario).",
    "",
    ...all.flatMap((p) => [p, ""]),
    "```ts code:payload-values",
    `const payloads = ${JSON.stringify(all)};`,
    "payloads",
    "```",
    "",
    "```ts code:payload-table",
    `show.table(payloads.map((p, i) => ({ n: i, text: p })), { title: ${JSON.stringify(`Payloads ${all[0]}`)} });`,
    "```",
    "",
    "```csv data:payload-data name=payload_data",
    "n,text",
    ...all.map((p, i) => `${i},${quoteCsv(p)}`),
    "```",
    "",
    "```ts code:payload-error",
    `throw new Error(${JSON.stringify(`refused on purpose: ${joined}`)});`,
    "```",
    "",
  ].join("\n");
}

let dir: string;
let html: string;

async function conebook(cwd: string, ...argv: string[]): Promise<{ code: number; err: string }> {
  let err = "";
  const io: Io = { out: () => undefined, err: (t) => void (err += `${t}\n`), cwd, progress: false };
  return { code: await main(argv, io), err };
}

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), "conebook-markup-"));
  await writeFile(join(dir, "hostile.cone.md"), hostileDocument());
  // The last cell fails on purpose (its message carries the payloads): export reruns the document, writes the
  // report with the error in it and a note on stderr.
  const exported = await conebook(dir, "export", "hostile.cone.md", "-o", "hostile.html", "--rerun");
  expect(exported.code, exported.err).toBe(0);
  expect(exported.err).toContain("payload-error");
  html = await readFile(join(dir, "hostile.html"), "utf8");
}, 120_000);

afterAll(async () => {
  if (dir) await rm(dir, { recursive: true, force: true });
});

describe("markup in every user-controlled field of the report", () => {
  it("holds at least 50 distinct payloads", () => {
    expect(MARKUP_PAYLOADS.length).toBeGreaterThanOrEqual(50);
    expect(new Set(MARKUP_PAYLOADS.map((p) => p.text)).size).toBe(MARKUP_PAYLOADS.length);
  });

  it("keeps each payload as text in the narrative, the outputs and the data", () => {
    const escaped = (s: string) => s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");
    // The first payload is a script tag: it appears escaped, never as a tag.
    expect(html).toContain(escaped(MARKUP_PAYLOADS[0]!.text));
    expect(html).toContain("refused on purpose");
    // A narrative image from outside the document is shown as text, not fetched (packages/document/src/render.ts).
    expect(html).toContain("[image not loaded: md image (http://127.0.0.1:9/md.png)]");
    expect(html).not.toMatch(/<script/i);
    expect(html).not.toMatch(/<(iframe|object|embed|base|form|meta http-equiv="refresh"|img|video|audio|input|isindex)\b/i);
    expect(html).not.toMatch(/<link (?!rel="icon" href="data:,")/i);
  });

  it("executes nothing, opens no dialog and makes no request when the report is opened in Chromium", async () => {
    const browser = await launchChromium();
    const hits: string[] = [];
    const dialogs: string[] = [];
    const requests: string[] = [];
    try {
      const context = await browser.newContext({ javaScriptEnabled: true });
      const page = await context.newPage();
      await page.exposeFunction("__hit", (name: string) => void hits.push(name));
      page.on("dialog", (d) => {
        dialogs.push(d.message());
        void d.dismiss();
      });
      page.on("request", (r) => {
        if (!r.url().startsWith("data:") && r.url() !== "about:blank") requests.push(r.url());
      });
      await page.route("**/*", (route) => (route.request().url().startsWith("data:") ? route.continue() : route.abort()));
      await page.setContent(html, { waitUntil: "load" });
      // Give timers, animations, focus and toggles their chance; then move the pointer over everything.
      await page.mouse.move(10, 10);
      for (let y = 0; y < 3000; y += 150) await page.mouse.move(300, y);
      await page.keyboard.press("Tab");
      await page.waitForTimeout(500);
      const text = await page.locator("body").innerText();
      expect(text).toContain("__hit(");
    } finally {
      await browser.close();
    }
    expect(hits).toEqual([]);
    expect(dialogs).toEqual([]);
    expect(requests).toEqual([]);
    console.log(
      `markup: ${MARKUP_PAYLOADS.length} payloads in ${FIELDS.length} fields of the report (${FIELDS.join(", ")}), ` +
        `opened in Chromium: ${hits.length} executions, ${dialogs.length} dialogs, ${requests.length} requests`,
    );
  }, 60_000);
});
