/**
 * `conebook serve`'s server without a browser: the token, Host and Origin rules, refused paths (traversal,
 * encoded traversal, symbolic links that lead out), refused methods, conflict-aware atomic saves, copies and
 * pinned data files. Requests are raw node:http requests, so every header is exactly as written here.
 * The documents are small invented ones written to a temporary folder.
 */
import { spawn } from "node:child_process";
import { request } from "node:http";
import { fileURLToPath } from "node:url";
import { mkdir, mkdtemp, readFile, readdir, rm, symlink, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { sha256Hex, utf8Bytes } from "@conebook/document";
import { writeFileAtomic } from "../src/atomic-write.js";
import { startServeServer, type RunningServer } from "../src/serve/server.js";
import { relativePathProblem } from "../src/serve/paths.js";
import { browserCommand } from "../src/serve/open-browser.js";

const CSV = "t_min,s_m\n1,0.2\n10,0.5\n";
const DOC = `---
conebook: 1
title: Served test document (invented)
seed: 3
---

\`\`\`csv data:obs file=data/obs.csv sha256=${sha256Hex(utf8Bytes(CSV))}
\`\`\`

\`\`\`ts code:rows
obs.rows.length
\`\`\`
`;

let dir: string;
let outside: string;
let server: RunningServer;
const INDEX = "<!doctype html><title>page</title>";

interface Reply {
  status: number;
  headers: Record<string, string | string[] | undefined>;
  body: string;
}

/** One raw request to the test server; `path` is sent exactly as given. */
function send(method: string, path: string, options: { headers?: Record<string, string>; body?: string } = {}): Promise<Reply> {
  return new Promise((resolve, reject) => {
    const req = request(
      { host: "127.0.0.1", port: server.port, method, path, headers: { host: `127.0.0.1:${server.port}`, ...options.headers } },
      (res) => {
        const chunks: Buffer[] = [];
        res.on("data", (c: Buffer) => chunks.push(c));
        res.on("end", () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks).toString("utf8") }));
      },
    );
    req.on("error", reject);
    req.end(options.body);
  });
}

const own = () => ({ origin: server.origin, "content-type": "application/json" });
const api = (route: string) => `/${server.token}/api/${route}`;

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), "conebook-serve-"));
  outside = await mkdtemp(join(tmpdir(), "conebook-outside-"));
  await mkdir(join(dir, "data"));
  await writeFile(join(dir, "site.cone.md"), DOC);
  await writeFile(join(dir, "data", "obs.csv"), CSV);
  await writeFile(join(outside, "secret.cone.md"), "---\nconebook: 1\ntitle: outside\nseed: 1\n---\n");
  await writeFile(join(outside, "secret.csv"), "a\n1\n");
  await symlink(join(outside, "secret.cone.md"), join(dir, "link-out.cone.md"));
  await symlink(outside, join(dir, "folder-out"));
  server = await startServeServer({
    folder: dir,
    initial: "site.cone.md",
    port: 0,
    assets: new Map([["/", { body: Buffer.from(INDEX), contentType: "text/html; charset=utf-8" }]]),
    // A document named fails.cone.md meets a full disk: its write fails before anything is written.
    writeFile: (path, text) =>
      path.endsWith("fails.cone.md") ? Promise.reject(Object.assign(new Error("ENOSPC: no space left on device (simulated)"), { code: "ENOSPC" })) : writeFileAtomic(path, text),
  });
});

afterAll(async () => {
  await server?.close();
  await rm(dir, { recursive: true, force: true });
  await rm(outside, { recursive: true, force: true });
});

describe("conebook serve: who gets in", () => {
  it("listens on 127.0.0.1 and prints a URL with a token of 32 base64url characters", () => {
    expect(server.origin).toMatch(/^http:\/\/127\.0\.0\.1:\d+$/);
    expect(server.token).toMatch(/^[A-Za-z0-9_-]{32}$/);
    expect(server.url).toBe(`${server.origin}/${server.token}/?open=site.cone.md`);
  });

  it("serves the page under the token, with a Content-Security-Policy that allows no remote origin", async () => {
    const r = await send("GET", `/${server.token}/`);
    expect(r.status).toBe(200);
    expect(r.body).toBe(INDEX);
    const csp = String(r.headers["content-security-policy"]);
    expect(csp).toContain("default-src 'none'");
    expect(csp).toContain("script-src 'self' 'wasm-unsafe-eval'");
    expect(csp).toContain("connect-src 'self'");
    expect(csp).not.toMatch(/https?:|\*/);
    expect(r.headers["x-content-type-options"]).toBe("nosniff");
  });

  it("refuses a request without the token, with a wrong token, and with the token only as a prefix", async () => {
    for (const path of ["/", "/api/session", `/x${server.token}/`, `/${server.token.slice(0, -1)}/`, `/${server.token}x/api/session`]) {
      const r = await send("GET", path);
      expect(r.status, path).toBe(403);
      expect(r.body).toMatch(/token/);
    }
  });

  it("refuses a Host header that does not name this server (DNS rebinding) and a foreign Origin", async () => {
    const badHost = await send("GET", api("session"), { headers: { host: `attacker.example:${server.port}` } });
    expect(badHost.status).toBe(403);
    expect(badHost.body).toMatch(/Host header/);
    const otherPort = await send("GET", api("session"), { headers: { host: `127.0.0.1:${server.port + 1}` } });
    expect(otherPort.status).toBe(403);
    const foreign = await send("GET", api("session"), { headers: { origin: "http://attacker.example" } });
    expect(foreign.status).toBe(403);
    expect(foreign.body).toMatch(/attacker\.example/);
    for (const site of ["cross-site", "same-site"]) {
      const r = await send("GET", api("session"), { headers: { "sec-fetch-site": site } });
      expect(r.status, site).toBe(403);
    }
    for (const site of ["same-origin", "none"]) expect((await send("GET", api("session"), { headers: { "sec-fetch-site": site } })).status, site).toBe(200);
    const localhost = await send("GET", api("session"), { headers: { host: `localhost:${server.port}`, origin: `http://localhost:${server.port}` } });
    expect(localhost.status).toBe(200);
  });

  it("refuses a save that carries no Origin or a foreign one, and leaves the file as it was", async () => {
    const before = await readFile(join(dir, "site.cone.md"), "utf8");
    const body = JSON.stringify({ text: "overwritten", baseSha256: sha256Hex(utf8Bytes(before)) });
    const none = await send("PUT", api("document?path=site.cone.md"), { headers: { "content-type": "application/json" }, body });
    expect(none.status).toBe(403);
    const foreign = await send("PUT", api("document?path=site.cone.md"), { headers: { origin: "http://127.0.0.1:1", "content-type": "application/json" }, body });
    expect(foreign.status).toBe(403);
    expect(await readFile(join(dir, "site.cone.md"), "utf8")).toBe(before);
  });

  it("refuses methods and paths it does not serve", async () => {
    for (const method of ["DELETE", "PATCH", "OPTIONS", "TRACE"]) expect((await send(method, `/${server.token}/`)).status, method).toBe(405);
    expect((await send("PUT", `/${server.token}/`, { headers: own(), body: "{}" })).status).toBe(405);
    expect((await send("GET", `/${server.token}/index2.html`)).status).toBe(404);
    expect((await send("GET", api("shell"))).status).toBe(404);
    expect((await send("DELETE", api("document?path=site.cone.md"), { headers: own() })).status).toBe(405);
  });
});

describe("conebook serve: which files", () => {
  it("lists the documents of the folder (symbolic links not followed) and names the one to open first", async () => {
    const r = await send("GET", api("session"));
    expect(r.status).toBe(200);
    const session = JSON.parse(r.body);
    expect(session.initial).toBe("site.cone.md");
    expect(session.documents).toEqual(["site.cone.md"]);
  });

  it("opens a document with its SHA-256 and the check of its pinned data file", async () => {
    const r = await send("GET", api("document?path=site.cone.md"));
    expect(r.status).toBe(200);
    const opened = JSON.parse(r.body);
    expect(opened.text).toBe(DOC);
    expect(opened.sha256).toBe(sha256Hex(utf8Bytes(DOC)));
    expect(opened.pins).toEqual([
      expect.objectContaining({ cellId: "obs", path: "data/obs.csv", status: "ok", pinned: sha256Hex(utf8Bytes(CSV)), actual: sha256Hex(utf8Bytes(CSV)) }),
    ]);
    const data = await send("GET", api("data?document=site.cone.md&path=data%2Fobs.csv"));
    expect(data.status).toBe(200);
    expect(data.body).toBe(CSV);
  });

  it("refuses traversal: .. and its percent-encoded forms, absolute paths, backslashes and hidden entries", async () => {
    const attempts = [
      "document?path=../outside.cone.md",
      "document?path=%2e%2e%2fsecret.cone.md",
      "document?path=%2E%2E/%2E%2E/etc/passwd.cone.md",
      "document?path=data/..%2f..%2fsecret.cone.md",
      "document?path=%2Fetc%2Fpasswd.cone.md",
      "document?path=data%5C..%5Csite.cone.md",
      "document?path=.hidden.cone.md",
      "data?document=site.cone.md&path=../../etc/passwd",
      "data?document=site.cone.md&path=%2e%2e/%2e%2e/etc/hostname",
      "data?document=site.cone.md&path=/etc/hostname",
    ];
    for (const attempt of attempts) {
      const r = await send("GET", api(attempt));
      expect(r.status, attempt).toBe(403);
      expect(JSON.parse(r.body).error, attempt).toMatch(/refused/);
    }
    // A path through .. in the URL path itself never reaches the API or the page's files.
    expect((await send("GET", `/${server.token}/../../etc/passwd`)).status).toBe(404);
    expect((await send("GET", `/${server.token}/%2e%2e/%2e%2e/etc/passwd`)).status).toBe(404);
  });

  it("refuses symbolic links that lead out of the folder, for documents and data files", async () => {
    const doc = await send("GET", api("document?path=link-out.cone.md"));
    expect(doc.status).toBe(403);
    expect(JSON.parse(doc.body).error).toMatch(/outside the served folder/);
    const data = await send("GET", api("data?document=site.cone.md&path=folder-out/secret.csv"));
    expect(data.status).toBe(403);
    const save = await send("PUT", api("document?path=folder-out/secret.cone.md"), { headers: own(), body: JSON.stringify({ text: "x", baseSha256: "0" }) });
    expect(save.status).toBe(403);
    expect(await readFile(join(outside, "secret.cone.md"), "utf8")).toMatch(/title: outside/);
  });

  it("names what is wrong with a malformed relative path", () => {
    expect(relativePathProblem("a/../b")).toMatch(/"\.\." segment/);
    expect(relativePathProblem("a//b")).toMatch(/empty segment/);
    expect(relativePathProblem("a\\b")).toMatch(/backslash/);
    expect(relativePathProblem("/a")).toMatch(/absolute/);
    expect(relativePathProblem("a/.git/config")).toMatch(/hidden/);
    expect(relativePathProblem("data/obs.csv")).toBeUndefined();
  });
});

describe("conebook serve: saving", () => {
  it("saves atomically when the file is still the one opened, and refuses with the disk's text when it changed", async () => {
    const path = join(dir, "save-me.cone.md");
    await writeFile(path, DOC);
    const opened = sha256Hex(utf8Bytes(DOC));
    const edited = DOC.replace("obs.rows.length", "obs.rows.length * 2");
    const ok = await send("PUT", api("document?path=save-me.cone.md"), { headers: own(), body: JSON.stringify({ text: edited, baseSha256: opened }) });
    expect(ok.status).toBe(200);
    expect(JSON.parse(ok.body).sha256).toBe(sha256Hex(utf8Bytes(edited)));
    expect(await readFile(path, "utf8")).toBe(edited);

    // Someone else changes the file; a save based on the old text is refused and nothing is overwritten.
    const theirs = edited.replace("* 2", "* 3");
    await writeFile(path, theirs);
    const stale = await send("PUT", api("document?path=save-me.cone.md"), { headers: own(), body: JSON.stringify({ text: "mine", baseSha256: sha256Hex(utf8Bytes(edited)) }) });
    expect(stale.status).toBe(409);
    const conflict = JSON.parse(stale.body);
    expect(conflict.text).toBe(theirs);
    expect(conflict.sha256).toBe(sha256Hex(utf8Bytes(theirs)));
    expect(await readFile(path, "utf8")).toBe(theirs);
  });

  it("keeps the file untouched and answers with the reason when the write itself fails (a full disk)", async () => {
    const path = join(dir, "fails.cone.md");
    await writeFile(path, DOC);
    const r = await send("PUT", api("document?path=fails.cone.md"), { headers: own(), body: JSON.stringify({ text: "new text", baseSha256: sha256Hex(utf8Bytes(DOC)) }) });
    expect(r.status).toBe(500);
    expect(JSON.parse(r.body).error).toMatch(/^saving fails\.cone\.md: ENOSPC/);
    expect(await readFile(path, "utf8")).toBe(DOC);
  });

  it("keeps edits as a copy beside the document without overwriting an existing file", async () => {
    const first = await send("POST", api("copy?path=site.cone.md"), { headers: own(), body: JSON.stringify({ text: "copy one" }) });
    const second = await send("POST", api("copy?path=site.cone.md"), { headers: own(), body: JSON.stringify({ text: "copy two" }) });
    expect(JSON.parse(first.body).path).toBe("site.copy-1.cone.md");
    expect(JSON.parse(second.body).path).toBe("site.copy-2.cone.md");
    expect(await readFile(join(dir, "site.copy-1.cone.md"), "utf8")).toBe("copy one");
    expect(await readFile(join(dir, "site.copy-2.cone.md"), "utf8")).toBe("copy two");
    expect((await readdir(dir)).filter((n) => n.includes(".tmp-"))).toEqual([]);
  });

  it("refuses a body that is not JSON and a save of a file that is not a document", async () => {
    const notJson = await send("PUT", api("document?path=site.cone.md"), { headers: { origin: server.origin, "content-type": "text/plain" }, body: "x" });
    expect(notJson.status).toBe(415);
    const csv = await send("PUT", api("document?path=data/obs.csv"), { headers: own(), body: JSON.stringify({ text: "x", baseSha256: sha256Hex(utf8Bytes(CSV)) }) });
    expect(csv.status).toBe(403);
    expect(await readFile(join(dir, "data", "obs.csv"), "utf8")).toBe(CSV);
  });
});

describe("opening a browser", () => {
  it("opens none under CI or without a display, and uses the platform's opener otherwise", () => {
    expect(browserCommand("http://x/", { CI: "true", DISPLAY: ":0" }, "linux")).toBeUndefined();
    expect(browserCommand("http://x/", {}, "linux")).toBeUndefined();
    expect(browserCommand("http://x/", { DISPLAY: ":0" }, "linux")).toEqual(["xdg-open", ["http://x/"]]);
    expect(browserCommand("http://x/", {}, "darwin")).toEqual(["open", ["http://x/"]]);
  });
});

describe("the conebook serve command", () => {
  it("starts on the demo, prints a URL that serves the page and the document, and stops on SIGTERM", async () => {
    const bin = fileURLToPath(new URL("../bin/conebook.js", import.meta.url));
    const root = fileURLToPath(new URL("../../../", import.meta.url));
    const child = spawn(process.execPath, [bin, "serve", "notebooks/kestrel-moor-constant-rate.cone.md", "--port", "0", "--no-open"], { cwd: root, stdio: ["ignore", "pipe", "pipe"] });
    let out = "";
    child.stdout.on("data", (c: Buffer) => (out += c.toString()));
    child.stderr.on("data", (c: Buffer) => (out += c.toString()));
    const url = await new Promise<string>((resolve, reject) => {
      const timer = setTimeout(() => reject(new Error(`no URL printed: ${out}`)), 25_000);
      child.stdout.on("data", () => {
        const m = /Conebook workbench: (http:\/\/127\.0\.0\.1:\d+\/[A-Za-z0-9_-]{32}\/\?open=kestrel-moor-constant-rate\.cone\.md)/.exec(out);
        if (m) {
          clearTimeout(timer);
          resolve(m[1]!);
        }
      });
    });
    const page = await fetch(url);
    expect(page.status).toBe(200);
    expect(await page.text()).toMatch(/<title>Conebook workbench<\/title>/);
    const doc = await fetch(url.replace("?open=", "api/document?path="));
    expect(((await doc.json()) as { text: string }).text).toMatch(/^---\nconebook: 1\ntitle: Constant-rate test of supply borehole KM-PW1/);
    const code = await new Promise<number | null>((resolve) => {
      child.on("exit", (c) => resolve(c));
      child.kill("SIGTERM");
    });
    expect(code).toBe(0);
    expect(out).toMatch(/stopped\n$/);
  }, 40_000);
});
