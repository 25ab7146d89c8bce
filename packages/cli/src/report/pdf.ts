/**
 * Printing a report's HTML to PDF through headless Chromium: the Chromium that the npm package
 * @sparticuz/chromium ships (unpacked once, on first use, under the system temp folder), or the one the
 * environment variable CONEBOOK_CHROMIUM points to, driven by playwright-core. Launched with `--no-sandbox`
 * and headless only: the package's own `chromium.args` turn off web security and site isolation, which would
 * void the report's Content-Security-Policy, so they are never used. The page is loaded from memory
 * (`setContent`), loads nothing else (the CSP forbids it; requests are aborted besides), and prints with the
 * report's own print stylesheet (page numbers in the bottom margin).
 */
import { chromium as playwright, type Browser } from "playwright-core";

/** Paper sizes a report can be printed on. */
export type Paper = "A4" | "Letter";

/** The Chromium to launch: CONEBOOK_CHROMIUM, else the one @sparticuz/chromium unpacks. */
export async function chromiumExecutable(env: NodeJS.ProcessEnv = process.env): Promise<string> {
  const override = env.CONEBOOK_CHROMIUM;
  if (override !== undefined && override !== "") return override;
  const { default: packaged } = await import("@sparticuz/chromium");
  return packaged.executablePath();
}

/** Launches headless Chromium with the sandbox off and nothing else changed. */
export async function launchChromium(env: NodeJS.ProcessEnv = process.env): Promise<Browser> {
  const executablePath = await chromiumExecutable(env);
  try {
    return await playwright.launch({ executablePath, headless: true, args: ["--no-sandbox"] });
  } catch (e) {
    const reason = e instanceof Error ? e.message.split("\n")[0] : String(e);
    throw new Error(`cannot start Chromium at ${executablePath} (${reason}); reinstall with npm ci, or set CONEBOOK_CHROMIUM to a Chromium binary`);
  }
}

/** The PDF bytes of a report's HTML on the given paper. The browser is closed before this returns. */
export async function printToPdf(html: string, paper: Paper, env: NodeJS.ProcessEnv = process.env): Promise<Uint8Array> {
  const browser = await launchChromium(env);
  try {
    const page = await browser.newPage({ javaScriptEnabled: false });
    await page.route("**/*", (route) => route.abort());
    await page.setContent(html, { waitUntil: "load" });
    await page.emulateMedia({ media: "print" });
    const pdf = await page.pdf({ format: paper, printBackground: true, preferCSSPageSize: false, outline: true, tagged: true });
    return new Uint8Array(pdf);
  } finally {
    await browser.close();
  }
}
