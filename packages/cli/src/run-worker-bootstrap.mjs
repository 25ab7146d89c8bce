// Starts the run worker from the TypeScript sources (when the command itself runs from them, through tsx or in
// tests): the worker thread gets its own tsx loader, then loads run-worker.ts. The bundle has run-worker.js instead.
import { register } from "tsx/esm/api";

register();
await import("./run-worker.ts");
