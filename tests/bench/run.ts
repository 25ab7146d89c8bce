/**
 * `npm run bench`: prints this machine's figures beside a peer measured in the same run, with ratios and
 * whether each target is met, then every target in one closing table. Run on an otherwise idle machine; figures
 * from a loaded machine are noisy (the paired ratios less so). `npm run bench -- --only=cli,kernel` runs some
 * sections only (names: foundation, laplace, methods, kernel, document, cli, workbench).
 */
import { machineLine, printTable, printTargetSummary } from "./harness.js";
import { PeerProcess, preparePython } from "./python-peer.js";
import { classicModelBenchmarks } from "./sections/classic-models.js";
import { cliBenchmarks } from "./sections/cli.js";
import { coverageSection } from "./sections/coverage.js";
import { documentParseBenchmarks } from "./sections/document-parse.js";
import { kernelBenchmarks } from "./sections/kernel.js";
import { laplaceModelBenchmarks } from "./sections/laplace-models.js";
import { newMethodBenchmarks } from "./sections/new-methods.js";
import { wellFunctionsAndFit } from "./sections/well-functions-and-fit.js";
import { workbenchBenchmarks } from "./sections/workbench.js";
import { workbenchAnalysisBenchmarks } from "./sections/workbench-analysis.js";

const only = process.argv.find((a) => a.startsWith("--only="))?.slice(7).split(",");
const wanted = (name: string) => only === undefined || only.includes(name);

console.log("# Conebook benchmarks");
console.log(machineLine());
const python = preparePython();
for (const note of python.notes) console.log(note);
const started = wanted("foundation") ? await PeerProcess.start(python) : null;
if (started) console.log(`scipy peer: scipy ${started.versions.scipy}, numpy ${started.versions.numpy}, Python ${started.versions.python} (${started.versions.executable})`);
try {
  if (wanted("foundation")) printTable("Well functions and fitting (aquifer), interleaved with scipy", await wellFunctionsAndFit(started?.peer ?? null, started?.versions.scipy ?? "?"));
} finally {
  started?.peer.close();
}
if (wanted("laplace")) printTable("Laplace-domain models (aquifer)", laplaceModelBenchmarks());
if (wanted("methods")) printTable("Screened wells, slug and step tests (aquifer)", newMethodBenchmarks());
if (wanted("methods")) printTable("Boulton, Jacob-Lohman, Hantush 1964, underdamped slug, barometric response (aquifer)", classicModelBenchmarks());
if (wanted("kernel")) printTable("Sandbox, bridge and documents (kernel)", await kernelBenchmarks());
if (wanted("document")) printTable("Parsing documents (document)", documentParseBenchmarks());
if (wanted("cli")) printTable("Command line (cli): cold start and logger documents", await cliBenchmarks());
if (wanted("coverage")) coverageSection();
if (wanted("workbench")) printTable("Workbench page in Chromium (viewer)", await workbenchBenchmarks());
if (wanted("workbench")) printTable("Analysis by hand in the workbench (viewer, Chromium)", await workbenchAnalysisBenchmarks());
printTargetSummary();
