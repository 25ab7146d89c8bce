/**
 * A node:http server on 127.0.0.1 (ephemeral port) serving a fixed set of in-memory files, and nothing else:
 * any other path is 404. It records every path asked for, so a test can check what the page fetched.
 */
import { createServer } from "node:http";
import type { AddressInfo } from "node:net";
import type { Asset } from "./bundle.js";

/** A running test server. */
export interface StaticServer {
  /** `http://127.0.0.1:<port>` */
  origin: string;
  /** Every request as `METHOD path status`, in order. */
  requests: string[];
  close(): Promise<void>;
}

/** Serves `assets` by URL path (query strings ignored) until `close()`. */
export async function startStaticServer(assets: ReadonlyMap<string, Asset>): Promise<StaticServer> {
  const requests: string[] = [];
  const server = createServer((req, res) => {
    const path = new URL(req.url ?? "/", "http://127.0.0.1").pathname;
    const asset = req.method === "GET" ? assets.get(path) : undefined;
    const status = asset ? 200 : 404;
    requests.push(`${req.method} ${path} ${status}`);
    res.writeHead(status, { "content-type": asset?.contentType ?? "text/plain; charset=utf-8", "cache-control": "no-store" });
    res.end(asset ? asset.body : `not found: ${path}`);
  });
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(0, "127.0.0.1", () => resolve());
  });
  const { port } = server.address() as AddressInfo;
  return {
    origin: `http://127.0.0.1:${port}`,
    requests,
    close: () =>
      new Promise<void>((resolve, reject) => {
        server.closeAllConnections();
        server.close((e) => (e ? reject(e) : resolve()));
      }),
  };
}
