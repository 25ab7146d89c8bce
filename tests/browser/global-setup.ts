/**
 * vitest global setup: unpacks the npm-provided Chromium once, in the main process, before any test file
 * starts (test files run in parallel forks and would otherwise race to unpack it into the same folder), and
 * hands its path to the browser tests through `inject("chromiumPath")`.
 */
import type { TestProject } from "vitest/node";
import { chromiumExecutable } from "./chromium.js";

declare module "vitest" {
  export interface ProvidedContext {
    chromiumPath: string;
  }
}

export default async function setup(project: TestProject): Promise<void> {
  project.provide("chromiumPath", await chromiumExecutable());
}
