/**
 * `npm run bench`: prints this machine's figures beside a peer measured in the same run, with ratios and
 * whether each target is met. Run on an otherwise idle machine; figures from a loaded machine are noisy.
 */
import { machineLine, printTable } from "./harness.js";
import { classicModelBenchmarks } from "./sections/classic-models.js";
import { cliBenchmarks } from "./sections/cli.js";
import { kernelBenchmarks } from "./sections/kernel.js";
import { laplaceModelBenchmarks } from "./sections/laplace-models.js";
import { newMethodBenchmarks } from "./sections/new-methods.js";
import { wellFunctionsAndFit } from "./sections/well-functions-and-fit.js";
import { workbenchBenchmarks } from "./sections/workbench.js";

console.log("# Conebook benchmarks");
console.log(machineLine());
printTable("Well functions and fitting (aquifer)", wellFunctionsAndFit());
printTable("Laplace-domain models (aquifer)", laplaceModelBenchmarks());
printTable("Screened wells, slug and step tests (aquifer)", newMethodBenchmarks());
printTable("Boulton, Jacob-Lohman, Hantush 1964, underdamped slug, barometric response (aquifer)", classicModelBenchmarks());
printTable("Sandbox, bridge and documents (kernel)", await kernelBenchmarks());
printTable("Command line (cli)", cliBenchmarks());
printTable("Workbench page in Chromium (viewer)", await workbenchBenchmarks());
