/**
 * The HTTP server behind `conebook serve`: node:http on 127.0.0.1, the built page and a small JSON API, all
 * under the per-start token (`http://127.0.0.1:PORT/TOKEN/`). Every request passes security.ts first.
 *
 *   GET  /TOKEN/                       the page (index.html) and its files (/TOKEN/assets/...)
 *   GET  /TOKEN/api/session            { folder, documents: [path], initial: path | null, token-free facts }
 *   GET  /TOKEN/api/document?path=P    { path, text, sha256, pins }       (P relative to the served folder)
 *   PUT  /TOKEN/api/document?path=P    body { text, baseSha256 } -> { sha256 } | 409 { text, sha256 }
 *   POST /TOKEN/api/copy?path=P        body { text } -> { path } (a new file beside P, never over one)
 *   GET  /TOKEN/api/data?document=P&path=D   the bytes of data file D pinned by document P
 *   POST /TOKEN/api/new?path=P         body { text, files: [{ path, base64 }] } -> { path, sha256 } | 409 (a new
 *                                      document from the template form, with its data files; never over a file)
 *
 * Errors are JSON { error } with a message the page shows as it is.
 */
import { createServer, type IncomingMessage, type Server, type ServerResponse } from "node:http";
import type { AddressInfo } from "node:net";
import { realpath } from "node:fs/promises";
import { basename } from "node:path";
import type { PageAsset } from "./assets.js";
import { createDocument, listDocuments, openDocument, readDataFile, saveCopy, saveDocument } from "./documents.js";
import { PathRefused } from "./paths.js";
import { checkRequest, newToken, SECURITY_HEADERS } from "./security.js";

/** Settings of a server. */
export interface ServeOptions {
  /** The served folder (documents and their data files must lie inside it). */
  folder: string;
  /** The document to open first, relative to the folder (forward slashes); none: the page lists the documents. */
  initial?: string;
  /** Port on 127.0.0.1; 0 chooses a free one. */
  port: number;
  /** The built page by URL path (assets.ts). */
  assets: ReadonlyMap<string, PageAsset>;
  /** Fixed token (tests); by default a new random one. */
  token?: string;
  /** Largest request body accepted, in bytes (default 64 MiB). */
  maxBodyBytes?: number;
  /**
   * Writes a document's new text atomically; by default `writeFileAtomic`. Tests give a writer that fails as a
   * full disk would, to show that a failed save leaves the file as it was and the edits in the page.
   */
  writeFile?: (path: string, text: string) => Promise<void>;
  /** Called with one line per request (`METHOD path status`), for logs and tests. */
  onRequest?: (line: string) => void;
}

/** A running server. */
export interface RunningServer {
  /** `http://127.0.0.1:PORT` */
  origin: string;
  port: number;
  token: string;
  /** The URL to open: origin, token and (when given) the initial document. */
  url: string;
  close(): Promise<void>;
}

class HttpError extends Error {
  constructor(
    readonly status: number,
    message: string,
  ) {
    super(message);
  }
}

function send(res: ServerResponse, status: number, body: string | Buffer, contentType: string, head = false): void {
  res.writeHead(status, { ...SECURITY_HEADERS, "content-type": contentType, "content-length": Buffer.byteLength(body) });
  res.end(head ? undefined : body);
}

function sendJson(res: ServerResponse, status: number, value: unknown): void {
  send(res, status, JSON.stringify(value), "application/json; charset=utf-8");
}

async function readBody(req: IncomingMessage, limit: number): Promise<unknown> {
  const type = req.headers["content-type"] ?? "";
  if (!type.startsWith("application/json")) throw new HttpError(415, "the request body must be JSON (content-type application/json)");
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const chunk of req) {
    size += (chunk as Buffer).length;
    if (size > limit) throw new HttpError(413, `the request body is larger than ${limit} bytes`);
    chunks.push(chunk as Buffer);
  }
  try {
    return JSON.parse(Buffer.concat(chunks).toString("utf8"));
  } catch {
    throw new HttpError(400, "the request body is not valid JSON");
  }
}

function stringField(body: unknown, name: string): string {
  const v = body !== null && typeof body === "object" ? (body as Record<string, unknown>)[name] : undefined;
  if (typeof v !== "string") throw new HttpError(400, `the request body needs a string "${name}"`);
  return v;
}

function queryParam(url: URL, name: string): string {
  const v = url.searchParams.get(name);
  if (v === null) throw new HttpError(400, `the request needs ?${name}=`);
  return v;
}

function fileError(e: unknown, what: string): never {
  if (e instanceof PathRefused) throw new HttpError(403, e.message);
  if (e instanceof HttpError) throw e;
  const code = (e as NodeJS.ErrnoException).code;
  if (code === "ENOENT") throw new HttpError(404, `${what}: no such file`);
  if (code === "EISDIR") throw new HttpError(404, `${what} is a folder, not a file`);
  throw new HttpError(500, `${what}: ${(e as Error).message}`);
}

/** Starts the server; resolves when it listens. */
export async function startServeServer(options: ServeOptions): Promise<RunningServer> {
  const token = options.token ?? newToken();
  const rootReal = await realpath(options.folder);
  const limit = options.maxBodyBytes ?? 64 * 1024 * 1024;
  let port = options.port;
  let saving: Promise<unknown> = Promise.resolve();
  /** Saves and copies one after another, so the page's check-then-write cannot interleave with its own. */
  const serialized = <T>(work: () => Promise<T>): Promise<T> => {
    const next = saving.then(work, work);
    saving = next.catch(() => undefined);
    return next;
  };

  async function api(req: IncomingMessage, res: ServerResponse, url: URL, route: string): Promise<number> {
    const method = req.method;
    if (route === "session" && method === "GET") {
      sendJson(res, 200, { folder: basename(rootReal), documents: await listDocuments(rootReal), initial: options.initial ?? null });
      return 200;
    }
    if (route === "document" && method === "GET") {
      const path = queryParam(url, "path");
      try {
        sendJson(res, 200, await openDocument(rootReal, path));
      } catch (e) {
        fileError(e, path);
      }
      return 200;
    }
    if (route === "document" && method === "PUT") {
      const path = queryParam(url, "path");
      const body = await readBody(req, limit);
      const text = stringField(body, "text");
      const base = stringField(body, "baseSha256");
      let outcome;
      try {
        outcome = await serialized(() => saveDocument(rootReal, path, text, base, options.writeFile));
      } catch (e) {
        fileError(e, `saving ${path}`);
      }
      if (outcome.status === "missing") throw new HttpError(409, `${path} no longer exists on disk; keep your edits as a copy`);
      if (outcome.status === "conflict") {
        sendJson(res, 409, { error: `${path} changed on disk since it was opened`, text: outcome.text, sha256: outcome.sha256 });
        return 409;
      }
      sendJson(res, 200, { sha256: outcome.sha256 });
      return 200;
    }
    if (route === "copy" && method === "POST") {
      const path = queryParam(url, "path");
      const text = stringField(await readBody(req, limit), "text");
      try {
        sendJson(res, 200, { path: await serialized(() => saveCopy(rootReal, path, text, options.writeFile)) });
      } catch (e) {
        fileError(e, `copying ${path}`);
      }
      return 200;
    }
    if (route === "data" && method === "GET") {
      const documentPath = queryParam(url, "document");
      const dataPath = queryParam(url, "path");
      let bytes: Uint8Array;
      try {
        bytes = await readDataFile(rootReal, documentPath, dataPath);
      } catch (e) {
        fileError(e, dataPath);
      }
      send(res, 200, Buffer.from(bytes), "application/octet-stream");
      return 200;
    }
    if (route === "new" && method === "POST") {
      const path = queryParam(url, "path");
      const body = await readBody(req, limit);
      const text = stringField(body, "text");
      const raw = (body as { files?: unknown }).files ?? [];
      if (!Array.isArray(raw) || raw.some((f) => typeof f?.path !== "string" || typeof f?.base64 !== "string")) throw new HttpError(400, 'the request body needs "files": a list of { path, base64 }');
      const files = (raw as { path: string; base64: string }[]).map((f) => ({ path: f.path, bytes: new Uint8Array(Buffer.from(f.base64, "base64")) }));
      let outcome;
      try {
        outcome = await serialized(() => createDocument(rootReal, path, text, files, options.writeFile));
      } catch (e) {
        fileError(e, `making ${path}`);
      }
      if (outcome.status === "exists") throw new HttpError(409, outcome.reason);
      sendJson(res, 200, { path, sha256: outcome.sha256 });
      return 200;
    }
    const known = ["session", "document", "copy", "data", "new"].includes(route);
    throw new HttpError(known ? 405 : 404, known ? `method ${method} is not served on api/${route}` : `no such API: api/${route}`);
  }

  async function handle(req: IncomingMessage, res: ServerResponse): Promise<number> {
    const checked = checkRequest(req, token, port);
    if ("status" in checked) {
      send(res, checked.status, checked.message, "text/plain; charset=utf-8");
      return checked.status;
    }
    const url = new URL(checked.rest, "http://127.0.0.1");
    const path = url.pathname;
    if (path.startsWith("/api/")) {
      if (req.method === "HEAD") throw new HttpError(405, "HEAD is not served on the API");
      return api(req, res, url, path.slice("/api/".length));
    }
    if (req.method !== "GET" && req.method !== "HEAD") throw new HttpError(405, `method ${req.method} is not served on page files`);
    if (req.url !== undefined && !/^\/[^/?#]+\//.test(req.url)) {
      // `/TOKEN` without its slash: relative asset URLs need it.
      res.writeHead(308, { ...SECURITY_HEADERS, location: `/${token}/${url.search}` });
      res.end();
      return 308;
    }
    const asset = options.assets.get(path);
    if (!asset) throw new HttpError(404, `not found: ${path}`);
    send(res, 200, asset.body, asset.contentType, req.method === "HEAD");
    return 200;
  }

  const server: Server = createServer((req, res) => {
    handle(req, res)
      .then((status) => options.onRequest?.(`${req.method} ${req.url} ${status}`))
      .catch((e: unknown) => {
        const status = e instanceof HttpError ? e.status : 500;
        const message = e instanceof Error ? e.message : String(e);
        if (!res.headersSent) sendJson(res, status, { error: message });
        else res.end();
        options.onRequest?.(`${req.method} ${req.url} ${status}`);
      });
  });
  server.headersTimeout = 10_000;
  server.requestTimeout = 60_000;
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(options.port, "127.0.0.1", () => resolve());
  });
  port = (server.address() as AddressInfo).port;
  const origin = `http://127.0.0.1:${port}`;
  const query = options.initial ? `?open=${encodeURIComponent(options.initial)}` : "";
  return {
    origin,
    port,
    token,
    url: `${origin}/${token}/${query}`,
    close: () =>
      new Promise<void>((resolve, reject) => {
        server.closeAllConnections();
        server.close((e) => (e ? reject(e) : resolve()));
      }),
  };
}
