import { readFileSync } from "node:fs";
import path from "node:path";
import ts from "typescript";
import { beforeAll, describe, expect, it } from "vitest";
import {
  API_REFERENCE_FILE,
  API_REFERENCE_SCRIPT,
  collectApi,
  formatMissingDoc,
  generateApiReference,
  registryDescriptors,
  REPO_ROOT,
  type CollectedApi,
} from "../scripts/api-reference.js";

/** Where two texts first differ, as "line N: committed ... / generated ...", for the failure message. */
function firstDifference(committed: string, generated: string): string {
  const a = committed.split("\n");
  const b = generated.split("\n");
  for (let i = 0; i < Math.max(a.length, b.length); i++) {
    if (a[i] !== b[i]) {
      return `line ${i + 1}:\n  committed: ${JSON.stringify(a[i] ?? "(end of file)")}\n  generated: ${JSON.stringify(b[i] ?? "(end of file)")}`;
    }
  }
  return "(no difference)";
}

describe("the API reference of @conebook/aquifer", () => {
  let markdown = "";
  let api: CollectedApi;

  beforeAll(() => {
    ({ markdown, api } = generateApiReference());
  }, 20_000);

  it("matches docs/api-reference.md as regenerated from the doc comments and the model registry", () => {
    const committed = readFileSync(path.join(REPO_ROOT, API_REFERENCE_FILE), "utf8");
    const upToDate = committed === markdown;
    expect(
      upToDate,
      `${API_REFERENCE_FILE} is out of date; rerun \`npx tsx ${API_REFERENCE_SCRIPT}\`. First difference at ` +
        firstDifference(committed, markdown),
    ).toBe(true);
  });

  it("finds a doc comment on every exported function, class and constant of src/index.ts", () => {
    const offenders = api.missingDocs.map(formatMissingDoc);
    expect(
      offenders,
      `Exports without a doc comment (add one giving units and the source of the formula):\n  ${offenders.join("\n  ")}`,
    ).toEqual([]);
  });

  it("documents every registered model with its source and one table row per parameter", () => {
    const descriptors = registryDescriptors();
    expect(descriptors.length).toBeGreaterThan(0);
    for (const model of descriptors) {
      expect(markdown).toContain(`### \`${model.id}\`: ${model.name}\n`);
      expect(markdown).toContain(`Source: ${model.source.replace(/\s+/g, " ").trim()}\n`);
      for (const parameter of model.parameters) {
        expect(markdown).toContain(`| \`${parameter.name}\` | ${parameter.label} |`);
      }
    }
  });

  it("covers the exports the library is known for, each under its own area", () => {
    // Names taken from packages/aquifer/src/*/index.ts; a rename there must show up here and in the reference.
    const areaOf = new Map(api.entries.map((entry) => [entry.name, entry.area]));
    expect(areaOf.get("convert")).toBe("units");
    expect(areaOf.get("expint1")).toBe("special");
    expect(areaOf.get("theisDrawdown")).toBe("models");
    expect(areaOf.get("fitModel")).toBe("fit");
    expect(areaOf.get("forecastDrawdown")).toBe("forecast");
    const names = api.entries.map((entry) => entry.name);
    expect(new Set(names).size).toBe(names.length);
  });
});

/** An in-memory TypeScript program (no lib, so it builds in milliseconds) over `files`. */
function virtualProgram(files: Record<string, string>, entry: string): ts.Program {
  const options: ts.CompilerOptions = {
    noLib: true,
    types: [],
    target: ts.ScriptTarget.ES2022,
    module: ts.ModuleKind.ESNext,
    moduleResolution: ts.ModuleResolutionKind.Bundler,
  };
  const host = ts.createCompilerHost(options);
  host.fileExists = (file) => file in files;
  host.readFile = (file) => files[file];
  host.getSourceFile = (file, languageVersion) =>
    file in files ? ts.createSourceFile(file, files[file]!, languageVersion, true) : undefined;
  host.getCurrentDirectory = () => "/virtual";
  host.directoryExists = (dir) => Object.keys(files).some((file) => file.startsWith(`${dir}/`));
  host.getDirectories = () => [];
  return ts.createProgram({ rootNames: [entry], options, host });
}

describe("the doc-comment check of the API reference", () => {
  it("lists each undocumented exported function, class and constant as file:line, and no type, in re-export order of areas", () => {
    const program = virtualProgram(
      {
        "/virtual/src/index.ts":
          '/** The whole surface. */\nexport * from "./beta/index.js";\nexport * from "./alpha/index.js";\n',
        "/virtual/src/beta/index.ts": '/** Beta. */\nexport { zeta } from "./zeta.js";\n',
        "/virtual/src/beta/zeta.ts": "/** A documented constant, 1 (dimensionless). */\nexport const zeta = 1;\n",
        "/virtual/src/alpha/index.ts":
          '/** Alpha: an area.\n * Second line. */\nexport { doubled, plain, Holder, LIMIT, renamed as alias, type Shape } from "./things.js";\n',
        "/virtual/src/alpha/things.ts": [
          "/** Twice x, in m (common practice, no source). */",
          "export function doubled(x: number): number { return 2 * x; }",
          "",
          "export function plain(x: number): number { return x; }",
          "export class Holder {}",
          "export const LIMIT = 3;",
          "export interface Shape { a: number }",
          "/** Documented under its own name. */",
          "export const renamed = 1;",
          "",
        ].join("\n"),
      },
      "/virtual/src/index.ts",
    );
    const api = collectApi(program, {
      entryFile: "/virtual/src/index.ts",
      sourceRoot: "/virtual/src",
      repoRoot: "/virtual",
    });
    expect(api.missingDocs.map(formatMissingDoc)).toEqual([
      "src/alpha/things.ts:4 plain (function)",
      "src/alpha/things.ts:5 Holder (class)",
      "src/alpha/things.ts:6 LIMIT (const)",
    ]);
    // Areas in the order the entry re-exports them (beta before alpha), then names case-insensitively.
    expect(api.entries.map((entry) => `${entry.area}/${entry.name}:${entry.kinds.join("+")}`)).toEqual([
      "beta/zeta:const",
      "alpha/alias:const",
      "alpha/doubled:function",
      "alpha/Holder:class",
      "alpha/LIMIT:const",
      "alpha/plain:function",
      "alpha/Shape:interface",
    ]);
    expect(api.areaIntros.get("alpha")).toBe("Alpha: an area.\nSecond line.");
    expect(api.entries.find((entry) => entry.name === "doubled")?.code).toEqual([
      "function doubled(x: number): number",
    ]);
  });
});
