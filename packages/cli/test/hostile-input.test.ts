/**
 * The command on inputs a careless or hostile author may give it: each is answered with exit 2 and one message
 * with file:line:column (never a stack trace), and nothing is written. Runs `main` in this process.
 */
import { mkdir, mkdtemp, readFile, readdir, symlink, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { sha256Hex, utf8Bytes } from "@conebook/document";
import { main, unexpectedFailureMessage } from "../src/cli.js";

async function conebook(cwd: string, ...argv: string[]) {
  const out: string[] = [];
  const err: string[] = [];
  const code = await main(argv, { out: (t) => out.push(t), err: (t) => err.push(t), cwd, progress: false });
  return { code, stdout: out.join("\n"), stderr: err.join("\n") };
}

const HEAD = "---\nconebook: 1\ntitle: Probe at KM-OB7 (invented)\nseed: 3\n---\n";
const folder = () => mkdtemp(join(tmpdir(), "conebook-hostile-"));

describe("conebook on hostile input", () => {
  it("refuses a document whose bytes are not UTF-8, naming the byte offset, and leaves it untouched", async () => {
    const dir = await folder();
    const bytes = Uint8Array.from([...utf8Bytes(`${HEAD}\n[narrative:n]: #\n\nRates `), 0xff, 0xfe, ...utf8Bytes(" here.\n\n```ts code:a\n1\n```\n")]);
    await writeFile(join(dir, "d.cone.md"), bytes);
    const r = await conebook(dir, "run", "d.cone.md", "--write");
    expect(r.code).toBe(2);
    expect(r.stderr).toBe("conebook run: d.cone.md:9:7: the file is not UTF-8 at byte offset 87 (line 9, column 7): bytes FF FE are not UTF-8; save it as UTF-8");
    expect(new Uint8Array(await readFile(join(dir, "d.cone.md")))).toEqual(bytes);
  });

  it("keeps a byte order mark through run --write", async () => {
    const dir = await folder();
    await writeFile(join(dir, "d.cone.md"), `\uFEFF${HEAD}\n\`\`\`ts code:a\n1\n\`\`\`\n`);
    expect((await conebook(dir, "run", "d.cone.md", "--write")).code).toBe(0);
    expect((await readFile(join(dir, "d.cone.md"), "utf8")).startsWith("\uFEFF---\nconebook: 1\n")).toBe(true);
  });

  it("refuses a pinned data file that is not UTF-8 with exit 2", async () => {
    const dir = await folder();
    const csv = Uint8Array.from([...utf8Bytes("t_s,s_m\n60,0.3"), 0xe9, ...utf8Bytes("\n")]);
    await writeFile(join(dir, "obs.csv"), csv);
    await writeFile(join(dir, "d.cone.md"), `${HEAD}\n\`\`\`csv data:obs file=obs.csv sha256=${sha256Hex(csv)}\n\`\`\`\n`);
    const r = await conebook(dir, "run", "d.cone.md");
    expect(r.code).toBe(2);
    expect(r.stderr).toBe("conebook run: d.cone.md:7:1: data \"obs\" refers to obs.csv, which is not UTF-8 at byte offset 14 (line 2, column 7): byte E9 is not UTF-8; save it as UTF-8 and pin the new bytes");
  });

  it("refuses a pinned data file that is a link to a file outside the document's folder", async () => {
    const root = await folder();
    const dir = join(root, "site");
    await mkdir(dir);
    const csv = "t_s,s_m\n60,0.31\n";
    await writeFile(join(root, "elsewhere.csv"), csv);
    await symlink(join(root, "elsewhere.csv"), join(dir, "obs.csv"));
    await writeFile(join(dir, "d.cone.md"), `${HEAD}\n\`\`\`csv data:obs file=obs.csv sha256=${sha256Hex(utf8Bytes(csv))}\n\`\`\`\n`);
    const r = await conebook(dir, "run", "d.cone.md");
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/^conebook run: d\.cone\.md:7:1: data "obs" refers to obs\.csv, which cannot be read beside the document \(obs\.csv leads outside the document's folder/);
  });

  it("answers a header that nests thousands of levels with file:line:column and no stack trace", async () => {
    const dir = await folder();
    await writeFile(join(dir, "d.cone.md"), `---\nconebook: 1\ntitle: t\nseed: 1\nx:\n  ${"- ".repeat(4000)}y\n---\n`);
    const r = await conebook(dir, "run", "d.cone.md");
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/^conebook run: d\.cone\.md:6:\d+: the header nests lists and mappings more than 64 levels deep/);
    expect(r.stderr).not.toMatch(/\n\s+at /);
    expect(await readdir(dir)).toEqual(["d.cone.md"]);
  });

  it("answers a file it cannot write with exit 2 and the reason, without a stack trace", async () => {
    const dir = await folder();
    await writeFile(join(dir, "d.cone.md"), `${HEAD}\n\`\`\`ts code:a\n1\n\`\`\`\n`);
    expect((await conebook(dir, "run", "d.cone.md", "--write")).code).toBe(0);
    const r = await conebook(dir, "export", "d.cone.md", "-o", "no-such-folder/report.html");
    expect(r.code).toBe(2);
    expect(r.stderr).toBe(`conebook export: cannot write ${join(dir, "no-such-folder", "report.html")}: its folder does not exist (ENOENT); the file is unchanged`);
  });

  it("says an unexpected failure without a stack trace unless CONEBOOK_DEBUG=1", () => {
    const e = new TypeError("x is not a function");
    expect(unexpectedFailureMessage("run", e, false)).toBe(
      "conebook run: internal error, please report it with the command that caused it (set CONEBOOK_DEBUG=1 to see where it happened): TypeError: x is not a function",
    );
    expect(unexpectedFailureMessage("run", e, true)).toContain(`: ${e.stack}`);
  });
});
