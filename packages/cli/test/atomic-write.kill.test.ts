/**
 * Saving never leaves a broken document: a process writing with writeFileAtomic is killed (SIGKILL) at random
 * moments; after each kill the file holds exactly one complete version, and the next write removes every
 * temporary file the killed processes left. The writer is this module bundled by esbuild and run by plain node,
 * so each kill costs about 0.1 s. (A fast version; a long one belongs in a soak script.)
 */
import { spawn } from "node:child_process";
import { mkdtemp, readFile, readdir, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { build } from "esbuild";
import { describe, expect, it } from "vitest";
import { writeFileAtomic } from "../src/atomic-write.js";

const KILLS = 30;

/** A version of the document: 64 KiB lines of its number, then an end line naming it, so a torn file shows. */
const version = (n: number) => `${`version ${n}\n`.repeat(6000)}end of version ${n}\n`;

function seededDelays(seed: number, count: number): number[] {
  let s = seed >>> 0;
  return Array.from({ length: count }, () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return 5 + (s % 60);
  });
}

describe("writeFileAtomic under SIGKILL", () => {
  it(`keeps one complete version through ${KILLS} kills and removes the temporary files they left`, async () => {
    const dir = await mkdtemp(join(tmpdir(), "conebook-kill-"));
    const writer = join(dir, "writer.mjs");
    await build({
      stdin: {
        contents: `import { writeFileAtomic } from ${JSON.stringify(fileURLToPath(new URL("../src/atomic-write.ts", import.meta.url)))};
          const [file, first] = process.argv.slice(2);
          const version = ${version.toString()};
          for (let n = Number(first); ; n++) { await writeFileAtomic(file, version(n)); if (n === Number(first)) process.stdout.write("ready\\n"); }`,
        resolveDir: dir,
        loader: "ts",
      },
      bundle: true,
      platform: "node",
      format: "esm",
      outfile: writer,
      logLevel: "silent",
    });
    const file = join(dir, "doc.cone.md");
    await writeFile(file, version(0));
    let leftBehind = 0;
    let next = 1;
    for (const delay of seededDelays(20240501, KILLS)) {
      const child = spawn(process.execPath, [writer, file, String(next)], { stdio: ["ignore", "pipe", "inherit"] });
      await new Promise<void>((resolve) => child.stdout.once("data", () => resolve()));
      await new Promise((r) => setTimeout(r, delay));
      child.kill("SIGKILL");
      await new Promise((r) => child.once("exit", r));
      const text = await readFile(file, "utf8");
      const m = /end of version (\d+)\n$/.exec(text);
      expect(m, "the file ends with a complete version").not.toBeNull();
      expect(text).toBe(version(Number(m![1])));
      next = Number(m![1]) + 1000;
      leftBehind = Math.max(leftBehind, (await readdir(dir)).filter((f) => f.includes(".tmp-")).length);
    }
    await writeFileAtomic(file, version(-1));
    expect(await readFile(file, "utf8")).toBe(version(-1));
    expect((await readdir(dir)).filter((f) => f.includes(".tmp-"))).toEqual([]);
    console.log(`atomic write: ${KILLS} kills, 0 broken files, at most ${leftBehind} temporary files left at once, 0 after the next write`);
  });
});
