import { chromiumExecutable } from "./chromium.js";
import { DEMO, openDocument, startWorkbench, waitForState } from "./workbench-harness.js";
const wb = await startWorkbench(await chromiumExecutable());
const { page, log } = await wb.newPage();
try {
  await openDocument(wb, page, DEMO);
  await page.locator("cb-workbench header.top").getByRole("button", { name: "Match by hand" }).click();
  await waitForState(page, "conebook-match-ready");
  await page.waitForTimeout(500);
  await page.locator("cb-match").screenshot({ path: "/tmp/scratch/match1.png" });
  const box = await page.locator("cb-match .plot.loglog svg").boundingBox();
  await page.mouse.move(box!.x + 300, box!.y + 150);
  await page.mouse.down();
  for (let i = 0; i < 10; i++) await page.mouse.move(box!.x + 300 + i * 5, box!.y + 150 - i * 2);
  await page.mouse.up();
  console.log(await page.locator("cb-match .figures").innerText());
  console.log("latencies", await page.evaluate("document.querySelector('cb-workbench').shadowRoot.querySelector('cb-match').latencies"));
  await page.locator("cb-match").screenshot({ path: "/tmp/scratch/match2.png" });
} finally {
  console.log("log", JSON.stringify(log.consoleErrors), JSON.stringify(log.pageErrors));
  await wb.close();
}
