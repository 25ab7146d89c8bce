/**
 * The page's save never loses a document: the server of `conebook serve` (the built command,
 * packages/cli/dist/conebook.js, run by plain node) is killed with SIGKILL at seeded moments while it saves a
 * document the page sent (PUT /TOKEN/api/document, as the page's save does). After each kill the file is exactly
 * the text it had or exactly the complete text that was sent, and the next save removes every temporary file the
 * killed servers left (cli docs, "atomic writes"). The page's own recovery copy of unsaved edits is checked in
 * tests/browser/workbench-editing.test.ts. The long version: `npm run soak` (1,000 kills).
 */
import { spawn, type ChildProcess } from "node:child_process";
import { createHash } from "node:crypto";
import { mkdtemp, readFile, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { seededFractions, temporaries } from "../../../tests/support/kill-moments.js";

/** 50 in npm test; the soak (tests/soak/run.ts) sets CONEBOOK_SERVE_KILLS=1000 for the long version. */
const KILLS = killsFrom(process.env.CONEBOOK_SERVE_KILLS);

function killsFrom(raw: string | undefined): number {
  if (raw === undefined) return 50;
  const n = Number(raw);
  if (!Number.isInteger(n) || n < 1) throw new Error(`CONEBOOK_SERVE_KILLS must be a whole number >= 1, got ${JSON.stringify(raw)}`);
  return n;
}
const CLI = fileURLToPath(new URL("../dist/conebook.js", import.meta.url));
const FILE = "hb.cone.md";

/** Two versions of an invented document (Heron Bank, invented), long enough that a save takes a moment. */
function version(label: string): string {
  const narrative = Array.from({ length: 6000 }, (_, i) => `Reading ${i} of the ${label} draft at Heron Bank HB-OB2 (invented).`).join("\n");
  return `---\nconebook: 1\ntitle: Saving from the page at Heron Bank (${label}, invented)\nseed: 5\n---\n\n${narrative}\n\n\`\`\`ts code:check\n1 + 1\n\`\`\`\n`;
}

const sha256 = (text: string) => createHash("sha256").update(text, "utf8").digest("hex");

/** Starts `conebook serve DIR --port 0 --no-open` and resolves with the child and the page's base address. */
async function startServer(dir: string): Promise<{ child: ChildProcess; base: string; origin: string; exited: Promise<unknown> }> {
  const child = spawn(process.execPath, [CLI, "serve", dir, "--port", "0", "--no-open"], { stdio: ["ignore", "pipe", "pipe"] });
  const exited = new Promise((r) => child.once("exit", r));
  const base = await new Promise<string>((resolve, reject) => {
    let out = "";
    const timer = setTimeout(() => reject(new Error(`conebook serve printed no address in 20 s: ${out}`)), 20_000);
    child.stdout!.on("data", (chunk: Buffer) => {
      out += chunk.toString("utf8");
      const m = /(http:\/\/127\.0\.0\.1:\d+\/[^/\s]+\/)/.exec(out);
      if (m) {
        clearTimeout(timer);
        resolve(m[1]!);
      }
    });
    child.once("exit", (code) => reject(new Error(`conebook serve exited (${code}) before printing its address: ${out}`)));
  });
  return { child, base, origin: new URL(base).origin, exited };
}

/** The page's save: PUT the text with the digest of the text it replaces. */
function save(base: string, origin: string, text: string, baseSha256: string): Promise<Response> {
  return fetch(`${base}api/document?path=${encodeURIComponent(FILE)}`, {
    method: "PUT",
    headers: { "content-type": "application/json", origin },
    body: JSON.stringify({ text, baseSha256 }),
  });
}

describe("the page's save under SIGKILL of conebook serve", () => {
  it(`leaves the old or the complete new document through ${KILLS} kills at random moments of a save, and no temporary file after the next save`, async () => {
    const dir = await mkdtemp(join(tmpdir(), "conebook-serve-kill-"));
    const file = join(dir, FILE);
    const texts = [version("first"), version("second")];
    await writeFile(file, texts[0]!);
    try {
      // One uninterrupted save measures how long a save takes, so the kills spread over it.
      const first = await startServer(dir);
      const t0 = performance.now();
      const whole = await save(first.base, first.origin, texts[1]!, sha256(texts[0]!));
      const saveMs = performance.now() - t0;
      expect(whole.status, await whole.text()).toBe(200);
      expect(await readFile(file, "utf8")).toBe(texts[1]);
      first.child.kill("SIGKILL");
      await first.exited;

      let kept = 0;
      let replaced = 0;
      let leftBehind = 0;
      for (const fraction of seededFractions(20261205, KILLS)) {
        const current = await readFile(file, "utf8");
        const from = texts.indexOf(current);
        expect(from, "the file holds one of the two versions").toBeGreaterThanOrEqual(0);
        const to = texts[1 - from]!;
        const server = await startServer(dir);
        const request = save(server.base, server.origin, to, sha256(current)).then(
          (r) => r.status,
          () => "no answer",
        );
        await new Promise((r) => setTimeout(r, fraction * saveMs * 1.5));
        server.child.kill("SIGKILL");
        await server.exited;
        await request;
        const after = await readFile(file, "utf8");
        if (after === current) kept++;
        else {
          expect(after === to, "a killed save leaves the old or the complete new text").toBe(true);
          replaced++;
        }
        leftBehind = Math.max(leftBehind, (await temporaries(dir)).length);
      }
      expect(kept + replaced).toBe(KILLS);

      const last = await startServer(dir);
      const current = await readFile(file, "utf8");
      const final = await save(last.base, last.origin, texts[1 - texts.indexOf(current)]!, sha256(current));
      expect(final.status).toBe(200);
      last.child.kill("SIGKILL");
      await last.exited;
      expect(await temporaries(dir)).toEqual([]);
      console.log(`serve save under SIGKILL: ${KILLS} kills, ${kept} kept the old text, ${replaced} the new, 0 corrupt; at most ${leftBehind} temporary file(s) left by a kill, 0 after the next save (one save took ${saveMs.toFixed(0)} ms)`);
    } finally {
      await rm(dir, { recursive: true, force: true });
    }
  }, Math.max(240_000, KILLS * 2_000));
});
