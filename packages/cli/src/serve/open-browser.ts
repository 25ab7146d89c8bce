/**
 * Opening the printed URL in the user's browser where one is available: `open` on macOS, `start` on Windows,
 * `xdg-open` on other systems with a graphical session (DISPLAY or WAYLAND_DISPLAY). Never under CI or without
 * a display; a failure to open is not an error (the URL is printed anyway).
 */
import { spawn } from "node:child_process";

/** The command that would open `url` here, or undefined when no browser can be expected. */
export function browserCommand(url: string, env: NodeJS.ProcessEnv = process.env, platform: NodeJS.Platform = process.platform): [string, string[]] | undefined {
  if (env.CI) return undefined;
  if (platform === "darwin") return ["open", [url]];
  if (platform === "win32") return ["cmd", ["/c", "start", "", url]];
  if (!env.DISPLAY && !env.WAYLAND_DISPLAY) return undefined;
  return ["xdg-open", [url]];
}

/** Tries to open `url`; returns whether a browser command was started. */
export function openBrowser(url: string): boolean {
  const command = browserCommand(url);
  if (!command) return false;
  try {
    const child = spawn(command[0], command[1], { stdio: "ignore", detached: true });
    child.on("error", () => undefined);
    child.unref();
    return true;
  } catch {
    return false;
  }
}
