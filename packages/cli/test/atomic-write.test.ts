import { mkdir, mkdtemp, readFile, readdir, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { temporaryPathFor, writeFileAtomic } from "../src/atomic-write.js";

describe("writeFileAtomic", () => {
  it("replaces a file's bytes and leaves no temporary file", async () => {
    const dir = await mkdtemp(join(tmpdir(), "conebook-atomic-"));
    const file = join(dir, "doc.cone.md");
    await writeFile(file, "old\n");
    await writeFileAtomic(file, "new\n");
    expect(await readFile(file, "utf8")).toBe("new\n");
    expect(await readdir(dir)).toEqual(["doc.cone.md"]);
  });

  it("removes the temporary file and keeps the target when the rename fails", async () => {
    // Renaming a file over a non-empty folder fails (EISDIR or ENOTEMPTY on POSIX): a real failure after the write.
    const dir = await mkdtemp(join(tmpdir(), "conebook-atomic-"));
    const target = join(dir, "busy");
    await mkdir(target);
    await writeFile(join(target, "inside.txt"), "kept");
    await expect(writeFileAtomic(target, "new")).rejects.toThrow(/EISDIR|ENOTEMPTY|EEXIST/);
    expect((await readdir(dir)).sort()).toEqual(["busy"]);
    expect(await readFile(join(target, "inside.txt"), "utf8")).toBe("kept");
  });

  it("names the temporary file after the target and the process id, in the same folder", () => {
    expect(temporaryPathFor("/data/site/doc.cone.md", 4242)).toBe("/data/site/doc.cone.md.tmp-4242");
  });
});
