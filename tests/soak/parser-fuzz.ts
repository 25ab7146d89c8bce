/**
 * The long version of tests/parser-fuzz.test.ts: `npm run soak` (or `npx tsx tests/soak/parser-fuzz.ts [runs] [seed]`)
 * mutates every notebook and template 10,000 times by default and prints the same figure; exit 1 on any uncaught
 * exception or lossy round trip, naming the run so that it can be reproduced with the seed.
 */
import { fileURLToPath } from "node:url";
import { corpus, fuzzDocuments } from "../support/document-mutations.js";

const runs = Number(process.argv[2] ?? 10_000);
const seed = Number(process.argv[3] ?? 20261204);
const root = fileURLToPath(new URL("../..", import.meta.url));
const t0 = performance.now();
const result = fuzzDocuments(corpus(root), runs, seed);
console.log(
  `parser: ${result.runs} mutated documents of ${result.sources} notebooks and templates (seed ${seed}), ` +
    `${result.crashes.length} uncaught exceptions, ${result.parsed - result.lossy.length} parsed and written back byte for byte, ` +
    `${result.lossy.length} lossy, ${result.refused} refused at a line; ${((performance.now() - t0) / 1000).toFixed(1)} s`,
);
for (const line of [...result.crashes, ...result.lossy]) console.log(`  ${line}`);
process.exitCode = result.crashes.length + result.lossy.length === 0 ? 0 : 1;
