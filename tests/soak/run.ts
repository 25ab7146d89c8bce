/**
 * `npm run soak`: the long versions of the fuzz and kill tests, one after the other, each in its own process:
 * tests/soak/parser-fuzz.ts (10,000 mutated documents) and tests/soak/save-kills.ts (1,000 kills of
 * `conebook run --write`), then the page's save under 1,000 kills of `conebook serve`
 * (packages/cli/test/serve-save.kill.test.ts). Options: --runs=N and --seed=N for the parser, --kills=N for both
 * kill runs, --only=parser, --only=kills or --only=page-save. Exit 1 when any fails.
 */
import { spawnSync } from "node:child_process";
import { fileURLToPath } from "node:url";

const arg = (name: string): string | undefined => process.argv.find((a) => a.startsWith(`--${name}=`))?.slice(name.length + 3);
const only = arg("only");
const here = (file: string): string => fileURLToPath(new URL(file, import.meta.url));
const steps: { name: string; script: string; args: string[] }[] = [
  { name: "parser", script: here("./parser-fuzz.ts"), args: [arg("runs") ?? "10000", ...(arg("seed") ? [arg("seed")!] : [])] },
  { name: "kills", script: here("./save-kills.ts"), args: arg("kills") ? [`--kills=${arg("kills")}`] : [] },
];
// The page's save under kills is a vitest file (packages/cli/test/serve-save.kill.test.ts, 50 kills in npm test),
// run here with 1,000 kills (or --kills=N).
const vitest = fileURLToPath(new URL("../../node_modules/vitest/vitest.mjs", import.meta.url));
const pageSave = { name: "page-save", argv: [vitest, "run", fileURLToPath(new URL("../../packages/cli/test/serve-save.kill.test.ts", import.meta.url))], kills: arg("kills") ?? "1000" };
let failed = 0;
for (const step of steps) {
  if (only !== undefined && only !== step.name) continue;
  const r = spawnSync(process.execPath, ["--import", "tsx", step.script, ...step.args], { stdio: "inherit" });
  if (r.status !== 0) {
    failed++;
    console.log(`soak: ${step.name} failed (exit ${r.status ?? r.signal})`);
  }
}
if (only === undefined || only === pageSave.name) {
  const r = spawnSync(process.execPath, pageSave.argv, { stdio: "inherit", env: { ...process.env, CONEBOOK_SERVE_KILLS: pageSave.kills } });
  if (r.status !== 0) {
    failed++;
    console.log(`soak: ${pageSave.name} failed (exit ${r.status ?? r.signal})`);
  }
}
process.exitCode = failed === 0 ? 0 : 1;
