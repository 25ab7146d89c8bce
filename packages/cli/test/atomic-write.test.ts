import { mkdir, mkdtemp, readFile, readdir, utimes, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { WriteError, isStaleTemporary, temporaryPathFor, writeFileAtomic } from "../src/atomic-write.js";

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

  it("names the temporary file after the target, the process id and 64 random bits, in the same folder", () => {
    const a = temporaryPathFor("/data/site/doc.cone.md", 4242);
    expect(a).toMatch(/^\/data\/site\/doc\.cone\.md\.tmp-4242-[0-9a-f]{16}$/);
    expect(temporaryPathFor("/data/site/doc.cone.md", 4242)).not.toBe(a);
  });

  it("writes although a stale temporary file holds the name an earlier version would have used", async () => {
    // A kill during a save left FILE.tmp-<pid>; a later process with the same pid must not fail with EEXIST.
    const dir = await mkdtemp(join(tmpdir(), "conebook-atomic-"));
    const file = join(dir, "doc.cone.md");
    await writeFile(file, "old\n");
    await writeFile(`${file}.tmp-${process.pid}`, "half");
    await writeFileAtomic(file, "new\n");
    expect(await readFile(file, "utf8")).toBe("new\n");
    expect(await readdir(dir)).toEqual(["doc.cone.md"]);
  });

  it("removes the stale temporary files of the same document and keeps everything else", async () => {
    const dir = await mkdtemp(join(tmpdir(), "conebook-atomic-"));
    const file = join(dir, "doc.cone.md");
    const dead = 2 ** 22 + 12345; // above Linux's default pid_max of 2^22, so no process has it
    const names = {
      deadOld: `doc.cone.md.tmp-${dead}`,
      deadNew: `doc.cone.md.tmp-${dead}-0123456789abcdef`,
      liveOld: `doc.cone.md.tmp-${process.ppid}-00000000000000aa`,
      liveFresh: `doc.cone.md.tmp-${process.ppid}-00000000000000bb`,
      otherDocument: `notes.cone.md.tmp-${dead}`,
      notOurs: "doc.cone.md.tmp-backup",
    };
    for (const n of Object.values(names)) await writeFile(join(dir, n), "x");
    const hourAgo = new Date(Date.now() - 3600_000);
    await utimes(join(dir, names.liveOld), hourAgo, hourAgo);
    await writeFileAtomic(file, "new\n");
    expect((await readdir(dir)).sort()).toEqual(["doc.cone.md", names.liveFresh, names.notOurs, names.otherDocument].sort());
  });

  it("tells a stale temporary file by its writer having ended or by its age", () => {
    const now = Date.now();
    expect(isStaleTemporary("doc.cone.md", `doc.cone.md.tmp-${process.ppid}-00ff00ff00ff00ff`, now, now)).toBe(false);
    expect(isStaleTemporary("doc.cone.md", `doc.cone.md.tmp-${process.ppid}-00ff00ff00ff00ff`, now - 120_000, now)).toBe(true);
    // This process's pid on a file it is not writing: left by an earlier process that had the same pid.
    expect(isStaleTemporary("doc.cone.md", `doc.cone.md.tmp-${process.pid}`, now, now)).toBe(true);
    expect(isStaleTemporary("doc.cone.md", `doc.cone.md.tmp-${2 ** 22 + 1}`, now, now)).toBe(true);
    expect(isStaleTemporary("doc.cone.md", "doc.cone.md.tmp-x", 0, now)).toBe(false);
    expect(isStaleTemporary("doc.cone.md", "doc.cone.mdx.tmp-1", 0, now)).toBe(false);
  });

  it("fails with a WriteError that names the file and says what went wrong", async () => {
    const dir = await mkdtemp(join(tmpdir(), "conebook-atomic-"));
    const error = await writeFileAtomic(join(dir, "missing-folder", "doc.cone.md"), "x").catch((e: unknown) => e);
    expect(error).toBeInstanceOf(WriteError);
    expect((error as Error).message).toMatch(/^cannot write .*missing-folder\/doc\.cone\.md: its folder does not exist \(ENOENT\)/);
  });
});
