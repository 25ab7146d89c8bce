/**
 * `conebook serve [FILE|DIR] [--port N] [--no-open]`: the workbench page on this machine. Serves the built page
 * and the documents of one folder on 127.0.0.1 only, behind a token made for this start, prints the URL and
 * (where a browser is available) opens it. Runs until interrupted (Ctrl+C).
 */
import { stat } from "node:fs/promises";
import { basename, dirname, resolve } from "node:path";
import { parseArgs, type OptionSpec } from "../args.js";
import { InputError, UsageError } from "../errors.js";
import type { Io } from "../io.js";
import { shownPath } from "../load.js";
import { loadPageAssets, viewerDistFolder } from "../serve/assets.js";
import { openBrowser } from "../serve/open-browser.js";
import { startServeServer, type RunningServer } from "../serve/server.js";

/** Port used when --port is not given; fixed so that the page's recovery copies (kept per origin) survive a restart. */
export const DEFAULT_PORT = 7319;

export const SERVE_OPTIONS: readonly OptionSpec[] = [
  { name: "port", kind: "value" },
  { name: "no-open", kind: "flag" },
];

export const SERVE_HELP = `Usage: conebook serve [FILE|DIR] [--port N] [--no-open]

Opens the workbench page for a document FILE (*.cone.md), or lists the documents of the folder DIR (default:
the working folder). The page shows the document cell by cell; you edit, run and save it there.

The server listens on 127.0.0.1 only and prints a URL with a token made for this start: only that URL gets in.
It serves the documents and data files inside the folder of FILE (or DIR) and nothing outside it. Saving
replaces the file atomically and refuses when the file changed on disk since the page opened it.

Options:
  --port N    the port on 127.0.0.1 (default ${DEFAULT_PORT}; 0 picks a free one)
  --no-open   only print the URL; do not try to open a browser
  --help      show this help

Stop the server with Ctrl+C. Exit codes: 0 stopped; 2 usage or input error.`;

function portOf(raw: string | undefined): number {
  if (raw === undefined) return DEFAULT_PORT;
  const n = Number(raw);
  if (!/^\d+$/.test(raw) || n > 65535) throw new UsageError(`--port must be a whole number from 0 to 65535, got ${JSON.stringify(raw)}`, "serve");
  return n;
}

/** Folder and initial document for a FILE or DIR argument. */
async function target(arg: string | undefined, cwd: string): Promise<{ folder: string; initial?: string }> {
  const path = resolve(cwd, arg ?? ".");
  let info;
  try {
    info = await stat(path);
  } catch {
    throw new InputError(`${shownPath(path, cwd)}: no such file or folder; give a document (*.cone.md) or a folder`);
  }
  if (info.isDirectory()) return { folder: path };
  if (!path.endsWith(".cone.md")) throw new InputError(`${shownPath(path, cwd)} is not a Conebook document (*.cone.md); give a document or a folder`);
  return { folder: dirname(path), initial: basename(path) };
}

/** Starts the server for the command line; resolves with it (the command itself waits for a signal). */
export async function startFromArgs(argv: readonly string[], io: Io): Promise<{ server: RunningServer; opened: boolean; noOpen: boolean }> {
  const args = parseArgs(argv, SERVE_OPTIONS, "serve");
  if (args.positionals.length > 1) throw new UsageError(`\`conebook serve\` takes one FILE or DIR, got ${args.positionals.length}`, "serve");
  const port = portOf(args.values.get("port"));
  const { folder, initial } = await target(args.positionals[0], io.cwd);
  const dist = viewerDistFolder();
  if (!dist) throw new InputError("the workbench page is not built; run `npm run build:viewer` (npm ci does it) and start again");
  const assets = await loadPageAssets(dist);
  let server: RunningServer;
  try {
    server = await startServeServer({ folder, port, assets, ...(initial ? { initial } : {}) });
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === "EADDRINUSE") throw new InputError(`port ${port} on 127.0.0.1 is in use (another conebook serve?); stop it or give --port N`);
    throw e;
  }
  const noOpen = args.flags.has("no-open");
  return { server, opened: noOpen ? false : openBrowser(server.url), noOpen };
}

/** Runs the command; resolves with the exit code when the process is interrupted. */
export async function serveCommand(argv: readonly string[], io: Io): Promise<number> {
  const { server, opened } = await startFromArgs(argv, io);
  io.out(`Conebook workbench: ${server.url}`);
  io.out(opened ? "Opened in your browser. Press Ctrl+C to stop." : "Open this address in a browser on this machine. Press Ctrl+C to stop.");
  await new Promise<void>((resolveStop) => {
    const stop = () => resolveStop();
    process.once("SIGINT", stop);
    process.once("SIGTERM", stop);
  });
  await server.close();
  io.out("stopped");
  return 0;
}
