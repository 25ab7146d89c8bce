/** Process entry of the `conebook` binary: real streams and working folder, exit code from `main`. */
import { main } from "./cli.js";

const code = await main(process.argv.slice(2), {
  out: (text) => process.stdout.write(`${text}\n`),
  err: (text) => process.stderr.write(`${text}\n`),
  cwd: process.cwd(),
  progress: process.stderr.isTTY === true,
});
process.exitCode = code;
