/**
 * The `conebook` command: picks the subcommand, shows help, and turns errors into messages and exit codes
 * (UsageError, InputError and WriteError: the message and 2; anything else: an internal error, also 2, whose
 * stack trace is shown only with CONEBOOK_DEBUG=1).
 */
import { WriteError } from "./atomic-write.js";
import { EXIT, InputError, UsageError } from "./errors.js";
import type { Io } from "./io.js";
import { TOOL_VERSION } from "./versions.js";

interface Command {
  help: string;
  run: (argv: readonly string[], io: Io) => Promise<number>;
}

/**
 * Each command is loaded when it is named, so `conebook verify` reads the document format and the comparison, and
 * not the report builder, the server or the aquifer library (the run worker loads what runs the cells).
 */
const COMMANDS: Record<string, () => Promise<Command>> = {
  run: () => import("./commands/run.js").then((m) => ({ help: m.RUN_HELP, run: m.runCommand })),
  verify: () => import("./commands/verify.js").then((m) => ({ help: m.VERIFY_HELP, run: m.verifyCommand })),
  new: () => import("./commands/new.js").then((m) => ({ help: m.NEW_HELP, run: m.newCommand })),
  export: () => import("./commands/export.js").then((m) => ({ help: m.EXPORT_HELP, run: m.exportCommand })),
  pin: () => import("./commands/pin.js").then((m) => ({ help: m.PIN_HELP, run: m.pinCommand })),
  serve: () => import("./commands/serve.js").then((m) => ({ help: m.SERVE_HELP, run: m.serveCommand })),
};

export const MAIN_HELP = `Usage: conebook COMMAND [options]

Commands:
  run FILE       run every cell of a document; --write records the outputs
  verify FILE    rerun a document and compare with its recorded outputs
  new TEMPLATE   a new document from a template (-o FILE, --set, --data)
  export FILE    a self-contained HTML report (-o report.html)
  pin FILE       re-pin data files after an intended change (prints both SHA-256 digests)
  serve [FILE]   the workbench page: read, edit, run and save documents in a browser

conebook COMMAND --help shows a command's options. conebook --version shows the version.
Exit codes: 0 ok; 1 a check failed; 2 usage or input error.`;

/** Runs the command line `argv` (without node and the script); returns the exit code. */
export async function main(argv: readonly string[], io: Io): Promise<number> {
  const [name, ...rest] = argv;
  if (name === undefined || name === "--help" || name === "-h" || name === "help") {
    io.out(MAIN_HELP);
    return name === undefined ? EXIT.inputError : EXIT.ok;
  }
  if (name === "--version") {
    io.out(`conebook ${TOOL_VERSION}`);
    return EXIT.ok;
  }
  const load = Object.hasOwn(COMMANDS, name) ? COMMANDS[name] : undefined;
  if (!load) {
    io.err(`conebook: unknown command ${JSON.stringify(name)}; the commands are ${Object.keys(COMMANDS).join(", ")} (see conebook --help)`);
    return EXIT.inputError;
  }
  const command = await load();
  if (rest.includes("--help") || rest.includes("-h")) {
    io.out(command.help);
    return EXIT.ok;
  }
  try {
    return await command.run(rest, io);
  } catch (e) {
    if (e instanceof UsageError || e instanceof InputError || e instanceof WriteError) {
      io.err(`conebook ${name}: ${e.message}`);
      return EXIT.inputError;
    }
    io.err(unexpectedFailureMessage(name, e));
    return EXIT.inputError;
  }
}

/**
 * The message for a failure no command expected: what it was, without a stack trace unless the environment
 * sets CONEBOOK_DEBUG=1 (a stack trace tells a user nothing they can act on).
 */
export function unexpectedFailureMessage(command: string, e: unknown, debug = process.env.CONEBOOK_DEBUG === "1"): string {
  const what = e instanceof Error ? (debug && e.stack ? e.stack : `${e.name}: ${e.message}`) : String(e);
  const hint = debug ? "" : " (set CONEBOOK_DEBUG=1 to see where it happened)";
  return `conebook ${command}: internal error, please report it with the command that caused it${hint}: ${what}`;
}
