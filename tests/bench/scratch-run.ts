import { printTable } from "./harness.js";
import { newMethodBenchmarks } from "./sections/new-methods.js";
printTable("new", newMethodBenchmarks());
