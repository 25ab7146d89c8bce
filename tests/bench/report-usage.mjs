// Preloaded (node --import) into a process the bench starts: when the process exits it writes its resource usage
// (process.resourceUsage(): CPU of all its threads, peak resident set) as JSON to the file named by
// CONEBOOK_BENCH_USAGE, so the bench can put CPU time and memory beside the wall-clock time it measured.
import { writeFileSync } from "node:fs";

const target = process.env.CONEBOOK_BENCH_USAGE;
if (target) process.on("exit", () => writeFileSync(target, JSON.stringify(process.resourceUsage())));
