/**
 * Command-line parsing for one command: options declared up front, everything else positional. Supports
 * `--name value`, `--name=value`, short aliases (`-o FILE`), repeated list options (`--set a=1 --set b=2`) and
 * `--` to end options. Anything undeclared is a UsageError naming the option and the command.
 */
import { UsageError } from "./errors.js";

/** One option of a command. */
export interface OptionSpec {
  /** Long name without dashes, e.g. "write". */
  name: string;
  /** One-letter alias without the dash, e.g. "o". */
  alias?: string;
  /** flag: no value; value: one value (the last wins); list: may repeat, values collected in order. */
  kind: "flag" | "value" | "list";
}

/** The parsed command line of one command. */
export interface ParsedArgs {
  positionals: string[];
  flags: Set<string>;
  values: Map<string, string>;
  lists: Map<string, string[]>;
}

/** Parses `argv` (the words after the command name) against `options`. Throws UsageError. */
export function parseArgs(argv: readonly string[], options: readonly OptionSpec[], command: string): ParsedArgs {
  const byName = new Map(options.map((o) => [o.name, o]));
  const byAlias = new Map(options.filter((o) => o.alias).map((o) => [o.alias!, o]));
  const out: ParsedArgs = { positionals: [], flags: new Set(), values: new Map(), lists: new Map() };
  for (let i = 0; i < argv.length; i++) {
    const word = argv[i]!;
    if (word === "--") {
      out.positionals.push(...argv.slice(i + 1));
      break;
    }
    if (!word.startsWith("-") || word === "-") {
      out.positionals.push(word);
      continue;
    }
    const long = word.startsWith("--");
    const eq = word.indexOf("=");
    const key = long ? word.slice(2, eq < 0 ? undefined : eq) : word.slice(1, eq < 0 ? undefined : eq);
    const spec = long ? byName.get(key) : byAlias.get(key);
    if (!spec) {
      throw new UsageError(`unknown option ${word.slice(0, eq < 0 ? undefined : eq)} for \`conebook ${command}\`; see \`conebook ${command} --help\``, command);
    }
    if (spec.kind === "flag") {
      if (eq >= 0) throw new UsageError(`option --${spec.name} takes no value; write it alone`, command);
      out.flags.add(spec.name);
      continue;
    }
    let value: string;
    if (eq >= 0) value = word.slice(eq + 1);
    else {
      const next = argv[i + 1];
      if (next === undefined) throw new UsageError(`option --${spec.name} needs a value; see \`conebook ${command} --help\``, command);
      value = next;
      i++;
    }
    if (spec.kind === "value") out.values.set(spec.name, value);
    else out.lists.set(spec.name, [...(out.lists.get(spec.name) ?? []), value]);
  }
  return out;
}

/** The single positional argument `what` (e.g. "FILE"); a UsageError when there is none or more than one. */
export function onePositional(args: ParsedArgs, what: string, command: string): string {
  if (args.positionals.length === 0) throw new UsageError(`\`conebook ${command}\` needs ${what}; see \`conebook ${command} --help\``, command);
  if (args.positionals.length > 1) {
    throw new UsageError(`\`conebook ${command}\` takes one ${what}, got ${args.positionals.length}: ${args.positionals.join(" ")}`, command);
  }
  return args.positionals[0]!;
}
