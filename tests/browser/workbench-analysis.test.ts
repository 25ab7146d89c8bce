/**
 * Analysis by hand in the workbench, in Chromium: curve matching (drag, keys, sliders), data windows (brush,
 * click, keys, undo), Keep and the saved document verified by the CLI, the review view against a tampered
 * record, control changes and what moves, review notes through save and reload, and the template form against
 * `conebook new` byte for byte. Screenshots of each go to tests/browser/screenshots/ (analysis-*.png).
 */
import { execFile } from "node:child_process";
import { mkdir, mkdtemp, readFile, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import { theisDrawdown } from "@conebook/aquifer";
import { parseDocument, reviewNotes } from "@conebook/document";
import { DEMO, SCREENSHOTS, openDocument, runAndWait, startWorkbench, statusLine, waitForState, type PageLog, type Workbench } from "./workbench-harness.js";

const BIN = fileURLToPath(new URL("../../packages/cli/bin/conebook.js", import.meta.url));
const DEMO_TEXT = await readFile(new URL(`../../notebooks/${DEMO}`, import.meta.url), "utf8");
const TAMPERED = DEMO_TEXT.replace('"value":0.004397273941233874', '"value":0.005397273941233874');

let wb: Workbench;

beforeAll(async () => {
  wb = await startWorkbench(inject("chromiumPath"), {
    "match.cone.md": DEMO_TEXT,
    "windows.cone.md": DEMO_TEXT,
    "keys.cone.md": DEMO_TEXT,
    // Two recorded numbers changed by hand: the transmissivity in SI units, and the Theis RMSE in the comparison table.
    "tampered.cone.md": TAMPERED.replace("        75.44428496433848,", "        74.44428496433848,"),
    "controls.cone.md": DEMO_TEXT,
    "notes.cone.md": DEMO_TEXT,
  });
}, 60_000);

afterAll(async () => {
  await wb?.close();
});

function conebook(cwd: string, ...args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    execFile(process.execPath, [BIN, ...args], { cwd, timeout: 120_000 }, (error, stdout, stderr) => {
      resolve({ code: error ? ((error as { code?: number }).code ?? 1) : 0, stdout, stderr });
    });
  });
}

const fileText = (name: string) => readFile(join(wb.folder, name), "utf8");
const panel = "document.querySelector('cb-workbench').shadowRoot.querySelector('cb-match')";

async function fresh(path: string): Promise<{ page: Page; log: PageLog }> {
  const opened = await wb.newPage();
  await openDocument(wb, opened.page, path);
  return opened;
}

async function openPanel(page: Page, byKey = false): Promise<void> {
  if (byKey) await page.keyboard.press("Alt+Shift+M");
  else await page.locator("cb-workbench header.top").getByRole("button", { name: "Match by hand" }).click();
  await waitForState(page, "conebook-match-ready");
  await page.locator("cb-match .figures").waitFor();
}

/** A screenshot of one element, with the page's sticky bar let go for it (it would cover the element's top). */
async function shot(page: Page, selector: string, name: string): Promise<void> {
  const bar = "document.querySelector('cb-workbench').shadowRoot.querySelector('header.top').style.position";
  await page.evaluate(`${bar} = 'static'`);
  const el = page.locator(selector).first();
  await el.scrollIntoViewIfNeeded();
  await el.screenshot({ path: join(SCREENSHOTS, name) });
  await page.evaluate(`${bar} = ''`);
}

const parameterText = (page: Page, i: number) => page.locator("cb-match .param input[type=text]").nth(i).inputValue();
const rmseText = (page: Page) => page.locator("cb-match .figures .rmse").innerText();

function noErrors(log: PageLog): void {
  expect(log.consoleErrors).toEqual([]);
  expect(log.pageErrors).toEqual([]);
  expect(log.dialogs).toEqual([]);
}

describe("curve matching by hand", () => {
  it("moves the curve with a drag and with a slider, and the curve, T and the RMSE follow", async () => {
    const { page, log } = await fresh("match.cone.md");
    await openPanel(page);
    expect(await page.locator("cb-match select[aria-label='Observation record'] option").allInnerTexts()).toEqual(["KM-OB1 (records[0], r = 28 m)", "KM-OB2 (records[1], r = 85 m)"]);
    const path0 = await page.locator("cb-match .plot.loglog path.curve").getAttribute("d");
    const rmse0 = await rmseText(page);
    const t0 = Number(await parameterText(page, 0));
    const box = (await page.locator("cb-match .plot.loglog svg").boundingBox())!;
    await page.mouse.move(box.x + 250, box.y + 180);
    await page.mouse.down();
    await page.mouse.move(box.x + 270, box.y + 150, { steps: 5 });
    await page.mouse.up();
    await page.evaluate(`${panel}.updateComplete`);
    const t1 = Number(await parameterText(page, 0));
    // Dragging up raises the drawdown scale a, and T = Q W / (4 pi s) falls as 1 / a (Theis 1935).
    expect(t1).toBeLessThan(t0);
    expect(await page.locator("cb-match .plot.loglog path.curve").getAttribute("d")).not.toBe(path0);
    const rmse1 = await rmseText(page);
    expect(rmse1).not.toBe(rmse0);
    // The figure shown is the RMSE of the Theis drawdown at the panel's values against the record.
    const state = (await page.evaluate(`(() => { const p = ${panel}; return { v: Array.from(p.values), t: Array.from(p.record.t), s: Array.from(p.record.s) }; })()`)) as { v: number[]; t: number[]; s: number[] };
    const rms = Math.sqrt(state.t.reduce((a, t, i) => a + (state.s[i]! - theisDrawdown(state.v[0]!, state.v[1]!, 1450, 28, t)) ** 2, 0) / state.t.length);
    expect(Number(rmse1.replace(" m", ""))).toBeCloseTo(Number(rms.toPrecision(6)), 12);
    await shot(page, "cb-match", "analysis-01-drag.png");

    const slider = page.locator("cb-match .param input[type=range]").first();
    await slider.focus();
    for (let i = 0; i < 5; i++) await slider.press("ArrowRight");
    await page.evaluate(`${panel}.updateComplete`);
    expect(Number(await parameterText(page, 0))).toBeGreaterThan(t1);
    expect(await rmseText(page)).not.toBe(rmse1);
    // A typed value in another unit of transmissivity is converted: 0.005 m2/s = 432 m2/d (86400 s per day).
    const typed = page.locator("cb-match .param input[type=text]").first();
    await typed.fill("0.005 m2/s");
    await typed.press("Enter");
    await page.evaluate(`${panel}.updateComplete`);
    expect(await parameterText(page, 0)).toBe("432");
    expect(await page.locator("cb-match .matchpoint").innerText()).toContain("theisMatchPoint gives T = 432 m2/d");
    noErrors(log);
    await page.context().close();
  }, 120_000);

  it("works from the keyboard: keys open the panel, move the curve, select readings and leave them out; undo takes the window back", async () => {
    const { page, log } = await fresh("keys.cone.md");
    await page.locator('cb-cell[data-id="intro"] .frame').focus();
    await openPanel(page, true);
    const t0 = Number((await page.evaluate(`${panel}.values[0]`)) as number);
    await page.locator("cb-match .plot.loglog").focus();
    await page.keyboard.press("ArrowUp");
    await page.evaluate(`${panel}.updateComplete`);
    // One key press raises the drawdown scale by 10^0.01: T falls by that factor exactly.
    expect((await page.evaluate(`${panel}.values[0]`)) as number).toBeCloseTo(t0 / 10 ** 0.01, 9);
    await page.locator("cb-match").getByRole("radio", { name: "select readings" }).focus();
    await page.keyboard.press("Space");
    await page.locator("cb-match .plot.semilog").focus();
    await page.keyboard.press("Enter");
    for (let i = 0; i < 3; i++) await page.keyboard.press("Shift+ArrowRight");
    await page.locator("cb-match input.reason").focus();
    await page.keyboard.type("logger reset");
    await page.keyboard.press("Enter");
    await expect.poll(() => statusLine(page)).toContain("KM-OB1: readings from 0.5 to 0.73 min left out (logger reset); 4 left out in all");
    expect(await page.locator("cb-match .plot.loglog circle.left-out").count()).toBe(4);
    await shot(page, "cb-match", "analysis-02-keyboard-window.png");
    const ids = () => page.evaluate("document.querySelector('cb-workbench').store.doc.cells.map((c) => c.id)") as Promise<string[]>;
    expect((await ids()).slice(0, 6)).toEqual(["intro", "ob1-record", "ob2-record", "load-note", "load", "data-windows"]);
    await page.locator("cb-workbench header.top").getByRole("button", { name: "Undo" }).focus();
    await page.keyboard.press("Enter");
    expect(await ids()).not.toContain("data-windows");
    expect(await page.locator("cb-match .plot.loglog circle.left-out").count()).toBe(0);
    await page.locator('cb-cell[data-id="intro"] .frame').focus();
    await page.keyboard.press("Control+Shift+Z");
    expect(await ids()).toContain("data-windows");
    noErrors(log);
    await page.context().close();
  }, 120_000);

  it("saves a brushed window, draws its readings hollow with the reason, fits without them, and the kept cell passes conebook verify", async () => {
    const { page, log } = await fresh("windows.cone.md");
    await openPanel(page);
    const circles = page.locator("cb-match .plot.semilog circle");
    const a = (await circles.nth(0).boundingBox())!;
    const b = (await circles.nth(4).boundingBox())!;
    // From the centre of the first reading to just past the centre of the fifth (the readings lie a few px apart).
    await page.mouse.move(a.x + a.width / 2 - 1, a.y + 10);
    await page.mouse.down();
    await page.mouse.move(b.x + b.width / 2 + 1, a.y + 10, { steps: 4 });
    await page.mouse.up();
    await page.locator("cb-match input.reason").fill("well-bore storage");
    await page.locator("cb-match").getByRole("button", { name: "Leave out 5 readings" }).click();
    const hollow = page.locator("cb-match .plot.loglog circle.left-out");
    expect(await hollow.count()).toBe(5);
    expect(await hollow.first().locator("title").textContent()).toBe("0.5 min, 0.162 m: left out (well-bore storage)");
    await page.locator("cb-match").getByRole("button", { name: "Refine", exact: true }).click();
    await expect.poll(() => page.locator("cb-match table caption").first().innerText()).toMatch(/^65 readings, RMSE/);
    const refinedT = Number((await page.locator("cb-match table tbody tr").first().locator("td").nth(1).innerText()).trim());
    await shot(page, "cb-match", "analysis-03-window-refined.png");
    await page.locator("cb-match").getByRole("button", { name: "Keep, refined" }).click();
    await runAndWait(page);
    await page.locator("cb-workbench header.top").getByRole("button", { name: "Save" }).click();
    await waitForState(page, "conebook-saved");
    const saved = parseDocument(await fileText("windows.cone.md")).document;
    const windows = saved.cells.find((c) => c.id === "data-windows")!;
    expect(windows.source).toContain('"KM-OB1": [\n      { "from": 0.5, "to": 0.83, "reason": "well-bore storage" }\n    ]');
    const kept = saved.cells.find((c) => c.id === "match-km-ob1-theis")!;
    expect(kept.source).toContain("wells: [{ ...records[0], mask: windowMask(records[0]) }]");
    const fitTable = kept.outputs.find((o) => o.type === "table");
    const tRow = fitTable?.type === "table" ? fitTable.rows.find((row) => String(row[0]).startsWith("T ")) : undefined;
    expect(Number((tRow![1] as number).toPrecision(6))).toBe(refinedT);
    expect(kept.outputs.find((o) => o.type === "value" && o.label === "readings used")).toMatchObject({ value: 65 });
    await page.locator('cb-cell[data-id="match-km-ob1-theis"]').scrollIntoViewIfNeeded();
    await shot(page, 'cb-cell[data-id="match-km-ob1-theis"]', "analysis-04-kept-cell.png");
    const verify = await conebook(wb.folder, "verify", "windows.cone.md");
    expect(verify.stdout).toMatch(/windows\.cone\.md: verified: all \d+ recorded outputs of 23 cells/);
    expect(verify.code).toBe(0);
    noErrors(log);
    await page.context().close();
  }, 180_000);
});

describe("the review view", () => {
  it("reports a tampered recorded number at its cell, highlights a changed table cell, and every other cell reproduced", async () => {
    const { page, log } = await fresh("tampered.cone.md");
    await page.locator('cb-cell[data-id="intro"] .frame').focus();
    await page.keyboard.press("Alt+Shift+V");
    await waitForState(page, "conebook-reviewed");
    expect(await page.locator("cb-workbench .review-summary").innerText()).toMatch(/^2 of 21 cells differ from the record; 1 narrative reference fails \(rtol 1e-9, as conebook verify\)/);
    expect(await page.locator('cb-cell[data-id="result"] cb-review-cell li').allInnerTexts()).toEqual(["outputs[1].value: recorded 0.00539727, rerun 0.00439727 (relative difference 1.85e-1)"]);
    const moved = page.locator('cb-cell[data-id="compare"] cb-review-cell td.moved');
    expect(await moved.count()).toBe(1);
    expect(await page.locator("cb-review-cell .badge.reproduced").count()).toBe(19);
    expect(await page.locator("cb-workbench section.review").innerText()).toContain("reference {=result/transmissivity in SI units}: recorded 0.005397273941233874, now 0.004397273941233874");
    await shot(page, "cb-workbench section.review", "analysis-05-review-summary.png");
    await shot(page, 'cb-cell[data-id="compare"]', "analysis-06-review-table.png");
    noErrors(log);
    await page.context().close();
  }, 120_000);

  it("reruns with a changed control, lists what moved against the record, and saving records the value so that verify passes", async () => {
    const { page, log } = await fresh("controls.cone.md");
    await page.locator("cb-workbench header.top").getByRole("button", { name: "Review" }).click();
    await waitForState(page, "conebook-reviewed");
    expect(await page.locator("cb-workbench .review-summary").innerText()).toMatch(/^All 21 cells reproduced/);
    const input = page.locator('cb-cell[data-id="forecast-controls"] input.control-number').first();
    await input.scrollIntoViewIfNeeded();
    await page.evaluate("document.body.dataset.conebook = 'waiting'");
    await input.fill("2000");
    await input.press("Enter");
    await waitForState(page, "conebook-ran");
    const table = page.locator('cb-cell[data-id="forecast"] cb-outputs table caption').first();
    expect(await table.innerText()).toBe("Forecast drawdown at KM-FW, 400 m from KM-PW1, after 30 d at 2000 m3/d");
    const rows = await page.locator("cb-workbench section.review .moves tbody tr").allInnerTexts();
    expect(rows.some((r) => r.startsWith("forecast-controls\tcontrol proposed_rate (m3/d)\t1450\t2000\t+37.9 %"))).toBe(true);
    // Drawdown is proportional to the rate in every model here (linear in Q): the forecast moves by the same 37.9 %,
    // and nothing above the control cell moves at all.
    expect(rows.some((r) => /^forecast\tForecast drawdown .*Hantush-Jacob \(preferred\), drawdown \(m\)\t.*\+37\.9 %$/.test(r))).toBe(true);
    expect(rows.every((r) => /^(forecast-controls|forecast)\t/.test(r))).toBe(true);
    await shot(page, "cb-workbench section.review", "analysis-07-what-moves.png");
    await shot(page, 'cb-cell[data-id="forecast-controls"]', "analysis-08-controls.png");
    await page.locator("cb-workbench header.top").getByRole("button", { name: "Save" }).click();
    await waitForState(page, "conebook-saved");
    const recorded = parseDocument(await fileText("controls.cone.md")).document.cells.find((c) => c.id === "forecast-controls")!.outputs[0];
    expect(recorded).toMatchObject({ type: "control", name: "proposed_rate", value: 2000, default: 1450 });
    const verify = await conebook(wb.folder, "verify", "controls.cone.md");
    expect(verify.code).toBe(0);
    noErrors(log);
    await page.context().close();
  }, 180_000);

  it("keeps a review note through save and reload, answers and resolves it in the page, and conebook verify lists it", async () => {
    const { page, log } = await fresh("notes.cone.md");
    await page.locator('cb-cell[data-id="fit-leaky"] .frame').focus();
    await page.keyboard.press("Alt+Shift+R");
    const form = page.locator('cb-cell[data-id="fit-leaky"] cb-note-form');
    await form.locator("input").fill("R. E. Viewer");
    await form.locator("textarea").focus();
    await page.keyboard.type("B runs to about 900 m; is the leakage real, or a recharge boundary?");
    await page.keyboard.press("Control+Enter");
    await page.locator("cb-workbench header.top").getByRole("button", { name: "Save" }).click();
    await waitForState(page, "conebook-saved");
    await openDocument(wb, page, "notes.cone.md");
    const note = page.locator('cb-cell[data-id="fit-leaky-note-1"] cb-note');
    expect(await note.locator(".card").innerText()).toContain("Challenge from R. E. Viewer: B runs to about 900 m; is the leakage real, or a recharge boundary?");
    await note.getByRole("button", { name: "Answer" }).click();
    await note.locator("input").fill("A. N. Analyst");
    await note.locator("textarea").fill("Both wells show the fall at the same time; see the derivative cell.");
    await note.getByRole("button", { name: "Add the answer" }).click();
    await page.locator('cb-cell[data-id="fit-leaky-note-1"] cb-note').getByRole("button", { name: "Resolve" }).click();
    await shot(page, 'cb-cell[data-id="fit-leaky-note-1"]', "analysis-09-review-note.png");
    await page.locator('cb-cell[data-id="fit-leaky-note-1"] .frame').focus();
    await page.keyboard.press("Control+s");
    await waitForState(page, "conebook-saved");
    const text = await fileText("notes.cone.md");
    expect(reviewNotes(parseDocument(text).document)).toMatchObject([
      {
        id: "fit-leaky-note-1",
        on: "fit-leaky",
        status: "resolved",
        entries: [
          { kind: "challenge", who: "R. E. Viewer", text: "B runs to about 900 m; is the leakage real, or a recharge boundary?" },
          { kind: "answer", who: "A. N. Analyst", text: "Both wells show the fall at the same time; see the derivative cell." },
        ],
      },
    ]);
    const verify = await conebook(wb.folder, "verify", "notes.cone.md");
    expect(verify.code).toBe(0);
    expect(verify.stdout).toMatch(/notes\.cone\.md:\d+: review note fit-leaky-note-1 on cell fit-leaky: resolved: Challenge from R\. E\. Viewer: B runs to about 900 m; is the leakage real, or a recharge boundary\? \(1 more entry\)/);
    noErrors(log);
    await page.context().close();
  }, 180_000);
});

describe("the template form", () => {
  const TEMPLATE = "templates/constant-rate-test.cone.md";

  async function fill(page: Page, out: string, csvPath: string): Promise<void> {
    await page.getByRole("button", { name: "Make a document from it" }).click();
    const form = page.locator("cb-template-form");
    await form.locator("#param-rate").fill("12 L/s");
    await form.locator("#param-distance").fill("40");
    await form.locator("#param-static_depth").fill("8.72");
    await form.locator("#param-site").fill("Tern Gap (invented)");
    await form.locator("#param-pumped_well").fill("TG-PW1");
    await form.locator("#param-observation_well").fill("TG-OB2");
    await form.locator('input[type="file"]').setInputFiles(csvPath);
    await form.locator("#info-analyst").fill("P. Q. Hydro (invented)");
    await form.locator("#doc-title").fill("Constant-rate test at Tern Gap, TG-OB2 (invented)");
    await form.locator("#out-path").fill(out);
  }

  const CLI_SETS = ["--set", "rate=12 L/s", "--set", "distance=40", "--set", "static_depth=8.72", "--set", "duration=1440", "--set", "site=Tern Gap (invented)", "--set", "pumped_well=TG-PW1", "--set", "observation_well=TG-OB2"];
  const CLI_REST = ["--info", "analyst=P. Q. Hydro (invented)", "--title", "Constant-rate test at Tern Gap, TG-OB2 (invented)"];

  it("makes the document conebook new writes from the same values, byte for byte, and keeps no demonstration value unconfirmed", async () => {
    const outside = await mkdtemp(join(tmpdir(), "conebook-form-"));
    // An invented record of TG-OB2 with the slot's own columns.
    const csv = "elapsed_min,depth_to_water_m\n1,8.80\n10,9.12\n100,9.44\n1000,9.71\n";
    await writeFile(join(outside, "tg-ob2.csv"), csv);
    const { page, log } = await fresh(TEMPLATE);
    await fill(page, "tern-gap.cone.md", join(outside, "tg-ob2.csv"));
    const form = page.locator("cb-template-form");
    const make = form.getByRole("button", { name: "Make the document" });
    expect(await make.isDisabled()).toBe(true);
    expect(await form.locator(".actions [role=status]").innerText()).toBe("Change or confirm duration: a template's values belong to its demonstration");
    await form.getByRole("checkbox", { name: "Confirm the value of duration" }).check();
    expect(await form.locator(".ok", { hasText: "converted from 12 L/s" }).innerText()).toBe("= 1036.8000000000002 m3/d (converted from 12 L/s)");
    expect(await form.locator("code.pin").innerText()).toMatch(/^[0-9a-f]{64}$/);
    await shot(page, "cb-workbench dialog.template-form", "analysis-10-template-form.png");
    await make.click();
    await waitForState(page, "conebook-made");
    await mkdir(join(wb.folder, "by-cli"), { recursive: true });
    const cli = await conebook(wb.folder, "new", TEMPLATE, "-o", "by-cli/tern-gap.cone.md", ...CLI_SETS, "--data", `obs=${join(outside, "tg-ob2.csv")}`, ...CLI_REST);
    expect(cli.code).toBe(0);
    const byForm = await readFile(join(wb.folder, "tern-gap.cone.md"));
    expect(byForm.equals(await readFile(join(wb.folder, "by-cli/tern-gap.cone.md")))).toBe(true);
    expect((await readFile(join(wb.folder, "data/tg-ob2.csv"), "utf8"))).toBe(csv);
    expect(await statusLine(page)).toContain("Made tern-gap.cone.md from the template with data/tg-ob2.csv");
    noErrors(log);
    await page.context().close();
  }, 120_000);

  it("maps a file's columns in other units to the slot's, and conebook new given the mapped file writes the same bytes", async () => {
    const outside = await mkdtemp(join(tmpdir(), "conebook-form-"));
    await writeFile(join(outside, "tg-ob3.csv"), "time_h,depth_ft\n0.1,28.9\n0.5,29.6\n1,30.1\n5,31.0\n");
    const { page, log } = await fresh(TEMPLATE);
    await fill(page, "tern-gap-3.cone.md", join(outside, "tg-ob3.csv"));
    const form = page.locator("cb-template-form");
    await form.getByRole("checkbox", { name: "Confirm the value of duration" }).check();
    await form.locator("#map-obs-elapsed_min").selectOption("time_h");
    await form.locator("#map-obs-depth_to_water_m").selectOption("depth_ft");
    await form.getByRole("textbox", { name: "unit of the file's column for elapsed_min" }).fill("h");
    await form.getByRole("textbox", { name: "unit of the file's column for elapsed_min" }).press("Tab");
    await form.getByRole("textbox", { name: "unit of the file's column for depth_to_water_m" }).fill("ft");
    await form.getByRole("textbox", { name: "unit of the file's column for depth_to_water_m" }).press("Tab");
    await form.locator("fieldset .ok").scrollIntoViewIfNeeded();
    await shot(page, "cb-workbench dialog.template-form", "analysis-11-template-mapping.png");
    await form.getByRole("button", { name: "Make the document" }).click();
    await waitForState(page, "conebook-made");
    const mapped = await readFile(join(wb.folder, "data/tg-ob3.obs.csv"), "utf8");
    // 0.1 h = 6 min; 28.9 ft = 8.80872 m (1 ft = 0.3048 m exactly, NIST SP 811 B.8).
    expect(mapped).toBe("elapsed_min,depth_to_water_m\n6,8.80872\n30,9.02208\n60,9.17448\n300,9.4488\n");
    await writeFile(join(outside, "tg-ob3.obs.csv"), mapped);
    const cli = await conebook(wb.folder, "new", TEMPLATE, "-o", "by-cli/tern-gap-3.cone.md", ...CLI_SETS, "--data", `obs=${join(outside, "tg-ob3.obs.csv")}`, ...CLI_REST);
    expect(cli.code).toBe(0);
    expect((await readFile(join(wb.folder, "tern-gap-3.cone.md"))).equals(await readFile(join(wb.folder, "by-cli/tern-gap-3.cone.md")))).toBe(true);
    noErrors(log);
    await page.context().close();
  }, 120_000);
});
