/**
 * The workbench page in Chromium, as a user drives it: open the demo, read it, edit and rerun a code cell, see
 * every chart drawn, save and reload (byte comparison with the file on disk), a save conflict and its choices,
 * a save that fails, stopping an endless loop, the recovery copy after a closed tab, a document that does not
 * parse, and editing by keyboard with undo across cells. Screenshots of the main states go to
 * tests/browser/screenshots/. The documents are copies of notebooks/ in a temporary folder.
 */
import { readFile, writeFile } from "node:fs/promises";
import { join } from "node:path";
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import { parseDocument } from "@conebook/document";
import { DEMO, SCREENSHOTS, lastRunOutputs, openDocument, runAndWait, startWorkbench, editorText, statusLine, typeAtEnd, waitForState, type PageLog, type Workbench } from "./workbench-harness.js";

const ENDLESS = `---
conebook: 1
title: A loop that never ends (test document)
seed: 5
limits:
  cellTimeMs: 20000
---

[narrative:why]: #

The first cell spins until it is stopped.

\`\`\`ts code:spin
let turns = 0;
while (turns >= 0) turns++;
\`\`\`

\`\`\`ts code:after
"after the loop"
\`\`\`
`;

const BROKEN = `---
conebook: 1
title: [an unclosed list
seed: 1
---

Some text.
`;

let wb: Workbench;
let page: Page;
let log: PageLog;

beforeAll(async () => {
  wb = await startWorkbench(inject("chromiumPath"), { "endless.cone.md": ENDLESS, "broken.cone.md": BROKEN });
  ({ page, log } = await wb.newPage());
}, 60_000);

afterAll(async () => {
  await wb?.close();
});

const cell = (id: string) => page.locator(`cb-cell[data-id="${id}"]`);
const fileText = (name: string) => readFile(join(wb.folder, name), "utf8");
const shot = (name: string) => page.screenshot({ path: join(SCREENSHOTS, `${name}.png`) });

describe("the workbench page on the demo", () => {
  it("opens the demo with the caution visible, every cell shown, and only its own server asked for anything", async () => {
    await openDocument(wb, page, DEMO);
    await expect.poll(() => page.locator("cb-workbench .caution").innerText()).toMatch(/qualified professionals.*Local regulations, permits and licensed practice govern/s);
    expect(await page.locator("cb-cell").count()).toBeGreaterThan(30);
    expect(await cell("intro").locator(".prose h1").innerText()).toBe("Constant-rate test of KM-PW1 at Kestrel Moor");
    await expect.poll(() => cell("ob1-record").locator(".pin").innerText()).toMatch(/data\/kestrel-moor-km-ob1\.csv.*6c707a63c3ff9f3fa178680c25355151eec98ae52396703ae4df4a39c271fc1f.*bytes match/s);
    expect(await cell("ob1-record").locator(".hint").innerText()).toBe("70 rows × 2 columns");
    expect(await page.locator("cb-workbench nav.outline").getByRole("button", { name: "Residuals" }).count()).toBe(1);
    await shot("01-demo-opened");
    expect(log.consoleErrors).toEqual([]);
    expect(log.pageErrors).toEqual([]);
    expect(log.requests.filter((u) => !u.startsWith(`${wb.server.origin}/${wb.server.token}/`) && !u.startsWith("data:"))).toEqual([]);
  });

  it("draws every chart output of every chart cell with marks (SVG elements present) as it comes into view, from the recorded outputs", async () => {
    const charts = await page.evaluate(`[...document.querySelector('cb-workbench').store.doc.cells].filter((c) => c.kind === 'chart').map((c) => c.id)`) as string[];
    expect(charts.length).toBeGreaterThanOrEqual(5);
    for (const id of charts) {
      // Charts are drawn as they come near the screen.
      await cell(id).scrollIntoViewIfNeeded();
      const marks = cell(id).locator("cb-chart svg g[class*='mark-'] path, cb-chart svg g[class*='mark-'] line");
      await expect.poll(() => marks.count(), { message: `marks of chart ${id}`, timeout: 15_000 }).toBeGreaterThan(0);
    }
    await cell("fit-loglog").scrollIntoViewIfNeeded();
    await shot("02-chart-cell");
  });

  it("runs the whole demo in the worker and shows every cell as ran, with times", async () => {
    await runAndWait(page);
    expect(await statusLine(page)).toMatch(/^Ran 21 cells in (\d+ ms|\d+(\.\d)? s); saving records these outputs$/);
    expect(await cell("fit-theis").locator(".status").innerText()).toMatch(/^ran in \d+ ms$/);
    expect(await page.locator("cb-cell .stale").count()).toBe(0);
  });

  it("edits a code cell, marks it and the cells below it out of date, and shows the edit's effect after a rerun", async () => {
    await typeAtEnd(page, "fit-theis", "\nshow.value(theis.parameters[0].estimate * 2, \"m2/d\", \"twice T, an edit\");");
    await expect.poll(() => cell("fit-theis").locator(".stale").count()).toBe(1);
    expect(await cell("forecast").locator(".stale").count()).toBe(1);
    expect(await cell("cooper-jacob").locator(".stale").count()).toBe(0);
    expect(await page.locator("cb-workbench .state").first().innerText()).toBe("unsaved changes");
    await shot("03-edited-out-of-date");
    await runAndWait(page, () => page.keyboard.press("Control+Shift+Enter"));
    const value = cell("fit-theis").locator("cb-outputs .value").filter({ hasText: "twice T" });
    expect(await value.innerText()).toBe("twice T, an edit = 891.158 m2/d");
    expect(await page.locator("cb-cell .stale").count()).toBe(0);
  });

  it("saves only the edited cell and the outputs it changed, and a reload shows the edit (bytes compared with the file)", async () => {
    const before = await fileText(DEMO);
    await page.keyboard.press("Control+s");
    await expect.poll(() => statusLine(page)).toMatch(/^Saved kestrel-moor-constant-rate\.cone\.md and recorded the outputs of 1 cells$/);
    const after = await fileText(DEMO);
    const editedLine = 'show.value(theis.parameters[0].estimate * 2, "m2/d", "twice T, an edit");';
    const newOutputs = /(```json outputs:fit-theis\n[\s\S]*?\n```)/.exec(after)![1]!;
    const oldOutputs = /(```json outputs:fit-theis\n[\s\S]*?\n```)/.exec(before)![1]!;
    const expected = before
      .replace('show.value(theis.correlation[0][1], "1", "correlation of T and S");\n```', `show.value(theis.correlation[0][1], "1", "correlation of T and S");\n${editedLine}\n\`\`\``)
      .replace(oldOutputs, newOutputs);
    expect(after).toBe(expected);
    expect(newOutputs).toContain('"label":"twice T, an edit"');
    await page.reload();
    await waitForState(page, "conebook-interactive");
    expect(await editorText(page, "fit-theis")).toContain(editedLine);
    expect(await page.locator("cb-workbench .state").first().innerText()).toBe("saved");
  });

  it("refuses to overwrite a file changed on disk, compares, and keeps the page's version as a copy", async () => {
    await typeAtEnd(page, "result", "\n// mine");
    const theirs = (await fileText(DEMO)).replace("## Conclusion", "## Conclusion (changed on disk)");
    await writeFile(join(wb.folder, DEMO), theirs);
    await page.keyboard.press("Control+s");
    const dialog = page.locator("cb-workbench dialog.conflict");
    await expect.poll(() => dialog.count()).toBe(1);
    expect(await fileText(DEMO)).toBe(theirs);
    await dialog.getByRole("button", { name: "Compare" }).click();
    const diff = dialog.locator(".diff");
    expect(await diff.locator(".removed").allInnerTexts()).toEqual(["− ## Conclusion (changed on disk)"]);
    expect(await diff.locator(".added").allInnerTexts()).toEqual(["+ // mine", "+ ## Conclusion"]);
    await shot("04-save-conflict");
    await dialog.getByRole("button", { name: "Keep mine as a copy" }).click();
    await expect.poll(() => statusLine(page)).toMatch(/^Your version was saved as kestrel-moor-constant-rate\.copy-1\.cone\.md/);
    const copy = await fileText("kestrel-moor-constant-rate.copy-1.cone.md");
    expect(copy).toContain("\n// mine\n```");
    expect(copy).toContain("\n## Conclusion\n");
    expect(await fileText(DEMO)).toBe(theirs);
  });

  it("leaves the file untouched and keeps the edits when the write fails", async () => {
    await openDocument(wb, page, DEMO);
    const before = await fileText(DEMO);
    await typeAtEnd(page, "compare", "\n// kept although the disk refused");
    wb.failWrites = "ENOSPC";
    try {
      await page.keyboard.press("Control+s");
      await expect.poll(() => statusLine(page)).toMatch(/^Not saved: saving kestrel-moor-constant-rate\.cone\.md: ENOSPC.*The file on disk is as it was; your edits are still here/);
    } finally {
      wb.failWrites = undefined;
    }
    expect(await fileText(DEMO)).toBe(before);
    expect(await editorText(page, "compare")).toContain("// kept although the disk refused");
    const kept = await page.evaluate(`localStorage.getItem('conebook.recovery:${DEMO}')`);
    expect(JSON.parse(kept as string).text).toContain("// kept although the disk refused");
  });

  it("offers the recovery copy again after the tab was closed, and restores it as an unsaved change", async () => {
    await page.close();
    ({ page, log } = await wb.newPage());
    // A new tab of the same origin reads the same storage only within one browser context: reuse the old one.
    await page.close();
    const context = wb.browser.contexts()[0]!;
    page = await context.newPage();
    await openDocument(wb, page, DEMO);
    const banner = page.locator("cb-workbench .banner").filter({ hasText: "Unsaved edits" });
    await expect.poll(() => banner.count()).toBe(1);
    await shot("05-recovery-offered");
    await banner.getByRole("button", { name: "Restore them" }).click();
    expect(await editorText(page, "compare")).toContain("// kept although the disk refused");
    expect(await page.locator("cb-workbench .state").first().innerText()).toBe("unsaved changes");
  });
});

describe("stopping a run", () => {
  it("stops an endless loop with the stop control while the page stays responsive, and the next run works", async () => {
    await openDocument(wb, page, "endless.cone.md");
    await page.evaluate("document.body.dataset.conebook = 'waiting'");
    await page.locator("cb-workbench header.top").getByRole("button", { name: "Run all" }).click();
    await expect.poll(() => cell("spin").locator(".status").innerText()).toBe("running");
    // The page answers while the worker spins: typing into the next cell goes through.
    await typeAtEnd(page, "after", " + \" (typed during the loop)\"");
    await shot("06-running-endless-loop");
    await page.locator("cb-workbench header.top").getByRole("button", { name: "Stop" }).click();
    await waitForState(page, "conebook-ran");
    expect(await statusLine(page)).toBe("Run stopped: stopped by the user. The next run starts a fresh kernel.");
    expect(await cell("spin").locator(".status").innerText()).toBe("stopped");
    expect(await page.evaluate("document.querySelector('cb-workbench').kernel.workersStarted")).toBe(1);
    // Fix the loop and run again in a fresh worker.
    const editor = cell("spin").locator("cb-editor .cm-content");
    await editor.click();
    await page.keyboard.press("Control+a");
    await page.keyboard.type("let turns = 0;\nwhile (turns < 1000) turns++;");
    await runAndWait(page);
    expect(await page.evaluate("document.querySelector('cb-workbench').kernel.workersStarted")).toBe(2);
    expect((await lastRunOutputs(page)).after).toEqual([{ type: "text", text: "after the loop (typed during the loop)" }]);
  });
});

describe("bad input", () => {
  it("shows a failed cell's error below it and marks it at the user's line in the editor", async () => {
    await openDocument(wb, page, DEMO);
    await typeAtEnd(page, "compare", "\nconst broken = undefinedName * 2;");
    await runAndWait(page);
    const error = cell("compare").locator("cb-outputs .error");
    // The typed line is the cell's last: one more than the lines of its source in the file.
    const compareLines = parseDocument(await fileText(DEMO)).document.cells.find((c) => c.id === "compare")!.source.split("\n").length;
    expect(await error.innerText()).toMatch(new RegExp(`^Error kestrel-moor-constant-rate\\.cone\\.md:\\d+:\\d+ \\(line ${compareLines + 1} of the cell\\): ReferenceError: .*undefinedName`));
    await expect.poll(() => cell("compare").locator("cb-editor .cm-lint-marker-error").count()).toBe(1);
    const markedLine = await cell("compare").locator("cb-editor .cm-gutterElement:has(.cm-lint-marker-error)").count();
    expect(markedLine).toBe(1);
    expect(await cell("residual-plot").locator(".status").innerText()).toMatch(/^ran in \d+ ms$/);
    expect(await cell("result").locator(".status").innerText()).toBe("not run");
    expect(await statusLine(page)).toMatch(/^Cell compare failed/);
    await error.scrollIntoViewIfNeeded();
    await shot("12-failed-cell");
    await page.keyboard.press("Control+z");
  });

  it("reads pinned data through the server and says so when a data file changed since it was pinned", async () => {
    const csv = join(wb.folder, "data", "kestrel-moor-km-ob2.csv");
    const original = await readFile(csv, "utf8");
    await writeFile(csv, original.replace("\n2880.00,", "\n2880.50,"));
    await openDocument(wb, page, DEMO);
    await expect.poll(() => cell("ob2-record").locator(".pin .bad").innerText()).toMatch(/^The file changed since it was pinned: it now has SHA-256 [0-9a-f]{64}\.$/);
    await runAndWait(page);
    expect(await cell("ob2-record").locator("cb-outputs .error").innerText()).toMatch(/the file data\/kestrel-moor-km-ob2\.csv has SHA-256 [0-9a-f]{64}, but the document pins e04dd73e9ee2715281008108b16868f8edf2797b20cd9559ff70403ac96c0af5/);
    await writeFile(csv, original);
  });

  it("opens a document that does not parse in a plain-text editor with the error's line and column marked", async () => {
    await openDocument(wb, page, "broken.cone.md");
    const banner = page.locator("cb-workbench .banner.error");
    // The YAML reader notices the unclosed flow list where the next key starts: line 4, column 1.
    expect(await banner.innerText()).toMatch(/does not open as cells[\s\S]*broken\.cone\.md:4:1: the header is not valid YAML/);
    expect(await page.locator("cb-workbench cb-editor.raw .cm-content").innerText()).toContain("title: [an unclosed list");
    await expect.poll(() => page.locator("cb-workbench cb-editor.raw .cm-lint-marker-error").count()).toBe(1);
    await shot("07-document-does-not-parse");
  });

  it("shows a chart spec's validation error in the cell while it is typed", async () => {
    await openDocument(wb, page, DEMO);
    await cell("semilog").scrollIntoViewIfNeeded();
    await cell("semilog").locator("cb-editor .cm-content").click();
    await page.keyboard.press("Control+Home");
    await page.keyboard.type("usermeta: {embedOptions: {actions: true}}\n");
    const problems = cell("semilog").locator(".problems");
    await expect.poll(() => problems.innerText()).toMatch(/usermeta/);
    await page.keyboard.press("Control+z");
    await expect.poll(() => problems.count()).toBe(0);
  });
});

describe("editing by keyboard", () => {
  it("adds, types into, moves, changes the kind of and deletes cells from the keyboard, with undo and redo across cells", async () => {
    await openDocument(wb, page, DEMO);
    const count = await page.locator("cb-cell").count();
    await cell("preview").locator(".frame").focus();
    await page.keyboard.press("Alt+Shift+N");
    await expect.poll(() => page.locator("cb-cell").count()).toBe(count + 1);
    await page.keyboard.type("1 + 1");
    await page.keyboard.press("Escape");
    const ids = () => page.evaluate("[...document.querySelector('cb-workbench').store.doc.cells].map((c) => c.id)") as Promise<string[]>;
    const around = async () => {
      const all = await ids();
      const i = all.indexOf("code-1");
      return all.slice(i - 1, i + 2);
    };
    expect((await around()).slice(0, 2)).toEqual(["preview", "code-1"]);
    await page.keyboard.press("Alt+Shift+ArrowUp");
    expect(await around()).toEqual(["load", "code-1", "preview"]);
    await typeAtEnd(page, "load", "\n// second edit");
    await page.keyboard.press("Escape");
    await page.keyboard.press("Alt+Shift+K");
    await shot("08-keyboard-editing");
    await page.keyboard.press("Control+z"); // kind change of load
    await page.keyboard.press("Control+z"); // the typing in load
    expect(await editorText(page, "load")).not.toContain("// second edit");
    await page.keyboard.press("Control+z"); // the move
    expect((await around()).slice(0, 2)).toEqual(["preview", "code-1"]);
    await page.keyboard.press("Control+Shift+z");
    expect(await around()).toEqual(["load", "code-1", "preview"]);
    await cell("code-1").locator(".frame").focus();
    await page.keyboard.press("Alt+Shift+Delete");
    expect(await page.locator("cb-cell").count()).toBe(count);
    await page.keyboard.press("F1");
    expect(await page.locator("cb-workbench dialog").innerText()).toMatch(/Alt\+Shift\+Delete/);
    await shot("09-keyboard-help");
    await page.keyboard.press("Escape");
    expect(log.pageErrors).toEqual([]);
  });

  it("completes the cell API with signatures and units from the library's own descriptors", async () => {
    await typeAtEnd(page, "result", "\naq.theisDr");
    await page.keyboard.press("Control+Space");
    const option = page.locator("cb-cell[data-id='result'] .cm-tooltip-autocomplete li").first();
    await expect.poll(() => option.innerText()).toMatch(/^theisDrawdown\(T, S, Q, r, t\)/);
    await expect.poll(() => page.locator("cb-cell[data-id='result'] .cm-completionInfo").innerText()).toBe("Theis drawdown (m) for T (m2/d), S (1), Q (m3/d), r (m), t (d)");
    await shot("10-completion");
    await page.keyboard.press("Escape");
  });
});
