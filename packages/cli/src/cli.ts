/**
 * The `conebook` command: picks the subcommand, shows help, and turns errors into messages and exit codes
 * (UsageError, InputError and WriteError: the message and 2; anything else: an internal error, also 2, whose
 * stack trace is shown only with CONEBOOK_DEBUG=1).
 */
import { WriteError } from "./atomic-write.js";
import { EXIT, InputError, UsageError } from "./errors.js";
import { EXPORT_HELP, exportCommand } from "./commands/export.js";
import { NEW_HELP, newCommand } from "./commands/new.js";
import { PIN_HELP, pinCommand } from "./commands/pin.js";
import { RUN_HELP, runCommand } from "./commands/run.js";
import { SERVE_HELP, serveCommand } from "./commands/serve.js";
import { VERIFY_HELP, verifyCommand } from "./commands/verify.js";
import type { Io } from "./io.js";
import { TOOL_VERSION } from "./versions.js";

const COMMANDS: Record<string, { help: string; run: (argv: readonly string[], io: Io) => Promise<number> }> = {
  run: { help: RUN_HELP, run: runCommand },
  verify: { help: VERIFY_HELP, run: verifyCommand },
  new: { help: NEW_HELP, run: newCommand },
  export: { help: EXPORT_HELP, run: exportCommand },
  pin: { help: PIN_HELP, run: pinCommand },
  serve: { help: SERVE_HELP, run: serveCommand },
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
  const command = COMMANDS[name];
  if (!command) {
    io.err(`conebook: unknown command ${JSON.stringify(name)}; the commands are ${Object.keys(COMMANDS).join(", ")} (see conebook --help)`);
    return EXIT.inputError;
  }
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
