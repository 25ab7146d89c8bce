/**
 * vitest global setup: unpacks the npm-provided Chromium once, in the main process, before any test file
 * starts (test files run in parallel forks and would otherwise race to unpack it into the same folder), and
 * hands its path to the browser tests through `inject("chromiumPath")`; rebuilds the workbench page when a
 * source is newer than its build (viewer-build.ts).
 */
import type { TestProject } from "vitest/node";
import { chromiumExecutable } from "./chromium.js";
import { ensureViewerBuilt } from "./viewer-build.js";

declare module "vitest" {
  export interface ProvidedContext {
    chromiumPath: string;
  }
}

export default async function setup(project: TestProject): Promise<void> {
  const [path] = await Promise.all([chromiumExecutable(), ensureViewerBuilt()]);
  project.provide("chromiumPath", path);
}
