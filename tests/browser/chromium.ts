/**
 * The Chromium the browser tests and the page benchmarks drive: by default the build shipped inside the npm
 * package @sparticuz/chromium (unpacked once under the system temp folder by `executablePath()`, about 3.5 s),
 * or the executable named by the environment variable CONEBOOK_CHROMIUM. No system package is needed.
 *
 * It is launched with our own arguments only, never the package's `chromium.args`: those switch off web
 * security and site isolation (`--disable-web-security`, `--disable-site-isolation-trials`, `--single-process`),
 * which would make every same-origin, Content-Security-Policy and script-injection test meaningless. The
 * network is closed on these machines, so the background services that would reach out are switched off too.
 */
import sparticuz from "@sparticuz/chromium";
import { chromium, type Browser } from "playwright-core";

/** Arguments every launch uses: no OS sandbox (tests run as root in a container), no background networking. */
export const CHROMIUM_ARGS: readonly string[] = [
  "--no-sandbox",
  "--disable-gpu",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
  "--no-first-run",
  "--no-default-browser-check",
];

/** Path of the Chromium executable: CONEBOOK_CHROMIUM when set, else the npm-provided build (unpacked on first use). */
export async function chromiumExecutable(): Promise<string> {
  const chosen = process.env.CONEBOOK_CHROMIUM;
  if (chosen !== undefined && chosen !== "") return chosen;
  return sparticuz.executablePath();
}

/** Launches headless Chromium with CHROMIUM_ARGS; the error says which executable failed and how to choose another. */
export async function launchChromium(executablePath?: string): Promise<Browser> {
  const path = executablePath ?? (await chromiumExecutable());
  try {
    return await chromium.launch({ executablePath: path, headless: true, args: [...CHROMIUM_ARGS] });
  } catch (e) {
    const reason = e instanceof Error ? e.message.split("\n")[0] : String(e);
    throw new Error(
      `cannot start Chromium at ${path} (${reason}); reinstall with npm ci (the build comes from @sparticuz/chromium; ` +
        `if an unpacking was interrupted, delete that file and rerun), or set CONEBOOK_CHROMIUM to another Chromium`,
    );
  }
}
